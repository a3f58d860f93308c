package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// rankJSON runs rank with --format json and returns the objects, checking
// that the keys come in the contracted order (data/FORMAT.md, Exports).
func rankJSON(t *testing.T, args ...string) []map[string]any {
	t.Helper()
	args = append([]string{"rank", "--format", "json"}, args...)
	status, out, errs := runCmd(t, args...)
	if status != exitOK || errs != "" {
		t.Fatalf("%q: status %d, stderr %q", args, status, errs)
	}
	var list []map[string]any
	if err := json.Unmarshal([]byte(out), &list); err != nil {
		t.Fatalf("%q: %v\n%s", args, err, out)
	}
	return list
}

// jsonKeys returns the keys of each object of a JSON array, in order.
func jsonKeys(t *testing.T, out string) [][]string {
	t.Helper()
	dec := json.NewDecoder(strings.NewReader(out))
	if tok, err := dec.Token(); err != nil || tok != json.Delim('[') {
		t.Fatalf("not a JSON array: %v %v", tok, err)
	}
	var all [][]string
	for dec.More() {
		if tok, err := dec.Token(); err != nil || tok != json.Delim('{') {
			t.Fatalf("not an object: %v %v", tok, err)
		}
		var keys []string
		for dec.More() {
			tok, err := dec.Token()
			if err != nil {
				t.Fatal(err)
			}
			keys = append(keys, tok.(string))
			var raw json.RawMessage
			if err := dec.Decode(&raw); err != nil {
				t.Fatal(err)
			}
		}
		if _, err := dec.Token(); err != nil {
			t.Fatal(err)
		}
		all = append(all, keys)
	}
	return all
}

func TestRankJSONKeysAsContracted(t *testing.T) {
	for _, units := range []string{"kcal", "kj"} {
		sfx := map[string]string{"kcal": "_kcal_mol", "kj": "_kj_mol"}[units]
		want := []string{"donor", "acceptor", "dg" + sfx, "sigma" + sfx, "log10_k",
			"donor_bdfe" + sfx, "acceptor_bdfe" + sfx, "donor_h2_margin" + sfx, "h2_tendency"}
		args := []string{"rank", "--format", "json", "--units", units, "--top", "5"}
		status, out, errs := runCmd(t, args...)
		if status != exitOK || errs != "" {
			t.Fatalf("%q: status %d stderr %q", args, status, errs)
		}
		objs := jsonKeys(t, out)
		if len(objs) != 5 {
			t.Fatalf("%q: %d objects, want 5", args, len(objs))
		}
		for _, keys := range objs {
			if len(keys) < len(want) || strings.Join(keys[:len(want)], ",") != strings.Join(want, ",") {
				t.Errorf("%q: keys %v, want them to start with %v", args, keys, want)
			}
			for _, k := range keys {
				if units == "kj" && strings.HasSuffix(k, "_kcal_mol") {
					t.Errorf("--units kj: key %s still in kcal", k)
				}
			}
		}
	}
}

func TestRankDefaultsAndOrder(t *testing.T) {
	list := rankJSON(t)
	if len(list) != DefaultTop {
		t.Errorf("%d pairs, want the default top %d", len(list), DefaultTop)
	}
	prev := math.Inf(-1)
	for _, p := range list {
		dg := p["dg_kcal_mol"].(float64)
		if dg < prev {
			t.Errorf("not sorted by ΔG° ascending: %v after %v", dg, prev)
		}
		prev = dg
		if p["donor"] == p["acceptor"] {
			t.Errorf("a couple paired with itself: %v", p["donor"])
		}
		// ΔG° = BDFE(D) − BDFE(A), rounded to 4 decimals each
		if d := p["donor_bdfe_kcal_mol"].(float64) - p["acceptor_bdfe_kcal_mol"].(float64); math.Abs(d-dg) > 2e-4 {
			t.Errorf("%v → %v: ΔG° %v but BDFE difference %v", p["donor"], p["acceptor"], dg, d)
		}
		// log K = −ΔG°/(2.303RT), 2.303RT = 1.3642 kcal/mol at 298.15 K (CODATA 2018 R)
		if lk := p["log10_k"].(float64); math.Abs(lk+dg/1.36425) > 1e-3 {
			t.Errorf("log10_k %v for ΔG° %v", lk, dg)
		}
		switch p["h2_tendency"] {
		case "downhill", "near line", "uphill":
		default:
			t.Errorf("h2_tendency %q", p["h2_tendency"])
		}
	}
	if all := rankJSON(t, "--top", "0"); len(all) <= DefaultTop {
		t.Errorf("--top 0 gave %d pairs, want every pair (more than %d)", len(all), DefaultTop)
	}
}

// The minimal library has one donor and one acceptor: exactly one pair,
// ΔG° = 70 − 80 = −10.
func TestRankMinimalLibrary(t *testing.T) {
	list := rankJSON(t, "-l", "../../testdata/good/minimal.yaml", "--top", "0")
	if len(list) != 1 {
		t.Fatalf("%d pairs, want 1: %v", len(list), list)
	}
	p := list[0]
	if p["donor"] != "donor-1" || p["acceptor"] != "acceptor-1" || p["dg_kcal_mol"] != -10.0 {
		t.Errorf("pair %v", p)
	}
	// σ = √(1² + 1²) with the assumed 1 kcal/mol of each direct BDFE
	// (common practice, no source)
	if s := p["sigma_kcal_mol"].(float64); math.Abs(s-math.Sqrt2) > 1e-4 {
		t.Errorf("σ %v, want √2", s)
	}
	kj := rankJSON(t, "-l", "../../testdata/good/minimal.yaml", "--units", "kj")
	if got := kj[0]["dg_kj_mol"]; got != -41.84 { // 1 kcal = 4.184 kJ (thermochemical calorie)
		t.Errorf("dg_kj_mol %v, want -41.84", got)
	}
}

func TestRankNeverPairsACoupleWithItself(t *testing.T) {
	f := filepath.Join(t.TempDir(), "one.yaml")
	if err := os.WriteFile(f, []byte("format: hatsieve/1\ncouples:\n  - id: only\n    bdfe: 70\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if list := rankJSON(t, "-l", f); len(list) != 0 {
		t.Errorf("pairs %v, want none", list)
	}
}

func TestRankFilters(t *testing.T) {
	for _, p := range rankJSON(t, "--h2", "uphill", "--top", "0") {
		if p["h2_tendency"] != "uphill" {
			t.Errorf("--h2 uphill kept %v", p)
		}
	}
	seen := map[any]bool{}
	for _, p := range rankJSON(t, "--h2", "downhill,near line", "--top", "0") {
		seen[p["h2_tendency"]] = true
	}
	if seen["uphill"] || !seen["downhill"] {
		t.Errorf("--h2 downhill,near line kept %v", seen)
	}
	list := rankJSON(t, "--dg-min", "-5", "--dg-max", "2", "--top", "0")
	if len(list) == 0 {
		t.Fatal("ΔG° window -5..2 kept nothing")
	}
	for _, p := range list {
		if dg := p["dg_kcal_mol"].(float64); dg < -5-1e-9 || dg > 2+1e-9 {
			t.Errorf("ΔG° %v outside -5..2", dg)
		}
	}
	// the window is in the units asked for
	for _, p := range rankJSON(t, "--units", "kj", "--dg-min", "-20", "--dg-max", "0", "--top", "0") {
		if dg := p["dg_kj_mol"].(float64); dg < -20-1e-3 || dg > 1e-3 {
			t.Errorf("--units kj: ΔG° %v kJ/mol outside -20..0", dg)
		}
	}
	byK := rankJSON(t, "--sort", "log10_k", "--top", "10")
	for i := 1; i < len(byK); i++ {
		if byK[i]["log10_k"].(float64) > byK[i-1]["log10_k"].(float64) {
			t.Errorf("--sort log10_k: not largest first at %d", i)
		}
	}
	rev := rankJSON(t, "--reverse", "--top", "10")
	for i := 1; i < len(rev); i++ {
		if rev[i]["dg_kcal_mol"].(float64) > rev[i-1]["dg_kcal_mol"].(float64) {
			t.Errorf("--reverse: not largest ΔG° first at %d", i)
		}
	}
}

func TestRankCrossSolvent(t *testing.T) {
	for _, p := range rankJSON(t, "--top", "0") {
		if p["cross_solvent"] != false || p["donor_solvent"] != "acetonitrile" || p["acceptor_solvent"] != "acetonitrile" {
			t.Fatalf("without --cross: %v", p)
		}
	}
	cross := 0
	for _, p := range rankJSON(t, "--top", "0", "--cross") {
		if p["cross_solvent"] == true {
			cross++
			if p["donor_solvent"] == p["acceptor_solvent"] {
				t.Errorf("marked cross but one solvent: %v", p)
			}
		}
	}
	if cross == 0 {
		t.Error("--cross added no cross-solvent pair")
	}
	status, out, _ := runCmd(t, "rank", "--cross", "--top", "0")
	if status != exitOK || !strings.Contains(out, "×") {
		t.Errorf("--cross table does not mark cross-solvent pairs")
	}
}

func TestRankUsageErrors(t *testing.T) {
	for _, args := range [][]string{
		{"rank", "--format", "xml"},
		{"rank", "--sort", "colour"},
		{"rank", "--h2", "sideways"},
		{"rank", "--top", "-1"},
		{"rank", "--force"},
		{"rank", "--nope"},
		{"rank", "extra.yaml"},
		{"rank", "--dg-min", "5", "--dg-max", "-5"},
		{"rank", "--units", "eV"},
		{"rank", "--cg-basis", "2015"},
		{"rank", "--temperature", "-3"},
		{"rank", "--dg-max", "NaN"},
	} {
		status, out, errs := runCmd(t, args...)
		if status != exitUsage {
			t.Errorf("%q: status %d, want %d", args, status, exitUsage)
		}
		if out != "" {
			t.Errorf("%q: wrote %q to stdout", args, out)
		}
		oneErrorLine(t, args, errs)
	}
}

func TestRankDataErrors(t *testing.T) {
	for _, args := range [][]string{
		{"rank", "-l", filepath.Join(t.TempDir(), "missing.yaml")},
		{"rank", "-l", "../../testdata/bad/not-a-number.yaml"},
		{"rank", "--solvent", "acetonitril"},
		{"rank", "-l", "../../testdata/good/minimal.yaml", "-l", "../../testdata/bad/csv-wrong-cells.csv"},
	} {
		status, out, errs := runCmd(t, args...)
		if status != exitData {
			t.Errorf("%q: status %d, want %d", args, status, exitData)
		}
		if out != "" {
			t.Errorf("%q: wrote %q to stdout", args, out)
		}
		oneErrorLine(t, args, errs)
	}
}

func TestRankOutFile(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "pairs.csv")
	args := []string{"rank", "--format", "csv", "--top", "5", "--out", out}
	status, stdout, errs := runCmd(t, args...)
	if status != exitOK || stdout != "" || errs != "" {
		t.Fatalf("%q: status %d stdout %q stderr %q", args, status, stdout, errs)
	}
	first, err := os.ReadFile(out)
	if err != nil || !bytes.HasPrefix(first, []byte("donor,acceptor,dg_kcal_mol,")) {
		t.Fatalf("written file: %v %q", err, first)
	}

	// no --force: refused, one line, the file untouched
	args2 := []string{"rank", "--format", "json", "--out", out}
	status, stdout, errs = runCmd(t, args2...)
	if status != exitData || stdout != "" {
		t.Errorf("%q: status %d stdout %q", args2, status, stdout)
	}
	oneErrorLine(t, args2, errs)
	if !strings.Contains(errs, "--force") {
		t.Errorf("refusal %q does not mention --force", errs)
	}
	if now, _ := os.ReadFile(out); !bytes.Equal(now, first) {
		t.Error("a refused write changed the file")
	}

	// --force replaces it
	status, _, errs = runCmd(t, "rank", "--format", "json", "--out", out, "--force")
	if status != exitOK || errs != "" {
		t.Fatalf("--force: status %d stderr %q", status, errs)
	}
	if now, _ := os.ReadFile(out); !bytes.HasPrefix(now, []byte("[")) {
		t.Errorf("--force did not replace the file: %q", now)
	}

	// a missing folder is an error, not created
	missing := filepath.Join(dir, "no-such-folder", "x.csv")
	args3 := []string{"rank", "--out", missing}
	status, stdout, errs = runCmd(t, args3...)
	if status != exitData || stdout != "" {
		t.Errorf("%q: status %d stdout %q", args3, status, stdout)
	}
	oneErrorLine(t, args3, errs)
	if _, err := os.Stat(filepath.Dir(missing)); !os.IsNotExist(err) {
		t.Error("the missing folder was created")
	}

	// no temporary file is left behind
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("folder holds %v, want only pairs.csv", names)
	}
}

// CSV and JSON from the same ranking carry the same numbers (JSON rounds to
// 4 decimals, CSV keeps every digit).
func TestRankCSVMatchesJSON(t *testing.T) {
	list := rankJSON(t, "--top", "20", "--cross")
	status, out, errs := runCmd(t, "rank", "--format", "csv", "--top", "20", "--cross")
	if status != exitOK || errs != "" {
		t.Fatalf("csv: status %d stderr %q", status, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != len(list)+1 {
		t.Fatalf("%d CSV rows for %d JSON objects", len(rows)-1, len(list))
	}
	head := rows[0]
	for i, p := range list {
		for c, name := range head {
			jv, ok := p[name]
			if !ok {
				continue
			}
			cell := rows[i+1][c]
			switch v := jv.(type) {
			case float64:
				f, err := strconv.ParseFloat(cell, 64)
				if err != nil || math.Abs(f-v) > 6e-5 {
					t.Errorf("row %d %s: CSV %q, JSON %v", i, name, cell, v)
				}
			case string:
				if strings.TrimPrefix(cell, "'") != v {
					t.Errorf("row %d %s: CSV %q, JSON %q", i, name, cell, v)
				}
			}
		}
	}
}

// Without a terminal the bare command prints exactly what
// 'rank --format table' prints.
func TestBareCommandPrintsRankTable(t *testing.T) {
	for _, extra := range [][]string{nil, {"-l", "../../testdata/good/full.yaml", "--units", "kj"}, {"--solvent", "gas"}} {
		s1, bare, e1 := runCmd(t, extra...)
		s2, table, e2 := runCmd(t, append([]string{"rank", "--format", "table"}, extra...)...)
		if s1 != exitOK || s2 != exitOK || e1 != "" || e2 != "" {
			t.Fatalf("%q: statuses %d %d, stderr %q %q", extra, s1, s2, e1, e2)
		}
		if bare != table {
			t.Errorf("%q: bare command printed\n%s\nrank --format table printed\n%s", extra, bare, table)
		}
		if !strings.Contains(bare, "ΔG°") {
			t.Errorf("%q: no table header in %q", extra, bare)
		}
	}
	args := []string{"stray"}
	status, _, errs := runCmd(t, args...)
	if status != exitUsage {
		t.Errorf("stray argument: status %d", status)
	}
	oneErrorLine(t, args, errs)
}

// --cg moves every cycle-derived BDFE by the change in C_G and leaves direct
// BDFEs alone; --temperature changes log K = −ΔG°/(2.303RT).
func TestRankCommonOptions(t *testing.T) {
	find := func(list []map[string]any, d, a string) map[string]any {
		for _, p := range list {
			if p["donor"] == d && p["acceptor"] == a {
				return p
			}
		}
		t.Fatalf("no pair %s → %s", d, a)
		return nil
	}
	base := rankJSON(t, "--top", "0")
	moved := rankJSON(t, "--top", "0", "--cg", "50")
	b, m := find(base, "nhpi", "demo-z4"), find(moved, "nhpi", "demo-z4")
	// nhpi comes from pKa and E° (C_G 52.6 on the 2022 basis); demo-z4 is direct
	if d := m["donor_bdfe_kcal_mol"].(float64) - b["donor_bdfe_kcal_mol"].(float64); math.Abs(d-(50-52.6)) > 2e-4 {
		t.Errorf("--cg 50 moved the cycle BDFE by %v, want -2.6", d)
	}
	if m["acceptor_bdfe_kcal_mol"] != b["acceptor_bdfe_kcal_mol"] {
		t.Error("--cg moved a directly given BDFE")
	}
	hot := find(rankJSON(t, "--top", "0", "--temperature", "350"), "nhpi", "demo-z4")
	// log K = −ΔG°·1000/(ln 10 · R · T), R = 8.314462618 J/(mol K) (CODATA 2018), 4.184 J/cal
	want := -hot["dg_kcal_mol"].(float64) * 4184 / (math.Ln10 * 8.314462618 * 350)
	if got := hot["log10_k"].(float64); math.Abs(got-want) > 2e-4 {
		t.Errorf("log K at 350 K: %v, want %v", got, want)
	}
}

// The table for the smallest library, whole. log K = 10/1.3642 = 7.33;
// σ = √2 from the assumed 1 kcal/mol per direct BDFE (common practice, no
// source); H2 line = C_G 52.6 (2022 basis, from memory) + F·E°(H+/H2),
// E°(H+/H2) = −0.028 V vs Fc+/Fc in MeCN (Roberts, Bullock, Inorg. Chem.
// 2013, 52, 3823), so 51.95 and a donor margin of 70 − 51.95 = +18.0.
func TestRankTableMinimal(t *testing.T) {
	status, out, errs := runCmd(t, "rank", "-l", "../../testdata/good/minimal.yaml")
	if status != exitOK || errs != "" {
		t.Fatalf("status %d stderr %q", status, errs)
	}
	want := `library: ../../testdata/good/minimal.yaml
solvent acetonitrile · C_G 52.60 kcal/mol vs Fc+/Fc (2022 basis) · H2 line 51.95 · p(H2) 1 atm · 298.15 K · kcal/mol | 1 donors, 1 acceptors | sorted by dg, best first
#  donor    acceptor    ΔG°    σ    log K  BDFE(D)  BDFE(A)  H2 margin(D)  H2 tendency  flags
1  donor-1  acceptor-1  -10.0  1.4  7.33   70.0     80.0     +18.0         ▲ uphill
energies in kcal/mol
`
	if out != want {
		t.Errorf("table:\n%s\nwant:\n%s", out, want)
	}
}

// The table's top line and the JSON name the conditions as they are: an
// explicit --cg is "explicit", not the table's basis; another temperature
// leaves ΔG° and the BDFEs at 298.15 K (they are 298.15 K quantities) and
// says so; the H2 pressure is always said.
func TestRankConditionsLabelled(t *testing.T) {
	_, out, _ := runCmd(t, "rank", "--top", "1", "--cg", "54.9", "--temperature", "323.15", "--p-h2", "1e-3")
	top := strings.Split(out, "\n")[1]
	for _, w := range []string{"C_G 54.90", "(explicit basis)", "ΔG°, BDFEs at 298.15 K; log K at 323.15 K", "p(H2) 0.001 atm"} {
		if !strings.Contains(top, w) {
			t.Errorf("top line lacks %q: %s", w, top)
		}
	}
	for _, p := range rankJSON(t, "--top", "3", "--cg", "54.9") {
		if p["c_g_basis"] != "explicit" {
			t.Errorf("--cg 54.9: c_g_basis %v, want explicit", p["c_g_basis"])
		}
	}
	for _, p := range rankJSON(t, "--top", "3", "--cg-basis", "2010") {
		if p["c_g_basis"] != "2010" {
			t.Errorf("--cg-basis 2010: c_g_basis %v", p["c_g_basis"])
		}
	}
}

// on_estimate and notes follow the other keys. In DMSO the H2 line is an
// estimate on either basis (no E°(H+/H2) is published there; see 'hatsieve
// solvents'), so every verdict there rests on one; in acetonitrile the H2
// line follows from E°(H+/H2) = −0.028 V vs Fc+/Fc (Roberts, Bullock, Inorg.
// Chem. 2013, 52, 3823) and no verdict does.
func TestRankOnEstimateAndNotes(t *testing.T) {
	_, out, _ := runCmd(t, "rank", "--format", "json", "--top", "2", "--solvent", "dmso")
	for _, keys := range jsonKeys(t, out) {
		if n := len(keys); n < 3 || strings.Join(keys[n-3:], ",") != "c_g_basis,on_estimate,notes" {
			t.Errorf("keys do not end with c_g_basis, on_estimate, notes: %v", keys)
		}
	}
	for _, basis := range []string{"2010", "2022"} {
		for _, p := range rankJSON(t, "--top", "5", "--solvent", "dmso", "--cg-basis", basis) {
			if p["on_estimate"] != true || !strings.Contains(p["notes"].(string), "estimated constant") {
				t.Errorf("DMSO, %s basis: %v → %v on_estimate %v, notes %q", basis, p["donor"], p["acceptor"], p["on_estimate"], p["notes"])
			}
		}
		for _, p := range rankJSON(t, "--top", "5", "--solvent", "MeCN", "--cg-basis", basis) {
			if p["on_estimate"] != false || strings.Contains(p["notes"].(string), "estimated constant") {
				t.Errorf("MeCN, %s basis: %v → %v on_estimate %v, notes %q", basis, p["donor"], p["acceptor"], p["on_estimate"], p["notes"])
			}
		}
	}
	// The table flags such a verdict and says what the flag means.
	if _, out, _ := runCmd(t, "rank", "--solvent", "dmso", "--top", "3"); !strings.Contains(out, "  est\n") || !strings.Contains(out, "est: the verdict rests on an estimated constant") {
		t.Errorf("DMSO table without the est flag:\n%s", out)
	}
	if _, out, _ := runCmd(t, "rank", "--top", "3"); strings.Contains(out, " est\n") || strings.Contains(out, "est:") {
		t.Errorf("MeCN table with the est flag:\n%s", out)
	}
	// A BDFE given without a basis is taken on the basis in force: said.
	p := rankJSON(t, "-l", "../../testdata/good/minimal.yaml")[0]
	if !strings.Contains(p["notes"].(string), "donor-1: BDFE given without a basis") {
		t.Errorf("notes %q", p["notes"])
	}
}
