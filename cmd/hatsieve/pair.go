package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// pairConfig holds the options of 'hatsieve pair': one donor with one
// acceptor, from the library or from numbers typed in.
type pairConfig struct {
	evalConfig
	donorM, acceptorM float64
	format            string
	dg, dgSigma       optFloat
	kDonor, kAcceptor optFloat
}

func (pc *pairConfig) register(fs *flag.FlagSet) {
	pc.evalConfig.register(fs)
	fs.Float64Var(&pc.donorM, "donor-m", thermo.DefaultDonorM, "initial [D–H] in mol/L, for the equilibrium conversion")
	fs.Float64Var(&pc.acceptorM, "acceptor-m", thermo.DefaultAcceptorM, "initial [A] in mol/L, for the equilibrium conversion")
	fs.StringVar(&pc.format, "format", "text", "output format: text or json")
	fs.Var(&pc.dg, "dg", "ΔG°(HAT) in --units: compute from this number instead of a library pair")
	fs.Var(&pc.dgSigma, "dg-sigma", "σ of --dg, in --units")
	fs.Var(&pc.kDonor, "k-self-donor", "self-exchange rate constant of the donor's couple, M⁻¹ s⁻¹ (wins over the library)")
	fs.Var(&pc.kAcceptor, "k-self-acceptor", "self-exchange rate constant of the acceptor's couple, M⁻¹ s⁻¹ (wins over the library)")
}

// parseInterspersed parses args with fs, allowing flags after the
// positional arguments (hatsieve pair D A -l FILE), and returns the
// positional ones.
func parseInterspersed(fs *flag.FlagSet, args []string, e env) ([]string, error) {
	var pos []string
	for {
		if err := parse(fs, args, e); err != nil {
			return nil, err
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return pos, nil
		}
		if rest[0] == "--" {
			return append(pos, rest[1:]...), nil
		}
		pos, args = append(pos, rest[0]), rest[1:]
	}
}

// check validates the pair options that need no library.
func (pc *pairConfig) check() error {
	if pc.format != "text" && pc.format != "json" {
		return usagef("pair: --format: want text or json, got %q", pc.format)
	}
	for _, c := range []struct {
		name string
		v    float64
	}{{"--donor-m", pc.donorM}, {"--acceptor-m", pc.acceptorM}} {
		if !(c.v > 0) || math.IsInf(c.v, 0) {
			return usagef("pair: %s: want a concentration above 0 mol/L, got %g", c.name, c.v)
		}
	}
	for _, k := range []struct {
		name string
		o    optFloat
	}{{"--k-self-donor", pc.kDonor}, {"--k-self-acceptor", pc.kAcceptor}} {
		if k.o.set && !(k.o.v > 0) {
			return usagef("pair: %s: want a rate constant above 0 M⁻¹ s⁻¹, got %g", k.name, k.o.v)
		}
	}
	if pc.dgSigma.set && pc.dgSigma.v < 0 {
		return usagef("pair: --dg-sigma: want 0 or more, got %g", pc.dgSigma.v)
	}
	return nil
}

// cmdPair computes one pairing: ΔG°, log K, the equilibrium conversion in a
// flask, the cross-relation rate estimate and the donor's H2 margin at the
// H2 pressure in force.
func cmdPair(args []string, e env) error {
	fs := newFlagSet("pair")
	var pc pairConfig
	pc.register(fs)
	pos, err := parseInterspersed(fs, args, e)
	if err != nil {
		return err
	}
	if err := pc.check(); err != nil {
		return err
	}
	if pc.dg.set {
		if len(pos) > 0 {
			return usagef("pair: with --dg, give no DONOR ACCEPTOR (got %q)", pos[0])
		}
		return pc.typed(e)
	}
	if pc.dgSigma.set {
		return usagef("pair: --dg-sigma only applies with --dg")
	}
	if len(pos) != 2 {
		return usagef("pair: want DONOR ACCEPTOR (two couple ids, a combined donor as ACID+REDUCTANT), or --dg DG")
	}
	return pc.library(e, pos[0], pos[1])
}

// userKSelf is a self-exchange constant typed on the command line.
func userKSelf(o optFloat) *thermo.SelfExchange {
	if !o.set {
		return nil
	}
	return &thermo.SelfExchange{K: o.v, Source: "command line", Status: "user"}
}

// pairResult is what pair computes, for either output.
type pairResult struct {
	cond     thermo.Conditions
	flask    thermo.Flask
	log10K   float64
	kD, kA   *thermo.SelfExchange
	est      thermo.FlaskEstimate
	combined bool
}

// typed is pair for numbers typed in: --dg with optional self-exchange
// constants.
func (pc *pairConfig) typed(e env) error {
	cond, u, err := pc.c.conditions(nil)
	if err != nil {
		return err
	}
	toKcal := func(v float64) float64 {
		if u == thermo.KJ {
			return v / thermo.JoulePerCalorie
		}
		return v
	}
	dg, sig := toKcal(pc.dg.v), toKcal(pc.dgSigma.v)
	k := thermo.RTLn10(cond.T())
	r := pairResult{cond: cond, flask: thermo.Flask{DonorM: pc.donorM, AcceptorM: pc.acceptorM},
		log10K: -dg / k, kD: userKSelf(pc.kDonor), kA: userKSelf(pc.kAcceptor)}
	if r.est, err = thermo.EstimateLogK(r.log10K, sig/k, cond, r.flask, r.kD, r.kA); err != nil {
		return err
	}
	sfx := u.Suffix()
	var sigma any
	if pc.dgSigma.set {
		sigma = round(u.From(sig))
	}
	o := object{}.
		add("dg_"+sfx, round(u.From(dg))).
		add("sigma_"+sfx, sigma)
	o = r.extra(o)
	if pc.format == "json" {
		return writeJSON(e.stdout, o)
	}
	fmt.Fprintf(e.stdout, "ΔG°(HAT) %+.2f %s (typed)%s | log K %.2f\n", u.From(dg), u.Label(), sigmaText(pc.dgSigma.set, u.From(sig)), r.log10K)
	return r.writeText(e.stdout, u)
}

func sigmaText(set bool, s float64) string {
	if !set {
		return ""
	}
	return fmt.Sprintf(" ± %.2f", s)
}

// extra appends the keys pair adds to a pair record.
func (r *pairResult) extra(o object) object {
	d, a := r.flask.Concentrations()
	var lk, f, sk any
	if r.est.Cross != nil {
		lk, f, sk = round(r.est.Cross.Log10K), sigFigs(r.est.Cross.F), round(r.est.Cross.Sigma10)
	}
	note := r.est.NoRate
	if r.est.Cross != nil {
		note = r.est.Cross.Note
	}
	o = o.add("log10_k_eq", round(r.log10K)).
		add("temperature_k", r.cond.T()).
		add("donor_m", d).
		add("acceptor_m", a).
		add("conversion_eq", sigFigs(r.est.Conversion.Fraction)).
		add("acceptor_left_eq", sigFigs(r.est.Conversion.Left)).
		add("stoichiometry", stoichiometry(r.combined)).
		add("log10_k_cross_m_s", lk).
		add("sigma_log10_k_cross", sk).
		add("f_cross", f).
		add("cross_out_of_range", r.est.Cross != nil && r.est.Cross.OutRange).
		add("cross_note", note).
		add("k_self_donor", kSelfObject(r.kD)).
		add("k_self_acceptor", kSelfObject(r.kA))
	var race any
	if r.est.Race != "" {
		race = r.est.Race
	}
	return o.add("h2_race", race)
}

func stoichiometry(combined bool) string {
	if combined {
		return "1:1:1 per H: one acid (H⁺) and one reductant (e⁻) per H delivered to one acceptor"
	}
	return "1:1:1: D–H + A ⇌ D + A–H"
}

func kSelfObject(k *thermo.SelfExchange) any {
	if k == nil {
		return nil
	}
	o := object{}.add("value_m_s", k.K)
	if k.Factor > 1 {
		o = o.add("factor", k.Factor)
	}
	return o.add("source", k.Source).add("status", k.Status)
}

func writeJSON(w io.Writer, o object) error {
	b, err := json.MarshalIndent(o, "", "  ")
	if err != nil {
		return err
	}
	_, err = fmt.Fprintln(w, string(b))
	return err
}

// writeText writes the flask and rate lines shared by both forms of pair.
func (r *pairResult) writeText(w io.Writer, u thermo.Units) error {
	d, a := r.flask.Concentrations()
	fmt.Fprintf(w, "conditions: %s\n", thermo.FlaskText(r.cond, &r.flask))
	fmt.Fprintf(w, "equilibrium (%s): %s of the acceptor converted, [A–H] = %.3g M, from [D–H]0 %g M and [A]0 %g M\n",
		stoichiometry(r.combined), percent(r.est.Conversion), r.est.Conversion.X, d, a)
	if r.est.Cross == nil {
		fmt.Fprintf(w, "rate: – (%s)\n", r.est.NoRate)
	} else {
		c := r.est.Cross
		sig := ""
		if c.Sigma10 > 0 {
			sig = fmt.Sprintf(" (± %.2f in log k from the inputs)", c.Sigma10)
		}
		fmt.Fprintf(w, "rate (cross relation): k ≈ 10^%.2f M⁻¹ s⁻¹%s, f = %.3g, λ ≈ %.0f %s, from k_self %s and %s\n",
			c.Log10K, sig, c.F, u.From(c.Lambda), u.Label(), kSelfText(r.kD), kSelfText(r.kA))
		fmt.Fprintf(w, "  %s\n", c.Note)
	}
	if r.est.Race != "" {
		fmt.Fprintln(w, r.est.Race)
	}
	return nil
}

// percent shows the conversion so that neither end rounds away: "50.0%",
// "100% − 1e-15", "1.2e-13%".
func percent(c thermo.Conversion) string {
	switch {
	case c.Left < 1e-4:
		return fmt.Sprintf("100%% (%.2g left)", c.Left)
	case c.Fraction < 1e-4:
		return fmt.Sprintf("%.2g%%", 100*c.Fraction)
	}
	return fmt.Sprintf("%.1f%%", 100*c.Fraction)
}

func kSelfText(k *thermo.SelfExchange) string {
	s := fmt.Sprintf("%.3g", k.K)
	if k.Factor > 1 {
		s += fmt.Sprintf(" ×/÷ %g", k.Factor)
	}
	return s + " M⁻¹ s⁻¹ (" + data.Printable(k.Source) + ", " + data.Printable(k.Status) + ")"
}

// library is pair for two couples of the library.
func (pc *pairConfig) library(e env, donorID, acceptorID string) error {
	ev, _, u, err := pc.evaluate(e)
	if err != nil {
		return err
	}
	d, err := findCouple(ev, donorID, thermo.RoleDonor)
	if err != nil {
		return err
	}
	a, err := findCouple(ev, acceptorID, thermo.RoleAcceptor)
	if err != nil {
		return err
	}
	if d == a {
		return fmt.Errorf("pair: %s with itself is a self-exchange, ΔG° = 0", donorID)
	}
	p := thermo.MakePair(d.R, a.R, ev.Cond)
	r := pairResult{cond: ev.Cond, flask: thermo.Flask{DonorM: pc.donorM, AcceptorM: pc.acceptorM},
		log10K: p.Log10K, kD: d.KSelf, kA: a.KSelf, combined: d.AcidID != ""}
	if k := userKSelf(pc.kDonor); k != nil {
		r.kD = k
	}
	if k := userKSelf(pc.kAcceptor); k != nil {
		r.kA = k
	}
	if r.est, err = thermo.EstimatePair(p, ev.Cond, r.flask, r.kD, r.kA, u); err != nil {
		return err
	}
	if pc.format == "json" {
		o := pairRecord(p, u, ev.Cond, ev.Working)
		return writeJSON(e.stdout, r.extra(o))
	}
	return writePairText(e.stdout, ev, p, d, a, &r, u)
}

// writePairText writes one pair for a terminal.
func writePairText(w io.Writer, ev *data.Evaluated, p thermo.Pair, d, a *data.Entry, r *pairResult, u thermo.Units) error {
	ul := u.Label()
	show := func(x *data.Entry, role string) {
		fmt.Fprintf(w, "%s %s (%s): BDFE %.2f ± %.2f %s via %v [%s, %s]\n", role, data.Printable(x.ID), data.Printable(nonEmptyText(x.Name, x.ID)),
			u.From(x.R.BDFE.Kcal), u.From(x.R.BDFE.Sigma()), ul, x.R.Route, data.Printable(x.Status), data.Printable(x.Source))
		if x.Note != "" {
			fmt.Fprintf(w, "  note: %s\n", data.Printable(x.Note))
		}
	}
	show(d, "donor")
	show(a, "acceptor")
	fmt.Fprintf(w, "ΔG°(HAT) %+.2f ± %.2f %s | log K %.2f%s\n", u.From(p.DG.Kcal), u.From(p.DG.Sigma()), ul, p.Log10K,
		map[bool]string{true: " | × cross-solvent", false: ""}[p.CrossSolvent])
	fmt.Fprintf(w, "donor H2 margin %+.2f ± %.2f %s at p(H2) %g atm: %s %v (H2 line %.2f %s)\n", u.From(d.R.Margin.Kcal), u.From(d.R.Margin.Sigma()), ul,
		ev.Cond.PH2Atm(), d.R.Tendency.Symbol(), d.R.Tendency, u.From(d.R.H2Line.V), ul)
	if p.H2Wins {
		fmt.Fprintf(w, "H2: the acceptor's bond (margin %+.2f %s) lies below the H2 line, so H2 formation beats H delivery to it\n", u.From(a.R.Margin.Kcal), ul)
	}
	for _, n := range p.Notes(ev.Cond) {
		fmt.Fprintf(w, "note: %s\n", data.Printable(n))
	}
	return r.writeText(w, u)
}

func nonEmptyText(s, alt string) string {
	if s == "" {
		return alt
	}
	return s
}

// findCouple returns the evaluated couple id in role, or an error that
// says why it is not there: unknown (with the nearest id), left out, in
// another solvent, or not able to play the role.
func findCouple(ev *data.Evaluated, id string, role thermo.Role) (*data.Entry, error) {
	what := map[thermo.Role]string{thermo.RoleDonor: "donor", thermo.RoleAcceptor: "acceptor"}[role]
	for _, x := range ev.All {
		if x.ID != id {
			continue
		}
		if x.Roles&role == 0 {
			return nil, fmt.Errorf("pair: %s %s cannot be a %s (roles: %v)", what, id, what, x.Roles)
		}
		return x, nil
	}
	for _, pr := range ev.Problems {
		if pr.Couple.ID == id {
			return nil, fmt.Errorf("pair: %s %v", what, pr)
		}
	}
	ids := make([]string, 0, len(ev.Lib.Couples))
	for _, c := range ev.Lib.Couples {
		if c.ID == id {
			return nil, fmt.Errorf("pair: %s %s is in %s, not the working solvent %s: add --cross, or --solvent %s", what, id, c.Solvent.Key, ev.Working.Key, c.Solvent.Key)
		}
		if c.Roles&role != 0 {
			ids = append(ids, c.ID)
		}
	}
	msg := fmt.Sprintf("pair: unknown %s %q", what, id)
	if n := thermo.Nearest(id, ids); n != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", n)
	}
	if strings.Contains(id, "+") && role == thermo.RoleDonor {
		if x, err := formCombined(ev, id); x != nil || err != nil {
			return x, err
		}
		msg += "; a combined donor is ACID+REDUCTANT with an acid and a reductant of the library"
	}
	return nil, fmt.Errorf("%s", msg)
}

// bothStatus is the status of a combined donor formed here: the parts'
// status when they agree, else both named.
func bothStatus(acid, red string) string {
	if acid == red {
		return acid
	}
	return "acid " + acid + ", reductant " + red
}

// formCombined forms the combined donor ACID+REDUCTANT that the library's
// combine list left out, as the loader forms the listed ones: effective
// BDFE 2.303RT·pKa(HA) + F·E°(Red) + C_G. It returns nil and no error when
// id does not name an acid and a reductant of the library.
func formCombined(ev *data.Evaluated, id string) (*data.Entry, error) {
	acidID, redID, _ := strings.Cut(id, "+")
	var acid *data.Acid
	var red *data.Reductant
	for _, a := range ev.Lib.Acids {
		if a.ID == acidID {
			acid = a
		}
	}
	for _, r := range ev.Lib.Reductants {
		if r.ID == redID {
			red = r
		}
	}
	if acid == nil || red == nil {
		return nil, nil
	}
	s := ev.Working
	for _, o := range []*thermo.Solvent{acid.Solvent, red.Solvent} {
		if o != nil && o != s {
			return nil, fmt.Errorf("pair: donor %s: the acid and the reductant must both be in the working solvent %s", id, ev.Working.Key)
		}
	}
	pka, e := acid.PKa, red.E
	if e.Vs == thermo.NoElectrode {
		e.Vs, e.VsAssumed = s.DefaultElectrode(), true
	}
	c := &data.Couple{
		Couple: thermo.Couple{ID: id, Name: nonEmptyText(acid.Name, acid.ID) + " + " + nonEmptyText(red.Name, red.ID),
			Bond: "H⁺ + e⁻", Roles: thermo.RoleDonor, Solvent: s, In: thermo.Inputs{AcidPKa: &pka, Reductant: &e}},
		Source: "acid: " + acid.Source + "; reductant: " + red.Source,
		Status: bothStatus(acid.Status, red.Status), Note: "formed for this pair: not in the library's combine list",
		AcidID: acid.ID, ReductantID: red.ID,
	}
	r, err := thermo.Resolve(&c.Couple, ev.Cond)
	if err != nil {
		return nil, fmt.Errorf("pair: donor %s: %v", id, err)
	}
	return &data.Entry{Couple: c, R: &r}, nil
}
