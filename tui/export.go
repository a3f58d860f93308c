package tui

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
	"github.com/hatsieve/hatsieve/thermo"
)

// exportJob is a snapshot of what to write: the marked pairs, or the Pairs
// table's current order.
type exportJob struct {
	path  string
	rows  []thermo.Pair // marked pairs, when any
	t     *tables
	perm  []int32 // otherwise: the visible order of the Pairs table
	units thermo.Units
	what  string
}

func (j exportJob) count() int {
	if j.rows != nil {
		return len(j.rows)
	}
	return len(j.perm)
}

type exportExistsMsg struct{ path string }

type exportDoneMsg struct {
	path string
	n    int
	err  error
}

// toggleMark marks or unmarks the pair under the cursor and saves the
// shortlist at once.
func (m Model) toggleMark() (Model, tea.Cmd) {
	var p *thermo.Pair
	if m.tab == paneSeries {
		if r := m.grids[paneSeries].row(); r >= 0 {
			p = &m.series[r].pair
		}
	} else {
		p = m.selectedPair()
	}
	if p == nil {
		return m, nil
	}
	k := pairKey(p)
	if _, ok := m.marks[k]; ok {
		delete(m.marks, k)
		m.status = "unmarked " + k.D + " → " + k.A
	} else {
		m.marks[k] = struct{}{}
		m.status = "marked " + k.D + " → " + k.A
	}
	return m, m.save()
}

// save writes the shortlist, once its file is known.
func (m *Model) save() tea.Cmd {
	if !m.stateReady || m.marksPath == "" {
		m.unsaved = true // saved once the shortlist file is known
		return nil
	}
	m.saveSeq++
	return saveCmd(m.state, m.marksPath, m.saveSeq, m.lib, sortedMarks(m.marks))
}

// markedPairs builds the marked pairs that exist in the current evaluation.
func (m Model) markedPairs() []thermo.Pair {
	ds := map[string]*thermo.Resolved{}
	for _, d := range m.t.ev.Donors {
		ds[d.Couple.ID] = d
	}
	as := map[string]*thermo.Resolved{}
	for _, a := range m.t.ev.Acceptors {
		as[a.Couple.ID] = a
	}
	out := []thermo.Pair{}
	for _, k := range sortedMarks(m.marks) {
		d, a := ds[k.D], as[k.A]
		if d != nil && a != nil {
			out = append(out, thermo.MakePair(d, a, m.t.ev.Cond))
		}
	}
	return out
}

func (m Model) startExport() (Model, tea.Cmd) {
	j := exportJob{t: m.t, units: m.units}
	if rows := m.markedPairs(); len(rows) > 0 {
		j.rows = rows
		j.what = fmt.Sprintf("%d marked pairs", len(j.rows))
	} else {
		// None marked among these pairs (marks of another solvent do not count).
		j.perm = m.grids[panePairs].perm
		j.what = fmt.Sprintf("%d listed pairs (none marked)", len(j.perm))
	}
	m.exporting = j
	m.mode = modeExportPath
	m.path.Prompt = fmt.Sprintf("export %s to: ", j.what)
	m.path.Width = max(m.w-lipgloss.Width(m.path.Prompt)-2, 8)
	if m.path.Value() == "" {
		m.path.SetValue("hatsieve-pairs.csv")
	}
	m.path.CursorEnd()
	m.status = ""
	return m, m.path.Focus()
}

func (m Model) keyExportPath(k tea.KeyMsg) (Model, tea.Cmd) {
	switch {
	case key.Matches(k, m.keys.Cancel):
		m.mode = modeBrowse
		m.path.Blur()
		m.status = "export cancelled"
		return m, nil
	case key.Matches(k, m.keys.Accept):
		p := strings.TrimSpace(m.path.Value())
		if p == "" {
			m.status = "give a file name"
			return m, nil
		}
		m.path.Blur()
		m.mode = modeBrowse
		m.exporting.path = p
		m.status = "writing " + p + "…"
		return m, exportCmd(m.exporting, false)
	}
	var cmd tea.Cmd
	m.path, cmd = m.path.Update(k)
	return m, cmd
}

func (m Model) keyExportConfirm(k tea.KeyMsg) (Model, tea.Cmd) {
	switch {
	case key.Matches(k, m.keys.Yes):
		m.mode = modeBrowse
		m.status = "writing " + m.exporting.path + "…"
		return m, exportCmd(m.exporting, true)
	case key.Matches(k, m.keys.No, m.keys.Cancel):
		m.mode = modeBrowse
		m.status = "not overwritten: " + m.exporting.path
	}
	return m, nil
}

// exportCmd writes the CSV; without force it refuses an existing file and
// asks instead (the refusal is made when the file is created, so a file that
// appears meanwhile is not overwritten either).
func exportCmd(j exportJob, force bool) tea.Cmd {
	return func() tea.Msg {
		pairs := j.rows
		if pairs == nil {
			pairs = make([]thermo.Pair, len(j.perm))
			for i, r := range j.perm {
				pairs[i] = j.t.pairs[r]
			}
		}
		// The writer and the atomic file of 'hatsieve rank --out'.
		err := atomicfile.Write(j.path, force, func(w io.Writer) error {
			return data.WritePairsCSV(w, j.t.ev, pairs, j.units)
		})
		if errors.Is(err, atomicfile.ErrExists) {
			return exportExistsMsg{j.path}
		}
		if err != nil {
			return exportDoneMsg{path: j.path, err: err}
		}
		abs, err := filepath.Abs(j.path)
		if err != nil {
			abs = j.path
		}
		return exportDoneMsg{path: abs, n: len(pairs)}
	}
}

// updateIO handles the results of file commands.
func (m Model) updateIO(msg tea.Msg) (Model, tea.Cmd) {
	switch msg := msg.(type) {
	case stateMsg:
		m.stateReady = true
		m.marksPath = msg.path
		if msg.err != nil {
			m.status = msg.err.Error()
		}
		for _, k := range msg.marks {
			m.marks[k] = struct{}{}
		}
		if msg.cautionSeen {
			m.cautionOK = true
			if m.mode == modeCaution {
				m.mode = modeBrowse
			}
		}
		if len(msg.marks) > 0 {
			m.status = fmt.Sprintf("%d marked pairs restored", len(msg.marks))
		}
		if m.unsaved {
			// Marks made before the saved ones were read: save the union.
			m.unsaved = false
			return m, m.save()
		}
		return m, nil
	case savedMsg:
		if msg.err != nil {
			m.status = "shortlist not saved: " + msg.err.Error()
		}
	case exportExistsMsg:
		m.mode = modeExportConfirm
		m.status = ""
	case exportDoneMsg:
		if msg.err != nil {
			m.status = "export failed: " + msg.err.Error()
		} else {
			m.status = fmt.Sprintf("wrote %d pairs to %s", msg.n, msg.path)
		}
	default:
		if m.mode == modeFilter {
			var cmd tea.Cmd
			m.filter, cmd = m.filter.Update(msg)
			return m, cmd
		}
		if m.mode == modeExportPath {
			var cmd tea.Cmd
			m.path, cmd = m.path.Update(msg)
			return m, cmd
		}
	}
	return m, nil
}
