package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/lipgloss"

	"github.com/hatsieve/hatsieve/thermo"
)

// View draws the screen: never wider than the terminal, exactly its height,
// and nothing in it a terminal would act on but line breaks and colours.
func (m Model) View() string {
	if !m.ready {
		return ""
	}
	var b strings.Builder
	top1, top2 := m.topLines()
	b.WriteString(fitStyled(top1, m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(top2, m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.tabsLine(), m.w))
	b.WriteByte('\n')
	b.WriteString(m.bodyView())
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.statusLine(), m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.help.View(m.helpKeys()), m.w))
	return screenSafe(b.String())
}

// topLines say what is shown of what (couples, pairs, the selection), then
// the conditions every number depends on.
func (m Model) topLines() (string, string) {
	st := m.st
	titles := shown(strings.Join(m.lib.Titles, " + "))
	if titles == "" {
		titles = "(untitled library)"
	}
	if m.t == nil {
		if m.errMsg != "" {
			return st.Top.Render("hatsieve · " + titles), st.Error.Render("cannot evaluate: " + shown(m.errMsg))
		}
		return st.Top.Render("hatsieve · " + titles), st.TopDim.Render("evaluating…")
	}
	ev := m.t.ev
	where := "in " + shown(ev.Working.Name)
	if m.okCond.Cross {
		where = "in all solvents"
	}
	counts := fmt.Sprintf("%d of %d couples: %s %s · %d pairs", len(ev.All), len(m.lib.Couples),
		classNames[m.t.class], where, m.t.total)
	if m.t.capped {
		counts += fmt.Sprintf(" (showing %s)", m.t.windowText())
	}
	counts += fmt.Sprintf(" · %d marked", len(m.marks))
	if len(ev.Problems) > 0 {
		counts += fmt.Sprintf(" · %d not evaluated", len(ev.Problems))
	}
	// Counts first: a long title is what gets cut.
	l1 := st.Top.Render("hatsieve") + st.TopDim.Render(" · "+counts+" · ") + st.Top.Render(titles)
	l2 := fmt.Sprintf("%d donors × %d acceptors · %s", len(ev.Donors), len(ev.Acceptors),
		shown(thermo.ConditionsText(ev.Cond, ev.Working, m.units)))
	if m.okCond.Cross {
		l2 = "working solvent " + shown(ev.Working.Name) + " · " + l2
	}
	return l1, st.TopDim.Render(l2)
}

func (m Model) tabsLine() string {
	var parts []string
	for i, n := range paneNames {
		s := fmt.Sprintf("%d %s", i+1, n)
		if pane(i) == m.tab {
			parts = append(parts, m.st.TabActive.Render("["+s+"]"))
		} else {
			parts = append(parts, m.st.TabIdle.Render(" "+s+" "))
		}
	}
	tabs := strings.Join(parts, " ")
	if m.t == nil {
		return tabs
	}
	// The flask, right-aligned where the tabs leave room: the pressure is
	// always in sight, even when the conditions line is cut.
	d, a := m.flask.Concentrations()
	for _, f := range []string{
		fmt.Sprintf("p(H2) %g atm · [D–H]0 %g M, [A]0 %g M", m.t.ev.Cond.PH2Atm(), d, a),
		fmt.Sprintf("p(H2) %g atm", m.t.ev.Cond.PH2Atm()),
	} {
		if gap := m.w - lipgloss.Width(tabs) - lipgloss.Width(f) - 1; gap >= 2 {
			return tabs + strings.Repeat(" ", gap) + m.st.TopDim.Render(f)
		}
	}
	return tabs
}

func (m Model) statusLine() string {
	if m.dlg != nil {
		if l := m.dlg.line(); l != "" {
			return m.st.Status.Render(l)
		}
	}
	switch {
	case m.quitting:
		return m.st.Error.Render(fmt.Sprintf("quitting once %s is written… (ctrl+c again: quit now, file not written)",
			shown(strings.Join(m.writing, ", "))))
	case m.errMsg != "" && m.t != nil:
		return m.st.Error.Render("! " + shown(m.errMsg))
	case m.loading && m.t != nil:
		return m.st.Status.Render("re-evaluating…")
	}
	var parts []string
	if m.t != nil && m.tab != paneScale {
		g := m.grids[m.tab]
		c := g.cols[g.sortCol]
		dir := "ascending"
		if g.desc() {
			dir = "descending"
		}
		parts = append(parts, fmt.Sprintf("%d/%d rows · sort %s %s", min(g.cursor+1, g.len()), g.len(), strings.TrimSpace(c.title), dir))
		if m.tab == panePairs && m.t.capped && (!m.t.holds(&g) || !isMetric(g.sortCol)) {
			parts = append(parts, "the "+m.t.windowText()+", re-ordered")
		}
		if g.query != "" {
			parts = append(parts, fmt.Sprintf("filter %q (esc clears)", g.query))
		}
		if g.pending {
			parts = append(parts, "sorting…")
		}
		switch m.tab {
		case paneDonors, paneAcceptors:
			parts = append(parts, "σ with a: an assumed default went in · BDFE with b: given without a basis")
		case panePairs:
			parts = append(parts, "ΔG° with e: rests on an estimated constant · b: a BDFE given without a basis")
		}
	}
	if m.status != "" {
		parts = append(parts, shown(m.status))
	}
	return m.st.Status.Render(strings.Join(parts, " · "))
}

// bodyView is exactly bodyHeight lines of at most m.w cells.
func (m Model) bodyView() string {
	h := m.bodyHeight()
	var s string
	if m.dlg != nil {
		s = m.dlg.view(m.w, h, m.st)
	}
	switch {
	case s != "":
	case m.t == nil:
		s = m.st.Dim.Render("evaluating the library…")
	default:
		s = m.paneView()
	}
	return block(s, m.w, h)
}

// block pads or cuts s to exactly h lines of at most w cells each.
func block(s string, w, h int) string {
	lines := strings.Split(s, "\n")
	if len(lines) > h {
		lines = lines[:h]
	}
	for i, l := range lines {
		if lipgloss.Width(l) > w {
			lines[i] = fitStyled(l, w)
		}
	}
	for len(lines) < h {
		lines = append(lines, "")
	}
	return strings.Join(lines, "\n")
}

func (m Model) paneView() string {
	switch m.tab {
	case panePairs:
		return m.grids[panePairs].view(m.st, m.pairCell, nil, m.emptyText("pairs"))
	case paneDonors:
		return m.grids[paneDonors].view(m.st, m.entryCell(m.t.donors, m.labels.get(slotDonors, m.t)), nil, m.emptyText("donors"))
	case paneAcceptors:
		return m.grids[paneAcceptors].view(m.st, m.entryCell(m.t.acceptors, m.labels.get(slotAcceptors, m.t)), nil, m.emptyText("acceptors"))
	case paneSeries:
		return m.seriesView()
	}
	return m.scale
}

func (m Model) emptyText(what string) string {
	if g := m.grids[m.tab]; g.query != "" {
		return fmt.Sprintf("no %s match %q (esc clears the filter)", what, g.query)
	}
	if g := m.grids[m.tab]; g.pending {
		return "sorting…"
	}
	if m.t != nil && m.t.class != classAll {
		return fmt.Sprintf("no %s with %s bonds here (c shows another bond class)", what, classNames[m.t.class])
	}
	return "no " + what + " in this solvent"
}

// helpLines lists the keys of the panes, one a line, for the help dialog;
// the page keys and the pane numbers share a line each.
func (m Model) helpLines() string {
	var b strings.Builder
	browse := m
	browse.dlg = nil
	browse.updateKeys()
	km := browse.keys
	folded := map[string]bool{}
	for _, k := range []key.Binding{km.PageDown, km.Home, km.End, km.Tab2, km.Tab3, km.Tab4, km.Tab5} {
		folded[k.Help().Key] = true
	}
	for _, col := range browse.helpKeys().full {
		for _, k := range col {
			h := k.Help()
			if (!k.Enabled() && h.Key != "enter" && h.Key != "esc") || folded[h.Key] {
				continue
			}
			switch h.Key {
			case km.PageUp.Help().Key:
				h.Key, h.Desc = "pgup/pgdn", "page (home/end: ends)"
			case km.Tab1.Help().Key:
				h.Key, h.Desc = "1…5", "pane by number"
			}
			fmt.Fprintf(&b, "%-10s %s\n", h.Key, h.Desc)
		}
	}
	fmt.Fprintf(&b, "%-10s %s\n%-10s %s\n", m.keys.Cancel.Help().Key, "close dialog or detail", "ctrl+c", "quit from anywhere")
	return b.String()
}

// e formats an energy in kcal/mol in the chosen units.
func (m Model) e(kcal float64) string { return fmt.Sprintf("%.1f", m.units.From(kcal)) }

func isMetric(col int) bool { _, ok := pairMetric(col); return ok }
