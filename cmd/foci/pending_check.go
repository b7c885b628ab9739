package main

import "errors"

// runCheck is not built yet; this file is replaced by the command's own.
func runCheck(e *env, args []string) error {
	return errors.New("the check command is not built yet")
}
