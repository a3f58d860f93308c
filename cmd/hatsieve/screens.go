package main

import (
	"errors"
	"flag"
	"fmt"
	"math"
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
	var flask thermo.Flask
	fs.Float64Var(&flask.DonorM, "donor-m", thermo.DefaultDonorM, "initial [D–H] in mol/L for the screens' conversion column")
	fs.Float64Var(&flask.AcceptorM, "acceptor-m", thermo.DefaultAcceptorM, "initial [A] in mol/L for the screens' conversion column")
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
	for _, c := range []struct {
		name string
		v    float64
	}{{"--donor-m", flask.DonorM}, {"--acceptor-m", flask.AcceptorM}} {
		if !(c.v > 0) || math.IsInf(c.v, 0) {
			return usagef("%s: want a concentration above 0 mol/L, got %g", c.name, c.v)
		}
	}
	ev, eo, units, err := ec.evaluate(e)
	if err != nil {
		return err
	}
	if e.isTerminal {
		return runTUI(ev, eo, units, flask, e)
	}
	o := thermo.RankOptions{Sort: thermo.ByDG, Top: DefaultTop}
	return writePairsTable(e.stdout, ev, ev.Rank(o), units, o)
}

// runTUI opens the screens on an evaluated library (they re-evaluate it
// themselves when the solvent, basis or units change).
func runTUI(ev *data.Evaluated, eo data.Options, units thermo.Units, flask thermo.Flask, e env) error {
	err := tui.Run(ev.Lib, tui.Options{Eval: eo, Units: units, Flask: flask})
	// An export still under way when the screens closed (quit, or a
	// signal) leaves no temporary file; the file it was to replace is as
	// it was.
	atomicfile.RemoveTemps()
	return err
}
