package tui

import (
	"fmt"

	"github.com/mattn/go-runewidth"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// crossMark follows an acceptor from another solvent than the donor's.
const crossMark = " ×solv"

// coupleName is a couple's readable name: its name, else its id.
func coupleName(c *thermo.Couple) string {
	if c.Name != "" {
		return c.Name
	}
	return c.ID
}

// readableNames gives each entry its readable name, as the screens show it;
// where two entries share a name, each gets its id after it.
func readableNames(es []*data.Entry) []string {
	out := make([]string, len(es))
	seen := make(map[string]int, len(es))
	for i, e := range es {
		out[i] = shown(coupleName(&e.Couple.Couple))
		seen[out[i]]++
	}
	for i, e := range es {
		if seen[out[i]] > 1 {
			out[i] += " [" + shown(e.ID) + "]"
		}
	}
	return out
}

// squeeze fits s into w cells by cutting out its middle: the start and the
// end, where names of one family differ, both stay.
func squeeze(s string, w int) string {
	if runewidth.StringWidth(s) <= w {
		return s
	}
	if w < 6 {
		return runewidth.Truncate(s, w, "…")
	}
	tailW := (w - 1) / 3
	head := runewidth.Truncate(s, w-1-tailW, "")
	rs := []rune(s)
	k, tw := len(rs), 0
	for k > 0 && tw+runewidth.RuneWidth(rs[k-1]) <= tailW {
		k--
		tw += runewidth.RuneWidth(rs[k])
	}
	head = runewidth.FillRight(head, w-1-tw)
	return head + "…" + string(rs[k:])
}

// uniqueLabels fits names into w cells so that different names never look
// the same: names that squeeze to the same text get a number, ~1, ~2, at
// the end. Equal names (one couple listed twice) keep equal labels.
func uniqueLabels(names []string, w int) []string {
	out := make([]string, len(names))
	groups := map[string][]int{}
	for i, n := range names {
		out[i] = squeeze(n, w)
		groups[out[i]] = append(groups[out[i]], i)
	}
	for _, idx := range groups {
		distinct := map[string]int{}
		for _, i := range idx {
			if _, ok := distinct[names[i]]; !ok {
				distinct[names[i]] = len(distinct) + 1
			}
		}
		if len(distinct) < 2 {
			continue
		}
		for _, i := range idx {
			suf := fmt.Sprintf("~%d", distinct[names[i]])
			out[i] = squeeze(names[i], max(w-len(suf), 1)) + suf
		}
	}
	return out
}

// label is row r's fitted label, or its readable name when the labels are
// not laid out for these tables.
func label(fitted, base []string, r int32) string {
	if int(r) < len(fitted) {
		return fitted[r]
	}
	return base[r]
}

// Label slots: the name columns whose labels are fitted to their width.
const (
	slotPairD = iota
	slotPairA
	slotDonors
	slotAcceptors
	nSlots
)

// labelSet is one column's names fitted to its width, for one layout.
type labelSet struct {
	t    *tables
	w    int
	rows []seriesRow // for the Series labels
	s    []string
}

// labelCache holds the fitted names; they are fitted again only when the
// tables or the column widths change, in Update, never in View.
type labelCache struct {
	sets [nSlots]labelSet
	ser  labelSet
}

func (c *labelCache) get(slot int, t *tables) []string {
	if c.sets[slot].t != t {
		return nil
	}
	return c.sets[slot].s
}

func (c *labelCache) ensure(slot int, t *tables, names []string, w int) {
	if s := &c.sets[slot]; s.t != t || s.w != w {
		*s = labelSet{t: t, w: w, s: uniqueLabels(names, max(w, 1))}
	}
}

// refresh fits the names of the pane shown.
func (c *labelCache) refresh(t *tables, tab pane, grids *[4]grid) {
	switch tab {
	case panePairs, paneScale:
		w := grids[panePairs].widths[pairAcc]
		if t.cross() {
			w -= runewidth.StringWidth(crossMark)
		}
		c.ensure(slotPairD, t, t.donorName, grids[panePairs].widths[pairDonor])
		c.ensure(slotPairA, t, t.accName, w)
	case paneDonors:
		c.ensure(slotDonors, t, t.donorName, grids[paneDonors].widths[0])
	case paneAcceptors:
		c.ensure(slotAcceptors, t, t.accName, grids[paneAcceptors].widths[0])
	}
}

// series fits the acceptor names of the Series rows.
func (c *labelCache) series(t *tables, rows []seriesRow, w int) {
	s := &c.ser
	same := s.t == t && s.w == w && len(s.rows) == len(rows) && (len(rows) == 0 || &s.rows[0] == &rows[0])
	if same {
		return
	}
	names := make([]string, len(rows))
	for i, r := range rows {
		if k, ok := t.ai[r.pair.Acceptor]; ok {
			names[i] = t.accName[k]
		} else {
			names[i] = shown(coupleName(r.pair.Acceptor.Couple))
		}
	}
	*s = labelSet{t: t, w: w, rows: rows, s: uniqueLabels(names, max(w, 1))}
}

// cross tells whether any pair joins couples of two solvents.
func (t *tables) cross() bool { return t.crossing }
