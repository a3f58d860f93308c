// Package tui is the interactive screens of hatsieve: Pairs, Donors,
// Acceptors, Series and Scale over an evaluated library. Views only format
// what thermo computed; evaluation, sorting, filtering and all file access
// run in commands, and every asynchronous result carries a sequence number
// so that a stale one is dropped.
package tui

import (
	"fmt"
	"os"
	"strings"

	"github.com/charmbracelet/bubbles/cursor"
	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/textinput"
	"github.com/charmbracelet/bubbles/viewport"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// Options configure the screens.
type Options struct {
	Eval  data.Options // solvent, basis, temperature, C_G override
	Units thermo.Units
	// StateDir holds the shortlists and the caution flag; empty means the
	// user's state folder (XDG_STATE_HOME/hatsieve, ~/.local/state/hatsieve).
	StateDir string
	// MaxPairs caps the Pairs table (0 for DefaultMaxPairs).
	MaxPairs int
	// NoCaution skips the first-start caution (tests).
	NoCaution bool
	// Renderer decides colours; nil for the default (stdout). NO_COLOR is
	// honoured by Run.
	Renderer *lipgloss.Renderer
}

// Run opens the screens on lib and returns when the user quits.
func Run(lib *data.Library, o Options) error {
	if o.Renderer == nil {
		o.Renderer = lipgloss.DefaultRenderer()
	}
	if os.Getenv("NO_COLOR") != "" {
		o.Renderer.SetColorProfile(termenv.Ascii)
		lipgloss.SetColorProfile(termenv.Ascii)
	}
	_, err := tea.NewProgram(New(lib, o), tea.WithAltScreen()).Run()
	return err
}

type pane int

const (
	panePairs pane = iota
	paneDonors
	paneAcceptors
	paneSeries
	paneScale
	nPanes
)

var paneNames = [nPanes]string{"Pairs", "Donors", "Acceptors", "Series", "Scale"}

// mode is what has the keyboard.
type mode int

const (
	modeBrowse mode = iota
	modeFilter
	modeDetail
	modeSolvent
	modeExportPath
	modeExportConfirm
	modeHelp
	modeCaution
)

// Model is the root model of the screens.
type Model struct {
	lib   *data.Library
	opts  Options
	keys  KeyMap // a value: each model copy has its own enabled states
	st    *Styles
	help  help.Model
	w, h  int
	ready bool

	cond    data.Options
	okCond  data.Options // conditions of the tables shown
	units   thermo.Units
	t       *tables
	evalSeq uint64
	loading bool
	status  string
	errMsg  string

	tab   pane
	grids [4]grid // Pairs, Donors, Acceptors, Series
	seq   uint64  // last reorder job number

	series      []seriesRow
	seriesDonor *thermo.Resolved // the donor series rows were built for
	selDonor    int32            // index into ev.Donors, -1 for none
	seriesFirst int              // series listed first

	marks      map[markKey]struct{}
	state      *stateStore
	marksPath  string // the shortlist file, once known
	saveSeq    uint64
	cautionOK  bool
	stateReady bool
	unsaved    bool // marks changed before the state was read

	mode      mode
	filter    textinput.Model
	path      textinput.Model
	exporting exportJob
	pick      int // solvent picker cursor
	solvents  []*thermo.Solvent
	detail    viewport.Model

	scale    string
	scaleKey scaleKey
}

// New builds the model; Init starts the evaluation.
func New(lib *data.Library, o Options) Model {
	if o.Renderer == nil {
		o.Renderer = lipgloss.DefaultRenderer()
	}
	m := Model{
		lib: lib, opts: o, keys: *DefaultKeyMap(), st: DefaultStyles(o.Renderer),
		help: help.New(), cond: o.Eval, units: o.Units, selDonor: -1,
		marks: map[markKey]struct{}{}, state: &stateStore{dir: o.StateDir},
	}
	m.grids[panePairs] = newGrid(pairCols, 2, false)
	m.grids[paneDonors] = newGrid(entryCols, 1, false)
	m.grids[paneAcceptors] = newGrid(entryCols, 1, true)
	m.grids[paneSeries] = newGrid(seriesCols, 0, false)
	m.filter = textinput.New()
	// A steady cursor: no blink timer to keep alive or to wait for in tests.
	m.filter.Cursor.SetMode(cursor.CursorStatic)
	m.filter.Prompt = "/"
	m.filter.Placeholder = "words to match in id, name, bond, source, tags"
	m.path = textinput.New()
	m.path.Cursor.SetMode(cursor.CursorStatic)
	m.path.Prompt = "save marked pairs to: "
	m.solvents = lib.Solvents.All()
	if !o.NoCaution {
		m.mode = modeCaution
	}
	m.loading = true
	m.evalSeq = 1
	m.updateKeys()
	return m
}

// Init evaluates the library and reads the saved shortlist.
func (m Model) Init() tea.Cmd {
	return tea.Batch(m.evalCmd(), loadStateCmd(m.state, m.lib, m.opts.NoCaution))
}

// evalCmd re-evaluates the library under m.cond and lays out the tables,
// with every grid's order computed from its current sort and filter.
func (m Model) evalCmd() tea.Cmd {
	lib, cond, seq, maxp := m.lib, m.cond, m.evalSeq, m.opts.MaxPairs
	specs := [3]gridSpec{m.grids[0].spec(), m.grids[1].spec(), m.grids[2].spec()}
	marks := m.markSnapshot()
	return func() tea.Msg {
		ev, err := data.Evaluate(lib, cond)
		if err != nil {
			return loadedMsg{seq: seq, err: err}
		}
		t := buildTables(ev, maxp)
		msg := loadedMsg{seq: seq, t: t}
		for p := range 3 {
			msg.perms[p], _ = order(jobFor(t, pane(p), specs[p], marks, nil))
		}
		return msg
	}
}

type loadedMsg struct {
	seq   uint64
	t     *tables
	perms [3][]int32
	err   error
}

// Update routes a message: sizes, then results of commands, then keys by
// mode. Derived views (series rows, the scale) are refreshed at the end.
func (m Model) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	var cmd tea.Cmd
	switch msg := msg.(type) {
	case tea.WindowSizeMsg:
		m.resize(msg.Width, msg.Height)
	case tea.KeyMsg:
		m, cmd = m.keyBurst(msg)
	case loadedMsg:
		m = m.loaded(msg)
	case reorderMsg:
		m = m.reordered(msg)
	default:
		m, cmd = m.updateIO(msg)
	}
	m, c := m.sync()
	m.updateKeys()
	return m, tea.Batch(cmd, c)
}

func (m Model) loaded(msg loadedMsg) Model {
	if msg.seq != m.evalSeq {
		return m // a newer evaluation is under way
	}
	m.loading = false
	if msg.err != nil {
		m.errMsg = msg.err.Error()
		if m.t != nil {
			// Keep the last good evaluation and its conditions.
			m.cond = m.okCond
		}
		return m
	}
	m.errMsg = ""
	m.t = msg.t
	m.okCond = m.cond
	for p := range 3 {
		m.grids[p].setPerm(msg.perms[p], 0)
		m.grids[p].pending = false
		// A sort issued over the old tables must not land on the new ones.
		m.seq++
		m.grids[p].seq = m.seq
	}
	m.seriesDonor = nil
	m.scaleKey = scaleKey{}
	m.selDonor = -1
	if m.mode == modeDetail {
		m.mode = modeBrowse
	}
	return m
}

func (m Model) reordered(msg reorderMsg) Model {
	g := &m.grids[msg.pane]
	if msg.seq != g.seq {
		return m // stale: a later sort or filter was asked for
	}
	g.pending = false
	g.setPerm(msg.perm, msg.at)
	return m
}

// resize lays out the screen: two top lines, the tabs, the body, a status
// line and the help bar.
func (m *Model) resize(w, h int) {
	m.w, m.h, m.ready = w, h, true
	m.help.Width = w
	bh := m.bodyHeight()
	for i := range m.grids {
		m.grids[i].setSize(w, bh-1)
	}
	m.grids[paneSeries].setSize(w, bh-3) // a donor line above, a summary below
	m.filter.Width = max(w-4, 10)
	m.path.Width = max(w-len(m.path.Prompt)-6, 10)
	m.detail.Width, m.detail.Height = w, bh
	m.scaleKey = scaleKey{}
}

func (m Model) bodyHeight() int { return max(m.h-5, 3) }

// sync refreshes what depends on the selection, only for the pane shown,
// so that a cursor move in Pairs stays constant work.
func (m Model) sync() (Model, tea.Cmd) {
	if m.t == nil {
		return m, nil
	}
	switch m.tab {
	case paneSeries:
		d := m.selectedDonor()
		if d != m.seriesDonor {
			m.seriesDonor = d
			m.series = buildSeries(m.t.ev, d, m.seriesFirst)
			// Until the sorted order comes back, show the rows as built, so
			// the grid never points past the new rows.
			perm := make([]int32, len(m.series))
			for i := range perm {
				perm[i] = int32(i)
			}
			m.grids[paneSeries].setPerm(perm, 0)
			return m, m.reorder(paneSeries, -1)
		}
	case paneScale:
		k := m.currentScaleKey()
		if k != m.scaleKey {
			m.scaleKey = k
			m.scale = renderScale(m.t, m.selectedPair(), m.w, m.bodyHeight(), m.units, m.st)
		}
	}
	return m, nil
}

// selectedPair is the pair under the Pairs cursor (nil if none).
func (m Model) selectedPair() *thermo.Pair {
	if m.t == nil {
		return nil
	}
	r := m.grids[panePairs].row()
	if r < 0 {
		return nil
	}
	return &m.t.pairs[r]
}

// selectedDonor is the donor last chosen in Donors, else the donor of the
// selected pair, else the first donor.
func (m Model) selectedDonor() *thermo.Resolved {
	if m.t == nil || len(m.t.ev.Donors) == 0 {
		return nil
	}
	if m.selDonor >= 0 {
		return m.t.ev.Donors[m.selDonor]
	}
	if p := m.selectedPair(); p != nil {
		return p.Donor
	}
	return m.t.ev.Donors[0]
}

// reorder issues a sort/filter job for pane p; anchor is the data row to
// keep under the cursor (-1 for the current one).
func (m *Model) reorder(p pane, anchor int32) tea.Cmd {
	if m.t == nil {
		return nil
	}
	g := &m.grids[p]
	if anchor < 0 {
		anchor = g.row()
	}
	m.seq++
	g.seq, g.pending = m.seq, true
	j := jobFor(m.t, p, g.spec(), m.markSnapshot(), m.series)
	j.anchor = anchor
	return reorderCmd(p, m.seq, j)
}

// --- keys ---

// keyBurst splits a burst of typed runes (several keys read at once, as
// from key repeat or a fast typist) into single keys, except in a text box.
func (m Model) keyBurst(k tea.KeyMsg) (Model, tea.Cmd) {
	if m.mode == modeBrowse {
		m.status = "" // a message lasts until the next key
	}
	text := m.mode == modeFilter || m.mode == modeExportPath
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
		cmds = append(cmds, cmd)
	}
	return m, tea.Batch(cmds...)
}

func (m Model) updateKey(k tea.KeyMsg) (Model, tea.Cmd) {
	if k.Type == tea.KeyCtrlC {
		return m, tea.Quit // from anywhere, even a text box
	}
	switch m.mode {
	case modeFilter:
		return m.keyFilter(k)
	case modeDetail:
		return m.keyDetail(k)
	case modeSolvent:
		return m.keySolvent(k)
	case modeExportPath:
		return m.keyExportPath(k)
	case modeExportConfirm:
		return m.keyExportConfirm(k)
	case modeHelp:
		if key.Matches(k, m.keys.Quit) {
			return m, tea.Quit
		}
		if key.Matches(k, m.keys.Help, m.keys.Cancel) {
			m.mode = modeBrowse
		}
		return m, nil
	case modeCaution:
		if key.Matches(k, m.keys.Quit) {
			return m, tea.Quit
		}
		if key.Matches(k, m.keys.Accept, m.keys.Cancel, m.keys.Mark) {
			m.mode = modeBrowse
			if !m.cautionOK {
				m.cautionOK = true
				return m, cautionSeenCmd(m.state)
			}
		}
		return m, nil
	}
	return m.keyBrowse(k)
}

func (m Model) keyBrowse(k tea.KeyMsg) (Model, tea.Cmd) {
	km := m.keys
	switch {
	case key.Matches(k, km.Quit):
		return m, tea.Quit
	case key.Matches(k, km.Help):
		m.mode = modeHelp
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
		m.mode, m.pick = modeSolvent, 0
		for i, s := range m.solvents {
			if m.t != nil && s == m.t.ev.Working {
				m.pick = i
			}
		}
	default:
		if m.t == nil {
			return m, nil
		}
		return m.keyPane(k)
	}
	return m, nil
}

// keyPane handles the keys of the pane shown.
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
		return m, m.reorder(m.gridPane(), -1)
	case key.Matches(k, km.SortDir):
		g.desc = !g.desc
		return m, m.reorder(m.gridPane(), -1)
	case key.Matches(k, km.Filter):
		m.mode = modeFilter
		m.filter.SetValue(g.query)
		m.filter.CursorEnd()
		return m, m.filter.Focus()
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

func (m Model) keyFilter(k tea.KeyMsg) (Model, tea.Cmd) {
	switch {
	case key.Matches(k, m.keys.Cancel):
		m.mode = modeBrowse
		m.filter.Blur()
		m.filter.SetValue("")
	case key.Matches(k, m.keys.Accept):
		m.mode = modeBrowse
		m.filter.Blur()
		return m, nil
	default:
		var cmd tea.Cmd
		m.filter, cmd = m.filter.Update(k)
		if m.filter.Value() == m.focusGrid().query {
			return m, cmd
		}
		m.focusGrid().query = m.filter.Value()
		return m, tea.Batch(cmd, m.reorder(m.gridPane(), -1))
	}
	if m.focusGrid().query == "" {
		return m, nil
	}
	m.focusGrid().query = ""
	return m, m.reorder(m.gridPane(), -1)
}

func (m Model) keySolvent(k tea.KeyMsg) (Model, tea.Cmd) {
	switch {
	case key.Matches(k, m.keys.Cancel):
		m.mode = modeBrowse
	case key.Matches(k, m.keys.Up):
		m.pick = max(m.pick-1, 0)
	case key.Matches(k, m.keys.Down):
		m.pick = min(m.pick+1, len(m.solvents)-1)
	case key.Matches(k, m.keys.Accept):
		m.mode = modeBrowse
		if m.pick >= 0 && m.pick < len(m.solvents) {
			s := m.solvents[m.pick]
			m.cond.Solvent = s.Key
			if m.cond.Cond.CG != nil && m.t != nil && s != m.t.ev.Working {
				// An explicit C_G was for the old working solvent.
				m.cond.Cond.CG = nil
			}
			return m.reevaluate()
		}
	}
	return m, nil
}

func (m Model) reevaluate() (Model, tea.Cmd) {
	m.evalSeq++
	m.loading = true
	m.errMsg = ""
	return m, m.evalCmd()
}

// updateKeys enables the bindings that apply now, so help shows exactly the
// keys that work.
func (m *Model) updateKeys() {
	km := &m.keys
	browse := m.mode == modeBrowse
	data := browse && m.t != nil
	table := data && m.tab != paneScale
	for _, b := range []*key.Binding{&km.NextTab, &km.PrevTab, &km.Tab1, &km.Tab2, &km.Tab3, &km.Tab4, &km.Tab5,
		&km.Solvent, &km.Basis, &km.Units, &km.Help} {
		b.SetEnabled(browse)
	}
	for _, b := range []*key.Binding{&km.Up, &km.Down, &km.PageUp, &km.PageDown, &km.Home, &km.End, &km.Detail} {
		b.SetEnabled(data || m.mode == modeSolvent || m.mode == modeDetail)
	}
	km.Detail.SetEnabled(data)
	for _, b := range []*key.Binding{&km.SortCol, &km.SortDir, &km.Filter} {
		b.SetEnabled(table)
	}
	km.Mark.SetEnabled(data && (m.tab == panePairs || m.tab == paneSeries || m.tab == paneScale))
	km.Export.SetEnabled(data)
	km.NextSeries.SetEnabled(data && m.tab == paneSeries)
	km.Quit.SetEnabled(m.mode != modeFilter && m.mode != modeExportPath)
	km.Accept.SetEnabled(m.mode != modeBrowse)
	km.Cancel.SetEnabled(m.mode != modeBrowse)
	km.Help.SetEnabled(browse || m.mode == modeHelp)
	km.Yes.SetEnabled(m.mode == modeExportConfirm)
	km.No.SetEnabled(m.mode == modeExportConfirm)
}

// helpKeys returns the bindings of the focused context.
func (m Model) helpKeys() helpKeys {
	km := m.keys
	switch m.mode {
	case modeFilter:
		return helpKeys{short: []key.Binding{km.Accept, km.Cancel}}
	case modeDetail:
		return helpKeys{short: []key.Binding{km.Up, km.Down, km.PageUp, km.PageDown, km.Cancel}}
	case modeSolvent:
		return helpKeys{short: []key.Binding{km.Up, km.Down, km.Accept, km.Cancel}}
	case modeExportPath:
		return helpKeys{short: []key.Binding{km.Accept, km.Cancel}}
	case modeExportConfirm:
		return helpKeys{short: []key.Binding{km.Yes, km.No, km.Cancel}}
	case modeHelp, modeCaution:
		return helpKeys{short: []key.Binding{km.Cancel}}
	}
	short := []key.Binding{km.Up, km.Down, km.SortCol, km.SortDir, km.Filter, km.Mark, km.Detail, km.NextSeries,
		km.Export, km.NextTab, km.Help, km.Quit}
	full := [][]key.Binding{
		{km.Up, km.Down, km.PageUp, km.PageDown, km.Home, km.End},
		{km.SortCol, km.SortDir, km.Filter, km.Mark, km.Detail, km.Export, km.NextSeries},
		{km.NextTab, km.PrevTab, km.Tab1, km.Tab2, km.Tab3, km.Tab4, km.Tab5},
		{km.Solvent, km.Basis, km.Units, km.Help, km.Quit},
	}
	return helpKeys{short: short, full: full}
}

// --- view ---

// View draws the screen: never wider than the terminal, exactly its height,
// and nothing in it a terminal would act on but line breaks and colours.
func (m Model) View() string {
	if !m.ready {
		return ""
	}
	var b strings.Builder
	top1, top2 := m.topLines()
	b.WriteString(fitStyled(top1, m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(top2, m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.tabsLine(), m.w))
	b.WriteByte('\n')
	b.WriteString(m.bodyView())
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.statusLine(), m.w))
	b.WriteByte('\n')
	b.WriteString(fitStyled(m.help.View(m.helpKeys()), m.w))
	return screenSafe(b.String())
}

func (m Model) topLines() (string, string) {
	st := m.st
	titles := shown(strings.Join(m.lib.Titles, " + "))
	if titles == "" {
		titles = "(untitled library)"
	}
	if m.t == nil {
		if m.errMsg != "" {
			return st.Top.Render("hatsieve · " + titles), st.Error.Render("cannot evaluate: " + shown(m.errMsg))
		}
		return st.Top.Render("hatsieve · " + titles), st.TopDim.Render("evaluating…")
	}
	ev := m.t.ev
	counts := fmt.Sprintf("%d donors × %d acceptors = %d pairs", len(ev.Donors), len(ev.Acceptors), m.t.total)
	if m.t.capped {
		counts += fmt.Sprintf(" (showing best %d by ΔG°)", len(m.t.pairs))
	}
	counts += fmt.Sprintf(" · %d marked", len(m.marks))
	if len(ev.Problems) > 0 {
		counts += fmt.Sprintf(" · %d not evaluated", len(ev.Problems))
	}
	// Counts first: a long title is what gets cut.
	l1 := st.Top.Render("hatsieve") + st.TopDim.Render(" · "+counts+" · ") + st.Top.Render(titles)
	cg, _ := ev.Cond.CGOf(ev.Working)
	l2 := fmt.Sprintf("%s · C_G %s basis %s · %.2f K · %s · H2 line %s",
		shown(ev.Working.Name), ev.Cond.Basis, m.e(cg.V), ev.Cond.T(), m.units.Label(), m.e(ev.H2Line.V))
	if ev.Cond.CG != nil {
		l2 += " (C_G given)"
	}
	return l1, st.TopDim.Render(l2)
}

func (m Model) tabsLine() string {
	var parts []string
	for i, n := range paneNames {
		s := fmt.Sprintf("%d %s", i+1, n)
		if pane(i) == m.tab {
			parts = append(parts, m.st.TabActive.Render("["+s+"]"))
		} else {
			parts = append(parts, m.st.TabIdle.Render(" "+s+" "))
		}
	}
	return strings.Join(parts, " ")
}

func (m Model) statusLine() string {
	switch {
	case m.mode == modeFilter:
		return m.filter.View()
	case m.mode == modeExportPath:
		return m.path.View()
	case m.errMsg != "" && m.t != nil:
		return m.st.Error.Render("! " + shown(m.errMsg))
	case m.loading && m.t != nil:
		return m.st.Status.Render("re-evaluating…")
	case m.mode == modeDetail:
		return m.st.Status.Render(fmt.Sprintf("detail %3.0f%% · ↑/↓ pgup/pgdn scroll · esc closes", 100*m.detail.ScrollPercent()))
	}
	var parts []string
	if m.t != nil && m.tab != paneScale {
		g := m.grids[m.tab]
		c := g.cols[g.sortCol]
		dir := "ascending"
		if g.desc {
			dir = "descending"
		}
		parts = append(parts, fmt.Sprintf("%d/%d rows · sort %s %s", min(g.cursor+1, g.len()), g.len(), strings.TrimSpace(c.title), dir))
		if g.query != "" {
			parts = append(parts, fmt.Sprintf("filter %q", g.query))
		}
		if g.pending {
			parts = append(parts, "sorting…")
		}
		if m.tab == paneDonors || m.tab == paneAcceptors {
			parts = append(parts, "σ with a: an assumed default went in")
		}
	}
	if m.status != "" {
		parts = append(parts, shown(m.status))
	}
	return m.st.Status.Render(strings.Join(parts, " · "))
}

// bodyView is exactly bodyHeight lines of at most m.w cells.
func (m Model) bodyView() string {
	h := m.bodyHeight()
	var s string
	switch {
	case m.mode == modeCaution:
		s = m.dialog("Before you start", cautionText+"\n\nPress enter to continue. (Also under ? help.)")
	case m.mode == modeHelp:
		s = m.helpView()
	case m.mode == modeSolvent:
		s = m.solventView()
	case m.mode == modeExportConfirm:
		s = m.dialog("File exists", fmt.Sprintf("%s already exists.\nOverwrite it with %d pairs? y / n", shown(m.exporting.path), m.exporting.count()))
	case m.mode == modeDetail:
		s = m.detail.View()
	case m.t == nil:
		s = m.st.Dim.Render("evaluating the library…")
	default:
		s = m.paneView()
	}
	return block(s, m.w, h)
}

// block pads or cuts s to exactly h lines of at most w cells each.
func block(s string, w, h int) string {
	lines := strings.Split(s, "\n")
	if len(lines) > h {
		lines = lines[:h]
	}
	for i, l := range lines {
		if lipgloss.Width(l) > w {
			lines[i] = fitStyled(l, w)
		}
	}
	for len(lines) < h {
		lines = append(lines, "")
	}
	return strings.Join(lines, "\n")
}

func (m Model) paneView() string {
	switch m.tab {
	case panePairs:
		return m.grids[panePairs].view(m.st, m.pairCell, nil, m.emptyText("pairs"))
	case paneDonors:
		return m.grids[paneDonors].view(m.st, m.entryCell(m.t.donors), nil, m.emptyText("donors"))
	case paneAcceptors:
		return m.grids[paneAcceptors].view(m.st, m.entryCell(m.t.acceptors), nil, m.emptyText("acceptors"))
	case paneSeries:
		return m.seriesView()
	}
	return m.scale
}

func (m Model) emptyText(what string) string {
	if g := m.grids[m.tab]; g.query != "" {
		return fmt.Sprintf("no %s match %q (/ then esc clears the filter)", what, g.query)
	}
	if g := m.grids[m.tab]; g.pending {
		return "sorting…"
	}
	return "no " + what + " in this solvent"
}

func (m Model) dialog(title, body string) string {
	w := min(m.w-2, 76)
	inner := m.st.Accent.Render(title) + "\n\n" + lipgloss.NewStyle().Width(w-4).Render(body)
	return m.st.Dialog.Width(w - 2).Render(inner)
}

func (m Model) helpView() string {
	var b strings.Builder
	browse := m
	browse.mode = modeBrowse
	browse.updateKeys()
	for _, col := range browse.helpKeys().full {
		for _, k := range col {
			if !k.Enabled() && k.Help().Key != "enter" {
				continue
			}
			h := k.Help()
			fmt.Fprintf(&b, "%-10s %s\n", h.Key, h.Desc)
		}
	}
	keys := b.String()
	km := m.keys
	extra := fmt.Sprintf("%-10s %s\n%-10s %s\n", km.Cancel.Help().Key, "close dialog or detail",
		"ctrl+c", "quit from anywhere")
	text := twoColumns(keys+extra, m.w) + "\n" + "Caution: " + cautionText
	return lipgloss.NewStyle().Width(m.w).Render(text)
}

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

func (m Model) solventView() string {
	var b strings.Builder
	b.WriteString(m.st.Accent.Render("Working solvent") + " (enter picks, esc cancels)\n")
	h := m.bodyHeight() - 2
	start := max(0, m.pick-h+1)
	for i := start; i < len(m.solvents) && i < start+h; i++ {
		s := m.solvents[i]
		cur := "  "
		if i == m.pick {
			cur = "> "
		}
		cg2022, cg2010 := "-", "-"
		if s.CG2022 != nil {
			cg2022 = m.e(s.CG2022.V)
		}
		if s.CG2010 != nil {
			cg2010 = m.e(s.CG2010.V)
		}
		l := fmt.Sprintf("%s%-16s C_G 2022 %6s · 2010 %6s · ref %v", cur, shown(s.Name), cg2022, cg2010, s.Ref)
		if i == m.pick {
			l = m.st.Selected.Render(fit(l, m.w))
		}
		b.WriteString(l + "\n")
	}
	return b.String()
}

// e formats an energy in kcal/mol in the chosen units.
func (m Model) e(kcal float64) string { return fmt.Sprintf("%.1f", m.units.From(kcal)) }

const cautionText = "Screening is not a safety assessment. H2 evolution pressurises closed vessels " +
	"and forms flammable mixtures with air; strong reductants and hydrides can be pyrophoric. " +
	"Local codes, your institution's chemical hygiene plan and licensed practice govern every experiment."
