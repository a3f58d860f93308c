package tui

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/figure"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
	"github.com/hatsieve/hatsieve/thermo"
)

// The f key writes the figure of what is shown: from the Scale pane the
// BDFE ladder with the selected pair, from the Pairs pane the map of the
// listed pairs' couples with the shortlist framed. The figure package draws
// it; the file is written through atomicfile.Write in a command, as the CSV
// export is, with the same question before an existing file is replaced.

// figureJob is a snapshot of the figure asked for.
type figureJob struct {
	ladder bool
	path   string
	format string
	lin    figure.LadderInput
	min    figure.MapInput
}

type (
	figurePathMsg   struct{ path, format string }
	figureExistsMsg struct{ path string }
	figureDoneMsg   struct {
		path, abs string
		err       error
	}
)

// maxMapRows is how many listed pairs, from the top, the map's couples are
// taken from (at most figure.MaxMapSide of each side).
const maxMapRows = 50_000

// startFigure snapshots the figure of the pane shown and asks for a path.
func (m Model) startFigure() (Model, tea.Cmd) {
	j := figureJob{ladder: m.tab == paneScale}
	ev, u := m.t.ev, m.units
	if j.ladder {
		j.lin = figure.LadderOf(ev, ev.Donors, ev.Acceptors, u)
		j.lin.Pair = figure.PairIn(m.selectedPair(), ev.Donors, ev.Acceptors, u)
		j.path = m.figPaths[0]
	} else {
		perm := m.grids[panePairs].perm
		n := min(len(perm), maxMapRows)
		pairs := make([]thermo.Pair, n)
		for i, r := range perm[:n] {
			pairs[i] = m.t.pairs[r]
		}
		d, a := figure.CouplesOf(pairs, figure.MaxMapSide)
		marks := make(map[figure.Mark]bool, len(m.marks))
		for k := range m.marks {
			marks[figure.Mark{Donor: k.D, Acceptor: k.A}] = true
		}
		j.min = figure.MapOf(ev, d, a, marks, u)
		if len(d) < len(ev.Donors) || len(a) < len(ev.Acceptors) {
			j.min.Caption += fmt.Sprintf(" Shown: the %d donors and %d acceptors of the pairs listed first (%d pairs listed).",
				len(d), len(a), len(perm))
		}
		j.path = m.figPaths[1]
	}
	if j.path == "" {
		j.path = map[bool]string{true: "hatsieve-ladder.svg", false: "hatsieve-map.svg"}[j.ladder]
	}
	m.figuring = j
	what := map[bool]string{true: "ladder", false: "map"}[j.ladder]
	d := newValueDialog("write the "+what+" (.svg or .png) to: ", j.path, m.w, func(s string) (tea.Msg, error) {
		if s == "" {
			return nil, errors.New("give a file name")
		}
		f, err := figure.FormatOf(s)
		if err != nil {
			return nil, err
		}
		return figurePathMsg{s, f}, nil
	})
	d.cancel = "figure not written"
	m.dlg = d
	return m, nil
}

// writeFigure starts writing the figure; quitting waits for it.
func (m Model) writeFigure(force bool) (Model, tea.Cmd) {
	j := m.figuring
	m.writing = append(m.writing, j.path)
	m.status = "writing " + j.path + "…"
	return m, func() tea.Msg {
		err := atomicfile.Write(j.path, force, func(w io.Writer) error {
			if j.ladder {
				return figure.Ladder(w, j.format, j.lin)
			}
			return figure.Map(w, j.format, j.min)
		})
		if errors.Is(err, atomicfile.ErrExists) {
			return figureExistsMsg{j.path}
		}
		abs, aerr := filepath.Abs(j.path)
		if aerr != nil {
			abs = j.path
		}
		return figureDoneMsg{path: j.path, abs: abs, err: err}
	}
}

// updateFigure handles the path, the overwrite answer and the result.
func (m Model) updateFigure(msg tea.Msg) (Model, tea.Cmd) {
	switch msg := msg.(type) {
	case figurePathMsg:
		m.figuring.path, m.figuring.format = msg.path, msg.format
		if m.figuring.ladder {
			m.figPaths[0] = msg.path
		} else {
			m.figPaths[1] = msg.path
		}
		return m.writeFigure(false)
	case figureExistsMsg:
		m.written(msg.path)
		m.status = ""
		m.dlg = confirmDialog{q: askFigureOverwrite, title: "File exists",
			body: fmt.Sprintf("%s already exists.\nOverwrite it with the figure?", shown(msg.path))}
		if m.quitting && len(m.writing) == 0 {
			m.quitting = false // the question comes first; quit again after it
		}
	case figureDoneMsg:
		m.written(msg.path)
		switch {
		case errors.Is(msg.err, figure.ErrTooSmall):
			m.status = "figure not written: " + msg.err.Error() + " (fewer couples: filter the list, or pick a bond class)"
		case msg.err != nil:
			m.status = "figure not written: " + msg.err.Error()
		default:
			m.status = "wrote the figure to " + msg.abs
		}
		if m.quitting && len(m.writing) == 0 {
			return m, tea.Quit
		}
	}
	return m, nil
}
