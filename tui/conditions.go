package tui

import (
	"fmt"
	"strconv"
	"strings"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/thermo"
)

// The keys that set the flask's conditions: the H2 pressure over the
// solution (p) and the starting concentrations (e). Both are checked by
// thermo before they are taken, and both re-evaluate.

type (
	pressureMsg struct{ atm float64 }
	flaskMsg    struct{ f thermo.Flask }
)

// pressureDialog asks for p(H2) in atm.
func (m Model) pressureDialog() dialog {
	cur := strconv.FormatFloat(m.cond.Cond.PH2Atm(), 'g', -1, 64)
	return newValueDialog("p(H2) in atm (1 is the standard state): ", cur, m.w, parsePressure)
}

func parsePressure(s string) (tea.Msg, error) {
	p, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return nil, fmt.Errorf("not a number: %q", shown(s))
	}
	if err := thermo.CheckPH2(p); err != nil {
		return nil, err
	}
	return pressureMsg{p}, nil
}

// flaskDialog asks for [D–H]0 and [A]0 in mol/L.
func (m Model) flaskDialog() dialog {
	d, a := m.flask.Concentrations()
	cur := strconv.FormatFloat(d, 'g', -1, 64) + " " + strconv.FormatFloat(a, 'g', -1, 64)
	return newValueDialog("[D–H]0 [A]0 in mol/L: ", cur, m.w, parseFlask)
}

func parseFlask(s string) (tea.Msg, error) {
	f := strings.Fields(strings.ReplaceAll(s, ",", " "))
	if len(f) != 2 {
		return nil, fmt.Errorf("give two concentrations, [D–H]0 then [A]0, e.g. 0.01 0.01")
	}
	var c [2]float64
	for i, x := range f {
		v, err := strconv.ParseFloat(x, 64)
		if err != nil {
			return nil, fmt.Errorf("not a number: %q", shown(x))
		}
		c[i] = v
	}
	// thermo decides what a flask may hold.
	if _, err := thermo.EquilibriumConversion(0, c[0], c[1]); err != nil {
		return nil, err
	}
	return flaskMsg{thermo.Flask{DonorM: c[0], AcceptorM: c[1]}}, nil
}

// setCondition takes a pressure or a flask and re-evaluates.
func (m Model) setCondition(msg tea.Msg) (Model, tea.Cmd) {
	switch msg := msg.(type) {
	case pressureMsg:
		m.cond.Cond.PH2 = msg.atm
	case flaskMsg:
		m.flask = msg.f
	}
	return m.reevaluate()
}
