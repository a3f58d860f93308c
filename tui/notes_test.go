package tui

import (
	"fmt"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/thermo"
)

// The Pairs pane marks a ΔG° resting on a BDFE given without a basis (b)
// and says what the letter means; the detail gives thermo's notes; the
// top line is thermo's account of the conditions.
func TestPairsMarkBasisAndEstimate(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	for i := range m.t.pairs {
		p := &m.t.pairs[i]
		want := p.Donor.BasisAssumed() || p.Acceptor.BasisAssumed()
		if got := strings.Contains(m.pairCell(int32(i), pairDG), "b"); got != want {
			t.Errorf("%s → %s: b shown %v, basis assumed %v", p.Donor.Couple.ID, p.Acceptor.Couple.ID, got, want)
		}
		if got := strings.Contains(m.pairCell(int32(i), pairDG), "e"); got != p.OnEstimate(m.t.ev.Cond) {
			t.Errorf("%s → %s: e shown %v, on estimate %v", p.Donor.Couple.ID, p.Acceptor.Couple.ID, got, !got)
		}
	}
	s := screen(m)
	if !strings.Contains(s, "b: a BDFE given without a basis") {
		t.Errorf("status line does not explain the letters:\n%s", s)
	}
	if !strings.Contains(s, thermo.ConditionsText(m.t.ev.Cond, m.t.ev.Working, m.units)[:40]) {
		t.Errorf("top line is not thermo's conditions text:\n%s", s)
	}
	// vexol → olix: both BDFEs from the cycle, no note letter.
	m = keys(t, m, "/", "vexol", "enter")
	for m.selectedPair().Acceptor.Couple.ID != "olix" {
		m = keys(t, m, "down")
	}
	if c := m.pairCell(m.grids[panePairs].row(), pairDG); strings.ContainsAny(c, "be") {
		t.Errorf("vexol → olix ΔG° cell %q carries a letter", c)
	}
	m = keys(t, m, "esc", "/", "tarn", "enter", "enter")
	if !strings.Contains(screen(m), "note: tarn: BDFE given without a basis, taken on the 2022 basis") {
		t.Errorf("detail lacks thermo's basis note:\n%s", screen(m))
	}
}

// The solvent picker marks a 2022 C_G that is an estimate.
func TestSolventPickerMarksEstimates(t *testing.T) {
	m := open(t, testLibrary(), 120, 60, t.TempDir())
	m = keys(t, m, "v")
	s := screen(m)
	n := 0
	for _, sv := range m.solvents {
		if sv.CG2022 == nil {
			continue
		}
		for _, l := range strings.Split(s, "\n") {
			if strings.Contains(l, sv.Name+" ") && strings.Contains(l, "C_G 2022") {
				if got := strings.Contains(l, "~"); got != sv.CGEstimated(thermo.Basis2022) {
					t.Errorf("%s: ~ shown %v, estimate %v: %q", sv.Name, got, !got, l)
				}
				if got := sv.CGEstimated(thermo.Basis2022); got {
					n++
				}
			}
		}
	}
	if n == 0 {
		t.Error("no solvent line carries an estimated 2022 C_G (the built-in solvents have some)")
	}
	if !strings.Contains(s, "~: an estimate") {
		t.Errorf("picker does not say what ~ means:\n%s", s)
	}
}

// In water with a pH set, the electrode view of an acid + reductant also
// gives its potentials vs RHE.
func TestElectrodeViewVsRHE(t *testing.T) {
	lib := testLibrary()
	lib.DefaultSolvent = "water"
	for _, c := range lib.Couples {
		if c.ID == "zorbic+quen" {
			c.In.AcidPKa = tval(4.0, 0.1)
			c.In.Reductant = &thermo.Potential{Value: thermo.Value{V: -0.60, Sigma: 0.01}, Vs: thermo.NHE}
		}
	}
	ph := 7.0
	o := Options{StateDir: t.TempDir(), NoCaution: true, Renderer: plainRenderer()}
	o.Eval.Cond.PH = &ph
	m := New(lib, o)
	m = send(t, m, tea.WindowSizeMsg{Width: 120, Height: 60})
	m = drain(t, m, m.Init())
	if m.t == nil {
		t.Fatalf("not evaluated: %s", m.errMsg)
	}
	m = keys(t, m, "/", "zorbic", "enter")
	for m.selectedPair().Acceptor.Couple.ID != "tarn" {
		m = keys(t, m, "down")
	}
	m = keys(t, m, "enter")
	s := screen(m)
	v, err := thermo.ElectrodeWindow(70, 4.0, m.t.ev.Working, m.t.ev.Cond)
	if err != nil {
		t.Fatal(err)
	}
	// Source: E(RHE) = E(NHE) + (2.303RT/F)·pH, 0.05916 V per pH unit at
	// 298.15 K (Bard, Faulkner, Electrochemical Methods, 2nd ed., the
	// reversible hydrogen electrode).
	want := fmt.Sprintf("vs RHE at pH 7: delivery %+.3f V, H2 onset %+.3f V", v.Thermoneutral+0.05916*7, v.H2Onset+0.05916*7)
	if !strings.Contains(s, want) {
		t.Errorf("detail lacks %q:\n%s", want, s)
	}
}
