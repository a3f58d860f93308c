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
	if format == "json" {
		out := make([]object, 0, len(list))
		for _, s := range list {
			out = append(out, solventObject(s, cond, units))
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
			cgs, ref, st = fmt.Sprintf("%.1f ± %.1f", units.From(cg.V), units.From(cg.Sigma)), s.Ref.String(), string(cg.Status)
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
	_, err := fmt.Fprintf(w, "energies in %s; BDFEs and C_G at 298.15 K; 'estimate' marks a constant no source gives "+
		"(outside MeCN and water the 2022 C_G is one); 'hatsieve solvents --format json' gives every source\n", units.Label())
	return err
}

// solventObject is one solvent's JSON entry: the constants in force, then
// C_G on both bases with source and status, the H2 line's σ and status,
// E°(H+/H2) and the electrode conversions. Every entry has the same keys.
func solventObject(s *thermo.Solvent, cond thermo.Conditions, units thermo.Units) object {
	sfx := units.Suffix()
	o := object{}.add("name", s.Key).add("aliases", nonNil(s.Aliases))
	var src []string
	cgSigma := any(nil)
	if cg, err := cond.CGOf(s); err == nil {
		o = o.add("c_g_"+sfx, round(units.From(cg.V))).add("c_g_ref", s.Ref.String())
		src = append(src, "C_G: "+cg.Source+" ("+string(cg.Status)+")")
		o = o.add("c_g_status", string(cg.Status))
		cgSigma = round(units.From(cg.Sigma))
	} else {
		o = o.add("c_g_"+sfx, nil).add("c_g_ref", nil).add("c_g_status", nil)
	}
	ghSigma, ghStatus := any(nil), any(nil)
	if gh, err := cond.H2LineOf(s); err == nil {
		o = o.add("h2_line_"+sfx, round(units.From(gh.V)))
		src = append(src, "H2 line: "+gh.Source+" ("+string(gh.Status)+")")
		ghSigma, ghStatus = round(units.From(gh.Sigma)), string(gh.Status)
	} else {
		o = o.add("h2_line_"+sfx, nil)
	}
	o = o.add("source", strings.Join(src, "; ")).add("c_g_basis", cond.Basis.String()).
		add("c_g_sigma_"+sfx, cgSigma).add("h2_line_sigma_"+sfx, ghSigma).add("h2_line_status", ghStatus).
		add("on_estimate", !s.IsGas() && cond.OnEstimate(s))
	for _, b := range []struct {
		name string
		n    *thermo.Number
	}{{"2010", s.CG2010}, {"2022", s.CG2022}} {
		k := "c_g_" + b.name
		if b.n == nil {
			o = o.add(k+"_"+sfx, nil).add(k+"_sigma_"+sfx, nil).add(k+"_source", nil).add(k+"_status", nil)
		} else {
			o = o.add(k+"_"+sfx, round(units.From(b.n.V))).add(k+"_sigma_"+sfx, round(units.From(b.n.Sigma))).
				add(k+"_source", b.n.Source).add(k+"_status", string(b.n.Status))
		}
	}
	o = o.add("c_g_2022_estimate", s.CGEstimated(thermo.Basis2022))
	if s.EH2 != nil {
		o = o.add("e_h2_v", s.EH2.V).add("e_h2_source", s.EH2.Source)
	} else {
		o = o.add("e_h2_v", nil).add("e_h2_source", nil)
	}
	return o.add("conversions", conversions(s)).add("note", s.Note)
}

// conversions lists the electrodes a potential may be quoted against in s,
// each with E(vs reference) = E(vs electrode) + offset_v.
func conversions(s *thermo.Solvent) []object {
	out := []object{}
	for _, e := range thermo.Electrodes {
		if e == s.Ref {
			continue
		}
		if e == thermo.RHE {
			if s.Ref == thermo.NHE {
				out = append(out, object{}.add("vs", e.String()).add("offset_v", nil).add("sigma_v", 0.0).
					add("source", "E(NHE) = E(RHE) − 0.05916·pH at 298.15 K (Nernst, CODATA constants); needs a pH").
					add("status", string(thermo.Derived)).add("aqueous_offset", false))
			}
			continue
		}
		n, ok := s.Offsets[e]
		if !ok {
			continue
		}
		out = append(out, object{}.add("vs", e.String()).add("offset_v", n.V).add("sigma_v", round(n.Sigma)).
			add("source", n.Source).add("status", string(n.Status)).add("aqueous_offset", s.AqueousConversion(e)))
	}
	return out
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}
