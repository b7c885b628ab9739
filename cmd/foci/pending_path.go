package main

import "errors"

// runPath is not built yet; this file is replaced by the command's own.
func runPath(e *env, args []string) error {
	return errors.New("the path command is not built yet")
}
