package main

import (
	"fmt"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// cmdCheck loads library files together, as 'rank -l A -l B' would, and
// reports every problem, one line each: FILE:LINE: field: what is wrong.
// With no file it checks the embedded library. Each couple is also resolved
// in its own solvent; one that cannot be is a problem, and a cycle that does
// not close is noted on stdout.
func cmdCheck(args []string, e env) error {
	fs := newFlagSet("check")
	if err := parse(fs, args, e); err != nil {
		return err
	}
	files := fs.Args()
	what := strings.Join(files, ", ")
	if len(files) == 0 {
		what = "embedded library"
	}
	lib, err := loadLibrary(e, files)
	if err != nil {
		return err
	}
	ev, notes, err := checkBothBases(lib, what)
	if err != nil {
		return err
	}
	combined := 0
	for _, c := range lib.Couples {
		if c.AcidID != "" {
			combined++
		}
	}
	if _, err := fmt.Fprintf(e.stdout, "ok: %s: %s (%s), %s, %s, %d series\n", data.Printable(what),
		count(len(lib.Couples), "couple"), count(combined, "combined donor"), count(len(lib.Acids), "acid"),
		count(len(lib.Reductants), "reductant"), len(lib.Series)); err != nil {
		return err
	}
	entryNotes(ev, notes)
	for _, n := range notes.result("notes") {
		if _, err := fmt.Fprintln(e.stdout, n); err != nil {
			return err
		}
	}
	return nil
}

// checkBothBases resolves every couple in its own solvent on both C_G bases:
// a couple that resolves on neither is a problem (the error lists them), one
// that resolves on only one basis is noted. It returns the evaluation on the
// default basis (the 2010 one where the default cannot be made).
func checkBothBases(lib *data.Library, what string) (*data.Evaluated, *capped, error) {
	// The 2010 basis first, of which only the problems are kept: its
	// resolutions are garbage by the time the 2022 basis is resolved, whose
	// are kept, so a large library is not held resolved twice.
	on2010 := data.Options{Cross: true, Cond: thermo.Conditions{Basis: thermo.Basis2010}}
	var otherProblems []data.Problem
	other, err2010 := data.Evaluate(lib, on2010)
	hasOther := err2010 == nil
	if hasOther {
		otherProblems = other.Problems
	}
	other = nil // let its resolutions go
	ev, err := data.Evaluate(lib, data.Options{Cross: true})
	switch {
	case err != nil && !hasOther:
		return nil, nil, fmt.Errorf("%s: solvent: %v", what, err)
	case err != nil:
		// The default basis cannot be made: the 2010 one is returned,
		// resolved again (a rare path; the common one holds one resolution).
		ev, _ = data.Evaluate(lib, on2010)
		hasOther = false
	}
	key := func(c *data.Couple) string { return c.Pos.String() + " " + c.ID }
	failedOther := map[string]bool{}
	if hasOther {
		for _, p := range otherProblems {
			failedOther[key(p.Couple)] = true
		}
	}
	var problems, notes capped
	onlyOn := func(p data.Problem, b thermo.Basis) {
		notes.add(p.Couple.Pos.File, fmt.Sprintf("%s: note: couple %s: usable on the %v basis only: %v", p.Couple.Pos, p.Couple.ID, b, p.Err))
	}
	failed := map[string]bool{}
	for _, p := range ev.Problems {
		failed[key(p.Couple)] = true
		if hasOther && !failedOther[key(p.Couple)] {
			onlyOn(p, thermo.Basis2010)
			continue
		}
		problems.add(p.Couple.Pos.File, fmt.Sprintf("%s: id: couple %s cannot be evaluated: %v", p.Couple.Pos, p.Couple.ID, p.Err))
	}
	if hasOther {
		for _, p := range otherProblems {
			if !failed[key(p.Couple)] {
				onlyOn(p, ev.Cond.Basis)
			}
		}
	}
	if len(problems.lines) > 0 {
		return nil, nil, fmt.Errorf("%s", strings.Join(problems.result("problems"), "\n"))
	}
	return ev, &notes, nil
}

// entryNotes notes each couple's potentials taken against an assumed
// electrode and each cycle that does not close.
func entryNotes(ev *data.Evaluated, notes *capped) {
	for _, en := range ev.All {
		for _, p := range []struct {
			field string
			p     *thermo.Potential
		}{{"e_anion", en.In.EAnion}, {"e_cation", en.In.ECation}, {"reductant e0", en.In.Reductant}} {
			if p.p != nil && p.p.VsAssumed {
				notes.addf(en.Pos.File, func() string {
					return fmt.Sprintf("%s: note: couple %s: %s has no electrode; taken as vs %v (assumed)", en.Pos, en.ID, p.field, p.p.Vs)
				})
			}
		}
		if en.R.BasisAssumed() {
			notes.addf(en.Pos.File, func() string {
				return fmt.Sprintf("%s: warning: couple %s: a BDFE in %s without a basis is taken on the basis in force "+
					"(2022 unless --cg-basis 2010); its H2 verdict moves with the basis: add basis: 2010, 2022 or absolute",
					en.Pos, en.ID, en.R.Couple.Solvent.Name)
			})
		}
		if c := en.R.Closure; c != nil {
			notes.addf(en.Pos.File, func() string {
				return fmt.Sprintf("%s: note: couple %s: cycle does not close: %s %.1f vs %s %.1f kcal/mol (gap %.1f ± %.1f)",
					en.Pos, en.ID, c.A.Route, c.A.Energy.Kcal, c.B.Route, c.B.Energy.Kcal, c.Gap, c.Sig)
			})
		}
	}
}

// capped keeps at most data.MaxIssuesPerFile lines per file and counts the
// rest.
type capped struct {
	lines []string
	files []string
	n     map[string]int
}

func (c *capped) add(file, line string) {
	if c.n == nil {
		c.n = map[string]int{}
	}
	if c.n[file] == 0 {
		c.files = append(c.files, file)
	}
	c.n[file]++
	if c.n[file] <= data.MaxIssuesPerFile {
		c.lines = append(c.lines, data.Printable(line)) // it quotes the library
	}
}

// addf is add for a line made only when it is kept: a large library can
// have a note on every couple, and all but the first few are only counted.
func (c *capped) addf(file string, line func() string) {
	if c.n[file] >= data.MaxIssuesPerFile {
		c.n[file]++
		return
	}
	c.add(file, line())
}

// result returns the kept lines and, per file with more, one closing line.
func (c *capped) result(what string) []string {
	out := c.lines
	for _, f := range c.files {
		if more := c.n[f] - data.MaxIssuesPerFile; more > 0 {
			out = append(out, fmt.Sprintf("%s: %d more %s not shown (first %d above)", data.Printable(f), more, what, data.MaxIssuesPerFile))
		}
	}
	return out
}

// count writes n with its noun, plural unless n is 1.
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
