package tui

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The export of the listed pairs (none marked) streams them in the order
// and with the filter shown.
func TestExportFollowsTheList(t *testing.T) {
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	out := filepath.Join(t.TempDir(), "list.csv")
	m = keys(t, m, "/", "olix", "enter", "s", "s", "s") // filtered, sorted by log K
	m = keys(t, m, "x")
	m = clearInput(t, m)
	m = keys(t, m, out, "enter")
	f, err := os.Open(out)
	if err != nil {
		t.Fatalf("not written: %v (%s)", err, m.status)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	perm := m.grids[panePairs].perm
	if len(rows) != len(perm)+1 || len(perm) == 0 {
		t.Fatalf("%d rows written for %d listed", len(rows)-1, len(perm))
	}
	for i, r := range perm {
		p := m.t.pairs[r]
		if rows[i+1][0] != p.Donor.Couple.ID || rows[i+1][1] != p.Acceptor.Couple.ID {
			t.Errorf("row %d is %s → %s, listed %s → %s", i+1, rows[i+1][0], rows[i+1][1], p.Donor.Couple.ID, p.Acceptor.Couple.ID)
		}
		if !strings.Contains(p.Donor.Couple.ID+p.Acceptor.Couple.ID, "olix") {
			t.Errorf("row %d is not of the filter", i+1)
		}
	}
}
