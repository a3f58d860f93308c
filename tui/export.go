package tui

import (
	"errors"
	"fmt"
	"io"
	"iter"
	"path/filepath"

	tea "github.com/charmbracelet/bubbletea"

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
	path, abs string // as asked, and made absolute
	n         int
	err       error
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

// exportAskRows is the longest export written without asking first: the
// limit 'hatsieve rank --top 0' refuses beyond.
const exportAskRows = data.LargeExport

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
	path := m.exporting.path
	if path == "" {
		path = "hatsieve-pairs.csv"
	}
	m.exporting = j
	m.dlg = pathDialog{newInput(fmt.Sprintf("export %s to: ", j.what), path, m.w)}
	m.status = ""
	return m, nil
}

// exportTo writes the export asked for to path, or first asks when it is
// long.
func (m Model) exportTo(path string) (Model, tea.Cmd) {
	m.exporting.path = path
	if n := m.exporting.count(); n > m.askRows {
		m.dlg = confirmDialog{q: askLargeExport, title: "A long export",
			body: fmt.Sprintf("Write %d rows to %s? That is about %s.", n, shown(path), sizeText(estimateCSV(m.exporting)))}
		return m, nil
	}
	return m.write(false)
}

// write starts writing the export; quitting waits for it.
func (m Model) write(force bool) (Model, tea.Cmd) {
	m.writing = append(m.writing, m.exporting.path)
	m.status = "writing " + m.exporting.path + "…"
	return m, exportCmd(m.exporting, force)
}

// written notes that the write to path ended.
func (m *Model) written(path string) {
	for i, p := range m.writing {
		if p == path {
			m.writing = append(m.writing[:i:i], m.writing[i+1:]...)
			return
		}
	}
}

// estimateCSV is the size of the export's CSV, from the first rows (more
// telling than data.PairRowBytes, as names and sources vary in length).
func estimateCSV(j exportJob) int64 {
	n := j.count()
	k := min(n, 200)
	sample := j
	if j.rows != nil {
		sample.rows = j.rows[:k]
	} else {
		sample.perm = j.perm[:k]
	}
	var head, body countWriter
	_ = data.WritePairsCSV(&head, j.t.ev, nil, j.units)
	_ = data.WritePairsCSVSeq(&body, j.t.ev, sample.seq(), j.units)
	if k == 0 {
		return head.n
	}
	return head.n + (body.n-head.n)*int64(n)/int64(k)
}

type countWriter struct{ n int64 }

func (c *countWriter) Write(p []byte) (int, error) { c.n += int64(len(p)); return len(p), nil }

func sizeText(b int64) string {
	switch {
	case b >= 1<<30:
		return fmt.Sprintf("%.1f GB", float64(b)/(1<<30))
	case b >= 1<<20:
		return fmt.Sprintf("%.0f MB", float64(b)/(1<<20))
	}
	return fmt.Sprintf("%.0f kB", float64(b)/(1<<10))
}

// seq yields the rows of the export in order, one at a time, so that
// writing a long list holds no copy of it.
func (j exportJob) seq() iter.Seq[thermo.Pair] {
	return func(yield func(thermo.Pair) bool) {
		if j.rows != nil {
			for _, p := range j.rows {
				if !yield(p) {
					return
				}
			}
			return
		}
		for _, r := range j.perm {
			if !yield(j.t.pairs[r]) {
				return
			}
		}
	}
}

// exportCmd writes the CSV; without force it refuses an existing file and
// asks instead (the refusal is made when the file is created, so a file that
// appears meanwhile is not overwritten either).
func exportCmd(j exportJob, force bool) tea.Cmd {
	return func() tea.Msg {
		// The streaming writer and the atomic file of 'hatsieve rank --out'.
		err := atomicfile.Write(j.path, force, func(w io.Writer) error {
			return data.WritePairsCSVSeq(w, j.t.ev, j.seq(), j.units)
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
		return exportDoneMsg{path: j.path, abs: abs, n: j.count()}
	}
}

// updateIO handles the results of file commands and the export questions.
func (m Model) updateIO(msg tea.Msg) (Model, tea.Cmd) {
	switch msg := msg.(type) {
	case stateMsg:
		return m.stateLoaded(msg)
	case savedMsg:
		if msg.err != nil {
			m.status = "shortlist not saved: " + msg.err.Error()
		}
	case exportPathMsg:
		return m.exportTo(msg.path)
	case answerMsg:
		switch {
		case msg.yes && msg.q == askOverwrite:
			return m.write(true)
		case msg.yes:
			return m.write(false)
		case msg.q == askOverwrite:
			m.status = "not overwritten: " + m.exporting.path
		default:
			m.status = "export cancelled"
		}
	case exportExistsMsg:
		m.written(msg.path)
		m.status = ""
		m.dlg = confirmDialog{q: askOverwrite, title: "File exists",
			body: fmt.Sprintf("%s already exists.\nOverwrite it with %d pairs?", shown(msg.path), m.exporting.count())}
		if m.quitting && len(m.writing) == 0 {
			m.quitting = false // the question comes first; quit again after it
		}
	case exportDoneMsg:
		m.written(msg.path)
		if msg.err != nil {
			m.status = "export failed: " + msg.err.Error()
		} else {
			m.status = fmt.Sprintf("wrote %d pairs to %s", msg.n, msg.abs)
		}
		if m.quitting && len(m.writing) == 0 {
			return m, tea.Quit
		}
	}
	return m, nil
}

func (m Model) stateLoaded(msg stateMsg) (Model, tea.Cmd) {
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
		if m.dlg != nil && m.dlg.kind() == "caution" {
			m.dlg = nil
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
}
