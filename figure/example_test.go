package figure_test

import (
	"fmt"
	"io"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/figure"
	"github.com/hatsieve/hatsieve/thermo"
)

// A screen writes the figure of what it shows: the Scale pane its couples
// and selected pair as a ladder, the Pairs pane the couples of its visible
// rows as a map (the marks framed). Written through atomicfile.Write
// in a real program; here to io.Discard.
func Example() {
	lib, err := data.Default()
	if err != nil {
		panic(err)
	}
	cond := thermo.Conditions{Basis: thermo.Basis2022, Temperature: thermo.DefaultTemperature}
	ev, err := data.Evaluate(lib, data.Options{Cond: cond})
	if err != nil {
		panic(err)
	}
	u := thermo.Kcal
	pairs := ev.Rank(thermo.RankOptions{Top: 40})

	in := figure.LadderOf(ev, ev.Donors, ev.Acceptors, u)
	in.Pair = figure.PairIn(&pairs[0], ev.Donors, ev.Acceptors, u)
	if err := figure.Ladder(io.Discard, "svg", in); err != nil {
		panic(err)
	}

	donors, acceptors := figure.CouplesOf(pairs, figure.MaxMapSide)
	marks := map[figure.Mark]bool{{Donor: pairs[0].Donor.Couple.ID, Acceptor: pairs[0].Acceptor.Couple.ID}: true}
	m := figure.MapOf(ev, donors, acceptors, marks, u)
	if err := figure.Map(io.Discard, "png", m); err != nil {
		panic(err)
	}
	fmt.Println(len(m.Marked), "pair framed")
	// Output: 1 pair framed
}
