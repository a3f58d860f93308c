package data

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"slices"
	"strings"
	"unicode/utf8"
	"unsafe"

	"github.com/hatsieve/hatsieve/thermo"
)

// CSV import: a header row names the columns, with the same names as the
// couple fields of a YAML library (CoupleFields), plus optional
// <field>_sigma for any number and <field>_vs for a potential. Roles and tags
// are separated by ';'. A spreadsheet saved as CSV (UTF-8, with or without a
// byte-order mark) loads as it is.

const (
	partValue = iota
	partSigma
	partVs
)

type csvColumn struct {
	field int // index in CoupleFields
	part  int
}

var (
	fieldIndex   = map[string]int{}
	numericField = map[string]Kind{
		"bdfe": KindEnergy, "bde": KindEnergy, "pka": KindPKa, "pka_cation": KindPKa,
		"e_anion": KindPotential, "e_cation": KindPotential, "ph": KindPKa, "e_pcet": KindPotential,
	}
)

func init() {
	for i, f := range CoupleFields {
		fieldIndex[f] = i
	}
	// the f* constants below must follow CoupleFields
	if CoupleFields[fNote] != "note" || CoupleFields[fECation] != "e_cation" || CoupleFields[fEPCET] != "e_pcet" || len(CoupleFields) != nFields {
		panic("data: CoupleFields and the f* indices disagree")
	}
}

// csvColumnNames lists every column name the CSV reader knows.
func csvColumnNames() []string {
	names := append([]string(nil), CoupleFields...)
	for _, f := range CoupleFields {
		if k, ok := numericField[f]; ok {
			names = append(names, f+"_sigma")
			if k == KindPotential {
				names = append(names, f+"_vs")
			}
		}
	}
	return names
}

func parseCSVHeader(h string) (csvColumn, bool) {
	h = strings.ToLower(strings.TrimSpace(h))
	if i, ok := fieldIndex[h]; ok {
		return csvColumn{i, partValue}, true
	}
	if base, ok := strings.CutSuffix(h, "_sigma"); ok {
		if _, num := numericField[base]; num {
			return csvColumn{fieldIndex[base], partSigma}, true
		}
	}
	if base, ok := strings.CutSuffix(h, "_vs"); ok {
		if numericField[base] == KindPotential {
			if _, num := numericField[base]; num {
				return csvColumn{fieldIndex[base], partVs}, true
			}
		}
	}
	return csvColumn{}, false
}

// loadCSV reads couples from CSV. It streams the rows and reuses the record
// buffer; a row with the wrong number of cells is reported and skipped.
func (ld *loader) loadCSV(file string, data []byte) {
	ld.mem.views = ld.owned
	defer func() { ld.mem.views = false }()
	data = bytes.TrimPrefix(data, []byte("\uFEFF"))
	r := csv.NewReader(bytes.NewReader(data))
	r.Comma = sniffComma(data)
	r.FieldsPerRecord = -1
	r.ReuseRecord = true
	header, err := r.Read()
	if err != nil {
		ld.csvError(file, err)
		return
	}
	cols := make([]csvColumn, len(header))
	seen := map[csvColumn]string{}
	bad := false
	hp := Pos{File: file, Line: 1}
	for i, h := range header {
		name := strings.TrimSpace(h)
		c, ok := parseCSVHeader(name)
		switch {
		case name == "":
			ld.c.add(hp, fmt.Sprintf("column %d", i+1), "empty column name in the header row")
			bad = true
		case !ok:
			ld.c.add(hp, name, "unknown column%s; known: %s", suggest(strings.ToLower(name), csvColumnNames()), strings.Join(CoupleFields, ", ")+" and <number>_sigma, <potential>_vs")
			bad = true
		default:
			if prev, dup := seen[c]; dup {
				ld.c.add(hp, name, "column given twice (also %q)", prev)
				bad = true
			}
			seen[c] = name
			cols[i] = c
		}
	}
	if _, ok := seen[csvColumn{fieldIndex["id"], partValue}]; !ok && !bad {
		ld.c.add(hp, "id", "missing column: the header row must name an id column")
		bad = true
	}
	if bad {
		return
	}
	// Size the id index and the couple list once: a row is a line or more.
	if rows := bytes.Count(data, []byte{'\n'}); rows > 1024 {
		ld.ids.reserve(ld.lib.Couples, len(ld.lib.Couples)+rows)
		ld.lib.Couples = slices.Grow(ld.lib.Couples, rows)
	}
	start := int(r.InputOffset())
	if body := data[start:]; csvByLines && bytes.IndexByte(body, '"') < 0 && r.Comma < utf8.RuneSelf {
		base := bytes.Count(data[:start], []byte{'\n'})
		if parts := csvParts(body); len(parts) > 1 {
			ld.csvInParts(file, parts, byte(r.Comma), base, len(header), cols, r.Comma == ';')
		} else {
			ld.csvRows(file, body, base, byte(r.Comma), nil, len(header), cols, r.Comma == ';')
		}
		return
	}
	ld.csvRows(file, nil, 0, 0, readerRows(r), len(header), cols, r.Comma == ';')
}

// csvByLines lets a file without quotes be read by lines (csvRows); tests
// turn it off to compare with encoding/csv.
var csvByLines = true

// csvRows reads rows into couples: those of body when next is nil (a file
// without quotes, read by lines from line lineBase+1), else those next
// returns, each row's cells and line. With decimalComma (a file separated
// by ';', as spreadsheets in locales that write 66,5 save it) a comma in a
// number or uncertainty cell is its decimal mark.
//
// A row's cells and the cells by field stay on the stack, and the cells
// are cut from a line here (splitCells only finds where): every cell of
// every column is written for each row (so nothing needs clearing), and
// writes to this function's own stack need no write barrier while the
// collector marks (one through a slice given to another function does).
func (ld *loader) csvRows(file string, body []byte, lineBase int, comma byte, next func() ([]string, int, error), ncols int, cols []csvColumn, decimalComma bool) {
	var cells [3 * nFields]string
	var row [rowCells]string
	var ends [rowCells]int
	at := make([]int, len(cols)) // where each column's cell goes in cells
	for i, c := range cols {
		at[i] = c.part*nFields + c.field
	}
	var numeric []bool // by column: a number or an uncertainty
	if decimalComma {
		numeric = make([]bool, len(cols))
		for i, c := range cols {
			_, num := numericField[CoupleFields[c.field]]
			numeric[i] = num && c.part != partVs
		}
	}
	solvents := map[string]*thermo.Solvent{}
	text, line := unsafe.String(unsafe.SliceData(body), len(body)), lineBase
	for {
		var rec []string
		n := 0 // cells in the row
		if next == nil {
			var l string
			if l, text, line = nextRow(text, line); l == "" {
				return
			}
			n = splitCells(&ends, l, comma)
			start := 0
			for k := range min(n, len(row)) {
				row[k], start = l[start:ends[k]], ends[k]+1
			}
			rec = row[:min(n, len(row))]
		} else {
			var err error
			rec, line, err = next()
			if err == io.EOF {
				return
			}
			if err != nil {
				ld.csvError(file, err)
				return
			}
			n = len(rec)
		}
		if n != ncols {
			ld.c.add(Pos{File: file, Line: line}, "row", "%d cells, the header has %d", n, ncols)
			continue
		}
		blank := true
		for i, cell := range rec {
			if cell = strings.TrimSpace(cell); cell != "" {
				if numeric != nil && numeric[i] {
					cell = strings.ReplaceAll(cell, ",", ".")
				}
				blank = false
			}
			cells[at[i]] = cell
		}
		if blank {
			continue
		}
		ld.csvCouple(Pos{File: file, Line: line}, cells[:], solvents)
	}
}

// rowCells is the most cells of a row that csvRows keeps: a header names
// each of its columns once, so a row that fits the header fits in it.
const rowCells = 3 * nFields

// readerRows returns the rows of r with their lines.
func readerRows(r *csv.Reader) func() ([]string, int, error) {
	return func() ([]string, int, error) {
		rec, err := r.Read()
		if err != nil {
			return nil, 0, err
		}
		line, _ := r.FieldPos(0)
		return rec, line, nil
	}
}

// A file without quotes (the usual export) is read by lines, as
// encoding/csv reads it: one row per line, split at the separator, a CR
// before the line end dropped, empty lines skipped. encoding/csv makes
// every row's cells anew, which triples the time to load 10^5 couples
// (0.38 s against 0.12 s, BenchmarkLoad/csv/100000).
//
// The cells are views of the file's bytes, not of a copy: what a couple
// keeps is copied (see slab.text), unless the bytes are the load's own
// (LoadFiles) and the couples keep views of them; either way the bytes
// must not change while it reads.

// nextRow returns the first line of text that is not empty, without its
// line end (and a CR before it), the text after it and its line number,
// counting on from line; "" at the end of the text.
func nextRow(text string, line int) (l, rest string, at int) {
	for text != "" {
		line++
		if i := strings.IndexByte(text, '\n'); i >= 0 {
			l, text = text[:i], text[i+1:]
		} else {
			l, text = text, ""
		}
		if l = strings.TrimSuffix(l, "\r"); l != "" {
			return l, text, line
		}
	}
	return "", "", line
}

// splitCells finds the cells of line l, split at comma: it puts where
// each one ends (the separator after it, or the end of the line) into
// ends and returns how many cells there are; those past the end of ends
// are counted only. Cell k is l[ends[k-1]+1 : ends[k]], the first
// starting at 0. It writes offsets, not strings: a string written through
// a pointer costs a write barrier while the collector marks.
func splitCells(ends *[rowCells]int, l string, comma byte) int {
	// A byte loop: cells are short, and a call of strings.IndexByte per
	// cell takes longer (105 against 64 ns a row of 14 cells).
	n := 0
	for i := 0; i < len(l); i++ {
		if l[i] == comma {
			if n < len(ends) {
				ends[n] = i
			}
			n++
		}
	}
	if n < len(ends) {
		ends[n] = len(l)
	}
	return n + 1
}

// sniffComma returns the separator of the header row: ',' unless the row
// has none and holds ';' or a tab, as spreadsheets in some locales write.
func sniffComma(data []byte) rune {
	head, _, _ := bytes.Cut(data, []byte{'\n'})
	switch {
	case bytes.IndexByte(head, ',') >= 0:
		return ','
	case bytes.IndexByte(head, ';') >= 0:
		return ';'
	case bytes.IndexByte(head, '\t') >= 0:
		return '\t'
	}
	return ','
}

func (ld *loader) csvError(file string, err error) {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		ld.c.add(Pos{File: file, Line: pe.Line}, "row", "%v", pe.Err)
		return
	}
	ld.c.add(Pos{File: file}, "", "%v", err)
}

// nFields is len(CoupleFields) (checked at init).
const nFields = fEPCET + 1

// Indices into CoupleFields, for the row reader.
const (
	fID = iota
	fName
	fBond
	fRoles
	fSolvent
	fBDFE
	fBasis
	fBDE
	fPKa
	fEAnion
	fPKaCation
	fECation
	fSource
	fStatus
	fTags
	fNote
	fPH
	fEPCET
)

var numericFields = [...]struct {
	idx  int
	kind Kind
}{{fBDFE, KindEnergy}, {fBDE, KindEnergy}, {fPKa, KindPKa}, {fPKaCation, KindPKa}, {fEAnion, KindPotential}, {fECation, KindPotential},
	{fPH, KindPKa}, {fEPCET, KindPotential}}

func (ld *loader) csvCouple(p Pos, cells []string, solvents map[string]*thermo.Solvent) {
	nf := len(CoupleFields)
	id := cells[fID]
	ok := ld.checkID(p, "id", id)
	c := ld.csvText(p, id, cells)
	if name := cells[fSolvent]; name != "" {
		c.Solvent = ld.csvSolvent(p, name, solvents)
		ok = ok && c.Solvent != nil
	}
	if rs := cells[fRoles]; rs != "" {
		r, good := ld.csvRoles(p, rs)
		ok = ok && good
		c.Roles = r
	}
	if b := cells[fBasis]; b != "" {
		bb, good := ld.basis(p, "basis", b)
		ok = ok && good
		c.In.BDFEBasis, c.In.BasisGiven = bb, good
	}
	for _, nfld := range numericFields {
		i := nfld.idx
		f := CoupleFields[i]
		v, sig, vs := cells[i], cells[nf+i], cells[2*nf+i]
		if v == "" {
			if sig != "" || vs != "" {
				ld.c.add(p, f, "has %s_sigma or %s_vs but no value", f, f)
				ok = false
			}
			continue
		}
		q, good := ld.csvQuantity(p, f, v, sig, vs)
		if !good {
			ok = false
			continue
		}
		switch i {
		case fBDFE, fBDE:
			v := ld.energy(p, f, q)
			ok = ok && v != nil
			if i == fBDFE {
				c.In.BDFE = v
			} else {
				c.In.BDE = v
			}
		case fPKa, fPKaCation, fPH:
			v := ld.pka(p, f, q)
			ok = ok && v != nil
			switch i {
			case fPKa:
				c.In.PKa = v
			case fPKaCation:
				c.In.PKaCation = v
			default:
				c.In.PH = ld.phOf(p, v, c.Solvent)
				ok = ok && (v == nil || c.In.PH != nil)
			}
		default:
			pot := ld.potential(p, f, q, c.Solvent)
			ok = ok && pot != nil
			switch i {
			case fEAnion:
				c.In.EAnion = pot
			case fECation:
				c.In.ECation = pot
			default:
				c.In.EPCET = pot
			}
		}
	}
	if ok {
		ld.addCouple(c, p)
	}
}

// csvText makes a couple with the text cells of a row. The cells may be
// views of the whole file's text (read by lines): the text a couple keeps is
// copied, and text that repeats from row to row (source, bond, status,
// tags...) is kept once, unless the text is the load's own (slab.views).
func (ld *loader) csvText(p Pos, id string, cells []string) *Couple {
	m := &ld.mem
	c := m.couple()
	c.Pos, c.Source, c.Note = p, m.intern(cells[fSource]), m.intern(cells[fNote])
	if t := cells[fTags]; t != "" {
		if strings.IndexByte(t, ';') >= 0 || strings.IndexByte(t, ',') >= 0 { // strings.ContainsAny(t, ";,"), without its set
			c.Tags = splitList(t)
			for i, tag := range c.Tags {
				c.Tags[i] = m.intern(tag)
			}
		} else {
			c.Tags = m.oneTag(m.intern(t)) // splitList's result: the cell is trimmed and not empty
		}
	}
	c.ID, c.Name, c.Bond, c.Roles = m.text(id), m.text(cells[fName]), m.intern(cells[fBond]), thermo.RoleBoth
	if s := cells[fStatus]; s != "" {
		if s == m.statusIn {
			c.Status = m.statusOut // as for the row before
		} else if c.Status = m.intern(ld.status(p, "status", s)); c.Status != "" {
			m.statusIn, m.statusOut = m.intern(s), c.Status
		}
	}
	return c
}

// csvSolvent looks a solvent up, once per name in a file (solvents).
func (ld *loader) csvSolvent(p Pos, name string, solvents map[string]*thermo.Solvent) *thermo.Solvent {
	s, hit := solvents[name]
	if !hit {
		var good bool
		if s, good = ld.solvent(p, "solvent", name); good {
			solvents[strings.Clone(name)] = s
		}
	}
	return s
}

// csvRoles reads a roles cell, the common spellings without a split.
func (ld *loader) csvRoles(p Pos, rs string) (thermo.Role, bool) {
	switch rs {
	case "both", "donor;acceptor":
		return thermo.RoleBoth, true
	case "donor":
		return thermo.RoleDonor, true
	case "acceptor":
		return thermo.RoleAcceptor, true
	}
	return ld.roles(p, "roles", splitList(rs))
}

// csvQuantity reads the value of field f with its <f>_sigma and <f>_vs
// cells; false when a problem was reported.
func (ld *loader) csvQuantity(p Pos, f, v, sig, vs string) (Quantity, bool) {
	q, err := ParseQuantity(v)
	if err != nil {
		ld.c.add(p, f, "%v", err)
		return q, false
	}
	if sig != "" {
		if q.HasSigma {
			ld.c.add(p, f+"_sigma", "uncertainty given twice (in %s and in %s_sigma)", f, f)
			return q, false
		}
		s, err := ParseQuantity(sig)
		if err == nil && (s.HasSigma || s.Unit != "" || s.Vs != "") {
			err = fmt.Errorf("%q: want a plain number", sig)
		}
		if err == nil && s.V < 0 {
			err = fmt.Errorf("uncertainty %g is negative", s.V)
		}
		if err != nil {
			ld.c.add(p, f+"_sigma", "%v", err)
			return q, false
		}
		q.Sigma, q.HasSigma = s.V, true
	}
	if vs != "" {
		if q.Vs != "" {
			ld.c.add(p, f+"_vs", "electrode given twice (in %s and in %s_vs)", f, f)
			return q, false
		}
		q.Vs = vs
	}
	return q, true
}

// slab hands out couples, values and potentials from blocks allocated a few
// hundred at a time, rather than one allocation each, and remembers the
// electrode names already read. A loader's slab is used by that loader
// alone.
type slab struct {
	// views is set when the text read is the load's own and never
	// changes (LoadFiles): text and intern then return it as it is, a view
	// of the file's bytes, with nothing copied.
	views bool

	couples    []Couple
	values     []thermo.Value
	potentials []thermo.Potential
	tags       []string
	electrodes map[string]thermo.Electrode

	// Text kept by couples: written into blocks that are never changed
	// once written (a strings.Builder's bytes stay put), and a few hundred
	// strings that repeat kept once.
	block  strings.Builder
	common map[string]string
	recent [16]string // common strings met lately, by recentSlot

	statusIn, statusOut string // the last status cell read, and its status

	tagLists map[string][]string // one-tag lists made so far, by tag
	lastTag  string
	lastTags []string
}

func recentSlot(v string) int { return (len(v) + int(v[0])) & 15 }

const textBlock = 64 << 10

// text returns a copy of v (v itself for views).
func (s *slab) text(v string) string {
	if v == "" || s.views {
		return v
	}
	if len(v) > textBlock/4 {
		return strings.Clone(v)
	}
	if s.block.Cap()-s.block.Len() < len(v) {
		s.block = strings.Builder{}
		s.block.Grow(textBlock)
	}
	at := s.block.Len()
	s.block.WriteString(v)
	return s.block.String()[at:]
}

// intern returns a copy of v, the same copy for text seen before (v
// itself for views).
func (s *slab) intern(v string) string {
	if v == "" || s.views {
		return v
	}
	slot := &s.recent[recentSlot(v)]
	if *slot == v {
		return *slot
	}
	if k, ok := s.common[v]; ok {
		*slot = k
		return k
	}
	k := s.text(v)
	if s.common == nil {
		s.common = map[string]string{}
	}
	if len(s.common) < 512 {
		s.common[k] = k
		*slot = k
	}
	return k
}

const slabBlock = 256

func (s *slab) couple() *Couple {
	if len(s.couples) == 0 {
		s.couples = make([]Couple, slabBlock)
	}
	c := &s.couples[0]
	s.couples = s.couples[1:]
	return c
}

// value returns a new value holding q's number and uncertainty.
func (s *slab) value(q Quantity) *thermo.Value {
	if len(s.values) == 0 {
		s.values = make([]thermo.Value, slabBlock)
	}
	v := &s.values[0]
	s.values = s.values[1:]
	*v = thermo.Value{V: q.V, Sigma: q.Sigma, SigmaGiven: q.HasSigma}
	return v
}

func (s *slab) potential() *thermo.Potential {
	if len(s.potentials) == 0 {
		s.potentials = make([]thermo.Potential, slabBlock)
	}
	p := &s.potentials[0]
	s.potentials = s.potentials[1:]
	return p
}

// oneTag returns []string{t}, with no room to grow into the next one. The
// same tag gives the same list (most rows of a file carry the same tag):
// the list is never written once made, and appending to it copies it.
func (s *slab) oneTag(t string) []string {
	if t == s.lastTag && s.lastTags != nil {
		return s.lastTags
	}
	if l, ok := s.tagLists[t]; ok {
		s.lastTag, s.lastTags = t, l
		return l
	}
	l := s.newTag(t)
	if s.tagLists == nil {
		s.tagLists = map[string][]string{}
	}
	if len(s.tagLists) < 512 {
		s.tagLists[t] = l
	}
	s.lastTag, s.lastTags = t, l
	return l
}

func (s *slab) newTag(t string) []string {
	if len(s.tags) == 0 {
		s.tags = make([]string, slabBlock)
	}
	out := s.tags[:1:1]
	out[0] = t
	s.tags = s.tags[1:]
	return out
}

// keepElectrode remembers that name reads as e (a few names at most).
func (s *slab) keepElectrode(name string, e thermo.Electrode) {
	if s.electrodes == nil {
		s.electrodes = map[string]thermo.Electrode{}
	}
	if len(s.electrodes) < 64 {
		s.electrodes[strings.Clone(name)] = e
	}
}
