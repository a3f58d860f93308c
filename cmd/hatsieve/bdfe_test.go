package main

import (
	"encoding/json"
	"math"
	"slices"
	"sort"
	"strings"
	"testing"
)

// nhpiArgs is the command line of the issue: N-hydroxyphthalimide in MeCN.
var nhpiArgs = []string{"bdfe", "--solvent", "acetonitrile", "--pka", "23.5", "--e0", "-0.1",
	"--vs", "Fc+/Fc", "--cg-basis", "2010", "--format", "json"}

// bdfeKeys is the key set of `bdfe --format json` with energies in kcal/mol:
// the six contract keys first, then the extra keys the command adds.
var (
	bdfeContractKeys = []string{"bdfe_kcal_mol", "sigma_kcal_mol", "solvent", "c_g_kcal_mol",
		"h2_line_kcal_mol", "h2_margin_kcal_mol"}
	bdfeKeys = append(slices.Clone(bdfeContractKeys), "h2_margin_sigma_kcal_mol", "h2_tendency",
		"potential_vs_h2_v", "c_g_basis", "temperature_k", "c_g_sigma_kcal_mol", "c_g_status", "c_g_estimate",
		"h2_verdict_on_estimate", "bdfe_temperature_k", "route", "e_vs", "notes", "p_h2_atm")
)

// bdfeJSON runs a bdfe command line that must succeed and decodes its JSON.
func bdfeJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	status, out, errs := runCmd(t, args...)
	if status != exitOK || errs != "" {
		t.Fatalf("hatsieve %s: status %d, stderr %q", strings.Join(args, " "), status, errs)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatalf("hatsieve %s: output is not a JSON object: %v\n%s", strings.Join(args, " "), err, out)
	}
	return m
}

func num(t *testing.T, m map[string]any, key string) float64 {
	t.Helper()
	v, ok := m[key].(float64)
	if !ok {
		t.Fatalf("key %s: %v (%T) is not a number", key, m[key], m[key])
	}
	return v
}

func within(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if math.Abs(got-want) > tol {
		t.Errorf("%s = %.4f, want %.4f ± %g", what, got, want, tol)
	}
}

func keysOf(m map[string]any) []string {
	k := make([]string, 0, len(m))
	for x := range m {
		k = append(k, x)
	}
	sort.Strings(k)
	return k
}

func sameKeys(t *testing.T, what string, m map[string]any, want []string) {
	t.Helper()
	w := slices.Clone(want)
	sort.Strings(w)
	if got := keysOf(m); !slices.Equal(got, w) {
		t.Errorf("%s: keys %q, want %q", what, got, w)
	}
}

const (
	faradayKcal = 23.0605 // kcal mol⁻¹ V⁻¹, CODATA 2018 (checked in thermo against gonum)
	rtLn10      = 1.3642  // kcal/mol at 298.15 K, CODATA 2018
)

func TestBDFEJSONNHPI(t *testing.T) {
	m := bdfeJSON(t, nhpiArgs...)
	sameKeys(t, "bdfe json", m, bdfeKeys)
	for _, k := range bdfeContractKeys {
		if _, ok := m[k]; !ok {
			t.Errorf("contract key %s missing", k)
		}
	}
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.1.2: NHPI O–H 84.8 kcal/mol
	// in MeCN (2010 basis) from pKa 23.5 and E°(PINO•/PINO⁻) −0.1 V vs Fc.
	bdfe := num(t, m, "bdfe_kcal_mol")
	within(t, "NHPI bdfe_kcal_mol", bdfe, 84.8, 0.2)
	if m["solvent"] != "acetonitrile" || m["c_g_basis"] != "2010" || m["h2_tendency"] != "uphill" {
		t.Errorf("solvent %v, basis %v, tendency %v", m["solvent"], m["c_g_basis"], m["h2_tendency"])
	}
	within(t, "temperature_k", num(t, m, "temperature_k"), 298.15, 0)
	// C_G(2010, MeCN) 54.9: derived, it reproduces the 2010 review's NHPI and Fc/benzoic-acid examples.
	cg := num(t, m, "c_g_kcal_mol")
	within(t, "c_g_kcal_mol", cg, 54.9, 1e-9)
	// The cycle itself, with CODATA constants: 2.303RT·pKa + F·E° + C_G.
	within(t, "bdfe = cycle", bdfe, rtLn10*23.5+faradayKcal*-0.1+cg, 0.002)
	// H2 line on the 2010 basis, C_G + F·E°(H+/H2) with E°(H+/H2) = −0.028 V vs Fc
	// (Roberts, Bullock, Inorg. Chem. 2013, 52, 3823): 54.25 (derived).
	gh := num(t, m, "h2_line_kcal_mol")
	within(t, "h2_line_kcal_mol", gh, 54.25, 0.01)
	margin := num(t, m, "h2_margin_kcal_mol")
	within(t, "margin = bdfe − line", margin, bdfe-gh, 2e-4)
	within(t, "potential_vs_h2_v = margin/F", num(t, m, "potential_vs_h2_v"), margin/faradayKcal, 2e-4)
	// σ with the assumed defaults pKa ±0.5, E° ±0.02 V (common practice, no source) and
	// σ(C_G) 1 kcal/mol (the table's estimate).
	within(t, "sigma_kcal_mol", num(t, m, "sigma_kcal_mol"),
		math.Sqrt(math.Pow(rtLn10*0.5, 2)+math.Pow(faradayKcal*0.02, 2)+1), 2e-3)
	// In the margin C_G cancels: σ is the data and E°(H+/H2) (±0.004 V) only.
	within(t, "h2_margin_sigma_kcal_mol", num(t, m, "h2_margin_sigma_kcal_mol"),
		math.Sqrt(math.Pow(rtLn10*0.5, 2)+math.Pow(faradayKcal*0.02, 2)+math.Pow(faradayKcal*0.004, 2)), 2e-3)

	// Given σ are used, not the defaults.
	m = bdfeJSON(t, append(slices.Clone(nhpiArgs), "--pka-sigma", "0", "--e0-sigma", "0.01")...)
	within(t, "sigma with given σ", num(t, m, "sigma_kcal_mol"), math.Hypot(faradayKcal*0.01, 1), 2e-3)
}

func TestBDFEUnitsKJ(t *testing.T) {
	kcal := bdfeJSON(t, nhpiArgs...)
	kj := bdfeJSON(t, append(slices.Clone(nhpiArgs), "--units", "kj")...)
	want := []string{}
	for _, k := range bdfeKeys {
		want = append(want, strings.Replace(k, "_kcal_mol", "_kj_mol", 1))
	}
	sameKeys(t, "bdfe --units kj", kj, want)
	for _, k := range bdfeKeys {
		kk := strings.Replace(k, "_kcal_mol", "_kj_mol", 1)
		if kk == k {
			if kj[k] != kcal[k] {
				t.Errorf("%s: %v with kj, %v with kcal; it is not an energy", k, kj[k], kcal[k])
			}
			continue
		}
		// Source: thermochemical calorie, 1 kcal = 4.184 kJ exactly (NIST SP 811).
		within(t, kk, num(t, kj, kk), 4.184*num(t, kcal, k), 1e-3)
	}
	// The spelling of the unit is forgiving.
	for _, u := range []string{"KJ", "kJ/mol"} {
		m := bdfeJSON(t, append(slices.Clone(nhpiArgs), "--units", u)...)
		if _, ok := m["bdfe_kj_mol"]; !ok {
			t.Errorf("--units %s: no bdfe_kj_mol key", u)
		}
	}
}

func TestBDFECGOverrideWins(t *testing.T) {
	base := bdfeJSON(t, nhpiArgs...)
	for _, basis := range []string{"2010", "2022"} {
		args := []string{"bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--cg-basis", basis,
			"--cg", "60", "--format", "json"}
		m := bdfeJSON(t, args...)
		within(t, "c_g with --cg ("+basis+")", num(t, m, "c_g_kcal_mol"), 60, 0)
		within(t, "bdfe with --cg ("+basis+")", num(t, m, "bdfe_kcal_mol"), num(t, base, "bdfe_kcal_mol")-54.9+60, 2e-4)
		// The H2 line moves with C_G (C_G + F·E°(H+/H2)), so the margin does not.
		within(t, "h2 line with --cg", num(t, m, "h2_line_kcal_mol"), 60+faradayKcal*-0.028, 2e-4)
		within(t, "margin with --cg", num(t, m, "h2_margin_kcal_mol"), num(t, base, "h2_margin_kcal_mol"), 2e-4)
	}
}

func TestBDFEDefaultsAndElectrodes(t *testing.T) {
	// Default basis is 2022 (README.md): the BDFE moves with C_G, the margin does not.
	m22 := bdfeJSON(t, "bdfe", "--solvent", "acetonitrile", "--pka", "23.5", "--e0", "-0.1", "--format", "json")
	m10 := bdfeJSON(t, nhpiArgs...)
	if m22["c_g_basis"] != "2022" {
		t.Errorf("default basis %v, want 2022", m22["c_g_basis"])
	}
	within(t, "BDFE 2022 − 2010", num(t, m22, "bdfe_kcal_mol")-num(t, m10, "bdfe_kcal_mol"),
		num(t, m22, "c_g_kcal_mol")-num(t, m10, "c_g_kcal_mol"), 2e-4)
	within(t, "margin on both bases", num(t, m22, "h2_margin_kcal_mol"), num(t, m10, "h2_margin_kcal_mol"), 2e-4)
	// Without --vs, Fc+/Fc in MeCN (README.md); --vs is case-insensitive.
	for _, vs := range []string{"", "fc+/fc", "FC"} {
		args := []string{"bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--cg-basis", "2010", "--format", "json"}
		if vs != "" {
			args = append(args, "--vs", vs)
		}
		within(t, "bdfe --vs "+vs, num(t, bdfeJSON(t, args...), "bdfe_kcal_mol"), num(t, m10, "bdfe_kcal_mol"), 0)
	}

	// Source: Agarwal et al., Chem. Rev. 2022, 122, 1, Table 13: hydrazine in water,
	// pKa(H2NNH2•+) 7.2, E° 0.69 V vs SHE → E°(V vs H2) 1.12 V. Water defaults to NHE.
	hz := []string{"bdfe", "--solvent", "water", "--pka", "7.2", "--format", "json"}
	m := bdfeJSON(t, append(slices.Clone(hz), "--e0", "0.69")...)
	within(t, "hydrazine potential_vs_h2_v", num(t, m, "potential_vs_h2_v"), 1.12, 0.006)
	// Same table row: BDFE 78.5 on the 2022 basis.
	within(t, "hydrazine bdfe (water, 2022)", num(t, m, "bdfe_kcal_mol"), 78.5, 0.1)
	// Source: CRC Handbook, SCE = +0.241 V vs NHE; Ag/AgCl (sat. KCl) +0.197…0.199 V.
	for _, x := range []struct {
		vs  string
		e   float64
		tol float64
	}{{"SHE", 0.69, 0}, {"nhe", 0.69, 0}, {"SCE", 0.69 - 0.241, 2e-4}, {"Ag/AgCl", 0.69 - 0.198, faradayKcal * 0.0011}} {
		mx := bdfeJSON(t, append(slices.Clone(hz), "--e0", strconvF(x.e), "--vs", x.vs)...)
		within(t, "hydrazine via "+x.vs, num(t, mx, "bdfe_kcal_mol"), num(t, m, "bdfe_kcal_mol"), x.tol)
	}
}

func strconvF(v float64) string { b, _ := json.Marshal(v); return string(b) }

func TestBDFEText(t *testing.T) {
	args := []string{"bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--cg-basis", "2010"}
	status, out, errs := runCmd(t, args...)
	if status != exitOK || errs != "" {
		t.Fatalf("status %d, stderr %q", status, errs)
	}
	for _, want := range []string{"BDFE        84.7 ± 1.3 kcal/mol", "acetonitrile", "C_G basis 2010",
		"54.90", "H2 line     54.25", "uphill", "assumed", "vs Fc+/Fc"} {
		if !strings.Contains(out, want) {
			t.Errorf("text output lacks %q:\n%s", want, out)
		}
	}
	// kJ text: the BDFE 84.65 kcal/mol is 354.2 kJ/mol.
	_, out, _ = runCmd(t, append(args, "--units", "kj")...)
	first, _, _ := strings.Cut(out, "\n")
	if !strings.HasPrefix(first, "BDFE        354.2 ± 5.4 kJ/mol") {
		t.Errorf("kJ text output:\n%s", out)
	}
	for _, line := range strings.Split(out, "\n") {
		// (a source may say "σ 1 kcal/mol"; the numbers themselves are in kJ)
		if strings.HasPrefix(line, "H2 ") && !strings.Contains(line, "kJ/mol") {
			t.Errorf("kJ text line without kJ/mol: %q", line)
		}
	}
}

func TestBDFEBadInput(t *testing.T) {
	ok := []string{"bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1"}
	with := func(extra ...string) []string { return append(slices.Clone(ok), extra...) }
	for _, x := range []struct {
		args   []string
		status int
		says   string // a word the one error line must contain
	}{
		// bad usage: exit 2
		{[]string{"bdfe"}, exitUsage, "--solvent"},
		{[]string{"bdfe", "--pka", "1", "--e0", "0"}, exitUsage, "--solvent"},
		{[]string{"bdfe", "--solvent", "MeCN", "--e0", "0"}, exitUsage, "--pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "1"}, exitUsage, "--e0"},
		{with("--format", "xml"), exitUsage, "format"},
		{with("--units", "furlong"), exitUsage, "units"},
		{with("--cg-basis", "2015"), exitUsage, "cg-basis"},
		{with("--cg-basis", "absolute"), exitUsage, "cg-basis"},
		{with("--vs", "Hg/HgO"), exitUsage, "electrode"},
		{with("--bogus"), exitUsage, "bogus"},
		{with("extra"), exitUsage, "extra"},
		{with("--temperature", "0"), exitUsage, "temperature"},
		{with("--temperature", "NaN"), exitUsage, "temperature"},
		{with("--temperature", "-4"), exitUsage, "temperature"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "NaN", "--e0", "0"}, exitUsage, "pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "nan", "--e0", "0"}, exitUsage, "pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "1", "--e0", "inf"}, exitUsage, "e0"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "1e400", "--e0", "0"}, exitUsage, "pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "twelve", "--e0", "0"}, exitUsage, "pka"},
		{with("--cg", "NaN"), exitUsage, "cg"},
		{with("--e0-sigma", "-Inf"), exitUsage, "e0-sigma"},
		// bad values: exit 1
		{[]string{"bdfe", "--solvent", "acetonitrle", "--pka", "1", "--e0", "0"}, exitData, "did you mean acetonitrile"},
		{[]string{"bdfe", "--solvent", "ethanol-ish", "--pka", "1", "--e0", "0"}, exitData, "unknown solvent"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "200", "--e0", "0"}, exitData, "pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "-40", "--e0", "0"}, exitData, "pka"},
		{[]string{"bdfe", "--solvent", "MeCN", "--pka", "1", "--e0", "12"}, exitData, "e0"},
		{with("--pka-sigma", "-1"), exitData, "pka-sigma"},
		{with("--e0-sigma", "-0.01"), exitData, "e0-sigma"},
		{[]string{"bdfe", "--solvent", "water", "--pka", "7", "--e0", "0", "--vs", "Fc+/Fc"}, exitData, "Fc+/Fc"},
		{[]string{"bdfe", "--solvent", "methanol", "--pka", "7", "--e0", "0", "--vs", "SCE"}, exitData, "SCE"},
		{[]string{"bdfe", "--solvent", "gas", "--pka", "7", "--e0", "0"}, exitData, "gas"},
		{[]string{"bdfe", "--solvent", "gas", "--pka", "7", "--e0", "0", "--cg", "50"}, exitData, "gas"},
	} {
		status, out, errs := runCmd(t, x.args...)
		if status != x.status {
			t.Errorf("hatsieve %s: status %d, want %d (stderr %q)", strings.Join(x.args, " "), status, x.status, errs)
		}
		if out != "" {
			t.Errorf("hatsieve %s: wrote %q to stdout on error", strings.Join(x.args, " "), out)
		}
		oneErrorLine(t, x.args, errs)
		if !strings.Contains(strings.ToLower(errs), strings.ToLower(x.says)) {
			t.Errorf("hatsieve %s: error %q does not mention %q", strings.Join(x.args, " "), errs, x.says)
		}
	}
}

// FuzzBDFEArgs feeds arbitrary option values to bdfe: it must exit 0, 1 or 2,
// never panic, print one error line on failure, and valid finite JSON on success.
func FuzzBDFEArgs(f *testing.F) {
	f.Add("acetonitrile", "23.5", "-0.1", "Fc+/Fc", "2010", "kcal")
	f.Add("water", "7.2", "0.69", "SHE", "2022", "kj")
	f.Add("gas", "NaN", "1e999", "", "absolute", "")
	f.Add("dmso", "-30", "-5", "ag/agcl", "2010", "KJ/mol")
	f.Fuzz(func(t *testing.T, solvent, pka, e0, vs, basis, units string) {
		args := []string{"bdfe", "--solvent", solvent, "--pka", pka, "--e0", e0, "--format", "json"}
		if vs != "" {
			args = append(args, "--vs", vs)
		}
		if basis != "" {
			args = append(args, "--cg-basis", basis)
		}
		if units != "" {
			args = append(args, "--units", units)
		}
		status, out, errs := runCmd(t, args...)
		switch status {
		case exitOK:
			var m map[string]any
			if err := json.Unmarshal([]byte(out), &m); err != nil {
				t.Fatalf("%q: bad JSON %v: %s", args, err, out)
			}
			for k, v := range m {
				if f, ok := v.(float64); ok && (math.IsNaN(f) || math.IsInf(f, 0)) {
					t.Fatalf("%q: %s = %v", args, k, v)
				}
				if v == nil {
					t.Fatalf("%q: %s is null", args, k)
				}
			}
			if errs != "" {
				t.Fatalf("%q: success with stderr %q", args, errs)
			}
		case exitData, exitUsage:
			oneErrorLine(t, args, errs)
		default:
			t.Fatalf("%q: status %d", args, status)
		}
	})
}

// Values pasted from a paper often carry the Unicode minus sign; the = form
// of a flag works as well.
func TestBDFEUnicodeMinusAndEqualsForm(t *testing.T) {
	want := num(t, bdfeJSON(t, nhpiArgs...), "bdfe_kcal_mol")
	for _, args := range [][]string{
		{"bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "−0.1", "--cg-basis", "2010", "--format", "json"},
		{"bdfe", "--solvent=MeCN", "--pka=23.5", "--e0=-0.1", "--cg-basis=2010", "--format=json"},
		{"bdfe", "-solvent", "MeCN", "-pka", "23.5", "-e0", "-0.1", "-cg-basis", "2010", "-format", "json"},
	} {
		within(t, strings.Join(args, " "), num(t, bdfeJSON(t, args...), "bdfe_kcal_mol"), want, 0)
	}
}

// --cg is reported as an explicit basis with its σ; --cg-sigma sets the σ.
func TestBDFEExplicitCG(t *testing.T) {
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.1.2: NHPI
	// with C_G 54.9 gives 84.8 (1.37·23.5 − 23.06·0.1 + 54.9; we use 2.303RT = 1.3642).
	m := bdfeJSON(t, "bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--cg", "54.9", "--format", "json")
	if m["c_g_basis"] != "explicit" || m["c_g_status"] != "user" {
		t.Errorf("--cg: basis %v, status %v", m["c_g_basis"], m["c_g_status"])
	}
	within(t, "NHPI BDFE", num(t, m, "bdfe_kcal_mol"), 84.8, 0.2)
	within(t, "C_G σ from the table", num(t, m, "c_g_sigma_kcal_mol"), 1.0, 0)
	m = bdfeJSON(t, "bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--cg", "54.9", "--cg-sigma", "0",
		"--pka-sigma", "0", "--e0-sigma", "0", "--format", "json")
	within(t, "σ with exact inputs and --cg-sigma 0", num(t, m, "sigma_kcal_mol"), 0, 0)
	status, _, errs := runCmd(t, "bdfe", "--solvent", "MeCN", "--pka", "1", "--e0", "0", "--cg-sigma", "1")
	if status != exitUsage || !strings.Contains(errs, "cg-sigma") {
		t.Errorf("--cg-sigma without --cg: status %d, %q", status, errs)
	}
}

// --temperature changes neither the BDFE nor what it is quoted at.
func TestBDFETemperatureKeys(t *testing.T) {
	a := bdfeJSON(t, append(nhpiArgs, "--temperature", "323.15")...)
	b := bdfeJSON(t, nhpiArgs...)
	within(t, "BDFE at 323.15 K", num(t, a, "bdfe_kcal_mol"), num(t, b, "bdfe_kcal_mol"), 0)
	within(t, "bdfe_temperature_k", num(t, a, "bdfe_temperature_k"), 298.15, 0)
	within(t, "temperature_k", num(t, a, "temperature_k"), 323.15, 0)
}

// Water at pH 7 with a potential vs RHE: BDFE = F·E(vs RHE) + C_G, since
// 2.303RT·pH and F·0.05916·pH cancel (Nernst slope from CODATA R and F).
func TestBDFEWaterPHvsRHE(t *testing.T) {
	m := bdfeJSON(t, "bdfe", "--solvent", "water", "--ph", "7", "--e0", "0.5", "--vs", "RHE", "--format", "json")
	cg := num(t, m, "c_g_kcal_mol")
	within(t, "BDFE vs RHE", num(t, m, "bdfe_kcal_mol"), 23.0605*0.5+cg, 0.01)
	within(t, "E vs RHE", num(t, m, "e_vs_rhe_v"), 0.5, 1e-9)
	within(t, "pH", num(t, m, "ph"), 7, 0)
	// The same potential vs NHE: E(NHE) = 0.5 − 0.0592·7.
	n := bdfeJSON(t, "bdfe", "--solvent", "water", "--ph", "7", "--e0", "0.0859", "--vs", "NHE", "--format", "json")
	within(t, "vs NHE at pH 7", num(t, n, "bdfe_kcal_mol"), num(t, m, "bdfe_kcal_mol"), 0.01)
	for _, bad := range [][]string{
		{"bdfe", "--solvent", "MeCN", "--ph", "7", "--e0", "0.5"},
		{"bdfe", "--solvent", "water", "--ph", "30", "--e0", "0.5"},
	} {
		if status, _, errs := runCmd(t, bad...); status != exitUsage || !strings.Contains(errs, "ph") {
			t.Errorf("%q: status %d, %q", bad, status, errs)
		}
	}
	if status, _, errs := runCmd(t, "bdfe", "--solvent", "water", "--pka", "7", "--e0", "0.5", "--vs", "RHE"); status != exitData || !strings.Contains(errs, "pH") {
		t.Errorf("RHE without a pH: status %d, %q", status, errs)
	}
}

// --vs Ag/Ag+ works in MeCN: Fc+/Fc is +0.082 V vs Ag/Ag+ (0.01 M AgNO3)
// (Pavlishchuk, Addison, Inorg. Chim. Acta 2000, 298, 97, as quoted; from memory).
func TestBDFEVsAgAgInMeCN(t *testing.T) {
	a := bdfeJSON(t, "bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.018", "--vs", "ag/ag+", "--format", "json")
	b := bdfeJSON(t, "bdfe", "--solvent", "MeCN", "--pka", "23.5", "--e0", "-0.1", "--vs", "Fc+/Fc", "--format", "json")
	within(t, "Ag/Ag+ and Fc+/Fc agree", num(t, a, "bdfe_kcal_mol"), num(t, b, "bdfe_kcal_mol"), 1e-9)
	if num(t, a, "sigma_kcal_mol") <= num(t, b, "sigma_kcal_mol") {
		t.Error("the conversion should add σ")
	}
}
