package figure

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/hatsieve/hatsieve/thermo"
)

// Couple is one X–H bond on a figure.
type Couple struct {
	Label    string          // drawn beside the tick (the couple's id)
	Value    float64         // BDFE in the figure's units
	Sigma    float64         // 1σ in the same units; 0 draws no error bar
	Tendency thermo.Tendency // a donor's H2 tendency
	BelowH2  bool            // an acceptor whose bond lies below the H2 line
}

// LadderInput is everything the BDFE ladder shows.
type LadderInput struct {
	Title     string
	Donors    []Couple
	Acceptors []Couple
	H2Line    float64 // G_H, the H2 line, in the figure's units
	// H2Pressure is the H2 pressure of the H2 line in atm, named beside
	// the line when not 1 (0 is taken as 1).
	H2Pressure float64
	Units      string // "kcal/mol" or "kJ/mol"
	// DonorsOf and AcceptorsOf are how many couples each side was chosen
	// from (the column heads say "20 of 49"); 0 or fewer than drawn: as
	// many as drawn.
	DonorsOf, AcceptorsOf int
	// Pair, when set, joins one donor to one acceptor with an arrow named
	// by its ΔG° (the pair selected on a screen).
	Pair    *LadderPair
	Caption string // the conditions: solvent, basis, temperature, units, what was left out
	Page    Page
	// Strict makes a side with more couples than the page holds an error
	// (a *TooManyError) instead of leaving some out and saying so.
	Strict bool
}

// TooManyError is the error of a strict ladder whose page cannot hold
// every couple of a side, even with the labels at their smallest.
type TooManyError struct {
	Side   string // "donors" or "acceptors"
	N, Fit int    // couples on that side, and how many the page holds
	Page   Page
}

func (e *TooManyError) Error() string {
	pg := e.Page.withDefaults()
	return fmt.Sprintf("a %.3gcm × %.3gcm page holds at most %d couples a side (labels at 8 pt), not %d %s",
		pg.Width/vg.Centimeter, pg.Height/vg.Centimeter, e.Fit, e.N, e.Side)
}

// Is makes a TooManyError an ErrTooSmall.
func (e *TooManyError) Is(target error) bool { return target == ErrTooSmall }

// LadderPair is a donor and an acceptor of a ladder, by their indices in
// Donors and Acceptors, and the ΔG°(HAT) between them.
type LadderPair struct {
	Donor, Acceptor int
	DG              float64
}

// Ladder writes the BDFE ladder in format ("svg" or "png"): donors
// left, acceptors right, each a tick with its label and value and a ±1σ
// bar, the donors' H2 tendency as marker shape (and colour) named in the
// legend, the H2 line across. Labels that would overlap are spread apart
// with leader lines to their ticks; when a side has more couples than fit
// at the page's height (labels shrunk to 8 pt), a Strict ladder is an
// error and any other keeps those that span the range (PickSpan, the
// selected pair's couples always among them) and the caption says how
// many were left out.
func Ladder(w io.Writer, format string, in LadderInput) error {
	_, err := ladder(w, format, in)
	return err
}

// ladderLayout is where things went; the tests check the drawing against it.
type ladderLayout struct {
	area         vg.Rectangle // the data area
	vmin, vmax   float64      // the axis range across area
	h2Y          vg.Length
	shownD       []int // indices of the donors drawn
	shownA       []int
	caption      []string
	labelsD      []vg.Length // label baselines (centres), by shownD
	labelsA      []vg.Length
	gap          vg.Length // minimum distance between label centres
	size         vg.Length // the labels' font size
	capacity     int       // labels a side holds at that size
	hiddenD, hid int
}

func (l *ladderLayout) y(v float64) vg.Length {
	return l.area.Min.Y + vg.Length((v-l.vmin)/(l.vmax-l.vmin))*(l.area.Max.Y-l.area.Min.Y)
}

const margin = 0.22 * vg.Inch

func ladder(w io.Writer, format string, in LadderInput) (ladderLayout, error) {
	var l ladderLayout
	err := render(w, format, in.Page, func(dc draw.Canvas) error {
		var err error
		l, err = drawLadder(dc, in)
		return err
	})
	return l, err
}

func ladderLegend(in LadderInput) []legendItem {
	items := []legendItem{
		{shape: shapeTriangleDown, col: colDownhill, text: "donor, H2 downhill"},
		{shape: shapeDiamond, col: colNear, text: "donor, near H2 line"},
		{shape: shapeTriangleUp, col: colUphill, text: "donor, H2 uphill"},
		{shape: shapeCircle, col: colAcceptor, text: "acceptor"},
	}
	for _, a := range in.Acceptors {
		if a.BelowH2 {
			items = append(items, legendItem{shape: shapeRing, col: colAcceptor, text: "acceptor below H2 line"})
			break
		}
	}
	return append(items,
		legendItem{dashed: true, text: "H2 line"},
		legendItem{errbar: true, text: "BDFE ± 1σ"})
}

// drawLadder lays the ladder out on dc and draws it; it draws nothing
// and fails when the page leaves the axis less than six label lines or the
// columns less than 300 pt, or a strict side does not fit.
func drawLadder(dc draw.Canvas, in LadderInput) (ladderLayout, error) {
	var l ladderLayout
	full := dc.Rectangle
	inner := vg.Rectangle{Min: vg.Point{X: full.Min.X + margin, Y: full.Min.Y + margin},
		Max: vg.Point{X: full.Max.X - margin, Y: full.Max.Y - margin}}
	tst := textStyle(titleSize, true)
	titleH := tst.Height("Ag") * 1.4
	legend := ladderLegend(in)
	iw := inner.Max.X - inner.Min.X

	// The caption may grow by a note on what was left out; lay out twice.
	var captionLines []string
	for range 4 {
		before := [2]int{l.hiddenD, l.hid}
		captionLines = wrap(textStyle(captionSize, false), in.Caption+l.leftOutNote(in), iw)
		footer := legendHeight(legend, iw) + 6 + captionHeight(captionLines)
		headH := textStyle(11, true).Height("Ag") * 1.6
		l.area = vg.Rectangle{
			Min: vg.Point{X: inner.Min.X + 56, Y: inner.Min.Y + footer + 12},
			Max: vg.Point{X: inner.Max.X, Y: inner.Max.Y - titleH - headH},
		}
		l.fit(in)
		if before == [2]int{l.hiddenD, l.hid} {
			break
		}
	}
	l.caption = captionLines
	if l.area.Max.Y-l.area.Min.Y < 6*l.gap || l.area.Max.X-l.area.Min.X < 300 {
		return l, tooSmall("the ladder", in.Page)
	}
	if in.Strict && l.hiddenD+l.hid > 0 {
		side, n := "donors", len(in.Donors)
		if l.hiddenD == 0 {
			side, n = "acceptors", len(in.Acceptors)
		}
		return l, &TooManyError{Side: side, N: n, Fit: l.capacity, Page: in.Page}
	}
	l.setRange(in)

	// Title, column heads, footer.
	tst.YAlign = draw.YTop
	dc.FillText(tst, vg.Point{X: inner.Min.X, Y: inner.Max.Y}, title(in.Title))
	drawLegend(dc, legend, inner.Min.X, l.area.Min.Y-12, iw)
	drawCaption(dc, captionLines, inner.Min.X, l.area.Min.Y-12-legendHeight(legend, iw)-6)
	l.drawAxis(dc, in.Units)

	cols := l.columns(in)
	hst := textStyle(11, true)
	hst.YAlign = draw.YBottom
	hst.XAlign = draw.XCenter
	top := l.area.Max.Y + 4
	dc.FillText(hst, vg.Point{X: cols.dTick + tickW/2, Y: top}, "Donors X–H"+count(len(l.shownD), max(len(in.Donors), in.DonorsOf)))
	dc.FillText(hst, vg.Point{X: cols.aTick + tickW/2, Y: top}, "Acceptors Y–H"+count(len(l.shownA), max(len(in.Acceptors), in.AcceptorsOf)))

	// The H2 line across, named in the middle.
	l.h2Y = l.y(in.H2Line)
	line(dc, h2Style(), vg.Point{X: l.area.Min.X, Y: l.h2Y}, vg.Point{X: l.area.Max.X, Y: l.h2Y})
	h2t := textStyle(labelSize, true)
	h2t.XAlign, h2t.YAlign = draw.XCenter, draw.YBottom
	h2 := fmt.Sprintf("H2 line %.1f", in.H2Line)
	if p := in.H2Pressure; p > 0 && p != thermo.StandardH2Pressure {
		h2 += fmt.Sprintf(" (%g atm)", p)
	}
	halo(dc, h2t, vg.Point{X: (cols.dTick + tickW + cols.aTick) / 2, Y: l.h2Y + 3}, h2)

	l.labelsD = l.drawSide(dc, in.Donors, l.shownD, cols.dTick, cols.dLabel, true)
	l.labelsA = l.drawSide(dc, in.Acceptors, l.shownA, cols.aTick, cols.aLabel, false)
	l.drawPair(dc, in, cols)
	return l, nil
}

// drawPair draws the arrow of in.Pair from the donor's tick to the
// acceptor's, when both are drawn (a pair whose couple was left out for
// want of room is always kept: see fit).
func (l *ladderLayout) drawPair(dc draw.Canvas, in LadderInput, cols columns) {
	p := in.Pair
	if p == nil || p.Donor < 0 || p.Donor >= len(in.Donors) || p.Acceptor < 0 || p.Acceptor >= len(in.Acceptors) {
		return
	}
	from := vg.Point{X: cols.dTick + tickW + 4, Y: l.y(in.Donors[p.Donor].Value)}
	to := vg.Point{X: cols.aTick - 4, Y: l.y(in.Acceptors[p.Acceptor].Value)}
	sty := draw.LineStyle{Color: color.Black, Width: 1.4}
	line(dc, sty, from, to)
	// The head: two strokes 8 pt long, 25° either side of the shaft.
	ang := math.Atan2(float64(to.Y-from.Y), float64(to.X-from.X))
	for _, da := range []float64{math.Pi - 0.44, math.Pi + 0.44} {
		a := ang + da
		line(dc, sty, to, vg.Point{X: to.X + vg.Length(8*math.Cos(a)), Y: to.Y + vg.Length(8*math.Sin(a))})
	}
	st := textStyle(labelSize, true)
	st.XAlign, st.YAlign = draw.XCenter, draw.YBottom
	mid := vg.Point{X: (from.X + to.X) / 2, Y: (from.Y+to.Y)/2 + 4}
	halo(dc, st, mid, fmt.Sprintf("ΔG° %+.1f", p.DG))
}

func count(shown, all int) string {
	if shown == all {
		return fmt.Sprintf(" (%d)", all)
	}
	return fmt.Sprintf(" (%d of %d)", shown, all)
}

// setRange spans every drawn value ± σ and the H2 line, with room at both
// ends.
func (l *ladderLayout) setRange(in LadderInput) {
	lo, hi := in.H2Line, in.H2Line
	for _, side := range []struct {
		cs  []Couple
		idx []int
	}{{in.Donors, l.shownD}, {in.Acceptors, l.shownA}} {
		for _, i := range side.idx {
			c := side.cs[i]
			lo, hi = math.Min(lo, c.Value-c.Sigma), math.Max(hi, c.Value+c.Sigma)
		}
	}
	if hi-lo < 2 {
		lo, hi = lo-1, hi+1
	}
	pad := (hi - lo) * 0.04
	l.vmin, l.vmax = lo-pad, hi+pad
}

// leftOutNote is the caption's note on couples not drawn.
func (l *ladderLayout) leftOutNote(in LadderInput) string {
	if l.hiddenD == 0 && l.hid == 0 {
		return ""
	}
	return fmt.Sprintf(" For want of room, %d of these %d donors and %d of %d acceptors are drawn, chosen %s; a taller page shows more.",
		len(in.Donors)-l.hiddenD, len(in.Donors), len(in.Acceptors)-l.hid, len(in.Acceptors), PickSpan.Rule())
}

// fit chooses on each side the couples whose labels fit the area's height:
// all when they fit, else those that span the range (the selected pair's
// couples among them).
func (l *ladderLayout) fit(in LadderInput) {
	h := l.area.Max.Y - l.area.Min.Y
	n := max(len(in.Donors), len(in.Acceptors))
	var k int
	// The labels shrink from 10 pt to 8 pt before any is left out.
	for _, size := range []vg.Length{labelSize, 9, 8} {
		l.size = size
		l.gap = textStyle(size, false).Height("Ag") * 1.1
		if k = capacity(float64(l.gap), 0, float64(h-l.gap)); k >= n {
			break
		}
	}
	h2 := in.H2Line
	keepD, keepA := -1, -1
	if in.Pair != nil {
		keepD, keepA = in.Pair.Donor, in.Pair.Acceptor
	}
	l.capacity = k
	l.shownD, l.shownA = spanKeeping(in.Donors, h2, k, keepD), spanKeeping(in.Acceptors, h2, k, keepA)
	l.hiddenD, l.hid = len(in.Donors)-len(l.shownD), len(in.Acceptors)-len(l.shownA)
}

// tickW is the width of a column's ticks; the error bars of overlapping
// couples take lanes across it.
const (
	tickW  = 64
	lanes  = 5
	leader = 36
)

type columns struct {
	dTick, dLabel vg.Length // donors: the tick's left end, the labels' right end
	aTick, aLabel vg.Length // acceptors: the tick's left end, the labels' left end
}

// columns places the two columns: donor labels, leaders, ticks, the middle
// (where the H2 line is named), ticks, leaders, acceptor labels.
func (l *ladderLayout) columns(in LadderInput) columns {
	lst := textStyle(l.size, false)
	widest := func(cs []Couple, idx []int, donor bool) vg.Length {
		var w vg.Length
		for _, i := range idx {
			w = max(w, lst.Width(sideLabel(cs[i], donor)))
		}
		return w
	}
	W := l.area.Max.X - l.area.Min.X
	wd := min(widest(in.Donors, l.shownD, true), W*0.3)
	wa := min(widest(in.Acceptors, l.shownA, false), W*0.3)
	// Centre the two ladders; the middle takes what is left, at least room
	// for the H2 line's name.
	mid := min(max(W-(wd+wa+2*(leader+tickW+8)), 110), 190)
	total := wd + wa + 2*(leader+tickW+8) + mid
	x0 := l.area.Min.X + max((W-total)/2, 0) + 8
	var c columns
	c.dLabel = x0 + wd
	c.dTick = c.dLabel + leader
	c.aTick = c.dTick + tickW + mid
	c.aLabel = c.aTick + tickW + leader
	return c
}

func sideLabel(c Couple, donor bool) string {
	if donor {
		return fmt.Sprintf("%s  %.1f", label(c.Label), c.Value)
	}
	s := fmt.Sprintf("%.1f  %s", c.Value, label(c.Label))
	if c.BelowH2 {
		s += " (below H2 line)"
	}
	return s
}

func donorLook(t thermo.Tendency) (shape, color.Color) {
	switch t {
	case thermo.Downhill:
		return shapeTriangleDown, colDownhill
	case thermo.NearLine:
		return shapeDiamond, colNear
	}
	return shapeTriangleUp, colUphill
}

// drawSide draws one column's ticks, error bars, markers, leaders and
// labels, and returns the labels' vertical centres in the order of idx.
func (l *ladderLayout) drawSide(dc draw.Canvas, cs []Couple, idx []int, xTick, xLabel vg.Length, donor bool) []vg.Length {
	order := append([]int(nil), idx...)
	sort.SliceStable(order, func(a, b int) bool { return cs[order[a]].Value < cs[order[b]].Value })
	vals := make([]float64, len(order))
	for k, i := range order {
		vals[k] = cs[i].Value
	}
	// The minimum gap in data units, from the font height and the scale.
	scale := (l.vmax - l.vmin) / float64(l.area.Max.Y-l.area.Min.Y)
	pos := spread(vals, float64(l.gap)*scale, l.vmin+float64(l.gap/2)*scale, l.vmax-float64(l.gap/2)*scale)
	lane := laneOf(cs, order)
	lst := textStyle(l.size, false)
	lst.YAlign = draw.YCenter
	centres := make(map[int]vg.Length, len(order))
	for k, i := range order {
		c := cs[i]
		y, ly := l.y(c.Value), l.y(pos[k])
		centres[i] = ly
		shp, col := shapeCircle, color.Color(colAcceptor)
		if donor {
			shp, col = donorLook(c.Tendency)
		} else if c.BelowH2 {
			shp = shapeRing
		}
		line(dc, draw.LineStyle{Color: col, Width: 1.6}, vg.Point{X: xTick, Y: y}, vg.Point{X: xTick + tickW, Y: y})
		// The leader runs from the label to the tick's near end.
		lead := draw.LineStyle{Color: colLeader, Width: 0.6}
		if donor {
			line(dc, lead, vg.Point{X: xLabel + 2, Y: ly}, vg.Point{X: xLabel + 8, Y: ly}, vg.Point{X: xTick - 2, Y: y})
			lst.XAlign = draw.XRight
		} else {
			line(dc, lead, vg.Point{X: xTick + tickW + 2, Y: y}, vg.Point{X: xLabel - 8, Y: ly}, vg.Point{X: xLabel - 2, Y: ly})
			lst.XAlign = draw.XLeft
		}
		x := xTick + tickW*(vg.Length(lane[k])+0.5)/lanes
		if c.Sigma > 0 {
			errBar(dc, col, x, l.y(c.Value-c.Sigma), l.y(c.Value+c.Sigma))
		}
		mark(dc, shp, col, 3.6, vg.Point{X: x, Y: y})
		halo(dc, lst, vg.Point{X: xLabel, Y: ly}, sideLabel(c, donor))
	}
	out := make([]vg.Length, len(idx))
	for k, i := range idx {
		out[k] = centres[i]
	}
	return out
}

// laneOf gives each couple (in value order) the first lane whose last
// error bar ends below this one's start, so overlapping bars stand apart.
func laneOf(cs []Couple, order []int) []int {
	top := make([]float64, lanes)
	for i := range top {
		top[i] = math.Inf(-1)
	}
	out := make([]int, len(order))
	for k, i := range order {
		c := cs[i]
		best := 0
		for j := range lanes {
			if top[j] < c.Value-c.Sigma {
				best = j
				break
			}
			if top[j] < top[best] {
				best = j
			}
		}
		out[k] = best
		top[best] = c.Value + c.Sigma
	}
	return out
}

// drawAxis draws the energy axis at the area's left edge, with a faint
// grid across.
func (l *ladderLayout) drawAxis(dc draw.Canvas, units string) {
	x := l.area.Min.X
	ax := draw.LineStyle{Color: color.Black, Width: 1}
	grid := draw.LineStyle{Color: colGrid, Width: 0.6}
	tst := textStyle(labelSize, false)
	tst.XAlign, tst.YAlign = draw.XRight, draw.YCenter
	want := max(int((l.area.Max.Y-l.area.Min.Y)/40), 3)
	for _, t := range niceTicks(l.vmin, l.vmax, want) {
		y := l.y(t.v)
		line(dc, grid, vg.Point{X: x, Y: y}, vg.Point{X: l.area.Max.X, Y: y})
		line(dc, ax, vg.Point{X: x - 5, Y: y}, vg.Point{X: x, Y: y})
		dc.FillText(tst, vg.Point{X: x - 7, Y: y}, t.label)
	}
	line(dc, ax, vg.Point{X: x, Y: l.area.Min.Y}, vg.Point{X: x, Y: l.area.Max.Y})
	st := textStyle(11, false)
	st.Rotation = math.Pi / 2
	st.XAlign, st.YAlign = draw.XCenter, draw.YBottom
	dc.FillText(st, vg.Point{X: x - 38, Y: (l.area.Min.Y + l.area.Max.Y) / 2}, "BDFE ("+label(units)+")")
}
