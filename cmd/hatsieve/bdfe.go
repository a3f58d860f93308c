package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/hatsieve/hatsieve/thermo"
)

// cmdBDFE derives one BDFE from a pKa and a potential (proton-first route, or
// the effective BDFE of an acid with a reductant or electrode potential), or,
// in water with --ph and no --pka, from a formal potential E°′(X, H+/X–H) at
// that pH: BDFE = 2.303RT·pH + F·E°′ + C_G.
func cmdBDFE(args []string, e env) error {
	fs := newFlagSet("bdfe")
	var bf bdfeFlags
	bf.register(fs)
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("bdfe: unexpected argument %q", fs.Arg(0))
	}
	if err := bf.check(); err != nil {
		return err
	}
	solvent, err := thermo.Builtin().Lookup(bf.solvent)
	if err != nil {
		return fmt.Errorf("bdfe: --solvent: %v", err)
	}
	cond, units, err := bf.c.conditions(solvent)
	if err != nil {
		return err
	}
	out := bdfeResult{cond: cond, units: units, solvent: solvent, withPKa: bf.pka.set}
	in, err := bf.inputs(solvent, &out)
	if err != nil {
		return err
	}
	cp := &thermo.Couple{ID: "input", Solvent: solvent, Roles: thermo.RoleDonor, In: in}
	if out.r, err = thermo.Resolve(cp, cond); err != nil {
		return fmt.Errorf("bdfe: %v", err)
	}
	if bf.format == "json" {
		return out.json(e.stdout)
	}
	return out.text(e.stdout)
}

// bdfeFlags are the options of 'hatsieve bdfe'.
type bdfeFlags struct {
	c                          common
	pka, e0, pkaSigma, e0Sigma optFloat
	solvent, vs, format        string
}

func (bf *bdfeFlags) register(fs *flag.FlagSet) {
	bf.c.register(fs)
	fs.StringVar(&bf.solvent, "solvent", "", "solvent name or alias (see 'hatsieve solvents')")
	fs.Var(&bf.pka, "pka", "pKa of the X–H bond, or of the acid (not needed in water with --ph)")
	fs.Var(&bf.e0, "e0", "E° of X•/X⁻, or of the reductant or electrode, in V; with --ph and no --pka, E°′(X, H+/X–H) at that pH")
	fs.StringVar(&bf.vs, "vs", "", "reference electrode of --e0: Fc+/Fc, SCE, NHE (SHE), Ag/AgCl, Ag/Ag+ (0.01 M AgNO3, MeCN), RHE (water, with --ph) (default: Fc+/Fc, NHE in water)")
	fs.Var(&bf.pkaSigma, "pka-sigma", "uncertainty of --pka (default 0.5, shown as assumed)")
	fs.Var(&bf.e0Sigma, "e0-sigma", "uncertainty of --e0 in V (default 0.02, shown as assumed)")
	fs.StringVar(&bf.format, "format", "text", "output format: text or json")
}

// check refuses missing or out-of-range options before any work.
func (bf *bdfeFlags) check() error {
	switch {
	case bf.solvent == "":
		return usagef("bdfe: --solvent is required")
	case !bf.pka.set && !bf.c.ph.set:
		return usagef("bdfe: --pka is required (or --ph in water)")
	case !bf.e0.set:
		return usagef("bdfe: --e0 is required")
	case bf.format != "text" && bf.format != "json":
		return usagef("bdfe: --format: want text or json, got %q", bf.format)
	}
	for _, s := range []struct {
		name string
		o    optFloat
	}{{"--pka-sigma", bf.pkaSigma}, {"--e0-sigma", bf.e0Sigma}} {
		if s.o.set && s.o.v < 0 {
			return fmt.Errorf("bdfe: %s: an uncertainty cannot be negative (%g)", s.name, s.o.v)
		}
	}
	if bf.pka.set && (bf.pka.v < -30 || bf.pka.v > 80) {
		return fmt.Errorf("bdfe: --pka %g is outside the range -30 to 80", bf.pka.v)
	}
	if math.Abs(bf.e0.v) > 5 {
		return fmt.Errorf("bdfe: --e0 %g V is outside the range -5 to +5 V", bf.e0.v)
	}
	return nil
}

// inputs turns the options into the couple's inputs: the potential (with its
// electrode, or the solvent's default marked assumed) and the pKa, each with
// the default σ where none was given; out keeps them for the report.
func (bf *bdfeFlags) inputs(solvent *thermo.Solvent, out *bdfeResult) (thermo.Inputs, error) {
	p := thermo.Potential{Value: thermo.Value{V: bf.e0.v, Sigma: bf.e0Sigma.v, SigmaGiven: true}, Vs: solvent.DefaultElectrode()}
	if !bf.e0Sigma.set {
		p.Value = thermo.Value{V: bf.e0.v}.WithDefaultSigma(thermo.DefaultSigmaE)
	}
	if bf.vs != "" {
		var err error
		if p.Vs, err = thermo.ParseElectrode(bf.vs); err != nil {
			return thermo.Inputs{}, usagef("bdfe: --vs: %v", err)
		}
	} else {
		p.VsAssumed = true
	}
	out.p = p
	if !bf.pka.set {
		return thermo.Inputs{EPCET: &out.p}, nil
	}
	pk := thermo.Value{V: bf.pka.v, Sigma: bf.pkaSigma.v, SigmaGiven: true}
	if !bf.pkaSigma.set {
		pk = thermo.Value{V: bf.pka.v}.WithDefaultSigma(thermo.DefaultSigmaPKa)
	}
	out.pk = pk
	return thermo.Inputs{EAnion: &out.p, PKa: &out.pk}, nil
}

// bdfeResult is one derived BDFE with what the output needs.
type bdfeResult struct {
	r       thermo.Resolved
	cond    thermo.Conditions
	units   thermo.Units
	solvent *thermo.Solvent
	p       thermo.Potential
	pk      thermo.Value
	withPKa bool
}

// vsRHE returns the input potential against RHE, in water at a pH.
func (b bdfeResult) vsRHE() (float64, bool) {
	if b.solvent.Ref != thermo.NHE || b.cond.PH == nil {
		return 0, false
	}
	q, err := b.solvent.ConvertAt(b.p, thermo.RHE, b.cond.PH)
	if err != nil {
		return 0, false
	}
	return q.V, true
}

func (b bdfeResult) json(w io.Writer) error {
	r, units, solvent, cond := b.r, b.units, b.solvent, b.cond
	cg, _ := cond.CGOf(solvent)
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
		add("c_g_basis", cond.BasisLabel(solvent)).
		add("temperature_k", cond.T()).
		add("p_h2_atm", cond.PH2Atm()).
		add("c_g_sigma_"+sfx, round(units.From(cg.Sigma))).
		add("c_g_status", string(cg.Status)).
		add("c_g_estimate", cg.Status == thermo.Estimate).
		add("h2_verdict_on_estimate", r.H2OnEstimate(cond)).
		add("bdfe_temperature_k", thermo.BDFETemperature).
		add("route", r.Route.String()).
		add("e_vs", b.p.Vs.String()).
		add("notes", strings.Join(r.Notes, "; "))
	if cond.PH != nil {
		o = o.add("ph", *cond.PH)
	}
	if v, ok := b.vsRHE(); ok {
		o = o.add("e_vs_rhe_v", round(v))
	}
	out, err := json.MarshalIndent(o, "", "  ")
	if err != nil {
		return err
	}
	_, err = fmt.Fprintln(w, string(out))
	return err
}

func (b bdfeResult) text(w io.Writer) error {
	r, units, solvent, cond := b.r, b.units, b.solvent, b.cond
	cg, _ := cond.CGOf(solvent)
	u := units.Label()
	k := thermo.RTLn10(thermo.BDFETemperature)
	fmt.Fprintf(w, "BDFE        %.1f ± %.1f %s  (%s, %s, C_G basis %s, 298.15 K)\n",
		units.From(r.BDFE.Kcal), units.From(r.BDFE.Sigma()), u, solvent.Name, r.Route, cond.BasisLabel(solvent))
	if b.withPKa {
		fmt.Fprintf(w, "  = 2.303RT·pKa %.2f + F·E° %.2f + C_G %.2f %s\n",
			units.From(k*b.pk.V), units.From(r.BDFE.Kcal-k*b.pk.V-cg.V), units.From(cg.V), u)
	} else {
		fmt.Fprintf(w, "  = 2.303RT·pH %.2f + F·E°′ %.2f + C_G %.2f %s\n",
			units.From(k**cond.PH), units.From(r.BDFE.Kcal-k**cond.PH-cg.V), units.From(cg.V), u)
	}
	for _, n := range r.Notes {
		fmt.Fprintf(w, "  %s\n", n)
	}
	if b.p.VsAssumed {
		fmt.Fprintf(w, "  E° taken as vs %v (no --vs given)\n", b.p.Vs)
	}
	switch {
	case b.withPKa && (b.pk.SigmaAssumed || b.p.SigmaAssumed):
		fmt.Fprintf(w, "  σ assumed: pKa ±%.2g, E° ±%.2g V (give --pka-sigma, --e0-sigma)\n", b.pk.Sigma, b.p.Sigma)
	case !b.withPKa && b.p.SigmaAssumed:
		fmt.Fprintf(w, "  σ assumed: E°′ ±%.2g V (give --e0-sigma)\n", b.p.Sigma)
	}
	if v, ok := b.vsRHE(); ok {
		fmt.Fprintf(w, "  E %.3f V vs RHE at pH %g\n", v, *cond.PH)
	}
	fmt.Fprintf(w, "C_G         %.2f ± %.2f %s vs %v (%s; %s)\n", units.From(cg.V), units.From(cg.Sigma), u, solvent.Ref, cg.Status, cg.Source)
	fmt.Fprintf(w, "H2 line     %.2f %s (%s) at p(H2) %g atm\n", units.From(r.H2Line.V), u, r.H2Line.Status, cond.PH2Atm())
	fmt.Fprintf(w, "H2 margin   %+.1f ± %.1f %s = %+.3f V vs H2: %s %s\n",
		units.From(r.Margin.Kcal), units.From(r.Margin.Sigma()), u, thermo.PotentialVsH2(r.Margin), r.Tendency.Symbol(), r.Tendency)
	_, err := fmt.Fprintf(w, "conditions  %s\n", thermo.ConditionsText(cond, solvent, units))
	return err
}
