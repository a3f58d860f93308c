package main

import (
	"encoding/json"
	"fmt"
	"math"

	"github.com/hatsieve/hatsieve/thermo"
)

// cmdBDFE derives one BDFE from a pKa and a potential (proton-first route, or
// the effective BDFE of an acid with a reductant or electrode potential).
func cmdBDFE(args []string, e env) error {
	fs := newFlagSet("bdfe")
	var c common
	c.register(fs)
	var pka, e0, pkaSigma, e0Sigma optFloat
	solventName := fs.String("solvent", "", "solvent name or alias (see 'hatsieve solvents')")
	fs.Var(&pka, "pka", "pKa of the X–H bond, or of the acid")
	fs.Var(&e0, "e0", "E° of X•/X⁻, or of the reductant or electrode, in V")
	vs := fs.String("vs", "", "reference electrode of --e0: Fc+/Fc, SCE, NHE (SHE), Ag/AgCl (default: Fc+/Fc, NHE in water)")
	fs.Var(&pkaSigma, "pka-sigma", "uncertainty of --pka (default 0.5, shown as assumed)")
	fs.Var(&e0Sigma, "e0-sigma", "uncertainty of --e0 in V (default 0.02, shown as assumed)")
	format := fs.String("format", "text", "output format: text or json")
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("bdfe: unexpected argument %q", fs.Arg(0))
	}
	switch {
	case *solventName == "":
		return usagef("bdfe: --solvent is required")
	case !pka.set:
		return usagef("bdfe: --pka is required")
	case !e0.set:
		return usagef("bdfe: --e0 is required")
	case *format != "text" && *format != "json":
		return usagef("bdfe: --format: want text or json, got %q", *format)
	}
	for _, s := range []struct {
		name string
		o    optFloat
	}{{"--pka-sigma", pkaSigma}, {"--e0-sigma", e0Sigma}} {
		if s.o.set && s.o.v < 0 {
			return fmt.Errorf("bdfe: %s: an uncertainty cannot be negative (%g)", s.name, s.o.v)
		}
	}
	if pka.v < -30 || pka.v > 80 {
		return fmt.Errorf("bdfe: --pka %g is outside the range -30 to 80", pka.v)
	}
	if math.Abs(e0.v) > 5 {
		return fmt.Errorf("bdfe: --e0 %g V is outside the range -5 to +5 V", e0.v)
	}
	table := thermo.Builtin()
	solvent, err := table.Lookup(*solventName)
	if err != nil {
		return fmt.Errorf("bdfe: --solvent: %v", err)
	}
	cond, units, err := c.conditions(solvent)
	if err != nil {
		return err
	}
	p := thermo.Potential{Value: thermo.Value{V: e0.v, Sigma: e0Sigma.v, SigmaGiven: true}, Vs: solvent.DefaultElectrode()}
	if !e0Sigma.set {
		p.Value = thermo.Value{V: e0.v}.WithDefaultSigma(thermo.DefaultSigmaE)
	}
	if *vs != "" {
		if p.Vs, err = thermo.ParseElectrode(*vs); err != nil {
			return usagef("bdfe: --vs: %v", err)
		}
	} else {
		p.VsAssumed = true
	}
	pk := thermo.Value{V: pka.v, Sigma: pkaSigma.v, SigmaGiven: true}
	if !pkaSigma.set {
		pk = thermo.Value{V: pka.v}.WithDefaultSigma(thermo.DefaultSigmaPKa)
	}
	cp := &thermo.Couple{ID: "input", Solvent: solvent, Roles: thermo.RoleDonor,
		In: thermo.Inputs{PKa: &pk, EAnion: &p}}
	r, err := thermo.Resolve(cp, cond)
	if err != nil {
		return fmt.Errorf("bdfe: %v", err)
	}
	cg, _ := cond.CGOf(solvent)
	if *format == "json" {
		sfx := units.Suffix()
		o := object{}.
			add("bdfe_"+sfx, round(units.From(r.BDFE.Kcal))).
			add("sigma_"+sfx, round(units.From(r.BDFE.Sigma()))).
			add("solvent", solvent.Key).
			add("c_g_"+sfx, round(units.From(cg.V))).
			add("h2_line_"+sfx, round(units.From(r.H2Line.V))).
			add("h2_margin_"+sfx, round(units.From(r.Margin.Kcal))).
			add("h2_margin_sigma_"+sfx, round(units.From(r.Margin.Sigma()))).
			add("h2_tendency", r.Tendency.String()).
			add("potential_vs_h2_v", round(thermo.PotentialVsH2(r.Margin))).
			add("c_g_basis", cond.Basis.String()).
			add("temperature_k", cond.T()).
			add("p_h2_atm", cond.PH2Atm())
		out, err := json.MarshalIndent(o, "", "  ")
		if err != nil {
			return err
		}
		fmt.Fprintln(e.stdout, string(out))
		return nil
	}
	u := units.Label()
	w := e.stdout
	fmt.Fprintf(w, "BDFE        %.1f ± %.1f %s  (%s, %s, C_G basis %v, %.2f K)\n",
		units.From(r.BDFE.Kcal), units.From(r.BDFE.Sigma()), u, solvent.Name, r.Route, cond.Basis, cond.T())
	fmt.Fprintf(w, "  = 2.303RT·pKa %.2f + F·E° %.2f + C_G %.2f %s\n",
		units.From(thermo.RTLn10(cond.T())*pk.V), units.From(r.BDFE.Kcal-thermo.RTLn10(cond.T())*pk.V-cg.V), units.From(cg.V), u)
	for _, n := range r.Notes {
		fmt.Fprintf(w, "  %s\n", n)
	}
	if p.VsAssumed {
		fmt.Fprintf(w, "  E° taken as vs %v (no --vs given)\n", p.Vs)
	}
	if pk.SigmaAssumed || p.SigmaAssumed {
		fmt.Fprintf(w, "  σ assumed: pKa ±%.2g, E° ±%.2g V (give --pka-sigma, --e0-sigma)\n", pk.Sigma, p.Sigma)
	}
	fmt.Fprintf(w, "C_G         %.2f %s vs %v (%s; %s)\n", units.From(cg.V), u, solvent.Ref, cg.Status, cg.Source)
	fmt.Fprintf(w, "H2 line     %.2f %s (%s) at p(H2) %g atm\n", units.From(r.H2Line.V), u, r.H2Line.Status, cond.PH2Atm())
	fmt.Fprintf(w, "H2 margin   %+.1f ± %.1f %s = %+.3f V vs H2: %s %s\n",
		units.From(r.Margin.Kcal), units.From(r.Margin.Sigma()), u, thermo.PotentialVsH2(r.Margin), r.Tendency.Symbol(), r.Tendency)
	return nil
}
