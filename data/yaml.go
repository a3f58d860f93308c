package data

import (
	"errors"
	"fmt"
	"io"
	"regexp"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/hatsieve/hatsieve/thermo"
)

// yamlDoc is one parsed file on its way through the loader.
type yamlDoc struct {
	file string
	root *yaml.Node
	top  map[string]*yaml.Node
	csv  []byte    // set instead of root for a CSV file
	runs *yamlRuns // set when the couples are read in runs
}

var topKeys = []string{"format", "title", "solvent", "solvents", "couples", "acids", "reductants", "combine", "series", "k_self"}

var lineRE = regexp.MustCompile(`line (\d+)`)

// parseYAML parses a file into a node tree. The parser's own errors become
// one issue with the line it names; a parser panic is caught. A large file
// of the usual shape is parsed here but for its couples, which are parsed
// in runs as they are read (yaml_runs.go).
func (ld *loader) parseYAML(f File, runs bool) (d *yamlDoc) {
	if runs {
		if d := parseYAMLRuns(f); d != nil {
			return d
		}
	}
	doc, err := decodeYAML(f.Data)
	if err != nil {
		if err == io.EOF {
			ld.c.add(Pos{File: f.Name}, "", "empty file: no library in it")
			return nil
		}
		msg := strings.TrimPrefix(err.Error(), "yaml: ")
		p := Pos{File: f.Name}
		if m := lineRE.FindStringSubmatch(msg); m != nil {
			p.Line, _ = strconv.Atoi(m[1])
			msg = strings.TrimPrefix(strings.Replace(msg, m[0], "", 1), ": ")
		}
		ld.c.add(p, "syntax", "%s", msg)
		return nil
	}
	root := doc
	if root.Kind == yaml.DocumentNode {
		if len(root.Content) == 0 {
			ld.c.add(Pos{File: f.Name}, "", "empty file: no library in it")
			return nil
		}
		root = root.Content[0]
	}
	if root.Kind != yaml.MappingNode {
		ld.c.add(Pos{File: f.Name, Line: root.Line}, "", "not a library: want a mapping that starts with \"format: %s\"", Format)
		return nil
	}
	return &yamlDoc{file: f.Name, root: root}
}

func pos(file string, n *yaml.Node) Pos { return Pos{File: file, Line: n.Line} }

// fields reads a mapping: it reports keys that are not text, given twice or
// unknown (with the nearest known key), and aliases, which are not followed.
func (ld *loader) fields(file string, n *yaml.Node, known []string) map[string]*yaml.Node {
	out := make(map[string]*yaml.Node, len(n.Content)/2)
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if k.Kind != yaml.ScalarNode {
			ld.c.add(pos(file, k), "", "a key must be a plain name")
			continue
		}
		key := k.Value
		if !containsStr(known, key) {
			msg := fmt.Sprintf("unknown key%s; known here: %s", suggest(strings.ToLower(key), known), strings.Join(known, ", "))
			ld.c.add(pos(file, k), key, "%s", msg)
			continue
		}
		if _, dup := out[key]; dup {
			ld.c.add(pos(file, k), key, "given twice (also at line %d)", keptKeyLine(n, key))
			continue
		}
		if v.Kind == yaml.AliasNode || k.Kind == yaml.AliasNode {
			ld.c.add(pos(file, v), key, "aliases (*name) are not supported; write the value out")
			continue
		}
		out[key] = v
	}
	return out
}

// keptKeyLine is the line of the key fields kept: the first that is text
// with a value that is not an alias.
func keptKeyLine(n *yaml.Node, key string) int {
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if k.Kind == yaml.ScalarNode && k.Value == key && v.Kind != yaml.AliasNode {
			return k.Line
		}
	}
	return 0
}

func containsStr(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func isNull(n *yaml.Node) bool { return n.Kind == yaml.ScalarNode && n.Tag == "!!null" }

// text reads a scalar as text; null reads as "".
func (ld *loader) text(file string, n *yaml.Node, field string) (string, bool) {
	if n == nil || isNull(n) {
		return "", true
	}
	if n.Kind == yaml.AliasNode {
		ld.c.add(pos(file, n), field, "aliases (*name) are not supported; write the value out")
		return "", false
	}
	if n.Kind != yaml.ScalarNode {
		ld.c.add(pos(file, n), field, "want text, not a %s", kindName(n))
		return "", false
	}
	return strings.TrimSpace(n.Value), true
}

func kindName(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "mapping"
	case yaml.SequenceNode:
		return "list"
	case yaml.AliasNode:
		return "alias"
	}
	return "value"
}

// list reads a list of text items, or one text with items separated by ';'
// or ','.
func (ld *loader) list(file string, n *yaml.Node, field string) ([]string, bool) {
	if n == nil || isNull(n) {
		return nil, true
	}
	switch n.Kind {
	case yaml.ScalarNode:
		return splitList(n.Value), true
	case yaml.SequenceNode:
		var out []string
		ok := true
		for _, it := range n.Content {
			s, good := ld.text(file, it, field)
			ok = ok && good
			if s != "" {
				out = append(out, s)
			}
		}
		return out, ok
	}
	ld.c.add(pos(file, n), field, "want a list, not a %s", kindName(n))
	return nil, false
}

func splitList(s string) []string {
	if !strings.ContainsAny(s, ";,") {
		// One item (a CSV tags cell, say): the same result, without the split.
		if s = strings.TrimSpace(s); s == "" {
			return nil
		}
		return []string{s}
	}
	var out []string
	for _, p := range strings.FieldsFunc(s, func(r rune) bool { return r == ';' || r == ',' }) {
		if p = strings.TrimSpace(p); p != "" {
			out = append(out, p)
		}
	}
	return out
}

// quantity reads a value: a number, "66.5 ± 0.5", "66.5 +/- 0.5",
// "-1.91 V vs Fc+/Fc", or a mapping {value, sigma} ({value, sigma, vs} for a
// potential). ok is false when nothing usable was given (already reported).
func (ld *loader) quantity(file string, n *yaml.Node, field string, potential bool) (Quantity, bool) {
	p := pos(file, n)
	switch n.Kind {
	case yaml.ScalarNode:
		if isNull(n) {
			ld.c.add(p, field, "empty value: give a number or leave the field out")
			return Quantity{}, false
		}
		q, err := ParseQuantity(n.Value)
		if err != nil {
			if err == errEmpty {
				err = errors.New("empty value: give a number or leave the field out")
			}
			ld.c.add(p, field, "%v", err)
			return q, false
		}
		return q, true
	case yaml.MappingNode:
		known := []string{"value", "sigma"}
		if potential {
			known = append(known, "vs")
		}
		f := ld.fields(file, n, known)
		vn, ok := f["value"]
		if !ok {
			ld.c.add(p, field, "a {value, sigma} mapping needs value")
			return Quantity{}, false
		}
		q, ok := ld.plain(file, vn, field, true)
		if !ok {
			return q, false
		}
		if sn, has := f["sigma"]; has {
			s, ok := ld.plain(file, sn, field+".sigma", false)
			if !ok {
				return q, false
			}
			if s.V < 0 {
				ld.c.add(pos(file, sn), field+".sigma", "uncertainty %g is negative", s.V)
				return q, false
			}
			q.Sigma, q.HasSigma = s.V, true
		}
		if vs, has := f["vs"]; has {
			t, ok := ld.text(file, vs, field+".vs")
			if !ok {
				return q, false
			}
			q.Vs = t
		}
		return q, true
	}
	ld.c.add(p, field, "want a number, \"66.5 ± 0.5\" or {value, sigma}, not a %s", kindName(n))
	return Quantity{}, false
}

// plain reads one number inside a {value, sigma} mapping; unit allows "V"
// or "kcal/mol" after it.
func (ld *loader) plain(file string, n *yaml.Node, field string, unit bool) (Quantity, bool) {
	if n.Kind != yaml.ScalarNode || isNull(n) {
		ld.c.add(pos(file, n), field, "want a number")
		return Quantity{}, false
	}
	q, err := ParseQuantity(n.Value)
	if err == nil && (q.HasSigma || q.Vs != "" || (!unit && q.Unit != "")) {
		err = fmt.Errorf("%q: want a plain number here", n.Value)
	}
	if err != nil {
		if err == errEmpty {
			err = errors.New("empty value")
		}
		ld.c.add(pos(file, n), field, "%v", err)
		return q, false
	}
	return q, true
}

// seq returns the items of a list field, reporting anything else.
func (ld *loader) seq(file string, n *yaml.Node, field string) []*yaml.Node {
	if isNull(n) {
		return nil
	}
	if n.Kind != yaml.SequenceNode {
		ld.c.add(pos(file, n), field, "want a list (lines starting with \"- \"), not a %s", kindName(n))
		return nil
	}
	return n.Content
}

// header reads format and title.
func (ld *loader) header(d *yamlDoc) {
	d.top = ld.fields(d.file, d.root, topKeys)
	fn, ok := d.top["format"]
	if !ok {
		ld.c.add(Pos{File: d.file, Line: d.root.Line}, "format", "missing: a library starts with \"format: %s\"", Format)
	} else if f, ok := ld.text(d.file, fn, "format"); ok && f != Format {
		if strings.HasPrefix(f, "hatsieve/") {
			ld.c.add(pos(d.file, fn), "format", "unsupported format version %q: this hatsieve reads %s", f, Format)
		} else {
			ld.c.add(pos(d.file, fn), "format", "%q is not a hatsieve library format: want %s", f, Format)
		}
	}
	if tn, ok := d.top["title"]; ok {
		if t, ok := ld.text(d.file, tn, "title"); ok && t != "" {
			ld.lib.Titles = append(ld.lib.Titles, t)
		}
	}
}

var solventKeys = []string{"name", "aliases", "ref", "c_g_2010", "c_g_2022", "e_h2", "h2_line", "fc_vs_sce", "ch", "cross_sigma", "source", "note"}

// solventsOf adds or overrides the file's own solvents.
func (ld *loader) solventsOf(d *yamlDoc) {
	n, ok := d.top["solvents"]
	if !ok {
		return
	}
	for _, it := range ld.seq(d.file, n, "solvents") {
		ld.yamlSolvent(d.file, it)
	}
}

func (ld *loader) yamlSolvent(file string, n *yaml.Node) {
	p := pos(file, n)
	if n.Kind != yaml.MappingNode {
		ld.c.add(p, "solvents", "each solvent is a mapping with name, c_g_2022, ..., source")
		return
	}
	f := ld.fields(file, n, solventKeys)
	name, _ := ld.text(file, f["name"], "name")
	if name == "" {
		ld.c.add(p, "name", "missing: a solvent needs a name")
		return
	}
	src, _ := ld.text(file, f["source"], "source")
	if src == "" {
		ld.c.add(p, "source", "missing: solvent %s needs a source for its values", name)
	}
	var s *thermo.Solvent
	override := false
	if old, err := ld.lib.Solvents.Lookup(name); err == nil {
		cp := *old
		cp.Offsets = map[thermo.Electrode]thermo.Number{}
		for k, v := range old.Offsets {
			cp.Offsets[k] = v
		}
		s, override = &cp, true
	} else {
		s = &thermo.Solvent{Key: strings.ToLower(name), Name: name, Ref: thermo.Fc, CrossSigma: thermo.DefaultCrossSigma,
			Offsets: map[thermo.Electrode]thermo.Number{}}
	}
	num := func(key string, k Kind, lo, hi float64) *thermo.Number {
		return ld.solventNumber(file, f, key, k, lo, hi, s, src)
	}
	if rn, ok := f["ref"]; ok {
		ld.solventRef(file, rn, s, override)
	}
	if al, ok := ld.list(file, f["aliases"], "aliases"); ok && al != nil {
		s.Aliases = al
	}
	if v := num("c_g_2010", KindEnergy, 0, 150); v != nil {
		s.CG2010 = v
	}
	if v := num("c_g_2022", KindEnergy, 0, 150); v != nil {
		s.CG2022 = v
	}
	if v := num("h2_line", KindEnergy, 0, 150); v != nil {
		s.GH = v
	}
	if v := num("ch", KindEnergy, 0, 150); v != nil {
		s.CH = v
	}
	if v := num("e_h2", KindPotential, MinE, MaxE); v != nil {
		s.EH2 = v
	}
	if v := num("cross_sigma", KindPlain, 0, 10); v != nil {
		s.CrossSigma = v.V
	}
	if v := num("fc_vs_sce", KindPotential, -2, 2); v != nil {
		if s.Ref != thermo.Fc {
			ld.c.add(pos(file, f["fc_vs_sce"]), "fc_vs_sce", "applies to a solvent whose ref is Fc+/Fc")
		} else {
			setFcVsSCE(s, v, src)
		}
	}
	if !override {
		referenceOffsets(s)
		if s.CG2010 == nil && s.CG2022 == nil && s.GH == nil {
			ld.c.add(p, "c_g_2022", "solvent %s is new: give c_g_2022 (or c_g_2010), or h2_line for a phase with no C_G", name)
		}
	}
	if nt, ok := ld.text(file, f["note"], "note"); ok && nt != "" {
		s.Note = nt
	}
	ld.lib.Solvents.Put(s)
}

// solventNumber reads the value of key in a solvent's fields f, of kind k
// and within lo to hi; nil when it is not given or a problem was reported.
func (ld *loader) solventNumber(file string, f map[string]*yaml.Node, key string, k Kind, lo, hi float64, s *thermo.Solvent, src string) *thermo.Number {
	vn, ok := f[key]
	if !ok {
		return nil
	}
	q, ok := ld.quantity(file, vn, key, k == KindPotential)
	if !ok {
		return nil
	}
	q, err := checkQuantity(q, k)
	if err == nil && q.Vs != "" {
		switch e, perr := thermo.ParseElectrode(q.Vs); {
		case key != "e_h2":
			err = fmt.Errorf("%s is a difference of potentials and takes no electrode", key)
		case perr != nil:
			err = perr
		case e != s.Ref:
			err = fmt.Errorf("give e_h2 vs the solvent's reference electrode, %v (got %v)", s.Ref, e)
		}
	}
	if err == nil && (q.V < lo || q.V > hi) {
		err = fmt.Errorf("%g is outside %g to %g", q.V, lo, hi)
	}
	if err != nil {
		ld.c.add(pos(file, vn), key, "%v", err)
		return nil
	}
	return &thermo.Number{V: q.V, Sigma: q.Sigma, Source: src, Status: thermo.UserGiven}
}

// solventRef reads the electrode a solvent's C_G refers to; an override of
// a known solvent cannot change it.
func (ld *loader) solventRef(file string, rn *yaml.Node, s *thermo.Solvent, override bool) {
	if r, ok := ld.text(file, rn, "ref"); ok && r != "" {
		if e, ok := ld.electrode(pos(file, rn), "ref", r); ok {
			if override && e != s.Ref {
				ld.c.add(pos(file, rn), "ref", "solvent %s already refers its C_G to %v; an override cannot change it", s.Name, s.Ref)
			}
			s.Ref = e
		}
	}
}

// referenceOffsets gives a new solvent referred to NHE or SCE the offsets
// of the other aqueous reference electrodes.
func referenceOffsets(s *thermo.Solvent) {
	switch s.Ref {
	case thermo.NHE:
		s.Offsets[thermo.SCE] = thermo.Number{V: 0.241, Source: "CRC Handbook", Status: thermo.Checked}
		s.Offsets[thermo.AgCl] = thermo.Number{V: 0.197, Source: "CRC Handbook", Status: thermo.Checked}
	case thermo.SCE:
		s.Offsets[thermo.NHE] = thermo.Number{V: -0.241, Source: "CRC Handbook", Status: thermo.Checked}
		s.Offsets[thermo.AgCl] = thermo.Number{V: -0.044, Source: "CRC Handbook", Status: thermo.Checked}
	}
}

// setFcVsSCE sets the offsets of a solvent referred to Fc+/Fc from the
// potential of Fc+/Fc vs SCE in it.
func setFcVsSCE(s *thermo.Solvent, v *thermo.Number, src string) {
	const sceVsNHE, agclVsNHE = 0.241, 0.197 // CRC Handbook, as in thermo.Builtin
	n := func(x float64) thermo.Number {
		return thermo.Number{V: x, Sigma: v.Sigma, Source: src, Status: thermo.UserGiven}
	}
	s.Offsets[thermo.SCE] = n(-v.V)
	s.Offsets[thermo.NHE] = n(-v.V - sceVsNHE)
	s.Offsets[thermo.AgCl] = n(-v.V - sceVsNHE + agclVsNHE)
}

// body reads the default solvent, acids, reductants, couples, combine and
// series of one file. It returns false when a run of couples did not parse
// on its own (the load is then done again, every file parsed whole).
func (ld *loader) body(d *yamlDoc) bool {
	var def *thermo.Solvent
	if sn, ok := d.top["solvent"]; ok {
		if name, ok := ld.text(d.file, sn, "solvent"); ok && name != "" {
			if s, ok := ld.solvent(pos(d.file, sn), "solvent", name); ok {
				def = s
				if ld.lib.DefaultSolvent == "" {
					ld.lib.DefaultSolvent = s.Key
				}
			}
		}
	}
	if n, ok := d.top["acids"]; ok {
		for _, it := range ld.seq(d.file, n, "acids") {
			ld.yamlAcid(d.file, it, def)
		}
	}
	if n, ok := d.top["reductants"]; ok {
		for _, it := range ld.seq(d.file, n, "reductants") {
			ld.yamlReductant(d.file, it, def)
		}
	}
	if n, ok := d.top["couples"]; ok && d.runs != nil && n == d.runs.seq {
		if !ld.runCouples(d, def) {
			return false
		}
	} else if ok {
		for _, it := range ld.seq(d.file, n, "couples") {
			ld.yamlCouple(d.file, it, def)
		}
	}
	if n, ok := d.top["combine"]; ok {
		ld.combineGiven = true
		for _, it := range ld.seq(d.file, n, "combine") {
			ld.yamlCombine(d.file, it)
		}
	}
	if n, ok := d.top["series"]; ok {
		for _, it := range ld.seq(d.file, n, "series") {
			ld.yamlSeries(d.file, it)
		}
	}
	if n, ok := d.top["k_self"]; ok {
		ld.yamlKSelfList(d.file, n)
	}
	return true
}

// entry holds the fields every kind of entry shares.
type entry struct {
	id, name, source, status, note string
	tags                           []string
	solvent                        *thermo.Solvent
	ok                             bool
}

func (ld *loader) entry(file string, n *yaml.Node, f map[string]*yaml.Node, what string, def *thermo.Solvent) entry {
	e := entry{solvent: def, ok: true}
	p := pos(file, n)
	var ok bool
	if e.id, ok = ld.text(file, f["id"], "id"); ok {
		ip := p
		if idn := f["id"]; idn != nil {
			ip = pos(file, idn)
		}
		e.ok = ld.checkID(ip, "id", e.id)
	} else {
		e.ok = false
	}
	e.name, _ = ld.text(file, f["name"], "name")
	e.source, _ = ld.text(file, f["source"], "source")
	e.note, _ = ld.text(file, f["note"], "note")
	e.tags, _ = ld.list(file, f["tags"], "tags")
	if sn, has := f["status"]; has {
		if s, ok := ld.text(file, sn, "status"); ok {
			e.status = ld.status(pos(file, sn), "status", s)
		}
	}
	// Text that repeats from entry to entry (a source, a status, tags) is
	// kept once, as the CSV reader keeps it: a large library then holds a
	// third less.
	e.source, e.status = ld.mem.intern(e.source), ld.mem.intern(e.status)
	for i, t := range e.tags {
		e.tags[i] = ld.mem.intern(t)
	}
	if sn, has := f["solvent"]; has {
		if name, ok := ld.text(file, sn, "solvent"); ok && name != "" {
			s, ok := ld.solvent(pos(file, sn), "solvent", name)
			if !ok {
				e.ok = false
			}
			e.solvent = s
		}
	}
	return e
}

var acidKeys = []string{"id", "name", "bond", "pka", "solvent", "source", "status", "tags", "note"}

func (ld *loader) yamlAcid(file string, n *yaml.Node, def *thermo.Solvent) {
	if n.Kind != yaml.MappingNode {
		ld.c.add(pos(file, n), "acids", "each acid is a mapping with id, pka, ...")
		return
	}
	f := ld.fields(file, n, acidKeys)
	e := ld.entry(file, n, f, "acid", def)
	a := &Acid{ID: e.id, Name: e.name, Solvent: e.solvent, Source: e.source, Status: e.status, Tags: e.tags, Note: e.note, Pos: pos(file, n)}
	a.Bond, _ = ld.text(file, f["bond"], "bond")
	pn, ok := f["pka"]
	if !ok {
		ld.c.add(a.Pos, "pka", "missing: acid %s needs its pka", a.ID)
		return
	}
	q, ok := ld.quantity(file, pn, "pka", false)
	if !ok {
		return
	}
	v := ld.pka(pos(file, pn), "pka", q)
	if v == nil || !e.ok {
		return
	}
	a.PKa = *v
	ld.putAcid(a, pos(file, f["id"]))
}

var reductantKeys = []string{"id", "name", "e0", "solvent", "source", "status", "tags", "note"}

func (ld *loader) yamlReductant(file string, n *yaml.Node, def *thermo.Solvent) {
	if n.Kind != yaml.MappingNode {
		ld.c.add(pos(file, n), "reductants", "each reductant is a mapping with id, e0, ...")
		return
	}
	f := ld.fields(file, n, reductantKeys)
	e := ld.entry(file, n, f, "reductant", def)
	r := &Reductant{ID: e.id, Name: e.name, Solvent: e.solvent, Source: e.source, Status: e.status, Tags: e.tags, Note: e.note, Pos: pos(file, n)}
	en, ok := f["e0"]
	if !ok {
		ld.c.add(r.Pos, "e0", "missing: reductant %s needs its potential e0", r.ID)
		return
	}
	q, ok := ld.quantity(file, en, "e0", true)
	if !ok {
		return
	}
	pot := ld.potential(pos(file, en), "e0", q, r.Solvent)
	if pot == nil || !e.ok {
		return
	}
	r.E = *pot
	ld.putReductant(r, pos(file, f["id"]))
}

// CoupleFields are the fields of a couple, in the order files and exports
// list them.
var CoupleFields = []string{"id", "name", "bond", "roles", "solvent", "bdfe", "basis", "bde", "pka", "e_anion", "pka_cation", "e_cation", "source", "status", "tags", "note", "ph", "e_pcet"}

func (ld *loader) yamlCouple(file string, n *yaml.Node, def *thermo.Solvent) {
	if n.Kind != yaml.MappingNode {
		ld.c.add(pos(file, n), "couples", "each couple is a mapping with id, bdfe or pka/e_anion, ...")
		return
	}
	before := ld.c.count(file)
	f := ld.fields(file, n, coupleKeys)
	e := ld.entry(file, n, f, "couple", def)
	c := &Couple{Source: e.source, Status: e.status, Tags: e.tags, Note: e.note, Pos: pos(file, n)}
	c.ID, c.Name, c.Solvent, c.Roles = e.id, e.name, e.solvent, thermo.RoleBoth
	c.Bond, _ = ld.text(file, f["bond"], "bond")
	// A misspelt key already reported leaves the couple out, so that its
	// missing value is not reported a second time.
	ok := e.ok && ld.c.count(file) == before
	if rn, has := f["roles"]; has {
		parts, good := ld.list(file, rn, "roles")
		r, good2 := ld.roles(pos(file, rn), "roles", parts)
		ok = ok && good && good2
		c.Roles = r
	}
	if bn, has := f["basis"]; has {
		if t, good := ld.text(file, bn, "basis"); good {
			b, good := ld.basis(pos(file, bn), "basis", t)
			ok = ok && good
			c.In.BDFEBasis, c.In.BasisGiven = b, good
		}
	}
	val := func(key string, k Kind) (*thermo.Value, *thermo.Potential) {
		vn, has := f[key]
		if !has {
			return nil, nil
		}
		q, good := ld.quantity(file, vn, key, k == KindPotential)
		if !good {
			ok = false
			return nil, nil
		}
		p := pos(file, vn)
		switch k {
		case KindEnergy:
			v := ld.energy(p, key, q)
			ok = ok && v != nil
			return v, nil
		case KindPKa:
			v := ld.pka(p, key, q)
			ok = ok && v != nil
			return v, nil
		}
		pot := ld.potential(p, key, q, c.Solvent)
		ok = ok && pot != nil
		return nil, pot
	}
	c.In.BDFE, _ = val("bdfe", KindEnergy)
	c.In.BDE, _ = val("bde", KindEnergy)
	c.In.PKa, _ = val("pka", KindPKa)
	_, c.In.EAnion = val("e_anion", KindPotential)
	c.In.PKaCation, _ = val("pka_cation", KindPKa)
	_, c.In.ECation = val("e_cation", KindPotential)
	if kn, has := f["k_self"]; has {
		k, good := ld.yamlKSelf(file, kn, c.Source, c.Status)
		ok = ok && good
		c.KSelf = k
	}
	ph, _ := val("ph", KindPKa)
	c.In.PH = ld.phOf(c.Pos, ph, c.Solvent)
	ok = ok && (ph == nil || c.In.PH != nil)
	_, c.In.EPCET = val("e_pcet", KindPotential)
	if !ok {
		return
	}
	idPos := c.Pos
	if idn := f["id"]; idn != nil {
		idPos = pos(file, idn)
	}
	ld.addCouple(c, idPos)
}

func (ld *loader) yamlCombine(file string, n *yaml.Node) {
	p := pos(file, n)
	switch n.Kind {
	case yaml.ScalarNode:
		if strings.EqualFold(strings.TrimSpace(n.Value), combineAllWord) {
			ld.rules = append(ld.rules, combineRule{acids: []string{combineAllWord}, reds: []string{combineAllWord}, pos: p})
			return
		}
		a, r, ok := strings.Cut(n.Value, "+")
		if !ok || strings.TrimSpace(a) == "" || strings.TrimSpace(r) == "" {
			ld.c.add(p, "combine", "%q: write ACID+REDUCTANT (e.g. bzoh+fc), all, or {acids: [...], reductant_tags: [...]}", n.Value)
			return
		}
		ld.combines = append(ld.combines, combineReq{strings.TrimSpace(a), strings.TrimSpace(r), p})
	case yaml.MappingNode:
		ld.combineMapping(file, n)
	default:
		ld.c.add(p, "combine", "want ACID+REDUCTANT, all, or a mapping {acid, reductant} or {acids, acid_tags, reductants, reductant_tags}, not a %s", kindName(n))
	}
}

var seriesKeys = []string{"id", "name", "steps", "source", "note"}

func (ld *loader) yamlSeries(file string, n *yaml.Node) {
	if n.Kind != yaml.MappingNode {
		ld.c.add(pos(file, n), "series", "each series is a mapping with id and steps")
		return
	}
	f := ld.fields(file, n, seriesKeys)
	s := Series{Pos: pos(file, n)}
	id, ok := ld.text(file, f["id"], "id")
	if !ok || !ld.checkID(s.Pos, "id", id) {
		return
	}
	s.ID = id
	s.Name, _ = ld.text(file, f["name"], "name")
	s.Source, _ = ld.text(file, f["source"], "source")
	s.Note, _ = ld.text(file, f["note"], "note")
	sn, has := f["steps"]
	if !has {
		ld.c.add(s.Pos, "steps", "missing: series %s needs its steps (couple ids, in order)", id)
		return
	}
	steps, ok := ld.list(file, sn, "steps")
	if !ok {
		return
	}
	if len(steps) == 0 {
		ld.c.add(pos(file, sn), "steps", "series %s has no steps", id)
		return
	}
	s.Steps = steps
	if old, dup := ld.series[id]; dup {
		ld.c.add(s.Pos, "id", "duplicate series id %q: also at %s", id, old)
		return
	}
	ld.series[id] = s.Pos
	ld.lib.Series = append(ld.lib.Series, s)
}
