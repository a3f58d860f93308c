package figure

import (
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// shape is a marker's form: the H2 tendency is told by shape as well as by
// colour.
type shape int

const (
	shapeTriangleDown shape = iota // donor, H2 downhill
	shapeDiamond                   // donor, near the H2 line
	shapeTriangleUp                // donor, H2 uphill
	shapeCircle                    // acceptor
	shapeRing                      // acceptor below the H2 line
	shapeSquare                    // a shortlisted pair on the map
	shapeFilled                    // a filled square: a cell's colour
	shapeText                      // no marker: the legend's words carry the symbol
)

// mark draws a marker of radius r centred on pt.
func mark(c draw.Canvas, s shape, col color.Color, r vg.Length, pt vg.Point) {
	poly := func(pts ...vg.Point) {
		c.FillPolygon(col, pts)
		var p vg.Path
		p.Move(pts[0])
		for _, q := range pts[1:] {
			p.Line(q)
		}
		p.Close()
		c.SetLineStyle(draw.LineStyle{Color: color.White, Width: 0.6})
		c.Stroke(p)
	}
	x, y := pt.X, pt.Y
	k := r * 1.25
	switch s {
	case shapeTriangleDown:
		poly(vg.Point{X: x - k, Y: y + k*0.6}, vg.Point{X: x + k, Y: y + k*0.6}, vg.Point{X: x, Y: y - k})
	case shapeTriangleUp:
		poly(vg.Point{X: x - k, Y: y - k*0.6}, vg.Point{X: x + k, Y: y - k*0.6}, vg.Point{X: x, Y: y + k})
	case shapeDiamond:
		poly(vg.Point{X: x, Y: y + k}, vg.Point{X: x + k, Y: y}, vg.Point{X: x, Y: y - k}, vg.Point{X: x - k, Y: y})
	case shapeCircle:
		draw.CircleGlyph{}.DrawGlyph(&c, draw.GlyphStyle{Color: col, Radius: r}, pt)
	case shapeRing:
		draw.CircleGlyph{}.DrawGlyph(&c, draw.GlyphStyle{Color: color.White, Radius: r}, pt)
		var p vg.Path
		p.Move(vg.Point{X: x + r, Y: y})
		p.Arc(pt, r, 0, 2*math.Pi)
		p.Close()
		c.SetLineStyle(draw.LineStyle{Color: col, Width: 1.4})
		c.Stroke(p)
	case shapeSquare:
		var p vg.Path
		p.Move(vg.Point{X: x - r, Y: y - r})
		p.Line(vg.Point{X: x + r, Y: y - r})
		p.Line(vg.Point{X: x + r, Y: y + r})
		p.Line(vg.Point{X: x - r, Y: y + r})
		p.Close()
		c.SetLineStyle(draw.LineStyle{Color: col, Width: 1.6})
		c.Stroke(p)
	case shapeFilled:
		c.FillPolygon(col, []vg.Point{{X: x - r, Y: y - r}, {X: x + r, Y: y - r}, {X: x + r, Y: y + r}, {X: x - r, Y: y + r}})
	}
}

func line(c draw.Canvas, sty draw.LineStyle, pts ...vg.Point) {
	if len(pts) < 2 {
		return
	}
	c.StrokeLines(sty, pts)
}

// tick is one labelled value on an axis.
type tick struct {
	v     float64
	label string
}

// niceTicks returns values at a round step (1, 2 or 5 × 10^k) between lo
// and hi, about want of them.
func niceTicks(lo, hi float64, want int) []tick {
	if !(hi > lo) || want < 2 {
		return nil
	}
	raw := (hi - lo) / float64(want)
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := mag
	for _, m := range []float64{1, 2, 5, 10} {
		if m*mag >= raw {
			step = m * mag
			break
		}
	}
	prec := max(0, -int(math.Floor(math.Log10(step))))
	var out []tick
	for v := math.Ceil(lo/step) * step; v <= hi+step*1e-9; v += step {
		r := math.Round(v/step) * step
		if r == 0 {
			r = 0 // no "-0"
		}
		out = append(out, tick{r, strconv.FormatFloat(r, 'f', prec, 64)})
	}
	return out
}

// legendItem is a marker (or a line sample) and its words.
type legendItem struct {
	shape  shape
	col    color.Color
	dashed bool // an H2 line sample instead of a marker
	errbar bool // an error bar sample
	text   string
}

// legendHeight is the height the legend takes when drawn in width w.
func legendHeight(items []legendItem, w vg.Length) vg.Length {
	return vg.Length(len(legendRows(items, w))) * legendLine()
}

func legendLine() vg.Length {
	st := textStyle(legendSize, false)
	return st.Height("Ag") * 1.35
}

const (
	legendSize  = 10
	captionSize = 9
	titleSize   = 15
	labelSize   = 10
)

// legendRows splits the items into rows that fit in w.
func legendRows(items []legendItem, w vg.Length) [][]legendItem {
	st := textStyle(legendSize, false)
	var rows [][]legendItem
	var row []legendItem
	var used vg.Length
	for _, it := range items {
		iw := 22 + st.Width(it.text) + 16
		if len(row) > 0 && used+iw > w {
			rows, row, used = append(rows, row), nil, 0
		}
		row, used = append(row, it), used+iw
	}
	if len(row) > 0 {
		rows = append(rows, row)
	}
	return rows
}

// drawLegend draws the items in rows from the top-left corner (x, top).
func drawLegend(c draw.Canvas, items []legendItem, x, top, w vg.Length) {
	st := textStyle(legendSize, false)
	st.YAlign = draw.YCenter
	lh := legendLine()
	for i, row := range legendRows(items, w) {
		y := top - lh*(vg.Length(i)+0.5)
		cx := x
		for _, it := range row {
			switch {
			case it.dashed:
				line(c, h2Style(), vg.Point{X: cx, Y: y}, vg.Point{X: cx + 18, Y: y})
			case it.errbar:
				errBar(c, colAcceptor, cx+9, y-6, y+6)
			default:
				mark(c, it.shape, it.col, 4, vg.Point{X: cx + 9, Y: y})
			}
			tx := cx + 22
			if it.shape == shapeText && !it.dashed && !it.errbar {
				tx = cx
			}
			c.FillText(st, vg.Point{X: tx, Y: y}, it.text)
			cx = tx + st.Width(it.text) + 16
		}
	}
}

// drawLegendList draws the items one per row from the top-left corner.
func drawLegendList(c draw.Canvas, items []legendItem, x, top vg.Length) {
	for i, it := range items {
		drawLegend(c, []legendItem{it}, x, top-legendLine()*vg.Length(i), 1e9)
	}
}

func h2Style() draw.LineStyle {
	return draw.LineStyle{Color: colH2, Width: 1.6, Dashes: []vg.Length{6, 3}}
}

// errBar draws a vertical error bar with caps from y0 to y1 at x.
func errBar(c draw.Canvas, col color.Color, x, y0, y1 vg.Length) {
	sty := draw.LineStyle{Color: col, Width: 0.9}
	line(c, sty, vg.Point{X: x, Y: y0}, vg.Point{X: x, Y: y1})
	line(c, sty, vg.Point{X: x - 2.5, Y: y0}, vg.Point{X: x + 2.5, Y: y0})
	line(c, sty, vg.Point{X: x - 2.5, Y: y1}, vg.Point{X: x + 2.5, Y: y1})
}

// drawCaption draws wrapped caption lines from the top-left corner and
// returns their height.
func drawCaption(c draw.Canvas, lines []string, x, top vg.Length) {
	st := textStyle(captionSize, false)
	st.Color = color.RGBA{0x22, 0x22, 0x22, 0xFF}
	st.YAlign = draw.YTop
	lh := st.Height("Ag") * 1.3
	for i, l := range lines {
		c.FillText(st, vg.Point{X: x, Y: top - lh*vg.Length(i)}, l)
	}
}

func captionHeight(lines []string) vg.Length {
	st := textStyle(captionSize, false)
	return st.Height("Ag") * 1.3 * vg.Length(len(lines))
}

// halo draws text on a white box, so the H2 line and the grid never run
// through it.
func halo(dc draw.Canvas, st draw.TextStyle, pt vg.Point, txt string) {
	// The box of one line as the plain text handler draws it: the
	// baseline at pt.Y + height·YAlign − ascent + size.
	e := st.FontExtents()
	w := st.Width(txt)
	base := pt.Y + st.Height(txt)*vg.Length(st.YAlign) - e.Ascent + st.Font.Size
	x0 := pt.X + w*vg.Length(st.XAlign)
	r := vg.Rectangle{Min: vg.Point{X: x0, Y: base - e.Descent}, Max: vg.Point{X: x0 + w, Y: base + e.Ascent}}
	const p = 2
	dc.FillPolygon(color.White, []vg.Point{{X: r.Min.X - p, Y: r.Min.Y}, {X: r.Max.X + p, Y: r.Min.Y},
		{X: r.Max.X + p, Y: r.Max.Y}, {X: r.Min.X - p, Y: r.Max.Y}})
	dc.FillText(st, pt, txt)
}
