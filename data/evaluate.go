package data

import (
	"cmp"
	"fmt"
	"runtime"
	"slices"
	"sync"

	"github.com/hatsieve/hatsieve/thermo"
)

// Options choose how a library is evaluated.
type Options struct {
	// Solvent is the working solvent: couples that name no solvent are taken
	// in it, and only couples in it are screened unless Cross is set. Empty
	// means the library's default solvent.
	Solvent string
	// Cross keeps couples from other solvents too; their pairs are marked
	// cross-solvent and carry extra uncertainty.
	Cross bool
	Cond  thermo.Conditions
}

// Problem is a couple that could not be evaluated under the conditions (a
// missing C_G on the chosen basis, say). It is reported, not fatal.
type Problem struct {
	Couple *Couple
	Err    error
}

func (p Problem) Error() string {
	return fmt.Sprintf("%s: couple %s: %v", p.Couple.Pos, p.Couple.ID, p.Err)
}

// Evaluated is a library with every couple in play resolved under one set of
// conditions. It is what the commands and the screens show.
type Evaluated struct {
	Lib     *Library
	Working *thermo.Solvent
	Cond    thermo.Conditions
	H2Line  thermo.Number // of the working solvent

	// All holds each couple in play with its resolution, in library order.
	All       []*Entry
	Donors    []*thermo.Resolved
	Acceptors []*thermo.Resolved
	Series    []thermo.Series
	Problems  []Problem

	// byCouple indexes All by couple, for a library whose couples are not
	// numbered in order (see Entry); it is built when first needed.
	byCouple map[*thermo.Couple]*Entry
	indexed  sync.Once
}

// Entry is one couple and what thermo derived for it.
type Entry struct {
	*Couple
	R *thermo.Resolved
}

// Entry returns the library entry behind a resolved couple. It is safe to
// call from several goroutines.
func (ev *Evaluated) Entry(c *thermo.Couple) *Entry {
	if c == nil {
		return nil
	}
	// A loaded library numbers its couples in order (Couple.Index), and
	// All keeps that order: the entry is found by halving.
	if k, ok := slices.BinarySearchFunc(ev.All, c.Index, func(e *Entry, i int32) int { return cmp.Compare(e.Index, i) }); ok && &ev.All[k].Couple.Couple == c {
		return ev.All[k]
	}
	ev.indexed.Do(func() {
		ev.byCouple = make(map[*thermo.Couple]*Entry, len(ev.All))
		for _, e := range ev.All {
			ev.byCouple[&e.Couple.Couple] = e
		}
	})
	return ev.byCouple[c]
}

// Subset is ev narrowed to the couples keep accepts: the same library,
// conditions and entries, with All, Donors and Acceptors filtered (series and
// problems are kept whole). It shares ev's entries, never copies them.
func (ev *Evaluated) Subset(keep func(*thermo.Couple) bool) *Evaluated {
	sub := &Evaluated{Lib: ev.Lib, Working: ev.Working, Cond: ev.Cond, H2Line: ev.H2Line,
		Series: ev.Series, Problems: ev.Problems}
	for _, e := range ev.All {
		if keep(&e.Couple.Couple) {
			sub.All = append(sub.All, e)
		}
	}
	for _, r := range ev.Donors {
		if keep(r.Couple) {
			sub.Donors = append(sub.Donors, r)
		}
	}
	for _, r := range ev.Acceptors {
		if keep(r.Couple) {
			sub.Acceptors = append(sub.Acceptors, r)
		}
	}
	return sub
}

// DefaultSolvent is the working solvent when neither the command nor the
// library names one.
const DefaultSolvent = "acetonitrile"

// WorkingSolvent is the solvent a screen of l works in: the one named, else
// the library's default solvent, else DefaultSolvent. The commands, the
// screens and Evaluate all choose it here.
func (l *Library) WorkingSolvent(name string) (*thermo.Solvent, error) {
	if name == "" {
		name = l.DefaultSolvent
	}
	if name == "" {
		name = DefaultSolvent
	}
	return l.Solvents.Lookup(name)
}

// Evaluate resolves the couples of l in play under o. It fails only when the
// working solvent is unknown or has no H2 line under the conditions; a couple
// that cannot be resolved becomes a Problem.
func Evaluate(l *Library, o Options) (*Evaluated, error) {
	working, err := l.WorkingSolvent(o.Solvent)
	if err != nil {
		return nil, err
	}
	gh, err := o.Cond.H2LineOf(working)
	if err != nil {
		return nil, err
	}
	ev := &Evaluated{Lib: l, Working: working, Cond: o.Cond, H2Line: gh}
	play := inPlay(l, working, o.Cross)
	sl, counts, fails := resolveInPlay(play, o.Cond)
	ev.collect(play, sl, counts, fails)
	ev.series(l.Series)
	return ev, nil
}

// inPlay lists the couples screened in the working solvent: those in it,
// those that name no solvent (taken in it, as copies, so the library stays
// unchanged), and with cross those of every other solvent too.
func inPlay(l *Library, working *thermo.Solvent, cross bool) []*Couple {
	play := make([]*Couple, 0, len(l.Couples))
	for _, c := range l.Couples {
		if c.Solvent == nil {
			// A potential written without an electrode takes the working
			// solvent's default (Fc+/Fc, or NHE in water).
			cc := *c
			cc.Solvent = working
			cc.In.EAnion = withElectrode(cc.In.EAnion, working)
			cc.In.ECation = withElectrode(cc.In.ECation, working)
			cc.In.Reductant = withElectrode(cc.In.Reductant, working)
			cc.In.EPCET = withElectrode(cc.In.EPCET, working)
			c = &cc
		}
		if c.Solvent != working && !cross {
			continue
		}
		play = append(play, c)
	}
	return play
}

// h2Lines finds the H2 line of each solvent in play once; nil for a solvent
// that has none under the conditions (thermo.Resolve then says why).
func h2Lines(play []*Couple, cond thermo.Conditions) map[*thermo.Solvent]*thermo.Number {
	lines := map[*thermo.Solvent]*thermo.Number{}
	var last *thermo.Solvent
	for _, c := range play {
		if c.Solvent == last {
			continue
		}
		last = c.Solvent
		if _, done := lines[c.Solvent]; !done {
			var line *thermo.Number
			if gh, err := cond.H2LineOf(c.Solvent); err == nil {
				line = &gh
			}
			lines[c.Solvent] = line
		}
	}
	return lines
}

// resolveInPlay resolves each couple in play into its own slot. Resolve is pure,
// so large libraries are resolved in blocks on every core; each couple's
// first route goes into its slot, so most need no allocation of their own.
// counts holds, per block, its entries, donors and acceptors.
func resolveInPlay(play []*Couple, cond thermo.Conditions) (slots, [][3]int, [][]failure) {
	lines := h2Lines(play, cond)
	sl := make(slots, (len(play)+slotBlock-1)/slotBlock)
	counts := make([][3]int, len(sl))
	fails := make([][]failure, len(sl))
	parallelFor(len(sl), 16, func(b int) {
		block := sl.alloc(b, len(play))
		n := &counts[b]
		var solvent *thermo.Solvent // the solvent of gh: couples come in runs of one solvent
		var gh *thermo.Number
		for k := range block {
			s, c := &block[k], play[b*slotBlock+k]
			if c.Solvent != solvent {
				solvent, gh = c.Solvent, lines[c.Solvent]
			}
			var err error
			if gh != nil {
				err = thermo.ResolveInto(&s.r, &c.Couple, cond, gh, s.route[:0:1])
			} else {
				s.r, err = thermo.Resolve(&c.Couple, cond)
			}
			if err != nil {
				fails[b] = append(fails[b], failure{k, err})
				continue
			}
			s.e = Entry{Couple: c, R: &s.r}
			n[0]++
			if c.Roles&thermo.RoleDonor != 0 {
				n[1]++
			}
			if c.Roles&thermo.RoleAcceptor != 0 {
				n[2]++
			}
		}
	})
	return sl, counts, fails
}

// collect fills All, Donors and Acceptors from the slots, in library order,
// and lists the couples that could not be resolved as Problems. The lists
// are sized from the counts (and left nil when empty, as appending would
// leave them), then filled block by block on every core, each block from
// its offsets.
func (ev *Evaluated) collect(play []*Couple, sl slots, counts [][3]int, fails [][]failure) {
	offsets := make([][3]int, len(sl))
	var total [3]int
	for b, n := range counts {
		offsets[b] = total
		for i := range total {
			total[i] += n[i]
		}
	}
	ev.All = makeOrNil[*Entry](total[0])
	ev.Donors = makeOrNil[*thermo.Resolved](total[1])
	ev.Acceptors = makeOrNil[*thermo.Resolved](total[2])
	parallelFor(len(sl), 16, func(b int) {
		at := offsets[b]
		for k := range sl[b] {
			s := &sl[b][k]
			if s.r.Couple == nil {
				continue
			}
			ev.All[at[0]] = &s.e
			at[0]++
			if s.e.Roles&thermo.RoleDonor != 0 {
				ev.Donors[at[1]] = &s.r
				at[1]++
			}
			if s.e.Roles&thermo.RoleAcceptor != 0 {
				ev.Acceptors[at[2]] = &s.r
				at[2]++
			}
		}
	})
	for b, fs := range fails {
		for _, f := range fs {
			ev.Problems = append(ev.Problems, Problem{play[b*slotBlock+f.k], f.err})
		}
	}
}

func makeOrNil[T any](n int) []T {
	if n == 0 {
		return nil
	}
	return make([]T, n)
}

// series keeps each library series whose every step is in play.
func (ev *Evaluated) series(list []Series) {
	if len(list) == 0 {
		return
	}
	byID := make(map[string]*Entry, len(ev.All))
	for _, e := range ev.All {
		byID[e.ID] = e
	}
	for _, s := range list {
		ts := thermo.Series{ID: s.ID, Name: s.Name}
		complete := true
		for _, id := range s.Steps {
			e, ok := byID[id]
			if !ok {
				complete = false
				break
			}
			ts.Steps = append(ts.Steps, e.R)
		}
		if complete {
			ev.Series = append(ev.Series, ts)
		}
	}
}

// slot holds what Evaluate makes for one couple: its resolution, room for
// its first route and its entry (a couple left out has a zero resolution:
// its failure is listed apart).
type slot struct {
	r     thermo.Resolved // r.Couple is nil when the couple was not resolved
	route [1]thermo.RouteValue
	e     Entry
}

// failure is a couple of a block of slots that could not be resolved: its
// place in the block, and why.
type failure struct {
	k   int
	err error
}

// slots are the slots of the couples, in blocks of slotBlock.
type slots [][]slot

const slotBlock = 128

// alloc allocates block b of the slots of n couples (on the core that will
// fill it). The block is written to at once, through a field that holds no
// pointer: should the collector (which may be marking by then) read a
// fresh page first, the kernel maps it to its zero page, and the first
// write through a pointer field then costs a second fault and a TLB flush
// on every core.
func (s slots) alloc(b, n int) []slot {
	block := make([]slot, min(n-b*slotBlock, slotBlock))
	for i := range block {
		block[i].r.Tendency = 0
	}
	s[b] = block
	return block
}

// withElectrode returns p with the solvent's default electrode when none was
// given; p itself is left unchanged.
func withElectrode(p *thermo.Potential, s *thermo.Solvent) *thermo.Potential {
	if p == nil || p.Vs != thermo.NoElectrode {
		return p
	}
	q := *p
	q.Vs = s.DefaultElectrode()
	q.VsAssumed = true
	return &q
}

// Rank ranks the pairs of ev (see thermo.Rank).
func (ev *Evaluated) Rank(o thermo.RankOptions) []thermo.Pair {
	return thermo.Rank(ev.Donors, ev.Acceptors, ev.Cond, o)
}

// LargeExport is the most pairs written in one go without a word: 'rank
// --top 0' refuses more up front, and the screens ask before exporting more.
// At about 450 bytes a CSV row, 10^6 pairs are some 450 MB of CSV.
const LargeExport = 1_000_000

// PairRowBytes is about what one pair takes as a CSV row, to tell people
// the size of a large export before it is written.
const PairRowBytes = 450

// MorePairsThan reports whether more than limit pairs of ev pass o's
// filters (o's order and Top do not matter). It holds at most limit+1
// pairs while it counts, however many donors and acceptors there are.
func (ev *Evaluated) MorePairsThan(o thermo.RankOptions, limit int) bool {
	if int64(len(ev.Donors))*int64(len(ev.Acceptors)) <= int64(limit) {
		return false // not even that many before the filters
	}
	if o.DGMin == nil && o.DGMax == nil {
		// Only the donors' tendency filters: count without ranking.
		var donors, self int64
		for _, d := range ev.Donors {
			if len(o.Tendencies) == 0 || slices.Contains(o.Tendencies, d.Tendency) {
				donors++
				if d.Couple.Roles&thermo.RoleAcceptor != 0 {
					self++ // never paired with itself
				}
			}
		}
		return donors*int64(len(ev.Acceptors))-self > int64(limit)
	}
	o.Sort, o.Reverse, o.Top = thermo.ByDG, false, limit+1
	return len(ev.Rank(o)) > limit
}

// parallelFor calls f(i) for every i < n, spread over the cores when there
// are at least 2×perCore of them.
func parallelFor(n, perCore int, f func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), n/perCore)
	if workers < 2 {
		for i := range n {
			f(i)
		}
		return
	}
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := w * n / workers; i < (w+1)*n/workers; i++ {
				f(i)
			}
		}()
	}
	wg.Wait()
}
