// Package tui is the interactive screens of hatsieve: Pairs, Donors,
// Acceptors, Series and Scale over an evaluated library. Views only format
// what thermo computed; evaluation, sorting, filtering and all file access
// run in commands, and every asynchronous result carries a sequence number
// so that a stale one is dropped.
//
// The app model (this file) holds the panes and at most one dialog
// (dialogs.go); keys go to the open dialog, else to the panes (keys.go).
// The drawing is in view.go.
package tui

import (
	"os"

	"github.com/charmbracelet/bubbles/help"
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
	// Flask holds the starting concentrations of the conversion and rate
	// estimates (zero fields: thermo's defaults).
	Flask thermo.Flask
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
	class   bondClass    // the bond class shown
	flask   thermo.Flask // [D–H]0 and [A]0 of the conversion and rate estimates
	units   thermo.Units
	t       *tables
	evalSeq uint64
	loading bool
	status  string
	errMsg  string

	tab    pane
	grids  [4]grid // Pairs, Donors, Acceptors, Series
	seq    uint64  // last reorder job number
	labels labelCache

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

	dlg       dialog    // the open dialog, nil for none
	exporting exportJob // the export being asked about
	writing   []string  // paths of exports being written
	quitting  bool      // quit once the writes are done
	askRows   int       // exports longer than this are asked about
	solvents  []*thermo.Solvent

	scale    string
	scaleKey scaleKey
	figuring figureJob // the figure being asked about
	figPaths [2]string // the last ladder and map paths
	band     bool      // the Scale pane shows the selected acceptor's delivery window
	winSeq   uint64    // last delivery window asked for
}

// New builds the model; Init starts the evaluation.
func New(lib *data.Library, o Options) Model {
	if o.Renderer == nil {
		o.Renderer = lipgloss.DefaultRenderer()
	}
	m := Model{
		lib: lib, opts: o, keys: *DefaultKeyMap(), st: DefaultStyles(o.Renderer),
		help: help.New(), cond: o.Eval, flask: o.Flask, units: o.Units, selDonor: -1,
		marks: map[markKey]struct{}{}, state: &stateStore{dir: o.StateDir}, askRows: exportAskRows,
	}
	m.grids[panePairs] = newGrid(pairCols, pairDG)
	m.grids[paneDonors] = newGrid(entryColumns(false), 1)
	m.grids[paneAcceptors] = newGrid(entryColumns(true), 1)
	m.grids[paneSeries] = newGrid(seriesCols, 0)
	m.solvents = lib.Solvents.All()
	if !o.NoCaution {
		m.dlg = cautionDialog{}
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
	lib, cond, seq := m.lib, m.cond, m.evalSeq
	specs := [3]gridSpec{m.grids[0].spec(), m.grids[1].spec(), m.grids[2].spec()}
	ts := tableSpec{maxPairs: m.opts.MaxPairs, class: m.class, metric: thermo.ByDG, flask: m.flask}
	if met, ok := pairMetric(specs[0].sortCol); ok {
		ts.metric, ts.reverse, ts.worst = met, specs[0].desc != met.NaturalDescending(), m.grids[panePairs].rev
	}
	marks := m.markSnapshot()
	return func() tea.Msg {
		ev, err := data.Evaluate(lib, cond)
		if err != nil {
			return loadedMsg{seq: seq, err: err}
		}
		t := layTables(ev, ts)
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

// Update routes a message: sizes, then results of commands, then keys to
// the open dialog or the panes. Derived views (labels, series rows, the
// scale) are refreshed at the end.
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
	case rankedMsg:
		m = m.ranked(msg)
	default:
		m, cmd = m.updateMsg(msg)
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
			m.class = m.t.class
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
	if m.dlg != nil && m.dlg.kind() == "detail" {
		m.dlg = nil // it described the old tables
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

// ranked installs the Pairs window ranked afresh by a new key.
func (m Model) ranked(msg rankedMsg) Model {
	g := &m.grids[panePairs]
	if msg.seq != g.seq || m.t == nil || msg.t.ev != m.t.ev {
		return m
	}
	m.t = msg.t
	g.pending = false
	g.setPerm(msg.perm, 0)
	m.scaleKey = scaleKey{}
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
	m.scaleKey = scaleKey{}
}

func (m Model) bodyHeight() int { return max(m.h-5, 3) }

// sync refreshes what depends on the selection, only for the pane shown,
// so that a cursor move in Pairs stays constant work.
func (m Model) sync() (Model, tea.Cmd) {
	if m.t == nil {
		return m, nil
	}
	m.labels.refresh(m.t, m.tab, &m.grids)
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
			m.labels.series(m.t, m.series, m.grids[paneSeries].widths[seriesAcc])
			return m, m.reorder(paneSeries, -1)
		}
		m.labels.series(m.t, m.series, m.grids[paneSeries].widths[seriesAcc])
	case paneScale:
		k := m.currentScaleKey()
		if k != m.scaleKey {
			m.scaleKey = k
			m.scale = renderScale(m.t, m.selectedPair(), m.band, m.w, m.bodyHeight(), m.units, m.st)
		}
	}
	return m, nil
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

// resort applies a new sort of pane p. When the Pairs table holds only the
// best of a larger library and the new key is one thermo ranks by, the
// whole library is ranked afresh by it (off the UI goroutine); otherwise
// the rows held are re-ordered, and the status line says which.
func (m *Model) resort(p pane) tea.Cmd {
	g := &m.grids[p]
	if p != panePairs || m.t == nil || m.t.holds(g) {
		return m.reorder(p, -1)
	}
	met, _ := pairMetric(g.sortCol)
	m.seq++
	g.seq, g.pending = m.seq, true
	t, spec, marks, seq, maxp := m.t, g.spec(), m.markSnapshot(), m.seq, m.opts.MaxPairs
	rev, worst := spec.desc != met.NaturalDescending(), g.rev
	return func() tea.Msg {
		nt := t.reranked(met, rev, maxp)
		nt.rankWorst = worst
		perm, _ := order(jobFor(nt, panePairs, spec, marks, nil))
		return rankedMsg{seq: seq, t: nt, perm: perm}
	}
}

type rankedMsg struct {
	seq  uint64
	t    *tables
	perm []int32
}

func (m Model) reevaluate() (Model, tea.Cmd) {
	m.evalSeq++
	m.loading = true
	m.errMsg = ""
	return m, m.evalCmd()
}

// quit ends the program, unless an export is still being written: then it
// waits for the write, and the status line says so. Asked again, it quits
// at once (the status line said the file would then not be written).
func (m Model) quit() (Model, tea.Cmd) {
	if len(m.writing) == 0 || m.quitting {
		return m, tea.Quit
	}
	m.quitting = true
	m.dlg = nil
	return m, nil
}

// updateMsg handles what dialogs and file commands report.
func (m Model) updateMsg(msg tea.Msg) (Model, tea.Cmd) {
	switch msg := msg.(type) {
	case quitAskedMsg:
		return m.quit()
	case cautionOKMsg:
		if !m.cautionOK {
			m.cautionOK = true
			return m, cautionSeenCmd(m.state)
		}
	case filterMsg:
		if m.t == nil || m.focusGrid().query == msg.query {
			return m, nil
		}
		m.focusGrid().query = msg.query
		return m, m.resort(m.gridPane())
	case solventMsg:
		return m.pickSolvent(msg.key)
	case pressureMsg, flaskMsg:
		return m.setCondition(msg)
	case windowAskMsg:
		return m.openWindow(msg.acc)
	case windowMsg:
		return m.windowShown(msg), nil
	case figurePathMsg, figureExistsMsg, figureDoneMsg:
		return m.updateFigure(msg)
	case answerMsg:
		if msg.q == askFigureOverwrite {
			if msg.yes {
				return m.writeFigure(true)
			}
			m.status = "not overwritten: " + m.figuring.path
			return m, nil
		}
		return m.updateIO(msg)
	case statusMsg:
		m.status = msg.text
	case stateMsg, savedMsg, exportPathMsg, exportExistsMsg, exportDoneMsg:
		return m.updateIO(msg)
	default:
		if m.dlg != nil {
			var cmd tea.Cmd
			m.dlg, cmd = m.dlg.update(msg, &m.keys)
			return m, cmd
		}
	}
	return m, nil
}
