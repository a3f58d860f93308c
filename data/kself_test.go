package data

import (
	"strings"
	"testing"
)

const kselfCouples = `format: hatsieve/1
solvent: acetonitrile
couples:
  - {id: a-oh, bdfe: 70, source: invented, status: invented, k_self: 4.7}
  - {id: b-oh, bdfe: 75, source: invented, status: invented, k_self: "3.2e5 M-1 s-1"}
  - id: c-oh
    bdfe: 80
    source: invented
    status: invented
    k_self: {value: 220, factor: 3, source: a notebook, status: measured, note: 25 °C}
  - {id: d-oh, bdfe: 85, source: invented, status: invented}
  - {id: e-oh, bdfe: 86, source: invented, status: invented}
`

// A second file that gives k_self to couples defined in the first.
const kselfList = `format: hatsieve/1
k_self:
  - {couple: d-oh, value: 10, factor: 2, source: another notebook, status: measured}
`

func TestKSelfFields(t *testing.T) {
	lib, err := Load(File{"a.yaml", []byte(kselfCouples)}, File{"b.yaml", []byte(kselfList)})
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]*Couple{}
	for _, c := range lib.Couples {
		got[c.ID] = c
	}
	check := func(id string, k, factor float64, source, status string) {
		t.Helper()
		c := got[id]
		if c.KSelf == nil {
			t.Fatalf("%s: no k_self", id)
		}
		if c.KSelf.K != k || c.KSelf.Factor != factor || c.KSelf.Source != source || c.KSelf.Status != status {
			t.Errorf("%s: %+v, want %g ×/÷ %g (%s, %s)", id, *c.KSelf, k, factor, source, status)
		}
	}
	check("a-oh", 4.7, 0, "invented", "invented")
	check("b-oh", 3.2e5, 0, "invented", "invented")
	check("c-oh", 220, 3, "a notebook", "measured")
	check("d-oh", 10, 2, "another notebook", "measured")
	if got["e-oh"].KSelf != nil {
		t.Errorf("e-oh has no k_self in any file, got %+v", got["e-oh"].KSelf)
	}
}

func TestKSelfProblems(t *testing.T) {
	for _, tc := range []struct {
		name, extra, want string
	}{
		{"unknown id", "k_self:\n  - {couple: d-hh, value: 1, source: x}\n", `no couple has this id (did you mean d-oh?)`},
		{"twice", "k_self:\n  - {couple: a-oh, value: 1, source: x}\n", "given twice"},
		{"no source", "k_self:\n  - {couple: d-oh, value: 1}\n", "needs its source"},
		{"above Z", "k_self:\n  - {couple: d-oh, value: 2e11, source: x}\n", "below 1e11"},
		{"negative", "k_self:\n  - {couple: d-oh, value: -1, source: x}\n", "above 0"},
		{"unit", "k_self:\n  - {couple: d-oh, value: 1 s-1, source: x}\n", "want a rate constant"},
		{"factor", "k_self:\n  - {couple: d-oh, value: 1, factor: 0.5, source: x}\n", "factor, 1 or more"},
		{"status", "k_self:\n  - {couple: d-oh, value: 1, source: x, status: chekced}\n", "did you mean checked"},
		{"key", "k_self:\n  - {couple: d-oh, valu: 1, source: x}\n", "unknown key"},
	} {
		_, err := Load(File{"a.yaml", []byte(kselfCouples)}, File{"b.yaml", []byte("format: hatsieve/1\n" + tc.extra)})
		if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), "b.yaml:") {
			t.Errorf("%s: %v, want %q with file and line", tc.name, err, tc.want)
		}
	}
	bad := strings.Replace(kselfCouples, "k_self: 4.7", "k_self: fast", 1)
	if _, err := Load(File{"a.yaml", []byte(bad)}); err == nil || !strings.Contains(err.Error(), "a.yaml:4: k_self") {
		t.Errorf("bad couple k_self: %v", err)
	}
}

// The embedded list gives its constants to reference couples, each with a
// source and a status (values from memory are marked so in the file).
func TestEmbeddedKSelf(t *testing.T) {
	lib := mustDefault(t)
	n := 0
	for _, c := range lib.Couples {
		if c.KSelf == nil {
			continue
		}
		n++
		if c.KSelf.Source == "" || c.KSelf.Status == "" {
			t.Errorf("%s: k_self without source or status: %+v", c.ID, *c.KSelf)
		}
	}
	if n < 2 {
		t.Errorf("%d reference couples have k_self, want at least 2 (library/kself.yaml)", n)
	}
}

// k_self reads the same on the fast path (runs of couples) as whole, in
// block style, with a bad value too.
func TestKSelfBothPaths(t *testing.T) {
	runsFor(t, 2)
	body := "format: hatsieve/1\nsolvent: acetonitrile\ncouples:\n" +
		"- id: p1\n  bdfe: 70\n  k_self: 4.7\n" +
		"- id: p2\n  bdfe: 71\n  k_self: 3.2e5 M-1 s-1\n" +
		"- id: p3\n  bdfe: 72\n" +
		"k_self:\n- couple: p3\n  value: 10\n  source: invented\n"
	st := sameBothPaths(t, File{"a.yaml", []byte(body)})
	if st.runFiles != 1 {
		t.Fatalf("the file did not take the fast path: %+v", st)
	}
	lib, err := Load(File{"a.yaml", []byte(body)})
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []float64{4.7, 3.2e5, 10} {
		if c := lib.Couples[i]; c.KSelf == nil || c.KSelf.K != want {
			t.Errorf("%s: k_self %+v, want %g", c.ID, c.KSelf, want)
		}
	}
	sameBothPaths(t, File{"b.yaml", []byte(strings.Replace(body, "k_self: 4.7", "k_self: slow", 1))})
}
