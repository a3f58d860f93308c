package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// windowConfig holds the options of hatsieve window.
type windowConfig struct {
	files   fileList
	c       common
	solvent string
	margin  optFloat
	belowH2 bool
	format  string
	top     int
}

func (wc *windowConfig) register(fs *flag.FlagSet) {
	wc.files.register(fs)
	wc.c.register(fs)
	fs.StringVar(&wc.solvent, "solvent", "", "solvent of the acids and reductants (default: the acceptor's)")
	fs.Var(&wc.margin, "margin", "let in combinations up to this much uphill of the acceptor (in --units; default 0)")
	fs.BoolVar(&wc.belowH2, "below-h2", false, "also list combinations below the H2 line (they make H2 downhill), after the others")
	fs.StringVar(&wc.format, "format", "table", "output format: table, csv or json")
	fs.IntVar(&wc.top, "top", 0, "show the best N combinations (0 for all)")
}

// windowRun is what the window command computed, ready to write.
type windowRun struct {
	acc     *data.Couple
	w       thermo.Window
	acids   []*data.Acid
	reds    []*data.Reductant
	cond    thermo.Conditions
	units   thermo.Units
	top     int
	belowH2 bool
	// inventedLeft counts the invented (demo) acids and reductants left
	// out of a published acceptor's window.
	inventedLeft int
}

// cmdWindow lists the acid + reductant and acid + electrode combinations
// that deliver an H atom to one acceptor bond without making H2 first.
func cmdWindow(args []string, e env) error {
	fs := newFlagSet("window")
	var wc windowConfig
	wc.register(fs)
	pos, err := parseInterspersed(fs, args, e)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("window: want one acceptor id (hatsieve window ACCEPTOR [-l FILE]...), got %d arguments", len(pos))
	}
	switch wc.format {
	case "table", "csv", "json":
	default:
		return usagef("window: --format: want table, csv or json, got %q", wc.format)
	}
	if wc.top < 0 {
		return usagef("window: --top: want 0 (all) or more, got %d", wc.top)
	}
	early := wc.c
	early.cg = optFloat{}
	if _, _, err := early.conditions(nil); err != nil {
		return err
	}
	run, err := wc.compute(e, pos[0])
	if err != nil {
		return err
	}
	switch wc.format {
	case "json":
		return writeWindowJSON(e.stdout, run)
	case "csv":
		return writeWindowCSV(e.stdout, run)
	}
	return writeWindowTable(e.stdout, run)
}

// compute loads the library (the embedded acids and reductants ahead of any
// -l file), finds the acceptor and works out its window.
func (wc *windowConfig) compute(e env, id string) (*windowRun, error) {
	var lib *data.Library
	var err error
	if len(wc.files) == 0 {
		lib, err = loadLibrary(e, nil)
	} else {
		var files []data.File
		if files, err = data.ReadFiles(wc.files...); err == nil {
			lib, err = data.Load(append(data.ReagentFiles(), files...)...)
		}
	}
	if err != nil {
		return nil, err
	}
	acc, err := findAcceptor(lib, id)
	if err != nil {
		return nil, err
	}
	left := 0
	if acc.Status != data.StatusInvented {
		lib, left = lib.WithoutInvented()
	}
	s, err := wc.windowSolvent(lib, acc)
	if err != nil {
		return nil, err
	}
	cond, units, err := wc.c.conditions(s)
	if err != nil {
		return nil, err
	}
	cp := acc.Couple
	if cp.Solvent == nil {
		cp.Solvent = s
	}
	a, err := thermo.Resolve(&cp, cond)
	if err != nil {
		return nil, fmt.Errorf("window: acceptor %s: %v", data.Printable(id), err)
	}
	var o thermo.WindowOptions
	o.BelowH2 = wc.belowH2
	if wc.margin.set {
		o.Margin = wc.margin.v
		if units == thermo.KJ {
			o.Margin /= thermo.JoulePerCalorie
		}
	}
	w, acids, reds, err := lib.DeliveryWindow(&a, s, cond, o)
	if err != nil {
		return nil, fmt.Errorf("window: %s: %v", s.Key, err)
	}
	return &windowRun{acc: acc, w: w, acids: acids, reds: reds, cond: cond, units: units, top: wc.top, belowH2: wc.belowH2, inventedLeft: left}, nil
}

// findAcceptor returns the couple of that id that can accept an H atom; an
// unknown id names the nearest acceptor ids.
func findAcceptor(lib *data.Library, id string) (*data.Couple, error) {
	var ids []string
	for _, c := range lib.Couples {
		if c.Roles&thermo.RoleAcceptor == 0 {
			continue
		}
		if c.ID == id {
			return c, nil
		}
		ids = append(ids, c.ID)
	}
	for _, c := range lib.Couples {
		if c.ID == id {
			return nil, fmt.Errorf("window: %s is a donor only; the window needs an acceptor bond", data.Printable(id))
		}
	}
	hint := ""
	if near := thermo.Nearest(id, ids); near != "" {
		hint = fmt.Sprintf(" (did you mean %s?)", data.Printable(near))
	}
	return nil, fmt.Errorf("window: unknown acceptor %q%s", data.Printable(id), hint)
}

// windowSolvent is --solvent, else the acceptor's solvent, else the
// library's default (acetonitrile when none).
func (wc *windowConfig) windowSolvent(lib *data.Library, acc *data.Couple) (*thermo.Solvent, error) {
	name := wc.solvent
	if name == "" && acc.Solvent != nil {
		name = acc.Solvent.Key
	}
	if name == "" {
		name = nonEmptyStr(lib.DefaultSolvent, "acetonitrile")
	}
	s, err := lib.Solvents.Lookup(name)
	if err != nil {
		return nil, usagef("window: --solvent: %v", err)
	}
	if s.IsGas() || s.Ref == thermo.NoElectrode {
		return nil, usagef("window: %s is in the %s, which has no C_G for acid + reductant combinations: choose a solvent with --solvent", data.Printable(acc.ID), s.Name)
	}
	return s, nil
}

func nonEmptyStr(a, b string) string {
	if a != "" {
		return a
	}
	return b
}

// electrodeMid is an acid + electrode held at the middle of its range: the
// effective BDFE halfway between the H2 line and the acceptor (plus margin).
type electrodeMid struct {
	e                  thermo.ElectrodeRange
	v                  float64 // V vs Ref
	bdfe, sigma        float64
	dg, h2, roomA, rH2 float64
}

func (r *windowRun) electrodeRows() []electrodeMid {
	w := r.w
	k := thermo.RTLn10(r.cond.T())
	var out []electrodeMid
	for _, e := range w.Electrodes {
		if e.Width() < 0 && !r.belowH2 {
			continue
		}
		top := w.Acceptor.BDFE.Kcal + w.Margin
		m := electrodeMid{e: e, v: (e.H2Onset + e.Limit) / 2, bdfe: (w.H2Line.V + top) / 2}
		cg, _ := r.cond.CGOf(w.Solvent)
		sp := k * r.acids[e.Acid].PKa.WithDefaultSigma(thermo.DefaultSigmaPKa).Sigma
		m.sigma = math.Hypot(sp, cg.Sigma)
		m.dg = m.bdfe - w.Acceptor.BDFE.Kcal
		m.h2 = m.bdfe - w.H2Line.V
		m.roomA, m.rH2 = -m.dg, m.h2
		out = append(out, m)
	}
	return out
}

func (r *windowRun) rows() []thermo.WindowRow {
	if r.top > 0 && len(r.w.Rows) > r.top {
		return r.w.Rows[:r.top]
	}
	return r.w.Rows
}

func writeWindowJSON(w io.Writer, r *windowRun) error {
	u := r.units
	sfx := u.Suffix()
	en := func(v float64) float64 { return round(u.From(v)) }
	out := []object{}
	for _, x := range r.rows() {
		a, d := r.acids[x.Acid], r.reds[x.Reductant]
		out = append(out, object{}.
			add("acid", a.ID).
			add("reductant", d.ID).
			add("bdfe_eff_"+sfx, en(x.Donor.BDFE.Kcal)).
			add("sigma_"+sfx, en(x.Donor.BDFE.Sigma())).
			add("dg_"+sfx, en(x.DG.Kcal)).
			add("h2_margin_"+sfx, en(x.Donor.Margin.Kcal)).
			add("room_to_acceptor_"+sfx, en(x.RoomToAcceptor)).
			add("room_to_h2_"+sfx, en(x.RoomToH2)).
			add("sources", []string{a.Source, d.Source}).
			add("dg_sigma_"+sfx, en(x.DG.Sigma())).
			add("h2_margin_sigma_"+sfx, en(x.Donor.Margin.Sigma())).
			add("status", worstOf(a.Status, d.Status)).
			add("solvent", r.w.Solvent.Key))
	}
	for _, m := range r.electrodeRows() {
		a := r.acids[m.e.Acid]
		out = append(out, object{}.
			add("acid", a.ID).
			add("electrode_v", round(m.v)).
			add("bdfe_eff_"+sfx, en(m.bdfe)).
			add("sigma_"+sfx, en(m.sigma)).
			add("dg_"+sfx, en(m.dg)).
			add("h2_margin_"+sfx, en(m.h2)).
			add("room_to_acceptor_"+sfx, en(m.roomA)).
			add("room_to_h2_"+sfx, en(m.rH2)).
			add("sources", []string{a.Source}).
			add("electrode_vs", m.e.Ref.String()).
			add("electrode_range_v", object{}.
				add("h2_onset", round(m.e.H2Onset)).
				add("limit", round(m.e.Limit)).
				add("h2_onset_vs_h2", round(m.e.OnsetVsH2)).
				add("limit_vs_h2", round(m.e.LimitVsH2)).
				add("sigma_h2_onset", round(m.e.SigOnset)).
				add("sigma_limit", round(m.e.SigLimit))).
			add("status", a.Status).
			add("solvent", r.w.Solvent.Key))
	}
	b, err := json.MarshalIndent(out, "", "  ")
	if err != nil {
		return err
	}
	_, err = fmt.Fprintln(w, string(b))
	return err
}

// worstOf is the less trusted of two statuses, in the order of data.Statuses.
func worstOf(a, b string) string {
	rank := func(s string) int {
		for i, x := range data.Statuses {
			if x == s {
				return i
			}
		}
		return len(data.Statuses)
	}
	if rank(a) >= rank(b) {
		return a
	}
	return b
}

func writeWindowCSV(w io.Writer, r *windowRun) error {
	sfx := r.units.Suffix()
	en := func(v float64) string { return fnum(round(r.units.From(v))) }
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
	head := []string{"acid", "reductant", "electrode_v", "electrode_vs", "bdfe_eff_" + sfx, "sigma_" + sfx, "dg_" + sfx,
		"h2_margin_" + sfx, "room_to_acceptor_" + sfx, "room_to_h2_" + sfx, "electrode_h2_onset_v", "electrode_limit_v",
		"electrode_h2_onset_v_vs_h2", "electrode_limit_v_vs_h2", "status", "solvent", "acceptor", "sources"}
	if err := cw.Write(head); err != nil {
		return err
	}
	t := data.Neutralise
	for _, x := range r.rows() {
		a, d := r.acids[x.Acid], r.reds[x.Reductant]
		if err := cw.Write([]string{t(a.ID), t(d.ID), "", "", en(x.Donor.BDFE.Kcal), en(x.Donor.BDFE.Sigma()), en(x.DG.Kcal),
			en(x.Donor.Margin.Kcal), en(x.RoomToAcceptor), en(x.RoomToH2), "", "", "", "",
			worstOf(a.Status, d.Status), r.w.Solvent.Key, t(r.acc.ID), t(a.Source + "; " + d.Source)}); err != nil {
			return err
		}
	}
	for _, m := range r.electrodeRows() {
		a := r.acids[m.e.Acid]
		v := func(x float64) string { return fnum(round(x)) }
		if err := cw.Write([]string{t(a.ID), "", v(m.v), m.e.Ref.String(), en(m.bdfe), en(m.sigma), en(m.dg), en(m.h2),
			en(m.roomA), en(m.rH2), v(m.e.H2Onset), v(m.e.Limit), v(m.e.OnsetVsH2), v(m.e.LimitVsH2),
			a.Status, r.w.Solvent.Key, t(r.acc.ID), t(a.Source)}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

func writeWindowTable(w io.Writer, r *windowRun) error {
	u, ul := r.units, r.units.Label()
	win := r.w
	a := win.Acceptor
	p := data.Printable
	fmt.Fprintf(w, "acceptor %s (%s), BDFE %.1f ± %.1f %s in %s\n", p(r.acc.ID), p(nonEmptyStr(r.acc.Name, r.acc.Bond)),
		u.From(a.BDFE.Kcal), u.From(a.BDFE.Sigma()), ul, p(r.acc.Couple.Solvent.Key))
	fmt.Fprintf(w, "acids and reductants in %s | margin %+.1f %s\n", p(conditionsLine(r.cond, win.Solvent, u)), u.From(win.Margin), ul)
	fmt.Fprintf(w, "%d of %d acid + reductant combinations lie between the H2 line and the acceptor (ΔG° ≤ margin, not below the H2 line)\n",
		len(win.Rows), win.Considered)
	if r.inventedLeft > 0 {
		fmt.Fprintf(w, "%d invented acids and reductants of the demo left out (the acceptor is not invented)\n", r.inventedLeft)
	}
	if len(r.acids) == 0 || len(r.reds) == 0 {
		fmt.Fprintf(w, "the library has %d acids and %d reductants in %s: add them with -l FILE (see data/FORMAT.md)\n",
			len(r.acids), len(r.reds), win.Solvent.Key)
	}
	var buf bytes.Buffer
	tw := tabwriter.NewWriter(&buf, 2, 4, 2, ' ', 0)
	if len(win.Rows) > 0 {
		fmt.Fprintf(tw, "#\tacid\treductant\tBDFE_eff\tσ\tΔG°\troom to acceptor\troom to H2\tstatus\n")
		for i, x := range r.rows() {
			ac, d := r.acids[x.Acid], r.reds[x.Reductant]
			mark := ""
			if x.RoomToH2 < 0 {
				mark = " ▼ below H2"
			}
			fmt.Fprintf(tw, "%d\t%s\t%s\t%.1f\t%.1f\t%+.1f\t%.1f\t%.1f%s\t%s\n", i+1, p(ac.ID), p(d.ID), u.From(x.Donor.BDFE.Kcal),
				u.From(x.Donor.BDFE.Sigma()), u.From(x.DG.Kcal), u.From(x.RoomToAcceptor), u.From(x.RoomToH2), mark, worstOf(ac.Status, d.Status))
		}
		tw.Flush()
	}
	ems := r.electrodeRows()
	if len(ems) > 0 {
		fmt.Fprintf(&buf, "\nacid + electrode: the electrode delivers between the H2 onset and the limit (V vs %v; vs H2 = vs E°(H+/H2) in %s)\n",
			win.Solvent.Ref, win.Solvent.Key)
		tw = tabwriter.NewWriter(&buf, 2, 4, 2, ' ', 0)
		fmt.Fprintf(tw, "acid\tpKa\tH2 onset\tlimit\twidth\tonset vs H2\tlimit vs H2\n")
		for _, m := range ems {
			ac := r.acids[m.e.Acid]
			fmt.Fprintf(tw, "%s\t%.2f\t%+.3f\t%+.3f\t%.3f\t%+.3f\t%+.3f\n", p(ac.ID), ac.PKa.V, m.e.H2Onset, m.e.Limit, m.e.Width(),
				m.e.OnsetVsH2, m.e.LimitVsH2)
		}
		tw.Flush()
	}
	for _, line := range strings.Split(strings.TrimSuffix(buf.String(), "\n"), "\n") {
		if _, err := fmt.Fprintln(w, strings.TrimRight(line, " ")); err != nil {
			return err
		}
	}
	_, err := fmt.Fprintf(w, "energies in %s; rooms: how far below the acceptor and above the H2 line (C_G cancels in both)\n", ul)
	return err
}

// fnum writes a number in its shortest round-trip form.
func fnum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
