package thermo_test

import (
	"math"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// The pressure term written out again from CODATA 2018 R = 8.314462618
// J mol⁻¹ K⁻¹ and the thermochemical calorie: ½·R·T·ln(p/p°).
// Hand-computed: 0.5 × 8.314462618 × 298.15 × ln(10⁻³) / 4184 = −2.0464.
func TestH2PressureTermMillibar(t *testing.T) {
	// Source: CODATA 2018 (R); E°(H+/H2) standard state p° = 1 atm.
	want := 0.5 * 8.314462618 * 298.15 * math.Log(1e-3) / 4184
	got := thermo.H2PressureTerm(1e-3, 298.15)
	if math.Abs(got-want) > 1e-9 {
		t.Fatalf("H2PressureTerm(1e-3) = %.6f, want %.6f", got, want)
	}
	if math.Abs(got-(-2.05)) > 0.01 {
		t.Fatalf("H2PressureTerm(1e-3) = %.4f, want −2.05 ± 0.01", got)
	}
	if thermo.H2PressureTerm(1, 298.15) != 0 {
		t.Fatalf("no shift expected at p°")
	}
}

// A donor resolved at 1 atm and at 10⁻³ atm: its margin moves by −2.05 and
// its tendency from near line to downhill. The couple is a BDFE given
// directly, 0.5 kcal/mol below the MeCN H2 line; with the line's σ the
// margin's σ is about 1.05, so −0.5 is near the line and −2.55 downhill.
func TestPressureMovesMarginAndTendency(t *testing.T) {
	mecn := thermo.Builtin().MustLookup("MeCN")
	c1 := thermo.Conditions{Basis: thermo.Basis2022}
	gh, err := c1.H2LineOf(mecn)
	if err != nil {
		t.Fatal(err)
	}
	cp := &thermo.Couple{ID: "x", Solvent: mecn, Roles: thermo.RoleDonor,
		In: thermo.Inputs{BDFE: &thermo.Value{V: gh.V - 0.5, Sigma: 0.3, SigmaGiven: true}}}
	r1, err := thermo.Resolve(cp, c1)
	if err != nil {
		t.Fatal(err)
	}
	c3 := c1
	c3.PH2 = 1e-3
	r3, err := thermo.Resolve(cp, c3)
	if err != nil {
		t.Fatal(err)
	}
	// Source: CODATA 2018 R; hand-computed shift −2.0464 (see above).
	if d := r3.Margin.Kcal - r1.Margin.Kcal; math.Abs(d-(-2.05)) > 0.01 {
		t.Fatalf("margin moved by %.4f, want −2.05 ± 0.01", d)
	}
	if r3.BDFE != r1.BDFE {
		t.Fatalf("the BDFE must not depend on the H2 pressure")
	}
	if r1.Tendency != thermo.NearLine || r3.Tendency != thermo.Downhill {
		t.Fatalf("tendency %v at 1 atm (σ %.2f, m %.2f) and %v at 1e-3 atm, want near line then downhill",
			r1.Tendency, r1.Margin.Sigma(), r1.Margin.Kcal, r3.Tendency)
	}
	// h2_wins follows the acceptor's margin at the pressure in force: an
	// acceptor bond 1 kcal/mol above the line at 1 atm is below it at 10⁻³.
	d := &thermo.Couple{ID: "d", Solvent: mecn, In: thermo.Inputs{BDFE: &thermo.Value{V: gh.V + 10, Sigma: 1}}}
	a := &thermo.Couple{ID: "a", Solvent: mecn, In: thermo.Inputs{BDFE: &thermo.Value{V: gh.V + 1, Sigma: 1}}}
	for _, c := range []thermo.Conditions{c1, c3} {
		rd, err1 := thermo.Resolve(d, c)
		ra, err2 := thermo.Resolve(a, c)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if p := thermo.MakePair(&rd, &ra, c); p.H2Wins != (c.PH2 == 1e-3) {
			t.Errorf("p(H2) %g atm: H2Wins %v with the acceptor margin %.2f", c.PH2Atm(), p.H2Wins, ra.Margin.Kcal)
		}
	}
}

func TestCheckPH2(t *testing.T) {
	for _, p := range []float64{0, -1, math.Inf(1), math.NaN()} {
		if thermo.CheckPH2(p) == nil {
			t.Errorf("CheckPH2(%g) accepted", p)
		}
	}
	if err := thermo.CheckPH2(1e-6); err != nil {
		t.Error(err)
	}
}

func TestConditionsText(t *testing.T) {
	s := thermo.FlaskText(thermo.Conditions{PH2: 1e-3}, &thermo.Flask{AcceptorM: 0.05})
	for _, w := range []string{"298.15 K", "p(H2) 0.001 atm", "[D–H]0 0.01 M", "[A]0 0.05 M"} {
		if !strings.Contains(s, w) {
			t.Errorf("%q lacks %q", s, w)
		}
	}
}
