package figure

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"strings"
	"testing"

	"gonum.org/v1/plot/palette/brewer"
	"gonum.org/v1/plot/vg"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

func TestSpreadKnownCases(t *testing.T) {
	// Labels already apart stay where they are.
	got := spread([]float64{1, 5, 9}, 2, 0, 10)
	for i, w := range []float64{1, 5, 9} {
		if got[i] != w {
			t.Errorf("apart: label %d moved to %g, want %g", i, got[i], w)
		}
	}
	// Two labels at one value part symmetrically: the least-squares
	// placement of p2 − p1 ≥ 2 about 5 is 4 and 6 (derived).
	got = spread([]float64{5, 5}, 2, 0, 10)
	if got[0] != 4 || got[1] != 6 {
		t.Errorf("pair at 5: %v, want [4 6]", got)
	}
	// Against the top bound, a cluster is pushed down, not out.
	got = spread([]float64{9.5, 10, 10}, 1, 0, 10)
	if got[2] != 10 || got[1] != 9 || got[0] != 8 {
		t.Errorf("at the top: %v, want [8 9 10]", got)
	}
}

// For random values the labels keep their order, keep the gap, stay in
// bounds, and move no more than needed: no label moves further than the
// whole cluster is wide.
func TestSpreadProperties(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for trial := range 300 {
		n := 1 + r.IntN(30)
		gap := 0.5 + r.Float64()
		hi := float64(n) * gap * (1 + 2*r.Float64())
		v := make([]float64, n)
		for i := range v {
			v[i] = r.Float64() * hi
		}
		sort.Float64s(v)
		p := spread(v, gap, 0, hi)
		for i := range p {
			if p[i] < -1e-9 || p[i] > hi+1e-9 {
				t.Fatalf("trial %d: label %d at %g outside [0, %g]", trial, i, p[i], hi)
			}
			if i > 0 && p[i]-p[i-1] < gap-1e-9 {
				t.Fatalf("trial %d: labels %d and %d %g apart, want ≥ %g", trial, i-1, i, p[i]-p[i-1], gap)
			}
			if math.Abs(p[i]-v[i]) > float64(n)*gap+1e-9 {
				t.Fatalf("trial %d: label %d moved %g", trial, i, p[i]-v[i])
			}
		}
	}
}

// A crowded side keeps every label it draws at least a line apart, leaves
// out those furthest from the H2 line, and says so in the caption.
func TestLadderCrowdedSaysWhatIsLeftOut(t *testing.T) {
	in := smallLadder()
	in.Donors = nil
	for i := range 80 {
		in.Donors = append(in.Donors, Couple{Label: fmt.Sprintf("d%02d", i), Value: 45 + float64(i)*0.2, Sigma: 0.5})
	}
	in.Page = Page{Width: 20 * vg.Centimeter, Height: 10 * vg.Centimeter}
	var buf bytes.Buffer
	l, err := ladder(&buf, "svg", in)
	if err != nil {
		t.Fatal(err)
	}
	if l.hiddenD == 0 || len(l.shownD)+l.hiddenD != 80 {
		t.Fatalf("shown %d, hidden %d of 80", len(l.shownD), l.hiddenD)
	}
	ys := append([]vg.Length(nil), l.labelsD...)
	sort.Slice(ys, func(i, j int) bool { return ys[i] < ys[j] })
	for i := 1; i < len(ys); i++ {
		if ys[i]-ys[i-1] < l.gap-0.01 {
			t.Fatalf("labels %g and %g overlap (gap %g)", ys[i-1], ys[i], l.gap)
		}
	}
	// Those kept are nearest the H2 line (52): every dropped one is further.
	kept := map[int]bool{}
	worst := 0.0
	for _, i := range l.shownD {
		kept[i] = true
		worst = math.Max(worst, math.Abs(in.Donors[i].Value-in.H2Line))
	}
	for i, c := range in.Donors {
		if !kept[i] && math.Abs(c.Value-in.H2Line) < worst {
			t.Fatalf("%s (%.1f from the line) left out while one %.1f away is drawn", c.Label, math.Abs(c.Value-in.H2Line), worst)
		}
	}
	note := fmt.Sprintf("%d of 80 donors", l.hiddenD)
	if !strings.Contains(strings.Join(l.caption, " "), note) {
		t.Errorf("caption does not say %q: %q", note, l.caption)
	}
	doc := parseSVG(t, buf.Bytes())
	for _, i := range l.shownD {
		if !doc.has(sideLabel(in.Donors[i], true)) {
			t.Errorf("label of %s missing", in.Donors[i].Label)
		}
	}
}

// The colour scale is ColorBrewer's PuOr, which ColorBrewer rates safe
// for colour-blind readers, centred on 0.
// Source: ColorBrewer's own ratings as shipped in gonum's palette/brewer
// (Harrower & Brewer, The Cartographic Journal 2003, 40, 27: from memory).
func TestDivergingScale(t *testing.T) {
	if brewer.PuOr[11].ColorBlind != brewer.Good {
		t.Fatal("PuOr 11 is not rated colour-blind safe")
	}
	if got := dgColour(0, 30); got != rgba(brewer.PuOr[11].Color[5]) {
		t.Errorf("ΔG° = 0 is %v, want the middle class %v", got, brewer.PuOr[11].Color[5])
	}
	if got := dgColour(-30, 30); got != rgba(brewer.PuOr[11].Color[10]) {
		t.Errorf("−limit is %v, want the purple end", got)
	}
	if got := dgColour(99, 30); got != rgba(brewer.PuOr[11].Color[0]) {
		t.Errorf("beyond +limit is %v, want the orange end", got)
	}
	// Lightness rises from either end towards 0 (a diverging scale).
	lum := func(c color.RGBA) float64 { return 0.2126*float64(c.R) + 0.7152*float64(c.G) + 0.0722*float64(c.B) }
	for v := 1.0; v <= 30; v++ {
		if lum(dgColour(v, 30)) > lum(dgColour(v-1, 30))+0.5 || lum(dgColour(-v, 30)) > lum(dgColour(1-v, 30))+0.5 {
			t.Fatalf("lightness does not fall away from 0 at |ΔG°| = %g", v)
		}
	}
}

func smallMap() MapInput {
	return MapInput{
		Title:     "test map",
		Donors:    []Couple{{Label: "d1", Value: 40, Tendency: thermo.Downhill}, {Label: "d2", Value: 60, Tendency: thermo.NearLine}},
		Acceptors: []Couple{{Label: "a1", Value: 70}, {Label: "a2", Value: 50}},
		DG:        [][]float64{{-30, -10}, {-10, math.NaN()}},
		Marked:    [][2]int{{0, 1}},
		Units:     "kcal/mol",
		Caption:   "map caption",
	}
}

func TestMapSVG(t *testing.T) {
	in := smallMap()
	var buf bytes.Buffer
	l, err := mapFig(&buf, "svg", in)
	if err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, buf.Bytes())
	for _, w := range []string{"▼ d1  40.0", "≈ d2  60.0", "a1  70.0", "a2  50.0", "map caption", "shortlisted pair", "−30", "−10"} {
		if !doc.has(w) {
			t.Errorf("text %q missing", w)
		}
	}
	if l.limit != 30 {
		t.Errorf("scale ±%g, want ±30 (the largest |ΔG°|, rounded up to 5)", l.limit)
	}
	// The shortlisted cell (row 0, column 1), and no other, is framed: a
	// closed line just inside it.
	framed := func(i, j int) bool {
		r := l.cell(i, j)
		for _, p := range doc.paths {
			if len(p.pts) == 5 && math.Abs(p.pts[0][0]-float64(r.Min.X)-1.2) < 0.02 &&
				math.Abs(p.pts[0][1]-float64(r.Min.Y)-1.2) < 0.02 && math.Abs(p.pts[2][0]-float64(r.Max.X)+1.2) < 0.02 {
				return true
			}
		}
		return false
	}
	for i := range 2 {
		for j := range 2 {
			if framed(i, j) != (i == 0 && j == 1) {
				t.Errorf("cell %d,%d framed: %v", i, j, framed(i, j))
			}
		}
	}
	if _, err := mapFig(&buf, "svg", MapInput{Donors: in.Donors, DG: [][]float64{{1}}}); err == nil {
		t.Error("a ragged ΔG° table was accepted")
	}
}

func embedded(t *testing.T) *data.Evaluated {
	t.Helper()
	lib, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	ev, err := data.Evaluate(lib, data.Options{Cond: thermo.Conditions{Basis: thermo.Basis2022, Temperature: thermo.DefaultTemperature}})
	if err != nil {
		t.Fatal(err)
	}
	return ev
}

// ΔG°(HAT) = BDFE(D–H) − BDFE(A–H) in each cell, rows by ascending
// donor BDFE, columns by descending acceptor BDFE.
// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961 (ΔG° of an
// H-atom transfer from the two BDFEs).
func TestMapOfEmbedded(t *testing.T) {
	ev := embedded(t)
	marks := map[Mark]bool{{ev.Donors[0].Couple.ID, ev.Acceptors[0].Couple.ID}: true}
	in := MapOf(ev, ev.Donors, ev.Acceptors, marks, thermo.Kcal)
	if len(in.Donors) != len(ev.Donors) || len(in.Acceptors) != len(ev.Acceptors) {
		t.Fatal("couples lost")
	}
	for i := 1; i < len(in.Donors); i++ {
		if in.Donors[i].Value < in.Donors[i-1].Value {
			t.Fatal("rows not in ascending BDFE")
		}
	}
	for j := 1; j < len(in.Acceptors); j++ {
		if in.Acceptors[j].Value > in.Acceptors[j-1].Value {
			t.Fatal("columns not in descending BDFE")
		}
	}
	for i, d := range in.Donors {
		for j, a := range in.Acceptors {
			v := in.DG[i][j]
			if math.IsNaN(v) {
				if d.Label != a.Label {
					t.Errorf("%s × %s has no ΔG°", d.Label, a.Label)
				}
				continue
			}
			if math.Abs(v-(d.Value-a.Value)) > 1e-9 {
				t.Errorf("%s × %s: ΔG° %g, want %g", d.Label, a.Label, v, d.Value-a.Value)
			}
		}
	}
	if (len(in.Marked) == 1) != (ev.Donors[0].Couple != ev.Acceptors[0].Couple) {
		t.Errorf("marked cells %v", in.Marked)
	}
	var buf bytes.Buffer
	if err := Map(&buf, "svg", in); err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, buf.Bytes())
	for _, d := range in.Donors {
		if !doc.has(rowLabel(d)) {
			t.Errorf("row %q missing", rowLabel(d))
		}
	}
}

// --max keeps, per side, the couples nearest the H2 line, and the caption
// says how many of how many.
func TestLadderFromMax(t *testing.T) {
	ev := embedded(t)
	in := LadderFrom(ev, thermo.Kcal, 5)
	if len(in.Donors) != min(5, len(ev.Donors)) || len(in.Acceptors) != min(5, len(ev.Acceptors)) {
		t.Fatalf("%d donors, %d acceptors", len(in.Donors), len(in.Acceptors))
	}
	kept := map[string]bool{}
	worst := 0.0
	for _, c := range in.Donors {
		kept[c.Label] = true
		worst = math.Max(worst, math.Abs(c.Value-in.H2Line))
	}
	for _, r := range ev.Donors {
		if !kept[r.Couple.ID] && math.Abs(r.Margin.Kcal) < worst-1e-9 {
			t.Errorf("%s is nearer the H2 line than a kept donor", r.Couple.ID)
		}
	}
	if !strings.Contains(in.Caption, fmt.Sprintf("the 5 of %d donors", len(ev.Donors))) {
		t.Errorf("caption: %s", in.Caption)
	}
	kj := LadderFrom(ev, thermo.KJ, 0)
	// 1 kcal = 4.184 kJ (thermochemical calorie). Source: CODATA / NIST SP 811.
	if math.Abs(kj.H2Line-4.184*ev.H2Line.V) > 1e-9 || !strings.Contains(kj.Caption, "kJ/mol") {
		t.Errorf("kJ ladder: H2 line %g, caption %s", kj.H2Line, kj.Caption)
	}
}

// The map's couples: spread evenly over the BDFE range by default, or
// those of the best pairs; rank's filters apply either way.
func TestMapCouples(t *testing.T) {
	ev := embedded(t)
	d, a := MapCouples(ev, MapSelect{N: 5})
	if len(d) != 5 || len(a) != 5 {
		t.Fatalf("%d donors, %d acceptors", len(d), len(a))
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, r := range ev.Donors {
		lo, hi = math.Min(lo, r.BDFE.Kcal), math.Max(hi, r.BDFE.Kcal)
	}
	if d[0].BDFE.Kcal != lo || d[4].BDFE.Kcal != hi {
		t.Errorf("spread donors run %g to %g, want the library's %g to %g", d[0].BDFE.Kcal, d[4].BDFE.Kcal, lo, hi)
	}
	d, _ = MapCouples(ev, MapSelect{Rank: thermo.RankOptions{Tendencies: []thermo.Tendency{thermo.Uphill}}})
	for _, r := range d {
		if r.Tendency != thermo.Uphill {
			t.Errorf("--h2 uphill kept %s (%v)", r.Couple.ID, r.Tendency)
		}
	}
	// A ΔG° window keeps only couples with a partner inside it.
	lo5, hi5 := -2.0, 2.0
	d, a = MapCouples(ev, MapSelect{Rank: thermo.RankOptions{DGMin: &lo5, DGMax: &hi5}})
	for _, r := range d {
		ok := false
		for _, x := range ev.Acceptors {
			if g := r.BDFE.Kcal - x.BDFE.Kcal; g >= lo5 && g <= hi5 {
				ok = true
			}
		}
		if !ok {
			t.Errorf("donor %s has no acceptor within ±2", r.Couple.ID)
		}
	}
	if len(d) == 0 || len(a) == 0 || len(d) == len(ev.Donors) {
		t.Errorf("window kept %d of %d donors, %d acceptors", len(d), len(ev.Donors), len(a))
	}
	// Ranked: the first pair's couples come first.
	best := ev.Rank(thermo.RankOptions{Top: 1})
	d, a = MapCouples(ev, MapSelect{N: 3, Ranked: true})
	if len(d) != 3 || len(a) != 3 || d[0] != best[0].Donor || a[0] != best[0].Acceptor {
		t.Errorf("ranked: %d donors, %d acceptors, first %s × %s", len(d), len(a), d[0].Couple.ID, a[0].Couple.ID)
	}
}

// A selected pair is drawn as an arrow named by its ΔG°, and its couples
// are kept even when room runs short.
func TestLadderPairArrow(t *testing.T) {
	ev := embedded(t)
	pairs := ev.Rank(thermo.RankOptions{Top: 1})
	in := LadderOf(ev, ev.Donors, ev.Acceptors, thermo.Kcal)
	in.Pair = PairIn(&pairs[0], ev.Donors, ev.Acceptors, thermo.Kcal)
	if in.Pair == nil {
		t.Fatal("the best pair is not in the ladder")
	}
	in.Page = Page{Width: 25 * vg.Centimeter, Height: 10 * vg.Centimeter} // too short for every label
	var buf bytes.Buffer
	l, err := ladder(&buf, "svg", in)
	if err != nil {
		t.Fatal(err)
	}
	if l.hiddenD == 0 {
		t.Fatal("the short page hid nothing; the test needs it to")
	}
	if !slices.Contains(l.shownD, in.Pair.Donor) || !slices.Contains(l.shownA, in.Pair.Acceptor) {
		t.Error("the selected pair's couples were left out")
	}
	want := fmt.Sprintf("ΔG° %+.1f", pairs[0].DG.Kcal)
	if !parseSVG(t, buf.Bytes()).has(want) {
		t.Errorf("no %q on the arrow", want)
	}
	if d, a := CouplesOf(ev.Rank(thermo.RankOptions{Top: 10}), 0); len(d) == 0 || len(a) == 0 || d[0] != pairs[0].Donor {
		t.Error("CouplesOf lost the first pair's donor")
	}
}
