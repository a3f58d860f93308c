package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func windowJSON(t *testing.T, args ...string) []map[string]any {
	t.Helper()
	args = append([]string{"window"}, append(args, "--format", "json")...)
	status, out, errs := runCmd(t, args...)
	if status != exitOK || errs != "" {
		t.Fatalf("%q: status %d, stderr %q", args, status, errs)
	}
	var list []map[string]any
	if err := json.Unmarshal([]byte(out), &list); err != nil {
		t.Fatalf("%q: %v\n%s", args, err, out)
	}
	// The contracted keys come first, in order.
	want := []string{"acid", "reductant", "bdfe_eff_kcal_mol", "sigma_kcal_mol", "dg_kcal_mol", "h2_margin_kcal_mol",
		"room_to_acceptor_kcal_mol", "room_to_h2_kcal_mol", "sources"}
	for _, keys := range jsonKeys(t, out) {
		w := slices.Clone(want)
		if keys[1] == "electrode_v" {
			w[1] = "electrode_v"
		}
		if len(keys) < len(w) || !slices.Equal(keys[:len(w)], w) {
			t.Fatalf("keys %v, want %v first", keys, w)
		}
	}
	return list
}

func f(m map[string]any, k string) float64 { return m[k].(float64) }

// The H2 line in MeCN on the 2022 basis: C_G 52.6 (2022 review, from memory)
// + F·E°(H+/H2), E°(H+/H2) = −0.028 V vs Fc (Source: Roberts, Bullock,
// Inorg. Chem. 2013, 52, 3823), F = 23.0605 kcal mol⁻¹ V⁻¹ (CODATA 2018).
const mecnH2Line2022 = 52.6 - 23.0605*0.028

func TestWindowOnBundledNHAcceptor(t *testing.T) {
	rows := windowJSON(t, "ru-pyim")
	// Source: Wu, Masland, Swartz, Kaminsky, Mayer, Inorg. Chem. 2007, 46,
	// 11190: Ru(hfac)2(py-imH) N–H, BDFE 79.6 in MeCN on the 2010 basis;
	// the 2022 basis lowers MeCN's C_G by 2.3 (54.9 → 52.6).
	const acceptor = 79.6 - 2.3
	var combos, electrodes int
	prev := math.Inf(1)
	for _, r := range rows {
		if _, ok := r["electrode_v"]; ok {
			electrodes++
			continue
		}
		combos++
		id := r["acid"].(string) + "+" + r["reductant"].(string)
		b, dg, m := f(r, "bdfe_eff_kcal_mol"), f(r, "dg_kcal_mol"), f(r, "h2_margin_kcal_mol")
		if dg > 1e-9 || m < -1e-9 {
			t.Errorf("%s outside the window: ΔG° %.3f, H2 margin %.3f", id, dg, m)
		}
		if math.Abs(b-dg-acceptor) > 0.15 || math.Abs(b-m-mecnH2Line2022) > 0.01 {
			t.Errorf("%s: BDFE %.3f − ΔG° %.3f ≠ acceptor %.1f, or − H2 margin %.3f ≠ H2 line %.3f", id, b, dg, acceptor, m, mecnH2Line2022)
		}
		if f(r, "room_to_acceptor_kcal_mol") != -dg || f(r, "room_to_h2_kcal_mol") != m {
			t.Errorf("%s: rooms %v, %v", id, r["room_to_acceptor_kcal_mol"], r["room_to_h2_kcal_mol"])
		}
		room := math.Min(-dg, m)
		if room > prev+1e-9 {
			t.Errorf("%s: room %.3f after %.3f; want the largest first", id, room, prev)
		}
		prev = room
		if src := r["sources"].([]any); len(src) != 2 || src[0] == "" || src[1] == "" {
			t.Errorf("%s: sources %v", id, src)
		}
	}
	if combos < 10 || electrodes < 25 {
		t.Errorf("%d combinations and %d electrode rows", combos, electrodes)
	}

	// Below the line only when asked, and then after every row above it.
	all := windowJSON(t, "ru-pyim", "--below-h2")
	below := 0
	for _, r := range all {
		if _, ok := r["electrode_v"]; ok {
			continue
		}
		if f(r, "h2_margin_kcal_mol") < 0 {
			below++
		} else if below > 0 {
			t.Fatalf("%s+%s above the H2 line after one below it", r["acid"], r["reductant"])
		}
	}
	if below == 0 || len(all) <= len(rows) {
		t.Errorf("--below-h2 added %d rows below the line (%d rows, %d without)", below, len(all), len(rows))
	}
}

func TestWindowElectrodeRows(t *testing.T) {
	rows := windowJSON(t, "ru-pyim")
	for _, r := range rows {
		if r["acid"] != "bzoh" || r["electrode_v"] == nil {
			continue
		}
		rng := r["electrode_range_v"].(map[string]any)
		// H2 onset for benzoic acid (pKa 20.7 in MeCN, from memory):
		// E°(H+/H2) − (2.303RT/F)·pKa with E°(H+/H2) = −0.028 V vs Fc
		// (Roberts, Bullock 2013) and 2.303RT/F = 0.05916 V at 298.15 K
		// (CODATA 2018).
		if got, want := rng["h2_onset"].(float64), -0.028-0.05916*20.7; math.Abs(got-want) > 2e-4 {
			t.Errorf("H2 onset %.4f V vs Fc, want %.4f", got, want)
		}
		if got := rng["h2_onset_vs_h2"].(float64); math.Abs(got+0.05916*20.7) > 2e-4 {
			t.Errorf("H2 onset %.4f V vs H2", got)
		}
		// The width is the acceptor's H2 margin in volts, whatever the acid.
		width := rng["limit"].(float64) - rng["h2_onset"].(float64)
		if math.Abs(width-(79.6-2.3-mecnH2Line2022)/23.0605) > 0.006 {
			t.Errorf("width %.4f V", width)
		}
		if r["electrode_vs"] != "Fc+/Fc" || math.Abs(f(r, "room_to_acceptor_kcal_mol")-f(r, "room_to_h2_kcal_mol")) > 1e-3 {
			t.Errorf("electrode row %v", r)
		}
		return
	}
	t.Error("no electrode row for bzoh")
}

// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961: Fc + PhCO2H in
// MeCN, formal BDFE 83.3 (§5.9); NHPI 84.8 (§5.1.2), both on the 2010 basis.
func TestWindowReviewCombination(t *testing.T) {
	for _, r := range windowJSON(t, "nhpi", "--cg-basis", "2010") {
		if r["acid"] == "bzoh" && r["reductant"] == "fc" {
			if b, dg := f(r, "bdfe_eff_kcal_mol"), f(r, "dg_kcal_mol"); math.Abs(b-83.3) > 0.2 || math.Abs(dg+1.5) > 0.3 {
				t.Errorf("bzoh+fc: BDFE %.2f, ΔG° %.2f; want 83.3 and −1.5", b, dg)
			}
			return
		}
	}
	t.Error("bzoh+fc not in NHPI's window")
}

func TestWindowMarginAndUserFile(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "mine.yaml")
	// An invented acceptor and reagents; pyh overrides the embedded acid.
	body := `format: hatsieve/1
solvent: MeCN
couples:
  - {id: my-acc, roles: acceptor, pka: 25, e_anion: -0.5 V vs Fc+/Fc, source: invented, status: invented}
acids:
  - {id: pyh, pka: 20, source: invented, status: invented}
reductants:
  - {id: my-red, e0: -0.5 V vs Fc+/Fc, source: invented, status: invented}
  - {id: weak-red, e0: -0.16 V vs Fc+/Fc, source: invented, status: invented}
  - {id: too-weak, e0: 0.1 V vs Fc+/Fc, source: invented, status: invented}
`
	if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	byID := func(rows []map[string]any) map[string]map[string]any {
		got := map[string]map[string]any{}
		for _, r := range rows {
			if red, ok := r["reductant"].(string); ok {
				got[r["acid"].(string)+"+"+red] = r
			}
		}
		return got
	}
	k, F := 1.3642, 23.0605 // 2.303RT and F in kcal/mol (CODATA 2018, 298.15 K)
	// Both BDFEs from the cycle in MeCN: ΔG° = k·(20 − 25) + F·(E° + 0.5),
	// C_G cancelling. pyh + weak-red: +1.02, inside a margin of 2 only;
	// pyh + too-weak: +7.0, outside it.
	plain := byID(windowJSON(t, "my-acc", "-l", p))
	wide := byID(windowJSON(t, "my-acc", "-l", p, "--margin", "2"))
	if _, ok := plain["pyh+weak-red"]; ok {
		t.Error("pyh+weak-red is uphill but listed without a margin")
	}
	r, ok := wide["pyh+weak-red"]
	if !ok {
		t.Fatal("pyh+weak-red missing with --margin 2")
	}
	if dg := f(r, "dg_kcal_mol"); math.Abs(dg-(k*(20-25)+F*(-0.16+0.5))) > 0.01 {
		t.Errorf("pyh+weak-red ΔG° %.3f", dg)
	}
	if _, ok := wide["pyh+too-weak"]; ok {
		t.Error("pyh+too-weak is 7 kcal/mol uphill but listed with --margin 2")
	}
	// The user's pyh (pKa 20) replaces the embedded one, and the embedded
	// reductants come along: pyh + Cp2Cr (−0.67 V, Connelly & Geiger, from
	// memory) has the H2 margin k·20 + F·(−0.67 + 0.028), E°(H+/H2) = −0.028 V
	// vs Fc (Roberts, Bullock 2013).
	if r, ok := plain["pyh+cp2cr"]; !ok {
		t.Error("pyh + the embedded Cp2Cr missing")
	} else if m := f(r, "h2_margin_kcal_mol"); math.Abs(m-(k*20+F*(-0.67+0.028))) > 0.01 {
		t.Errorf("pyh+cp2cr H2 margin %.3f: the user's pKa 20 not used", m)
	}
	if r, ok := plain["pyh+my-red"]; !ok || math.Abs(f(r, "h2_margin_kcal_mol")-(k*20+F*(-0.5+0.028))) > 0.01 {
		t.Errorf("pyh+my-red: %v", r)
	}
}

func TestWindowCSVAndTable(t *testing.T) {
	rows := windowJSON(t, "ru-pyim")
	status, out, errs := runCmd(t, "window", "ru-pyim", "--format", "csv")
	if status != exitOK || errs != "" {
		t.Fatalf("csv: status %d, %q", status, errs)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(recs) != len(rows)+1 || recs[0][4] != "bdfe_eff_kcal_mol" {
		t.Fatalf("csv: %d records for %d JSON rows, header %v, %v", len(recs), len(rows), recs[0], err)
	}
	status, out, _ = runCmd(t, "window", "ru-pyim", "--top", "3")
	if status != exitOK || !strings.Contains(out, "H2 line 51.95") || !strings.Contains(out, "H2 onset") {
		t.Errorf("table: status %d\n%s", status, out)
	}
}

func TestWindowBadInput(t *testing.T) {
	for _, c := range []struct {
		args   []string
		status int
		want   string
	}{
		{[]string{"window", "ru-pym"}, exitData, "did you mean ru-pyim"},
		{[]string{"window", "nh3-gas"}, exitUsage, "--solvent"},
		{[]string{"window"}, exitUsage, "one acceptor"},
		{[]string{"window", "ru-pyim", "--format", "xml"}, exitUsage, "--format"},
		{[]string{"window", "ru-pyim", "--solvent", "nope"}, exitUsage, "--solvent"},
	} {
		status, _, errs := runCmd(t, c.args...)
		if status != c.status || strings.Count(errs, "\n") != 1 || !strings.Contains(errs, c.want) {
			t.Errorf("%q: status %d, stderr %q; want %d and one line with %q", c.args, status, errs, c.status, c.want)
		}
	}
}

// A published acceptor's window is weighed with published reagents only:
// the demo's invented acid, reductant and electrode are left out, and said
// so; the demo's own (invented) acceptor keeps them.
func TestWindowKeepsTheDemoApart(t *testing.T) {
	for _, r := range windowJSON(t, "ru-pyim") {
		if r["status"] == "invented" {
			t.Errorf("ru-pyim: invented row %v + %v", r["acid"], r["reductant"])
		}
	}
	_, out, _ := runCmd(t, "window", "ru-pyim", "--top", "1")
	if !strings.Contains(out, "3 invented acids and reductants of the demo left out") {
		t.Errorf("the table does not say the demo was left out:\n%s", out)
	}
	demo := 0
	for _, r := range windowJSON(t, "demo-z3") {
		if r["status"] == "invented" {
			demo++
		}
	}
	if demo == 0 {
		t.Error("demo-z3: no invented reagent in the demo's own window")
	}
}

// Options may come before or after the acceptor id, those with a value
// included (--p-h2 once swallowed the id). At 10⁻³ atm the H2 line rises by
// ½RT·ln(10³) = 2.05 kcal/mol at 298.15 K (R = 1.98720 cal/(mol K), CODATA
// 2018), so a window holds fewer combinations.
func TestWindowOptionsAroundTheID(t *testing.T) {
	before := windowJSON(t, "--p-h2", "1e-3", "ru-pyim")
	after := windowJSON(t, "ru-pyim", "--p-h2", "1e-3")
	if len(before) != len(after) || len(after) >= len(windowJSON(t, "ru-pyim")) {
		t.Errorf("--p-h2 before the id: %d rows, after: %d", len(before), len(after))
	}
	_, out, _ := runCmd(t, "window", "--p-h2", "1e-3", "ru-pyim", "--top", "1")
	if !strings.Contains(out, "H2 line 54.00 · p(H2) 0.001 atm") {
		t.Errorf("the top line does not give the H2 line at 0.001 atm:\n%s", out)
	}
}
