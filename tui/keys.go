package tui

import (
	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/thermo"
)

// KeyMap holds every key the screens answer to. Help is generated from it,
// so what the help bar says is what the keys do. README.md's key table
// lists the same keys.
type KeyMap struct {
	// Moving in a table.
	Up, Down, PageUp, PageDown, Home, End key.Binding

	// Panes.
	NextTab, PrevTab, Tab1, Tab2, Tab3, Tab4, Tab5 key.Binding

	// Table actions.
	SortCol, SortDir, Filter, ClearFilter, Mark, Export, Detail key.Binding
	// Series pane: pick the series shown first.
	NextSeries key.Binding
	// The delivery window of the acceptor under the cursor (Acceptors,
	// Pairs, Scale, a pair's detail), and its band on the Scale.
	Window, Band key.Binding
	// Write the figure of the pane shown (Scale: ladder, Pairs: map).
	Figure key.Binding

	// Conditions and what of the library is shown.
	Solvent, Class, Basis, Units key.Binding
	// The flask: the H2 pressure and the starting concentrations.
	Pressure, Flask key.Binding

	// Dialogs.
	Accept, Cancel, Yes, No key.Binding

	Help, Quit key.Binding
}

// DefaultKeyMap returns the keys of the screens.
func DefaultKeyMap() *KeyMap {
	b := func(help, desc string, keys ...string) key.Binding {
		return key.NewBinding(key.WithKeys(keys...), key.WithHelp(help, desc))
	}
	return &KeyMap{
		Up:       b("↑/k", "up", "up", "k"),
		Down:     b("↓/j", "down", "down", "j"),
		PageUp:   b("pgup", "page up", "pgup"),
		PageDown: b("pgdn", "page down", "pgdown"),
		Home:     b("home", "first row", "home"),
		End:      b("end", "last row", "end"),

		NextTab: b("tab", "next pane", "tab"),
		PrevTab: b("shift+tab", "previous pane", "shift+tab"),
		Tab1:    b("1", "Pairs", "1"),
		Tab2:    b("2", "Donors", "2"),
		Tab3:    b("3", "Acceptors", "3"),
		Tab4:    b("4", "Series", "4"),
		Tab5:    b("5", "Scale", "5"),

		SortCol:     b("s", "sort column", "s"),
		SortDir:     b("S", "reverse sort", "S"),
		Filter:      b("/", "filter", "/"),
		ClearFilter: b("esc", "clear filter", "esc"),
		Mark:        b("space", "mark pair", " "),
		Export:      b("x", "export CSV", "x"),
		Detail:      b("enter", "details", "enter"),
		NextSeries:  b("n", "next series", "n"),
		Window:      b("w", "delivery window", "w"),
		Band:        b("g", "window band", "g"),
		Figure:      b("f", "write figure", "f"),

		Solvent: b("v", "solvent (or all)", "v"),
		Class:   b("c", "bond class", "c"),
		Basis:   b("b", "C_G basis", "b"),
		Units:   b("u", "kcal/kJ", "u"),

		Pressure: b("p", "p(H2)", "p"),
		Flask:    b("e", "[D–H]0, [A]0", "e"),

		Accept: b("enter", "accept", "enter"),
		Cancel: b("esc", "close", "esc"),
		Yes:    b("y", "yes", "y"),
		No:     b("n", "no", "n"),

		Help: b("?", "help", "?"),
		Quit: b("q", "quit", "q", "ctrl+c"),
	}
}

// helpKeys adapts a set of bindings to help.KeyMap.
type helpKeys struct {
	short []key.Binding
	full  [][]key.Binding
}

func (h helpKeys) ShortHelp() []key.Binding  { return h.short }
func (h helpKeys) FullHelp() [][]key.Binding { return h.full }

// keyBurst splits a burst of typed runes (several keys read at once, as
// from key repeat or a fast typist) into single keys, except in a text box.
func (m Model) keyBurst(k tea.KeyMsg) (Model, tea.Cmd) {
	if m.dlg == nil {
		m.status = "" // a message lasts until the next key
	}
	text := m.dlg != nil && m.dlg.text()
	if k.Type != tea.KeyRunes || len(k.Runes) < 2 || k.Paste || text {
		return m.updateKey(k)
	}
	var cmds []tea.Cmd
	for _, r := range k.Runes {
		var cmd tea.Cmd
		one := tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}, Alt: k.Alt}
		if r == ' ' {
			one = tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}}
		}
		m, cmd = m.updateKey(one) // after a "/" the rest goes to the filter box
		m.updateKeys()
		cmds = append(cmds, cmd)
	}
	return m, tea.Batch(cmds...)
}

// updateKey sends a key to the open dialog, else to the panes. Ctrl+C quits
// from anywhere, even a text box (waiting for an export being written).
func (m Model) updateKey(k tea.KeyMsg) (Model, tea.Cmd) {
	if k.Type == tea.KeyCtrlC {
		return m.quit()
	}
	if m.dlg != nil {
		var cmd tea.Cmd
		m.dlg, cmd = m.dlg.update(k, &m.keys)
		return m, cmd
	}
	return m.keyBrowse(k)
}

// keyBrowse handles the keys that act whatever pane is shown.
func (m Model) keyBrowse(k tea.KeyMsg) (Model, tea.Cmd) {
	km := m.keys
	switch {
	case key.Matches(k, km.Quit):
		return m.quit()
	case key.Matches(k, km.Help):
		m.dlg = helpDialog{keys: m.helpLines()}
	case key.Matches(k, km.NextTab):
		m.tab = (m.tab + 1) % nPanes
	case key.Matches(k, km.PrevTab):
		m.tab = (m.tab + nPanes - 1) % nPanes
	case key.Matches(k, km.Tab1, km.Tab2, km.Tab3, km.Tab4, km.Tab5):
		m.tab = pane(k.Runes[0] - '1')
	case key.Matches(k, km.Basis):
		if m.cond.Cond.Basis == thermo.Basis2010 {
			m.cond.Cond.Basis = thermo.Basis2022
		} else {
			m.cond.Cond.Basis = thermo.Basis2010
		}
		return m.reevaluate()
	case key.Matches(k, km.Units):
		m.units = 1 - m.units
		m.scaleKey = scaleKey{}
	case key.Matches(k, km.Solvent):
		var cur *thermo.Solvent
		if m.t != nil {
			cur = m.t.ev.Working
		}
		m.dlg = newSolventDialog(m.solvents, solventCounts(m.lib, m.solvents, cur), cur, m.cond.Cross, m.e)
	case key.Matches(k, km.Class):
		m.class = (m.class + 1) % nClasses
		return m.reevaluate()
	case key.Matches(k, km.Pressure):
		m.dlg = m.pressureDialog()
	case key.Matches(k, km.Flask):
		m.dlg = m.flaskDialog()
	default:
		if m.t == nil {
			return m, nil
		}
		return m.keyPane(k)
	}
	return m, nil
}

// keyPane handles the keys of the pane shown. A key for one pane only goes
// here, guarded by m.tab, with its binding in KeyMap and DefaultKeyMap, its
// enabled state in updateKeys (which is what help shows), a place in
// helpKeys and a row in README.md's key table. A key that changes the
// conditions (as b does) goes in keyBrowse and ends with m.reevaluate().
func (m Model) keyPane(k tea.KeyMsg) (Model, tea.Cmd) {
	km := m.keys
	g := m.focusGrid()
	switch {
	case key.Matches(k, km.Up):
		g.move(-1)
	case key.Matches(k, km.Down):
		g.move(1)
	case key.Matches(k, km.PageUp):
		g.move(-g.height)
	case key.Matches(k, km.PageDown):
		g.move(g.height)
	case key.Matches(k, km.Home):
		g.top()
	case key.Matches(k, km.End):
		g.bottom()
	case key.Matches(k, km.SortCol):
		g.nextSort()
		return m, m.resort(m.gridPane())
	case key.Matches(k, km.SortDir):
		g.rev = !g.rev
		return m, m.resort(m.gridPane())
	case key.Matches(k, km.Filter):
		m.dlg = newFilterDialog(g.query, m.w, m.st)
	case key.Matches(k, km.ClearFilter):
		g.query = ""
		return m, m.resort(m.gridPane())
	case key.Matches(k, km.NextSeries):
		if n := len(m.t.ev.Series); n > 0 {
			m.seriesFirst = (m.seriesFirst + 1) % n
			m.seriesDonor = nil // rebuild, listing the next series first
		}
	case key.Matches(k, km.Mark):
		return m.toggleMark()
	case key.Matches(k, km.Detail):
		m.openDetail()
	case key.Matches(k, km.Export):
		return m.startExport()
	case key.Matches(k, km.Window) && (m.tab == paneAcceptors || m.tab == panePairs || m.tab == paneScale):
		return m.openWindow(m.windowAcceptor())
	case key.Matches(k, km.Band) && m.tab == paneScale:
		m.band = !m.band
	case key.Matches(k, km.Figure) && (m.tab == paneScale || m.tab == panePairs):
		return m.startFigure()
	}
	// The Series pane follows whichever cursor moved last: Donors, or Pairs.
	switch m.tab {
	case paneDonors:
		m.selDonor = m.grids[paneDonors].row()
	case panePairs, paneScale:
		m.selDonor = -1
	}
	return m, nil
}

// gridPane is the grid the keys act on: Scale moves through Pairs.
func (m Model) gridPane() pane {
	if m.tab == paneScale {
		return panePairs
	}
	return m.tab
}

func (m *Model) focusGrid() *grid { return &m.grids[m.gridPane()] }

// updateKeys enables the bindings that apply now, so help shows exactly the
// keys that work.
func (m *Model) updateKeys() {
	km := &m.keys
	kind := ""
	if m.dlg != nil {
		kind = m.dlg.kind()
	}
	browse := m.dlg == nil
	data := browse && m.t != nil
	table := data && m.tab != paneScale
	for _, b := range []*key.Binding{&km.NextTab, &km.PrevTab, &km.Tab1, &km.Tab2, &km.Tab3, &km.Tab4, &km.Tab5,
		&km.Solvent, &km.Class, &km.Basis, &km.Units, &km.Pressure, &km.Flask, &km.Help} {
		b.SetEnabled(browse)
	}
	for _, b := range []*key.Binding{&km.Up, &km.Down, &km.PageUp, &km.PageDown, &km.Home, &km.End} {
		b.SetEnabled(data || kind == "solvent" || kind == "detail")
	}
	km.Detail.SetEnabled(data)
	for _, b := range []*key.Binding{&km.SortCol, &km.SortDir, &km.Filter} {
		b.SetEnabled(table)
	}
	km.ClearFilter.SetEnabled(data && m.focusGrid().query != "")
	km.Mark.SetEnabled(data && (m.tab == panePairs || m.tab == paneSeries || m.tab == paneScale))
	km.Export.SetEnabled(data)
	km.NextSeries.SetEnabled(data && m.tab == paneSeries)
	km.Window.SetEnabled((data && (m.tab == paneAcceptors || m.tab == panePairs || m.tab == paneScale)) || kind == "detail")
	km.Band.SetEnabled(data && m.tab == paneScale)
	km.Figure.SetEnabled(data && (m.tab == paneScale || m.tab == panePairs))
	km.Quit.SetEnabled(m.dlg == nil || !m.dlg.text())
	km.Accept.SetEnabled(!browse)
	km.Cancel.SetEnabled(!browse)
	km.Help.SetEnabled(browse || kind == "help")
	km.Yes.SetEnabled(kind == "confirm")
	km.No.SetEnabled(kind == "confirm")
}

// helpKeys returns the bindings of the focused context.
func (m Model) helpKeys() helpKeys {
	km := m.keys
	if m.dlg != nil {
		return helpKeys{short: m.dlg.help(&km)}
	}
	short := []key.Binding{km.Up, km.Down, km.SortCol, km.SortDir, km.Filter, km.ClearFilter, km.Mark, km.Detail,
		km.NextSeries, km.Window, km.Band, km.Export, km.Figure, km.NextTab, km.Help, km.Quit}
	full := [][]key.Binding{
		{km.Up, km.Down, km.PageUp, km.PageDown, km.Home, km.End},
		{km.SortCol, km.SortDir, km.Filter, km.ClearFilter, km.Mark, km.Detail, km.Export, km.Figure, km.NextSeries, km.Window, km.Band},
		{km.NextTab, km.PrevTab, km.Tab1, km.Tab2, km.Tab3, km.Tab4, km.Tab5},
		{km.Solvent, km.Class, km.Basis, km.Units, km.Pressure, km.Flask, km.Help, km.Quit},
	}
	return helpKeys{short: short, full: full}
}
