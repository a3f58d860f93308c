package data

import (
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/hatsieve/hatsieve/thermo"
)

// MaxCombined is the most combined donors (acid + reductant) the files
// loaded together may form. An all × all rule on a large file stops here
// with a message instead of filling memory.
const MaxCombined = 50000

// MaxWindowCombinations is the most acid × reductant combinations
// Library.DeliveryWindow weighs in one solvent.
const MaxWindowCombinations = 1_000_000

// combineAllWord is the combine item that pairs every acid with every
// reductant of the same solvent.
const combineAllWord = "all"

// combineRule is a combine item that names sets rather than one pair:
// `all`, or {acids: [...] | all, acid_tags: [...], reductants: [...] | all,
// reductant_tags: [...]}. Every selected acid meets every selected reductant
// of the same solvent.
type combineRule struct {
	acids, reds       []string // ids; "all" selects every one
	acidTags, redTags []string
	pos               Pos
}

var combineKeys = []string{"acid", "reductant", "acids", "reductants", "acid_tags", "reductant_tags"}

// combineMapping reads a combine item written as a mapping: one pair
// {acid, reductant}, or a rule over id lists and tags.
func (ld *loader) combineMapping(file string, n *yaml.Node) {
	p := pos(file, n)
	f := ld.fields(file, n, combineKeys)
	a, _ := ld.text(file, f["acid"], "acid")
	r, _ := ld.text(file, f["reductant"], "reductant")
	var rule combineRule
	var ok1, ok2, ok3, ok4 bool
	rule.acids, ok1 = ld.list(file, f["acids"], "acids")
	rule.reds, ok2 = ld.list(file, f["reductants"], "reductants")
	rule.acidTags, ok3 = ld.list(file, f["acid_tags"], "acid_tags")
	rule.redTags, ok4 = ld.list(file, f["reductant_tags"], "reductant_tags")
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return
	}
	if len(rule.acids)+len(rule.reds)+len(rule.acidTags)+len(rule.redTags) == 0 {
		if a == "" || r == "" {
			ld.c.add(p, "combine", "a combination needs both acid and reductant")
			return
		}
		ld.combines = append(ld.combines, combineReq{a, r, p})
		return
	}
	if a != "" {
		rule.acids = append(rule.acids, a)
	}
	if r != "" {
		rule.reds = append(rule.reds, r)
	}
	switch {
	case len(rule.acids)+len(rule.acidTags) == 0:
		ld.c.add(p, "combine", "say which acids: acids: [ID, ...], acids: all, or acid_tags: [TAG, ...]")
		return
	case len(rule.reds)+len(rule.redTags) == 0:
		ld.c.add(p, "combine", "say which reductants: reductants: [ID, ...], reductants: all, or reductant_tags: [TAG, ...]")
		return
	}
	rule.pos = p
	ld.rules = append(ld.rules, rule)
}

// combinePairs is the work of combineAll: the pairs listed under combine
// and those the rules select, or every pair in one solvent when no file
// has a combine list; at most MaxCombined in all.
func (ld *loader) combinePairs() {
	if !ld.combineGiven {
		all := []combineRule{{acids: []string{combineAllWord}, reds: []string{combineAllWord}}}
		if n := countPairs(ld.lib.Acids, ld.lib.Reductants); n > MaxCombined {
			p := Pos{}
			if len(ld.lib.Files) > 0 {
				p.File = ld.lib.Files[len(ld.lib.Files)-1]
			}
			ld.c.add(p, "combine", "%d acids and %d reductants would form %d combined donors; at most %d: add a combine list naming the pairs or sets to form (see data/FORMAT.md)",
				len(ld.lib.Acids), len(ld.lib.Reductants), n, MaxCombined)
			return
		}
		ld.expandRules(all, map[string]Pos{}, 0)
		return
	}
	seen := map[string]Pos{}
	for _, r := range ld.combines {
		a, aok := ld.acids[r.acid]
		d, dok := ld.reductants[r.red]
		if !aok {
			ld.c.add(r.pos, "combine", "unknown acid %q%s", r.acid, suggest(r.acid, keys(ld.acids)))
		}
		if !dok {
			ld.c.add(r.pos, "combine", "unknown reductant %q%s", r.red, suggest(r.red, keys(ld.reductants)))
		}
		if !aok || !dok {
			continue
		}
		id := a.ID + "+" + d.ID
		if old, dup := seen[id]; dup {
			// The same pair in two files (a user file repeating an
			// embedded one, say) is formed once; twice in one file is a slip.
			if old.File == r.pos.File {
				ld.c.add(r.pos, "combine", "%s listed twice (also at %s)", id, old)
			}
			continue
		}
		if _, ok := sameSolvent(a.Solvent, d.Solvent); !ok {
			ld.c.add(r.pos, "combine", "%s: acid is in %s and reductant in %s; a combined donor needs one solvent", id, a.Solvent.Name, d.Solvent.Name)
			continue
		}
		if len(seen) >= MaxCombined {
			ld.c.add(r.pos, "combine", "more than %d combined donors; hatsieve forms at most %d", MaxCombined, MaxCombined)
			return
		}
		seen[id] = r.pos
		ld.combine(a, d, r.pos)
	}
	ld.expandRules(ld.rules, seen, len(seen))
}

// expandRules forms the pairs each rule selects that are not in seen yet.
// Before a rule is expanded its pair count is added to formed, so the
// total stays under MaxCombined whatever the rules overlap.
func (ld *loader) expandRules(rules []combineRule, seen map[string]Pos, formed int) {
	var acidTags map[string][]*Acid
	var redTags map[string][]*Reductant
	for _, r := range rules {
		if len(r.acidTags) > 0 && acidTags == nil {
			acidTags = tagIndex(ld.lib.Acids, func(a *Acid) []string { return a.Tags })
		}
		if len(r.redTags) > 0 && redTags == nil {
			redTags = tagIndex(ld.lib.Reductants, func(d *Reductant) []string { return d.Tags })
		}
		as, ok1 := selectSet(ld, r.pos, "acid", r.acids, r.acidTags, ld.lib.Acids, ld.acids, acidTags)
		ds, ok2 := selectSet(ld, r.pos, "reductant", r.reds, r.redTags, ld.lib.Reductants, ld.reductants, redTags)
		if !ok1 || !ok2 {
			continue
		}
		n := countPairs(as, ds)
		if formed+n > MaxCombined {
			ld.c.add(r.pos, "combine", "this rule selects %d acids and %d reductants, %d combined donors, beyond the %d hatsieve forms in all: name fewer, or select by tags",
				len(as), len(ds), n, MaxCombined)
			return
		}
		formed += n
		for _, a := range as {
			for _, d := range ds {
				if _, ok := sameSolvent(a.Solvent, d.Solvent); !ok {
					continue
				}
				id := a.ID + "+" + d.ID
				if _, dup := seen[id]; dup {
					continue
				}
				seen[id] = r.pos
				p := r.pos
				if p.File == "" {
					p = a.Pos
				}
				ld.combine(a, d, p)
			}
		}
	}
}

// selectSet returns the entries a rule names by id (or "all") and by tag,
// each once, in library order. An unknown id or a tag that no entry has is
// reported.
func selectSet[T any](ld *loader, p Pos, what string, ids, tags []string, all []*T, byID map[string]*T, byTag map[string][]*T) ([]*T, bool) {
	if slices.ContainsFunc(ids, func(s string) bool { return strings.EqualFold(s, combineAllWord) }) {
		return all, true
	}
	ok := true
	var out []*T
	in := map[*T]bool{}
	add := func(x *T) {
		if !in[x] {
			in[x] = true
			out = append(out, x)
		}
	}
	for _, id := range ids {
		x, found := byID[id]
		if !found {
			ld.c.add(p, "combine", "unknown %s %q%s", what, id, suggest(id, keys(byID)))
			ok = false
			continue
		}
		add(x)
	}
	for _, t := range tags {
		xs := byTag[t]
		if len(xs) == 0 {
			ld.c.add(p, "combine", "no %s has the tag %q", what, t)
			ok = false
		}
		for _, x := range xs {
			add(x)
		}
	}
	return out, ok
}

func tagIndex[T any](all []*T, tags func(*T) []string) map[string][]*T {
	m := map[string][]*T{}
	for _, x := range all {
		for _, t := range tags(x) {
			m[t] = append(m[t], x)
		}
	}
	return m
}

// countPairs is how many acid × reductant pairs share a solvent (an entry
// with no solvent takes the working one and meets every other), counted by
// solvent so a large file costs one pass over each side.
func countPairs(as []*Acid, ds []*Reductant) int {
	acidBy := map[*thermo.Solvent]int{}
	for _, a := range as {
		acidBy[a.Solvent]++
	}
	redBy := map[*thermo.Solvent]int{}
	for _, d := range ds {
		redBy[d.Solvent]++
	}
	n := acidBy[nil]*len(ds) + len(as)*redBy[nil] - acidBy[nil]*redBy[nil]
	for s, k := range acidBy {
		if s != nil {
			n += k * redBy[s]
		}
	}
	return n
}

// putAcid adds an acid, or replaces one of the same id read from an earlier
// file: a user file's acid overrides the embedded one. The same id twice in
// one file is reported.
func (ld *loader) putAcid(a *Acid, idPos Pos) {
	putReagent(ld, &ld.lib.Acids, ld.acids, a, a.ID, idPos, "acid", func(x *Acid) Pos { return x.Pos })
}

// putReductant is putAcid for reductants.
func (ld *loader) putReductant(r *Reductant, idPos Pos) {
	putReagent(ld, &ld.lib.Reductants, ld.reductants, r, r.ID, idPos, "reductant", func(x *Reductant) Pos { return x.Pos })
}

// putReagent adds x to list and byID, replacing an entry of the same id
// from an earlier file; the same id twice in one file is reported.
func putReagent[T comparable](ld *loader, list *[]T, byID map[string]T, x T, id string, idPos Pos, what string, posOf func(T) Pos) {
	old, dup := byID[id]
	switch {
	case !dup:
		*list = append(*list, x)
	case posOf(old).File == posOf(x).File:
		ld.c.add(idPos, "id", "duplicate %s id %q: also at %s", what, id, posOf(old))
		return
	default:
		(*list)[slices.Index(*list, old)] = x
	}
	byID[id] = x
}

// ReagentFiles returns the embedded acids and reductants (library/acids.yaml
// and library/reductants.yaml) to load ahead of a user's files: a later
// file's acid or reductant of the same id overrides the embedded one.
func ReagentFiles() []File {
	var out []File
	for _, f := range DefaultFiles() {
		switch f.Name {
		case EmbeddedPrefix + "acids.yaml", EmbeddedPrefix + "reductants.yaml":
			out = append(out, f)
		}
	}
	return out
}

// ReagentsIn returns the acids and the reductants usable in solvent s: those
// measured in s and those that name no solvent (taken in the working one).
func (l *Library) ReagentsIn(s *thermo.Solvent) ([]*Acid, []*Reductant) {
	var as []*Acid
	for _, a := range l.Acids {
		if a.Solvent == nil || a.Solvent == s {
			as = append(as, a)
		}
	}
	var ds []*Reductant
	for _, d := range l.Reductants {
		if d.Solvent == nil || d.Solvent == s {
			ds = append(ds, d)
		}
	}
	return as, ds
}

// DeliveryWindow runs thermo.DeliveryWindow for acceptor a over every acid
// and reductant of the library usable in s (ReagentsIn), whatever the
// combine lists say. The rows' Acid and Reductant indices point into the
// slices returned beside the window.
func (l *Library) DeliveryWindow(a *thermo.Resolved, s *thermo.Solvent, c thermo.Conditions, o thermo.WindowOptions) (thermo.Window, []*Acid, []*Reductant, error) {
	as, ds := l.ReagentsIn(s)
	if n := len(as) * len(ds); n > MaxWindowCombinations {
		return thermo.Window{}, nil, nil, fmt.Errorf("%d acids × %d reductants in %s make %d combinations; the window weighs at most %d (load fewer)",
			len(as), len(ds), s.Name, n, MaxWindowCombinations)
	}
	wa := make([]thermo.WindowAcid, len(as))
	for i, x := range as {
		wa[i] = thermo.WindowAcid{ID: x.ID, PKa: x.PKa}
	}
	wd := make([]thermo.WindowReductant, len(ds))
	for i, x := range ds {
		wd[i] = thermo.WindowReductant{ID: x.ID, E: x.E}
	}
	w, err := thermo.DeliveryWindow(a, s, wa, wd, c, o)
	return w, as, ds, err
}

// StatusInvented is the status of the demo scenario's made-up entries.
const StatusInvented = "invented"

// WithoutInvented returns l without its invented acids and reductants (the
// demo scenario's), and how many it left out. A published acceptor's
// delivery window is weighed with published reagents only, so that an
// invented electrode or acid never heads the list beside real ones; the
// demo's own acceptors keep every reagent. The couples are shared.
func (l *Library) WithoutInvented() (*Library, int) {
	out := *l
	out.Acids, out.Reductants = nil, nil
	for _, a := range l.Acids {
		if a.Status != StatusInvented {
			out.Acids = append(out.Acids, a)
		}
	}
	for _, d := range l.Reductants {
		if d.Status != StatusInvented {
			out.Reductants = append(out.Reductants, d)
		}
	}
	return &out, len(l.Acids) + len(l.Reductants) - len(out.Acids) - len(out.Reductants)
}
