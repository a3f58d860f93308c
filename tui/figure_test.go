package tui

import (
	"encoding/xml"
	"os"
	"path/filepath"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
)

// svgText is the text of every element of an SVG file, checking that it
// parses as XML.
func svgText(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(strings.NewReader(string(b)))
	var text strings.Builder
	for {
		tok, err := dec.Token()
		if err != nil {
			if err.Error() == "EOF" {
				break
			}
			t.Fatalf("%s is not XML: %v", path, err)
		}
		if c, ok := tok.(xml.CharData); ok {
			text.Write(c)
			text.WriteByte('\n')
		}
	}
	return text.String()
}

// f on the Scale writes the ladder with the selected pair; on Pairs the map
// of the listed pairs' couples. An existing file is asked about.
func TestFigureKey(t *testing.T) {
	dir := t.TempDir()
	m := open(t, testLibrary(), 120, 40, t.TempDir())
	ladder := filepath.Join(dir, "ladder.svg")
	m = keys(t, m, "5", "f")
	if focus(m) != "value" || !strings.Contains(screen(m), "hatsieve-ladder.svg") {
		t.Fatalf("f on Scale does not ask for a path with the default name:\n%s", screen(m))
	}
	m = clearInput(t, m)
	m = keys(t, m, filepath.Join(dir, "ladder.pdf"), "enter")
	if focus(m) != "value" || !strings.Contains(screen(m), ".pdf is not offered") {
		t.Fatalf("a .pdf path was not refused in the box:\n%s", screen(m))
	}
	m = clearInput(t, m)
	m = keys(t, m, ladder, "enter")
	if !strings.Contains(m.status, "wrote the figure") {
		t.Fatalf("status %q", m.status)
	}
	s := svgText(t, ladder)
	for _, id := range []string{"quilo", "vexol", "brimid", "tarn", "olix", "mur", "kelp", "zorbic+quen"} {
		if !strings.Contains(s, id) {
			t.Errorf("ladder lacks %s", id)
		}
	}
	// The same path again: asked, refused, then overwritten.
	before, _ := os.ReadFile(ladder)
	m = keys(t, m, "f", "enter")
	if focus(m) != "confirm" || !strings.Contains(screen(m), "already exists") {
		t.Fatalf("no overwrite question:\n%s", screen(m))
	}
	m = keys(t, m, "n")
	if after, _ := os.ReadFile(ladder); string(after) != string(before) || !strings.Contains(m.status, "not overwritten") {
		t.Errorf("n changed the file or said %q", m.status)
	}
	m = keys(t, m, "down", "f", "enter", "y")
	if !strings.Contains(m.status, "wrote the figure") {
		t.Errorf("y did not overwrite: %q", m.status)
	}
	// The map of the listed pairs: filtered to tarn, only its donors and it.
	mp := filepath.Join(dir, "map.png")
	m = keys(t, m, "1", "/", "tarn", "enter", "f")
	if !strings.Contains(screen(m), "hatsieve-map.svg") {
		t.Errorf("f on Pairs does not offer the map's default name:\n%s", screen(m))
	}
	m = clearInput(t, m)
	m = keys(t, m, mp, "enter")
	b, err := os.ReadFile(mp)
	if err != nil || !strings.HasPrefix(string(b), "\x89PNG") {
		t.Fatalf("no PNG written (%v), status %q", err, m.status)
	}
	svg := filepath.Join(dir, "map.svg")
	m = keys(t, m, "f")
	m = clearInput(t, m)
	m = keys(t, m, svg, "enter")
	s = svgText(t, svg)
	if !strings.Contains(s, "tarn") || strings.Contains(s, "olix") {
		t.Errorf("the map is not of the listed pairs (tarn only):\n%s", s)
	}
}

// Quitting while a figure is being written waits for it.
func TestQuitWaitsForFigure(t *testing.T) {
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	out := filepath.Join(t.TempDir(), "slow.svg")
	m = keys(t, m, "5", "f")
	m = clearInput(t, m)
	m = keys(t, m, out)
	mm, cmd := m.Update(keyMsg("enter"))
	m = mm.(Model)
	mm, write := m.Update(cmd()) // figurePathMsg → the write command, not yet run
	m = mm.(Model)
	if len(m.writing) != 1 {
		t.Fatalf("writing %v, want the figure", m.writing)
	}
	mm, c := m.Update(keyMsg("q"))
	m = mm.(Model)
	if c != nil {
		if _, quit := c().(tea.QuitMsg); quit {
			t.Fatal("q quit with a figure being written")
		}
	}
	mm, after := m.Update(write())
	m = mm.(Model)
	if after == nil {
		t.Fatal("no quit once the figure was written")
	}
	if _, quit := after().(tea.QuitMsg); !quit {
		t.Error("the finished figure did not quit")
	}
	if _, err := os.Stat(out); err != nil {
		t.Errorf("the figure is missing: %v", err)
	}
}
