package main

import (
	"errors"
	"flag"
	"fmt"
	"os"

	"golang.org/x/term"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
	"github.com/hatsieve/hatsieve/thermo"
	"github.com/hatsieve/hatsieve/tui"
)

func stdoutIsTerminal() bool { return term.IsTerminal(int(os.Stdout.Fd())) }

// cmdScreens is the bare command: the screens in a terminal; otherwise the
// ranked table, exactly as 'hatsieve rank --format table' prints it with the
// same options.
func cmdScreens(args []string, e env) error {
	fs := newFlagSet("")
	var ec evalConfig
	ec.register(fs)
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			fmt.Fprint(e.stdout, topUsage)
			return err
		}
		return usagef("%v (see 'hatsieve help')", err)
	}
	if fs.NArg() > 0 {
		return usagef("unexpected argument %q (commands: %s; library files go after -l)", fs.Arg(0), commandList())
	}
	ev, eo, units, err := ec.evaluate(e)
	if err != nil {
		return err
	}
	if e.isTerminal {
		return runTUI(ev, eo, units, e)
	}
	o := thermo.RankOptions{Sort: thermo.ByDG, Top: DefaultTop}
	return writePairsTable(e.stdout, ev, ev.Rank(o), units, o)
}

// runTUI opens the screens on an evaluated library (they re-evaluate it
// themselves when the solvent, basis or units change).
func runTUI(ev *data.Evaluated, eo data.Options, units thermo.Units, e env) error {
	err := tui.Run(ev.Lib, tui.Options{Eval: eo, Units: units})
	// An export still under way when the screens closed (quit, or a
	// signal) leaves no temporary file; the file it was to replace is as
	// it was.
	atomicfile.RemoveTemps()
	return err
}
