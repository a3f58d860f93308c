package main

import (
	"cmp"
	"flag"
	"fmt"
	"strings"
)

// moreHelp says what each command does, for its --help, beside commandHelp.
var moreHelp = map[string]string{
	"bdfe": "Computes one BDFE from a pKa and a potential (BDFE = 2.303RT·pKa + F·E° + C_G), with its σ,\n" +
		"the H2 line of the solvent and the margin to it.",
	"rank": "Ranks every donor × acceptor pair of the library by ΔG°(HAT) = BDFE(donor) − BDFE(acceptor),\n" +
		"with each donor's margin to the H2 line.",
	"pair": "One donor against one acceptor: ΔG°, log K, the equilibrium conversion in a flask and, where both\n" +
		"couples have a self-exchange rate constant, the Marcus cross-relation rate estimate.",
	"window": "For one acceptor bond, the acid + reductant combinations (and the electrode potentials per acid)\n" +
		"strong enough to deliver H to it yet above the H2 line.",
	"library": "Lists the couples of the library (embedded, plus any -l file) with their BDFE on the basis in force,\n" +
		"source and status.",
	"solvents": "Lists the solvents with C_G on both bases, the H2 line, E°(H+/H2), the electrode offsets,\n" +
		"and the source and status of each constant.",
	"version": "Prints the version.",
}

// commonFlags are the options of the common struct, listed apart in --help.
var commonFlags = map[string]bool{"cg-basis": true, "cg": true, "cg-sigma": true, "units": true,
	"temperature": true, "p-h2": true, "ph": true}

// flagArg names the argument of a flag in --help where its type would say
// less ("value", "string").
var flagArg = map[string]string{
	"cg": "KCAL", "cg-sigma": "KCAL", "cg-basis": "2010|2022", "units": "kcal|kj", "temperature": "K",
	"p-h2": "ATM", "ph": "PH", "solvent": "S", "format": "FORMAT", "top": "N", "library": "FILE", "out": "FILE",
	"sort": "METRIC", "h2": "TENDENCY", "dg-min": "DG", "dg-max": "DG", "dg": "DG", "dg-sigma": "S",
	"pka": "P", "pka-sigma": "S", "e0": "V", "e0-sigma": "V", "vs": "REF", "margin": "E", "find": "TEXT",
	"bond": "X-H", "role": "donor|acceptor", "donor-m": "C", "acceptor-m": "C", "k-self-donor": "K1",
	"k-self-acceptor": "K2",
}

// usageOf is a command's --help: its lines of the top usage, what it does,
// its own options and the common ones, written with two dashes (a
// one-letter alias beside its long name: -l, --library FILE).
func usageOf(fs *flag.FlagSet) string {
	name := strings.TrimPrefix(fs.Name(), "hatsieve ")
	var b strings.Builder
	b.WriteString("usage:\n")
	b.WriteString(usageLines(name))
	if h := cmp.Or(commandHelp[name], moreHelp[name]); h != "" {
		b.WriteString("\n" + h + "\n")
	}
	short := map[string]string{} // long name → its one-letter alias
	fs.VisitAll(func(f *flag.Flag) {
		if a, ok := strings.CutPrefix(f.Usage, "same as -"); ok && fs.Lookup(a) != nil {
			short[f.Name] = a
		}
	})
	var own, shared strings.Builder
	fs.VisitAll(func(f *flag.Flag) {
		if len(f.Name) == 1 && fs.Lookup(longOf(short, f.Name)) != nil {
			return // shown with its long name
		}
		w := &own
		if commonFlags[f.Name] {
			w = &shared
		}
		writeFlag(w, fs, f, short[f.Name])
	})
	if own.Len() > 0 {
		b.WriteString("\noptions:\n" + own.String())
	}
	if shared.Len() > 0 {
		b.WriteString("\ncommon options:\n" + shared.String())
	}
	return b.String()
}

// usageLines returns the lines of topUsage for command name.
func usageLines(name string) string {
	var b strings.Builder
	in := false
	for _, l := range strings.Split(topUsage, "\n") {
		switch {
		case strings.HasPrefix(l, "  hatsieve "+name+" ") || l == "  hatsieve "+name:
			in = true
		case in && strings.HasPrefix(l, "        "):
		default:
			in = false
		}
		if in {
			b.WriteString(l + "\n")
		}
	}
	if b.Len() == 0 {
		return "  hatsieve " + name + " [options]\n"
	}
	return b.String()
}

func longOf(short map[string]string, a string) string {
	for long, s := range short {
		if s == a {
			return long
		}
	}
	return ""
}

// writeFlag writes one option of --help: its names and argument, then its
// use and default on the next line.
func writeFlag(w *strings.Builder, fs *flag.FlagSet, f *flag.Flag, alias string) {
	use := f.Usage
	if alias != "" {
		use = fs.Lookup(alias).Usage
	}
	arg, _ := flag.UnquoteUsage(f)
	if a, ok := flagArg[f.Name]; ok && arg != "" {
		arg = a
	}
	names := "--" + f.Name
	if alias != "" {
		names = "-" + alias + ", " + names
	}
	fmt.Fprintf(w, "  %s\n      %s", strings.TrimSpace(names+" "+arg), use)
	if f.DefValue != "" && f.DefValue != "false" && f.DefValue != "[]" && f.DefValue != "0" {
		fmt.Fprintf(w, " (default %s)", f.DefValue)
	}
	w.WriteString("\n")
}
