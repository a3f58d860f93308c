package main

import (
	"encoding/json"
	"math"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func pairJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	status, out, errOut := runCmd(t, append([]string{"pair", "--format", "json"}, args...)...)
	if status != exitOK {
		t.Fatalf("pair %v: status %d, stderr %q", args, status, errOut)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("pair %v: %v\n%s", args, err, out)
	}
	return m
}

// bigRoot solves K = x²/((d − x)(a − x)) by the textbook quadratic root in
// 1000-bit arithmetic, K given as a float64.
func bigRoot(K, d, a float64) float64 {
	const prec = 1000
	f := func(v float64) *big.Float { return new(big.Float).SetPrec(prec).SetFloat64(v) }
	k, D, A := f(K), f(d), f(a)
	s := f(0).Add(D, A)
	ks := f(0).Mul(k, s)
	km1 := f(0).Sub(k, f(1))
	disc := f(0).Mul(ks, ks)
	disc.Sub(disc, f(0).Mul(f(0).Mul(f(0).Mul(km1, k), f(0).Mul(D, A)), f(4)))
	num := f(0).Sub(ks, f(0).Sqrt(disc))
	x, _ := num.Quo(num, f(0).Mul(km1, f(2))).Float64()
	return x
}

// The typed form: ΔG° = −5 kcal/mol, k_self 4.7 and 220 M⁻¹ s⁻¹, 298.15 K.
// Hand-computed (see also thermo's test): log K = 5/1.364247 = 3.66503,
// log f = 3.66503²/(4·(log10(1034) − 22)) = −0.17688, log k = 3.2513.
// The formula is also evaluated here in natural logs, as printed.
func TestPairTypedCrossAndConversion(t *testing.T) {
	m := pairJSON(t, "--dg", "-5", "--k-self-donor", "4.7", "--k-self-acceptor", "220",
		"--donor-m", "0.02", "--acceptor-m", "0.005")
	// Source: CODATA 2018 R for 2.303RT; the cross relation of Marcus as
	// applied to HAT (Mayer, Acc. Chem. Res. 2011, 44, 36), Z = 1e11.
	rtln := 8.314462618 * 298.15 / 4184 // RT in kcal/mol
	lnK := 5 / rtln
	lnf := lnK * lnK / (4 * math.Log(4.7*220/1e22))
	want := math.Log10(math.Sqrt(4.7 * 220 * math.Exp(lnK) * math.Exp(lnf)))
	got, _ := m["log10_k_cross_m_s"].(float64)
	if math.Abs(got-want) > 0.02 || math.Abs(got-3.2513) > 0.02 {
		t.Fatalf("log10_k_cross_m_s %v, formula %.4f, hand-computed 3.2513", m["log10_k_cross_m_s"], want)
	}
	if f, _ := m["f_cross"].(float64); math.Abs(f-math.Exp(lnf)) > 1e-3 {
		t.Fatalf("f_cross %v, want %.4f", m["f_cross"], math.Exp(lnf))
	}
	x := bigRoot(math.Exp(lnK), 0.02, 0.005)
	if c, _ := m["conversion_eq"].(float64); math.Abs(c-x/0.005) > 1e-6 {
		t.Fatalf("conversion_eq %v, want %.9f", m["conversion_eq"], x/0.005)
	}
	if m["cross_out_of_range"] != false || !strings.Contains(m["cross_note"].(string), "order of magnitude") {
		t.Fatalf("note and range: %v %v", m["cross_out_of_range"], m["cross_note"])
	}
	// K = 1 with equal concentrations converts half (hand-computed).
	m = pairJSON(t, "--dg", "0")
	if c, _ := m["conversion_eq"].(float64); math.Abs(c-0.5) > 1e-12 || m["log10_k_cross_m_s"] != nil {
		t.Fatalf("ΔG° 0 without k_self: conversion %v (want 0.5), k %v (want null)", m["conversion_eq"], m["log10_k_cross_m_s"])
	}
	// kJ/mol: −20.92 kJ/mol is −5 kcal/mol.
	m = pairJSON(t, "--dg", "-20.92", "--units", "kj", "--k-self-donor", "4.7", "--k-self-acceptor", "220")
	if got, _ := m["log10_k_cross_m_s"].(float64); math.Abs(got-want) > 0.02 {
		t.Fatalf("kJ/mol: log k %v", got)
	}
}

// A library with a donor 0.5 kcal/mol below the MeCN H2 line (2022 basis,
// 51.95: C_G 52.6 + F·E°(H+/H2) −0.028 V, Roberts & Bullock, Inorg. Chem.
// 2013, 52, 3823) and an acceptor: 10⁻³ atm moves the margin by
// ½RT·ln 10⁻³ = −2.046 kcal/mol (CODATA R; hand-computed) and the
// tendency from near line to downhill.
const pressureLib = `format: hatsieve/1
title: pressure test (invented values)
solvent: acetonitrile
couples:
  - {id: d-near, roles: donor, bdfe: 51.45 ± 0.3, basis: 2022, source: invented, status: invented}
  - {id: d-up, roles: donor, bdfe: 70 ± 1, basis: 2022, source: invented, status: invented}
  - {id: acc, roles: acceptor, bdfe: 80 ± 1, basis: 2022, source: invented, status: invented}
`

func writeLib(t *testing.T, body string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "lib.yaml")
	if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestPairPressure(t *testing.T) {
	lib := writeLib(t, pressureLib)
	at1 := pairJSON(t, "d-near", "acc", "-l", lib)
	at3 := pairJSON(t, "d-near", "acc", "-l", lib, "--p-h2", "1e-3")
	m1, m3 := at1["donor_h2_margin_kcal_mol"].(float64), at3["donor_h2_margin_kcal_mol"].(float64)
	if math.Abs(m3-m1-(-2.05)) > 0.01 {
		t.Fatalf("margin moved by %.4f, want −2.05 ± 0.01", m3-m1)
	}
	if at1["h2_tendency"] != "near line" || at3["h2_tendency"] != "downhill" {
		t.Fatalf("tendency %v at 1 atm, %v at 1e-3 atm", at1["h2_tendency"], at3["h2_tendency"])
	}
	if at1["p_h2_atm"] != 1.0 || at3["p_h2_atm"] != 0.001 {
		t.Fatalf("p_h2_atm %v, %v", at1["p_h2_atm"], at3["p_h2_atm"])
	}
	if at1["dg_kcal_mol"] != at3["dg_kcal_mol"] {
		t.Fatalf("ΔG°(HAT) must not depend on the H2 pressure")
	}
	// Every donor's margin in rank moves by the same amount.
	var r1, r3 []map[string]any
	for _, c := range []struct {
		p   string
		out *[]map[string]any
	}{{"1", &r1}, {"0.001", &r3}} {
		status, out, errOut := runCmd(t, "rank", "-l", lib, "--format", "json", "--p-h2", c.p)
		if status != exitOK {
			t.Fatalf("rank: %d %s", status, errOut)
		}
		if err := json.Unmarshal([]byte(out), c.out); err != nil {
			t.Fatal(err)
		}
	}
	if len(r1) != 2 || len(r3) != 2 {
		t.Fatalf("want 2 pairs, got %d and %d", len(r1), len(r3))
	}
	for i := range r1 {
		d := r3[i]["donor_h2_margin_kcal_mol"].(float64) - r1[i]["donor_h2_margin_kcal_mol"].(float64)
		if math.Abs(d+2.05) > 0.01 {
			t.Errorf("%v: margin moved by %.4f", r1[i]["donor"], d)
		}
	}
	_, out, _ := runCmd(t, "rank", "-l", lib, "--p-h2", "0.001")
	if !strings.Contains(out, "p(H2) 0.001 atm") {
		t.Errorf("rank's top line does not name the pressure:\n%s", out)
	}
}

func TestPairErrors(t *testing.T) {
	lib := writeLib(t, pressureLib)
	status, _, errOut := runCmd(t, "pair", "d-nera", "acc", "-l", lib)
	if status != exitData || !strings.Contains(errOut, `did you mean "d-near"`) || strings.Count(errOut, "\n") != 1 {
		t.Fatalf("unknown id: status %d, stderr %q", status, errOut)
	}
	status, _, errOut = runCmd(t, "pair", "acc", "d-near", "-l", lib)
	if status != exitData || !strings.Contains(errOut, "cannot be a donor") {
		t.Fatalf("wrong role: status %d, stderr %q", status, errOut)
	}
	for _, args := range [][]string{
		{"pair", "--dg", "-5", "--p-h2", "0"},
		{"pair", "--dg", "-5", "--p-h2", "-1"},
		{"pair", "--dg", "-5", "--p-h2", "Inf"},
		{"pair", "--dg", "-5", "--donor-m", "0"},
		{"pair", "--dg", "-5", "--k-self-donor", "-3"},
		{"pair", "--dg", "-5", "d", "a"},
		{"pair", "d-near"},
		{"pair", "d-near", "acc", "--format", "csv"},
		{"rank", "--p-h2", "0"},
	} {
		if status, _, errOut := runCmd(t, args...); status != exitUsage || strings.Count(errOut, "\n") != 1 {
			t.Errorf("%v: status %d, stderr %q; want one line and exit 2", args, status, errOut)
		}
	}
}

// The keys the pair record promises, in library form, and the estimate
// absent (null) without self-exchange data, never a guess.
func TestPairLibraryKeys(t *testing.T) {
	lib := writeLib(t, pressureLib)
	m := pairJSON(t, "-l", lib, "d-up", "acc", "--acceptor-m", "0.05")
	for _, k := range []string{"donor", "acceptor", "dg_kcal_mol", "sigma_kcal_mol", "log10_k_eq", "conversion_eq",
		"log10_k_cross_m_s", "f_cross", "donor_h2_margin_kcal_mol", "h2_tendency", "p_h2_atm",
		"log10_k", "donor_bdfe_kcal_mol", "acceptor_bdfe_kcal_mol", "h2_wins", "donor_route"} {
		if _, ok := m[k]; !ok {
			t.Errorf("key %s missing", k)
		}
	}
	if m["log10_k_cross_m_s"] != nil || m["f_cross"] != nil {
		t.Errorf("no k_self: the estimate must be null, got %v, %v", m["log10_k_cross_m_s"], m["f_cross"])
	}
	// ΔG° = 70 − 80 = −10: log K = 10/1.364247 = 7.330 (hand-computed).
	if lk := m["log10_k_eq"].(float64); math.Abs(lk-7.330) > 0.001 {
		t.Errorf("log10_k_eq %v", lk)
	}
	// Typed self-exchange constants give an estimate for library pairs too.
	m = pairJSON(t, "-l", lib, "d-up", "acc", "--k-self-donor", "10", "--k-self-acceptor", "10")
	if m["log10_k_cross_m_s"] == nil {
		t.Errorf("typed k_self: no estimate")
	}
	status, out, _ := runCmd(t, "pair", "-l", lib, "d-up", "acc")
	if status != exitOK || !strings.Contains(out, "rate: –") || !strings.Contains(out, "p(H2) 1 atm") {
		t.Errorf("text form: %d\n%s", status, out)
	}
}

// Self-exchange constants from the library, one of them given by a second
// file; a donor below the H2 line paired downhill says that no rate data
// exist for H2 evolution. (Invented values.)
const kselfLib = `format: hatsieve/1
title: k_self test (invented values)
solvent: acetonitrile
couples:
  - {id: d-low, roles: donor, bdfe: 45 ± 0.5, basis: 2022, source: invented, status: invented, k_self: 100}
  - {id: acc, roles: acceptor, bdfe: 50 ± 0.5, basis: 2022, source: invented, status: invented}
`

func TestPairLibraryKSelf(t *testing.T) {
	lib := writeLib(t, kselfLib)
	m := pairJSON(t, "d-low", "acc", "-l", lib)
	if m["log10_k_cross_m_s"] != nil || !strings.Contains(m["cross_note"].(string), "acceptor") {
		t.Fatalf("acceptor without k_self: %v, %v", m["log10_k_cross_m_s"], m["cross_note"])
	}
	race, _ := m["h2_race"].(string)
	if !strings.Contains(race, "no rate data for H2 evolution; thermodynamics only") {
		t.Fatalf("h2_race %q", race)
	}
	extra := filepath.Join(t.TempDir(), "k.yaml")
	if err := os.WriteFile(extra, []byte("format: hatsieve/1\nk_self:\n  - {couple: acc, value: 1000, factor: 10, source: invented, status: invented}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	m = pairJSON(t, "d-low", "acc", "-l", lib, "-l", extra)
	// ΔG° = −5: the hand-computed route of TestPairTypedCrossAndConversion
	// with log10(100 × 1000) = 5: M = −17, log K = 3.66503,
	// log f = 3.66503²/(4 × −17) = −0.19753, log k = ½(5 + 3.66503 − 0.19753)
	// = 4.2338 (hand-computed).
	if got, _ := m["log10_k_cross_m_s"].(float64); math.Abs(got-4.2338) > 0.001 {
		t.Fatalf("log10_k_cross_m_s %v, hand-computed 4.2338", m["log10_k_cross_m_s"])
	}
	ks, _ := m["k_self_acceptor"].(map[string]any)
	if ks["value_m_s"] != 1000.0 || ks["factor"] != 10.0 || ks["source"] != "invented" {
		t.Fatalf("k_self_acceptor %v", ks)
	}
	// σ(log k)² = [½(1 − L²/(4M²))·log10 10]² + [½(1 + L/(2M))·σ(ΔG°)/2.303RT]²
	// with σ(ΔG°) = √(0.5² + 0.5²) = 0.7071: 0.4942² + (0.4461 × 0.5183)²,
	// σ = 0.5456 (hand-computed).
	if s, _ := m["sigma_log10_k_cross"].(float64); math.Abs(s-0.5456) > 0.001 {
		t.Fatalf("sigma_log10_k_cross %v, hand-computed 0.5456", m["sigma_log10_k_cross"])
	}
	race, _ = m["h2_race"].(string)
	if !strings.Contains(race, "HAT estimated at 10^4.2") {
		t.Fatalf("h2_race %q", race)
	}
}

// A combined donor: one the library forms (listed under combine) and one
// it does not, formed for the pair. Effective BDFE 2.303RT·pKa + F·E° + C_G
// (Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961): pKa 10, E° −1.0 V
// vs Fc, C_G 52.6 (2022 basis) gives 13.642 − 23.061 + 52.6 = 43.18
// (hand-computed). Invented acid and reductants.
const combinedLib = `format: hatsieve/1
title: combined donors (invented values)
solvent: acetonitrile
acids:
  - {id: ha, pka: 10, source: invented, status: invented}
reductants:
  - {id: r1, e0: -1.0 V vs Fc+/Fc, source: invented, status: invented}
  - {id: r2, e0: -1.2 V vs Fc+/Fc, source: invented, status: invented}
combine:
  - ha+r1
couples:
  - {id: acc, roles: acceptor, bdfe: 80 ± 1, basis: 2022, source: invented, status: invented}
`

func TestPairCombinedDonor(t *testing.T) {
	lib := writeLib(t, combinedLib)
	m := pairJSON(t, "ha+r1", "acc", "-l", lib)
	if b := m["donor_bdfe_kcal_mol"].(float64); math.Abs(b-43.18) > 0.01 {
		t.Fatalf("ha+r1 BDFE %v, hand-computed 43.18", b)
	}
	if !strings.Contains(m["stoichiometry"].(string), "per H") {
		t.Errorf("stoichiometry %q", m["stoichiometry"])
	}
	// ha+r2 is not in the combine list: formed for the pair, 0.2 V lower:
	// 43.18 − 0.2 × 23.061 = 38.57 (hand-computed).
	m = pairJSON(t, "ha+r2", "acc", "-l", lib)
	if b := m["donor_bdfe_kcal_mol"].(float64); math.Abs(b-38.57) > 0.01 {
		t.Fatalf("ha+r2 BDFE %v, hand-computed 38.57", b)
	}
	status, out, _ := runCmd(t, "pair", "ha+r2", "acc", "-l", lib)
	if status != exitOK || !strings.Contains(out, "not in the library's combine list") {
		t.Errorf("formed donor not said so:\n%s", out)
	}
	status, _, errOut := runCmd(t, "pair", "ha+r3", "acc", "-l", lib)
	if status != exitData || !strings.Contains(errOut, "unknown donor") {
		t.Errorf("ha+r3: %d %q", status, errOut)
	}
}

// The text and JSON of one pair carry its notes: a gas-phase donor against
// an O–H acceptor in MeCN is compared through ΔG°solv(H•), an approximation
// for non-polar X–H that is weaker for O–H (Warren, Tronic, Mayer, Chem.
// Rev. 2010, 110, 6961, §3.1.1).
func TestPairNotes(t *testing.T) {
	_, out, _ := runCmd(t, "pair", "methane", "tempo-h", "--cross")
	if !strings.Contains(out, "note: different media") || !strings.Contains(out, "note: O–H/N–H") {
		t.Errorf("pair text without the cross-phase notes:\n%s", out)
	}
	_, out, _ = runCmd(t, "pair", "methane", "tempo-h", "--cross", "--format", "json")
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	if n, _ := m["notes"].(string); !strings.Contains(n, "different media") || m["on_estimate"] != false {
		t.Errorf("pair JSON notes %q, on_estimate %v", m["notes"], m["on_estimate"])
	}
}
