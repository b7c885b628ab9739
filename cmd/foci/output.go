package main

import (
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// writeFileAtomic writes what fill produces to path through a temporary
// file in the same directory, renamed over path only when fill and the
// close succeed. On any error the temporary file is removed and an
// existing file at path is left untouched, so a machine never sees half a
// program. The path "-" writes to stdout instead.
func writeFileAtomic(e *env, path string, fill func(w io.Writer) error) error {
	if path == "-" || path == "" {
		return fill(e.stdout)
	}
	dir := filepath.Dir(path)
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	tmp := f.Name()
	ok := false
	defer func() {
		if !ok {
			f.Close()
			os.Remove(tmp)
		}
	}()
	if err := fill(f); err != nil {
		return err
	}
	if err := f.Sync(); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := os.Chmod(tmp, 0o644); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	ok = true
	return nil
}

// writeJSON writes v as indented JSON with a final newline.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// readInput reads a whole file, or standard input for "-". It refuses
// files that are not text (a NUL byte in the first 8 KiB).
func readInput(e *env, path string) ([]byte, error) {
	var data []byte
	var err error
	if path == "-" {
		data, err = io.ReadAll(e.stdin)
	} else {
		data, err = os.ReadFile(path)
	}
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %v", path, err)
	}
	head := data
	if len(head) > 8192 {
		head = head[:8192]
	}
	for _, c := range head {
		if c == 0 {
			return nil, fmt.Errorf("cannot read %s: not a text file (NUL byte)", path)
		}
	}
	return data, nil
}
