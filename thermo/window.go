package thermo

import (
	"errors"
	"math"
	"sort"
)

// WindowAcid is a proton source offered to DeliveryWindow: its pKa in the
// window's solvent.
type WindowAcid struct {
	ID  string
	PKa Value
}

// WindowReductant is an electron source offered to DeliveryWindow: a
// reagent's E°(Red+/Red), or an electrode held at a potential, in the
// window's solvent.
type WindowReductant struct {
	ID string
	E  Potential
}

// WindowOptions tune DeliveryWindow.
type WindowOptions struct {
	// Margin (kcal/mol) lets in combinations up to this much uphill of the
	// acceptor: ΔG° = BDFE_eff − BDFE_A ≤ Margin. Zero means thermoneutral
	// or downhill only.
	Margin float64
	// BelowH2 keeps combinations below the H2 line (two of them give H2
	// downhill); they sort after every combination above it.
	BelowH2 bool
}

// WindowRow is one acid + reductant combination inside the window.
type WindowRow struct {
	Acid, Reductant int // indices into the slices given to DeliveryWindow

	// Donor is the combination resolved as a donor: BDFE_eff =
	// 2.303RT·pKa + F·E° + C_G, its σ split into data and C_G parts, and its
	// H2 margin BDFE_eff − G_H (C_G cancels).
	Donor Resolved
	// DG is ΔG°(HAT) = BDFE_eff − BDFE_A; C_G cancels when the acceptor's
	// BDFE comes from the cycle in the same solvent.
	DG Energy

	// RoomToAcceptor = −ΔG° (kcal/mol): how far below the acceptor's bond the
	// combination sits (negative within a positive Margin). RoomToH2 is the
	// H2 margin. The rows sort by the smaller of the two, largest first.
	RoomToAcceptor, RoomToH2 float64
}

// Room is the smaller of the row's two rooms, the key it is sorted by.
func (r WindowRow) Room() float64 { return math.Min(r.RoomToAcceptor, r.RoomToH2) }

// ElectrodeRange is, for one acid, the electrode potentials over which the
// acid plus an electrode delivers H to the acceptor before H2 evolution:
// from the H2 onset E = (G_H − C_G − 2.303RT·pKa)/F (more negative gives
// H2) to the delivery limit E = (BDFE_A + Margin − C_G − 2.303RT·pKa)/F
// (more positive cannot reach the acceptor).
type ElectrodeRange struct {
	Acid int // index into the acids given to DeliveryWindow

	// H2Onset and Limit are in V vs Ref (the solvent's C_G electrode).
	H2Onset, Limit float64
	// SigOnset and SigLimit are their σ in V: pKa and E°(H+/H2) for the
	// onset, pKa and the acceptor's data for the limit (C_G cancels in both
	// unless the acceptor's BDFE does not carry the solvent's C_G).
	SigOnset, SigLimit float64
	// OnsetVsH2 and LimitVsH2 are the same potentials against the solvent's
	// standard H+/H2 couple, E°(H+/H2) = (G_H − C_G)/F vs Ref: the onset is
	// −2.303RT·pKa/F, independent of C_G.
	OnsetVsH2, LimitVsH2 float64
	Ref                  Electrode
}

// Width is Limit − H2Onset in volts: the same for every acid, (BDFE_A +
// Margin − G_H)/F, and negative when the acceptor lies below the H2 line.
func (e ElectrodeRange) Width() float64 { return e.Limit - e.H2Onset }

// Window is the delivery window of one acceptor bond in one solvent.
type Window struct {
	Acceptor *Resolved
	Solvent  *Solvent
	H2Line   Number
	Margin   float64

	Rows       []WindowRow      // combinations inside the window, best room first
	Electrodes []ElectrodeRange // one per acid, in the order given
	// Considered counts the acid × reductant combinations tried; Failed
	// those that could not be resolved (e.g. an electrode with no known
	// conversion in the solvent).
	Considered, Failed int
}

// ErrNoAcceptorBDFE is returned when the acceptor has no BDFE to aim at.
var ErrNoAcceptorBDFE = errors.New("the acceptor has no BDFE")

// DeliveryWindow finds, for acceptor a (resolved under c) and solvent s,
// every acid + reductant combination whose effective BDFE lies between the
// H2 line and the acceptor's BDFE: ΔG° = BDFE_eff − BDFE_A ≤ o.Margin and
// BDFE_eff − G_H ≥ 0 (the latter dropped with o.BelowH2). Rows sort by the
// smaller of their two rooms, largest first, then by acid and reductant id.
// It also gives each acid's electrode-potential range. Every acid and
// reductant is taken to be in s. It is pure: nothing is read or kept.
func DeliveryWindow(a *Resolved, s *Solvent, acids []WindowAcid, reds []WindowReductant, c Conditions, o WindowOptions) (Window, error) {
	if a == nil {
		return Window{}, ErrNoAcceptorBDFE
	}
	gh, err := c.H2LineOf(s)
	if err != nil {
		return Window{}, err
	}
	w := Window{Acceptor: a, Solvent: s, H2Line: gh, Margin: o.Margin}
	if err := w.electrodes(acids, c); err != nil {
		return Window{}, err
	}
	for i, ac := range acids {
		for j, rd := range reds {
			w.Considered++
			row, ok := windowRow(a, s, ac, rd, c, &gh)
			if !ok {
				w.Failed++
				continue
			}
			row.Acid, row.Reductant = i, j
			if row.DG.Kcal > o.Margin || (row.RoomToH2 < 0 && !o.BelowH2) {
				continue
			}
			w.Rows = append(w.Rows, row)
		}
	}
	sort.SliceStable(w.Rows, func(x, y int) bool {
		rx, ry := w.Rows[x], w.Rows[y]
		if bx, by := rx.RoomToH2 >= 0, ry.RoomToH2 >= 0; bx != by {
			return bx
		}
		if kx, ky := rx.Room(), ry.Room(); kx != ky {
			return kx > ky
		}
		if ix, iy := acids[rx.Acid].ID, acids[ry.Acid].ID; ix != iy {
			return ix < iy
		}
		return reds[rx.Reductant].ID < reds[ry.Reductant].ID
	})
	return w, nil
}

// windowRow resolves one combination and measures it against the acceptor.
func windowRow(a *Resolved, s *Solvent, ac WindowAcid, rd WindowReductant, c Conditions, gh *Number) (WindowRow, bool) {
	pka := ac.PKa
	e := rd.E
	if e.Vs == NoElectrode {
		e.Vs = s.DefaultElectrode()
	}
	cp := &Couple{ID: ac.ID + "+" + rd.ID, Roles: RoleDonor, Solvent: s, In: Inputs{AcidPKa: &pka, Reductant: &e}}
	var r WindowRow
	routes, err := Routes(cp, c)
	if err != nil {
		return r, false
	}
	fill(&r.Donor, cp, routes, gh)
	p := MakePair(&r.Donor, a, c)
	r.DG = p.DG
	r.RoomToAcceptor = -r.DG.Kcal
	r.RoomToH2 = r.Donor.Margin.Kcal
	return r, true
}

// electrodes fills the electrode range of every acid.
func (w *Window) electrodes(acids []WindowAcid, c Conditions) error {
	s, a := w.Solvent, w.Acceptor
	if len(acids) == 0 {
		return nil
	}
	cg, err := c.CGOf(s)
	if err != nil {
		return err
	}
	k := RTLn10(c.T())
	// E°(H+/H2) vs Ref is (G_H − C_G)/F; H2Margin gives C_G − G_H with the σ
	// of the difference (F·σ(E°(H+/H2)) where that is known).
	cgE := Energy{Kcal: cg.V, SigCG: cg.Sigma, CG: s}
	h := H2Margin(cgE, w.H2Line, s)
	eH2 := -h.Kcal / FaradayKcal
	// BDFE_A − C_G: the C_G parts cancel when the acceptor carries this
	// solvent's C_G.
	lim := Diff(a.BDFE, cgE)
	for i, ac := range acids {
		v, err := ElectrodeWindow(a.BDFE.Kcal+w.Margin, ac.PKa.V, s, c)
		if err != nil {
			return err
		}
		sp := k * ac.PKa.WithDefaultSigma(DefaultSigmaPKa).Sigma
		w.Electrodes = append(w.Electrodes, ElectrodeRange{
			Acid:      i,
			H2Onset:   v.H2Onset,
			Limit:     v.Thermoneutral,
			SigOnset:  math.Hypot(sp, h.Sigma()) / FaradayKcal,
			SigLimit:  math.Hypot(sp, lim.Sigma()) / FaradayKcal,
			OnsetVsH2: v.H2Onset - eH2,
			LimitVsH2: v.Thermoneutral - eH2,
			Ref:       v.Ref,
		})
	}
	return nil
}
