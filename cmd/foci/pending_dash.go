package main

import "errors"

// runDash is not built yet; this file is replaced by the command's own.
func runDash(e *env, args []string) error {
	return errors.New("the dash command is not built yet")
}
