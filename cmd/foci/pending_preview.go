package main

import "errors"

// runPreview is not built yet; this file is replaced by the command's own.
func runPreview(e *env, args []string) error {
	return errors.New("the preview command is not built yet")
}
