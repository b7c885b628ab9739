package main

import "errors"

// runDrill is not built yet; this file is replaced by the command's own.
func runDrill(e *env, args []string) error {
	return errors.New("the drill command is not built yet")
}
