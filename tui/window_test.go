package tui

import (
	"fmt"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// windowLibrary is the test library with two invented acids and an
// invented reductant in acetonitrile.
func windowLibrary() *data.Library {
	lib := testLibrary()
	lib.Acids = []*data.Acid{
		{ID: "zorbic", PKa: thermo.Value{V: 12.0, Sigma: 0.3}, Source: "invented", Status: "invented"},
		{ID: "frapium", PKa: thermo.Value{V: 25.0, Sigma: 0.3}, Source: "invented", Status: "invented"},
	}
	lib.Reductants = []*data.Reductant{
		{ID: "quen", E: thermo.Potential{Value: thermo.Value{V: -1.35, Sigma: 0.01}, Vs: thermo.Fc}, Source: "invented", Status: "invented"},
	}
	return lib
}

// w on an acceptor lists the combinations inside its delivery window and
// each acid's electrode range; from a pair's detail too.
func TestDeliveryWindowDialog(t *testing.T) {
	m := open(t, windowLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "3", "/", "tarn", "enter", "w")
	if focus(m) != "detail" {
		t.Fatalf("w did not open the window (status %q)", m.status)
	}
	s := screen(m)
	// Source: BDFE = 1.37·pKa + 23.06·E° + C_G (Warren, Tronic, Mayer,
	// Chem. Rev. 2010, 110, 6961, eq. 15), here with 2.303RT = 1.3642 and
	// F = 23.0605 kcal/(mol·V) at 298.15 K (CODATA 2018).
	cg, _ := m.t.ev.Cond.CGOf(m.t.ev.Working)
	eff := func(pKa float64) float64 { return 1.3642*pKa + 23.0605*(-1.35) + cg.V }
	gh := m.t.ev.H2Line.V
	if e := eff(25); !(e > gh && e < 70) {
		t.Fatalf("test set-up: frapium + quen at %.2f is not inside %.2f..70", e, gh)
	}
	if e := eff(12); e > gh {
		t.Fatalf("test set-up: zorbic + quen at %.2f is not below the H2 line %.2f", e, gh)
	}
	var row string
	for _, l := range strings.Split(s, "\n") {
		if strings.HasPrefix(l, "frapium") && strings.Contains(l, "quen") {
			row = l
		}
		if strings.HasPrefix(l, "zorbic") && strings.Contains(l, "quen") {
			t.Errorf("a combination below the H2 line is listed: %q", l)
		}
	}
	for _, want := range []string{fmt.Sprintf("%.1f", eff(25)), fmt.Sprintf("%.1f", eff(25)-70), fmt.Sprintf("%.1f", eff(25)-gh)} {
		if !strings.Contains(row, want) {
			t.Errorf("frapium + quen row %q lacks %s", row, want)
		}
	}
	// The electrode range of zorbic: H2 onset (G_H − C_G − 2.303RT·pKa)/F,
	// delivery limit (BDFE_A − C_G − 2.303RT·pKa)/F (same source, solved
	// for E).
	onset, limit := (gh-cg.V-1.3642*12)/23.0605, (70-cg.V-1.3642*12)/23.0605
	if !strings.Contains(s, fmt.Sprintf("%+7.3f..%-+7.3f", onset, limit)) {
		t.Errorf("zorbic electrode range %.3f..%.3f not shown:\n%s", onset, limit, s)
	}
	checkFrame(t, m, 120, 40)
	// From a pair's detail.
	m = keys(t, m, "esc", "1", "/", "tarn", "enter", "enter", "w")
	if !strings.Contains(screen(m), "Delivery window of tarn radical") {
		t.Errorf("w in a pair's detail did not open the acceptor's window:\n%s", screen(m))
	}
}

// g shades the window on the Scale, or says there is none.
func TestScaleWindowBand(t *testing.T) {
	m := open(t, testLibrary(), 100, 30, t.TempDir())
	m = keys(t, m, "5")
	if strings.Contains(screen(m), "▒") {
		t.Fatal("band shown before g")
	}
	m = keys(t, m, "g")
	p := m.selectedPair()
	s := screen(m)
	if p.Acceptor.Margin.Kcal <= 0 {
		t.Fatalf("test set-up: the first pair's acceptor %s is below the H2 line", p.Acceptor.Couple.ID)
	}
	want := fmt.Sprintf("its window %.1f–%.1f", m.t.ev.H2Line.V, p.Acceptor.BDFE.Kcal)
	if !strings.Contains(s, want) || strings.Count(s, "▒") < 3 {
		t.Errorf("no band (want %q):\n%s", want, s)
	}
	checkFrame(t, m, 100, 30)
	for m.selectedPair().Acceptor.Couple.ID != "mur" {
		m = keys(t, m, "down")
	}
	if s := screen(m); !strings.Contains(s, "no window: acceptor below H2") || strings.Count(s, "▒") > 1 {
		t.Errorf("an acceptor below the H2 line has a band:\n%s", s)
	}
}
