package tui

import (
	"fmt"
	"strings"
	"testing"

	"github.com/charmbracelet/x/exp/golden"
)

// TestGolden keeps each pane's plain text at 80×24 and 120×40 (regenerate
// with go test ./tui/ -run TestGolden -update, and review the diff).
func TestGolden(t *testing.T) {
	screens := []struct {
		name string
		keys []string
	}{
		{"pairs", nil},
		{"donors", []string{"2"}},
		{"acceptors", []string{"3"}},
		{"series", []string{"4"}},
		{"scale", []string{"5", "down", "down"}},
		{"detail", []string{"enter"}},
		{"help", []string{"?"}},
		{"marked_sorted", []string{"space", "down", "space", "s", "s", "S"}},
		{"filter", []string{"/", "o", "l", "i"}},
		{"class_oh", []string{"c"}},
		{"solvent_picker", []string{"v"}},
		{"caution_first_start", []string{"__caution"}},
	}
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		for _, s := range screens {
			t.Run(fmt.Sprintf("%s_%dx%d", s.name, size[0], size[1]), func(t *testing.T) {
				m := open(t, testLibrary(), size[0], size[1], t.TempDir())
				if len(s.keys) == 1 && s.keys[0] == "__caution" {
					m.dlg = cautionDialog{}
					s.keys = nil
				}
				m = keys(t, m, s.keys...)
				checkFrame(t, m, size[0], size[1])
				out := screen(m)
				// Trailing blanks are padding; keep goldens readable.
				lines := strings.Split(out, "\n")
				for i, l := range lines {
					lines[i] = strings.TrimRight(l, " ")
				}
				golden.RequireEqual(t, []byte(strings.Join(lines, "\n")+"\n"))
			})
		}
	}
}
