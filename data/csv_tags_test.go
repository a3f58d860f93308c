package data

import (
	"slices"
	"testing"
)

// Rows with the same single tag share one list; each couple still reads
// its own tags, and a couple's list grown by a caller leaves the others'
// as they were.
func TestCSVOneTagListsShared(t *testing.T) {
	text := "id,bdfe,tags\na,70,demo\nb,71,demo\nc,72,other\nd,73,demo;other\ne,74,demo\nf,75,\n"
	lib, err := Load(File{Name: "tags.csv", Data: []byte(text)})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string][]string{"a": {"demo"}, "b": {"demo"}, "c": {"other"}, "d": {"demo", "other"}, "e": {"demo"}, "f": nil}
	byID := map[string]*Couple{}
	for _, c := range lib.Couples {
		byID[c.ID] = c
		if !slices.Equal(c.Tags, want[c.ID]) {
			t.Errorf("%s: tags %q, want %q", c.ID, c.Tags, want[c.ID])
		}
	}
	grown := append(byID["a"].Tags, "extra")
	grown[0] = "changed"
	for _, id := range []string{"a", "b", "e"} {
		if !slices.Equal(byID[id].Tags, []string{"demo"}) {
			t.Errorf("%s: tags %q after another couple's list grew, want [demo]", id, byID[id].Tags)
		}
	}
}
