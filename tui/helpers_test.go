package tui

import (
	"fmt"
	"io"
	"math/rand/v2"
	"strings"
	"sync"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/x/ansi"
	"github.com/muesli/termenv"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

func init() {
	// Plain output: goldens and width checks see text only.
	lipgloss.SetColorProfile(termenv.Ascii)
}

func plainRenderer() *lipgloss.Renderer {
	r := lipgloss.NewRenderer(io.Discard)
	r.SetColorProfile(termenv.Ascii)
	r.SetHasDarkBackground(true)
	return r
}

func tval(v, s float64) *thermo.Value { return &thermo.Value{V: v, Sigma: s} }

func potFc(v, s float64) *thermo.Potential {
	return &thermo.Potential{Value: thermo.Value{V: v, Sigma: s}, Vs: thermo.Fc}
}

// testLibrary is an invented scenario (invented species and values), in the
// working solvent, enough to exercise every pane.
func testLibrary() *data.Library {
	c := func(id, name string, roles thermo.Role, in thermo.Inputs, src string) *data.Couple {
		return &data.Couple{Couple: thermo.Couple{ID: id, Name: name, Bond: "O–H", Roles: roles, In: in},
			Source: src, Status: "invented", Tags: []string{"invented"}}
	}
	comb := c("zorbic+quen", "zorbic acid + quenol", thermo.RoleDonor,
		thermo.Inputs{AcidPKa: tval(12.0, 0.3), Reductant: potFc(-1.35, 0.01)}, "invented demo")
	comb.AcidID, comb.ReductantID = "zorbic", "quen"
	return &data.Library{
		Titles:         []string{"invented test set"},
		DefaultSolvent: "acetonitrile",
		Solvents:       thermo.Builtin(),
		Couples: []*data.Couple{
			c("quilo", "quilo-H", thermo.RoleDonor, thermo.Inputs{BDFE: tval(62, 1)}, "invented A"),
			c("vexol", "vexol-H", thermo.RoleDonor,
				thermo.Inputs{PKa: tval(24.0, 0.2), EAnion: potFc(-1.10, 0.01)}, "invented B"),
			c("brimid", "brimid-H", thermo.RoleDonor, thermo.Inputs{BDFE: tval(48, 1)}, "invented C"),
			c("tarn", "tarn radical", thermo.RoleAcceptor, thermo.Inputs{BDFE: tval(70, 1)}, "invented D"),
			c("olix", "olix", thermo.RoleAcceptor, thermo.Inputs{PKa: tval(18.5, 0.2), EAnion: potFc(-0.45, 0.01),
				PKaCation: tval(-2.0, 0.5), ECation: potFc(0.95, 0.02)}, "invented E"),
			c("mur", "mur", thermo.RoleAcceptor, thermo.Inputs{BDFE: tval(45, 1)}, "invented F"),
			c("kelp", "kelp", thermo.RoleBoth, thermo.Inputs{BDFE: tval(66, 0.5)}, "invented G"),
			comb,
		},
		Series: []data.Series{{ID: "ladder", Name: "ladder", Steps: []string{"olix", "tarn", "kelp"}}},
	}
}

// bigLibrary has nd donors and na acceptors with seeded random BDFEs.
func bigLibrary(nd, na int) *data.Library {
	rng := rand.New(rand.NewPCG(1, 1))
	lib := &data.Library{Titles: []string{"big"}, DefaultSolvent: "acetonitrile", Solvents: thermo.Builtin()}
	for i := range nd {
		lib.Couples = append(lib.Couples, &data.Couple{Couple: thermo.Couple{ID: fmt.Sprintf("d%05d", i),
			Roles: thermo.RoleDonor, In: thermo.Inputs{BDFE: tval(40+40*rng.Float64(), 0.5+rng.Float64())}}})
	}
	for i := range na {
		lib.Couples = append(lib.Couples, &data.Couple{Couple: thermo.Couple{ID: fmt.Sprintf("a%05d", i),
			Roles: thermo.RoleAcceptor, In: thermo.Inputs{BDFE: tval(40+40*rng.Float64(), 0.5+rng.Float64())}}})
	}
	return lib
}

// drain runs a command and everything it leads to, feeding each message
// back into the model, as the runtime would (but in order, at once).
func drain(t testing.TB, m Model, cmd tea.Cmd) Model {
	t.Helper()
	queue := []tea.Cmd{cmd}
	for steps := 0; len(queue) > 0; steps++ {
		if steps > 1000 {
			t.Fatal("commands do not settle")
		}
		c := queue[0]
		queue = queue[1:]
		if c == nil {
			continue
		}
		msg := c()
		switch msg := msg.(type) {
		case nil:
			continue
		case tea.BatchMsg:
			queue = append(queue, msg...)
			continue
		case tea.QuitMsg:
			continue
		}
		var next tea.Cmd
		var mm tea.Model
		mm, next = m.Update(msg)
		m = mm.(Model)
		queue = append(queue, next)
	}
	return m
}

// send delivers one message and drains what follows.
func send(t testing.TB, m Model, msg tea.Msg) Model {
	t.Helper()
	mm, cmd := m.Update(msg)
	return drain(t, mm.(Model), cmd)
}

// keys types each key name: single characters as runes, or named keys.
func keys(t testing.TB, m Model, names ...string) Model {
	t.Helper()
	for _, n := range names {
		m = send(t, m, keyMsg(n))
	}
	return m
}

func keyMsg(n string) tea.KeyMsg {
	switch n {
	case "down":
		return tea.KeyMsg{Type: tea.KeyDown}
	case "up":
		return tea.KeyMsg{Type: tea.KeyUp}
	case "pgdown":
		return tea.KeyMsg{Type: tea.KeyPgDown}
	case "pgup":
		return tea.KeyMsg{Type: tea.KeyPgUp}
	case "home":
		return tea.KeyMsg{Type: tea.KeyHome}
	case "end":
		return tea.KeyMsg{Type: tea.KeyEnd}
	case "enter":
		return tea.KeyMsg{Type: tea.KeyEnter}
	case "esc":
		return tea.KeyMsg{Type: tea.KeyEscape}
	case "tab":
		return tea.KeyMsg{Type: tea.KeyTab}
	case "shift+tab":
		return tea.KeyMsg{Type: tea.KeyShiftTab}
	case "space":
		return tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}}
	case "ctrl+c":
		return tea.KeyMsg{Type: tea.KeyCtrlC}
	case "backspace":
		return tea.KeyMsg{Type: tea.KeyBackspace}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(n)}
}

// open builds a model on lib at w×h with its state in dir, evaluated.
func open(t testing.TB, lib *data.Library, w, h int, dir string) Model {
	t.Helper()
	m := New(lib, Options{StateDir: dir, NoCaution: true, Renderer: plainRenderer()})
	m = send(t, m, tea.WindowSizeMsg{Width: w, Height: h})
	return drain(t, m, m.Init())
}

// screen is the plain text of the view.
func screen(m Model) string { return ansi.Strip(m.View()) }

// checkFrame asserts the view is exactly h lines of at most w cells.
func checkFrame(t *testing.T, m Model, w, h int) {
	t.Helper()
	lines := strings.Split(m.View(), "\n")
	if len(lines) != h {
		t.Errorf("view has %d lines, want %d", len(lines), h)
	}
	for i, l := range lines {
		if lw := ansi.StringWidth(l); lw > w {
			t.Errorf("line %d is %d cells wide (> %d): %q", i, lw, w, ansi.Strip(l))
		}
	}
}

var (
	bigOnce sync.Once
	bigLib  *data.Library
	bigTabs *tables
)

// million is a library with 1000 donors × 1000 acceptors = 10^6 pairs,
// evaluated once per test binary.
func million(tb testing.TB) (*data.Library, *tables) {
	bigOnce.Do(func() {
		bigLib = bigLibrary(1000, 1000)
		ev, err := data.Evaluate(bigLib, data.Options{})
		if err != nil {
			panic(err)
		}
		bigTabs = buildTables(ev, 0)
	})
	return bigLib, bigTabs
}

// withTables builds a ready model straight from laid-out tables.
func withTables(tb testing.TB, lib *data.Library, t *tables, w, h int) Model {
	m := New(lib, Options{StateDir: tb.TempDir(), NoCaution: true, Renderer: plainRenderer()})
	mm, _ := m.Update(tea.WindowSizeMsg{Width: w, Height: h})
	m = mm.(Model)
	msg := loadedMsg{seq: m.evalSeq, t: t}
	for p := range 3 {
		msg.perms[p], _ = order(jobFor(t, pane(p), m.grids[p].spec(), nil, nil))
	}
	mm, _ = m.Update(msg)
	return mm.(Model)
}

// focus names the open dialog ("" for none).
func focus(m Model) string {
	if m.dlg == nil {
		return ""
	}
	return m.dlg.kind()
}

// setPath types over the export path box.
func setPath(m Model, p string) Model {
	d := m.dlg.(pathDialog)
	d.in.SetValue(p)
	m.dlg = d
	return m
}

// quits tells whether key k leads to tea.Quit, following the messages
// dialogs send to the app model.
func quits(t testing.TB, m Model, k string) bool {
	t.Helper()
	mm, cmd := m.Update(keyMsg(k))
	m = mm.(Model)
	queue := []tea.Cmd{cmd}
	for len(queue) > 0 {
		c := queue[0]
		queue = queue[1:]
		if c == nil {
			continue
		}
		switch msg := c().(type) {
		case tea.QuitMsg:
			return true
		case tea.BatchMsg:
			queue = append(queue, msg...)
		case nil:
		default:
			mm, next := m.Update(msg)
			m = mm.(Model)
			queue = append(queue, next)
		}
	}
	return false
}
