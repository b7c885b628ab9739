// Command foci turns ellipses into machine-ready programs for routers,
// lasers and pen plotters, checks programs against the intended shape,
// and draws them.
//
// Usage:
//
//	foci <command> [flags]
//
// Run "foci help" for the list of commands and "foci <command> -h" for the
// flags of one. Exit status: 0 fine, 1 a check found violations, 2 bad
// usage or input.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
)

// command is one subcommand: its name, a one-line summary and the function
// that runs it with its arguments.
type command struct {
	name    string
	summary string
	run     func(env *env, args []string) error
}

// commands lists the subcommands in the order "foci help" shows them.
func commands() []command {
	return []command{
		{"info", "geometry of an ellipse: axes, foci, area, perimeter, curvature", runInfo},
		{"divide", "points at equal arc length along an ellipse or a parallel curve", runDivide},
		{"path", "the approximated closed curve alone as a minimal G-code program", runPath},
		{"profile", "a complete program that cuts an elliptical part out", runProfile},
		{"drill", "holes or marks at equal arc length along the curve", runDrill},
		{"dash", "a dashed or dotted elliptical outline", runDash},
		{"pocket", "clear an elliptical recess to depth", runPocket},
		{"check", "read a G-code program back and check it", runCheck},
		{"preview", "draw a G-code program as a PNG picture", runPreview},
		{"fit", "the ellipse through measured points", runFit},
		{"demo", "run the whole job on a built-in workshop order", runDemo},
	}
}

// env is what a command may touch: its streams and the working directory.
type env struct {
	stdin  io.Reader
	stdout io.Writer
	stderr io.Writer
}

func main() {
	os.Exit(run(&env{os.Stdin, os.Stdout, os.Stderr}, os.Args[1:]))
}

// run executes one command line and returns the exit status.
func run(e *env, args []string) int {
	if len(args) == 0 || args[0] == "help" || args[0] == "-h" || args[0] == "-help" || args[0] == "--help" {
		usage(e.stdout)
		if len(args) == 0 {
			return 2
		}
		return 0
	}
	for _, c := range commands() {
		if c.name != args[0] {
			continue
		}
		err := c.run(e, args[1:])
		return exitStatus(e, c.name, err)
	}
	fmt.Fprintf(e.stderr, "foci: unknown command %q; run \"foci help\" for the list\n", args[0])
	return 2
}

// exitStatus reports err and maps it to the exit status.
func exitStatus(e *env, name string, err error) int {
	switch {
	case err == nil:
		return 0
	case errors.Is(err, errHelp):
		return 0
	case errors.Is(err, errViolations):
		return 1
	}
	fmt.Fprintf(e.stderr, "foci %s: %v\n", name, err)
	return 2
}

func usage(w io.Writer) {
	fmt.Fprintln(w, "foci turns ellipses into machine-ready toolpaths.")
	fmt.Fprintln(w, "\nUsage: foci <command> [flags]\n\nCommands:")
	for _, c := range commands() {
		fmt.Fprintf(w, "  %-8s %s\n", c.name, c.summary)
	}
	fmt.Fprintln(w, "\nRun \"foci <command> -h\" for the flags of a command.")
	fmt.Fprintln(w, "Exit status: 0 fine, 1 a check found violations, 2 bad usage or input.")
}
