package main

import "errors"

// runPocket is not built yet; this file is replaced by the command's own.
func runPocket(e *env, args []string) error {
	return errors.New("the pocket command is not built yet")
}
