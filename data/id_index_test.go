package data

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// Duplicate ids are found by the loader's id table (idIndex) as it grows:
// a few YAML couples first (the table grows couple by couple), then a CSV
// file large enough to have the table sized for its rows at once. Each
// duplicate names the place of the first couple with its id, within a file
// and across files; every other couple loads, and so does the same set
// without the duplicates.
func TestDuplicateIDsAcrossGrowingIndex(t *testing.T) {
	var y strings.Builder
	y.WriteString("format: hatsieve/1\ncouples:\n")
	for i := range 40 {
		fmt.Fprintf(&y, "  - {id: y%d, bdfe: %.1f}\n", i, 70+float64(i)/10)
	}
	var c strings.Builder
	c.WriteString("id,bdfe\n")
	const n = 5000
	for i := range n {
		fmt.Fprintf(&c, "c%d,%.2f\n", i, 60+float64(i%400)/10)
	}
	clean := []File{{"a.yaml", []byte(y.String())}, {"b.csv", []byte(c.String())}}
	lib, err := Load(clean...)
	if err != nil {
		t.Fatal(err)
	}
	if len(lib.Couples) != 40+n {
		t.Fatalf("%d couples, want %d", len(lib.Couples), 40+n)
	}
	// Row k of b.csv is on line k+2.
	c.WriteString("c17,61.0\n")   // line n+2: within the file
	c.WriteString("y3,62.0\n")    // line n+3: across files
	c.WriteString("c4999,63\n")   // line n+4: the last row before
	c.WriteString("c17,64.0\n")   // line n+5: twice
	c.WriteString("fresh,65.0\n") // a new id: no problem
	_, err = Load(File{"a.yaml", []byte(y.String())}, File{"b.csv", []byte(c.String())})
	var is Issues
	if !errors.As(err, &is) {
		t.Fatalf("want Issues, got %v", err)
	}
	want := []string{
		fmt.Sprintf("b.csv:%d: id: duplicate id \"c17\": also at b.csv:19", n+2),
		fmt.Sprintf("b.csv:%d: id: duplicate id \"y3\": also at a.yaml:6", n+3),
		fmt.Sprintf("b.csv:%d: id: duplicate id \"c4999\": also at b.csv:%d", n+4, n+1),
		fmt.Sprintf("b.csv:%d: id: duplicate id \"c17\": also at b.csv:19", n+5),
	}
	if len(is) != len(want) {
		t.Fatalf("%d problems, want %d:\n%v", len(is), len(want), err)
	}
	for i, w := range want {
		if got := is[i].String(); got != w {
			t.Errorf("problem %d: %q, want %q", i, got, w)
		}
	}
}

// The id table and the map it turns to past maxPlace couples agree on
// every id of a sequence with repeats: the place of the first couple with
// it, or none.
func TestIDIndexTableAndMapAgree(t *testing.T) {
	var table, big idIndex
	var list []*Couple
	for i := range 3000 {
		id := fmt.Sprintf("k%d", (i*7919)%2100) // repeats after 2100
		p1, dup1 := table.add(list, id)
		p2, dup2 := big.addBig(list, id)
		if p1 != p2 || dup1 != dup2 {
			t.Fatalf("id %s: table (%d, %v), map (%d, %v)", id, p1, dup1, p2, dup2)
		}
		if dup1 != (i >= 2100) {
			t.Fatalf("id %s (item %d): duplicate %v", id, i, dup1)
		}
		if dup1 {
			if list[p1].ID != id {
				t.Fatalf("id %s: place %d holds %s", id, p1, list[p1].ID)
			}
			continue
		}
		list = append(list, &Couple{Couple: thermo.Couple{ID: id}})
	}
}
