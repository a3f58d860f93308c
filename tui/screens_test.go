package tui

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// Quitting while an export is being written waits for the write, says so,
// and then quits; the file is there.
func TestQuitWaitsForExport(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	out := filepath.Join(t.TempDir(), "slow.csv")
	m = keys(t, m, "x")
	m = setPath(m, out)
	// enter: the path dialog reports the path; the app starts the write.
	mm, cmd := m.Update(keyMsg("enter"))
	m = mm.(Model)
	mm, write := m.Update(cmd()) // exportPathMsg → the write command, not yet run
	m = mm.(Model)
	if len(m.writing) != 1 {
		t.Fatalf("writing %v, want the one export", m.writing)
	}
	for _, k := range []string{"q", "ctrl+c"} {
		mm, c := m.Update(keyMsg(k))
		if k == "q" {
			m = mm.(Model)
			if c != nil {
				if _, quit := c().(tea.QuitMsg); quit {
					t.Fatal("q quit with an export being written")
				}
			}
			if !strings.Contains(screen(m), "quitting once "+out+" is written") {
				t.Errorf("the status line does not say quitting waits:\n%s", screen(m))
			}
		}
	}
	done := write()
	mm, after := m.Update(done)
	m = mm.(Model)
	if after == nil {
		t.Fatal("no quit once the export was written")
	}
	if _, quit := after().(tea.QuitMsg); !quit {
		t.Error("the finished write did not quit")
	}
	if _, err := os.Stat(out); err != nil {
		t.Errorf("the export is missing: %v", err)
	}
	// With nothing being written q quits at once.
	if !quits(t, open(t, testLibrary(), 80, 24, t.TempDir()), "q") {
		t.Error("q does not quit")
	}
}

// A second quit while waiting quits at once: the status line had said the
// file would then not be written, so nothing is dropped unannounced.
func TestSecondQuitDoesNotWait(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m.writing = []string{"x.csv"}
	m = keys(t, m, "q")
	if !m.quitting || !strings.Contains(screen(m), "ctrl+c again: quit now, file not written") {
		t.Fatalf("first quit: quitting %v\n%s", m.quitting, screen(m))
	}
	if !quits(t, m, "ctrl+c") {
		t.Error("the second quit does not quit")
	}
}

// On a library with more pairs than the screens hold, a new sort key ranks
// the whole library again: the rows held are the best N by that key, the
// same set thermo.Rank gives.
func TestCappedSortRanksWholeLibrary(t *testing.T) {
	lib := bigLibrary(30, 40)
	m := New(lib, Options{StateDir: t.TempDir(), NoCaution: true, MaxPairs: 100, Renderer: plainRenderer()})
	m = send(t, m, tea.WindowSizeMsg{Width: 120, Height: 30})
	m = drain(t, m, m.Init())
	if !m.t.capped || len(m.t.pairs) != 100 {
		t.Fatalf("capped %v, %d pairs", m.t.capped, len(m.t.pairs))
	}
	ids := func(ps []thermo.Pair) []string {
		var out []string
		for _, p := range ps {
			out = append(out, p.Donor.Couple.ID+">"+p.Acceptor.Couple.ID)
		}
		slices.Sort(out)
		return out
	}
	for _, c := range []struct {
		keys   []string
		metric thermo.Metric
		rev    bool
		says   string
	}{
		{[]string{"s"}, thermo.BySigma, false, "showing best 100 by σ"},
		{[]string{"s"}, thermo.ByLog10K, false, "showing best 100 by log K"},
		{[]string{"S"}, thermo.ByLog10K, true, "showing worst 100 by log K"},
		// The conversion rises with log K in one flask: the whole library
		// is ranked by log K again, in the conversion's natural direction.
		{[]string{"s"}, thermo.ByLog10K, false, "showing best 100 by log K"},
		// thermo does not rank by the rate estimate: the pairs held stay,
		// re-ordered, and the status line says so.
		{[]string{"s"}, thermo.ByLog10K, false, "the best 100 by log K, re-ordered"},
		{[]string{"s"}, thermo.ByDonorBDFE, false, "showing best 100 by donor BDFE"},
	} {
		m = keys(t, m, c.keys...)
		want := thermo.Rank(m.t.ev.Donors, m.t.ev.Acceptors, m.t.ev.Cond, thermo.RankOptions{Sort: c.metric, Reverse: c.rev, Top: 100})
		if !slices.Equal(ids(m.t.pairs), ids(want)) {
			t.Errorf("after %v the pairs held are not the best 100 by %v", c.keys, c.metric)
		}
		if !strings.Contains(screen(m), c.says) {
			t.Errorf("after %v the top line does not say %q:\n%s", c.keys, c.says, screen(m))
		}
	}
	// A column thermo does not rank by re-orders the rows held, and says so.
	for m.grids[panePairs].sortCol != pairDonor {
		m = keys(t, m, "s")
	}
	if s := screen(m); !strings.Contains(s, "re-ordered") || !strings.Contains(s, "the best 100 by donor H2 margin") {
		t.Errorf("sorting by donor does not say the rows are a re-ordered window:\n%s", s)
	}
	// A filter typed while the new ranking is still being made does not
	// lose it: the late result is dropped, the filter ranks afresh.
	for m.grids[panePairs].sortCol != pairDG {
		m = keys(t, m, "s")
	}
	mm, pending := m.Update(keyMsg("s")) // σ, not yet run
	m = mm.(Model)
	m = keys(t, m, "/", "d", "0", "0", "0", "1", "enter")
	m = send(t, m, pending())
	if m.t.rankedBy != thermo.BySigma || m.grids[panePairs].pending {
		t.Errorf("after a filter during the ranking: ranked by %v, pending %v", m.t.rankedBy, m.grids[panePairs].pending)
	}
	for _, r := range m.grids[panePairs].perm {
		if !strings.HasPrefix(m.t.pairs[r].Donor.Couple.ID, "d0001") {
			t.Fatalf("filter d0001 kept %s", m.t.pairs[r].Donor.Couple.ID)
		}
	}
}

// Each sort column starts in its natural direction; S reverses the current
// column only, and a new column forgets it.
func TestSortDirectionIsPerColumn(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	m = keys(t, m, "S") // ΔG° worst first
	if !m.grids[panePairs].desc() {
		t.Fatal("S did not reverse ΔG°")
	}
	m = keys(t, m, "s", "s") // σ, then log K
	if g := m.grids[panePairs]; g.sortCol != pairLogK || !g.desc() {
		t.Fatalf("log K starts with desc=%v, want largest first", g.desc())
	}
	lk := func(i int) float64 { return m.t.pairs[m.grids[panePairs].perm[i]].Log10K }
	if lk(0) < lk(m.grids[panePairs].len()-1) {
		t.Error("log K not largest first")
	}
	for m.grids[panePairs].sortCol != pairDG {
		m = keys(t, m, "s")
	}
	if m.grids[panePairs].desc() {
		t.Error("back on ΔG° the list is worst first: the reverse flag carried over")
	}
	if !strings.Contains(screen(m), "ΔG°↑") {
		t.Error("ΔG° header does not show ascending")
	}
	// Acceptors start strongest bond first; Donors weakest first.
	m = keys(t, m, "3")
	if !m.grids[paneAcceptors].desc() {
		t.Error("Acceptors do not start strongest bond first")
	}
	m = keys(t, m, "2")
	if m.grids[paneDonors].desc() {
		t.Error("Donors do not start weakest bond first")
	}
}

// Esc clears an accepted filter; / reopens on the old text, and typing
// replaces it instead of appending.
func TestFilterEscAndReopen(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m = keys(t, m, "/", "t", "a", "r", "n", "enter")
	if m.grids[panePairs].query != "tarn" || m.grids[panePairs].len() != 5 {
		t.Fatalf("filter tarn: %q, %d rows", m.grids[panePairs].query, m.grids[panePairs].len())
	}
	m = keys(t, m, "/")
	if !strings.Contains(screen(m), "/tarn") {
		t.Errorf("the filter box does not open on the old text:\n%s", screen(m))
	}
	m = keys(t, m, "m", "u", "r", "enter")
	if got := m.grids[panePairs].query; got != "mur" {
		t.Fatalf("reopened filter gives %q, want mur (typing replaces)", got)
	}
	// An arrow key keeps the old text to edit it.
	m = keys(t, m, "/", "backspace", "enter")
	if got := m.grids[panePairs].query; got != "mu" {
		t.Errorf("backspace in the reopened box gives %q, want mu", got)
	}
	m = keys(t, m, "esc")
	if m.grids[panePairs].query != "" || m.grids[panePairs].len() != 19 {
		t.Errorf("esc did not clear the accepted filter: %q, %d rows", m.grids[panePairs].query, m.grids[panePairs].len())
	}
	if focus(m) != "" {
		t.Error("esc opened something")
	}
}

// An export longer than the threshold asks first, with the row count and
// the size; n writes nothing, y writes it.
func TestLongExportAsks(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	m.askRows = 10 // 19 listed pairs is "long" here; the default is 10^6
	out := filepath.Join(t.TempDir(), "long.csv")
	m = keys(t, m, "x")
	m = setPath(m, out)
	m = keys(t, m, "enter")
	if focus(m) != "confirm" {
		t.Fatalf("no question before a long export (focus %q)", focus(m))
	}
	s := screen(m)
	if !strings.Contains(s, "Write 19 rows to") || !strings.Contains(s, "about") || !strings.Contains(s, "kB") {
		t.Errorf("the question does not give rows and size:\n%s", s)
	}
	m = keys(t, m, "n")
	if _, err := os.Stat(out); err == nil {
		t.Fatal("n still wrote the file")
	}
	m = keys(t, m, "x", "enter", "y")
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatalf("y did not write: %v (%s)", err, m.status)
	}
	if n := strings.Count(string(b), "\n"); n != 20 {
		t.Errorf("%d lines written, want header + 19", n)
	}
	// The estimate is the size written, within a few per cent.
	j := exportJob{t: m.t, perm: m.grids[panePairs].perm, units: m.units}
	if est, got := estimateCSV(j), int64(len(b)); est < got*9/10 || est > got*11/10 {
		t.Errorf("estimate %d bytes, file %d", est, got)
	}
}

// Names, not ids: two long names that share their start still look
// different at 80 columns, in Pairs and in Donors; the id still filters.
func TestLongNamesStayDistinct(t *testing.T) {
	lib := testLibrary()
	long := "2,4,6-tri-tert-butyl-4-substituted-invented-phenoxyl-"
	for _, c := range []struct{ id, tail string }{{"nA", "alpha"}, {"nB", "beta"}, {"nC", "alphb"}} {
		lib.Couples = append(lib.Couples, &data.Couple{Couple: thermo.Couple{ID: c.id, Name: long + c.tail, Bond: "O–H",
			Roles: thermo.RoleDonor, In: thermo.Inputs{BDFE: tval(50, 1)}}, Status: "invented"})
	}
	m := open(t, lib, 80, 24, t.TempDir())
	m = keys(t, m, "/", "t", "a", "r", "n", "enter")
	check := func(where string, cells []string) {
		t.Helper()
		seen := map[string]bool{}
		for _, c := range cells {
			if seen[c] {
				t.Errorf("%s: two rows show %q", where, c)
			}
			seen[c] = true
		}
	}
	var cells []string
	for _, r := range m.grids[panePairs].perm {
		cells = append(cells, m.pairCell(r, pairDonor))
	}
	check("Pairs", cells)
	for _, c := range cells {
		if w := len([]rune(c)); w > m.grids[panePairs].widths[pairDonor] {
			t.Errorf("label %q wider than its column", c)
		}
	}
	if s := screen(m); !strings.Contains(s, "…") {
		t.Errorf("the long names are not shortened:\n%s", s)
	}
	m = keys(t, m, "2")
	cells = nil
	for r := range m.t.donors {
		cells = append(cells, m.entryCell(m.t.donors, m.labels.get(slotDonors, m.t))(int32(r), 0))
	}
	check("Donors", cells)
	m = keys(t, m, "/", "n", "b", "enter")
	if m.grids[paneDonors].len() != 1 {
		t.Errorf("filter by id nB keeps %d rows", m.grids[paneDonors].len())
	}
	checkFrame(t, m, 80, 24)
}

func TestUniqueLabels(t *testing.T) {
	names := []string{"abcdefghijklmnop-one", "abcdefghijklmnop-two", "abcdefghXjklmnop-one", "abcdefghYjklmnop-one", "short", "short"}
	got := uniqueLabels(names, 12)
	for i := range got {
		for j := range got {
			if i != j && names[i] != names[j] && got[i] == got[j] {
				t.Errorf("%q and %q both show as %q", names[i], names[j], got[i])
			}
		}
		if w := len([]rune(got[i])); w > 12 {
			t.Errorf("%q is %d wide", got[i], w)
		}
	}
	if got[4] != "short" || got[5] != "short" {
		t.Errorf("one name listed twice should keep one label: %q %q", got[4], got[5])
	}
}

func TestBondClasses(t *testing.T) {
	for bond, want := range map[string]bondClass{"O–H": classOH, "N-H": classNH, "C–H": classCH, "S–H": classSH,
		"Cr–H": classMH, "M–H": classMH, "W–H": classMH, "Fe–OH2": classOH, "H–H": classOther, "Se–H": classOther, "": classOther} {
		if got := classOf(bond); got != want {
			t.Errorf("classOf(%q) = %s, want %s", bond, classNames[got], classNames[want])
		}
	}
}

// c narrows the screens to one bond class, v to one solvent or all; the
// top line says what is shown of what.
func TestLibrarySelection(t *testing.T) {
	lib := testLibrary()
	lib.Couples[2].Bond = "C–H" // brimid
	lib.Couples[5].Bond = "C–H" // mur
	m := open(t, lib, 120, 40, t.TempDir())
	m = keys(t, m, "c") // O–H
	if s := screen(m); !strings.Contains(s, "6 of 8 couples: O–H in acetonitrile") {
		t.Errorf("O–H selection not said:\n%s", s)
	}
	for _, p := range m.t.pairs {
		if p.Donor.Couple.Bond != "O–H" || p.Acceptor.Couple.Bond != "O–H" {
			t.Fatalf("O–H shows %s→%s", p.Donor.Couple.ID, p.Acceptor.Couple.ID)
		}
	}
	m = keys(t, m, "c", "c") // N–H, then C–H
	if len(m.t.pairs) != 1 || !strings.Contains(screen(m), "2 of 8 couples: C–H in acetonitrile · 1 pairs") {
		t.Errorf("C–H: %d pairs\n%s", len(m.t.pairs), screen(m))
	}
	for range nClasses - 3 {
		m = keys(t, m, "c")
	}
	if m.t.class != classAll || len(m.t.pairs) != 19 {
		t.Fatalf("c did not cycle back to all bonds: %s, %d pairs", classNames[m.t.class], len(m.t.pairs))
	}
	// Move olix to DMSO: out of play in MeCN, back in with every solvent.
	dmso, _ := lib.Solvents.Lookup("dmso")
	lib.Couples[4].Solvent = dmso
	m = keys(t, m, "b", "b")
	if len(m.t.pairs) != 14 {
		t.Fatalf("%d pairs with olix in DMSO, want 14", len(m.t.pairs))
	}
	m = keys(t, m, "v", "home")
	for focus(m) == "solvent" && m.dlg.(solventDialog).pick > 0 {
		m = keys(t, m, "up")
	}
	m = keys(t, m, "enter")
	if !m.okCond.Cross || len(m.t.pairs) != 19 || !strings.Contains(screen(m), "8 of 8 couples: all bonds in all solvents") {
		t.Errorf("every solvent: cross %v, %d pairs\n%s", m.okCond.Cross, len(m.t.pairs), screen(m))
	}
	if !strings.Contains(screen(m), "×solv") {
		t.Error("cross-solvent pairs not marked")
	}
	checkFrame(t, m, 120, 40)
}
