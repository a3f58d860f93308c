package thermo

import (
	"errors"
	"fmt"
	"math"
)

// Role says which side of a pair a couple may play.
type Role uint8

const (
	RoleDonor    Role = 1 << iota // gives its H atom: X–H → X• + H•
	RoleAcceptor                  // its X• (or unsaturated form) takes an H atom
	RoleBoth     = RoleDonor | RoleAcceptor
)

func (r Role) String() string {
	switch r {
	case RoleDonor:
		return "donor"
	case RoleAcceptor:
		return "acceptor"
	case RoleBoth:
		return "donor;acceptor"
	}
	return "none"
}

// Route names how a BDFE was obtained (README, "The formulas").
type Route uint8

const (
	RouteNone          Route = iota
	RouteDirect              // a BDFE given directly
	RouteBDE                 // a BDE converted to a BDFE
	RouteProtonFirst         // pKa(XH) and E°(X•/X⁻)
	RouteElectronFirst       // pKa(XH•+) and E°(XH•+/XH)
	RouteCombined            // pKa of an acid and E° of a reductant or electrode
	RoutePH                  // water: pH and E°′(X, H+/X–H) at that pH
)

var routeNames = [...]string{"none", "direct", "from BDE", "pKa + E°(X•/X⁻)", "pKa(XH•+) + E°(XH•+/XH)", "acid pKa + reductant E°", "pH + E°′(X, H+/X–H)"}

func (r Route) String() string { return routeNames[r] }

// Short is a one-word name of the route for narrow table columns.
func (r Route) Short() string {
	return [...]string{"-", "direct", "BDE", "PT-ET", "ET-PT", "acid+red", "pH+E°′"}[r]
}

// Inputs are the data known for one couple. Any field may be nil.
type Inputs struct {
	BDFE *Value
	BDE  *Value

	PKa       *Value     // pKa(X–H)
	EAnion    *Potential // E°(X•/X⁻)
	PKaCation *Value     // pKa(XH•+)
	ECation   *Potential // E°(XH•+/XH)

	// A combined donor: an acid and an electron source.
	AcidPKa   *Value
	Reductant *Potential // E°(Red+/Red), or an electrode potential

	// PH, in water, is the pH at which the couple's potentials are formal
	// potentials E°′; EPCET is then E°′(X, H+/X–H) of the one-proton,
	// one-electron couple at that pH, giving BDFE = 2.303RT·pH + F·E°′ + C_G.
	PH    *float64
	EPCET *Potential

	// BDFEBasis is the basis a direct BDFE or BDE was reported on.
	// BasisGiven is false when the file did not say which basis that was;
	// it is then taken on the working basis.
	BDFEBasis  Basis
	BasisGiven bool
}

// Couple is one X–H bond with its data, as thermo sees it.
type Couple struct {
	ID      string
	Name    string
	Bond    string
	Solvent *Solvent
	In      Inputs

	// Index is the caller's own: data gives each couple its place in the
	// library, to find its record of the couple by. thermo never reads it.
	Index int32
	Roles Role
}

// Conditions are the choices that every computation depends on.
type Conditions struct {
	Basis Basis
	// Temperature (kelvin; 0 means DefaultTemperature) sets only what depends
	// on RT downstream of the free energies: log10 K = −ΔG°/(2.303RT). BDFEs,
	// ΔG° and the H2 line stay 298.15 K quantities (see BDFETemperature).
	Temperature float64
	// CG overrides C_G for individual solvents, keyed by Solvent.Key.
	CG map[string]float64
	// PH2 is the H2 pressure in atm; 0 means the standard 1 atm. The H2
	// line in force moves with it (see H2PressureTerm).
	PH2 float64
	// CGSigma is the σ of an explicit C_G in CG, keyed likewise. Without an
	// entry the table's σ for that solvent on the basis in force is taken,
	// or DefaultSigmaCG where the table has none.
	CGSigma map[string]float64
	// PH is the pH of aqueous inputs that state none (the command line's
	// --ph); nil when not given.
	PH *float64
}

// BDFETemperature is the temperature of every BDFE, ΔG° and H2 line: the pKa
// and E° values behind them were measured at 298.15 K, so their 2.303RT
// terms use it whatever Conditions.Temperature is.
const BDFETemperature = DefaultTemperature

// DefaultSigmaCG is the σ of an explicit C_G given without one, where the
// table has no value for the solvent (common practice, no source).
const DefaultSigmaCG = 1.0

// T returns the temperature in kelvin used for log10 K.
func (c Conditions) T() float64 {
	if c.Temperature == 0 {
		return DefaultTemperature
	}
	return c.Temperature
}

// Explicit reports whether C_G for s was given explicitly (--cg).
func (c Conditions) Explicit(s *Solvent) bool {
	_, ok := c.CG[s.Key]
	return ok
}

// BasisLabel names the C_G basis in force for s: "explicit" for a C_G given
// explicitly, else "2010" or "2022".
func (c Conditions) BasisLabel(s *Solvent) string {
	if s != nil && c.Explicit(s) {
		return "explicit"
	}
	return c.Basis.String()
}

// CGOf returns the C_G in force for s, with its σ: an explicit one carries
// its CGSigma entry, or the table's σ on the basis in force, or
// DefaultSigmaCG.
func (c Conditions) CGOf(s *Solvent) (Number, error) {
	v, ok := c.CG[s.Key]
	if !ok {
		return s.CG(c.Basis, nil)
	}
	n := Number{V: v, Source: "given explicitly", Status: UserGiven}
	if sg, ok := c.CGSigma[s.Key]; ok {
		n.Sigma = sg
		n.Source += fmt.Sprintf(", σ %.2g given", sg)
	} else if t, err := s.CG(c.Basis, nil); err == nil {
		n.Sigma = t.Sigma
		n.Source += fmt.Sprintf(", σ %.2g from the %v-basis table", t.Sigma, c.Basis)
	} else {
		n.Sigma = DefaultSigmaCG
		n.Source += fmt.Sprintf(", σ %.2g assumed (common practice)", DefaultSigmaCG)
	}
	return n, nil
}

// H2LineOf returns the H2 line in force for s, at the H2 pressure in force.
func (c Conditions) H2LineOf(s *Solvent) (Number, error) {
	n, err := c.h2LineStandard(s)
	n.V -= c.H2Shift()
	return n, err
}

// h2LineStandard is the H2 line in force for s at 1 atm H2.
func (c Conditions) h2LineStandard(s *Solvent) (Number, error) {
	if s.IsGas() || !c.Explicit(s) {
		return s.H2Line(c.Basis, nil)
	}
	cg, err := c.CGOf(s)
	if err != nil {
		return Number{}, err
	}
	return s.h2LineWith(cg)
}

// RouteValue is the BDFE from one route.
type RouteValue struct {
	Route  Route
	Energy Energy
	Note   string // a conversion that was applied, if any
}

// Tendency classes a donor's H2 margin m with uncertainty σ.
type Tendency uint8

const (
	Uphill   Tendency = iota // m > 2σ: H2 evolution is uphill
	NearLine                 // |m| ≤ 2σ
	Downhill                 // m < −2σ: two X–H give H2 downhill
)

func (t Tendency) String() string {
	return [...]string{"uphill", "near line", "downhill"}[t]
}

// Symbol is a one-character mark so colour is never the only signal.
func (t Tendency) Symbol() string { return [...]string{"▲", "≈", "▼"}[t] }

// ParseTendency reads "uphill", "near line" (or "near", "near-line") or "downhill".
func ParseTendency(s string) (Tendency, error) {
	switch normName(s) {
	case "uphill", "up":
		return Uphill, nil
	case "nearline", "near", "near-line", "near_line":
		return NearLine, nil
	case "downhill", "down":
		return Downhill, nil
	}
	return Uphill, fmt.Errorf("unknown H2 tendency %q (want downhill, near line or uphill)", s)
}

// Classify returns the tendency of a margin.
func Classify(m Energy) Tendency {
	s := m.Sigma()
	switch {
	case m.Kcal < -2*s:
		return Downhill
	case m.Kcal > 2*s:
		return Uphill
	}
	return NearLine
}

// Closure reports two routes to one BDFE that disagree beyond their
// combined uncertainty: the cycle does not close.
type Closure struct {
	A, B RouteValue
	Gap  float64 // A − B, kcal/mol
	Sig  float64 // combined σ of the gap
}

// Resolved is a couple with everything thermo derived for it under a set of
// conditions.
//
// A large library holds one of these per couple, so the fields are laid out
// to leave no padding, and the H2 line is shared by the couples of a
// solvent.
type Resolved struct {
	Couple *Couple
	BDFE   Energy
	Routes []RouteValue // every route the data allow, the chosen one first
	// Closure is non-nil when two routes disagree beyond 2σ combined.
	Closure *Closure

	H2Line *Number  // of the couple's solvent, shared: never written through
	Margin Energy   // BDFE − G_H; C_G cancels for a cycle-derived BDFE
	Notes  []string // conversions applied and values assumed

	Route    Route
	Tendency Tendency
}

// ErrNoRoute is returned for a couple with neither a BDFE nor data for a route.
var ErrNoRoute = errors.New("no BDFE and no pKa/E° pair to derive one")

// Cycle returns 2.303RT·pKa + F·E° + C_G for a pKa and a potential in solvent
// s, with the potential converted to the solvent's C_G reference.
func Cycle(pka Value, e Potential, s *Solvent, c Conditions) (Energy, string, error) {
	return cycleAt(pka, e, s, c, c.PH)
}

// cycleAt is Cycle with the pH a potential vs RHE is converted at.
func cycleAt(pka Value, e Potential, s *Solvent, c Conditions, pH *float64) (Energy, string, error) {
	if s.Ref == NoElectrode {
		// The gas phase: even with an explicit C_G there is no electrode to
		// refer E° to.
		return Energy{}, "", fmt.Errorf("%s has no reference electrode, so no pKa/E° cycle: give a BDFE or BDE directly", s.Name)
	}
	cg, err := c.CGOf(s)
	if err != nil {
		return Energy{}, "", err
	}
	ref, err := s.ConvertAt(e, s.Ref, pH)
	if err != nil {
		return Energy{}, "", err
	}
	note := ""
	if e.Vs != ref.Vs {
		note = fmt.Sprintf("E° %.3f V vs %v = %.3f V vs %v", e.V, e.Vs, ref.V, ref.Vs)
		if e.Vs == RHE {
			note += fmt.Sprintf(" at pH %g", *pH)
		}
		if n := s.ConversionNote(e.Vs); n != "" {
			note += "; " + n
		}
	}
	k := RTLn10(BDFETemperature)
	return Energy{
		Kcal:    k*pka.V + FaradayKcal*ref.V + cg.V,
		SigData: math.Hypot(k*pka.Sigma, FaradayKcal*ref.Sigma),
		SigCG:   cg.Sigma,
		CG:      s,
	}, note, nil
}

// Routes computes every BDFE route the couple's data allow, in order of
// preference: direct, BDE, proton first, electron first, combined.
func Routes(cp *Couple, c Conditions) ([]RouteValue, error) {
	return appendRoutes(nil, cp, c)
}

// appendRoutes appends the routes of Routes to out.
func appendRoutes(out []RouteValue, cp *Couple, c Conditions) ([]RouteValue, error) {
	in, s := cp.In, cp.Solvent
	n0 := len(out)
	var firstErr error
	keep := func(rv RouteValue, err error) {
		if err != nil {
			if firstErr == nil {
				firstErr = err
			}
			return
		}
		out = append(out, rv)
	}
	if in.BDFE != nil {
		keep(direct(*in.BDFE, in, s, c, RouteDirect))
	}
	if in.BDE != nil {
		keep(fromBDE(*in.BDE, in, s, c))
	}
	if in.PKa != nil && in.EAnion != nil {
		e, note, err := Cycle(in.PKa.WithDefaultSigma(DefaultSigmaPKa), withDefaultE(*in.EAnion), s, c)
		keep(RouteValue{RouteProtonFirst, e, note}, err)
	}
	if in.PKaCation != nil && in.ECation != nil {
		e, note, err := Cycle(in.PKaCation.WithDefaultSigma(DefaultSigmaPKa), withDefaultE(*in.ECation), s, c)
		keep(RouteValue{RouteElectronFirst, e, note}, err)
	}
	ph := in.PH
	if ph == nil {
		ph = c.PH
	}
	if in.AcidPKa != nil && in.Reductant != nil {
		e, note, err := cycleAt(in.AcidPKa.WithDefaultSigma(DefaultSigmaPKa), withDefaultE(*in.Reductant), s, c, ph)
		keep(RouteValue{RouteCombined, e, note}, err)
	}
	if in.EPCET != nil {
		keep(pcetRoute(*in.EPCET, ph, s, c))
	}
	if len(out) == n0 {
		if firstErr != nil {
			return nil, firstErr
		}
		return nil, ErrNoRoute
	}
	return out, nil
}

// pcetRoute is BDFE = 2.303RT·pH + F·E°′(X, H+/X–H) + C_G in water: the
// formal potential of the one-proton, one-electron couple at pH, vs NHE (or
// vs RHE, where the pH terms cancel). It holds while the pH lies between the
// pKa values of X–H•+ and X–H, so the couple stays 1H+/1e−. Source: Warren,
// Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §3.2 (aqueous PCET).
func pcetRoute(e Potential, ph *float64, s *Solvent, c Conditions) (RouteValue, error) {
	if s.Ref != NHE {
		return RouteValue{}, fmt.Errorf("a potential at a pH (E°′) needs water, not %s", s.Name)
	}
	if ph == nil {
		return RouteValue{}, fmt.Errorf("a potential at a pH (E°′) needs the pH (a ph field or --ph)")
	}
	pv := Value{V: *ph, Sigma: 0, SigmaGiven: true}
	en, note, err := cycleAt(pv, withDefaultE(e), s, c, ph)
	if err != nil {
		return RouteValue{}, err
	}
	if note != "" {
		note += "; "
	}
	note += fmt.Sprintf("2.303RT·pH %.2f kcal/mol with pH %g", RTLn10(BDFETemperature)**ph, *ph)
	return RouteValue{RoutePH, en, note}, nil
}

// withDefaultE gives a potential stated without an uncertainty the default σ
// (0.02 V, common practice), marked assumed.
func withDefaultE(p Potential) Potential {
	p.Value = p.Value.WithDefaultSigma(DefaultSigmaE)
	return p
}

func direct(v Value, in Inputs, s *Solvent, c Conditions, r Route) (RouteValue, error) {
	v = v.WithDefaultSigma(DefaultSigmaBDFE)
	rv := RouteValue{Route: r, Energy: Energy{Kcal: v.V, SigData: v.Sigma}}
	if in.BasisGiven && !s.IsGas() {
		shift, err := s.BasisShift(in.BDFEBasis, c.Basis)
		if err != nil {
			return rv, err
		}
		if in.BDFEBasis != BasisAbsolute {
			// A value reported on a C_G basis was found with that constant
			// (or calibrated against it): it carries C_G as a cycle value
			// does, so C_G cancels against other values of the solvent.
			if cg, err := c.CGOf(s); err == nil {
				rv.Energy.SigCG, rv.Energy.CG = cg.Sigma, s
			}
		}
		if shift != 0 {
			rv.Energy.Kcal += shift
			rv.Note = fmt.Sprintf("%v-basis value %.2f kcal/mol shifted by %+.2f to the %v basis", in.BDFEBasis, v.V, shift, c.Basis)
		}
	}
	return rv, nil
}

// BDEToBDFESigma is the uncertainty added by converting a BDE to a BDFE in
// solution: the entropy of X• and X–H is taken as equal. (Estimate.)
const BDEToBDFESigma = 1.0

func fromBDE(v Value, in Inputs, s *Solvent, c Conditions) (RouteValue, error) {
	v = v.WithDefaultSigma(DefaultSigmaBDFE)
	var delta float64
	var how string
	switch {
	case s.IsGas():
		delta = GasEntropyTerm(BDFETemperature)
		how = fmt.Sprintf("BDE %.2f − T·S°(H•) %.2f kcal/mol", v.V, delta)
	case s.CH != nil && s.CG2010 != nil:
		delta = s.CH.V - s.CG2010.V
		how = fmt.Sprintf("BDE %.2f − (C_H − C_G) %.2f kcal/mol", v.V, delta)
	default:
		return RouteValue{}, fmt.Errorf("no BDE-to-BDFE conversion is known for %s: give a BDFE", s.Name)
	}
	rv := RouteValue{Route: RouteBDE, Energy: Energy{Kcal: v.V - delta, SigData: math.Hypot(v.Sigma, BDEToBDFESigma)}, Note: how}
	if !s.IsGas() {
		// Bordwell's C_H sits on the 2010 basis unless the file says otherwise.
		from := Basis2010
		if in.BasisGiven {
			from = in.BDFEBasis
		}
		shift, err := s.BasisShift(from, c.Basis)
		if err != nil {
			return rv, err
		}
		if shift != 0 {
			rv.Energy.Kcal += shift
			rv.Note += fmt.Sprintf(", shifted by %+.2f kcal/mol to the %v basis", shift, c.Basis)
		}
	}
	return rv, nil
}

// Resolve derives the BDFE, its route, the closure check and the H2 margin of
// a couple.
func Resolve(cp *Couple, c Conditions) (Resolved, error) {
	routes, err := Routes(cp, c)
	if err != nil {
		return Resolved{}, err
	}
	gh, err := c.H2LineOf(cp.Solvent)
	if err != nil {
		return Resolved{}, err
	}
	var r Resolved
	fill(&r, cp, routes, &gh)
	return r, nil
}

// ResolveInto is Resolve for a caller that resolves many couples: gh is the
// H2 line of cp's solvent under c, as c.H2LineOf(cp.Solvent) returns it
// (found once per solvent rather than once per couple), and the routes are
// appended to routes[:0], so a slice with room saves an allocation. It
// sets *dst to what Resolve returns, or returns Resolve's error and leaves
// *dst unchanged.
func ResolveInto(dst *Resolved, cp *Couple, c Conditions, gh *Number, routes []RouteValue) error {
	routes, err := appendRoutes(routes[:0], cp, c)
	if err != nil {
		return err
	}
	fill(dst, cp, routes, gh)
	return nil
}

// fill sets *r to the resolution of cp from its routes and H2 line.
func fill(r *Resolved, cp *Couple, routes []RouteValue, gh *Number) {
	*r = Resolved{Couple: cp, BDFE: routes[0].Energy, Route: routes[0].Route, Routes: routes}
	for _, rv := range routes {
		if rv.Note != "" {
			r.Notes = append(r.Notes, rv.Route.String()+": "+rv.Note)
		}
	}
	for i := 1; i < len(routes) && r.Closure == nil; i++ {
		d := Diff(routes[0].Energy, routes[i].Energy)
		if math.Abs(d.Kcal) > 2*d.Sigma() {
			r.Closure = &Closure{A: routes[0], B: routes[i], Gap: d.Kcal, Sig: d.Sigma()}
		}
	}
	r.H2Line = gh
	r.Margin = H2Margin(r.BDFE, *gh, cp.Solvent)
	r.Tendency = Classify(r.Margin)
}

// H2Margin returns BDFE − G_H. For a BDFE that carries the solvent's C_G the
// C_G parts cancel (G_H = C_G + F·E°(H+/H2)), leaving σ of the data and of
// E°(H+/H2). Where E°(H+/H2) is unknown the line is the 2022-basis G_H moved
// with C_G (see Solvent.H2Line), so the C_G in force cancels and what remains
// is G_H(2022) − C_G(2022), each counted once. Otherwise the H2 line's full σ
// is added.
func H2Margin(b Energy, gh Number, s *Solvent) Energy {
	m := Energy{Kcal: b.Kcal - gh.V}
	if b.CG == s && s.EH2 != nil {
		m.SigData = math.Hypot(b.SigData, FaradayKcal*s.EH2.Sigma)
		return m
	}
	if b.CG == s && !s.IsGas() && s.GH != nil && s.CG2022 != nil {
		m.SigData = math.Sqrt(b.SigData*b.SigData + s.GH.Sigma*s.GH.Sigma + s.CG2022.Sigma*s.CG2022.Sigma)
		return m
	}
	m.SigData = math.Hypot(b.SigData, gh.Sigma)
	m.SigCG = b.SigCG
	return m
}
