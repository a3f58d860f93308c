package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/cursor"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/textinput"
	"github.com/charmbracelet/bubbles/viewport"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"github.com/hatsieve/hatsieve/thermo"
)

// dialog is a small model that has the keyboard while it is open: the help,
// the caution, the solvent picker, a yes/no question, the filter and export
// path boxes, the detail panel. The app model routes every key to the open
// dialog and no global key reaches the panes meanwhile. A dialog reports
// what was chosen with a message (a command), and closes by returning nil.
type dialog interface {
	update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd)
	// view draws the dialog in the body, w×h; "" leaves the pane shown
	// (a dialog on the status line).
	view(w, h int, st *Styles) string
	// line is what the dialog writes on the status line ("" for the
	// app's own status).
	line() string
	help(km *KeyMap) []key.Binding
	kind() string
	// text tells whether a text box has focus: then q and digits are text.
	text() bool
}

// Messages with which dialogs report to the app.
type (
	quitAskedMsg  struct{}
	cautionOKMsg  struct{}
	filterMsg     struct{ query string }
	solventMsg    struct{ key string } // "" for every solvent
	exportPathMsg struct{ path string }
	answerMsg     struct {
		q   question
		yes bool
	}
	statusMsg struct{ text string }
)

// question is what a yes/no dialog asks.
type question int

const (
	askOverwrite question = iota
	askLargeExport
	askFigureOverwrite
)

func emit(msg tea.Msg) tea.Cmd { return func() tea.Msg { return msg } }

// frame draws a dialog box of at most 76 cells.
func frame(st *Styles, w int, title, body string) string {
	w = min(w-2, 76)
	inner := st.Accent.Render(title) + "\n\n" + lipgloss.NewStyle().Width(max(w-4, 1)).Render(body)
	return st.Dialog.Width(max(w-2, 1)).Render(inner)
}

// --- help ---

type helpDialog struct{ keys string } // the key lines, one a line

func (d helpDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	switch {
	case !ok:
	case key.Matches(k, km.Quit):
		return d, emit(quitAskedMsg{})
	case key.Matches(k, km.Help, km.Cancel):
		return nil, nil
	}
	return d, nil
}

func (d helpDialog) view(w, h int, st *Styles) string {
	text := "Caution: " + cautionText + "\n\n" + twoColumns(d.keys, w)
	return lipgloss.NewStyle().Width(w).Render(text)
}

func (helpDialog) line() string                  { return "" }
func (helpDialog) help(km *KeyMap) []key.Binding { return []key.Binding{km.Cancel} }
func (helpDialog) kind() string                  { return "help" }
func (helpDialog) text() bool                    { return false }

// twoColumns sets help lines side by side when the screen is wide enough.
func twoColumns(s string, w int) string {
	lines := strings.Split(strings.TrimRight(s, "\n"), "\n")
	if w < 70 {
		return strings.Join(lines, "\n")
	}
	half := (len(lines) + 1) / 2
	var b strings.Builder
	for i := range half {
		l := fit(lines[i], w/2)
		if i+half < len(lines) {
			l += lines[i+half]
		}
		b.WriteString(strings.TrimRight(l, " "))
		b.WriteByte('\n')
	}
	return b.String()
}

// --- first-start caution ---

type cautionDialog struct{}

func (d cautionDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	switch {
	case !ok:
	case key.Matches(k, km.Quit):
		return d, emit(quitAskedMsg{})
	case key.Matches(k, km.Accept, km.Cancel, km.Mark):
		return nil, emit(cautionOKMsg{})
	}
	return d, nil
}

func (cautionDialog) view(w, h int, st *Styles) string {
	return frame(st, w, "Before you start", cautionText+"\n\nPress enter to continue. (Also under ? help.)")
}

func (cautionDialog) line() string                  { return "" }
func (cautionDialog) help(km *KeyMap) []key.Binding { return []key.Binding{km.Accept} }
func (cautionDialog) kind() string                  { return "caution" }
func (cautionDialog) text() bool                    { return false }

const cautionText = "Screening is not a safety assessment. H2 evolution pressurises closed vessels " +
	"and forms flammable mixtures with air; strong reductants and hydrides can be pyrophoric. " +
	"Local codes, your institution's chemical hygiene plan and licensed practice govern every experiment."

// --- yes/no question ---

type confirmDialog struct {
	q           question
	title, body string
}

func (d confirmDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	switch {
	case !ok:
	case key.Matches(k, km.Yes):
		return nil, emit(answerMsg{d.q, true})
	case key.Matches(k, km.No, km.Cancel):
		return nil, emit(answerMsg{d.q, false})
	}
	return d, nil
}

func (d confirmDialog) view(w, h int, st *Styles) string {
	return frame(st, w, d.title, d.body+"\ny / n")
}

func (confirmDialog) line() string { return "" }
func (confirmDialog) help(km *KeyMap) []key.Binding {
	return []key.Binding{km.Yes, km.No, km.Cancel}
}
func (confirmDialog) kind() string { return "confirm" }
func (confirmDialog) text() bool   { return false }

// --- solvent picker ---

// solventDialog picks the solvent shown: every solvent (cross-solvent
// pairs, with their extra σ) or one, which then is the working solvent.
type solventDialog struct {
	solvents []*thermo.Solvent
	counts   []int // couples of the library in each solvent
	pick     int   // 0 is "every solvent", i+1 is solvents[i]
	e        func(float64) string
}

func newSolventDialog(solvents []*thermo.Solvent, counts []int, current *thermo.Solvent, all bool, e func(float64) string) solventDialog {
	d := solventDialog{solvents: solvents, counts: counts, e: e}
	for i, s := range solvents {
		if s == current && !all {
			d.pick = i + 1
		}
	}
	return d
}

func (d solventDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	switch {
	case !ok:
	case key.Matches(k, km.Cancel):
		return nil, nil
	case key.Matches(k, km.Up):
		d.pick = max(d.pick-1, 0)
	case key.Matches(k, km.Down):
		d.pick = min(d.pick+1, len(d.solvents))
	case key.Matches(k, km.Accept):
		if d.pick == 0 {
			return nil, emit(solventMsg{})
		}
		return nil, emit(solventMsg{key: d.solvents[d.pick-1].Key})
	}
	return d, nil
}

func (d solventDialog) view(w, h int, st *Styles) string {
	var b strings.Builder
	b.WriteString(st.Accent.Render("Solvent shown") + " · enter picks · esc cancels · one is the working solvent\n")
	b.WriteString(st.Dim.Render("C_G with ~: an estimate, no published 2022 value (hatsieve solvents gives its source)") + "\n")
	rows := h - 3
	start := max(0, d.pick-rows+1)
	for i := start; i <= len(d.solvents) && i < start+rows; i++ {
		cur := "  "
		if i == d.pick {
			cur = "> "
		}
		var l string
		if i == 0 {
			l = cur + "every solvent (pairs across solvents carry extra σ; the working solvent stays)"
		} else {
			s := d.solvents[i-1]
			cg2022, cg2010 := "-", "-"
			if s.CG2022 != nil {
				cg2022 = d.e(s.CG2022.V)
				if s.CGEstimated(thermo.Basis2022) {
					cg2022 += "~" // no published value: see the legend
				}
			}
			if s.CG2010 != nil {
				cg2010 = d.e(s.CG2010.V)
			}
			l = fmt.Sprintf("%s%-16s %4d couples · C_G 2022 %7s · 2010 %6s · ref %v", cur, shown(s.Name), d.counts[i-1], cg2022, cg2010, s.Ref)
		}
		if i == d.pick {
			l = st.Selected.Render(fit(l, w))
		}
		b.WriteString(l + "\n")
	}
	return b.String()
}

func (solventDialog) line() string { return "" }
func (solventDialog) help(km *KeyMap) []key.Binding {
	return []key.Binding{km.Up, km.Down, km.Accept, km.Cancel}
}
func (solventDialog) kind() string { return "solvent" }
func (solventDialog) text() bool   { return false }

// --- text boxes: the filter and the export path ---

func newInput(prompt, value string, w int) textinput.Model {
	in := textinput.New()
	// A steady cursor: no blink timer to keep alive or to wait for in tests.
	in.Cursor.SetMode(cursor.CursorStatic)
	in.Prompt = prompt
	in.SetValue(value)
	in.CursorEnd()
	in.Width = max(w-lipgloss.Width(prompt)-2, 8)
	in.Focus()
	return in
}

// filterDialog edits the focused table's filter; every change is applied at
// once. It opens on the current text, shown selected: the first character
// typed replaces it, an arrow or backspace edits it instead.
type filterDialog struct {
	in    textinput.Model
	fresh bool // the old text is still selected
	sel   lipgloss.Style
	old   string // the filter before the box opened, for esc
}

func newFilterDialog(query string, w int, st *Styles) filterDialog {
	in := newInput("/", query, w)
	in.Placeholder = "words to match in id, name, bond, source, tags"
	d := filterDialog{in: in, fresh: query != "", sel: st.Selected, old: query}
	d.in.TextStyle = d.style()
	return d
}

func (d filterDialog) style() lipgloss.Style {
	if d.fresh {
		return d.sel
	}
	return lipgloss.NewStyle()
}

func (d filterDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		var cmd tea.Cmd
		d.in, cmd = d.in.Update(msg)
		return d, cmd
	}
	switch {
	case key.Matches(k, km.Cancel):
		// esc leaves with no filter (README: Esc clears).
		return nil, emit(filterMsg{""})
	case key.Matches(k, km.Accept):
		return nil, nil
	}
	if d.fresh && (k.Type == tea.KeyRunes || k.Type == tea.KeySpace) {
		d.in.SetValue("") // typing replaces the selected old text
	}
	d.fresh = false
	d.in.TextStyle = d.style()
	before := d.in.Value()
	var cmd tea.Cmd
	d.in, cmd = d.in.Update(k)
	if d.in.Value() == before {
		return d, cmd
	}
	return d, tea.Batch(cmd, emit(filterMsg{d.in.Value()}))
}

func (filterDialog) view(w, h int, st *Styles) string { return "" }
func (d filterDialog) line() string                   { return d.in.View() }
func (filterDialog) help(km *KeyMap) []key.Binding {
	return []key.Binding{km.Accept, km.Cancel}
}
func (filterDialog) kind() string { return "filter" }
func (filterDialog) text() bool   { return true }

// pathDialog asks where to export.
type pathDialog struct{ in textinput.Model }

func (d pathDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	if k, ok := msg.(tea.KeyMsg); ok {
		switch {
		case key.Matches(k, km.Cancel):
			return nil, emit(statusMsg{"export cancelled"})
		case key.Matches(k, km.Accept):
			p := strings.TrimSpace(d.in.Value())
			if p == "" {
				return d, emit(statusMsg{"give a file name"})
			}
			return nil, emit(exportPathMsg{p})
		}
	}
	var cmd tea.Cmd
	d.in, cmd = d.in.Update(msg)
	return d, cmd
}

func (pathDialog) view(w, h int, st *Styles) string { return "" }
func (d pathDialog) line() string                   { return d.in.View() }
func (pathDialog) help(km *KeyMap) []key.Binding {
	return []key.Binding{km.Accept, km.Cancel}
}
func (pathDialog) kind() string { return "path" }
func (pathDialog) text() bool   { return true }

// --- detail panel ---

type detailDialog struct {
	vp  viewport.Model
	acc *thermo.Resolved // the acceptor described, for w (nil for none)
}

func newDetailDialog(text string, w, h int) detailDialog {
	vp := viewport.New(w, h)
	vp.SetContent(lipgloss.NewStyle().Width(w).Render(text))
	return detailDialog{vp: vp}
}

func (d detailDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	if k, ok := msg.(tea.KeyMsg); ok {
		switch {
		case key.Matches(k, km.Cancel, km.Accept):
			return nil, nil
		case key.Matches(k, km.Quit):
			return d, emit(quitAskedMsg{})
		case key.Matches(k, km.Window) && d.acc != nil:
			return nil, emit(windowAskMsg{d.acc})
		}
	}
	var cmd tea.Cmd
	d.vp, cmd = d.vp.Update(msg)
	return d, cmd
}

func (d detailDialog) view(w, h int, st *Styles) string {
	d.vp.Width, d.vp.Height = w, h
	return d.vp.View()
}

func (d detailDialog) line() string {
	w := ""
	if d.acc != nil {
		w = " · w: delivery window of the acceptor"
	}
	return fmt.Sprintf("detail %3.0f%% · ↑/↓ pgup/pgdn scroll · esc closes%s", 100*d.vp.ScrollPercent(), w)
}

func (d detailDialog) help(km *KeyMap) []key.Binding {
	if d.acc != nil {
		return []key.Binding{km.Up, km.Down, km.PageUp, km.PageDown, km.Window, km.Cancel}
	}
	return []key.Binding{km.Up, km.Down, km.PageUp, km.PageDown, km.Cancel}
}
func (detailDialog) kind() string { return "detail" }
func (detailDialog) text() bool   { return false }

// --- a number typed in: the H2 pressure, the flask's concentrations ---

// valueDialog asks for a value on the status line. Enter hands the text to
// parse, which returns the message to send (the dialog closes) or what is
// wrong with it (the dialog stays open and says so). Esc leaves it as it
// was.
type valueDialog struct {
	in      textinput.Model
	parse   func(string) (tea.Msg, error)
	problem string
	cancel  string // the status line after esc
}

func newValueDialog(prompt, value string, w int, parse func(string) (tea.Msg, error)) valueDialog {
	return valueDialog{in: newInput(prompt, value, w), parse: parse, cancel: "unchanged"}
}

func (d valueDialog) update(msg tea.Msg, km *KeyMap) (dialog, tea.Cmd) {
	if k, ok := msg.(tea.KeyMsg); ok {
		switch {
		case key.Matches(k, km.Cancel):
			return nil, emit(statusMsg{d.cancel})
		case key.Matches(k, km.Accept):
			out, err := d.parse(strings.TrimSpace(d.in.Value()))
			if err != nil {
				d.problem = err.Error()
				return d, nil
			}
			return nil, emit(out)
		}
		d.problem = ""
	}
	var cmd tea.Cmd
	d.in, cmd = d.in.Update(msg)
	return d, cmd
}

func (valueDialog) view(w, h int, st *Styles) string { return "" }
func (d valueDialog) line() string {
	if d.problem != "" {
		return "! " + d.problem + " · " + d.in.View()
	}
	return d.in.View()
}
func (valueDialog) help(km *KeyMap) []key.Binding {
	return []key.Binding{km.Accept, km.Cancel}
}
func (valueDialog) kind() string { return "value" }
func (valueDialog) text() bool   { return true }
