package thermo

import (
	"math"
	mrand "math/rand"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
	"testing/quick"
)

// Property tests: identities that follow from the definitions of the cycle,
// the pair metrics and the H2 line (README, "The formulas").
// Random inputs come from seeded generators so a failure can be replayed.

const loops = 2000

// cycleSolvents are the built-in solvents with a C_G on both bases.
var cycleSolvents = []string{"acetonitrile", "water", "dmso", "dmf", "thf", "methanol", "benzene"}

type gen struct {
	*rand.Rand
	tab *Table
}

func newGen(seed uint64) gen { return gen{rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15)), Builtin()} }

func (g gen) between(lo, hi float64) float64 { return lo + (hi-lo)*g.Float64() }

func (g gen) solvent() *Solvent { return g.tab.MustLookup(cycleSolvents[g.IntN(len(cycleSolvents))]) }

// electrode picks an electrode that potentials in s can be converted from.
func (g gen) electrode(s *Solvent) Electrode {
	ok := []Electrode{s.Ref}
	for e := range s.Offsets {
		ok = append(ok, e)
	}
	// map order is random; sort by value for a replayable pick
	for i := 1; i < len(ok); i++ {
		for j := i; j > 0 && ok[j] < ok[j-1]; j-- {
			ok[j], ok[j-1] = ok[j-1], ok[j]
		}
	}
	return ok[g.IntN(len(ok))]
}

func (g gen) value(lo, hi float64) *Value {
	return &Value{V: g.between(lo, hi), Sigma: g.between(0, 1)}
}

func (g gen) potential(s *Solvent) *Potential {
	return &Potential{Value: Value{V: g.between(-2.5, 2), Sigma: g.between(0, 0.05)}, Vs: g.electrode(s)}
}

// squareScheme returns inputs with all four legs of a square scheme that
// close exactly: pKa(XH), E°(X•/X⁻), pKa(XH•+) and E°(XH•+/XH).
func (g gen) squareScheme(s *Solvent) Inputs {
	k := RTLn10(DefaultTemperature)
	pka, ea := g.value(-5, 45), g.potential(s)
	pkc := g.value(-15, 20)
	eaRef, err := s.ToRef(*ea)
	if err != nil {
		panic(err)
	}
	// BDFE − C_G is the same both ways: k·pkc + F·ec = k·pka + F·ea.
	ec := &Potential{Value: Value{V: eaRef.V + k*(pka.V-pkc.V)/FaradayKcal, Sigma: g.between(0, 0.05)}, Vs: s.Ref}
	if e := g.electrode(s); e != s.Ref {
		conv, err := s.Convert(*ec, e)
		if err != nil {
			panic(err)
		}
		ec = &Potential{Value: Value{V: conv.V, Sigma: ec.Sigma}, Vs: e}
	}
	return Inputs{PKa: pka, EAnion: ea, PKaCation: pkc, ECation: ec}
}

// couple returns a random couple in s: a proton-first, electron-first or
// combined-donor cycle, or (with direct) a directly given BDFE.
func (g gen) couple(s *Solvent, direct bool) *Couple {
	in := Inputs{}
	n := 3
	if direct {
		n = 4
	}
	switch g.IntN(n) {
	case 0:
		in.PKa, in.EAnion = g.value(-5, 45), g.potential(s)
	case 1:
		in.PKaCation, in.ECation = g.value(-15, 20), g.potential(s)
	case 2:
		in.AcidPKa, in.Reductant = g.value(-5, 40), g.potential(s)
	case 3:
		in.BDFE = g.value(40, 120)
	}
	return &Couple{ID: "c", Solvent: s, In: in}
}

func mustResolve(t *testing.T, cp *Couple, c Conditions) *Resolved {
	t.Helper()
	r, err := Resolve(cp, c)
	if err != nil {
		t.Fatalf("Resolve: %v (inputs %+v in %s)", err, cp.In, cp.Solvent.Key)
	}
	return &r
}

func (g gen) conditions() Conditions {
	if g.IntN(2) == 0 {
		return on2010
	}
	return on2022
}

// ΔG°(D→A) = −ΔG°(A→D), with the same σ and opposite log K, in one solvent or across two.
func TestPropertyPairAntisymmetric(t *testing.T) {
	g := newGen(1)
	for i := range loops {
		c := g.conditions()
		sd, sa := g.solvent(), g.solvent()
		d := mustResolve(t, g.couple(sd, true), c)
		a := mustResolve(t, g.couple(sa, true), c)
		fwd, rev := MakePair(d, a, c), MakePair(a, d, c)
		if math.Abs(fwd.DG.Kcal+rev.DG.Kcal) > 1e-9 {
			t.Fatalf("case %d: ΔG(D→A) %.6f, ΔG(A→D) %.6f: not opposite", i, fwd.DG.Kcal, rev.DG.Kcal)
		}
		if math.Abs(fwd.DG.Sigma()-rev.DG.Sigma()) > 1e-12 {
			t.Fatalf("case %d: σ %.6f vs %.6f", i, fwd.DG.Sigma(), rev.DG.Sigma())
		}
		if math.Abs(fwd.Log10K+rev.Log10K) > 1e-9 {
			t.Fatalf("case %d: log K %.6f vs %.6f", i, fwd.Log10K, rev.Log10K)
		}
		if fwd.CrossSolvent != rev.CrossSolvent || fwd.CrossSolvent != (sd != sa) {
			t.Fatalf("case %d: cross-solvent marks %v/%v for %s/%s", i, fwd.CrossSolvent, rev.CrossSolvent, sd.Key, sa.Key)
		}
		// log K = −ΔG°/(2.303RT) (definition of K from ΔG° = −RT ln K).
		if math.Abs(fwd.Log10K*RTLn10(c.T())+fwd.DG.Kcal) > 1e-9 {
			t.Fatalf("case %d: log K %.6f does not match ΔG %.6f", i, fwd.Log10K, fwd.DG.Kcal)
		}
	}
}

// FuzzPairAntisymmetric is the same property over fuzzed direct BDFEs and σ.
func FuzzPairAntisymmetric(f *testing.F) {
	f.Add(84.8, 1.0, 66.5, 0.5)
	f.Add(50.5, 0.0, 110.64, 3.0)
	mecn := Builtin().MustLookup("MeCN")
	f.Fuzz(func(t *testing.T, bd, sd, ba, sa float64) {
		for _, x := range []float64{bd, sd, ba, sa} {
			if math.IsNaN(x) || math.IsInf(x, 0) || math.Abs(x) > 1e6 {
				t.Skip()
			}
		}
		sd, sa = math.Abs(sd), math.Abs(sa)
		d := mustResolve(t, &Couple{ID: "d", Solvent: mecn, In: Inputs{BDFE: &Value{V: bd, Sigma: sd}}}, on2022)
		a := mustResolve(t, &Couple{ID: "a", Solvent: mecn, In: Inputs{BDFE: &Value{V: ba, Sigma: sa}}}, on2022)
		fwd, rev := MakePair(d, a, on2022), MakePair(a, d, on2022)
		if fwd.DG.Kcal != -rev.DG.Kcal || fwd.DG.Sigma() != rev.DG.Sigma() {
			t.Errorf("ΔG %v ± %v vs %v ± %v", fwd.DG.Kcal, fwd.DG.Sigma(), rev.DG.Kcal, rev.DG.Sigma())
		}
		if want := bd - ba; math.Abs(fwd.DG.Kcal-want) > 1e-9*math.Max(1, math.Abs(want)) {
			t.Errorf("ΔG = %v, want BDFE(D) − BDFE(A) = %v", fwd.DG.Kcal, want)
		}
	})
}

// The two stepwise paths add up to ΔG°(HAT) when each BDFE comes from the
// matching route: PT first + ET second with the donor's proton-first and the
// acceptor's electron-first BDFE, and ET first + PT second the other way.
func TestPropertyStepwiseLegsSum(t *testing.T) {
	g := newGen(2)
	for i := range loops {
		c := g.conditions()
		s := g.solvent()
		ds, as := g.squareScheme(s), g.squareScheme(s)

		// PT first, then ET.
		d := mustResolve(t, &Couple{ID: "d", Solvent: s, In: Inputs{PKa: ds.PKa, EAnion: ds.EAnion}}, c)
		a := mustResolve(t, &Couple{ID: "a", Solvent: s, In: Inputs{PKaCation: as.PKaCation, ECation: as.ECation}}, c)
		p := MakePair(d, a, c)
		if p.PTFirst == nil || p.ETSecond == nil {
			t.Fatalf("case %d: PT-first legs missing (%v, %v)", i, p.PTFirst, p.ETSecond)
		}
		if p.ETFirst != nil || p.PTSecond != nil {
			t.Fatalf("case %d: ET-first legs given without the data for them", i)
		}
		if sum := *p.PTFirst + *p.ETSecond; math.Abs(sum-p.DG.Kcal) > 1e-9 {
			t.Fatalf("case %d (%s): PT %.4f + ET %.4f = %.4f, ΔG(HAT) %.4f", i, s.Key, *p.PTFirst, *p.ETSecond, sum, p.DG.Kcal)
		}

		// ET first, then PT.
		d = mustResolve(t, &Couple{ID: "d", Solvent: s, In: Inputs{PKaCation: ds.PKaCation, ECation: ds.ECation}}, c)
		a = mustResolve(t, &Couple{ID: "a", Solvent: s, In: Inputs{PKa: as.PKa, EAnion: as.EAnion}}, c)
		p = MakePair(d, a, c)
		if p.ETFirst == nil || p.PTSecond == nil {
			t.Fatalf("case %d: ET-first legs missing", i)
		}
		if sum := *p.ETFirst + *p.PTSecond; math.Abs(sum-p.DG.Kcal) > 1e-9 {
			t.Fatalf("case %d (%s): ET %.4f + PT %.4f = %.4f, ΔG(HAT) %.4f", i, s.Key, *p.ETFirst, *p.PTSecond, sum, p.DG.Kcal)
		}

		// With closed square schemes on both sides, both paths give ΔG(HAT) and
		// neither couple is flagged.
		d = mustResolve(t, &Couple{ID: "d", Solvent: s, In: ds}, c)
		a = mustResolve(t, &Couple{ID: "a", Solvent: s, In: as}, c)
		if d.Closure != nil || a.Closure != nil {
			t.Fatalf("case %d: a closed square scheme was flagged: %+v %+v", i, d.Closure, a.Closure)
		}
		p = MakePair(d, a, c)
		for _, path := range [][2]*float64{{p.PTFirst, p.ETSecond}, {p.ETFirst, p.PTSecond}} {
			if path[0] == nil || path[1] == nil {
				t.Fatalf("case %d: a leg is missing with full data", i)
			}
			if sum := *path[0] + *path[1]; math.Abs(sum-p.DG.Kcal) > 1e-9 {
				t.Fatalf("case %d: legs %.4f + %.4f ≠ ΔG %.4f", i, *path[0], *path[1], p.DG.Kcal)
			}
		}
	}
}

// First-step signs: PT first is downhill when the donor is the stronger acid
// than the acceptor's cation; the legs as README defines them.
func TestStepwiseSigns(t *testing.T) {
	mecn := solvent(t, "MeCN")
	d := mustResolve(t, &Couple{ID: "d", Solvent: mecn, In: Inputs{PKa: val(10), EAnion: pot(0.5, Fc), PKaCation: val(-5), ECation: pot(1.5, Fc)}}, on2022)
	a := mustResolve(t, &Couple{ID: "a", Solvent: mecn, In: Inputs{PKa: val(30), EAnion: pot(-1.5, Fc), PKaCation: val(12), ECation: pot(0.2, Fc)}}, on2022)
	p := MakePair(d, a, on2022)
	k := RTLn10(DefaultTemperature)
	near(t, "PT first", *p.PTFirst, k*(10-12), 1e-12) // donor pKa 10 < acceptor cation pKa 12: downhill
	near(t, "ET first", *p.ETFirst, FaradayKcal*(1.5-(-1.5)), 1e-12)
	near(t, "ET second", *p.ETSecond, FaradayKcal*(0.5-0.2), 1e-12)
	near(t, "PT second", *p.PTSecond, k*(-5-30), 1e-12)
}

// σ(C_G) cancels in a same-solvent pair of cycle-derived BDFEs and does not in
// a cross-solvent pair.
func TestPropertyCGSigmaCancels(t *testing.T) {
	g := newGen(3)
	for i := range loops {
		c := g.conditions()
		s := g.solvent()
		dc, ac := g.couple(s, false), g.couple(s, false)
		d, a := mustResolve(t, dc, c), mustResolve(t, ac, c)
		if d.BDFE.SigCG == 0 || a.BDFE.SigCG == 0 {
			t.Fatalf("case %d: a cycle BDFE carries no σ(C_G)", i)
		}
		p := MakePair(d, a, c)
		if p.DG.SigCG != 0 {
			t.Fatalf("case %d: same-solvent pair keeps σ(C_G) %.3f", i, p.DG.SigCG)
		}
		if want := math.Hypot(d.BDFE.SigData, a.BDFE.SigData); math.Abs(p.DG.Sigma()-want) > 1e-12 {
			t.Fatalf("case %d: σ(ΔG) %.4f, want data σ only %.4f", i, p.DG.Sigma(), want)
		}

		// The same inputs, with the acceptor in another solvent: the pair is
		// compared on H2 margins (BDFE(solution) ≈ BDFE(gas) + ΔG°solv(H•),
		// Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §3.1.1), so σ
		// is both margins' σ and both sides' cross-solvent σ.
		other := g.solvent()
		for other == s {
			other = g.solvent()
		}
		ax := g.couple(other, false)
		ar := mustResolve(t, ax, c)
		px := MakePair(d, ar, c)
		if !px.CrossSolvent {
			t.Fatalf("case %d: %s/%s pair not marked cross-solvent", i, s.Key, other.Key)
		}
		if want := d.Margin.Kcal - ar.Margin.Kcal; math.Abs(px.DG.Kcal-want) > 1e-9 {
			t.Fatalf("case %d: cross-solvent ΔG° %.4f, want margin difference %.4f", i, px.DG.Kcal, want)
		}
		wantAll := math.Sqrt(d.Margin.Sigma()*d.Margin.Sigma() + ar.Margin.Sigma()*ar.Margin.Sigma() +
			CrossSigma2(d.Couple) + CrossSigma2(ar.Couple))
		if math.Abs(px.DG.Sigma()-wantAll) > 1e-9 {
			t.Fatalf("case %d: cross-solvent σ %.4f, want %.4f", i, px.DG.Sigma(), wantAll)
		}
		if px.PTFirst != nil || px.ETFirst != nil || px.ETSecond != nil || px.PTSecond != nil {
			t.Fatalf("case %d: stepwise legs computed across solvents", i)
		}
	}
}

// Changing σ(C_G) changes nothing in a same-solvent pair, and changes a pair
// with a directly given BDFE (no C_G to cancel against).
func TestCGSigmaIsTheOnlyDifference(t *testing.T) {
	for _, sig := range []float64{0, 1, 5} {
		s := *solvent(t, "MeCN")
		cg := *s.CG2022
		cg.Sigma = sig
		s.CG2022 = &cg
		d := mustResolve(t, &Couple{ID: "d", Solvent: &s, In: Inputs{PKa: val(23.5), EAnion: pot(-0.1, Fc)}}, on2022)
		a := mustResolve(t, &Couple{ID: "a", Solvent: &s, In: Inputs{PKa: val(41), EAnion: pot(-1.95, Fc)}}, on2022)
		x := mustResolve(t, &Couple{ID: "x", Solvent: &s, In: Inputs{BDFE: &Value{V: 70, Sigma: 1}}}, on2022)
		same := MakePair(d, a, on2022)
		want := math.Hypot(d.BDFE.SigData, a.BDFE.SigData)
		near(t, "same-solvent σ with σ(C_G) "+ftoa(sig), same.DG.Sigma(), want, 1e-12)
		mixed := MakePair(d, x, on2022)
		near(t, "cycle vs direct σ with σ(C_G) "+ftoa(sig), mixed.DG.Sigma(),
			math.Sqrt(d.BDFE.SigData*d.BDFE.SigData+1+sig*sig), 1e-12)
	}
}

func ftoa(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func newStdRand(seed int64) *mrand.Rand { return mrand.New(mrand.NewSource(seed)) }

// A potential converted to another electrode and back is unchanged, and going
// through an intermediate electrode is the same as going directly.
func TestPropertyElectrodeRoundTrip(t *testing.T) {
	tab := Builtin()
	for _, s := range tab.All() {
		known := []Electrode{}
		for _, e := range Electrodes {
			if _, err := s.Convert(Potential{Vs: e}, s.Ref); err == nil && !s.IsGas() {
				known = append(known, e)
			}
		}
		for _, from := range known {
			for _, to := range known {
				f := func(v, sig float64) bool {
					v = math.Mod(v, 10)
					p := Potential{Value: Value{V: v, Sigma: math.Abs(math.Mod(sig, 1))}, Vs: from}
					there, err := s.Convert(p, to)
					if err != nil || there.Vs != to {
						return false
					}
					back, err := s.Convert(there, from)
					if err != nil || back.Vs != from || math.Abs(back.V-v) > 1e-12 {
						return false
					}
					// never less certain after a conversion
					if back.Sigma < p.Sigma {
						return false
					}
					for _, via := range known {
						mid, err := s.Convert(p, via)
						if err != nil {
							return false
						}
						end, err := s.Convert(mid, to)
						if err != nil || math.Abs(end.V-there.V) > 1e-12 {
							return false
						}
					}
					return true
				}
				if err := quick.Check(f, &quick.Config{MaxCount: 200, Rand: newStdRand(int64(from)*10 + int64(to))}); err != nil {
					t.Errorf("%s: %v → %v → %v: %v", s.Key, from, to, from, err)
				}
			}
		}
	}
}

// The H2 margin of a cycle-derived BDFE is F·E°(V vs H2) and the same on
// either C_G basis (basis consistency, README "Two bases of C_G").
func TestPropertyMarginBasisIndependent(t *testing.T) {
	g := newGen(4)
	for i := range loops {
		s := g.solvent()
		cp := g.couple(s, false)
		r10, r22 := mustResolve(t, cp, on2010), mustResolve(t, cp, on2022)
		if math.Abs(r10.Margin.Kcal-r22.Margin.Kcal) > 1e-9 {
			t.Fatalf("case %d (%s): margin %.4f on 2010, %.4f on 2022", i, s.Key, r10.Margin.Kcal, r22.Margin.Kcal)
		}
		if math.Abs(r10.Margin.Sigma()-r22.Margin.Sigma()) > 1e-9 {
			t.Fatalf("case %d (%s): σ(margin) %.4f on 2010, %.4f on 2022", i, s.Key, r10.Margin.Sigma(), r22.Margin.Sigma())
		}
		if math.Abs(r10.BDFE.Kcal-r22.BDFE.Kcal) < 1e-9 {
			t.Fatalf("case %d (%s): BDFE did not move with the basis", i, s.Key)
		}
		if s.EH2 == nil {
			continue
		}
		// margin in volts = E°(vs ref) + (2.303RT/F)·pKa − E°(H+/H2)
		var pk *Value
		var e *Potential
		switch {
		case cp.In.PKa != nil:
			pk, e = cp.In.PKa, cp.In.EAnion
		case cp.In.PKaCation != nil:
			pk, e = cp.In.PKaCation, cp.In.ECation
		default:
			pk, e = cp.In.AcidPKa, cp.In.Reductant
		}
		ref, err := s.ToRef(*e)
		if err != nil {
			t.Fatal(err)
		}
		want := ref.V + RTLn10(DefaultTemperature)*pk.V/FaradayKcal - s.EH2.V
		if got := PotentialVsH2(r22.Margin); math.Abs(got-want) > 1e-9 {
			t.Fatalf("case %d (%s): E° vs H2 %.5f V, want %.5f", i, s.Key, got, want)
		}
	}
}

// In the margin of a cycle-derived BDFE, C_G cancels: its σ must not count,
// however large, on either basis, whether or not E°(H+/H2) is known.
func TestMarginSigmaDropsCG(t *testing.T) {
	for _, name := range cycleSolvents {
		for _, c := range []Conditions{on2010, on2022} {
			s := *solvent(t, name)
			n10, n22 := *s.CG2010, *s.CG2022
			base := mustResolve(t, &Couple{ID: "x", Solvent: &s, In: Inputs{PKa: val(20), EAnion: pot(-0.5, s.Ref)}}, c)
			// Inflate σ of the C_G in use; the margin's σ must not move.
			if c.Basis == Basis2010 {
				n10.Sigma += 50
			} else {
				n22.Sigma += 50
			}
			s.CG2010, s.CG2022 = &n10, &n22
			if c.Basis == Basis2022 && s.EH2 == nil {
				// Without E°(H+/H2) the 2022 line is an independent estimate: C_G(2022)
				// does not cancel. Check the 2010 case only.
				continue
			}
			r := mustResolve(t, &Couple{ID: "x", Solvent: &s, In: Inputs{PKa: val(20), EAnion: pot(-0.5, s.Ref)}}, c)
			if math.Abs(r.Margin.Sigma()-base.Margin.Sigma()) > 1e-9 {
				t.Errorf("%s, %v basis: σ(margin) %.3f → %.3f when σ(C_G) grew by 50",
					name, c.Basis, base.Margin.Sigma(), r.Margin.Sigma())
			}
		}
	}
}

// Thermoneutral potential and H2 onset of the electrode view are the
// potentials at which the combined donor's BDFE meets the acceptor's BDFE and
// the H2 line.
func TestPropertyElectrodeWindowRoundTrip(t *testing.T) {
	g := newGen(5)
	for i := range loops {
		c := g.conditions()
		s := g.solvent()
		bdfeA, p := g.between(40, 110), g.between(-5, 40)
		v, err := ElectrodeWindow(bdfeA, p, s, c)
		if err != nil {
			t.Fatal(err)
		}
		at := func(e float64) *Resolved {
			return mustResolve(t, &Couple{ID: "acid+electrode", Solvent: s,
				In: Inputs{AcidPKa: &Value{V: p}, Reductant: &Potential{Value: Value{V: e}, Vs: v.Ref}}}, c)
		}
		if r := at(v.Thermoneutral); math.Abs(r.BDFE.Kcal-bdfeA) > 1e-9 {
			t.Fatalf("case %d: at the thermoneutral potential BDFE_eff %.4f ≠ %.4f", i, r.BDFE.Kcal, bdfeA)
		}
		if r := at(v.H2Onset); math.Abs(r.Margin.Kcal) > 1e-9 {
			t.Fatalf("case %d: at the H2 onset the margin is %.4f, want 0", i, r.Margin.Kcal)
		}
		gh, _ := c.H2LineOf(s)
		if (v.Window > 0) != (bdfeA > gh.V) {
			t.Fatalf("case %d: window %.3f V for acceptor %.2f vs H2 line %.2f", i, v.Window, bdfeA, gh.V)
		}
	}
}

func TestPropertySeries(t *testing.T) {
	g := newGen(6)
	for i := range loops / 10 {
		s := g.solvent()
		d := mustResolve(t, g.couple(s, true), on2022)
		n := 1 + g.IntN(6)
		var ser Series
		sum, lowest := 0.0, math.Inf(1)
		for range n {
			a := mustResolve(t, g.couple(s, true), on2022)
			ser.Steps = append(ser.Steps, a)
			sum += a.BDFE.Kcal
			lowest = math.Min(lowest, a.BDFE.Kcal)
		}
		r := RunSeries(d, ser, on2022)
		if len(r.Steps) != n {
			t.Fatalf("case %d: %d steps, want %d", i, len(r.Steps), n)
		}
		if math.Abs(r.Overall-(float64(n)*d.BDFE.Kcal-sum)) > 1e-9 {
			t.Fatalf("case %d: overall %.4f, want n·BDFE(D) − ΣBDFE(A) = %.4f", i, r.Overall, float64(n)*d.BDFE.Kcal-sum)
		}
		if math.Abs(r.MeanBDFE-sum/float64(n)) > 1e-9 {
			t.Fatalf("case %d: mean BDFE %.4f", i, r.MeanBDFE)
		}
		// The bottleneck is the weakest acceptor bond: the largest ΔG° step.
		if got := ser.Steps[r.Bottleneck].BDFE.Kcal; got != lowest {
			t.Fatalf("case %d: bottleneck step has BDFE %.3f, the weakest is %.3f", i, got, lowest)
		}
	}
	if r := RunSeries(nil, Series{}, on2022); r.Bottleneck != -1 || len(r.Steps) != 0 {
		t.Errorf("empty series: %+v", r)
	}
}

// Closure: two routes that disagree by more than 2σ are flagged; within 2σ not.
func TestClosureFlag(t *testing.T) {
	mecn := solvent(t, "MeCN")
	cyc := Inputs{PKa: &Value{V: 23.5, Sigma: 0.1}, EAnion: &Potential{Value: Value{V: -0.1, Sigma: 0.01}, Vs: Fc}}
	r := mustResolve(t, &Couple{ID: "x", Solvent: mecn, In: cyc}, on2010)
	for _, off := range []float64{0, 1, -1, 2.5, -2.5, 3.5, -3.5, 5, -5, 10} { // 2σ ≈ 2.9
		in := cyc
		in.BDFE = &Value{V: r.BDFE.Kcal + off, Sigma: 1}
		got := mustResolve(t, &Couple{ID: "x", Solvent: mecn, In: in}, on2010)
		d := Diff(got.Routes[0].Energy, got.Routes[1].Energy)
		wantFlag := math.Abs(off) > 2*d.Sigma()
		if (got.Closure != nil) != wantFlag {
			t.Errorf("offset %+g (2σ = %.2f): closure %v, want flagged %v", off, 2*d.Sigma(), got.Closure, wantFlag)
		}
		if got.Route != RouteDirect || len(got.Routes) != 2 {
			t.Errorf("routes %v: want direct first, then the cycle", got.Routes)
		}
		if got.Closure != nil && math.Abs(got.Closure.Gap-off) > 1e-9 {
			t.Errorf("closure gap %.3f, want %.3f", got.Closure.Gap, off)
		}
	}
}

func TestClassify(t *testing.T) {
	for _, x := range []struct {
		m, sig float64
		want   Tendency
	}{
		{-3, 1, Downhill}, {-2.01, 1, Downhill}, {-2, 1, NearLine}, {0, 1, NearLine},
		{2, 1, NearLine}, {2.01, 1, Uphill}, {0.001, 0, Uphill}, {-0.001, 0, Downhill}, {0, 0, NearLine},
	} {
		if got := Classify(Energy{Kcal: x.m, SigData: x.sig}); got != x.want {
			t.Errorf("Classify(%g ± %g) = %v, want %v", x.m, x.sig, got, x.want)
		}
	}
}

// The gas phase has no C_G and no electrode: a cycle there is refused with a
// message that says what to do, even when a C_G is given explicitly.
func TestCycleRefusedInGasPhase(t *testing.T) {
	gas := solvent(t, "gas")
	cg := 52.0
	for _, c := range []Conditions{on2022, {CG: map[string]float64{"gas": cg}}} {
		_, _, err := Cycle(Value{V: 10}, Potential{Value: Value{V: 0}, Vs: Fc}, gas, c)
		if err == nil {
			t.Fatalf("Cycle in the gas phase (C_G override %v) gave no error", c.CG)
		}
		if msg := err.Error(); !strings.Contains(msg, "gas phase") || !strings.Contains(msg, "directly") || strings.Contains(msg, "  ") {
			t.Errorf("unhelpful error: %q", msg)
		}
	}
}
