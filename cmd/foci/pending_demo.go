package main

import "errors"

// runDemo is not built yet; this file is replaced by the command's own.
func runDemo(e *env, args []string) error {
	return errors.New("the demo command is not built yet")
}
