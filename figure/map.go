package figure

import (
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/hatsieve/hatsieve/thermo"
)

// MapInput is everything the pairing map shows: Donors are the rows (top
// to bottom), Acceptors the columns (left to right), DG[i][j] the ΔG°(HAT)
// of donor i with acceptor j in the figure's units (NaN: no pair, such as
// a couple with itself), Marked the cells of shortlisted pairs.
type MapInput struct {
	Title     string
	Donors    []Couple
	Acceptors []Couple
	DG        [][]float64
	Marked    [][2]int // {donor index, acceptor index}
	Units     string
	Caption   string
	Page      Page
}

// Map writes the pairing map in format: a grid coloured by ΔG°(HAT) on a
// diverging scale centred on 0 (ColorBrewer's purple–orange, rated safe
// for colour-blind readers; purple below 0, orange above), a colour bar,
// the value in each cell when the cell is big enough to read it, ▼ before
// a donor H2 downhill (≈ near the line) and a square on each shortlisted
// pair.
func Map(w io.Writer, format string, in MapInput) error {
	_, err := mapFig(w, format, in)
	return err
}

// mapLayout is where things went; the tests check the drawing against it.
type mapLayout struct {
	grid         vg.Rectangle
	cellW, cellH vg.Length
	limit        float64 // the colour scale runs from −limit to +limit
	values       bool    // cell values written
}

func mapFig(w io.Writer, format string, in MapInput) (mapLayout, error) {
	if len(in.DG) != len(in.Donors) {
		return mapLayout{}, fmt.Errorf("map: %d rows of ΔG° for %d donors", len(in.DG), len(in.Donors))
	}
	for i, row := range in.DG {
		if len(row) != len(in.Acceptors) {
			return mapLayout{}, fmt.Errorf("map: row %d has %d ΔG° for %d acceptors", i+1, len(row), len(in.Acceptors))
		}
	}
	var l mapLayout
	err := render(w, format, in.Page, func(dc draw.Canvas) error {
		var ok bool
		if l, ok = drawMap(dc, in); !ok {
			return tooSmall(fmt.Sprintf("a map of %d × %d couples", len(in.Donors), len(in.Acceptors)), in.Page)
		}
		return nil
	})
	return l, err
}

// diverging is ColorBrewer's 11-class PuOr (Brewer, colorbrewer2.org;
// the test checks it against gonum's table of it), purple first, so that
// negative ΔG° (downhill) is purple and positive orange. Written out rather
// than taken from gonum's palette package, which builds every palette when
// a program starts.
var diverging = []color.Color{
	color.RGBA{0x2d, 0x00, 0x4b, 0xff}, color.RGBA{0x54, 0x27, 0x88, 0xff}, color.RGBA{0x80, 0x73, 0xac, 0xff},
	color.RGBA{0xb2, 0xab, 0xd2, 0xff}, color.RGBA{0xd8, 0xda, 0xeb, 0xff}, color.RGBA{0xf7, 0xf7, 0xf7, 0xff},
	color.RGBA{0xfe, 0xe0, 0xb6, 0xff}, color.RGBA{0xfd, 0xb8, 0x63, 0xff}, color.RGBA{0xe0, 0x82, 0x14, 0xff},
	color.RGBA{0xb3, 0x58, 0x06, 0xff}, color.RGBA{0x7f, 0x3b, 0x08, 0xff},
}

// dgColour interpolates the diverging scale linearly (in sRGB, between
// neighbouring classes) at v on [−limit, limit]; 0 is the middle class.
func dgColour(v, limit float64) color.RGBA {
	t := (v/limit + 1) / 2
	t = math.Min(math.Max(t, 0), 1) * float64(len(diverging)-1)
	i := min(int(t), len(diverging)-2)
	f := t - float64(i)
	a, b := rgba(diverging[i]), rgba(diverging[i+1])
	mix := func(x, y uint8) uint8 { return uint8(math.Round(float64(x)*(1-f) + float64(y)*f)) }
	return color.RGBA{mix(a.R, b.R), mix(a.G, b.G), mix(a.B, b.B), 0xFF}
}

func rgba(c color.Color) color.RGBA {
	r, g, b, a := c.RGBA()
	return color.RGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), uint8(a >> 8)}
}

// dark reports whether white text reads better than black on c (relative
// luminance as WCAG 2 defines it, from memory, below 0.3).
func dark(c color.RGBA) bool {
	lin := func(u uint8) float64 {
		s := float64(u) / 255
		if s <= 0.04045 {
			return s / 12.92
		}
		return math.Pow((s+0.055)/1.055, 2.4)
	}
	return 0.2126*lin(c.R)+0.7152*lin(c.G)+0.0722*lin(c.B) < 0.3
}

var colNoPair = color.RGBA{0xC8, 0xC8, 0xC8, 0xFF}

func rowLabel(c Couple) string {
	s := fmt.Sprintf("%s  %.1f", label(c.Label), c.Value)
	switch c.Tendency {
	case thermo.Downhill:
		s = "▼ " + s
	case thermo.NearLine:
		s = "≈ " + s
	}
	return s
}

func colLabel(c Couple) string { return fmt.Sprintf("%s  %.1f", label(c.Label), c.Value) }

// scaleLimit is the colour scale's half-range: the largest |ΔG°| rounded
// up to a multiple of 5.
func scaleLimit(dg [][]float64) float64 {
	m := 0.0
	for _, row := range dg {
		for _, v := range row {
			if !math.IsNaN(v) {
				m = math.Max(m, math.Abs(v))
			}
		}
	}
	return math.Max(5, math.Ceil(m/5)*5)
}

func mapLegend(in MapInput) []legendItem {
	items := []legendItem{
		{shape: shapeText, text: "▼ donor, H2 downhill"},
		{shape: shapeText, text: "≈ donor near the H2 line"},
	}
	if len(in.Marked) > 0 {
		items = append(items, legendItem{shape: shapeSquare, col: color.Black, text: "shortlisted pair"})
	}
	for _, row := range in.DG {
		for _, v := range row {
			if math.IsNaN(v) {
				return append(items, legendItem{shape: shapeFilled, col: colNoPair, text: "a couple with itself (no pair)"})
			}
		}
	}
	return items
}

// labelRoom is the width of the row labels and the height of the column
// labels (at 45°) at these sizes.
func labelRoom(in MapInput, rowSize, colSize vg.Length) (rowW, colH vg.Length) {
	rst, cst := textStyle(rowSize, false), textStyle(colSize, false)
	var colW vg.Length
	for _, c := range in.Donors {
		rowW = max(rowW, rst.Width(rowLabel(c)))
	}
	for _, c := range in.Acceptors {
		colW = max(colW, cst.Width(colLabel(c)))
	}
	return rowW, colW*math.Sqrt2/2 + cst.Height("Ag")
}

// mapPlan is one way to lay a map out.
type mapPlan struct {
	l       mapLayout
	side    bool // legend and caption right of the colour bar
	textW   vg.Length
	caption []string
	footer  vg.Length
}

const barW = 84 // colour bar, its ticks and its title

// planMap lays the grid out with the legend and the caption beside it
// (side) or below it; ok is false when cells would be under 4 pt or the
// caption taller than the page.
func planMap(in MapInput, inner vg.Rectangle, side bool, rowW, colH, titleH vg.Length) (mapPlan, bool) {
	iw, ih := inner.Max.X-inner.Min.X, inner.Max.Y-inner.Min.Y
	p := mapPlan{side: side, textW: iw}
	if side {
		p.textW = max(iw*0.28, 170)
	}
	p.caption = wrap(textStyle(captionSize, false), in.Caption, p.textW)
	if !side {
		p.footer = legendHeight(mapLegend(in), p.textW) + 6 + captionHeight(p.caption) + 10
	}
	p.l.grid = vg.Rectangle{
		Min: vg.Point{X: inner.Min.X + rowW + 6, Y: inner.Min.Y + p.footer + colH + 6},
		Max: vg.Point{X: inner.Max.X - barW, Y: inner.Max.Y - titleH - 4},
	}
	if side {
		p.l.grid.Max.X -= p.textW + 10
	}
	p.l.sizeCells(len(in.Donors), len(in.Acceptors))
	textH := captionHeight(p.caption)
	if side {
		// Beside the grid, under the legend, above the page's foot.
		textH += legendLine()*vg.Length(len(mapLegend(in))) + 8
	}
	ok := p.l.cellH >= 4 && p.l.cellW >= 4 && textH <= ih-titleH-4
	return p, ok
}

// mapDraft is a map laid out on a page: the plan and the label sizes.
type mapDraft struct {
	p                mapPlan
	inner            vg.Rectangle
	rowSize, colSize vg.Length
}

// layoutMap lays the map out in the page rectangle full. The legend and
// the caption stand right of the colour bar or below the grid, whichever
// gives the larger cells (beside, on a slide). ok is false when the page
// cannot hold it.
func layoutMap(in MapInput, full vg.Rectangle) (mapDraft, bool) {
	inner := vg.Rectangle{Min: vg.Point{X: full.Min.X + margin, Y: full.Min.Y + margin},
		Max: vg.Point{X: full.Max.X - margin, Y: full.Max.Y - margin}}
	titleH := textStyle(titleSize, true).Height("Ag") * 1.4

	// Label sizes shrink with the grid so a big map stays legible.
	n := max(len(in.Donors), len(in.Acceptors))
	size := vg.Length(labelSize)
	if n > 24 {
		size = vg.Length(max(6, 10*24/float64(n)))
	}
	// Row labels no taller than a row, column labels (at 45°) no closer
	// than their line height: measure, plan, shrink to the cells, plan again.
	d := mapDraft{inner: inner, rowSize: size, colSize: size}
	for range 2 {
		rowW, colH := labelRoom(in, d.rowSize, d.colSize)
		p, ok := planMap(in, inner, true, rowW, colH, titleH)
		if q, qok := planMap(in, inner, false, rowW, colH, titleH); qok && (!ok || q.l.cellH > p.l.cellH) {
			p, ok = q, qok
		}
		d.p = p
		if !ok {
			return d, false
		}
		d.rowSize = max(min(d.rowSize, p.l.cellH*0.85), 5)
		d.colSize = max(min(d.colSize, p.l.cellW*0.6), 5)
	}
	return d, true
}

// valueSize is the size of the values written in cells w × h.
func valueSize(w, h vg.Length) vg.Length { return min(9, h*0.6, w/1.9) }

// MapReadable reports whether the map fits its page readably: every cell
// holds its value (at 6 pt or more) and no id is under 7 pt.
func MapReadable(in MapInput) bool {
	pg := in.Page.withDefaults()
	d, ok := layoutMap(in, vg.Rectangle{Max: vg.Point{X: pg.Width, Y: pg.Height}})
	return ok && valueSize(d.p.l.cellW, d.p.l.cellH) >= 6 && d.rowSize >= 7 && d.colSize >= 7
}

// drawMap lays the map out on dc and draws it.
func drawMap(dc draw.Canvas, in MapInput) (mapLayout, bool) {
	d, ok := layoutMap(in, dc.Rectangle)
	if !ok {
		return d.p.l, false
	}
	p, inner, l := d.p, d.inner, d.p.l
	tst := textStyle(titleSize, true)
	tst.YAlign = draw.YTop
	dc.FillText(tst, vg.Point{X: inner.Min.X, Y: inner.Max.Y}, title(in.Title))
	l.limit = scaleLimit(in.DG)
	l.drawCells(dc, in)

	lst := textStyle(d.rowSize, false)
	lst.XAlign, lst.YAlign = draw.XRight, draw.YCenter
	for i, c := range in.Donors {
		dc.FillText(lst, vg.Point{X: l.grid.Min.X - 4, Y: l.grid.Max.Y - l.cellH*(vg.Length(i)+0.5)}, rowLabel(c))
	}
	cst := textStyle(d.colSize, false)
	cst.XAlign, cst.YAlign = draw.XRight, draw.YCenter
	cst.Rotation = math.Pi / 4
	for j, c := range in.Acceptors {
		dc.FillText(cst, vg.Point{X: l.grid.Min.X + l.cellW*(vg.Length(j)+0.5), Y: l.grid.Min.Y - 4}, colLabel(c))
	}
	l.drawBar(dc, in.Units, vg.Point{X: l.grid.Max.X + 14, Y: l.grid.Min.Y})
	legend := mapLegend(in)
	if p.side {
		x := l.grid.Max.X + barW + 10
		drawLegendList(dc, legend, x, l.grid.Max.Y)
		drawCaption(dc, p.caption, x, l.grid.Max.Y-legendLine()*vg.Length(len(legend))-8)
	} else {
		drawLegend(dc, legend, inner.Min.X, inner.Min.Y+p.footer-10, inner.Max.X-inner.Min.X)
		drawCaption(dc, p.caption, inner.Min.X, inner.Min.Y+captionHeight(p.caption))
	}
	return l, true
}

// sizeCells divides the grid into cells no wider than twice their height
// and shrinks the grid to them.
func (l *mapLayout) sizeCells(rows, cols int) {
	gw, gh := l.grid.Max.X-l.grid.Min.X, l.grid.Max.Y-l.grid.Min.Y
	l.cellW = gw / vg.Length(max(cols, 1))
	l.cellH = gh / vg.Length(max(rows, 1))
	if l.cellW > 2*l.cellH {
		l.cellW = 2 * l.cellH
	}
	l.grid.Max.X = l.grid.Min.X + l.cellW*vg.Length(cols)
}

func (l *mapLayout) cell(i, j int) vg.Rectangle {
	x := l.grid.Min.X + l.cellW*vg.Length(j)
	y := l.grid.Max.Y - l.cellH*vg.Length(i+1)
	return vg.Rectangle{Min: vg.Point{X: x, Y: y}, Max: vg.Point{X: x + l.cellW, Y: y + l.cellH}}
}

func (l *mapLayout) drawCells(dc draw.Canvas, in MapInput) {
	vsize := valueSize(l.cellW, l.cellH)
	l.values = vsize >= 6
	vst := textStyle(vsize, false)
	vst.XAlign, vst.YAlign = draw.XCenter, draw.YCenter
	for i, row := range in.DG {
		for j, v := range row {
			r := l.cell(i, j)
			pts := []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}}
			if math.IsNaN(v) {
				dc.FillPolygon(colNoPair, pts)
				continue
			}
			c := dgColour(v, l.limit)
			dc.FillPolygon(c, pts)
			if l.values {
				vst.Color = color.Black
				if dark(c) {
					vst.Color = color.White
				}
				dc.FillText(vst, vg.Point{X: (r.Min.X + r.Max.X) / 2, Y: (r.Min.Y + r.Max.Y) / 2}, cellValue(v))
			}
		}
	}
	// Thin white rules between cells, then the shortlist's squares.
	rule := draw.LineStyle{Color: color.White, Width: 0.5}
	for j := 1; j < len(in.Acceptors); j++ {
		x := l.grid.Min.X + l.cellW*vg.Length(j)
		line(dc, rule, vg.Point{X: x, Y: l.grid.Min.Y}, vg.Point{X: x, Y: l.grid.Max.Y})
	}
	for i := 1; i < len(in.Donors); i++ {
		y := l.grid.Max.Y - l.cellH*vg.Length(i)
		line(dc, rule, vg.Point{X: l.grid.Min.X, Y: y}, vg.Point{X: l.grid.Max.X, Y: y})
	}
	for _, m := range in.Marked {
		if m[0] < 0 || m[0] >= len(in.Donors) || m[1] < 0 || m[1] >= len(in.Acceptors) {
			continue
		}
		// A frame just inside the cell, clear of the value.
		r := l.cell(m[0], m[1])
		const in = 1.2
		frame := draw.LineStyle{Color: color.Black, Width: 1.8}
		line(dc, frame, vg.Point{X: r.Min.X + in, Y: r.Min.Y + in}, vg.Point{X: r.Max.X - in, Y: r.Min.Y + in},
			vg.Point{X: r.Max.X - in, Y: r.Max.Y - in}, vg.Point{X: r.Min.X + in, Y: r.Max.Y - in}, vg.Point{X: r.Min.X + in, Y: r.Min.Y + in})
	}
}

// drawBar draws the colour bar from bottom-left corner at, as tall as the
// grid.
func (l *mapLayout) drawBar(dc draw.Canvas, units string, at vg.Point) {
	const w = 12
	h := l.grid.Max.Y - l.grid.Min.Y
	const steps = 120
	for k := range steps {
		y0 := at.Y + h*vg.Length(k)/steps
		y1 := at.Y + h*vg.Length(k+1)/steps
		v := -l.limit + 2*l.limit*(float64(k)+0.5)/steps
		dc.FillPolygon(dgColour(v, l.limit), []vg.Point{{X: at.X, Y: y0}, {X: at.X + w, Y: y0}, {X: at.X + w, Y: y1}, {X: at.X, Y: y1}})
	}
	tst := textStyle(9, false)
	tst.XAlign, tst.YAlign = draw.XLeft, draw.YCenter
	ax := draw.LineStyle{Color: color.Black, Width: 0.8}
	for _, t := range niceTicks(-l.limit, l.limit, 6) {
		y := at.Y + h*vg.Length((t.v+l.limit)/(2*l.limit))
		line(dc, ax, vg.Point{X: at.X + w, Y: y}, vg.Point{X: at.X + w + 3, Y: y})
		s := t.label
		if t.v > 0 {
			s = "+" + s
		} else if t.v < 0 {
			s = "−" + s[1:]
		}
		dc.FillText(tst, vg.Point{X: at.X + w + 5, Y: y}, s)
	}
	st := textStyle(10, false)
	st.Rotation = math.Pi / 2
	st.XAlign, st.YAlign = draw.XCenter, draw.YTop
	dc.FillText(st, vg.Point{X: at.X + w + 30, Y: at.Y + h/2}, "ΔG°(HAT) ("+label(units)+")")
}

// cellValue is a cell's ΔG° to the nearest unit, with a true minus sign
// and no "−0".
func cellValue(v float64) string {
	r := math.Round(v)
	switch {
	case r < 0:
		return fmt.Sprintf("−%.0f", -r)
	case r > 0:
		return fmt.Sprintf("%.0f", r)
	}
	return "0"
}
