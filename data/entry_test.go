package data

import (
	"fmt"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// Entry finds every entry of an evaluation by its couple: each couple in
// play gives its own entry, a couple that is not in play (left out as a
// problem, or never loaded) and nil give none, in a Subset too.
func TestEntryFindsEachCoupleOnly(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,roles,solvent,bdfe,bde\n")
	for i := range 3000 {
		if i%10 == 7 { // a BDE in THF, which has no BDE-to-BDFE conversion: a problem
			fmt.Fprintf(&b, "t%d,donor,thf,,%.1f\n", i, 70+float64(i%50)/10)
			continue
		}
		fmt.Fprintf(&b, "c%d,%s,acetonitrile,%.2f,\n", i, [...]string{"donor", "acceptor", "both"}[i%3], 60+float64(i%400)/10)
	}
	lib, err := Load(File{Name: "entries.csv", Data: []byte(b.String())})
	if err != nil {
		t.Fatal(err)
	}
	ev, err := Evaluate(lib, Options{Solvent: "acetonitrile", Cross: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(ev.Problems) == 0 || len(ev.All) == 0 {
		t.Fatal("the library should hold couples that resolve and couples that do not")
	}
	for _, e := range ev.All {
		if got := ev.Entry(&e.Couple.Couple); got != e {
			t.Fatalf("Entry(%s) = %v, want its own entry", e.ID, got)
		}
	}
	if ev.byCouple != nil {
		t.Error("the entries of a loaded library should be found by their place (Couple.Index), without the map")
	}
	for _, p := range ev.Problems {
		if got := ev.Entry(&p.Couple.Couple); got != nil {
			t.Errorf("Entry(%s), left out as a problem, = %s, want nil", p.Couple.ID, got.ID)
		}
	}
	if got := ev.Entry(&thermo.Couple{ID: "c1"}); got != nil {
		t.Errorf("Entry of a couple never loaded = %s, want nil", got.ID)
	}
	if got := ev.Entry(nil); got != nil {
		t.Errorf("Entry(nil) = %s, want nil", got.ID)
	}
	sub := ev.Subset(func(c *thermo.Couple) bool { return c.Roles == thermo.RoleDonor })
	for _, e := range ev.All {
		want := e
		if e.Roles != thermo.RoleDonor {
			want = nil
		}
		if got := sub.Entry(&e.Couple.Couple); got != want {
			t.Fatalf("Subset: Entry(%s) = %v, want %v", e.ID, got, want)
		}
	}
	if got := (&Evaluated{}).Entry(&ev.All[0].Couple.Couple); got != nil {
		t.Errorf("Entry in an empty evaluation = %s, want nil", got.ID)
	}
}

// A library made in code, its couples not numbered, still finds every
// entry.
func TestEntryUnnumberedLibrary(t *testing.T) {
	mecn := thermo.Builtin()
	s, err := mecn.Lookup("acetonitrile")
	if err != nil {
		t.Fatal(err)
	}
	lib := &Library{Solvents: mecn}
	for i := range 5 {
		lib.Couples = append(lib.Couples, &Couple{Couple: thermo.Couple{ID: fmt.Sprint("u", i), Roles: thermo.RoleBoth, Solvent: s,
			In: thermo.Inputs{BDFE: &thermo.Value{V: 70 + float64(i), Sigma: 1}}}})
	}
	ev, err := Evaluate(lib, Options{Solvent: "acetonitrile"})
	if err != nil || len(ev.All) != 5 {
		t.Fatalf("%v, %d entries", err, len(ev.All))
	}
	for _, e := range ev.All {
		if got := ev.Entry(&e.Couple.Couple); got != e {
			t.Fatalf("Entry(%s) = %v, want its own entry", e.ID, got)
		}
	}
}
