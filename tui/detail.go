package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/lipgloss"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// openDetail fills the detail panel for the row under the cursor.
func (m *Model) openDetail() {
	var text string
	var acc *thermo.Resolved
	switch m.tab {
	case panePairs, paneScale:
		if p := m.selectedPair(); p != nil {
			text, acc = m.pairDetail(p), p.Acceptor
		}
	case paneSeries:
		if r := m.grids[paneSeries].row(); r >= 0 {
			text, acc = m.pairDetail(&m.series[r].pair), m.series[r].pair.Acceptor
		}
	case paneDonors:
		if r := m.grids[paneDonors].row(); r >= 0 {
			text = m.coupleDetail("Donor", m.t.donors[r], nil)
		}
	case paneAcceptors:
		if r := m.grids[paneAcceptors].row(); r >= 0 {
			text, acc = m.coupleDetail("Acceptor", m.t.acceptors[r], nil), m.t.acceptors[r].R
		}
	}
	if text == "" {
		return
	}
	d := newDetailDialog(text, m.w, m.bodyHeight())
	d.acc = acc
	m.dlg = d
}

// pairDetail describes a pair: the numbers thermo computed, then each
// couple's data. A new section of the pair's detail (a rate, a delivery
// window) goes here as one more block written to b, before the couples;
// one about a single couple goes in coupleDetail.
func (m Model) pairDetail(p *thermo.Pair) string {
	u := m.units.Label()
	var b strings.Builder
	fmt.Fprintf(&b, "%s\n", m.st.Accent.Render(fmt.Sprintf("%s → %s   (esc closes)", shown(coupleName(p.Donor.Couple)), shown(coupleName(p.Acceptor.Couple)))))
	fmt.Fprintf(&b, "ΔG°(HAT) %s ± %s %s   log K %.2f", m.e(p.DG.Kcal), m.e(p.DG.Sigma()), u, p.Log10K)
	if p.CrossSolvent {
		fmt.Fprintf(&b, "   cross-solvent: %s donor, %s acceptor (extra σ included)",
			shown(p.Donor.Couple.Solvent.Name), shown(p.Acceptor.Couple.Solvent.Name))
	}
	b.WriteString("\n")
	fmt.Fprintf(&b, "First step, proton transfer: %s (then ET %s)\n", m.opt(p.PTFirst), m.opt(p.ETSecond))
	fmt.Fprintf(&b, "First step, electron transfer: %s (then PT %s)\n", m.opt(p.ETFirst), m.opt(p.PTSecond))
	fmt.Fprintf(&b, "Donor H2 margin at p(H2) %g atm %s ± %s %s: %s %s\n", m.t.ev.Cond.PH2Atm(), m.e(p.Donor.Margin.Kcal),
		m.e(p.Donor.Margin.Sigma()), u, p.Donor.Tendency.Symbol(), p.Donor.Tendency)
	fmt.Fprintf(&b, "Acceptor H2 margin %s ± %s %s\n", m.e(p.Acceptor.Margin.Kcal), m.e(p.Acceptor.Margin.Sigma()), u)
	if p.H2Wins {
		b.WriteString(m.st.Warn.Width(max(m.w, 1)).Render("H2 wins: the acceptor's bond lies below the H2 line, so any donor strong enough to reach it makes H2 faster downhill.") + "\n")
	}
	if m.marked(p) {
		b.WriteString("* in the shortlist\n")
	}
	b.WriteString(m.flaskDetail(p))
	for _, n := range p.Notes(m.t.ev.Cond) {
		fmt.Fprintf(&b, "note: %s\n", shown(n))
	}
	b.WriteString("\n")
	b.WriteString(m.coupleDetail("Donor", m.t.ev.Entry(p.Donor.Couple), p))
	b.WriteString("\n")
	b.WriteString(m.coupleDetail("Acceptor", m.t.ev.Entry(p.Acceptor.Couple), nil))
	return b.String()
}

// flaskDetail is the pair in the flask: the conditions, the equilibrium
// conversion, the cross-relation rate estimate with its inputs, and the
// race against H2 evolution when both are downhill.
func (m Model) flaskDetail(p *thermo.Pair) string {
	var b strings.Builder
	c := m.t.ev.Cond
	fmt.Fprintf(&b, "\nIn the flask: %s\n", thermo.FlaskText(c, &m.t.flask))
	e := m.t.estimatePair(p, m.units)
	fmt.Fprintf(&b, "  equilibrium conversion of the acceptor %s ([D•] = [A–H] = %.3g M)\n", convText(e.Conversion), e.Conversion.X)
	if x := e.Cross; x != nil {
		fmt.Fprintf(&b, "  rate estimate, cross relation: log k %.1f ± %.1f (k in M⁻¹ s⁻¹), f %.3g, λ ≈ %.0f %s\n",
			x.Log10K, x.Sigma10, x.F, m.units.From(x.Lambda), m.units.Label())
		if x.OutRange {
			b.WriteString("  " + m.st.Warn.Render("! outside the range of the cross relation") + "\n")
		}
		fmt.Fprintf(&b, "  note: %s\n", shown(x.Note))
	} else {
		fmt.Fprintf(&b, "  rate estimate: – (%s)\n", shown(e.NoRate))
	}
	for _, side := range []struct {
		role string
		r    *thermo.Resolved
	}{{"donor", p.Donor}, {"acceptor", p.Acceptor}} {
		k := m.t.kSelf(side.r)
		if k == nil {
			fmt.Fprintf(&b, "  k_self (%s %s): not in the library\n", side.role, shown(side.r.Couple.ID))
			continue
		}
		fmt.Fprintf(&b, "  k_self (%s %s): %.3g M⁻¹ s⁻¹", side.role, shown(side.r.Couple.ID), k.K)
		if k.Factor > 1 {
			fmt.Fprintf(&b, " ×/÷ %g", k.Factor)
		}
		fmt.Fprintf(&b, " · %s (%s)\n", shown(k.Source), shown(k.Status))
		if k.Note != "" {
			fmt.Fprintf(&b, "    %s\n", shown(k.Note))
		}
	}
	if e.Race != "" {
		b.WriteString(m.st.Warn.Width(max(m.w, 1)).Render(shown(e.Race)) + "\n")
	}
	return b.String()
}

func (m Model) opt(v *float64) string {
	if v == nil {
		return "n/a (data missing)"
	}
	return m.e(*v) + " " + m.units.Label()
}

// coupleDetail describes one couple; with a pair, a combined donor also gets
// the electrode view toward that pair's acceptor.
func (m Model) coupleDetail(role string, e *data.Entry, p *thermo.Pair) string {
	if e == nil {
		return ""
	}
	r, u := e.R, m.units.Label()
	var b strings.Builder
	name := shown(e.ID)
	if e.Name != "" {
		name = shown(e.Name) + " · id " + name
	}
	if e.Bond != "" {
		name += " (" + shown(e.Bond) + ")"
	}
	fmt.Fprintf(&b, "%s\n", m.st.Header.Render(role+" "+name))
	fmt.Fprintf(&b, "  BDFE %s ± %s %s via %s · solvent %s\n", m.e(r.BDFE.Kcal), m.e(r.BDFE.Sigma()), u, r.Route, shown(e.Couple.Solvent.Name))
	for _, rv := range r.Routes {
		fmt.Fprintf(&b, "  route %-24s %s ± %s\n", rv.Route.String()+":", m.e(rv.Energy.Kcal), m.e(rv.Energy.Sigma()))
	}
	if c := r.Closure; c != nil {
		fmt.Fprintf(&b, "  ! cycle does not close: %s %s vs %s %s, gap %s ± %s\n", c.A.Route.Short(), m.e(c.A.Energy.Kcal),
			c.B.Route.Short(), m.e(c.B.Energy.Kcal), m.e(c.Gap), m.e(c.Sig))
	}
	fmt.Fprintf(&b, "  H2 margin %s ± %s: %s %s\n", m.e(r.Margin.Kcal), m.e(r.Margin.Sigma()), r.Tendency.Symbol(), r.Tendency)
	for _, n := range r.Notes {
		fmt.Fprintf(&b, "  note: %s\n", shown(n))
	}
	if assumed(r) {
		fmt.Fprintf(&b, "  some σ are assumed defaults (pKa %g, E° %g V, BDFE %s %s)\n",
			thermo.DefaultSigmaPKa, thermo.DefaultSigmaE, m.e(thermo.DefaultSigmaBDFE), m.units.Label())
	}
	if e.AcidID != "" || e.ReductantID != "" {
		fmt.Fprintf(&b, "  combined donor: acid %s + %s\n", shown(e.AcidID), shown(e.ReductantID))
	}
	if e.Source != "" {
		fmt.Fprintf(&b, "  source: %s", shown(e.Source))
		if e.Status != "" {
			fmt.Fprintf(&b, " (%s)", shown(e.Status))
		}
		b.WriteString("\n")
	}
	if e.Note != "" {
		fmt.Fprintf(&b, "  %s\n", shown(e.Note))
	}
	b.WriteString(squareScheme(r.Couple, m))
	if p != nil && r.Couple.In.AcidPKa != nil {
		v, err := thermo.ElectrodeWindow(p.Acceptor.BDFE.Kcal, r.Couple.In.AcidPKa.V, r.Couple.Solvent, m.t.ev.Cond)
		if err == nil {
			fmt.Fprintf(&b, "  Electrode view for this acid (pKa %.2f) with an electrode in place of the reductant:\n", r.Couple.In.AcidPKa.V)
			fmt.Fprintf(&b, "    thermoneutral H delivery to %s at %+.3f V vs %v\n", shown(p.Acceptor.Couple.ID), v.Thermoneutral, v.Ref)
			fmt.Fprintf(&b, "    H2 evolution from this acid begins at %+.3f V vs %v\n", v.H2Onset, v.Ref)
			fmt.Fprintf(&b, "    window %+.3f V (%s)\n", v.Window, windowWord(v.Window))
			if ph := m.t.ev.Cond.PH; ph != nil && r.Couple.Solvent.Key == "water" {
				tn, on := thermo.ElectrodeViewRHE(v, *ph)
				fmt.Fprintf(&b, "    vs RHE at pH %g: delivery %+.3f V, H2 onset %+.3f V\n", *ph, tn, on)
			}
		}
	}
	return b.String()
}

func windowWord(w float64) string {
	if w > 0 {
		return "the acceptor is reached before H2 evolution starts"
	}
	return "H2 evolution starts first"
}

// squareScheme draws the couple's square scheme with the known numbers on
// its edges; '?' marks a value the library does not give.
func squareScheme(c *thermo.Couple, m Model) string {
	in := c.In
	if in.AcidPKa != nil || in.Reductant != nil {
		return fmt.Sprintf("  HA + Red: pKa(HA) %s, E°(Red+/Red) %s\n", val(in.AcidPKa), pot(in.Reductant))
	}
	if in.PKa == nil && in.EAnion == nil && in.PKaCation == nil && in.ECation == nil {
		return "  square scheme: no pKa or E° given (the BDFE was given directly)\n"
	}
	top := "─ E° " + pot(in.ECation) + " ─"
	bot := "─ E° " + pot(in.EAnion) + " ─"
	w := max(lipgloss.Width(top), lipgloss.Width(bot), 24)
	edge := func(s string) string { return s + strings.Repeat("─", w-lipgloss.Width(s)) }
	gap := strings.Repeat(" ", w+4)
	var b strings.Builder
	fmt.Fprintf(&b, "  square scheme:\n")
	fmt.Fprintf(&b, "    XH•+ %s XH\n", edge(top))
	fmt.Fprintf(&b, "     │%s│\n", gap)
	fmt.Fprintf(&b, "    pKa %-*s pKa %s\n", w+1, val(in.PKaCation), val(in.PKa))
	fmt.Fprintf(&b, "     │%s│\n", gap)
	fmt.Fprintf(&b, "    X•   %s X⁻\n", edge(bot))
	fmt.Fprintf(&b, "    diagonal XH → X• + H•: BDFE %s %s\n", m.e(mustBDFE(c, m)), m.units.Label())
	return b.String()
}

// mustBDFE is the resolved BDFE of c in the current tables.
func mustBDFE(c *thermo.Couple, m Model) float64 {
	if e := m.t.ev.Entry(c); e != nil {
		return e.R.BDFE.Kcal
	}
	return 0
}

func val(v *thermo.Value) string {
	if v == nil {
		return "?"
	}
	return fmt.Sprintf("%.2f", v.V)
}

func pot(p *thermo.Potential) string {
	if p == nil {
		return "?"
	}
	return fmt.Sprintf("%+.3f V vs %v", p.V, p.Vs)
}
