package tui

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// clearInput empties the text box of the open dialog (it opens on the
// current value).
func clearInput(t *testing.T, m Model) Model {
	t.Helper()
	for range 300 {
		m = keys(t, m, "backspace")
	}
	return m
}

// The p key sets the H2 pressure: every donor's H2 margin moves by
// ½RT·ln(p/p°), the top line says the pressure, and a pressure thermo
// refuses keeps the box open with the reason.
func TestPressureKey(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	before := map[string]float64{}
	for _, d := range m.t.ev.Donors {
		before[d.Couple.ID] = d.Margin.Kcal
	}
	m = keys(t, m, "p")
	m = clearInput(t, m)
	m = keys(t, m, "0", "enter")
	if focus(m) != "value" || !strings.Contains(screen(m), "H2 pressure must be") {
		t.Fatalf("p(H2) 0 was not refused in the box:\n%s", screen(m))
	}
	m = clearInput(t, m)
	m = keys(t, m, "0.001", "enter")
	if focus(m) != "" || m.t.ev.Cond.PH2Atm() != 0.001 {
		t.Fatalf("pressure not taken: dialog %q, p %g", focus(m), m.t.ev.Cond.PH2Atm())
	}
	if !strings.Contains(screen(m), "p(H2) 0.001 atm") {
		t.Errorf("top line does not say the pressure:\n%s", screen(m))
	}
	// Source: ½·R·T·ln(10⁻³) with R = 8.314462618 J/(mol·K) (CODATA 2018)
	// and 4.184 J/cal at 298.15 K is −2.046 kcal/mol (hand-computed).
	for _, d := range m.t.ev.Donors {
		if got := d.Margin.Kcal - before[d.Couple.ID]; math.Abs(got-(-2.046)) > 0.01 {
			t.Errorf("%s: margin moved by %.3f kcal/mol at 10⁻³ atm, want −2.05", d.Couple.ID, got)
		}
	}
	m = keys(t, m, "enter")
	if !strings.Contains(screen(m), "Donor H2 margin at p(H2) 0.001 atm") {
		t.Errorf("detail does not give the margin at the pressure in force:\n%s", screen(m))
	}
}

// kselfLibrary is the test library with invented self-exchange constants
// on kelp and olix, so the pair kelp → olix has a rate estimate and every
// other pair has none.
func kselfLibrary() *data.Library {
	lib := testLibrary()
	for _, c := range lib.Couples {
		switch c.ID {
		case "kelp":
			c.KSelf = &thermo.SelfExchange{K: 1e3, Factor: 3, Source: "invented k", Status: "invented"}
		case "olix":
			c.KSelf = &thermo.SelfExchange{K: 2e5, Source: "invented k2", Status: "invented"}
		}
	}
	return lib
}

// The conv. and log k columns, their sort, and the flask in the detail.
func TestFlaskColumnsAndDetail(t *testing.T) {
	m := open(t, kselfLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "e")
	m = clearInput(t, m)
	m = keys(t, m, "0.02 0.01", "enter")
	if d, a := m.t.flask.Concentrations(); d != 0.02 || a != 0.01 {
		t.Fatalf("flask %g %g, want 0.02 0.01", d, a)
	}
	for m.grids[panePairs].sortCol != pairRate {
		m = keys(t, m, "s")
	}
	m = keys(t, m, "home") // a sort keeps the cursor on its pair
	p := m.selectedPair()
	if p.Donor.Couple.ID != "kelp" || p.Acceptor.Couple.ID != "olix" {
		t.Fatalf("sorted by log k, the first pair is %s → %s, want kelp → olix (the only estimate)", p.Donor.Couple.ID, p.Acceptor.Couple.ID)
	}
	// Source: the cross relation as stated by Mayer, Acc. Chem. Res. 2011,
	// 44, 36: k = √(k11·k22·K·f), ln f = (ln K)²/(4·ln(k11·k22/Z²)),
	// Z = 10^11 M⁻¹ s⁻¹; here in base 10 with hand-derived logs.
	L := p.Log10K
	mm := math.Log10(1e3) + math.Log10(2e5) - 22
	logk := 0.5 * (math.Log10(1e3) + math.Log10(2e5) + L + L*L/(4*mm))
	// Conversion from the quadratic K(d−x)(a−x) = x² (K ≈ 13, no
	// cancellation to fear): x = [K·s − √(K²s² − 4(K−1)K·d·a)] / (2(K−1)).
	K, d, a := math.Pow(10, L), 0.02, 0.01
	x := (K*(d+a) - math.Sqrt(K*K*(d+a)*(d+a)-4*(K-1)*K*d*a)) / (2 * (K - 1))
	row := strings.Split(screen(m), "\n")[4]
	for _, want := range []string{fmt.Sprintf("%.1f%%", 100*x/a), fmt.Sprintf("%.1f", logk)} {
		if !strings.Contains(row, want) {
			t.Errorf("row %q lacks %q", row, want)
		}
	}
	last := m.grids[panePairs].perm[len(m.grids[panePairs].perm)-1]
	if got := m.pairCell(last, pairRate); got != "–" {
		t.Errorf("a pair with no k_self shows %q, want –", got)
	}
	m = keys(t, m, "enter")
	s := screen(m)
	for _, want := range []string{"[D–H]0 0.02 M, [A]0 0.01 M", "log k " + fmt.Sprintf("%.1f", logk),
		"k_self (donor kelp): 1e+03 M⁻¹ s⁻¹ ×/÷ 3 · invented k (invented)", "k_self (acceptor olix): 2e+05",
		"order of magnitude"} {
		if !strings.Contains(s, want) {
			t.Errorf("detail lacks %q:\n%s", want, s)
		}
	}
	// A bad flask is refused in the box.
	m = keys(t, m, "esc", "e")
	m = clearInput(t, m)
	m = keys(t, m, "0.01", "enter")
	if focus(m) != "value" || !strings.Contains(screen(m), "two concentrations") {
		t.Errorf("one concentration was not refused:\n%s", screen(m))
	}
}
