package main

import "errors"

// runFit is not built yet; this file is replaced by the command's own.
func runFit(e *env, args []string) error {
	return errors.New("the fit command is not built yet")
}
