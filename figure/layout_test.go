package figure

import (
	"bytes"
	"errors"
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

// coverRadius is the largest distance from a value of vs not in shown to
// the nearest value in shown.
func coverRadius(vs []float64, shown []int) float64 {
	in := map[int]bool{}
	for _, i := range shown {
		in[i] = true
	}
	r := 0.0
	for i, v := range vs {
		if in[i] {
			continue
		}
		d := math.Inf(1)
		for _, j := range shown {
			d = math.Min(d, math.Abs(v-vs[j]))
		}
		r = math.Max(r, d)
	}
	return r
}

// spanBound is what farthest-point selection guarantees for k of the
// values spanning a range R: every couple added after the three seeds was,
// when added, at least the final cover radius r from all chosen before,
// so the k chosen less one seed are pairwise ≥ r apart and (k−2)·r ≤ R.
// Derived here, the argument of the greedy k-centre bound (common
// practice, no source).
func spanBound(R float64, k int) float64 { return R / float64(k-2) }

// A crowded side keeps every label it draws at least a line apart, keeps
// couples that span the range (the extremes and the one nearest the H2
// line among them), and says how many it drew in the caption.
func TestLadderCrowdedSaysWhatIsLeftOut(t *testing.T) {
	in := smallLadder()
	in.Donors = nil
	var vs []float64
	for i := range 80 {
		v := 45 + float64(i)*0.2
		if i%3 == 0 {
			v += 0.07 // not evenly spaced
		}
		vs = append(vs, v)
		in.Donors = append(in.Donors, Couple{Label: fmt.Sprintf("d%02d", i), Value: v, Sigma: 0.5})
	}
	in.Page = Page{Width: 20 * vg.Centimeter, Height: 10 * vg.Centimeter}
	var buf bytes.Buffer
	l, err := ladder(&buf, "svg", in)
	if err != nil {
		t.Fatal(err)
	}
	if l.hiddenD == 0 || len(l.shownD)+l.hiddenD != 80 || len(l.shownD) != l.capacity {
		t.Fatalf("shown %d, hidden %d of 80, capacity %d", len(l.shownD), l.hiddenD, l.capacity)
	}
	ys := append([]vg.Length(nil), l.labelsD...)
	sort.Slice(ys, func(i, j int) bool { return ys[i] < ys[j] })
	for i := 1; i < len(ys); i++ {
		if ys[i]-ys[i-1] < l.gap-0.01 {
			t.Fatalf("labels %g and %g overlap (gap %g)", ys[i-1], ys[i], l.gap)
		}
	}
	near := 0
	for i, v := range vs {
		if math.Abs(v-in.H2Line) < math.Abs(vs[near]-in.H2Line) {
			near = i
		}
	}
	for _, must := range []int{0, 79, near} {
		if !slices.Contains(l.shownD, must) {
			t.Errorf("%s (%.2f) not drawn: the extremes and the one nearest the H2 line are", in.Donors[must].Label, vs[must])
		}
	}
	if r, b := coverRadius(vs, l.shownD), spanBound(vs[79]-vs[0], len(l.shownD)); r > b+1e-9 {
		t.Errorf("a left-out couple is %.3f from every drawn one; spanning guarantees ≤ %.3f", r, b)
	}
	note := fmt.Sprintf("%d of these 80 donors", len(l.shownD))
	if !strings.Contains(strings.Join(l.caption, " "), note) {
		t.Errorf("caption does not say %q: %q", note, l.caption)
	}
	doc := parseSVG(t, buf.Bytes())
	for _, i := range l.shownD {
		if !doc.has(sideLabel(in.Donors[i], true)) {
			t.Errorf("label of %s missing", in.Donors[i].Label)
		}
	}
	// Strict, the same page is an error that says what it holds, and
	// nothing is written.
	in.Strict = true
	buf.Reset()
	_, err = ladder(&buf, "svg", in)
	var tm *TooManyError
	if !errors.As(err, &tm) || !errors.Is(err, ErrTooSmall) || tm.N != 80 || tm.Fit != l.capacity || tm.Side != "donors" {
		t.Fatalf("strict: %v", err)
	}
	if buf.Len() != 0 {
		t.Error("a strict ladder that does not fit wrote something")
	}
}

// Spanning keeps the couples asked for, then the extremes and the one
// nearest the H2 line, then spreads the rest.
func TestSpanning(t *testing.T) {
	ev := embedded(t)
	rs := ev.Donors
	if len(rs) < 12 {
		t.Fatalf("only %d donors in the embedded library", len(rs))
	}
	keep := rs[len(rs)/2]
	for _, n := range []int{4, 10} {
		got := Spanning(rs, n, []*thermo.Resolved{keep})
		if len(got) != n || !slices.Contains(got, keep) {
			t.Fatalf("n=%d: %d chosen, keep among them %v", n, len(got), slices.Contains(got, keep))
		}
		lo, hi, near := rs[0], rs[0], rs[0]
		for _, r := range rs {
			if r.BDFE.Kcal < lo.BDFE.Kcal {
				lo = r
			}
			if r.BDFE.Kcal > hi.BDFE.Kcal {
				hi = r
			}
			if math.Abs(r.Margin.Kcal) < math.Abs(near.Margin.Kcal) {
				near = r
			}
		}
		for _, must := range []*thermo.Resolved{lo, hi, near} {
			if !slices.Contains(got, must) {
				t.Errorf("n=%d: %s not chosen", n, must.Couple.ID)
			}
		}
		for i := 1; i < len(got); i++ {
			if slices.Index(rs, got[i-1]) > slices.Index(rs, got[i]) {
				t.Errorf("n=%d: not in the library's order", n)
			}
		}
	}
	if len(Spanning(rs, 0, nil)) != len(rs) || len(Spanning(rs, len(rs)+5, nil)) != len(rs) {
		t.Error("n ≤ 0 or n ≥ len must keep all")
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
	// The written-out scale is gonum's PuOr 11, purple first.
	pu := brewer.PuOr[11].Color
	if len(diverging) != len(pu) {
		t.Fatalf("%d classes, want %d", len(diverging), len(pu))
	}
	for i, c := range pu {
		if got, want := rgba(diverging[len(pu)-1-i]), rgba(c); got != want {
			t.Errorf("class %d is %v, want %v", len(pu)-1-i, got, want)
		}
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

// --max keeps per side the couples the pick chooses, and the caption says
// how many of how many and by what rule.
func TestLadderFromMax(t *testing.T) {
	ev := embedded(t)
	in := LadderFrom(ev, thermo.Kcal, 5, PickNearH2)
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
	want := fmt.Sprintf("Shown: 5 of %d donors and 5 of %d acceptors, chosen as those nearest the H2 line.", len(ev.Donors), len(ev.Acceptors))
	if !strings.Contains(in.Caption, want) {
		t.Errorf("caption: %s", in.Caption)
	}
	span := LadderFrom(ev, thermo.Kcal, 8, PickSpan)
	if span.DonorsOf != len(ev.Donors) || len(span.Donors) != 8 || !strings.Contains(span.Caption, "chosen to span the BDFE range") {
		t.Errorf("span: %d of %d donors, caption %s", len(span.Donors), span.DonorsOf, span.Caption)
	}
	var vs []float64
	var shown []int
	for i, r := range ev.Donors {
		vs = append(vs, r.BDFE.Kcal)
		if slices.ContainsFunc(span.Donors, func(c Couple) bool { return c.Label == r.Couple.ID }) {
			shown = append(shown, i)
		}
	}
	if r, b := coverRadius(vs, shown), spanBound(slices.Max(vs)-slices.Min(vs), 8); r > b+1e-9 {
		t.Errorf("span: a left-out donor is %.2f from every shown one, want ≤ %.2f", r, b)
	}
	kj := LadderFrom(ev, thermo.KJ, 0, PickSpan)
	// 1 kcal = 4.184 kJ (thermochemical calorie). Source: CODATA / NIST SP 811.
	if math.Abs(kj.H2Line-4.184*ev.H2Line.V) > 1e-9 || !strings.Contains(kj.Caption, "kJ/mol") || strings.Contains(kj.Caption, "Shown:") {
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

// The default map (20 × 20 of the embedded library) fits a slide with
// every value written and no id under 7 pt; the whole library does not
// (a 49-row grid leaves rows of under 7 pt on a 14.29 cm page), and a
// shortlist's couples are chosen first.
func TestMapReadableAndKeep(t *testing.T) {
	ev := embedded(t)
	d, a := MapCouples(ev, MapSelect{N: 20})
	in := MapOf(ev, d, a, nil, thermo.Kcal)
	if !MapReadable(in) {
		t.Error("a 20 × 20 map is not readable on the default slide")
	}
	var buf bytes.Buffer
	l, err := mapFig(&buf, "svg", in)
	if err != nil || !l.values || l.cellH < 10 {
		t.Errorf("20 × 20: values written %v, cells %.1f pt tall, %v", l.values, l.cellH, err)
	}
	if len(ev.Donors) < 40 {
		t.Fatalf("only %d donors: the test needs a big library", len(ev.Donors))
	}
	all := MapOf(ev, ev.Donors, ev.Acceptors, nil, thermo.Kcal)
	if MapReadable(all) {
		t.Errorf("a %d × %d map called readable on a slide", len(ev.Donors), len(ev.Acceptors))
	}
	// A couple from the middle of each side, kept.
	kd, ka := ev.Donors[len(ev.Donors)/2], ev.Acceptors[len(ev.Acceptors)/2]
	keep := map[string]bool{kd.Couple.ID: true, ka.Couple.ID: true}
	for _, ranked := range []bool{false, true} {
		d, a = MapCouples(ev, MapSelect{N: 3, Ranked: ranked, Keep: keep})
		if len(d) != 3 || len(a) != 3 || !slices.Contains(d, kd) || !slices.Contains(a, ka) {
			t.Errorf("ranked %v: kept couples not chosen (%d, %d)", ranked, len(d), len(a))
		}
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

// The caption's C_G says "an estimate" exactly where the solvent table
// marks the C_G on the basis in force as one (DMSO and water, on both
// bases, and acetonitrile are checked against the table's own flag), and
// "explicit" when one is given; the H2 pressure is named when not 1 atm.
func TestConditionsBasisAndPressure(t *testing.T) {
	lib, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	for _, solvent := range []string{"acetonitrile", "dmso", "water"} {
		for _, b := range []thermo.Basis{thermo.Basis2010, thermo.Basis2022} {
			cond := thermo.Conditions{Basis: b, Temperature: thermo.DefaultTemperature}
			ev, err := data.Evaluate(lib, data.Options{Solvent: solvent, Cond: cond})
			if err != nil {
				t.Fatal(err)
			}
			c := Conditions(ev, thermo.Kcal)
			est := ev.Working.CGEstimated(b)
			if strings.Contains(c, b.String()+" basis, an estimate") != est || !strings.Contains(c, b.String()+" basis") {
				t.Errorf("%s, %v basis (estimate %v): %s", solvent, b, est, c)
			}
			if strings.Contains(c, "p(H2)") || strings.Contains(c, "explicit") {
				t.Errorf("%s: %s", solvent, c)
			}
		}
	}
	cond := thermo.Conditions{Basis: thermo.Basis2022, Temperature: thermo.DefaultTemperature, PH2: 10,
		CG: map[string]float64{"acetonitrile": 54}}
	ev, err := data.Evaluate(lib, data.Options{Solvent: "acetonitrile", Cond: cond})
	if err != nil {
		t.Fatal(err)
	}
	c := Conditions(ev, thermo.Kcal)
	if !strings.Contains(c, "C_G 54.00 kcal/mol") || !strings.Contains(c, "explicit basis") || !strings.Contains(c, "p(H2) = 10 atm") {
		t.Errorf("explicit C_G at 10 atm: %s", c)
	}
}
