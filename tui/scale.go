package tui

import (
	"fmt"
	"math"
	"strings"

	"github.com/charmbracelet/lipgloss"
	"github.com/mattn/go-runewidth"

	"github.com/hatsieve/hatsieve/thermo"
)

// scaleKey is what the drawn scale depends on; the scale is redrawn in
// Update only when it changes.
type scaleKey struct {
	t     *tables
	sel   *thermo.Pair
	w, h  int
	units thermo.Units
}

func (m Model) currentScaleKey() scaleKey {
	return scaleKey{t: m.t, sel: m.selectedPair(), w: m.w, h: m.bodyHeight(), units: m.units}
}

// scaleLabel is one couple placed on the axis.
type scaleLabel struct {
	r   *thermo.Resolved
	sel bool
}

// renderScale draws a vertical BDFE axis in a w×h block: donors on the left,
// acceptors on the right, the H2 line across, and the selected pair's two
// couples joined by an arrow. One label per row per side; the rest are
// hidden and counted.
func renderScale(t *tables, sel *thermo.Pair, w, h int, u thermo.Units, st *Styles) string {
	ev := t.ev
	rows := h - 3 // title, then rows, then two lines of legend
	if rows < 3 || w < 30 {
		return "the screen is too small for the scale"
	}
	gh := ev.H2Line.V
	lo, hi := gh, gh
	for _, set := range [][]*thermo.Resolved{ev.Donors, ev.Acceptors} {
		for _, r := range set {
			lo, hi = math.Min(lo, r.BDFE.Kcal), math.Max(hi, r.BDFE.Kcal)
		}
	}
	if hi-lo < 1 {
		lo, hi = lo-1, hi+1
	}
	y := func(v float64) int { return int(math.Round((hi - v) / (hi - lo) * float64(rows-1))) }

	const mid = 9 // tick (6) + axis + arrow + space
	lw := (w - mid) / 2
	rw := w - mid - lw
	left := make([]string, rows)
	right := make([]string, rows)
	leftSt := make([]*lipgloss.Style, rows)
	rightSt := make([]*lipgloss.Style, rows)
	hiddenD, hiddenA := 0, 0
	yh := y(gh)

	place := func(side []string, sty []*lipgloss.Style, r *thermo.Resolved, selected, isDonor bool) bool {
		k := y(r.BDFE.Kcal)
		if side[k] != "" || (k == yh && !selected) {
			return false
		}
		val := fmt.Sprintf("%.1f", u.From(r.BDFE.Kcal))
		if isDonor {
			txt := r.Tendency.Symbol() + " " + shown(r.Couple.ID) + " " + val + " ─"
			if selected {
				txt = "▶ " + txt
			}
			side[k] = txt
			s := tendencyStyle(st, r.Tendency)
			sty[k] = &s
		} else {
			txt := "─ " + val + " " + shown(r.Couple.ID)
			if r.Margin.Kcal < 0 {
				txt += " (below H2)"
			}
			if selected {
				txt += " ◀"
			}
			side[k] = txt
		}
		if selected {
			s := st.Accent
			sty[k] = &s
		}
		return true
	}
	if sel != nil {
		place(left, leftSt, sel.Donor, true, true)
		place(right, rightSt, sel.Acceptor, true, false)
	}
	for _, r := range ev.Donors {
		if sel != nil && r == sel.Donor {
			continue
		}
		if !place(left, leftSt, r, false, true) {
			hiddenD++
		}
	}
	for _, r := range ev.Acceptors {
		if sel != nil && r == sel.Acceptor {
			continue
		}
		if !place(right, rightSt, r, false, false) {
			hiddenA++
		}
	}

	// The arrow column joins the selected donor's row to its acceptor's.
	arrow := make([]string, rows)
	if sel != nil {
		yd, ya := y(sel.Donor.BDFE.Kcal), y(sel.Acceptor.BDFE.Kcal)
		step := 1
		head := "▼"
		if ya < yd {
			step, head = -1, "▲"
		}
		for k := yd; k != ya; k += step {
			arrow[k] = "│"
		}
		arrow[yd] = "●"
		arrow[ya] = head
		if ya == yd {
			arrow[ya] = "◆"
		}
	}

	var b strings.Builder
	fmt.Fprintf(&b, "BDFE scale, %s: donors (H2 tendency ▼ ≈ ▲) left, acceptors right, H2 line ═", u.Label())
	tickEvery := max(rows/6, 2)
	for k := range rows {
		b.WriteByte('\n')
		v := hi - float64(k)/float64(rows-1)*(hi-lo)
		tick := "      "
		axis := "│"
		if k%tickEvery == 0 || k == rows-1 {
			tick = fmt.Sprintf("%6.1f", u.From(v))
			axis = "┤"
		}
		if k == yh {
			line := fmt.Sprintf(" H2 line %.1f ", u.From(gh))
			l := left[k]
			if l == "" {
				l = strings.Repeat("═", max(lw-1, 0))
			}
			b.WriteString(st.H2Line.Render(pad1(l, lw, true)))
			b.WriteString(st.H2Line.Render(fmt.Sprintf("%6.1f╪", u.From(gh))))
			a := arrow[k]
			if a == "" {
				a = "═"
			}
			b.WriteString(a + "═")
			r := right[k]
			if r == "" {
				r = line + strings.Repeat("═", max(rw-runewidth.StringWidth(line), 0))
			}
			b.WriteString(st.H2Line.Render(pad1(r, rw, false)))
			continue
		}
		b.WriteString(styled(leftSt[k], pad1(left[k], lw, true)))
		b.WriteString(st.Axis.Render(tick + axis))
		a := arrow[k]
		if a == "" {
			a = " "
		}
		b.WriteString(st.Accent.Render(a) + " ")
		b.WriteString(styled(rightSt[k], pad1(right[k], rw, false)))
	}
	b.WriteByte('\n')
	if sel != nil {
		fmt.Fprintf(&b, "● %s (%.1f) → %s (%.1f): ΔG° %.1f %s", shown(sel.Donor.Couple.ID), u.From(sel.Donor.BDFE.Kcal),
			shown(sel.Acceptor.Couple.ID), u.From(sel.Acceptor.BDFE.Kcal), u.From(sel.DG.Kcal), u.Label())
	} else {
		b.WriteString("no pair selected")
	}
	b.WriteByte('\n')
	if hiddenD+hiddenA > 0 {
		b.WriteString(st.Dim.Render(fmt.Sprintf("labels thinned: %d donors and %d acceptors hidden where they would overlap (↑/↓ picks a pair)", hiddenD, hiddenA)))
	} else {
		b.WriteString(st.Dim.Render("every couple is labelled (↑/↓ picks a pair)"))
	}
	return b.String()
}

func styled(s *lipgloss.Style, text string) string {
	if s == nil {
		return text
	}
	return s.Render(text)
}

func tendencyStyle(st *Styles, t thermo.Tendency) lipgloss.Style {
	switch t {
	case thermo.Downhill:
		return st.Downhill
	case thermo.NearLine:
		return st.Near
	}
	return st.Uphill
}

// pad1 fits plain text into w cells, aligned right or left.
func pad1(s string, w int, right bool) string {
	var b strings.Builder
	pad(&b, s, w, right)
	return b.String()
}
