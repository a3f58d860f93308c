// Command hatsieve screens H-atom donors against acceptor bonds by their bond
// dissociation free energies (see README.md).
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"regexp"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// version is set at build time with -ldflags "-X main.version=...".
var version = "0.1.0-dev"

// Exit statuses (README.md, A short tour).
const (
	exitOK    = 0
	exitData  = 1 // bad data or input
	exitUsage = 2 // bad usage
)

// usageError marks an error as bad usage (exit 2) rather than bad data.
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

func usagef(format string, a ...any) error { return usageError{fmt.Sprintf(format, a...)} }

// env is what a command may touch: its arguments and streams. Commands never
// reach for os.Stdout or os.Args themselves, so tests can run them.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
	isTerminal     bool // stdout is a terminal
}

func main() {
	e := env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr, isTerminal: stdoutIsTerminal()}
	os.Exit(run(os.Args[1:], e))
}

// commands maps a subcommand name to its function.
var commands = map[string]func(args []string, e env) error{
	"bdfe":     cmdBDFE,
	"check":    cmdCheck,
	"pair":     cmdPair,
	"library":  cmdLibrary,
	"figure":   cmdFigure,
	"rank":     cmdRank,
	"solvents": cmdSolvents,
	"version":  cmdVersion,
	"window":   cmdWindow,
}

// run dispatches to a subcommand and turns its error into one line on stderr
// and an exit status.
func run(args []string, e env) int {
	var err error
	if len(args) > 0 && !strings.HasPrefix(args[0], "-") {
		if args[0] == "help" {
			fmt.Fprint(e.stdout, topUsage)
			return exitOK
		}
		cmd, ok := commands[args[0]]
		if !ok {
			err = usagef("unknown command %q (commands: %s)", args[0], commandList())
		} else {
			err = cmd(args[1:], e)
		}
	} else {
		err = cmdScreens(args, e)
	}
	return report(err, e.stderr)
}

func report(err error, stderr io.Writer) int {
	if err == nil || errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	var ue usageError
	status := exitData
	if errors.As(err, &ue) {
		status = exitUsage
	}
	// Each line through the one sanitiser: an error may quote a file.
	for _, line := range strings.Split(strings.TrimRight(err.Error(), "\n"), "\n") {
		fmt.Fprintln(stderr, "hatsieve: "+data.Printable(line))
	}
	return status
}

func commandList() string {
	return "bdfe, rank, pair, window, library, figure, check, solvents, version"
}

const topUsage = `hatsieve: screen H-atom donors against acceptor bonds by BDFE

  hatsieve [-l FILE]... [--solvent S] [--cross] [--donor-m C] [--acceptor-m C]
                                               open the screens (the ranked table when not a terminal)
  hatsieve bdfe --solvent S (--pka P | --ph P) --e0 V [--vs REF] [--pka-sigma s] [--e0-sigma s] [--format text|json]
  hatsieve rank [-l FILE]... [--solvent S] [--cross] [--top N] [--sort METRIC [--reverse]] [--h2 TENDENCY]
                [--dg-min DG] [--dg-max DG] [--format table|csv|json] [--out FILE [--force]]
  hatsieve pair DONOR ACCEPTOR [-l FILE]... [--donor-m C] [--acceptor-m C] [--p-h2 ATM] [--format text|json]
  hatsieve pair --dg DG [--dg-sigma S] [--k-self-donor K1 --k-self-acceptor K2] [--donor-m C] [--acceptor-m C]
                [--format text|json]
  hatsieve check FILE...
  hatsieve library [-l FILE]... [--solvent S] [--find TEXT] [--bond X-H] [--role donor|acceptor] [--format text|json]
  hatsieve figure ladder|map [-l FILE]... [--solvent S] -o FILE.svg|.png [--width 25.4cm --height 14.29cm] [--force]
  hatsieve solvents [--format text|json]
  hatsieve window ACCEPTOR [-l FILE]... [--solvent S] [--margin E] [--below-h2] [--top N] [--format table|csv|json]
  hatsieve version

Common options (every command that computes):
  --cg-basis 2010|2022   C_G basis (default 2022)
  --cg KCAL [--cg-sigma S]  an explicit C_G for the working solvent (reported as basis "explicit")
  --units kcal|kj        energy units (default kcal)
  --temperature K        log K, conversion and rates only; BDFEs and ΔG° stay 298.15 K quantities
  --p-h2 ATM             H2 pressure (default 1 atm); moves the H2 line by ½RT·ln p
  --ph P                 water only: potentials are E°′ at this pH, or vs RHE
'hatsieve COMMAND --help' gives every option of a command.
Screening is not a safety assessment: see README.md.
`

// common holds the options every computing command accepts.
type common struct {
	basis       string
	cg          optFloat
	cgSigma     optFloat
	ph          optFloat
	units       string
	temperature float64
	pH2         float64 // atm
}

func (c *common) register(fs *flag.FlagSet) {
	fs.StringVar(&c.basis, "cg-basis", "2022", "C_G basis: 2010 or 2022")
	fs.Var(&c.cg, "cg", "explicit C_G in kcal/mol for the working solvent (wins over the table; reported as basis \"explicit\")")
	fs.Var(&c.cgSigma, "cg-sigma", "σ of --cg in kcal/mol (default: the table's σ for the solvent, else 1.0)")
	fs.Var(&c.ph, "ph", "pH of aqueous inputs: potentials are E°′ at this pH, or vs RHE (water only)")
	fs.StringVar(&c.units, "units", "kcal", "energy units: kcal or kj")
	fs.Float64Var(&c.temperature, "temperature", thermo.DefaultTemperature,
		"temperature in K for log K only; BDFEs, ΔG° and the H2 line stay 298.15 K quantities")
	fs.Float64Var(&c.pH2, "p-h2", thermo.StandardH2Pressure, "H2 pressure in atm (moves the H2 line by ½RT·ln p, at 298.15 K like every free energy)")
}

// conditions checks the common options and returns them as thermo sees them.
func (c *common) conditions(working *thermo.Solvent) (thermo.Conditions, thermo.Units, error) {
	b, err := thermo.ParseBasis(c.basis)
	if err != nil || b == thermo.BasisAbsolute {
		return thermo.Conditions{}, 0, usagef("--cg-basis: want 2010 or 2022, got %q", c.basis)
	}
	u, err := thermo.ParseUnits(c.units)
	if err != nil {
		return thermo.Conditions{}, 0, usagef("--units: %v", err)
	}
	if !(c.temperature > 0 && c.temperature < 1000) {
		return thermo.Conditions{}, 0, usagef("--temperature: want a temperature in kelvin between 0 and 1000, got %g", c.temperature)
	}
	if err := thermo.CheckPH2(c.pH2); err != nil {
		return thermo.Conditions{}, 0, usagef("--p-h2: %v", err)
	}
	cond := thermo.Conditions{Basis: b, Temperature: c.temperature, PH2: c.pH2}
	if c.cgSigma.set && (!c.cg.set || c.cgSigma.v < 0) {
		return cond, u, usagef("--cg-sigma: want a σ ≥ 0 with --cg, got %g", c.cgSigma.v)
	}
	if c.cg.set {
		if working == nil {
			return cond, u, usagef("--cg needs a working solvent (--solvent)")
		}
		cond.CG = map[string]float64{working.Key: c.cg.v}
		if c.cgSigma.set {
			cond.CGSigma = map[string]float64{working.Key: c.cgSigma.v}
		}
	}
	if c.ph.set {
		if c.ph.v < -2 || c.ph.v > 16 {
			return cond, u, usagef("--ph: want a pH between -2 and 16, got %g", c.ph.v)
		}
		if working != nil && working.Ref != thermo.NHE {
			return cond, u, usagef("--ph applies to water, not %s", working.Name)
		}
		cond.PH = &c.ph.v
	}
	return cond, u, nil
}

// optFloat is a float flag that remembers whether it was given.
type optFloat struct {
	v   float64
	set bool
}

func (o *optFloat) String() string {
	if !o.set {
		return ""
	}
	return fmt.Sprint(o.v)
}

func (o *optFloat) Set(s string) error {
	v, err := parseFinite(s)
	if err != nil {
		return err
	}
	o.v, o.set = v, true
	return nil
}

// newFlagSet returns a flag set that reports errors as a usage error instead
// of printing the whole usage text.
func newFlagSet(name string) *flag.FlagSet {
	fs := flag.NewFlagSet("hatsieve "+name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	return fs
}

// parse parses args, turning flag errors into one-line usage errors. Help
// (-h) prints the command's options to stdout.
func parse(fs *flag.FlagSet, args []string, e env) error {
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			fmt.Fprint(e.stdout, usageOf(fs))
			return err
		}
		return usagef("%s: %s", strings.TrimPrefix(fs.Name(), "hatsieve "), twoDashes(err.Error()))
	}
	return nil
}

// commandHelp says in a sentence or two what a command does, for its --help.
var commandHelp = map[string]string{
	"check": "Loads the library files together, as 'rank -l A -l B' would, and reports every problem,\n" +
		"one line each (FILE:LINE: field: what is wrong); with no file it checks the embedded library.\n" +
		"Exit status 0 when the files are fine, 1 when a problem was found.",
}

// flagInMessage finds a flag name as the flag package writes it in its
// errors ("flag provided but not defined: -x", "invalid value ... for flag
// -top: ...").
var flagInMessage = regexp.MustCompile(`(flag|defined:|argument:|for) -([A-Za-z][A-Za-z0-9_-]*)`)

// twoDashes writes the flags named in a flag package error with two dashes,
// as every message and the README write them.
func twoDashes(msg string) string { return flagInMessage.ReplaceAllString(msg, "$1 --$2") }

func cmdVersion(args []string, e env) error {
	fs := newFlagSet("version")
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("version takes no arguments")
	}
	fmt.Fprintln(e.stdout, "hatsieve", version)
	return nil
}
