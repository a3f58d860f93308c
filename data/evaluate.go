package data

import (
	"fmt"
	"runtime"
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

	// byCouple is built on another core once Evaluate has returned (the
	// pairs are ranked meanwhile); indexed is closed when it is done.
	byCouple map[*thermo.Couple]*Entry
	indexed  chan struct{}
}

// Entry is one couple and what thermo derived for it.
type Entry struct {
	*Couple
	R *thermo.Resolved
}

// Entry returns the library entry behind a resolved couple.
func (ev *Evaluated) Entry(c *thermo.Couple) *Entry {
	if ev.indexed != nil {
		<-ev.indexed
	}
	return ev.byCouple[c]
}

// Evaluate resolves the couples of l in play under o. It fails only when the
// working solvent is unknown or has no H2 line under the conditions; a couple
// that cannot be resolved becomes a Problem.
func Evaluate(l *Library, o Options) (*Evaluated, error) {
	name := o.Solvent
	if name == "" {
		name = l.DefaultSolvent
	}
	if name == "" {
		name = "acetonitrile"
	}
	working, err := l.Solvents.Lookup(name)
	if err != nil {
		return nil, err
	}
	gh, err := o.Cond.H2LineOf(working)
	if err != nil {
		return nil, err
	}
	ev := &Evaluated{Lib: l, Working: working, Cond: o.Cond, H2Line: gh}
	play := make([]*Couple, 0, len(l.Couples))
	for _, c := range l.Couples {
		if c.Solvent == nil {
			// A couple without a solvent of its own plays in the working one.
			// Evaluate works on a copy so the library stays unchanged.
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
		if c.Solvent != working && !o.Cross {
			continue
		}
		play = append(play, c)
	}
	// Resolve is pure and each couple has its own slot, so large libraries
	// are resolved on every core; the results are then taken in order.
	// The H2 line is found once per solvent; each couple's first route goes
	// into a slab, so most couples need no allocation of their own.
	lines := map[*thermo.Solvent]*thermo.Number{}
	var last *thermo.Solvent
	for _, c := range play {
		if c.Solvent == last {
			continue
		}
		last = c.Solvent
		if _, done := lines[c.Solvent]; !done {
			var line *thermo.Number
			if gh, err := o.Cond.H2LineOf(c.Solvent); err == nil {
				line = &gh
			}
			lines[c.Solvent] = line // nil: Resolve reports why
		}
	}
	slots := make(slots, (len(play)+slotBlock-1)/slotBlock)
	counts := make([][3]int, len(slots)) // of each block: entries, donors, acceptors
	parallelFor(len(slots), 16, func(b int) {
		block := slots.alloc(b, len(play))
		n := &counts[b]
		var s *thermo.Solvent
		var gh *thermo.Number
		for k := range block {
			sl, c := &block[k], play[b*slotBlock+k]
			cp := &c.Couple
			if cp.Solvent != s {
				s, gh = cp.Solvent, lines[cp.Solvent]
			}
			if gh != nil {
				sl.err = thermo.ResolveInto(&sl.r, cp, o.Cond, *gh, sl.route[:0:1])
			} else {
				sl.r, sl.err = thermo.Resolve(cp, o.Cond)
			}
			if sl.err == nil {
				sl.e = Entry{Couple: c, R: &sl.r}
				n[0]++
				if c.Roles&thermo.RoleDonor != 0 {
					n[1]++
				}
				if c.Roles&thermo.RoleAcceptor != 0 {
					n[2]++
				}
			}
		}
	})
	// The lists are sized from the counts (and left nil when empty, as
	// appending would leave them), then filled block by block on every core,
	// each block from its offsets.
	offsets := make([][3]int, len(slots))
	var nAll, nd, na int
	for b, n := range counts {
		offsets[b] = [3]int{nAll, nd, na}
		nAll, nd, na = nAll+n[0], nd+n[1], na+n[2]
	}
	if nAll > 0 {
		ev.All = make([]*Entry, nAll)
	}
	if nd > 0 {
		ev.Donors = make([]*thermo.Resolved, nd)
	}
	if na > 0 {
		ev.Acceptors = make([]*thermo.Resolved, na)
	}
	parallelFor(len(slots), 16, func(b int) {
		at := offsets[b]
		for k := range slots[b] {
			sl := &slots[b][k]
			if sl.err != nil {
				continue
			}
			ev.All[at[0]] = &sl.e
			at[0]++
			if sl.e.Roles&thermo.RoleDonor != 0 {
				ev.Donors[at[1]] = &sl.r
				at[1]++
			}
			if sl.e.Roles&thermo.RoleAcceptor != 0 {
				ev.Acceptors[at[2]] = &sl.r
				at[2]++
			}
		}
	})
	if nAll < len(play) {
		for i, c := range play {
			if sl := slots.at(i); sl.err != nil {
				ev.Problems = append(ev.Problems, Problem{c, sl.err})
			}
		}
	}
	ev.indexed = make(chan struct{})
	go func(all []*Entry) {
		defer close(ev.indexed)
		ev.byCouple = make(map[*thermo.Couple]*Entry, len(all))
		for _, e := range all {
			ev.byCouple[&e.Couple.Couple] = e
		}
	}(ev.All)
	byID := map[string]*Entry{}
	if len(l.Series) > 0 {
		for _, e := range ev.All {
			byID[e.ID] = e
		}
	}
	for _, s := range l.Series {
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
	return ev, nil
}

// slot holds what Evaluate makes for one couple: its resolution, room for
// its first route, its entry, and the error that left it out.
type slot struct {
	r     thermo.Resolved
	route [1]thermo.RouteValue
	e     Entry
	err   error
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

func (s slots) at(i int) *slot { return &s[i/slotBlock][i%slotBlock] }

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
