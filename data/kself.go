package data

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/hatsieve/hatsieve/thermo"
)

// Self-exchange rate constants (k_self, FORMAT.md). A couple may carry its
// own:
//
//	k_self: 4.7                      # M⁻¹ s⁻¹; source and status: the couple's
//	k_self: "4.7 M-1 s-1"
//	k_self: {value: 4.7, factor: 2, source: ..., status: ..., note: ...}
//
// and any file may give them for couples defined in any file loaded with
// it, in a top-level list keyed by couple id:
//
//	k_self:
//	  - {couple: tempo-h, value: 4.7, factor: 2, source: ..., status: ...}

// kselfKeys are the fields of a k_self mapping; kselfListKeys those of an
// item of the top-level list.
var (
	kselfKeys     = []string{"value", "factor", "source", "status", "note"}
	kselfListKeys = []string{"couple", "value", "factor", "source", "status", "note"}
)

// coupleKeys are the fields of a YAML couple: CoupleFields (which are also
// the CSV columns) and k_self.
var coupleKeys = append(CoupleFields[:len(CoupleFields):len(CoupleFields)], "k_self")

// kselfReq is one item of a top-level k_self list, linked to its couple
// once every file is read.
type kselfReq struct {
	couple string
	k      thermo.SelfExchange
	pos    Pos
}

// kselfUnits are the ways of writing M⁻¹ s⁻¹ after the number.
var kselfUnits = []string{"M-1 s-1", "M^-1 s^-1", "M⁻¹ s⁻¹", "M−1 s−1", "/M/s", "L mol-1 s-1"}

// ParseRateConstant reads a self-exchange rate constant in M⁻¹ s⁻¹: a
// number, optionally followed by the unit ("4.7", "4.7e3 M-1 s-1"). It
// must lie above 0 and below Z = 10^11 M⁻¹ s⁻¹, the collision frequency of
// the cross relation.
func ParseRateConstant(s string) (float64, error) {
	t := strings.TrimSpace(s)
	for _, u := range kselfUnits {
		if r, ok := strings.CutSuffix(t, u); ok {
			t = strings.TrimSpace(r)
			break
		}
	}
	v, err := strconv.ParseFloat(strings.ReplaceAll(t, "−", "-"), 64)
	if err != nil {
		return 0, fmt.Errorf("%q: want a rate constant in M⁻¹ s⁻¹, e.g. 4.7 or \"4.7e3 M-1 s-1\"", s)
	}
	if !(v > 0) || v >= thermo.CollisionZ || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q: a self-exchange rate constant lies above 0 and below 1e11 M⁻¹ s⁻¹ (the collision frequency Z)", s)
	}
	return v, nil
}

// yamlKSelf reads a couple's k_self field; source and status default to
// the couple's.
func (ld *loader) yamlKSelf(file string, n *yaml.Node, source, status string) (*thermo.SelfExchange, bool) {
	p := pos(file, n)
	if n.Kind == yaml.ScalarNode {
		if isNull(n) {
			ld.c.add(p, "k_self", "empty value: give a rate constant or leave the field out")
			return nil, false
		}
		v, err := ParseRateConstant(n.Value)
		if err != nil {
			ld.c.add(p, "k_self", "%v", err)
			return nil, false
		}
		return &thermo.SelfExchange{K: v, Source: source, Status: status}, true
	}
	if n.Kind != yaml.MappingNode {
		ld.c.add(p, "k_self", "want a rate constant or {value, factor, source, status}, not a %s", kindName(n))
		return nil, false
	}
	k, ok := ld.kselfFields(file, n, ld.fields(file, n, kselfKeys))
	if k.Source == "" {
		k.Source = source
	}
	if k.Status == "" {
		k.Status = status
	}
	return &k, ok
}

// kselfFields reads value, factor, source, status and note of a k_self
// mapping.
func (ld *loader) kselfFields(file string, n *yaml.Node, f map[string]*yaml.Node) (thermo.SelfExchange, bool) {
	var k thermo.SelfExchange
	p := pos(file, n)
	ok := true
	vn, has := f["value"]
	if !has {
		ld.c.add(p, "k_self", "a k_self mapping needs value (M⁻¹ s⁻¹)")
		ok = false
	} else if t, good := ld.text(file, vn, "k_self.value"); good {
		v, err := ParseRateConstant(t)
		if err != nil {
			ld.c.add(pos(file, vn), "k_self.value", "%v", err)
			ok = false
		}
		k.K = v
	} else {
		ok = false
	}
	if fn, has := f["factor"]; has {
		t, good := ld.text(file, fn, "k_self.factor")
		v, err := strconv.ParseFloat(t, 64)
		if !good || err != nil || !(v >= 1) || math.IsInf(v, 0) {
			ld.c.add(pos(file, fn), "k_self.factor", "%q: want the uncertainty as a factor, 1 or more (k within ×/÷ factor)", t)
			ok = false
		}
		k.Factor = v
	}
	k.Source, _ = ld.text(file, f["source"], "k_self.source")
	k.Note, _ = ld.text(file, f["note"], "k_self.note")
	if sn, has := f["status"]; has {
		t, _ := ld.text(file, sn, "k_self.status")
		k.Status = ld.status(pos(file, sn), "k_self.status", t)
	}
	return k, ok
}

// yamlKSelfList reads the items of a top-level k_self list.
func (ld *loader) yamlKSelfList(file string, n *yaml.Node) {
	for _, it := range ld.seq(file, n, "k_self") {
		p := pos(file, it)
		if it.Kind != yaml.MappingNode {
			ld.c.add(p, "k_self", "each item is a mapping {couple, value, source, status}")
			continue
		}
		f := ld.fields(file, it, kselfListKeys)
		id, _ := ld.text(file, f["couple"], "couple")
		k, ok := ld.kselfFields(file, it, f)
		if id == "" {
			ld.c.add(p, "couple", "missing: which couple (its id) this k_self is for")
			ok = false
		}
		if k.Source == "" {
			ld.c.add(p, "source", "missing: a k_self in a list needs its source")
			ok = false
		}
		if ok {
			ld.kselfs = append(ld.kselfs, kselfReq{id, k, p})
		}
	}
}

// linkKSelf gives the couples the constants of the top-level lists. A
// couple that already has one (its own field or an earlier item) is
// reported, as is an id no file defines.
func (ld *loader) linkKSelf() {
	from := map[string]Pos{}
	for _, r := range ld.kselfs {
		c, ok := ld.couples[r.couple]
		if !ok {
			ld.c.add(r.pos, "couple", "k_self for %q: no couple has this id%s", r.couple, suggest(r.couple, keys(ld.couples)))
			continue
		}
		if c.KSelf != nil {
			at, listed := from[r.couple]
			if !listed {
				at = c.Pos
			}
			ld.c.add(r.pos, "couple", "k_self for %s given twice (also at %s)", r.couple, at)
			continue
		}
		k := r.k
		c.KSelf = &k
		from[r.couple] = r.pos
	}
}
