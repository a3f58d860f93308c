package main

import (
	"os"

	"golang.org/x/term"
)

func stdoutIsTerminal() bool { return term.IsTerminal(int(os.Stdout.Fd())) }

// cmdScreens is the bare command: the screens in a terminal, the ranked
// table otherwise. Until the library loader lands it prints the solvent table.
func cmdScreens(args []string, e env) error {
	return cmdSolvents(args, e)
}
