package tui

import (
	"cmp"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// order must agree with a plain comparison sort (cmp.Compare on the key,
// then the row index) for every kind of float, both directions, any filter.
func TestOrderMatchesComparisonSort(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	special := []float64{math.NaN(), math.Inf(-1), math.Inf(1), 0, math.Copysign(0, -1), -1e-300, 1e300, 5, 5, -5}
	for _, n := range []int{0, 1, 7, 63, 64, 1000, 20000} {
		keys := make([]float64, n)
		for i := range keys {
			if rng.IntN(5) == 0 {
				keys[i] = special[rng.IntN(len(special))]
			} else {
				keys[i] = math.Round(rng.NormFloat64()*100) / 10 // many ties
			}
		}
		for _, desc := range []bool{false, true} {
			keep := func(i int32) bool { return i%3 != 1 }
			got, _ := order(orderJob{n: n, key: func(i int32) float64 { return keys[i] }, keep: keep, desc: desc, anchor: -1})
			var want []int32
			for i := range int32(n) {
				if keep(i) {
					want = append(want, i)
				}
			}
			slices.SortFunc(want, func(a, b int32) int {
				ka, kb := keys[a], keys[b]
				if ka == kb { // treats −0 and +0 as equal, as cmp.Compare does
					return cmp.Compare(a, b)
				}
				c := cmp.Compare(ka, kb)
				if c == 0 {
					return cmp.Compare(a, b)
				}
				if desc {
					// Reversed key order, ties still by row; NaN last.
					return -c
				}
				return c
			})
			if !slices.Equal(got, want) {
				t.Fatalf("n=%d desc=%v: order differs from comparison sort", n, desc)
			}
		}
	}
}

func TestOrderKeepsAnchor(t *testing.T) {
	keys := []float64{3, 1, 2}
	perm, at := order(orderJob{n: 3, key: func(i int32) float64 { return keys[i] }, anchor: 0})
	if !slices.Equal(perm, []int32{1, 2, 0}) || at != 2 {
		t.Fatalf("perm %v at %d, want [1 2 0] at 2", perm, at)
	}
}

func TestGridScrollKeepsCursorVisible(t *testing.T) {
	g := newGrid(pairCols, 0)
	g.setSize(80, 5)
	perm := make([]int32, 100)
	for i := range perm {
		perm[i] = int32(i)
	}
	g.setPerm(perm, 0)
	for _, d := range []int{1, 4, 1, 50, -3, 1000, -1000, 7} {
		g.move(d)
		if g.cursor < g.offset || g.cursor >= g.offset+g.height || g.cursor < 0 || g.cursor >= 100 {
			t.Fatalf("after move %d: cursor %d offset %d", d, g.cursor, g.offset)
		}
	}
	g.setPerm(perm[:3], 2)
	if g.offset != 0 || g.cursor != 2 {
		t.Errorf("short table: cursor %d offset %d", g.cursor, g.offset)
	}
	g.setPerm(nil, 0)
	if g.row() != -1 {
		t.Error("empty grid has a row")
	}
}
