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
	band  bool
}

func (m Model) currentScaleKey() scaleKey {
	return scaleKey{t: m.t, sel: m.selectedPair(), w: m.w, h: m.bodyHeight(), units: m.units, band: m.band}
}

// renderScale draws a vertical BDFE axis in a w×h block: donors on the left,
// acceptors on the right, the H2 line across, and the selected pair's two
// couples joined by an arrow. One label per row per side; the rest are
// hidden and counted.
//
// With band, a column beside the axis shades the selected acceptor's
// delivery window: the BDFEs between the H2 line and the acceptor's bond,
// where an acid + reductant delivers H to it without making H2 (the w key
// lists them).
func renderScale(t *tables, sel *thermo.Pair, band bool, w, h int, u thermo.Units, st *Styles) string {
	rows := h - 3 // title, then rows, then two lines of legend
	if rows < 3 || w < 30 {
		return "the screen is too small for the scale"
	}
	s := newScaleLayout(t.ev.Donors, t.ev.Acceptors, t.ev.H2Line.V, rows, w)
	s.placeAll(t.ev.Donors, t.ev.Acceptors, sel, u, st)
	s.drawArrow(sel)
	if band && sel != nil {
		s.drawBand(sel.Acceptor)
	}
	var b strings.Builder
	fmt.Fprintf(&b, "BDFE scale, %s: donors (H2 tendency ▼ ≈ ▲) left, acceptors right, H2 line ═", u.Label())
	s.writeRows(&b, u, st)
	s.writeLegend(&b, sel, band, u, st)
	return b.String()
}

// scaleLayout is the scale being drawn: the axis range, one label per row
// on each side, and the arrow column.
type scaleLayout struct {
	rows, lw, rw, yh int
	lo, hi, gh       float64
	left, right      []string
	leftSt, rightSt  []*lipgloss.Style
	arrow            []string
	band             []bool // rows inside the delivery window
	hiddenD, hiddenA int
}

// newScaleLayout spans the BDFEs of every couple and the H2 line gh.
func newScaleLayout(donors, acceptors []*thermo.Resolved, gh float64, rows, w int) *scaleLayout {
	lo, hi := gh, gh
	for _, set := range [][]*thermo.Resolved{donors, acceptors} {
		for _, r := range set {
			lo, hi = math.Min(lo, r.BDFE.Kcal), math.Max(hi, r.BDFE.Kcal)
		}
	}
	if hi-lo < 1 {
		lo, hi = lo-1, hi+1
	}
	const mid = 10 // tick (6) + axis + band + arrow + space
	lw := (w - mid) / 2
	s := &scaleLayout{rows: rows, lw: lw, rw: w - mid - lw, lo: lo, hi: hi, gh: gh,
		left: make([]string, rows), right: make([]string, rows), arrow: make([]string, rows), band: make([]bool, rows),
		leftSt: make([]*lipgloss.Style, rows), rightSt: make([]*lipgloss.Style, rows)}
	s.yh = s.y(gh)
	return s
}

// y is the row of a BDFE.
func (s *scaleLayout) y(v float64) int {
	return int(math.Round((s.hi - v) / (s.hi - s.lo) * float64(s.rows-1)))
}

// placeAll labels the selected pair's couples first, then every other
// couple where its row is free, counting those that are not.
func (s *scaleLayout) placeAll(donors, acceptors []*thermo.Resolved, sel *thermo.Pair, u thermo.Units, st *Styles) {
	if sel != nil {
		s.place(sel.Donor, true, true, u, st)
		s.place(sel.Acceptor, true, false, u, st)
	}
	for _, r := range donors {
		if (sel == nil || r != sel.Donor) && !s.place(r, false, true, u, st) {
			s.hiddenD++
		}
	}
	for _, r := range acceptors {
		if (sel == nil || r != sel.Acceptor) && !s.place(r, false, false, u, st) {
			s.hiddenA++
		}
	}
}

// place labels r on its row, if the row is free (the H2 line's row only
// takes the selected pair).
func (s *scaleLayout) place(r *thermo.Resolved, selected, isDonor bool, u thermo.Units, st *Styles) bool {
	side, sty := s.right, s.rightSt
	if isDonor {
		side, sty = s.left, s.leftSt
	}
	k := s.y(r.BDFE.Kcal)
	if side[k] != "" || (k == s.yh && !selected) {
		return false
	}
	val := fmt.Sprintf("%.1f", u.From(r.BDFE.Kcal))
	name := shown(coupleName(r.Couple))
	if isDonor {
		txt := r.Tendency.Symbol() + " " + name + " " + val + " ─"
		if selected {
			txt = "▶ " + txt
		}
		side[k] = txt
		ts := tendencyStyle(st, r.Tendency)
		sty[k] = &ts
	} else {
		txt := "─ " + val + " " + name
		if r.Margin.Kcal < 0 {
			txt += " (below H2)"
		}
		if selected {
			txt += " ◀"
		}
		side[k] = txt
	}
	if selected {
		a := st.Accent
		sty[k] = &a
	}
	return true
}

// drawArrow joins the selected donor's row to its acceptor's.
func (s *scaleLayout) drawArrow(sel *thermo.Pair) {
	if sel == nil {
		return
	}
	yd, ya := s.y(sel.Donor.BDFE.Kcal), s.y(sel.Acceptor.BDFE.Kcal)
	step, head := 1, "▼"
	if ya < yd {
		step, head = -1, "▲"
	}
	for k := yd; k != ya; k += step {
		s.arrow[k] = "│"
	}
	s.arrow[yd] = "●"
	s.arrow[ya] = head
	if ya == yd {
		s.arrow[ya] = "◆"
	}
}

// drawBand shades the rows from the H2 line up to acceptor a's bond: none
// when the bond lies below the line.
func (s *scaleLayout) drawBand(a *thermo.Resolved) {
	if a.BDFE.Kcal <= s.gh {
		return
	}
	for k := s.y(a.BDFE.Kcal); k <= s.yh; k++ {
		s.band[k] = true
	}
}

func (s *scaleLayout) bandCell(k int, st *Styles) string {
	if s.band[k] {
		return st.Accent.Render("▒")
	}
	return " "
}

// writeRows writes the axis rows, ticks on the axis and the H2 line across.
func (s *scaleLayout) writeRows(b *strings.Builder, u thermo.Units, st *Styles) {
	tickEvery := max(s.rows/6, 2)
	for k := range s.rows {
		b.WriteByte('\n')
		if k == s.yh {
			s.writeH2Row(b, u, st)
			continue
		}
		v := s.hi - float64(k)/float64(s.rows-1)*(s.hi-s.lo)
		tick, axis := "      ", "│"
		if k%tickEvery == 0 || k == s.rows-1 {
			tick, axis = fmt.Sprintf("%6.1f", u.From(v)), "┤"
		}
		b.WriteString(styled(s.leftSt[k], pad1(s.left[k], s.lw, true)))
		b.WriteString(st.Axis.Render(tick + axis))
		b.WriteString(s.bandCell(k, st))
		a := s.arrow[k]
		if a == "" {
			a = " "
		}
		b.WriteString(st.Accent.Render(a) + " ")
		b.WriteString(styled(s.rightSt[k], pad1(s.right[k], s.rw, false)))
	}
}

func (s *scaleLayout) writeH2Row(b *strings.Builder, u thermo.Units, st *Styles) {
	k := s.yh
	line := fmt.Sprintf(" H2 line %.1f ", u.From(s.gh))
	l := s.left[k]
	if l == "" {
		l = strings.Repeat("═", max(s.lw-1, 0))
	}
	b.WriteString(st.H2Line.Render(pad1(l, s.lw, true)))
	b.WriteString(st.H2Line.Render(fmt.Sprintf("%6.1f╪", u.From(s.gh))))
	if s.band[k] {
		b.WriteString(s.bandCell(k, st))
	} else {
		b.WriteString(st.H2Line.Render("═"))
	}
	a := s.arrow[k]
	if a == "" {
		a = "═"
	}
	b.WriteString(a + "═")
	r := s.right[k]
	if r == "" {
		r = line + strings.Repeat("═", max(s.rw-runewidth.StringWidth(line), 0))
	}
	b.WriteString(st.H2Line.Render(pad1(r, s.rw, false)))
}

// writeLegend names the selected pair and says what was thinned.
func (s *scaleLayout) writeLegend(b *strings.Builder, sel *thermo.Pair, band bool, u thermo.Units, st *Styles) {
	b.WriteByte('\n')
	if sel != nil {
		fmt.Fprintf(b, "● %s (%.1f) → %s (%.1f): ΔG° %.1f %s", shown(coupleName(sel.Donor.Couple)), u.From(sel.Donor.BDFE.Kcal),
			shown(coupleName(sel.Acceptor.Couple)), u.From(sel.Acceptor.BDFE.Kcal), u.From(sel.DG.Kcal), u.Label())
		switch a := sel.Acceptor; {
		case !band:
		case a.BDFE.Kcal <= s.gh:
			b.WriteString(" · no window: acceptor below H2")
		default:
			fmt.Fprintf(b, " · ▒ its window %.1f–%.1f (w lists reagents)", u.From(s.gh), u.From(a.BDFE.Kcal))
		}
	} else {
		b.WriteString("no pair selected")
	}
	b.WriteByte('\n')
	if s.hiddenD+s.hiddenA > 0 {
		b.WriteString(st.Dim.Render(fmt.Sprintf("labels thinned: %d donors and %d acceptors hidden where they would overlap (↑/↓ picks a pair)", s.hiddenD, s.hiddenA)))
	} else {
		b.WriteString(st.Dim.Render("every couple is labelled (↑/↓ picks a pair)"))
	}
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
