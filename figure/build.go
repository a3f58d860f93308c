package figure

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// Conditions is the caption's account of what the numbers of ev mean:
// solvent, C_G and its basis, temperature, units, the H2 line and the
// library.
func Conditions(ev *data.Evaluated, u thermo.Units) string {
	ul := u.Label()
	s := ev.Working
	name := s.Name
	if name == "" {
		name = s.Key
	}
	cg := "no C_G (gas phase)"
	if n, err := ev.Cond.CGOf(s); err == nil {
		cg = fmt.Sprintf("C_G %.2f %s vs %v", u.From(n.V), ul, s.Ref)
	}
	lib := strings.Join(ev.Lib.Titles, " + ")
	if lib == "" {
		lib = strings.Join(ev.Lib.Files, ", ")
	}
	return fmt.Sprintf("Solvent %s; %s (%v basis); %g K; energies in %s; H2 line G_H = %.2f %s. Library: %s.",
		data.Printable(name), cg, ev.Cond.Basis, ev.Cond.T(), ul, u.From(ev.H2Line.V), ul, data.Printable(lib))
}

// CoupleOf is the figure's view of a resolved couple in units u.
func CoupleOf(r *thermo.Resolved, u thermo.Units) Couple {
	return Couple{
		Label:    r.Couple.ID,
		Value:    u.From(r.BDFE.Kcal),
		Sigma:    u.From(r.BDFE.Sigma()),
		Tendency: r.Tendency,
		BelowH2:  r.Margin.Kcal < 0,
	}
}

// LadderOf builds the ladder of the given donors and acceptors of ev (all
// of them, or what a screen shows).
func LadderOf(ev *data.Evaluated, donors, acceptors []*thermo.Resolved, u thermo.Units) LadderInput {
	in := LadderInput{
		Title:  "BDFE ladder, " + solventName(ev),
		H2Line: u.From(ev.H2Line.V),
		Units:  u.Label(),
	}
	for _, r := range donors {
		in.Donors = append(in.Donors, CoupleOf(r, u))
	}
	for _, r := range acceptors {
		in.Acceptors = append(in.Acceptors, CoupleOf(r, u))
	}
	in.Caption = Conditions(ev, u) + " Error bars ±1σ; a donor is H2 downhill when BDFE − G_H < −2σ, uphill when > +2σ."
	return in
}

// CouplesOf returns the donors and the acceptors of pairs (the rows a
// screen shows), each once, in order of first appearance, at most n of
// each (n ≤ 0: all): the couples of a map of those pairs.
func CouplesOf(pairs []thermo.Pair, n int) (donors, acceptors []*thermo.Resolved) {
	return collect(pairs, n)
}

// PairIn returns the LadderPair of p in a ladder built by LadderOf from
// donors and acceptors, or nil when either couple is not among them.
func PairIn(p *thermo.Pair, donors, acceptors []*thermo.Resolved, u thermo.Units) *LadderPair {
	if p == nil {
		return nil
	}
	di, ai := slices.Index(donors, p.Donor), slices.Index(acceptors, p.Acceptor)
	if di < 0 || ai < 0 {
		return nil
	}
	return &LadderPair{Donor: di, Acceptor: ai, DG: u.From(p.DG.Kcal)}
}

// LadderFrom builds the ladder of every donor and acceptor of ev; n > 0
// keeps on each side the n couples nearest the H2 line (those that decide
// between H delivery and H2 evolution), and the caption says so.
func LadderFrom(ev *data.Evaluated, u thermo.Units, n int) LadderInput {
	d, a := NearestH2(ev.Donors, n), NearestH2(ev.Acceptors, n)
	in := LadderOf(ev, d, a, u)
	if len(d) < len(ev.Donors) || len(a) < len(ev.Acceptors) {
		in.Caption += fmt.Sprintf(" Shown: the %d of %d donors and %d of %d acceptors nearest the H2 line.",
			len(d), len(ev.Donors), len(a), len(ev.Acceptors))
	}
	return in
}

// NearestH2 returns the n couples of rs whose BDFE lies nearest the H2
// line, in their original order; n ≤ 0 returns them all.
func NearestH2(rs []*thermo.Resolved, n int) []*thermo.Resolved {
	if n <= 0 || n >= len(rs) {
		return rs
	}
	idx := make([]int, len(rs))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(i, j int) bool {
		return math.Abs(rs[idx[i]].Margin.Kcal) < math.Abs(rs[idx[j]].Margin.Kcal)
	})
	idx = idx[:n]
	sort.Ints(idx)
	out := make([]*thermo.Resolved, n)
	for i, k := range idx {
		out[i] = rs[k]
	}
	return out
}

func solventName(ev *data.Evaluated) string {
	if ev.Working.Name != "" {
		return ev.Working.Name
	}
	return ev.Working.Key
}

// Mark names a pair by its couples' ids, as the screens' shortlist does.
type Mark struct{ Donor, Acceptor string }

// MapOf builds the map of donors × acceptors of ev, rows and columns in
// order of BDFE (the weakest donor bond first, the strongest acceptor bond
// first, so the most downhill pairs gather at the top left), ΔG° as
// thermo pairs them, and the pairs in marks shown as shortlisted.
func MapOf(ev *data.Evaluated, donors, acceptors []*thermo.Resolved, marks map[Mark]bool, u thermo.Units) MapInput {
	d := append([]*thermo.Resolved(nil), donors...)
	a := append([]*thermo.Resolved(nil), acceptors...)
	sort.SliceStable(d, func(i, j int) bool { return d[i].BDFE.Kcal < d[j].BDFE.Kcal })
	sort.SliceStable(a, func(i, j int) bool { return a[i].BDFE.Kcal > a[j].BDFE.Kcal })
	in := MapInput{
		Title: "ΔG°(HAT) of every pairing, " + solventName(ev),
		Units: u.Label(),
		DG:    make([][]float64, len(d)),
	}
	for _, r := range d {
		in.Donors = append(in.Donors, CoupleOf(r, u))
	}
	for _, r := range a {
		in.Acceptors = append(in.Acceptors, CoupleOf(r, u))
	}
	for i, dr := range d {
		in.DG[i] = make([]float64, len(a))
		for j, ar := range a {
			if dr.Couple == ar.Couple {
				in.DG[i][j] = math.NaN() // a couple is never paired with itself
				continue
			}
			p := thermo.MakePair(dr, ar, ev.Cond)
			in.DG[i][j] = u.From(p.DG.Kcal)
			if marks[Mark{dr.Couple.ID, ar.Couple.ID}] {
				in.Marked = append(in.Marked, [2]int{i, j})
			}
		}
	}
	in.Caption = Conditions(ev, u) + " ΔG°(HAT) = BDFE(donor) − BDFE(acceptor): below 0 (purple) the H atom goes downhill to the acceptor, above 0 (orange) uphill." +
		" Rows and columns in order of BDFE (values beside the ids). A donor is H2 downhill (▼) when BDFE − G_H < −2σ, near the line (≈) within ±2σ."
	if len(in.Marked) > 0 {
		in.Caption += " A framed cell is a shortlisted pair."
	}
	return in
}

// MaxMapSide is the most donors or acceptors a map draws: beyond, the
// labels fall below 6 pt on a slide.
const MaxMapSide = 120

// MapSelect says which couples a map draws.
type MapSelect struct {
	N int // at most N donors and N acceptors; 0 for all that pass the filters
	// Ranked takes the couples of the best pairs in rank's order (Rank.Sort)
	// until N of each are in; otherwise the N are spread evenly over the
	// BDFE range of the couples that pass the filters.
	Ranked bool
	Rank   thermo.RankOptions // the sort and the filters (tendencies, ΔG° window)
}

// MapCouples chooses the donors and acceptors of a map. The filters are
// rank's: donors of the H2 tendencies asked for, and couples that take part
// in at least one pair inside the ΔG° window.
func MapCouples(ev *data.Evaluated, sel MapSelect) (donors, acceptors []*thermo.Resolved) {
	if sel.Ranked && sel.N > 0 {
		return rankedCouples(ev, sel.Rank, sel.N)
	}
	donors, acceptors = filtered(ev, sel.Rank)
	return evenly(donors, sel.N), evenly(acceptors, sel.N)
}

// filtered returns the donors of the tendencies asked for and the couples
// with a partner inside the ΔG° window, each side in order of BDFE.
func filtered(ev *data.Evaluated, o thermo.RankOptions) (donors, acceptors []*thermo.Resolved) {
	for _, d := range ev.Donors {
		if len(o.Tendencies) == 0 || slices.Contains(o.Tendencies, d.Tendency) {
			donors = append(donors, d)
		}
	}
	acceptors = append([]*thermo.Resolved(nil), ev.Acceptors...)
	byBDFE := func(s []*thermo.Resolved) {
		sort.SliceStable(s, func(i, j int) bool { return s[i].BDFE.Kcal < s[j].BDFE.Kcal })
	}
	byBDFE(donors)
	byBDFE(acceptors)
	if o.DGMin == nil && o.DGMax == nil {
		return donors, acceptors
	}
	lo, hi := math.Inf(-1), math.Inf(1)
	if o.DGMin != nil {
		lo = *o.DGMin
	}
	if o.DGMax != nil {
		hi = *o.DGMax
	}
	// ΔG° = BDFE(D) − BDFE(A) in [lo, hi]: a partner's BDFE lies in a window.
	keep := func(side, other []*thermo.Resolved, win func(v float64) (float64, float64)) []*thermo.Resolved {
		var out []*thermo.Resolved
		for _, r := range side {
			a, b := win(r.BDFE.Kcal)
			k := sort.Search(len(other), func(i int) bool { return other[i].BDFE.Kcal >= a })
			if k < len(other) && other[k].BDFE.Kcal <= b {
				out = append(out, r)
			}
		}
		return out
	}
	donors = keep(donors, acceptors, func(d float64) (float64, float64) { return d - hi, d - lo })
	acceptors = keep(acceptors, donors, func(a float64) (float64, float64) { return a + lo, a + hi })
	return donors, acceptors
}

// evenly picks n couples spread evenly over rs (in order of BDFE), the
// first and the last among them; n ≤ 0 or n ≥ len(rs) keeps all.
func evenly(rs []*thermo.Resolved, n int) []*thermo.Resolved {
	if n <= 0 || n >= len(rs) {
		return rs
	}
	out := make([]*thermo.Resolved, 0, n)
	for i := range n {
		k := 0
		if n > 1 {
			k = int(math.Round(float64(i) * float64(len(rs)-1) / float64(n-1)))
		}
		out = append(out, rs[k])
	}
	return out
}

// maxRankedPairs bounds the pairs ranked to find the couples of a map.
const maxRankedPairs = 1 << 20

// rankedCouples takes the couples of the best pairs under o, in order,
// until n donors and n acceptors are in (or maxRankedPairs were ranked).
func rankedCouples(ev *data.Evaluated, o thermo.RankOptions, n int) (donors, acceptors []*thermo.Resolved) {
	total := len(ev.Donors) * len(ev.Acceptors)
	k := max(4*n*n, 64)
	for {
		k = min(k, total, maxRankedPairs)
		o.Top = k
		pairs := ev.Rank(o)
		donors, acceptors = collect(pairs, n)
		if len(pairs) < k || k == total || k == maxRankedPairs || (len(donors) >= n && len(acceptors) >= n) {
			return donors, acceptors
		}
		k *= 4
	}
}

func collect(pairs []thermo.Pair, n int) (donors, acceptors []*thermo.Resolved) {
	seenD := map[*thermo.Resolved]bool{}
	seenA := map[*thermo.Resolved]bool{}
	for _, p := range pairs {
		if !seenD[p.Donor] && (n <= 0 || len(donors) < n) {
			seenD[p.Donor] = true
			donors = append(donors, p.Donor)
		}
		if !seenA[p.Acceptor] && (n <= 0 || len(acceptors) < n) {
			seenA[p.Acceptor] = true
			acceptors = append(acceptors, p.Acceptor)
		}
		if n > 0 && len(donors) >= n && len(acceptors) >= n {
			break
		}
	}
	return donors, acceptors
}
