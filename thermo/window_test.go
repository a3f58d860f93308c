package thermo

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/unit/constant"
)

func windowOf(t *testing.T, acc *Couple, s *Solvent, acids []WindowAcid, reds []WindowReductant, c Conditions, o WindowOptions) Window {
	t.Helper()
	a := resolve(t, acc, c)
	w, err := DeliveryWindow(&a, s, acids, reds, c, o)
	if err != nil {
		t.Fatal(err)
	}
	return w
}

func rowIDs(w Window, acids []WindowAcid, reds []WindowReductant) map[string]WindowRow {
	m := map[string]WindowRow{}
	for _, r := range w.Rows {
		m[acids[r.Acid].ID+"+"+reds[r.Reductant].ID] = r
	}
	return m
}

func TestWindowReproducesPublishedCombination(t *testing.T) {
	mecn := solvent(t, "MeCN")
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.9: ferrocene
	// + benzoic acid in MeCN has the "formal BDFE" 83.3 kcal/mol (2010 basis).
	// The pKa 20.7 of benzoic acid in MeCN is // from memory (Kolthoff,
	// Chantooni); E°(Fc+/Fc) is 0 V vs Fc by definition.
	acids := []WindowAcid{{ID: "bzoh", PKa: Value{V: 20.7}}}
	reds := []WindowReductant{{ID: "fc", E: Potential{Value: Value{V: 0, SigmaGiven: true}, Vs: Fc}}}
	// Source: 2010 review §5.1.2: NHPI O–H in MeCN, pKa 23.5 and E°(PINO/PINO⁻)
	// −0.1 V vs Fc, BDFE 84.8: 1.5 kcal/mol above Fc + PhCO2H, so the
	// combination delivers to PINO.
	nhpi := &Couple{ID: "nhpi", Roles: RoleAcceptor, Solvent: mecn, In: Inputs{PKa: val(23.5), EAnion: pot(-0.1, Fc)}}
	w := windowOf(t, nhpi, mecn, acids, reds, on2010, WindowOptions{})
	if len(w.Rows) != 1 {
		t.Fatalf("%d rows, want Fc + PhCO2H inside the window", len(w.Rows))
	}
	r := w.Rows[0]
	near(t, "formal BDFE of Fc + PhCO2H", r.Donor.BDFE.Kcal, 83.3, 0.2)
	near(t, "ΔG° to PINO", r.DG.Kcal, 83.3-84.8, 0.2)
	// Both come from the cycle in MeCN: σ(C_G) stays out of ΔG° and of the
	// H2 margin (2010 review §3: C_G cancels between cycle-derived BDFEs).
	if r.DG.SigCG != 0 || r.Donor.Margin.SigCG != 0 {
		t.Errorf("σ(C_G) in ΔG° %.3g or in the H2 margin %.3g, want 0", r.DG.SigCG, r.Donor.Margin.SigCG)
	}
	if r.Donor.BDFE.SigCG == 0 {
		t.Error("the effective BDFE itself carries σ(C_G)")
	}
	// The H2 margin is 2.303RT·pKa + F·(E° − E°(H+/H2)) whatever the basis;
	// E°(H+/H2) = −0.028 V vs Fc in MeCN (Source: Roberts, Bullock, Inorg.
	// Chem. 2013, 52, 3823).
	want := RTLn10(DefaultTemperature)*20.7 + FaradayKcal*0.028
	near(t, "room to H2, 2010 basis", r.RoomToH2, want, 1e-9)
	w22 := windowOf(t, nhpi, mecn, acids, reds, on2022, WindowOptions{})
	near(t, "room to H2, 2022 basis", w22.Rows[0].RoomToH2, want, 1e-9)
	near(t, "room to the acceptor, either basis", w22.Rows[0].RoomToAcceptor, r.RoomToAcceptor, 1e-9)
}

func TestWindowEdges(t *testing.T) {
	mecn := solvent(t, "MeCN")
	eh2 := mecn.EH2.V
	acids := []WindowAcid{
		{ID: "zero", PKa: Value{V: 0}},
		{ID: "ten", PKa: Value{V: 10}},
	}
	reds := []WindowReductant{
		// With pKa 0 and E° = E°(H+/H2) the effective BDFE is the H2 line itself.
		{ID: "at-h2", E: Potential{Value: Value{V: eh2}, Vs: Fc}},
		{ID: "below-h2", E: Potential{Value: Value{V: eh2 - 0.01}, Vs: Fc}},
		{ID: "mid", E: Potential{Value: Value{V: -0.4}, Vs: Fc}},
		{ID: "weak", E: Potential{Value: Value{V: 0.2}, Vs: Fc}},
	}
	// The acceptor is built from the same pKa and E° as ten + mid, so that
	// combination sits exactly at it.
	acc := &Couple{ID: "acc", Roles: RoleAcceptor, Solvent: mecn, In: Inputs{PKa: val(10), EAnion: pot(-0.4, Fc)}}
	for _, c := range []Conditions{on2010, on2022} {
		w := windowOf(t, acc, mecn, acids, reds, c, WindowOptions{})
		got := rowIDs(w, acids, reds)
		if r, ok := got["zero+at-h2"]; !ok || r.RoomToH2 != 0 {
			t.Errorf("%v basis: a combination exactly on the H2 line belongs in the window (room %v, present %v)", c.Basis, r.RoomToH2, ok)
		}
		if r, ok := got["ten+mid"]; !ok || r.DG.Kcal != 0 {
			t.Errorf("%v basis: a combination exactly at the acceptor belongs in the window (ΔG° %v, present %v)", c.Basis, r.DG.Kcal, ok)
		}
		if _, ok := got["zero+below-h2"]; ok {
			t.Errorf("%v basis: a combination 0.01 V below the H2 line is in the window", c.Basis)
		}
		if _, ok := got["ten+weak"]; ok {
			t.Errorf("%v basis: a combination 0.6 V uphill of the acceptor is in the window", c.Basis)
		}
		for _, r := range w.Rows {
			if r.DG.Kcal > 0 || r.RoomToH2 < 0 {
				t.Errorf("%s+%s outside the window: ΔG° %.3f, room to H2 %.3f", acids[r.Acid].ID, reds[r.Reductant].ID, r.DG.Kcal, r.RoomToH2)
			}
		}
		if w.Considered != len(acids)*len(reds) || w.Failed != 0 {
			t.Errorf("considered %d, failed %d", w.Considered, w.Failed)
		}
	}
	// With the option, those below the line come back (zero+below-h2, and
	// zero+mid, 0.37 V below it), after every row above it.
	w := windowOf(t, acc, mecn, acids, reds, on2022, WindowOptions{BelowH2: true})
	got := rowIDs(w, acids, reds)
	if r, ok := got["zero+below-h2"]; !ok || r.RoomToH2 >= 0 {
		t.Errorf("with BelowH2: zero+below-h2 present %v, room to H2 %.3f", ok, r.RoomToH2)
	}
	below := false
	for _, r := range w.Rows {
		if r.RoomToH2 < 0 {
			below = true
		} else if below {
			t.Errorf("%s+%s above the line sorts after one below it", acids[r.Acid].ID, reds[r.Reductant].ID)
		}
	}
	// A margin lets in the uphill one: ten + weak is F·0.6 uphill.
	up := FaradayKcal * 0.6
	w = windowOf(t, acc, mecn, acids, reds, on2022, WindowOptions{Margin: up + 0.01})
	if r, ok := rowIDs(w, acids, reds)["ten+weak"]; !ok || math.Abs(r.RoomToAcceptor+up) > 1e-9 {
		t.Errorf("margin %.2f: ten+weak present %v, room %.4f, want %.4f", up+0.01, ok, r.RoomToAcceptor, -up)
	}
}

func TestWindowSortsByTheSmallerRoom(t *testing.T) {
	mecn := solvent(t, "MeCN")
	acc := &Couple{ID: "acc", Roles: RoleAcceptor, Solvent: mecn, In: Inputs{PKa: val(20), EAnion: pot(-0.2, Fc)}}
	var acids []WindowAcid
	for _, p := range []float64{2, 6, 10, 14, 18} {
		acids = append(acids, WindowAcid{ID: ftoa(p), PKa: Value{V: p}})
	}
	reds := []WindowReductant{{ID: "a", E: Potential{Value: Value{V: -0.5}, Vs: Fc}}, {ID: "b", E: Potential{Value: Value{V: -1.0}, Vs: Fc}}}
	w := windowOf(t, acc, mecn, acids, reds, on2022, WindowOptions{})
	if len(w.Rows) < 3 {
		t.Fatalf("only %d rows", len(w.Rows))
	}
	for i := 1; i < len(w.Rows); i++ {
		if w.Rows[i].Room() > w.Rows[i-1].Room() {
			t.Errorf("row %d room %.3f after %.3f", i, w.Rows[i].Room(), w.Rows[i-1].Room())
		}
	}
	for _, r := range w.Rows {
		if r.Room() != math.Min(r.RoomToAcceptor, r.RoomToH2) || math.Abs(r.RoomToAcceptor+r.RoomToH2-(w.Acceptor.Margin.Kcal)) > 1e-9 {
			t.Errorf("rooms %.3f + %.3f do not add up to the acceptor's H2 margin %.3f", r.RoomToAcceptor, r.RoomToH2, w.Acceptor.Margin.Kcal)
		}
	}
}

func TestWindowElectrodeRange(t *testing.T) {
	mecn := solvent(t, "MeCN")
	// Source: 2010 review §5.1.2 (NHPI in MeCN: pKa 23.5, E° −0.1 V vs Fc).
	nhpi := &Couple{ID: "nhpi", Roles: RoleAcceptor, Solvent: mecn, In: Inputs{PKa: val(23.5), EAnion: pot(-0.1, Fc)}}
	acids := []WindowAcid{{ID: "anilinium", PKa: Value{V: 10.6}}}
	// The Nernst slope 2.303RT/F at 298.15 K from CODATA R and F
	// (Source: CODATA 2018 via gonum unit/constant, R = k_B·N_A).
	slope := math.Ln10 * float64(constant.Boltzmann) * float64(constant.Avogadro) * DefaultTemperature / float64(constant.Faraday)
	for _, c := range []Conditions{on2010, on2022} {
		w := windowOf(t, nhpi, mecn, acids, nil, c, WindowOptions{})
		if len(w.Electrodes) != 1 {
			t.Fatalf("%d electrode ranges", len(w.Electrodes))
		}
		e := w.Electrodes[0]
		// H2 onset of an acid HA: E°(HA/H2) = E°(H+/H2) − (2.303RT/F)·pKa,
		// with E°(H+/H2) = −0.028 V vs Fc (Source: Roberts, Bullock, Inorg.
		// Chem. 2013, 52, 3823), on either basis.
		near(t, "H2 onset vs Fc", e.H2Onset, -0.028-slope*10.6, 1e-4)
		near(t, "H2 onset vs H2", e.OnsetVsH2, -slope*10.6, 1e-4)
		// The delivery limit is the NHPI couple itself moved by the two
		// pKas: E°(PINO/PINO⁻) + (2.303RT/F)(pKa(NHPI) − pKa(HA)).
		near(t, "delivery limit vs Fc", e.Limit, -0.1+slope*(23.5-10.6), 1e-4)
		near(t, "window width", e.Width(), w.Acceptor.Margin.Kcal/FaradayKcal, 1e-9)
		// σ: pKa (default 0.5) and E°(H+/H2) for the onset, no σ(C_G).
		near(t, "σ of the onset", e.SigOnset, math.Hypot(slope*0.5, 0.004), 1e-4)
		if e.Ref != Fc {
			t.Errorf("ref %v", e.Ref)
		}
	}
}

func TestWindowAcceptorBelowH2Line(t *testing.T) {
	mecn := solvent(t, "MeCN")
	// An acceptor bond below the H2 line: every combination that could reach
	// it gives H2 first, so the window is empty and the electrode range
	// negative. (The cobaloxime O–H of Estes, Grills, Norton, BDFE 50.5 in
	// MeCN, is such a bond; here built from pKa 0 and E° 0.1 V below
	// E°(H+/H2).)
	acc := &Couple{ID: "low", Roles: RoleAcceptor, Solvent: mecn, In: Inputs{PKa: val(0), EAnion: pot(mecn.EH2.V-0.1, Fc)}}
	acids := []WindowAcid{{ID: "x", PKa: Value{V: 0}}}
	reds := []WindowReductant{{ID: "r", E: Potential{Value: Value{V: mecn.EH2.V - 0.2}, Vs: Fc}}}
	w := windowOf(t, acc, mecn, acids, reds, on2022, WindowOptions{})
	if len(w.Rows) != 0 || w.Electrodes[0].Width() >= 0 {
		t.Errorf("rows %d, electrode width %.3f V: want none and negative", len(w.Rows), w.Electrodes[0].Width())
	}
}

func TestWindowNilAcceptor(t *testing.T) {
	if _, err := DeliveryWindow(nil, solvent(t, "MeCN"), nil, nil, on2022, WindowOptions{}); err == nil {
		t.Error("no error for a nil acceptor")
	}
}
