package main

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
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

func TestFigureLadderEmbedded(t *testing.T) {
	out := filepath.Join(t.TempDir(), "ladder.svg")
	status, stdout, stderr := runCmd(t, "figure", "ladder", "-o", out)
	if status != exitOK || stdout != "" || stderr != "" {
		t.Fatalf("status %d, stdout %q, stderr %q", status, stdout, stderr)
	}
	texts := svgTexts(t, out)
	_, js, _ := runCmd(t, "rank", "--top", "0", "--format", "csv")
	ids := map[string]bool{}
	for _, line := range strings.Split(js, "\n")[1:] {
		if f := strings.Split(line, ","); len(f) > 2 {
			ids[f[0]], ids[f[1]] = true, true
		}
	}
	for id := range ids {
		if !hasText(texts, id) {
			t.Errorf("couple %s not labelled", id)
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
	if !hasText(texts, "4 of 23 donors") && !hasText(texts, "Drawn: 4 of") {
		t.Errorf("the caption does not say what --top kept: %q", texts)
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
