package data

import (
	"fmt"
	"reflect"
	"runtime"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// Evaluate resolves large libraries in blocks on every core. Whatever the
// number of cores, its lists must be those of resolving the couples one by
// one in library order with thermo.Resolve: the same entries in the same
// order, the same donors, acceptors and problems.
func TestEvaluateInBlocksMatchesOneByOne(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,roles,solvent,bdfe,bde,pka,e_anion\n")
	const n = 6000 // enough blocks for every core
	for i := range n {
		role := [...]string{"donor", "acceptor", "both"}[i%3]
		switch {
		case i%7 == 3: // a BDE in THF, which has no BDE-to-BDFE conversion: a problem
			fmt.Fprintf(&b, "t%d,%s,thf,,%.1f,,\n", i, role, 70+float64(i%50)/10)
		case i%11 == 5: // another solvent, through the cycle
			fmt.Fprintf(&b, "w%d,%s,dmso,,,%.1f,%.3f\n", i, role, 10+float64(i%90)/10, -0.5+float64(i%40)/100)
		default:
			fmt.Fprintf(&b, "c%d,%s,acetonitrile,%.2f,,,\n", i, role, 60+float64(i%400)/10)
		}
	}
	lib, err := Load(File{Name: "mixed.csv", Data: []byte(b.String())})
	if err != nil {
		t.Fatal(err)
	}
	for _, basis := range []thermo.Basis{thermo.Basis2022, thermo.Basis2010} {
		o := Options{Solvent: "acetonitrile", Cross: true, Cond: thermo.Conditions{Basis: basis}}
		// One by one, as Evaluate did before it worked in blocks.
		var all []*Couple
		var rs []thermo.Resolved
		var donors, acceptors []string
		var problems []string
		for _, c := range lib.Couples {
			r, err := thermo.Resolve(&c.Couple, o.Cond)
			if err != nil {
				problems = append(problems, Problem{c, err}.Error())
				continue
			}
			all, rs = append(all, c), append(rs, r)
			if c.Roles&thermo.RoleDonor != 0 {
				donors = append(donors, c.ID)
			}
			if c.Roles&thermo.RoleAcceptor != 0 {
				acceptors = append(acceptors, c.ID)
			}
		}
		if len(problems) == 0 || len(all) == 0 {
			t.Fatalf("basis %v: the library should hold couples that resolve and couples that do not", basis)
		}
		for _, procs := range []int{1, 2, 4} {
			t.Run(fmt.Sprintf("%v/GOMAXPROCS=%d", basis, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				ev, err := Evaluate(lib, o)
				if err != nil {
					t.Fatal(err)
				}
				if len(ev.All) != len(all) {
					t.Fatalf("%d entries, want %d", len(ev.All), len(all))
				}
				for i, e := range ev.All {
					if e.Couple != all[i] || !reflect.DeepEqual(*e.R, rs[i]) {
						t.Fatalf("entry %d: %s %+v, want %s %+v", i, e.ID, *e.R, all[i].ID, rs[i])
					}
					if got := ev.Entry(&all[i].Couple); got != e {
						t.Fatalf("Entry(%s) = %v, want entry %d", all[i].ID, got, i)
					}
				}
				ids := func(rs []*thermo.Resolved) []string {
					out := make([]string, len(rs))
					for i, r := range rs {
						out[i] = r.Couple.ID
					}
					return out
				}
				if got := ids(ev.Donors); !reflect.DeepEqual(got, donors) {
					t.Errorf("donors differ: %d, want %d", len(got), len(donors))
				}
				if got := ids(ev.Acceptors); !reflect.DeepEqual(got, acceptors) {
					t.Errorf("acceptors differ: %d, want %d", len(got), len(acceptors))
				}
				var got []string
				for _, p := range ev.Problems {
					got = append(got, p.Error())
				}
				if !reflect.DeepEqual(got, problems) {
					t.Errorf("problems differ: %d, want %d (first %q)", len(got), len(problems), problems[0])
				}
			})
		}
	}
}
