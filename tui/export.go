package tui

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
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
	if len(m.marks) > 0 {
		j.rows = m.markedPairs()
		j.what = fmt.Sprintf("%d marked pairs", len(j.rows))
	} else {
		j.perm = m.grids[panePairs].perm
		j.what = fmt.Sprintf("the %d pairs of the Pairs table, in its order (none marked)", len(j.perm))
	}
	m.exporting = j
	m.mode = modeExportPath
	m.path.Prompt = fmt.Sprintf("export %s to: ", j.what)
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
// asks instead.
func exportCmd(j exportJob, force bool) tea.Cmd {
	return func() tea.Msg {
		if !force {
			if _, err := os.Stat(j.path); err == nil {
				return exportExistsMsg{j.path}
			} else if !errors.Is(err, fs.ErrNotExist) {
				return exportDoneMsg{path: j.path, err: err}
			}
		}
		pairs := j.rows
		if pairs == nil {
			pairs = make([]thermo.Pair, len(j.perm))
			for i, r := range j.perm {
				pairs[i] = j.t.pairs[r]
			}
		}
		var buf bytes.Buffer
		if err := writePairsCSV(&buf, j.t.ev, pairs, j.units); err != nil {
			return exportDoneMsg{path: j.path, err: err}
		}
		if err := writeAtomic(j.path, buf.Bytes()); err != nil {
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
		return m, m.save()
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

// writePairsCSV writes pairs as the rank command's CSV does: a header with
// units in the names, and per row the conditions that make it stand alone.
func writePairsCSV(w io.Writer, ev *data.Evaluated, pairs []thermo.Pair, u thermo.Units) error {
	cw := csv.NewWriter(w)
	s := "_" + u.Suffix()
	header := []string{"donor", "acceptor", "dg" + s, "sigma" + s, "log10_k", "donor_bdfe" + s, "acceptor_bdfe" + s,
		"donor_h2_margin" + s, "h2_tendency", "h2_wins", "cross_solvent", "solvent", "h2_line" + s, "c_g" + s,
		"c_g_basis", "temperature_k"}
	if err := cw.Write(header); err != nil {
		return err
	}
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	e := func(kcal float64) string { return f(u.From(kcal)) }
	cg, _ := ev.Cond.CGOf(ev.Working)
	for i := range pairs {
		p := &pairs[i]
		rec := []string{safeText(p.Donor.Couple.ID), safeText(p.Acceptor.Couple.ID), e(p.DG.Kcal), e(p.DG.Sigma()),
			f(p.Log10K), e(p.Donor.BDFE.Kcal), e(p.Acceptor.BDFE.Kcal), e(p.Donor.Margin.Kcal),
			p.Donor.Tendency.String(), strconv.FormatBool(p.H2Wins), strconv.FormatBool(p.CrossSolvent),
			safeText(ev.Working.Name), e(ev.H2Line.V), e(cg.V), ev.Cond.Basis.String(), f(ev.Cond.T())}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// safeText keeps a spreadsheet from reading a text cell as a formula.
func safeText(s string) string {
	if s != "" && strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return "'" + s
	}
	return s
}
