package data

import (
	"bytes"
	"encoding/csv"
	"strconv"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// Rank, write CSV, read it back: every number comes back bit for bit, in
// either unit.
func TestPairsCSVRoundTrip(t *testing.T) {
	ev := evaluate(t, mustDefault(t), Options{Cross: true})
	pairs := ev.Rank(thermo.RankOptions{})
	if len(pairs) < 1000 {
		t.Fatalf("only %d pairs", len(pairs))
	}
	for _, u := range []thermo.Units{thermo.Kcal, thermo.KJ} {
		var buf bytes.Buffer
		if err := WritePairsCSV(&buf, ev, pairs, u); err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(buf.String(), "\r\n") {
			t.Error("rows do not end in CRLF (RFC 4180)")
		}
		rows, err := csv.NewReader(&buf).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		head := rows[0]
		if strings.Join(head, ",") != strings.Join(PairColumns(u), ",") {
			t.Fatalf("header %v", head)
		}
		col := map[string]int{}
		for i, h := range head {
			col[h] = i
		}
		sfx := u.Suffix()
		if len(rows) != len(pairs)+1 {
			t.Fatalf("%d rows for %d pairs", len(rows)-1, len(pairs))
		}
		for i, p := range pairs {
			r := rows[i+1]
			get := func(name string) float64 {
				v, err := strconv.ParseFloat(r[col[name]], 64)
				if err != nil {
					t.Fatalf("row %d %s: %q: %v", i, name, r[col[name]], err)
				}
				return v
			}
			for name, want := range map[string]float64{
				"dg_" + sfx:                  Round(u.From(p.DG.Kcal)),
				"sigma_" + sfx:               Round(u.From(p.DG.Sigma())),
				"log10_k":                    Round(p.Log10K),
				"donor_bdfe_" + sfx:          Round(u.From(p.Donor.BDFE.Kcal)),
				"acceptor_bdfe_" + sfx:       Round(u.From(p.Acceptor.BDFE.Kcal)),
				"donor_h2_margin_" + sfx:     Round(u.From(p.Donor.Margin.Kcal)),
				"temperature_k":              Round(thermo.DefaultTemperature),
				"faraday_" + sfx + "_per_v":  Round(u.From(thermo.FaradayKcal)),
				"rt_ln10_" + sfx:             Round(u.From(thermo.RTLn10(thermo.DefaultTemperature))),
				"donor_bdfe_sigma_" + sfx:    Round(u.From(p.Donor.BDFE.Sigma())),
				"acceptor_bdfe_sigma_" + sfx: Round(u.From(p.Acceptor.BDFE.Sigma())),
			} {
				if got := get(name); got != want {
					t.Fatalf("row %d %s: read back %v, wrote %v", i, name, got, want)
				}
			}
			if r[col["donor"]] != Neutralise(p.Donor.Couple.ID) || r[col["h2_tendency"]] != p.Donor.Tendency.String() {
				t.Fatalf("row %d: %v", i, r[:9])
			}
			if want := strconv.FormatBool(p.CrossSolvent); r[col["cross_solvent"]] != want {
				t.Fatalf("row %d cross_solvent %q", i, r[col["cross_solvent"]])
			}
		}
	}
}

func TestNeutralise(t *testing.T) {
	for in, want := range map[string]string{
		"=SUM(A1)": "'=SUM(A1)", "+1": "'+1", "-x": "'-x", "@cmd": "'@cmd", "\tx": "'\tx", "\rx": "'\rx",
		"plain": "plain", "": "", "a=b": "a=b", "ΔG": "ΔG",
	} {
		if got := Neutralise(in); got != want {
			t.Errorf("Neutralise(%q) = %q, want %q", in, got, want)
		}
	}
}

// Text cells that look like formulas are neutralised; numbers, negative
// ones included, stay plain numbers.
func TestPairsCSVCells(t *testing.T) {
	lib, err := Load(File{"f.yaml", []byte(`format: hatsieve/1
couples:
  - {id: "=cmd", name: "@SUM(1)", roles: donor, bdfe: 70, source: "-1 from a note"}
  - {id: "-acc", name: "plain", roles: acceptor, bdfe: 80, source: "+tab"}
`)})
	if err != nil {
		t.Fatal(err)
	}
	ev := evaluate(t, lib, Options{})
	var buf bytes.Buffer
	if err := WritePairsCSV(&buf, ev, ev.Rank(thermo.RankOptions{}), thermo.Kcal); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil || len(rows) != 2 {
		t.Fatalf("%v %v", rows, err)
	}
	cell := map[string]string{}
	for i, h := range rows[0] {
		cell[h] = rows[1][i]
	}
	for name, want := range map[string]string{
		"donor": "'=cmd", "acceptor": "'-acc", "donor_name": "'@SUM(1)", "acceptor_name": "plain",
		"donor_source": "'-1 from a note", "acceptor_source": "'+tab",
		"dg_kcal_mol": "-10", "donor_h2_margin_kcal_mol": FormatNumber(70 - ev.H2Line.V),
	} {
		if cell[name] != want {
			t.Errorf("%s = %q, want %q", name, cell[name], want)
		}
	}
}

// Write pairs whose text cells hold anything, read the CSV back with
// encoding/csv: every row has every column, and each text cell reads back
// as written, after neutralisation (and with CRLF inside a cell read as LF,
// as encoding/csv does).
func FuzzWritePairsCSV(f *testing.F) {
	f.Add("d", "donor, \"quoted\"", "=HYPERLINK(\"x\")", "a", "-1+1", "@SUM(A1)\r\nnext")
	f.Add("\x1b[2J", "\r", "\t lead", " sp", "\u202e", "\xff\xfe")
	f.Add("", "", "", "", "", "")
	f.Fuzz(func(t *testing.T, id1, name1, src1, id2, name2, src2 string) {
		c := func(id, name, src string, roles thermo.Role, bdfe float64) *Couple {
			return &Couple{Couple: thermo.Couple{ID: id, Name: name, Roles: roles,
				In: thermo.Inputs{BDFE: &thermo.Value{V: bdfe, Sigma: 1}}}, Source: src, Status: name}
		}
		lib := &Library{Solvents: thermo.Builtin(), Couples: []*Couple{
			c(id1, name1, src1, thermo.RoleDonor, 62), c(id2, name2, src2, thermo.RoleAcceptor, 70)}}
		ev, err := Evaluate(lib, Options{})
		if err != nil {
			t.Fatal(err)
		}
		pairs := ev.Rank(thermo.RankOptions{})
		if len(pairs) != 1 {
			t.Fatalf("%d pairs", len(pairs))
		}
		var buf bytes.Buffer
		if err := WritePairsCSV(&buf, ev, pairs, thermo.Kcal); err != nil {
			t.Fatal(err)
		}
		recs, err := csv.NewReader(&buf).ReadAll()
		if err != nil {
			t.Fatalf("written CSV does not parse: %v\n%q", err, buf.String())
		}
		if len(recs) != 2 {
			t.Fatalf("%d records, want 2: %q", len(recs), recs)
		}
		cell := map[string]string{}
		for i, h := range recs[0] {
			cell[h] = recs[1][i]
		}
		back := func(s string) string { return strings.ReplaceAll(Neutralise(s), "\r\n", "\n") }
		for col, want := range map[string]string{
			"donor": back(id1), "donor_name": back(name1), "donor_source": back(src1), "donor_status": back(name1),
			"acceptor": back(id2), "acceptor_name": back(name2), "acceptor_source": back(src2),
		} {
			if cell[col] != want {
				t.Errorf("%s read back %q, wrote %q", col, cell[col], want)
			}
		}
		if cell["dg_kcal_mol"] != "-8" {
			t.Errorf("dg %q", cell["dg_kcal_mol"])
		}
	})
}
