package main

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/hatsieve/hatsieve/thermo"
)

// cmdSolvents prints the built-in solvent table.
func cmdSolvents(args []string, e env) error {
	fs := newFlagSet("solvents")
	var c common
	c.register(fs)
	format := fs.String("format", "text", "output format: text or json")
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("solvents: unexpected argument %q", fs.Arg(0))
	}
	if *format != "text" && *format != "json" {
		return usagef("solvents: --format: want text or json, got %q", *format)
	}
	if c.cg.set {
		return usagef("solvents: --cg applies to one solvent; use it with bdfe or rank")
	}
	cond, units, err := c.conditions(nil)
	if err != nil {
		return err
	}
	return writeSolvents(e.stdout, thermo.Builtin().All(), cond, units, *format)
}

func writeSolvents(w io.Writer, list []*thermo.Solvent, cond thermo.Conditions, units thermo.Units, format string) error {
	sfx := units.Suffix()
	if format == "json" {
		out := make([]object, 0, len(list))
		for _, s := range list {
			o := object{}.add("name", s.Key).add("aliases", nonNil(s.Aliases))
			var src []string
			if cg, err := cond.CGOf(s); err == nil {
				o = o.add("c_g_"+sfx, round(units.From(cg.V))).add("c_g_ref", s.Ref.String())
				src = append(src, "C_G: "+cg.Source+" ("+string(cg.Status)+")")
				o = o.add("c_g_status", string(cg.Status))
			} else {
				o = o.add("c_g_"+sfx, nil).add("c_g_ref", nil).add("c_g_status", nil)
			}
			if gh, err := cond.H2LineOf(s); err == nil {
				o = o.add("h2_line_"+sfx, round(units.From(gh.V)))
				src = append(src, "H2 line: "+gh.Source+" ("+string(gh.Status)+")")
			} else {
				o = o.add("h2_line_"+sfx, nil)
			}
			o = o.add("source", strings.Join(src, "; ")).add("c_g_basis", cond.Basis.String())
			out = append(out, o)
		}
		b, err := json.MarshalIndent(out, "", "  ")
		if err != nil {
			return err
		}
		_, err = fmt.Fprintln(w, string(b))
		return err
	}
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "solvent\taliases\tC_G (%v basis)\tvs\tH2 line\tE°(H+/H2)\tstatus\n", cond.Basis)
	for _, s := range list {
		cgs, ref, st := "–", "–", ""
		if cg, err := cond.CGOf(s); err == nil {
			cgs, ref, st = fmt.Sprintf("%.1f", units.From(cg.V)), s.Ref.String(), string(cg.Status)
		}
		ghs := "–"
		if gh, err := cond.H2LineOf(s); err == nil {
			ghs = fmt.Sprintf("%.1f", units.From(gh.V))
			if st == "" {
				st = string(gh.Status)
			}
		}
		eh := "–"
		if s.EH2 != nil {
			eh = fmt.Sprintf("%+.3f V", s.EH2.V)
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", s.Key, strings.Join(s.Aliases, ", "), cgs, ref, ghs, eh, st)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	_, err := fmt.Fprintf(w, "energies in %s; 'hatsieve solvents --format json' gives every source\n", units.Label())
	return err
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}
