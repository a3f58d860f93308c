package tui

import "github.com/charmbracelet/bubbles/key"

// KeyMap holds every key the screens answer to. Help is generated from it,
// so what the help bar says is what the keys do.
type KeyMap struct {
	// Moving in a table.
	Up, Down, PageUp, PageDown, Home, End key.Binding

	// Panes.
	NextTab, PrevTab, Tab1, Tab2, Tab3, Tab4, Tab5 key.Binding

	// Table actions.
	SortCol, SortDir, Filter, Mark, Export, Detail key.Binding
	// Series pane: pick the series shown first.
	NextSeries key.Binding

	// Conditions.
	Solvent, Basis, Units key.Binding

	// Dialogs.
	Accept, Cancel, Yes, No key.Binding

	Help, Quit key.Binding
}

// DefaultKeyMap returns the keys of DESIGN §5.
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

		SortCol:    b("s", "sort column", "s"),
		SortDir:    b("S", "reverse sort", "S"),
		Filter:     b("/", "filter", "/"),
		Mark:       b("space", "mark pair", " "),
		Export:     b("x", "export CSV", "x"),
		Detail:     b("enter", "details", "enter"),
		NextSeries: b("n", "next series", "n"),

		Solvent: b("v", "solvent", "v"),
		Basis:   b("b", "C_G basis", "b"),
		Units:   b("u", "kcal/kJ", "u"),

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
