package main

import "errors"

// runProfile is not built yet; this file is replaced by the command's own.
func runProfile(e *env, args []string) error {
	return errors.New("the profile command is not built yet")
}
