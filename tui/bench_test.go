package tui

import (
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// thousand is 40 donors × 25 acceptors = 10^3 pairs.
func thousand(tb testing.TB) (*data.Library, *tables) {
	lib := bigLibrary(40, 25)
	ev, err := data.Evaluate(lib, data.Options{})
	if err != nil {
		tb.Fatal(err)
	}
	return lib, buildTables(ev, 0)
}

// BenchmarkCursorMove is one key press on the Pairs table as the runtime
// handles it: Update with ↓ (or ↑), then View. Target ≤ 1 ms at 10^6 rows
// (README.md, Performance), with allocations that do not grow with the row count.
func BenchmarkCursorMove(b *testing.B) {
	for _, c := range []struct {
		name string
		tabs func(testing.TB) (*data.Library, *tables)
	}{{"1e3", thousand}, {"1e6", million}} {
		b.Run(c.name, func(b *testing.B) {
			lib, t := c.tabs(b)
			m := withTables(b, lib, t, 120, 40)
			down, up := tea.KeyMsg{Type: tea.KeyDown}, tea.KeyMsg{Type: tea.KeyUp}
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				k := down
				if i%64 >= 32 {
					k = up
				}
				mm, _ := m.Update(k)
				m = mm.(Model)
				_ = m.View()
			}
		})
	}
}

// BenchmarkResort re-sorts all 10^6 pairs by σ (what `s` starts, off the UI
// goroutine). Target ≤ 300 ms.
func BenchmarkResort(b *testing.B) {
	_, t := million(b)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		perm, _ := order(jobFor(t, panePairs, gridSpec{sortCol: pairSigma, desc: i%2 == 1}, nil, nil))
		if len(perm) != len(t.pairs) {
			b.Fatal("lost rows")
		}
	}
}

// BenchmarkResortFlask re-sorts all 10^6 pairs by the conversion and by
// the rate estimate, every couple with an (invented) self-exchange
// constant, so that thermo's cross relation runs for every pair. Target,
// as for any sort: ≤ 300 ms.
func BenchmarkResortFlask(b *testing.B) {
	lib := bigLibrary(1000, 1000)
	for i, c := range lib.Couples {
		c.KSelf = &thermo.SelfExchange{K: float64(10 + i), Factor: 3, Status: "invented"}
	}
	ev, err := data.Evaluate(lib, data.Options{})
	if err != nil {
		b.Fatal(err)
	}
	t := buildTables(ev, 0)
	b.ResetTimer()
	for _, col := range []int{pairConv, pairRate} {
		b.Run(pairCols[col].title, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				perm, _ := order(jobFor(t, panePairs, gridSpec{sortCol: col, desc: true}, nil, nil))
				if len(perm) != len(t.pairs) {
					b.Fatal("lost rows")
				}
			}
		})
	}
}

// BenchmarkResortText sorts 10^6 pairs by acceptor id.
func BenchmarkResortText(b *testing.B) {
	_, t := million(b)
	for i := 0; i < b.N; i++ {
		order(jobFor(t, panePairs, gridSpec{sortCol: 1}, nil, nil))
	}
}

// BenchmarkFilter filters 10^6 pairs by a donor id and sorts what is kept.
func BenchmarkFilter(b *testing.B) {
	_, t := million(b)
	for i := 0; i < b.N; i++ {
		order(jobFor(t, panePairs, gridSpec{sortCol: 2, query: "d0001"}, nil, nil))
	}
}

// BenchmarkView draws the whole Pairs screen at 120×40.
func BenchmarkView(b *testing.B) {
	for _, c := range []struct {
		name string
		tabs func(testing.TB) (*data.Library, *tables)
	}{{"1e3", thousand}, {"1e6", million}} {
		b.Run(c.name, func(b *testing.B) {
			lib, t := c.tabs(b)
			m := withTables(b, lib, t, 120, 40)
			b.ReportAllocs()
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				_ = m.View()
			}
		})
	}
}

// A cursor move allocates no more at 10^6 rows than at 10^3: nothing in
// Update or View is sized by the row count.
func TestCursorMoveAllocsIndependentOfRows(t *testing.T) {
	allocs := func(lib *data.Library, tb *tables) float64 {
		m := withTables(t, lib, tb, 120, 40)
		m = keys(t, m, "pgdown") // away from the top, so both moves scroll
		down := tea.KeyMsg{Type: tea.KeyDown}
		return testing.AllocsPerRun(200, func() {
			mm, _ := m.Update(down)
			m = mm.(Model)
			_ = m.View()
		})
	}
	small := allocs(thousand(t))
	big := allocs(million(t))
	if big > small*1.1+2 {
		t.Errorf("allocations per move: %.0f at 10^6 rows vs %.0f at 10^3", big, small)
	}
	t.Logf("allocations per move+view: 1e3 %.0f, 1e6 %.0f", small, big)
}
