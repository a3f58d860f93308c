package figure

import (
	"bytes"
	"encoding/xml"
	"errors"
	"flag"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"github.com/hatsieve/hatsieve/thermo"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

// svgDoc is what a test reads back from an SVG: every text with its
// position, and every path's points.
type svgDoc struct {
	texts []svgText
	paths []svgPath
}

type svgText struct {
	x, y float64 // as drawn: y up, like the canvas
	s    string
}

type svgPath struct {
	pts    [][2]float64
	dashed bool
}

// parseSVG decodes an SVG with encoding/xml, failing the test on any
// error: a stray "<" or "&" or a control character would be one.
func parseSVG(t *testing.T, b []byte) svgDoc {
	t.Helper()
	var doc svgDoc
	dec := xml.NewDecoder(bytes.NewReader(b))
	var cur *svgText
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the SVG is not well-formed XML: %v", err)
		}
		switch el := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range el.Attr {
				attr[a.Name.Local] = a.Value
			}
			switch el.Name.Local {
			case "text":
				x, _ := strconv.ParseFloat(attr["x"], 64)
				y, _ := strconv.ParseFloat(attr["y"], 64)
				cur = &svgText{x: x, y: -y} // the writer flips each text back
			case "path":
				doc.paths = append(doc.paths, svgPath{pts: pathPoints(t, attr["d"]), dashed: strings.Contains(attr["style"], "dasharray")})
			}
		case xml.CharData:
			if cur != nil {
				cur.s += string(el)
			}
		case xml.EndElement:
			if el.Name.Local == "text" && cur != nil {
				doc.texts = append(doc.texts, *cur)
				cur = nil
			}
		}
	}
	return doc
}

// pathPoints reads the M and L points of a path (arcs are skipped).
func pathPoints(t *testing.T, d string) [][2]float64 {
	var out [][2]float64
	for _, seg := range strings.FieldsFunc(d, func(r rune) bool { return r == 'M' || r == 'L' || r == 'Z' }) {
		xy := strings.Split(seg, ",")
		if len(xy) != 2 {
			continue
		}
		x, err1 := strconv.ParseFloat(xy[0], 64)
		y, err2 := strconv.ParseFloat(xy[1], 64)
		if err1 != nil || err2 != nil {
			continue
		}
		out = append(out, [2]float64{x, y})
	}
	return out
}

func (d svgDoc) has(s string) bool {
	for _, t := range d.texts {
		if t.s == s {
			return true
		}
	}
	return false
}

func smallLadder() LadderInput {
	return LadderInput{
		Title: "test ladder",
		Donors: []Couple{
			{Label: "d-low", Value: 40, Sigma: 1, Tendency: thermo.Downhill},
			{Label: "d-near", Value: 52.5, Sigma: 2, Tendency: thermo.NearLine},
			{Label: "d-high", Value: 70, Sigma: 1.3, Tendency: thermo.Uphill},
		},
		Acceptors: []Couple{
			{Label: "a-low", Value: 50, Sigma: 1, BelowH2: true},
			{Label: "a-high", Value: 80, Sigma: 1.5},
		},
		H2Line:  52,
		Units:   "kcal/mol",
		Caption: "Solvent test; 298.15 K; energies in kcal/mol.",
	}
}

// The H2 line lies where the drawn axis puts G_H: the axis transform is
// read from the SVG itself (each tick mark's height against its number),
// not from the layout code.
func TestLadderSVGLabelsAndH2Line(t *testing.T) {
	in := smallLadder()
	var buf bytes.Buffer
	l, err := ladder(&buf, "svg", in)
	if err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, buf.Bytes())
	for _, c := range in.Donors {
		if !doc.has(sideLabel(c, true)) {
			t.Errorf("donor label %q missing", sideLabel(c, true))
		}
	}
	for _, c := range in.Acceptors {
		if !doc.has(sideLabel(c, false)) {
			t.Errorf("acceptor label %q missing", sideLabel(c, false))
		}
	}
	if !doc.has("a-low") && !strings.Contains(buf.String(), "below H2 line") {
		t.Error("the acceptor below the H2 line is not said to be")
	}
	ax := axisFromSVG(t, doc, float64(l.area.Min.X))
	want := ax(in.H2Line)
	found := false
	for _, p := range doc.paths {
		if p.dashed && len(p.pts) == 2 && math.Abs(p.pts[0][1]-want) < 0.02 && math.Abs(p.pts[1][1]-want) < 0.02 &&
			p.pts[1][0]-p.pts[0][0] > 0.9*float64(l.area.Max.X-l.area.Min.X) {
			found = true
		}
	}
	if !found {
		t.Errorf("no dashed line across the plot at y = %.3f pt (G_H = %g on the drawn axis)", want, in.H2Line)
	}
	for _, w := range []string{"Solvent test; 298.15 K; energies in kcal/mol.", "donor, H2 downhill", "donor, near H2 line", "donor, H2 uphill", "H2 line 52.0"} {
		if !doc.has(w) {
			t.Errorf("text %q missing", w)
		}
	}
}

// axisFromSVG fits y = a + b·v through the axis's tick marks (5 pt
// horizontal strokes ending at x) and the numbers written beside them.
func axisFromSVG(t *testing.T, doc svgDoc, x float64) func(float64) float64 {
	t.Helper()
	var ys []float64
	for _, p := range doc.paths {
		if len(p.pts) == 2 && math.Abs(p.pts[1][0]-x) < 0.01 && math.Abs(p.pts[0][0]-(x-5)) < 0.01 && p.pts[0][1] == p.pts[1][1] {
			ys = append(ys, p.pts[0][1])
		}
	}
	var vs []float64
	for _, tx := range doc.texts {
		if v, err := strconv.ParseFloat(tx.s, 64); err == nil && tx.x < x {
			vs = append(vs, v)
		}
	}
	sort.Float64s(ys)
	sort.Float64s(vs)
	if len(ys) < 2 || len(ys) != len(vs) {
		t.Fatalf("axis: %d tick marks, %d tick numbers", len(ys), len(vs))
	}
	n := len(ys) - 1
	b := (ys[n] - ys[0]) / (vs[n] - vs[0])
	for i := range ys {
		if got := ys[0] + b*(vs[i]-vs[0]); math.Abs(got-ys[i]) > 0.02 {
			t.Fatalf("axis ticks not evenly spaced: tick %g at %g, want %g", vs[i], ys[i], got)
		}
	}
	return func(v float64) float64 { return ys[0] + b*(v-vs[0]) }
}

// Hostile names are escaped: no markup gets through, the XML stays well
// formed, control characters become visible escapes.
func TestSVGEscapesHostileNames(t *testing.T) {
	in := smallLadder()
	in.Donors[0].Label = "<script>alert(1)</script>"
	in.Acceptors[0].Label = "a&b \x01\x1b[31m\u202e"
	in.Title = "T <b>&amp;"
	var buf bytes.Buffer
	if err := Ladder(&buf, "svg", in); err != nil {
		t.Fatal(err)
	}
	raw := buf.String()
	if strings.Contains(raw, "<script") || strings.Contains(raw, "<b>") || strings.ContainsAny(raw, "\x01\x1b\u202e") {
		t.Fatalf("hostile text reached the SVG unescaped")
	}
	doc := parseSVG(t, buf.Bytes())
	if !doc.has(sideLabel(in.Donors[0], true)) || !strings.Contains(sideLabel(in.Donors[0], true), "<script>") {
		t.Errorf("the donor's name should read back as written, escaped only in the file")
	}
	found := false
	for _, tx := range doc.texts {
		if strings.Contains(tx.s, "a&b") {
			found = true
		}
	}
	if !found {
		t.Error("a name with & is not drawn")
	}

	mi := MapInput{Title: "<x>", Donors: in.Donors[:1], Acceptors: in.Acceptors[:1], DG: [][]float64{{-3}}, Units: "kcal/mol"}
	buf.Reset()
	if err := Map(&buf, "svg", mi); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(buf.String(), "<script") || strings.Contains(buf.String(), "<x>") {
		t.Fatal("hostile text reached the map's SVG unescaped")
	}
	parseSVG(t, buf.Bytes())
}

// The PNG decodes and has the pixel size asked for.
func TestPNGSize(t *testing.T) {
	pg := Page{Width: 16 * vg.Centimeter, Height: 9 * vg.Centimeter, DPI: 100}
	wantW, wantH := int(math.Round(16/2.54*100)), int(math.Round(9/2.54*100))
	for name, draw := range map[string]func(io.Writer) error{
		"ladder": func(w io.Writer) error { in := smallLadder(); in.Page = pg; return Ladder(w, "png", in) },
		"map": func(w io.Writer) error {
			in := smallMap()
			in.Page = pg
			return Map(w, "png", in)
		},
	} {
		var buf bytes.Buffer
		if err := draw(&buf); err != nil {
			t.Fatal(name, err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if b := img.Bounds(); b.Dx() != wantW || b.Dy() != wantH {
			t.Errorf("%s: %dx%d pixels, want %dx%d", name, b.Dx(), b.Dy(), wantW, wantH)
		}
		if w, h := pg.PixelSize(); w != wantW || h != wantH {
			t.Errorf("PixelSize %dx%d, want %dx%d", w, h, wantW, wantH)
		}
	}
}

func TestFormatOf(t *testing.T) {
	for in, want := range map[string]string{"a.svg": "svg", "x/B.PNG": "png", "c.pdf": "", "d.jpg": "", "e": ""} {
		got, err := FormatOf(in)
		if got != want || (want == "") != (err != nil) {
			t.Errorf("FormatOf(%q) = %q, %v; want %q", in, got, err, want)
		}
	}
	if err := Ladder(io.Discard, "gif", smallLadder()); err == nil {
		t.Error("an unknown format was accepted")
	}
	if err := Ladder(io.Discard, "svg", LadderInput{Page: Page{Width: vg.Centimeter}}); err == nil {
		t.Error("a 1 cm page was accepted")
	}
	// A page too small for the caption writes nothing and says so.
	small := Page{Width: 12 * vg.Centimeter, Height: 5 * vg.Centimeter}
	var buf bytes.Buffer
	in := smallLadder()
	in.Caption = strings.Repeat("a long caption ", 40)
	in.Page = small
	if err := Ladder(&buf, "png", in); !errors.Is(err, ErrTooSmall) || buf.Len() != 0 {
		t.Errorf("tiny ladder: %v, %d bytes written", err, buf.Len())
	}
	m := smallMap()
	m.Page = Page{Width: 5 * vg.Centimeter, Height: 5 * vg.Centimeter}
	m.Caption = in.Caption
	if err := Map(&buf, "svg", m); !errors.Is(err, ErrTooSmall) || buf.Len() != 0 {
		t.Errorf("tiny map: %v, %d bytes written", err, buf.Len())
	}
}

// A golden SVG of one small ladder: any change to the drawing shows in
// review. go test ./figure -run Golden -update rewrites it.
func TestLadderGolden(t *testing.T) {
	in := smallLadder()
	in.Page = Page{Width: 16 * vg.Centimeter, Height: 10 * vg.Centimeter}
	var buf bytes.Buffer
	if err := Ladder(&buf, "svg", in); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join("testdata", "ladder-small.svg")
	if *update {
		if err := os.MkdirAll("testdata", 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./figure -run Golden -update)", err)
	}
	if !bytes.Equal(buf.Bytes(), want) {
		got := strings.Split(buf.String(), "\n")
		exp := strings.Split(string(want), "\n")
		for i := range min(len(got), len(exp)) {
			if got[i] != exp[i] {
				t.Fatalf("differs from %s at line %d:\n got %s\nwant %s\n(go test ./figure -run Golden -update if the change is meant)", path, i+1, got[i], exp[i])
			}
		}
		t.Fatalf("differs from %s in length: %d lines, want %d", path, len(got), len(exp))
	}
}
