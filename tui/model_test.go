package tui

import (
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

func TestLoadShowsEveryPair(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	// 5 donors × 4 acceptors, less kelp with itself (it plays both roles).
	if got := m.grids[panePairs].len(); got != 19 {
		t.Fatalf("Pairs rows = %d, want 19", got)
	}
	if m.t.total != 19 || m.t.capped {
		t.Errorf("total %d capped %v, want 19 and not capped", m.t.total, m.t.capped)
	}
	if !strings.Contains(screen(m), "8 of 8 couples: all bonds in acetonitrile · 19 pairs") ||
		!strings.Contains(screen(m), "5 donors × 4 acceptors") {
		t.Errorf("top line does not count 19 pairs:\n%s", screen(m))
	}
	// Default order: ΔG° ascending, so the first row is the most favourable.
	p := m.selectedPair()
	for _, q := range m.t.pairs {
		if q.DG.Kcal < p.DG.Kcal {
			t.Fatalf("first row ΔG° %.2f but %s→%s has %.2f", p.DG.Kcal, q.Donor.Couple.ID, q.Acceptor.Couple.ID, q.DG.Kcal)
		}
	}
}

func TestCycleDerivedBDFEOnScreen(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	// vexol: pKa 24.0 and E°(X•/X−) −1.10 V vs Fc+/Fc in MeCN.
	// BDFE = 1.37·pKa + 23.06·E° + C_G (Source: Warren, Tronic, Mayer,
	// Chem. Rev. 2010, 110, 6961, eq 7 and Table 1); on the 2010 basis
	// C_G(MeCN) = 54.9 kcal/mol (same source, Table 1), and 2.303RT =
	// 1.3642, F = 23.0605 kcal mol⁻¹ V⁻¹ from CODATA 2018 R and F.
	want2010 := 1.3642*24.0 + 23.0605*(-1.10) + 54.9
	m = keys(t, m, "b") // to the 2010 basis
	if m.t.ev.Cond.Basis != thermo.Basis2010 {
		t.Fatalf("basis = %v after b, want 2010", m.t.ev.Cond.Basis)
	}
	m = keys(t, m, "2")
	var got float64
	for i, e := range m.t.donors {
		if e.ID == "vexol" {
			got = e.R.BDFE.Kcal
			m.grids[paneDonors].cursor = slices.Index(m.grids[paneDonors].perm, int32(i))
		}
	}
	if math.Abs(got-want2010) > 0.01 {
		t.Errorf("vexol BDFE on the 2010 basis = %.3f, want %.3f", got, want2010)
	}
	if !strings.Contains(screen(m), strconv.FormatFloat(want2010, 'f', 1, 64)) {
		t.Errorf("the Donors pane does not show %.1f:\n%s", want2010, screen(m))
	}
	if !strings.Contains(screen(m), "C_G 54.90 kcal/mol vs Fc+/Fc (2010 basis)") {
		t.Errorf("top line does not show the 2010 basis:\n%s", screen(m))
	}
}

func TestUnitsToggle(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	dg := m.selectedPair().DG.Kcal
	m = keys(t, m, "u")
	if m.units != thermo.KJ {
		t.Fatal("u did not switch to kJ/mol")
	}
	// 1 kcal = 4.184 kJ (thermochemical calorie; NIST SP 811, B.8).
	want := strconv.FormatFloat(dg*4.184, 'f', 1, 64)
	if s := screen(m); !strings.Contains(s, want) || !strings.Contains(s, "kJ/mol") {
		t.Errorf("after u the screen lacks %s kJ/mol:\n%s", want, s)
	}
	m = keys(t, m, "u")
	if m.units != thermo.Kcal {
		t.Error("u did not switch back to kcal/mol")
	}
}

func TestCursorKeys(t *testing.T) {
	m := open(t, testLibrary(), 80, 12, t.TempDir()) // 6 visible rows
	g := func() grid { return m.grids[panePairs] }
	for _, c := range []struct {
		key          string
		cursor       int
		offsetAtMost int
	}{
		{"down", 1, 0}, {"j", 2, 0}, {"k", 1, 0}, {"up", 0, 0}, {"up", 0, 0},
		{"pgdown", 6, 6}, {"end", 18, 18}, {"pgup", 12, 12}, {"home", 0, 0},
	} {
		m = keys(t, m, c.key)
		if g().cursor != c.cursor {
			t.Fatalf("after %s cursor = %d, want %d", c.key, g().cursor, c.cursor)
		}
		if g().cursor < g().offset || g().cursor >= g().offset+g().height {
			t.Fatalf("after %s cursor %d is off screen (offset %d, height %d)", c.key, g().cursor, g().offset, g().height)
		}
	}
	checkFrame(t, m, 80, 12)
}

func TestTabsAndNumberKeys(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	for _, c := range []struct {
		key  string
		want pane
	}{
		{"tab", paneDonors}, {"tab", paneAcceptors}, {"shift+tab", paneDonors}, {"5", paneScale},
		{"tab", panePairs}, {"shift+tab", paneScale}, {"4", paneSeries}, {"1", panePairs},
	} {
		m = keys(t, m, c.key)
		if m.tab != c.want {
			t.Fatalf("after %s tab = %s, want %s", c.key, paneNames[m.tab], paneNames[c.want])
		}
	}
}

func TestSortCyclesAndReverses(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "s") // ΔG° → σ
	g := m.grids[panePairs]
	if g.sortCol != pairSigma || g.desc() {
		t.Fatalf("after s: column %d desc %v, want σ ascending", g.sortCol, g.desc())
	}
	sig := func(i int) float64 { return m.t.pairs[m.grids[panePairs].perm[i]].DG.Sigma() }
	for i := 1; i < g.len(); i++ {
		if sig(i) < sig(i-1) {
			t.Fatalf("rows %d,%d not ascending in σ: %.3f then %.3f", i-1, i, sig(i-1), sig(i))
		}
	}
	if !strings.Contains(screen(m), "σ↑") || !strings.Contains(screen(m), "sort σ ascending") {
		t.Errorf("header does not show σ↑:\n%s", screen(m))
	}
	m = keys(t, m, "S")
	for i := 1; i < m.grids[panePairs].len(); i++ {
		if sig(i) > sig(i-1) {
			t.Fatalf("after S rows %d,%d not descending: %.3f then %.3f", i-1, i, sig(i-1), sig(i))
		}
	}
	if !strings.Contains(screen(m), "σ↓") {
		t.Errorf("header does not show σ↓")
	}
	// Cycling wraps round every column back to the first.
	for range len(pairCols) {
		m = keys(t, m, "s")
	}
	if m.grids[panePairs].sortCol != 3 {
		t.Errorf("after a full cycle sort column = %d, want 3", m.grids[panePairs].sortCol)
	}
	// Text columns sort by name.
	for m.grids[panePairs].sortCol != pairAcc {
		m = keys(t, m, "s")
	}
	for i := 1; i < m.grids[panePairs].len(); i++ {
		a := m.t.pairs[m.grids[panePairs].perm[i-1]].Acceptor.Couple.Name
		b := m.t.pairs[m.grids[panePairs].perm[i]].Acceptor.Couple.Name
		if (b < a) != m.grids[panePairs].desc() && a != b {
			t.Fatalf("acceptor order broken at %d: %s then %s", i, a, b)
		}
	}
}

func TestStaleReorderIsDropped(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	mm, old := m.Update(keyMsg("s")) // σ
	m = mm.(Model)
	mm, newer := m.Update(keyMsg("S")) // σ descending
	m = mm.(Model)
	newMsg, oldMsg := newer(), old()
	m = send(t, m, newMsg)
	want := slices.Clone(m.grids[panePairs].perm)
	m = send(t, m, oldMsg) // arrives late
	if !slices.Equal(m.grids[panePairs].perm, want) {
		t.Fatal("a stale reorder result replaced a newer one")
	}
	if m.grids[panePairs].pending {
		t.Error("grid still pending after its latest job landed")
	}
}

func TestFilterKeepsGlobalKeysAway(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "/")
	if focus(m) != "filter" {
		t.Fatal("/ did not open the filter")
	}
	mm, cmd := m.Update(keyMsg("q"))
	m = drain(t, mm.(Model), cmd)
	if focus(m) != "filter" || m.grids[panePairs].query != "q" {
		t.Fatalf("typing q in the filter: focus %q query %q", focus(m), m.grids[panePairs].query)
	}
	if cmd != nil {
		if _, quit := cmd().(tea.QuitMsg); quit {
			t.Fatal("q in the filter box quits")
		}
	}
	m = keys(t, m, "backspace", "t", "a", "r", "n", "2", "s")
	if got := m.grids[panePairs].query; got != "tarn2s" {
		t.Fatalf("query = %q, want tarn2s (digits and s typed, not acted on)", got)
	}
	if m.tab != panePairs || m.grids[panePairs].sortCol != 2 {
		t.Fatal("keys typed in the filter acted as global keys")
	}
	m = keys(t, m, "backspace", "backspace", "enter")
	if focus(m) != "" || m.grids[panePairs].query != "tarn" {
		t.Fatalf("enter: focus %q query %q", focus(m), m.grids[panePairs].query)
	}
	for _, r := range m.grids[panePairs].perm {
		p := m.t.pairs[r]
		if p.Donor.Couple.ID != "tarn" && p.Acceptor.Couple.ID != "tarn" {
			t.Fatalf("filter tarn kept %s→%s", p.Donor.Couple.ID, p.Acceptor.Couple.ID)
		}
	}
	if got := m.grids[panePairs].len(); got != 5 {
		t.Errorf("filter tarn keeps %d rows, want 5 (one per donor)", got)
	}
	m = keys(t, m, "/", "esc")
	if m.grids[panePairs].query != "" || m.grids[panePairs].len() != 19 {
		t.Errorf("esc did not clear the filter: %q, %d rows", m.grids[panePairs].query, m.grids[panePairs].len())
	}
	m = keys(t, m, "/", "z", "z", "z", "enter")
	if !strings.Contains(screen(m), `no pairs match "zzz"`) {
		t.Errorf("empty filter result not explained:\n%s", screen(m))
	}
}

func TestQuitKeys(t *testing.T) {
	for _, k := range []string{"q", "ctrl+c"} {
		m := open(t, testLibrary(), 80, 24, t.TempDir())
		_, cmd := m.Update(keyMsg(k))
		if cmd == nil {
			t.Fatalf("%s returns no command", k)
		}
		if _, ok := cmd().(tea.QuitMsg); !ok {
			t.Errorf("%s does not quit", k)
		}
	}
	// q quits from help and from the detail panel too.
	for _, first := range []string{"?", "enter"} {
		m := open(t, testLibrary(), 80, 24, t.TempDir())
		m = keys(t, m, first)
		if !quits(t, m, "q") {
			t.Errorf("q after %s does not quit", first)
		}
	}
	// ctrl+c quits even from the filter box; q there is text.
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "/")
	_, cmd := m.Update(keyMsg("ctrl+c"))
	if cmd == nil {
		t.Fatal("ctrl+c in the filter returns no command")
	}
	if _, ok := cmd().(tea.QuitMsg); !ok {
		t.Error("ctrl+c in the filter does not quit")
	}
}

func TestDetailPanel(t *testing.T) {
	m := open(t, testLibrary(), 100, 60, t.TempDir())
	// Select zorbic+quen → mur: a combined donor and an acceptor below the H2 line.
	m = keys(t, m, "/", "m", "u", "r", "enter")
	for m.selectedPair().Donor.Couple.ID != "zorbic+quen" {
		m = keys(t, m, "down")
	}
	m = keys(t, m, "enter")
	if focus(m) != "detail" {
		t.Fatal("enter did not open the detail panel")
	}
	s := screen(m)
	for _, want := range []string{"ΔG°(HAT)", "log K", "H2 wins", "Electrode view", "H2 evolution from this acid begins",
		"source: invented demo", "Donor H2 margin", "Acceptor H2 margin", "First step"} {
		if !strings.Contains(s, want) {
			t.Errorf("detail lacks %q:\n%s", want, s)
		}
	}
	// Electrode view numbers: E = (BDFE_A − C_G − 2.303RT·pKa)/F and
	// E = (G_H − C_G − 2.303RT·pKa)/F (Agarwal et al., Chem. Rev. 2022,
	// 122, 1, the effective-BDFE relation solved for the potential).
	cg, _ := m.t.ev.Cond.CGOf(m.t.ev.Working)
	k, f := 1.3642, 23.0605
	onset := (m.t.ev.H2Line.V - cg.V - k*12.0) / f
	if !strings.Contains(s, strconv.FormatFloat(onset, 'f', 3, 64)) {
		t.Errorf("H2 onset %.3f V not shown:\n%s", onset, s)
	}
	m = keys(t, m, "esc")
	if focus(m) != "" {
		t.Error("esc did not close the detail")
	}
	// A couple with a full square scheme shows its edges.
	m = keys(t, m, "3", "enter")
	if !strings.Contains(screen(m), "square scheme") && !strings.Contains(screen(m), "H2 margin") {
		t.Errorf("acceptor detail:\n%s", screen(m))
	}
	m = keys(t, m, "esc", "/", "o", "l", "i", "x", "enter", "enter")
	s = screen(m)
	for _, want := range []string{"square scheme", "XH•+", "X⁻", "+0.950 V vs Fc+/Fc", "-0.450 V vs Fc+/Fc", "pKa -2.00", "pKa 18.50"} {
		if !strings.Contains(s, want) {
			t.Errorf("olix square scheme lacks %q:\n%s", want, s)
		}
	}
}

func TestSeriesFollowsDonorAndMarksBottleneck(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "2", "/", "q", "u", "i", "l", "o", "enter", "down", "up", "4")
	if m.seriesDonor == nil || m.seriesDonor.Couple.ID != "quilo" {
		t.Fatalf("series donor = %v, want quilo", m.seriesDonor)
	}
	if len(m.series) != 3 {
		t.Fatalf("series rows = %d, want 3", len(m.series))
	}
	// quilo (62) against olix 67.5, tarn 70, kelp 66: the bottleneck is the
	// step with the largest ΔG°, the weakest bond, kelp.
	var bn string
	for _, r := range m.series {
		if r.bottleneck {
			bn = r.pair.Acceptor.Couple.ID
		}
	}
	if bn != "kelp" {
		t.Errorf("bottleneck = %s, want kelp", bn)
	}
	if !strings.Contains(screen(m), "◀ bottleneck") {
		t.Errorf("bottleneck not written on screen:\n%s", screen(m))
	}
}

func TestMarksSaveAndRestore(t *testing.T) {
	dir := t.TempDir()
	lib := testLibrary()
	m := open(t, lib, 80, 24, dir)
	first := pairKey(m.selectedPair())
	m = keys(t, m, "space", "down", "space", "down", "space", "up", "space")
	if len(m.marks) != 2 {
		t.Fatalf("%d marks, want 2", len(m.marks))
	}
	if !strings.Contains(screen(m), "2 marked") {
		t.Errorf("top line does not count the marks")
	}
	saved, err := ReadShortlist(m.marksPath)
	if err != nil || len(saved) != 2 {
		t.Fatalf("saved shortlist %v, %v; want 2 marks", saved, err)
	}
	if !strings.HasPrefix(m.marksPath, dir) {
		t.Errorf("shortlist at %s, outside the state folder %s", m.marksPath, dir)
	}
	m2 := open(t, lib, 80, 24, dir)
	if _, ok := m2.marks[first]; !ok || len(m2.marks) != 2 {
		t.Errorf("restored marks %v, want 2 including %v", m2.marks, first)
	}
	// A different library gets its own shortlist.
	other := testLibrary()
	other.Titles = []string{"another set"}
	if m3 := open(t, other, 80, 24, dir); len(m3.marks) != 0 {
		t.Errorf("another library sees %d marks", len(m3.marks))
	}
	// The mark column sorts marked pairs together.
	for m.grids[panePairs].sortCol != pairMark {
		m = keys(t, m, "s")
	}
	for i, r := range m.grids[panePairs].perm {
		if got := m.marked(&m.t.pairs[r]); got != (i < 2) {
			t.Fatalf("row %d marked=%v with marked-first order", i, got)
		}
	}
}

func TestSaveOrderNeverGoesBack(t *testing.T) {
	dir := t.TempDir()
	s := &stateStore{dir: dir}
	path := filepath.Join(dir, "x.json")
	lib := testLibrary()
	newer := saveCmd(s, path, 2, lib, []markKey{{"a", "b"}, {"c", "d"}})
	older := saveCmd(s, path, 1, lib, []markKey{{"a", "b"}})
	newer()
	older()
	got, err := ReadShortlist(path)
	if err != nil || len(got) != 2 {
		t.Fatalf("after a late older save the file holds %v (%v), want the newer 2 marks", got, err)
	}
}

func TestExportAsksBeforeOverwriting(t *testing.T) {
	dir := t.TempDir()
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	target := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(target, []byte("precious\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	m = keys(t, m, "space", "down", "space", "x")
	if focus(m) != "path" {
		t.Fatal("x did not ask for a path")
	}
	m = setPath(m, target)
	m = keys(t, m, "enter")
	if focus(m) != "confirm" {
		t.Fatalf("existing file: focus %q, want the overwrite question", focus(m))
	}
	m = keys(t, m, "n")
	if b, _ := os.ReadFile(target); string(b) != "precious\n" {
		t.Fatal("the file was overwritten after n")
	}
	m = keys(t, m, "x", "enter", "y")
	f, err := os.Open(target)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != 3 || recs[0][2] != "dg_kcal_mol" {
		t.Fatalf("CSV has %d records, header %v; want header + 2 marked pairs", len(recs), recs[0])
	}
	if !strings.Contains(m.status, "wrote 2 pairs") {
		t.Errorf("status %q", m.status)
	}
	// With nothing marked the visible, sorted, filtered list is exported.
	m = keys(t, m, "home", "space", "down", "space", "/", "t", "a", "r", "n", "enter", "S", "x")
	fresh := filepath.Join(dir, "visible.csv")
	m = setPath(m, fresh)
	m = keys(t, m, "enter")
	f2, _ := os.Open(fresh)
	defer f2.Close()
	recs, err = csv.NewReader(f2).ReadAll()
	if err != nil || len(recs) != 6 {
		t.Fatalf("visible export: %d records (%v), want header + 5", len(recs), err)
	}
	// S made it ΔG° descending: the last row is the most favourable.
	last, _ := strconv.ParseFloat(recs[5][2], 64)
	firstDG, _ := strconv.ParseFloat(recs[1][2], 64)
	if !(firstDG > last) {
		t.Errorf("export not in the screen's order: first %g last %g", firstDG, last)
	}
	// esc leaves the path prompt without writing.
	m = keys(t, m, "x", "esc")
	if focus(m) != "" {
		t.Error("esc did not leave the export prompt")
	}
}

func TestSolventPicker(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "v")
	if focus(m) != "solvent" {
		t.Fatal("v did not open the solvent picker")
	}
	checkFrame(t, m, 80, 24)
	want := -1
	for i, s := range m.solvents {
		if s.Key == "dmso" {
			want = i
		}
	}
	for m.dlg.(solventDialog).pick < want+1 { // row 0 is every solvent
		m = keys(t, m, "down")
	}
	m = keys(t, m, "enter")
	if m.t.ev.Working.Key != "dmso" {
		t.Fatalf("working solvent %s, want dmso", m.t.ev.Working.Key)
	}
	if !strings.Contains(screen(m), "DMSO") {
		t.Error("top line does not name DMSO")
	}
	m = keys(t, m, "v", "up", "esc")
	if m.t.ev.Working.Key != "dmso" || focus(m) != "" {
		t.Error("esc in the picker changed the solvent")
	}
}

func TestEvaluationErrorKeepsTables(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	before := m.t
	// The gas phase has no C_G: the combined donor and the cycle-derived
	// couples cannot be evaluated; if the working solvent itself fails the
	// old tables stay.
	m.cond.Solvent = "no-such-solvent"
	m, cmd := m.reevaluate()
	m = drain(t, m, cmd)
	if m.t != before || m.errMsg == "" {
		t.Fatalf("bad solvent: tables replaced=%v err=%q", m.t != before, m.errMsg)
	}
	if m.cond.Solvent == "no-such-solvent" {
		t.Error("conditions not rolled back after a failed evaluation")
	}
	checkFrame(t, m, 80, 24)
}

func TestStaleEvaluationDropped(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	mm, first := m.Update(keyMsg("b"))
	m = mm.(Model)
	mm, second := m.Update(keyMsg("b"))
	m = mm.(Model)
	m = send(t, m, second())
	m = send(t, m, first()) // late
	if m.t.ev.Cond.Basis != thermo.Basis2022 {
		t.Errorf("a stale evaluation won: basis %v", m.t.ev.Cond.Basis)
	}
}

func TestCautionFirstStart(t *testing.T) {
	dir := t.TempDir()
	m := New(testLibrary(), Options{StateDir: dir, Renderer: plainRenderer()})
	m = send(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	m = drain(t, m, m.Init())
	if focus(m) != "caution" || !strings.Contains(screen(m), "not a safety assessment") {
		t.Fatalf("no caution at first start:\n%s", screen(m))
	}
	checkFrame(t, m, 80, 24)
	m = keys(t, m, "j") // not a dismiss key: the caution stays
	if focus(m) != "caution" {
		t.Error("j dismissed the caution")
	}
	m = keys(t, m, "enter")
	if focus(m) != "" {
		t.Fatal("enter did not dismiss the caution")
	}
	if _, err := os.Stat(filepath.Join(dir, "caution-seen")); err != nil {
		t.Errorf("dismissal not remembered: %v", err)
	}
	m2 := New(testLibrary(), Options{StateDir: dir, Renderer: plainRenderer()})
	m2 = send(t, m2, tea.WindowSizeMsg{Width: 80, Height: 24})
	m2 = drain(t, m2, m2.Init())
	if focus(m2) != "" {
		t.Error("caution shown again after dismissal")
	}
	m2 = keys(t, m2, "?")
	if !strings.Contains(screen(m2), "pyrophoric") {
		t.Error("help does not repeat the caution")
	}
}

func TestHelpListsEnabledKeys(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "?")
	s := screen(m)
	for _, want := range []string{"sort column", "reverse sort", "filter", "mark pair", "export CSV", "details",
		"next pane", "solvent", "C_G basis", "kcal/kJ", "quit", "esc", "p(H2)", "[D–H]0, [A]0", "write figure", "delivery window"} {
		if !strings.Contains(s, want) {
			t.Errorf("full help lacks %q", want)
		}
	}
	m = keys(t, m, "?")
	if focus(m) != "" {
		t.Error("? did not close help")
	}
	// On Scale there is no sorting; its help says so by leaving it out.
	m = keys(t, m, "5")
	if strings.Contains(screen(m), "sort column") {
		t.Error("Scale's help bar offers sorting")
	}
	if m = keys(t, m, "?"); !strings.Contains(screen(m), "window band") || !strings.Contains(screen(m), "write figure") {
		t.Errorf("Scale's help lacks the band and figure keys:\n%s", screen(m))
	}
}

func TestEveryScreenFits(t *testing.T) {
	for _, size := range [][2]int{{80, 24}, {120, 35}, {60, 15}} {
		m := open(t, testLibrary(), size[0], size[1], t.TempDir())
		for _, seq := range [][]string{{}, {"2"}, {"3"}, {"4"}, {"5"}, {"1", "enter"}, {"?"}, {"v"}, {"x"}, {"/"},
			{"3", "enter"}, {"4", "enter"}, {"p"}, {"e"}, {"f"}, {"5", "f"}, {"5", "g"}, {"3", "w"}, {"1", "enter", "w"}} {
			mm := keys(t, m, seq...)
			checkFrame(t, mm, size[0], size[1])
			keys(t, mm, "esc")
		}
	}
}

func TestCapIsReported(t *testing.T) {
	lib := bigLibrary(30, 40)
	m := New(lib, Options{StateDir: t.TempDir(), NoCaution: true, MaxPairs: 500, Renderer: plainRenderer()})
	m = send(t, m, tea.WindowSizeMsg{Width: 120, Height: 30})
	m = drain(t, m, m.Init())
	if len(m.t.pairs) != 500 || !m.t.capped || m.t.total != 1200 {
		t.Fatalf("pairs %d capped %v total %d", len(m.t.pairs), m.t.capped, m.t.total)
	}
	if !strings.Contains(screen(m), "showing best 500 by ΔG°") {
		t.Errorf("cap not said:\n%s", screen(m))
	}
}

func TestLibraryKeyFollowsContent(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "lib.yaml")
	os.WriteFile(f, []byte("a: 1\n"), 0o644)
	lib := testLibrary()
	lib.Files = []string{f}
	k1 := LibraryKey(lib)
	os.WriteFile(f, []byte("a: 2\n"), 0o644)
	if k2 := LibraryKey(lib); k2 == k1 {
		t.Error("changing the file's content kept the key")
	}
	emb, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	if k1, k2 := LibraryKey(emb), LibraryKey(emb); k1 != k2 || k1 == LibraryKey(lib) {
		t.Error("embedded library key not stable or not distinct")
	}
}

// The embedded library opens and every pane draws within 80×24.
func TestEmbeddedLibraryScreens(t *testing.T) {
	lib, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	m := open(t, lib, 80, 24, t.TempDir())
	if m.t == nil || len(m.t.pairs) == 0 {
		t.Fatalf("no pairs from the embedded library (err %q)", m.errMsg)
	}
	for _, k := range []string{"1", "2", "3", "4", "5", "enter", "esc", "b", "u", "4", "enter"} {
		m = keys(t, m, k)
		checkFrame(t, m, 80, 24)
	}
}

// Several keys read at once arrive as one message of runes; each acts.
func TestKeyBurst(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = send(t, m, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("jjj ")})
	if m.grids[panePairs].cursor != 3 || len(m.marks) != 1 {
		t.Fatalf("burst jjj+space: cursor %d, %d marks; want 3 and 1", m.grids[panePairs].cursor, len(m.marks))
	}
	m = send(t, m, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune("/tarn")})
	if focus(m) != "filter" || m.grids[panePairs].query != "tarn" {
		t.Fatalf("burst /tarn: focus %q query %q", focus(m), m.grids[panePairs].query)
	}
}

// Sorting keeps the row under the cursor selected.
func TestSortKeepsSelection(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "down", "down", "down")
	before := pairKey(m.selectedPair())
	m = keys(t, m, "s", "s")
	if got := pairKey(m.selectedPair()); got != before {
		t.Errorf("after sorting the cursor is on %v, was on %v", got, before)
	}
	if m.grids[panePairs].cursor < m.grids[panePairs].offset {
		t.Error("selected row scrolled out of view")
	}
}

// A sort issued before a re-evaluation must not apply to the new tables
// (its row numbers index the old pairs).
func TestReorderFromOldTablesDropped(t *testing.T) {
	lib := testLibrary()
	m := open(t, lib, 80, 24, t.TempDir())
	mm, sortCmd := m.Update(keyMsg("s"))
	m = mm.(Model)
	// The library gains a donor; the re-evaluation has 4 more pairs.
	lib.Couples = append(lib.Couples, &data.Couple{Couple: thermo.Couple{ID: "extra", Roles: thermo.RoleDonor,
		In: thermo.Inputs{BDFE: tval(50, 1)}}})
	m = keys(t, m, "b")
	if len(m.t.pairs) != 23 {
		t.Fatalf("%d pairs after adding a donor, want 23", len(m.t.pairs))
	}
	late := sortCmd().(reorderMsg) // sorted the old 19 pairs
	m = send(t, m, late)
	if m.grids[panePairs].len() != 23 {
		t.Errorf("rows %d after a late result over the old tables, want 23", m.grids[panePairs].len())
	}
	checkFrame(t, m, 80, 24)
}

// Switching to a solvent where the series is incomplete leaves no stale
// series rows behind.
func TestSeriesRowsFollowEvaluation(t *testing.T) {
	lib := testLibrary()
	m := open(t, lib, 80, 24, t.TempDir())
	m = keys(t, m, "4")
	if len(m.series) != 3 {
		t.Fatalf("%d series rows, want 3", len(m.series))
	}
	// Move olix to water: out of play in MeCN, the ladder is incomplete.
	water, err := lib.Solvents.Lookup("water")
	if err != nil {
		t.Fatal(err)
	}
	lib.Couples[4].Solvent = water
	m = keys(t, m, "b")
	if len(m.series) != 0 || m.grids[paneSeries].len() != 0 {
		t.Fatalf("series rows %d, grid %d: want none", len(m.series), m.grids[paneSeries].len())
	}
	m = keys(t, m, "space", "enter", "down")
	checkFrame(t, m, 80, 24)
}

// A library with acceptors only: no pairs, no donors; every pane still
// draws, and keys that need a row do nothing.
func TestEmptyPanes(t *testing.T) {
	lib := testLibrary()
	var acc []*data.Couple
	for _, c := range lib.Couples {
		if c.Roles == thermo.RoleAcceptor {
			acc = append(acc, c)
		}
	}
	lib.Couples = acc
	lib.Series = nil
	m := open(t, lib, 80, 24, t.TempDir())
	if len(m.t.pairs) != 0 {
		t.Fatalf("%d pairs from acceptors only", len(m.t.pairs))
	}
	for _, k := range []string{"space", "enter", "x", "esc", "2", "enter", "3", "enter", "esc", "4", "space", "5", "enter", "s", "/", "a", "enter"} {
		m = keys(t, m, k)
		checkFrame(t, m, 80, 24)
	}
	if len(m.marks) != 0 {
		t.Error("a mark was made with no pairs")
	}
	if !strings.Contains(screen(keys(t, m, "1")), "no pairs in this solvent") {
		t.Errorf("empty Pairs pane not explained:\n%s", screen(m))
	}
}

// Resizing lays everything out again within the new size.
func TestResize(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "end")
	for _, sz := range [][2]int{{80, 24}, {100, 30}, {80, 24}} {
		m = send(t, m, tea.WindowSizeMsg{Width: sz[0], Height: sz[1]})
		for _, tab := range []string{"1", "2", "3", "4", "5", "1"} {
			m = keys(t, m, tab)
			checkFrame(t, m, sz[0], sz[1])
		}
		g := m.grids[panePairs]
		if g.cursor < g.offset || g.cursor >= g.offset+g.height {
			t.Errorf("at %v the cursor %d is out of view (offset %d height %d)", sz, g.cursor, g.offset, g.height)
		}
	}
}

// The scale thins labels that would share a row and counts what it hid:
// shown + hidden = all couples on each side; no two labels share a row.
func TestScaleThinsLabels(t *testing.T) {
	lib := bigLibrary(30, 40)
	m := open(t, lib, 80, 24, t.TempDir())
	m = keys(t, m, "5")
	s := screen(m)
	checkFrame(t, m, 80, 24)
	var hidD, hidA int
	if _, err := fmt.Sscanf(s[strings.Index(s, "labels thinned: "):], "labels thinned: %d donors and %d acceptors", &hidD, &hidA); err != nil {
		t.Fatalf("no thinning note: %v\n%s", err, s)
	}
	shownD, shownA := 0, 0
	for _, l := range strings.Split(s, "\n") {
		d, a := strings.Count(l, " d0"), strings.Count(l, " a0")
		if d > 1 || a > 1 {
			t.Fatalf("two labels on one row: %q", l)
		}
		shownD += d
		shownA += a
	}
	shownD -= 1 // the legend line names the selected donor
	shownA -= 1 // and its acceptor
	if shownD+hidD != 30 || shownA+hidA != 40 {
		t.Errorf("donors shown %d + hidden %d, acceptors shown %d + hidden %d; want 30 and 40", shownD, hidD, shownA, hidA)
	}
	if hidD == 0 || hidA == 0 {
		t.Error("nothing thinned at 80×24 with 70 couples")
	}
}

// Marks made before the saved shortlist is read are merged with it, and
// opening a library writes nothing until a mark changes.
func TestEarlyMarksMergeWithSaved(t *testing.T) {
	dir := t.TempDir()
	lib := testLibrary()
	m := open(t, lib, 80, 24, dir)
	m = keys(t, m, "space")
	saved := pairKey(m.selectedPair())

	m2 := New(lib, Options{StateDir: dir, NoCaution: true, Renderer: plainRenderer()})
	m2 = send(t, m2, tea.WindowSizeMsg{Width: 80, Height: 24})
	m2 = drain(t, m2, m2.evalCmd()) // the library first, the state later
	m2 = keys(t, m2, "down", "space")
	early := pairKey(m2.selectedPair())
	m2 = drain(t, m2, loadStateCmd(m2.state, lib, true))
	if len(m2.marks) != 2 {
		t.Fatalf("%d marks after merging, want 2", len(m2.marks))
	}
	got, _ := ReadShortlist(m.marksPath)
	if !slices.Contains(got, saved) || !slices.Contains(got, early) {
		t.Errorf("merged shortlist on disk %v lacks %v or %v", got, saved, early)
	}
	// A damaged shortlist is set aside whole (see robust_test.go), never
	// rewritten in place.
	bad := []byte("{not json")
	os.WriteFile(m.marksPath, bad, 0o644)
	m3 := open(t, lib, 80, 24, dir)
	kept, _ := filepath.Glob(m.marksPath + ".damaged-*")
	if len(kept) != 1 {
		t.Fatalf("damaged shortlist kept as %v", kept)
	}
	if after, _ := os.ReadFile(kept[0]); string(after) != string(bad) {
		t.Error("the damaged shortlist was not kept as it was")
	}
	if !strings.Contains(m3.status, "damaged") {
		t.Errorf("status %q does not report the damaged shortlist", m3.status)
	}
}

// In kJ/mol the detail panel gives every energy in kJ/mol: the race against
// H2 evolution and the assumed σ of a BDFE included (the embedded library's
// best pair has both).
func TestDetailInKJ(t *testing.T) {
	lib, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	m := open(t, lib, 120, 35, t.TempDir())
	m = keys(t, m, "u")
	p := m.selectedPair()
	if p == nil {
		t.Fatal("no pair selected")
	}
	d := m.pairDetail(p)
	// 1 kcal = 4.184 kJ (thermochemical calorie; NIST SP 811, B.8).
	for _, want := range []string{
		"HAT (ΔG° " + strconv.FormatFloat(p.DG.Kcal*4.184, 'f', 1, 64) + " kJ/mol)",
		"(" + strconv.FormatFloat(p.Donor.Margin.Kcal*4.184, 'f', 1, 64) + " kJ/mol per H",
		"BDFE 4.2 kJ/mol)",
	} {
		if !strings.Contains(d, want) {
			t.Errorf("kJ detail lacks %q:\n%s", want, d)
		}
	}
	// What hatsieve writes itself says kJ; a note of a conversion applied
	// names the kcal/mol it was made in (the library's own text may say
	// anything).
	for _, l := range strings.Split(d, "\n") {
		if strings.HasPrefix(l, "HAT (") || strings.Contains(l, "assumed defaults") || strings.Contains(l, "rate estimate") {
			if strings.Contains(l, "kcal") {
				t.Errorf("kJ detail line names kcal: %q", l)
			}
		}
		if strings.Contains(l, "note: from BDE") && !strings.Contains(l, "kcal/mol") {
			t.Errorf("conversion note without its unit: %q", l)
		}
	}
}
