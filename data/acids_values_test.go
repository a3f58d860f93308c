package data

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

func loadReagentsLib(t *testing.T, extra ...File) *Library {
	t.Helper()
	lib, err := Load(append(DefaultFiles(), extra...)...)
	if err != nil {
		t.Fatalf("embedded library: %v", err)
	}
	return lib
}

func yamlFile(name, body string) File {
	return File{Name: name, Data: []byte("format: hatsieve/1\n" + body)}
}

func TestEmbeddedReagentsAreSourced(t *testing.T) {
	lib := loadReagentsLib(t)
	var acids, reds int
	for _, a := range lib.Acids {
		if slices.Contains(a.Tags, "invented") {
			continue
		}
		acids++
		if a.Source == "" || a.Status == "" || a.Status == "invented" || a.Solvent == nil {
			t.Errorf("acid %s: source %q, status %q, solvent %v", a.ID, a.Source, a.Status, a.Solvent)
		}
	}
	for _, r := range lib.Reductants {
		if slices.Contains(r.Tags, "invented") {
			continue
		}
		reds++
		if r.Source == "" || r.Status == "" || r.Status == "invented" || r.Solvent == nil {
			t.Errorf("reductant %s: source %q, status %q, solvent %v", r.ID, r.Source, r.Status, r.Solvent)
		}
		// A potential quoted against another electrode says in its note
		// how it was converted.
		if r.E.Vs != r.Solvent.Ref && !strings.Contains(r.Note, "converted") {
			t.Errorf("reductant %s: E° vs %v in %s with no note of the conversion", r.ID, r.E.Vs, r.Solvent.Name)
		}
	}
	if acids < 40 || reds < 25 {
		t.Errorf("%d sourced acids and %d sourced reductants; want at least 40 and 25", acids, reds)
	}
	// The reagent files load on their own (ahead of a user's files).
	if _, err := Load(ReagentFiles()...); err != nil || len(ReagentFiles()) != 2 {
		t.Errorf("reagent files alone: %d files, %v", len(ReagentFiles()), err)
	}
}

func TestEmbeddedReagentValues(t *testing.T) {
	lib := loadReagentsLib(t)
	acid := func(id string) *Acid {
		for _, a := range lib.Acids {
			if a.ID == id {
				return a
			}
		}
		t.Fatalf("no acid %s", id)
		return nil
	}
	for _, c := range []struct {
		id, solvent string
		want        float64
	}{
		// Source: Kütt et al., Eur. J. Org. Chem. 2021, 1407 (abstract): the MeCN
		// scale spans hydrogen iodide (2.8) to indole (32.57).
		{"hi", "acetonitrile", 2.8},
		{"indole", "acetonitrile", 32.57},
		// Source: J. Res. Natl. Bur. Stand. 1967, 71A, 379, Table 1: benzoic
		// acid in water at 25 °C, 4.210.
		{"bzoh-aq", "water", 4.210},
		// Source: K. Gable, Oregon State Univ. CH630 table: acetic acid 4.76
		// (water) and 12.3 (DMSO), benzoic acid 11.0 (DMSO).
		{"acoh-aq", "water", 4.76},
		{"acoh-dmso", "dmso", 12.3},
		{"bzoh-dmso", "dmso", 11.0},
		// Source: W. Reusch, Virtual Textbook of Organic Chemistry (MSU),
		// onium acids: NH4+ 9.25, pyridinium 5.2, 2,6-lutidinium 6.7.
		{"nh4-aq", "water", 9.25},
		{"pyh-aq", "water", 5.2},
		{"lutidinium-aq", "water", 6.7},
		// Source: Leito et al., J. Org. Chem. 1998, 63, 7868 (abstract): the
		// MeCN scale is anchored to picric acid at 11.0.
		{"picric", "acetonitrile", 11.0},
		// Source: Kaljurand et al., J. Org. Chem. 2005, 70, 1019, as quoted
		// in the Wikipedia infoboxes of DMAP, DBU and TBD: 17.95, 24.34, 26.03.
		{"dmaph", "acetonitrile", 17.95},
		{"dbuh", "acetonitrile", 24.34},
		{"tbdh", "acetonitrile", 26.03},
		// Source: Wikipedia, "Bistriflimide" (quoting the Tartu superacid
		// work): TfOH 0.70 and Tf2NH −0.10 in MeCN.
		{"tfoh", "acetonitrile", 0.70},
		{"tf2nh", "acetonitrile", -0.10},
		// Source: Wikipedia infoboxes, "Triethylamine" (Et3NH+ 9.00 in DMSO)
		// and "Guanidine" (13.6 in water).
		{"et3nh-dmso", "dmso", 9.00},
		{"guanidinium-aq", "water", 13.6},
		// Source: Abdur-Rashid et al. (Morris), J. Am. Chem. Soc., doi
		// 10.1021/ja994428d, abstract: [HPCy3]BPh4 anchors the THF scale at 9.7.
		{"hpcy3-thf", "thf", 9.7},
	} {
		a := acid(c.id)
		if a.PKa.V != c.want || a.Solvent.Key != c.solvent || a.Status != "checked" {
			t.Errorf("%s: pKa %g in %s (%s), want %g in %s, checked", c.id, a.PKa.V, a.Solvent.Key, a.Status, c.want, c.solvent)
		}
	}
	// The pKa order in water of the onium acids (same source) holds in
	// MeCN too (Kaljurand et al. 2005, from memory): a sanity check that
	// the MeCN numbers were not swapped.
	for _, pair := range [][2]string{{"ph2nh2", "pyh"}, {"pyh", "lutidinium"}, {"lutidinium", "collidinium"}, {"nh4", "et3nh"}} {
		if acid(pair[0]).PKa.V >= acid(pair[1]).PKa.V {
			t.Errorf("%s should be the stronger acid than %s", pair[0], pair[1])
		}
	}

	// Source: CRC Handbook of Chemistry and Physics, 54th ed., p. D120 (as
	// tabulated by genchem.clearcognition.org): standard potentials vs NHE.
	// Source: Saeki 1985 as tabulated in the dGPredictor redox.tsv data file:
	// methyl viologen MV2+/MV•+ −0.44 V vs NHE.
	for id, want := range map[string]float64{"li-aq": -3.045, "na-aq": -2.711, "zn-aq": -0.7628, "fe2-aq": 0.770, "mv-aq": -0.44} {
		found := false
		for _, r := range lib.Reductants {
			if r.ID != id {
				continue
			}
			found = true
			if r.E.V != want || r.Status != "checked" || r.Solvent.Key != "water" {
				t.Errorf("%s: E° %g (%s) in %s, want %g checked in water", id, r.E.V, r.Status, r.Solvent.Key, want)
			}
		}
		if !found {
			t.Errorf("no reductant %s", id)
		}
	}
	// Source: Connelly, Geiger, Chem. Rev. 1996, 96, 877, as quoted in the
	// English Wikipedia article "Decamethylferrocene" (stored copies):
	// Cp*2Fe+/0 −0.59 V vs Fc+/Fc in acetonitrile (−0.48 V is the other
	// solvent, CH2Cl2).
	for _, r := range lib.Reductants {
		if r.ID == "cpstar2fe" && (r.E.V != -0.59 || r.Status != "checked" || r.Solvent.Key != "acetonitrile") {
			t.Errorf("cpstar2fe: E° %g (%s) in %s, want −0.59 checked in acetonitrile", r.E.V, r.Status, r.Solvent.Key)
		}
	}
	// The superacids keep their order: Tf2NH is the stronger in MeCN (same
	// source).
	if acid("tf2nh").PKa.V >= acid("tfoh").PKa.V {
		t.Error("Tf2NH should be the stronger acid than TfOH in MeCN")
	}

	// SmI2 in THF, −1.33 V vs SCE (Shabangi, Flowers 1997, // from memory), is
	// converted with Fc+/Fc = +0.56 V vs SCE in THF (Connelly, Geiger,
	// Chem. Rev. 1996, 96, 877, Table 1; indirect support in
	// docs/sources-research.md): −1.89 V vs Fc.
	for _, r := range lib.Reductants {
		if r.ID != "smi2-thf" {
			continue
		}
		e, err := r.Solvent.ToRef(r.E)
		if err != nil || math.Abs(e.V-(-1.89)) > 1e-9 {
			t.Errorf("SmI2 in THF: %.3f V vs %v (%v), want −1.89 vs Fc", e.V, e.Vs, err)
		}
	}
}

// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.9: Cp2Fe +
// PhCO2H in MeCN, formal BDFE 83.3 (2010 basis), and NHPI 84.8 (§5.1.2):
// the library's window for NHPI holds that combination with ΔG° −1.5.
func TestLibraryWindowReproducesReview(t *testing.T) {
	lib := loadReagentsLib(t)
	mecn := lib.Solvents.MustLookup("MeCN")
	var nhpi *Couple
	for _, c := range lib.Couples {
		if c.ID == "nhpi" {
			nhpi = c
		}
	}
	cond := thermo.Conditions{Basis: thermo.Basis2010}
	a, err := thermo.Resolve(&nhpi.Couple, cond)
	if err != nil {
		t.Fatal(err)
	}
	w, as, ds, err := lib.DeliveryWindow(&a, mecn, cond, thermo.WindowOptions{})
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, r := range w.Rows {
		if as[r.Acid].ID == "bzoh" && ds[r.Reductant].ID == "fc" {
			found = true
			if math.Abs(r.Donor.BDFE.Kcal-83.3) > 0.2 || math.Abs(r.DG.Kcal+1.5) > 0.3 {
				t.Errorf("Fc + PhCO2H: BDFE %.2f, ΔG° %.2f; the 2010 review gives 83.3 and 84.8", r.Donor.BDFE.Kcal, r.DG.Kcal)
			}
		}
		if as[r.Acid].Solvent != nil && as[r.Acid].Solvent != mecn || ds[r.Reductant].Solvent != nil && ds[r.Reductant].Solvent != mecn {
			t.Errorf("%s+%s: a reagent from another solvent", as[r.Acid].ID, ds[r.Reductant].ID)
		}
	}
	if !found {
		t.Error("Fc + PhCO2H is not in NHPI's window")
	}
	if w.Considered != len(as)*len(ds) || len(as) < 25 {
		t.Errorf("considered %d of %d acids × %d reductants", w.Considered, len(as), len(ds))
	}
}

// reagentsYAML writes n acids and n reductants in MeCN, tagged by parity.
func reagentsYAML(n int, combine string) string {
	var b strings.Builder
	b.WriteString("solvent: MeCN\nacids:\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "  - {id: a%d, pka: %d, tags: [t%d], source: synthetic, status: estimate}\n", i, 5+i%20, i%2)
	}
	b.WriteString("reductants:\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "  - {id: r%d, e0: %.2f V vs Fc+/Fc, tags: [u%d], source: synthetic, status: estimate}\n", i, -0.01*float64(i%150), i%2)
	}
	b.WriteString(combine)
	return b.String()
}

func combinedIDs(lib *Library) []string {
	var ids []string
	for _, c := range lib.Couples {
		if c.AcidID != "" {
			ids = append(ids, c.ID)
		}
	}
	return ids
}

func TestCombineRules(t *testing.T) {
	for _, c := range []struct {
		name, combine string
		want          int
	}{
		{"all keyword", "combine: [all]\n", 36},
		{"id lists", "combine:\n  - {acids: [a0, a1], reductants: [r0, r1, r2]}\n", 6},
		{"tags", "combine:\n  - {acid_tags: [t0], reductant_tags: [u1]}\n", 9},
		{"acids all × one reductant", "combine:\n  - {acids: all, reductant: r5}\n", 6},
		{"overlapping rules and a pair, each pair once", "combine:\n  - a0+r0\n  - {acids: [a0], reductants: all}\n  - {acid_tags: [t0], reductants: [r0]}\n", 8},
		{"no combine list: every pair", "", 36},
	} {
		lib, err := Load(yamlFile("rules.yaml", reagentsYAML(6, c.combine)))
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		ids := combinedIDs(lib)
		if len(ids) != c.want {
			t.Errorf("%s: %d combined donors, want %d", c.name, len(ids), c.want)
		}
		seen := map[string]bool{}
		for _, id := range ids {
			if seen[id] {
				t.Errorf("%s: %s formed twice", c.name, id)
			}
			seen[id] = true
		}
	}
	for _, c := range []struct{ combine, want string }{
		{"combine:\n  - {acids: [a0, zz], reductants: all}\n", `unknown acid "zz"`},
		{"combine:\n  - {acid_tags: [nope], reductants: all}\n", `no acid has the tag "nope"`},
		{"combine:\n  - {acids: [a0]}\n", "say which reductants"},
		{"combine:\n  - {reductant_tags: [u0]}\n", "say which acids"},
		{"combine:\n  - a0+r0\n  - a0+r0\n", "listed twice"},
		{"combine:\n  - {acids: [a0], bogus: 1, reductants: all}\n", "bogus"},
	} {
		_, err := Load(yamlFile("bad.yaml", reagentsYAML(4, c.combine)))
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "bad.yaml:") {
			t.Errorf("%q: error %v, want one naming bad.yaml and %q", c.combine, err, c.want)
		}
	}
}

// A large generated file: combine rules keep the number of combined donors
// bounded, and an all × all that would pass MaxCombined is refused with one
// line instead of filling memory.
func TestCombineCountBounded(t *testing.T) {
	const n = 400 // 160,000 pairs, beyond MaxCombined
	lib, err := Load(yamlFile("big.yaml", reagentsYAML(n, "combine:\n  - {acids: [a1, a2, a3], reductant_tags: [u0]}\n  - a7+r9\n")))
	if err != nil {
		t.Fatal(err)
	}
	if got := len(combinedIDs(lib)); got != 3*n/2+1 {
		t.Errorf("%d combined donors, want %d", got, 3*n/2+1)
	}
	if len(lib.Acids) != n || len(lib.Reductants) != n {
		t.Errorf("%d acids, %d reductants", len(lib.Acids), len(lib.Reductants))
	}
	for _, combine := range []string{"combine: [all]\n", ""} {
		_, err := Load(yamlFile("big.yaml", reagentsYAML(n, combine)))
		if err == nil || !strings.Contains(err.Error(), fmt.Sprint(MaxCombined)) || strings.Count(err.Error(), "\n") > 1 {
			t.Errorf("combine %q on %d × %d: error %v, want one line naming the limit %d", combine, n, n, err, MaxCombined)
		}
	}
	if MaxCombined >= n*n {
		t.Fatalf("the test needs more pairs than MaxCombined")
	}
}

func TestLaterFileOverridesReagent(t *testing.T) {
	user := yamlFile("user.yaml", `acids:
  - {id: pyh, name: my pyridinium, solvent: MeCN, pka: 12.0, source: lab, status: measured}
reductants:
  - {id: cpstar2co, solvent: MeCN, e0: -1.95 V vs Fc+/Fc, source: lab, status: measured}
`)
	lib := loadReagentsLib(t, user)
	n := 0
	for _, a := range lib.Acids {
		if a.ID == "pyh" {
			n++
			if a.PKa.V != 12.0 || a.Source != "lab" {
				t.Errorf("pyh: pKa %g from %q; the user file's acid should win", a.PKa.V, a.Source)
			}
		}
	}
	for _, c := range lib.Couples {
		if c.ID == "ph2nh2+cpstar2co" && c.In.Reductant.V != -1.95 {
			t.Errorf("the curated combination uses E° %g, not the user's -1.95", c.In.Reductant.V)
		}
	}
	if n != 1 {
		t.Errorf("pyh %d times", n)
	}
	// Twice in one file is still a mistake.
	_, err := Load(yamlFile("twice.yaml", "acids:\n  - {id: x, pka: 1}\n  - {id: x, pka: 2}\n"))
	if err == nil || !strings.Contains(err.Error(), "duplicate acid id") {
		t.Errorf("duplicate acid in one file: %v", err)
	}
}

// The window weighs every acid × reductant of a solvent, so it too is
// bounded: past MaxWindowCombinations it says so instead of running on.
func TestWindowCombinationsBounded(t *testing.T) {
	const n = 1001 // 1001² > 10^6
	lib, err := Load(yamlFile("many.yaml", reagentsYAML(n, "combine:\n  - a0+r0\n")+
		"couples:\n  - {id: acc, roles: acceptor, solvent: MeCN, bdfe: 80}\n"))
	if err != nil {
		t.Fatal(err)
	}
	mecn := lib.Solvents.MustLookup("MeCN")
	a, err := thermo.Resolve(&lib.Couples[0].Couple, thermo.Conditions{})
	if err != nil {
		t.Fatal(err)
	}
	if _, _, _, err := lib.DeliveryWindow(&a, mecn, thermo.Conditions{}, thermo.WindowOptions{}); err == nil ||
		!strings.Contains(err.Error(), fmt.Sprint(MaxWindowCombinations)) {
		t.Errorf("%d × %d reagents: error %v, want the limit named", n, n, err)
	}
}

// A published acceptor's window is weighed with published reagents only:
// WithoutInvented drops exactly the demo's invented acids and reductants.
func TestWithoutInvented(t *testing.T) {
	lib, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	out, left := lib.WithoutInvented()
	invented := 0
	for _, a := range lib.Acids {
		if a.Status == StatusInvented {
			invented++
		}
	}
	for _, d := range lib.Reductants {
		if d.Status == StatusInvented {
			invented++
		}
	}
	if invented == 0 || left != invented || len(out.Acids)+len(out.Reductants) != len(lib.Acids)+len(lib.Reductants)-invented {
		t.Fatalf("left out %d of %d invented reagents", left, invented)
	}
	for _, a := range out.Acids {
		if a.Status == StatusInvented {
			t.Errorf("acid %s kept", a.ID)
		}
	}
	if len(out.Couples) != len(lib.Couples) {
		t.Error("couples changed")
	}
}
