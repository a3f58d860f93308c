package data

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"

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
		"e_anion": KindPotential, "e_cation": KindPotential,
	}
)

func init() {
	for i, f := range CoupleFields {
		fieldIndex[f] = i
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
	data = bytes.TrimPrefix(data, []byte("\uFEFF"))
	r := csv.NewReader(bytes.NewReader(data))
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
	nf := len(CoupleFields)
	cells := make([]string, 3*nf)
	solvents := map[string]*thermo.Solvent{}
	for {
		rec, err := r.Read()
		if err == io.EOF {
			return
		}
		if err != nil {
			ld.csvError(file, err)
			return
		}
		line, _ := r.FieldPos(0)
		if len(rec) != len(header) {
			ld.c.add(Pos{File: file, Line: line}, "row", "%d cells, the header has %d", len(rec), len(header))
			continue
		}
		clear(cells)
		blank := true
		for i, cell := range rec {
			if cell = strings.TrimSpace(cell); cell != "" {
				blank = false
				cells[cols[i].part*nf+cols[i].field] = cell
			}
		}
		if blank {
			continue
		}
		ld.csvCouple(Pos{File: file, Line: line}, cells, solvents)
	}
}

func (ld *loader) csvError(file string, err error) {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		ld.c.add(Pos{File: file, Line: pe.Line}, "row", "%v", pe.Err)
		return
	}
	ld.c.add(Pos{File: file}, "", "%v", err)
}

func (ld *loader) csvCouple(p Pos, cells []string, solvents map[string]*thermo.Solvent) {
	nf := len(CoupleFields)
	get := func(f string) string { return cells[fieldIndex[f]] }
	id := get("id")
	ok := ld.checkID(p, "id", id)
	c := &Couple{Pos: p, Source: get("source"), Note: get("note"), Tags: splitList(get("tags"))}
	c.ID, c.Name, c.Bond, c.Roles = id, get("name"), get("bond"), thermo.RoleBoth
	if s := get("status"); s != "" {
		c.Status = ld.status(p, "status", s)
	}
	if name := get("solvent"); name != "" {
		s, hit := solvents[name]
		if !hit {
			var good bool
			s, good = ld.solvent(p, "solvent", name)
			if good {
				solvents[name] = s
			}
		}
		if s == nil {
			ok = false
		}
		c.Solvent = s
	}
	if rs := get("roles"); rs != "" {
		r, good := ld.roles(p, "roles", splitList(rs))
		ok = ok && good
		c.Roles = r
	}
	if b := get("basis"); b != "" {
		bb, good := ld.basis(p, "basis", b)
		ok = ok && good
		c.In.BDFEBasis, c.In.BasisGiven = bb, good
	}
	quantity := func(f string) (Quantity, bool) {
		i := fieldIndex[f]
		v, sig, vs := cells[i], cells[nf+i], cells[2*nf+i]
		if v == "" {
			if sig != "" || vs != "" {
				ld.c.add(p, f, "has %s_sigma or %s_vs but no value", f, f)
				ok = false
			}
			return Quantity{}, false
		}
		q, err := ParseQuantity(v)
		if err != nil {
			ld.c.add(p, f, "%v", err)
			ok = false
			return q, false
		}
		if sig != "" {
			if q.HasSigma {
				ld.c.add(p, f+"_sigma", "uncertainty given twice (in %s and in %s_sigma)", f, f)
				ok = false
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
				ok = false
				return q, false
			}
			q.Sigma, q.HasSigma = s.V, true
		}
		if vs != "" {
			if q.Vs != "" {
				ld.c.add(p, f+"_vs", "electrode given twice (in %s and in %s_vs)", f, f)
				ok = false
				return q, false
			}
			q.Vs = vs
		}
		return q, true
	}
	for _, f := range [...]string{"bdfe", "bde", "pka", "pka_cation", "e_anion", "e_cation"} {
		q, has := quantity(f)
		if !has {
			continue
		}
		switch f {
		case "bdfe", "bde":
			v := ld.energy(p, f, q)
			ok = ok && v != nil
			if f == "bdfe" {
				c.In.BDFE = v
			} else {
				c.In.BDE = v
			}
		case "pka", "pka_cation":
			v := ld.pka(p, f, q)
			ok = ok && v != nil
			if f == "pka" {
				c.In.PKa = v
			} else {
				c.In.PKaCation = v
			}
		default:
			pot := ld.potential(p, f, q, c.Solvent)
			ok = ok && pot != nil
			if f == "e_anion" {
				c.In.EAnion = pot
			} else {
				c.In.ECation = pot
			}
		}
	}
	if ok {
		ld.addCouple(c, p)
	}
}
