package tui

import (
	"fmt"
	"strings"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// The delivery window of an acceptor (w, from the Acceptors pane, the
// Scale pane or a pair's detail): the acid + reductant combinations of the
// library whose effective BDFE lies between the H2 line and the acceptor's
// bond, and each acid's electrode range. data.Library.DeliveryWindow
// computes it, in a command; the dialog only writes it out.

type (
	windowAskMsg struct{ acc *thermo.Resolved }
	windowMsg    struct {
		seq   uint64
		w     thermo.Window
		acids []*data.Acid
		reds  []*data.Reductant
		err   error
	}
)

// openWindow starts computing the window of acceptor a in its solvent.
func (m Model) openWindow(a *thermo.Resolved) (Model, tea.Cmd) {
	if a == nil || m.t == nil {
		return m, nil
	}
	m.winSeq++
	m.status = "weighing the delivery window of " + a.Couple.ID + "…"
	lib, cond, seq := m.lib, m.t.ev.Cond, m.winSeq
	if e := m.t.ev.Entry(a.Couple); e == nil || e.Status != data.StatusInvented {
		lib, _ = lib.WithoutInvented() // published acceptors: published reagents only
	}
	return m, func() tea.Msg {
		w, as, ds, err := lib.DeliveryWindow(a, a.Couple.Solvent, cond, thermo.WindowOptions{})
		return windowMsg{seq: seq, w: w, acids: as, reds: ds, err: err}
	}
}

func (m Model) windowShown(msg windowMsg) Model {
	if msg.seq != m.winSeq || m.t == nil {
		return m
	}
	m.status = ""
	if msg.err != nil {
		m.status = "no delivery window: " + msg.err.Error()
		return m
	}
	if m.dlg != nil && m.dlg.kind() != "detail" {
		// Another dialog was opened meanwhile: it keeps the keyboard.
		m.status = "the delivery window is ready: w shows it"
		return m
	}
	m.dlg = newDetailDialog(m.windowText(msg), m.w, m.bodyHeight())
	return m
}

// windowText writes the window: its edges, the combinations inside, and
// the electrode range of each acid.
func (m Model) windowText(msg windowMsg) string {
	w, u := msg.w, m.units.Label()
	var b strings.Builder
	a := w.Acceptor
	fmt.Fprintf(&b, "%s\n", m.st.Accent.Render(fmt.Sprintf("Delivery window of %s in %s   (esc closes)", shown(coupleName(a.Couple)), shown(w.Solvent.Name))))
	fmt.Fprintf(&b, "BDFE_eff between the H2 line %s (p(H2) %g atm) and the acceptor's bond %s %s\n",
		m.e(w.H2Line.V), m.t.ev.Cond.PH2Atm(), m.e(a.BDFE.Kcal), u)
	fmt.Fprintf(&b, "%d of %d acid + reductant combinations inside", len(w.Rows), w.Considered)
	if w.Failed > 0 {
		fmt.Fprintf(&b, " (%d could not be resolved)", w.Failed)
	}
	b.WriteString("; best room first\n")
	if a.Margin.Kcal < 0 {
		b.WriteString(m.st.Warn.Width(max(m.w, 1)).Render("The acceptor's bond lies below the H2 line: whatever reaches it makes H2 from itself first.") + "\n")
	}
	b.WriteString("\n")
	nw := min(max((m.w-62)/2, 10), 18) // the name columns
	if len(w.Rows) > 0 {
		fmt.Fprintf(&b, "%s %s %8s %4s %6s %7s %7s  %s\n", fit("acid", nw), fit("reductant", nw), "BDFE_eff", "σ", "ΔG°", "room A", "room H2", "status")
		for _, r := range w.Rows {
			ac, rd := msg.acids[r.Acid], msg.reds[r.Reductant]
			fmt.Fprintf(&b, "%s %s %8s %4s %6s %7s %7s  %s\n", fit(shown(ac.ID), nw), fit(shown(rd.ID), nw),
				m.e(r.Donor.BDFE.Kcal), m.e(r.DG.Sigma()), m.e(r.DG.Kcal), m.e(r.RoomToAcceptor), m.e(r.RoomToH2),
				fit(pairStatus(ac.Status, rd.Status), max(m.w-2*nw-40, 8)))
		}
	} else {
		b.WriteString("No acid + reductant combination of the library lies inside the window.\n")
	}
	if len(w.Electrodes) > 0 {
		fmt.Fprintf(&b, "\nEach acid with an electrode in place of the reductant delivers between these potentials:\n")
		fmt.Fprintf(&b, "%s %6s %16s %16s\n", fit("acid", nw), "pKa", "V vs "+w.Solvent.Ref.String(), "V vs H+/H2")
		for _, e := range w.Electrodes {
			ac := msg.acids[e.Acid]
			fmt.Fprintf(&b, "%s %6.2f %+7.3f..%-+7.3f %+7.3f..%-+7.3f\n", fit(shown(ac.ID), nw), ac.PKa.V,
				e.H2Onset, e.Limit, e.OnsetVsH2, e.LimitVsH2)
		}
		b.WriteString("(more negative than the first potential makes H2; more positive than the second cannot reach the acceptor)\n")
	}
	return b.String()
}

// windowAcceptor is the acceptor the w key is for in the pane shown.
func (m Model) windowAcceptor() *thermo.Resolved {
	switch m.tab {
	case paneAcceptors:
		if r := m.grids[paneAcceptors].row(); r >= 0 {
			return m.t.acceptors[r].R
		}
	case panePairs, paneScale:
		if p := m.selectedPair(); p != nil {
			return p.Acceptor
		}
	}
	return nil
}

// pairStatus is the status of an acid + reductant combination: the one
// status when both values have it, else the acid's, then the reductant's.
func pairStatus(acid, red string) string {
	if acid == red {
		return shown(acid)
	}
	return shown(acid + " / " + red)
}
