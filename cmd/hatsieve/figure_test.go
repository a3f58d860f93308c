package main

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// svgTexts parses an SVG file with encoding/xml and returns its texts.
func svgTexts(t *testing.T, path string) []string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(b))
	var texts []string
	in := false
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return texts
		}
		if err != nil {
			t.Fatalf("%s is not well-formed XML: %v", path, err)
		}
		switch el := tok.(type) {
		case xml.StartElement:
			if in = el.Name.Local == "text"; in {
				texts = append(texts, "")
			}
		case xml.CharData:
			if in {
				texts[len(texts)-1] += string(el)
			}
		case xml.EndElement:
			in = false
		}
	}
}

func hasText(texts []string, part string) bool {
	for _, s := range texts {
		if strings.Contains(s, part) {
			return true
		}
	}
	return false
}

// caption joins an SVG's texts, so a wrapped caption reads as one line.
func caption(texts []string) string { return strings.Join(texts, " ") }

// rankedIDs are the donors and the acceptors rank pairs on the embedded
// library, read from its CSV (columns donor, acceptor).
func rankedIDs(t *testing.T, args ...string) (donors, acceptors map[string]bool) {
	t.Helper()
	status, csv, stderr := runCmd(t, append([]string{"rank", "--top", "0", "--format", "csv"}, args...)...)
	if status != exitOK {
		t.Fatalf("rank: status %d, %s", status, stderr)
	}
	donors, acceptors = map[string]bool{}, map[string]bool{}
	for _, line := range strings.Split(csv, "\n")[1:] {
		if f := strings.Split(line, ","); len(f) > 2 {
			donors[f[0]], acceptors[f[1]] = true, true
		}
	}
	return donors, acceptors
}

// labelled counts the couples of ids with a label on their side of the
// ladder: "id  value" left (donors), "value  id" right (acceptors).
func labelled(texts []string, ids map[string]bool, donor bool) map[string]bool {
	out := map[string]bool{}
	for _, s := range texts {
		f := strings.Fields(strings.TrimSuffix(s, " (below H2 line)"))
		if len(f) != 2 {
			continue
		}
		id := f[1]
		if donor {
			id = f[0]
		}
		if ids[id] {
			out[id] = true
		}
	}
	return out
}

func TestFigureLadderEmbedded(t *testing.T) {
	out := filepath.Join(t.TempDir(), "ladder.svg")
	status, stdout, stderr := runCmd(t, "figure", "ladder", "-o", out)
	if status != exitOK || stdout != "" || stderr != "" {
		t.Fatalf("status %d, stdout %q, stderr %q", status, stdout, stderr)
	}
	texts := svgTexts(t, out)
	donors, acceptors := rankedIDs(t)
	if len(donors) <= DefaultLadderMax || len(acceptors) <= DefaultLadderMax {
		t.Fatalf("%d donors, %d acceptors: the test needs more than --max's default", len(donors), len(acceptors))
	}
	// The caption says how many of how many are drawn; exactly those are
	// labelled, and the column heads say the same.
	nd, na := min(DefaultLadderMax, len(donors)), min(DefaultLadderMax, len(acceptors))
	want := fmt.Sprintf("Shown: %d of %d donors and %d of %d acceptors, chosen to span the BDFE range", nd, len(donors), na, len(acceptors))
	if !strings.Contains(caption(texts), want) {
		t.Errorf("caption does not say %q: %s", want, caption(texts))
	}
	if got := len(labelled(texts, donors, true)); got != nd {
		t.Errorf("%d donors labelled, the caption says %d", got, nd)
	}
	if got := len(labelled(texts, acceptors, false)); got != na {
		t.Errorf("%d acceptors labelled, the caption says %d", got, na)
	}
	for _, head := range []string{fmt.Sprintf("Donors X–H (%d of %d)", nd, len(donors)), fmt.Sprintf("Acceptors Y–H (%d of %d)", na, len(acceptors))} {
		if !hasText(texts, head) {
			t.Errorf("no column head %q", head)
		}
	}
	for _, w := range []string{"acetonitrile", "2022 basis", "298.15 K", "kcal/mol", "H2 line"} {
		if !hasText(texts, w) {
			t.Errorf("no %q in the figure", w)
		}
	}
	// Never overwritten without --force; replaced with it.
	status, _, stderr = runCmd(t, "figure", "ladder", "-o", out)
	if status != exitData || !strings.Contains(stderr, "--force") {
		t.Errorf("second write: status %d, stderr %q", status, stderr)
	}
	oneErrorLine(t, []string{"figure", "ladder"}, stderr)
	if status, _, stderr = runCmd(t, "figure", "ladder", "-o", out, "--force", "--units", "kj"); status != exitOK {
		t.Fatalf("--force: status %d, %s", status, stderr)
	}
	if !hasText(svgTexts(t, out), "kJ/mol") {
		t.Error("--units kj not in the figure")
	}
}

// --max 0 draws every couple, labelled, on a page tall enough, and is a
// usage error naming what the page holds on one that is not.
func TestFigureLadderAll(t *testing.T) {
	dir := t.TempDir()
	donors, acceptors := rankedIDs(t)
	short := filepath.Join(dir, "short.svg")
	status, _, stderr := runCmd(t, "figure", "ladder", "--max", "0", "-o", short)
	if status != exitUsage || !strings.Contains(stderr, "--max 0") || !strings.Contains(stderr, fmt.Sprintf("not %d donors", len(donors))) {
		t.Errorf("--max 0 on a slide: status %d, %q", status, stderr)
	}
	oneErrorLine(t, []string{"figure", "ladder", "--max", "0"}, stderr)
	if _, err := os.Stat(short); err == nil {
		t.Error("a failed --max 0 wrote its file")
	}
	tall := filepath.Join(dir, "tall.svg")
	if status, _, stderr = runCmd(t, "figure", "ladder", "--max", "0", "--height", "60cm", "-o", tall); status != exitOK {
		t.Fatalf("--max 0 --height 60cm: status %d, %s", status, stderr)
	}
	texts := svgTexts(t, tall)
	for side, ids := range map[bool]map[string]bool{true: donors, false: acceptors} {
		got := labelled(texts, ids, side)
		for id := range ids {
			if !got[id] {
				t.Errorf("couple %s (donor %v) not labelled", id, side)
			}
		}
	}
	if strings.Contains(caption(texts), "Shown:") || strings.Contains(caption(texts), "want of room") {
		t.Errorf("an all-couples ladder says it left some out: %s", caption(texts))
	}
}

// gH reads the H2 line from a ladder's caption ("G_H = 51.95 kcal/mol").
func gH(t *testing.T, c string) float64 {
	t.Helper()
	_, rest, ok := strings.Cut(c, "G_H = ")
	f := strings.Fields(rest)
	if !ok || len(f) == 0 {
		t.Fatalf("no G_H in %s", c)
	}
	v, err := strconv.ParseFloat(f[0], 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// The H2 line moves with --p-h2 by ½RT·ln p and the caption and the line's
// name give the pressure; --cg makes the basis "explicit" and moves the
// line by as much as C_G.
func TestFigureLadderPressureAndExplicit(t *testing.T) {
	dir := t.TempDir()
	draw := func(name string, args ...string) string {
		out := filepath.Join(dir, name)
		status, _, stderr := runCmd(t, append([]string{"figure", "ladder", "-o", out, "--solvent", "acetonitrile"}, args...)...)
		if status != exitOK {
			t.Fatalf("%q: status %d, %s", args, status, stderr)
		}
		return caption(svgTexts(t, out))
	}
	std, p100, cg := draw("std.svg"), draw("p100.svg", "--p-h2", "100"), draw("cg.svg", "--cg", "54")
	// ½RT·ln 100 = 0.5 × 1.98720e-3 kcal/(mol·K) × 298.15 K × ln 100
	// = 1.364 kcal/mol. Source: CODATA 2018 (R = 8.314462618 J/(mol·K),
	// 1 cal = 4.184 J).
	shift := 0.5 * 8.314462618 / 4184 * 298.15 * math.Log(100)
	if d := gH(t, std) - gH(t, p100); math.Abs(d-shift) > 0.006 {
		t.Errorf("100 atm moves G_H by %.3f, want %.3f", d, shift)
	}
	// G_H = C_G + F·E°(H+/H2): a C_G 54 − 52.60 higher lifts it as much.
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961 (eq. 15).
	if d := gH(t, cg) - gH(t, std); math.Abs(d-(54-52.60)) > 0.006 {
		t.Errorf("--cg 54 moves G_H by %.3f, want %.2f", d, 54-52.60)
	}
	for _, w := range []string{"p(H2) = 100 atm", "(100 atm)"} {
		if !strings.Contains(p100, w) || strings.Contains(std, w) {
			t.Errorf("%q: in the 100 atm caption %v, in the 1 atm one %v", w, strings.Contains(p100, w), strings.Contains(std, w))
		}
	}
	if !strings.Contains(cg, "explicit basis") || !strings.Contains(std, "2022 basis") {
		t.Errorf("basis: --cg %s; default %s", cg, std)
	}
}

func TestFigurePNGSize(t *testing.T) {
	out := filepath.Join(t.TempDir(), "map.png")
	status, _, stderr := runCmd(t, "figure", "map", "-o", out, "--width", "20cm", "--height", "4.5in", "--dpi", "100")
	if status != exitOK {
		t.Fatalf("status %d, %s", status, stderr)
	}
	f, err := os.Open(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	// 1 in = 2.54 cm exactly. Source: NIST SP 811, appendix B.
	w, h := int(math.Round(20/2.54*100)), 450
	if b := img.Bounds(); b.Dx() != w || b.Dy() != h {
		t.Errorf("%dx%d pixels, want %dx%d", b.Dx(), b.Dy(), w, h)
	}
}

func TestFigureMapShortlistAndTop(t *testing.T) {
	dir := t.TempDir()
	list := filepath.Join(dir, "shortlist.json")
	body := `{"format": "hatsieve-shortlist/1", "files": [], "titles": [], "marks": [{"donor": "tempo-h", "acceptor": "nhpi"}]}`
	if err := os.WriteFile(list, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "map.svg")
	status, _, stderr := runCmd(t, "figure", "map", "-o", out, "--shortlist", list)
	if status != exitOK || stderr != "" {
		t.Fatalf("status %d, stderr %q", status, stderr)
	}
	texts := svgTexts(t, out)
	if !hasText(texts, "shortlisted pair") || !hasText(texts, "tempo-h") {
		t.Error("the shortlist is not shown")
	}
	if b, _ := os.ReadFile(list); string(b) != body {
		t.Error("the shortlist file was changed")
	}
	out2 := filepath.Join(dir, "top.svg")
	status, _, stderr = runCmd(t, "figure", "map", "-o", out2, "--top", "4", "--h2", "uphill")
	if status != exitOK {
		t.Fatalf("--top 4: status %d, %s", status, stderr)
	}
	texts = svgTexts(t, out2)
	donors, acceptors := rankedIDs(t)
	want := fmt.Sprintf("Shown: 4 of %d donors and 4 of %d acceptors, chosen to span the BDFE range", len(donors), len(acceptors))
	if !strings.Contains(caption(texts), want) || !strings.Contains(caption(texts), "among those that pass the filters") {
		t.Errorf("the caption does not say what --top kept (%q): %s", want, caption(texts))
	}
	for _, s := range texts {
		if strings.HasPrefix(s, "▼ ") && !strings.HasPrefix(s, "▼ donor,") {
			t.Errorf("--h2 uphill drew %q, a donor below the H2 line", s)
		}
	}
	// A damaged shortlist is bad data, one line, and left as it was.
	if err := os.WriteFile(list, []byte(`{"format": "other"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	status, _, stderr = runCmd(t, "figure", "map", "-o", filepath.Join(dir, "x.svg"), "--shortlist", list)
	if status != exitData || !strings.Contains(stderr, "hatsieve-shortlist/1") {
		t.Errorf("damaged shortlist: status %d, stderr %q", status, stderr)
	}
	oneErrorLine(t, []string{"figure", "map", "--shortlist"}, stderr)
	if _, err := os.Stat(list); err != nil {
		t.Error("the damaged shortlist was moved")
	}
}

func TestFigureUsageErrors(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{
		{"figure"},
		{"figure", "pie", "-o", "x.svg"},
		{"figure", "ladder"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.jpg")},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.pdf")},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.svg"), "--width", "16"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.svg"), "--height", "1cm"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.png"), "--dpi", "5"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.svg"), "--max", "-1"},
		{"figure", "map", "-o", filepath.Join(dir, "x.svg"), "--top", "-2"},
		{"figure", "map", "-o", filepath.Join(dir, "x.svg"), "--h2", "sideways"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.svg"), "--cg-basis", "1999"},
		{"figure", "ladder", "-o", filepath.Join(dir, "x.png"), "--width", "12cm", "--height", "5cm"},
		{"figure", "map", "-o", filepath.Join(dir, "x.svg"), "--width", "5cm", "--height", "5cm"},
	} {
		status, _, stderr := runCmd(t, args...)
		if status != exitUsage {
			t.Errorf("%q: status %d, want %d (stderr %q)", args, status, exitUsage, stderr)
		}
		oneErrorLine(t, args, stderr)
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("usage errors left files: %v", entries)
	}
}

func TestFigureBadLibraryIsData(t *testing.T) {
	dir := t.TempDir()
	lib := filepath.Join(dir, "bad.yaml")
	if err := os.WriteFile(lib, []byte("format: hatsieve/1\ncouples: [{id: x, bdfe: banana}]\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "x.svg")
	status, _, stderr := runCmd(t, "figure", "ladder", "-l", lib, "-o", out)
	if status != exitData {
		t.Errorf("status %d, stderr %q", status, stderr)
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("a figure was written from a bad library")
	}
}

// figure, figure ladder and figure map each print a real usage for --help
// (and -h), with the options written with two dashes, and exit 0.
func TestFigureHelp(t *testing.T) {
	for _, c := range []struct {
		args []string
		want []string
	}{
		{[]string{"figure", "--help"}, []string{"hatsieve figure ladder", "hatsieve figure map"}},
		{[]string{"figure", "-h"}, []string{"hatsieve figure ladder"}},
		{[]string{"figure", "ladder", "--help"}, []string{"The BDFE ladder", "\n  --max int\n", "\n  --pick string\n", "\n  --p-h2 ATM\n", "(default 20)"}},
		{[]string{"figure", "map", "--help"}, []string{"The pairing map", "\n  --top N\n", "\n  --shortlist string\n", "\n  --sort METRIC\n"}},
	} {
		status, out, errs := runCmd(t, c.args...)
		if status != exitOK || errs != "" || !strings.HasPrefix(out, "usage:\n  hatsieve figure ") {
			t.Errorf("%q: status %d, stderr %q, stdout %q", c.args, status, errs, out)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(out, w) {
				t.Errorf("%q: no %q in %s", c.args, w, out)
			}
		}
		if strings.Contains(out, "\n  -max") || strings.Contains(out, "\n  -top") {
			t.Errorf("%q: an option with one dash", c.args)
		}
	}
}
