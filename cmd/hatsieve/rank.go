package main

import (
	"bufio"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
	"github.com/hatsieve/hatsieve/thermo"
)

// DefaultTop is how many pairs rank shows unless --top says otherwise.
const DefaultTop = 50

// evalConfig holds the options that choose a library and the conditions it
// is evaluated under; rank and the bare command share them.
type evalConfig struct {
	files   fileList
	c       common
	solvent string
	cross   bool
}

func (ec *evalConfig) register(fs *flag.FlagSet) {
	ec.files.register(fs)
	ec.c.register(fs)
	fs.StringVar(&ec.solvent, "solvent", "", "working solvent (default: the library's, else acetonitrile)")
	fs.BoolVar(&ec.cross, "cross", false, "also pair couples from other solvents (marked ×, with extra uncertainty)")
}

// evaluate loads the library and resolves it. Couples that cannot be
// resolved under the conditions are reported on stderr and left out.
func (ec *evalConfig) evaluate(e env) (*data.Evaluated, data.Options, thermo.Units, error) {
	// Check the usage of the common options before reading any file; --cg
	// is checked once the working solvent is known.
	early := ec.c
	early.cg = optFloat{}
	if _, _, err := early.conditions(nil); err != nil {
		return nil, data.Options{}, 0, err
	}
	lib, err := loadLibrary(e, ec.files)
	if err != nil {
		return nil, data.Options{}, 0, err
	}
	working, err := lib.WorkingSolvent(ec.solvent)
	if err != nil {
		return nil, data.Options{}, 0, fmt.Errorf("--solvent: %v", err)
	}
	cond, units, err := ec.c.conditions(working)
	if err != nil {
		return nil, data.Options{}, 0, err
	}
	eo := data.Options{Solvent: working.Key, Cross: ec.cross, Cond: cond}
	ev, err := data.Evaluate(lib, eo)
	if err != nil {
		return nil, eo, units, fmt.Errorf("--solvent %s: %v", working.Key, err)
	}
	var left capped
	for _, p := range ev.Problems {
		left.add(p.Couple.Pos.File, fmt.Sprintf("left out: %v", p))
	}
	for _, l := range left.result("couples left out") {
		fmt.Fprintln(e.stderr, "hatsieve: "+data.Printable(l))
	}
	return ev, eo, units, nil
}

// listFlag is a repeatable flag whose values may also be comma-separated.
type listFlag []string

func (l *listFlag) String() string { return strings.Join(*l, ",") }

func (l *listFlag) Set(s string) error {
	for _, p := range strings.Split(s, ",") {
		if p = strings.TrimSpace(p); p != "" {
			*l = append(*l, p)
		}
	}
	return nil
}

type rankConfig struct {
	evalConfig
	top          int
	sort         string
	h2           listFlag
	format       string
	out          string
	force        bool
	reverse      bool
	dgMin, dgMax optFloat
}

func (rc *rankConfig) register(fs *flag.FlagSet) {
	rc.evalConfig.register(fs)
	fs.IntVar(&rc.top, "top", DefaultTop, "show the best N pairs (0 for all)")
	fs.StringVar(&rc.sort, "sort", "dg", "sort by: "+strings.Join(thermo.MetricNames(), ", "))
	fs.Var(&rc.h2, "h2", "keep donors of this H2 tendency: downhill, near line, uphill (repeat or comma-list)")
	fs.StringVar(&rc.format, "format", "table", "output format: table, csv or json")
	fs.StringVar(&rc.out, "out", "", "write to FILE instead of stdout (refuses to overwrite without --force)")
	fs.BoolVar(&rc.force, "force", false, "with --out, replace an existing file")
	fs.BoolVar(&rc.reverse, "reverse", false, "reverse the sort order")
	fs.Var(&rc.dgMin, "dg-min", "keep pairs with ΔG° at or above this (in --units)")
	fs.Var(&rc.dgMax, "dg-max", "keep pairs with ΔG° at or below this (in --units)")
}

// options checks the ranking flags and turns them into thermo's options.
func (rc *rankConfig) options() (thermo.RankOptions, error) {
	var o thermo.RankOptions
	switch rc.format {
	case "table", "csv", "json":
	default:
		return o, usagef("rank: --format: want table, csv or json, got %q", rc.format)
	}
	if rc.top < 0 {
		return o, usagef("rank: --top: want 0 (all) or more, got %d", rc.top)
	}
	if rc.force && rc.out == "" {
		return o, usagef("rank: --force only applies with --out FILE")
	}
	m, err := thermo.ParseMetric(rc.sort)
	if err != nil {
		return o, usagef("rank: --sort: %v", err)
	}
	o.Sort, o.Reverse, o.Top = m, rc.reverse, rc.top
	for _, s := range rc.h2 {
		t, err := thermo.ParseTendency(s)
		if err != nil {
			return o, usagef("rank: --h2: %v", err)
		}
		o.Tendencies = append(o.Tendencies, t)
	}
	units, err := thermo.ParseUnits(rc.c.units)
	if err != nil {
		return o, usagef("--units: %v", err)
	}
	toKcal := func(v float64) *float64 {
		if units == thermo.KJ {
			v /= thermo.JoulePerCalorie
		}
		return &v
	}
	if rc.dgMin.set {
		o.DGMin = toKcal(rc.dgMin.v)
	}
	if rc.dgMax.set {
		o.DGMax = toKcal(rc.dgMax.v)
	}
	if rc.dgMin.set && rc.dgMax.set && rc.dgMin.v > rc.dgMax.v {
		return o, usagef("rank: --dg-min %g is above --dg-max %g", rc.dgMin.v, rc.dgMax.v)
	}
	return o, nil
}

// cmdRank ranks every donor × acceptor pair of the library.
func cmdRank(args []string, e env) error {
	fs := newFlagSet("rank")
	var rc rankConfig
	rc.register(fs)
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("rank: unexpected argument %q (library files go after --library or -l)", fs.Arg(0))
	}
	o, err := rc.options()
	if err != nil {
		return err
	}
	if err := checkOutPath(rc.out); err != nil {
		return err
	}
	ev, _, units, err := rc.evaluate(e)
	if err != nil {
		return err
	}
	if o.Top == 0 && ev.MorePairsThan(o, maxAllPairs) {
		return fmt.Errorf("rank: --top 0 would write more than %d pairs (%d donors × %d acceptors, %d pairs before the filters; some %s as CSV): give --top N, or narrow the list with --h2, --dg-min or --dg-max",
			maxAllPairs, len(ev.Donors), len(ev.Acceptors), len(ev.Donors)*len(ev.Acceptors), csvSizeOf(maxAllPairs))
	}
	pairs := ev.Rank(o)
	write := func(w io.Writer) error {
		if testWriteHook != nil {
			w = testWriteHook(w)
		}
		switch rc.format {
		case "csv":
			return data.WritePairsCSV(w, ev, pairs, units)
		case "json":
			return writePairsJSON(w, pairs, units, ev.Cond, ev.Working)
		}
		return writePairsTable(w, ev, pairs, units, o)
	}
	if rc.out == "" || rc.out == "-" {
		bw := bufio.NewWriterSize(e.stdout, 64<<10)
		if err := write(bw); err != nil {
			return err
		}
		return bw.Flush()
	}
	stop := onInterrupt(e, rc.out)
	defer stop()
	if err := atomicfile.Write(rc.out, rc.force, write); err != nil {
		if errors.Is(err, atomicfile.ErrExists) {
			return fmt.Errorf("rank: --out %s: file exists; not overwritten (add --force to replace it)", rc.out)
		}
		return fmt.Errorf("rank: --out %v", err)
	}
	return nil
}

// maxAllPairs is the most pairs 'rank --top 0' writes; a test lowers it.
var maxAllPairs = data.LargeExport

// csvSizeOf says about how large n pairs are as CSV.
func csvSizeOf(n int) string {
	mb := float64(n) * data.PairRowBytes / 1e6
	if mb >= 1000 {
		return fmt.Sprintf("%.0f GB", mb/1000)
	}
	return fmt.Sprintf("%.0f MB", mb)
}

// checkOutPath refuses an --out that cannot be written before any work is
// done: a folder, or a path inside a missing folder. "-" is standard
// output.
func checkOutPath(out string) error {
	if out == "" || out == "-" {
		return nil
	}
	if st, err := os.Stat(out); err == nil && st.IsDir() {
		return fmt.Errorf("rank: --out %s is a folder; give a file name (for example %s)", out, filepath.Join(out, "pairs.csv"))
	}
	if dir := filepath.Dir(out); dir != "" {
		if _, err := os.Stat(dir); errors.Is(err, fs.ErrNotExist) {
			return fmt.Errorf("rank: --out %s: folder %s does not exist (nothing written)", out, dir)
		}
	}
	return nil
}

// writePairsJSON writes the pairs as a JSON array, one object at a time;
// the first nine keys are the contract data/FORMAT.md gives (Exports).
func writePairsJSON(w io.Writer, pairs []thermo.Pair, u thermo.Units, c thermo.Conditions, working *thermo.Solvent) error {
	bw := bufio.NewWriterSize(w, 64<<10)
	bw.WriteString("[")
	for i, p := range pairs {
		if i > 0 {
			bw.WriteString(",")
		}
		b, err := json.MarshalIndent(pairRecord(p, u, c, working), "  ", "  ")
		if err != nil {
			return err
		}
		bw.WriteString("\n  ")
		bw.Write(b)
	}
	if len(pairs) > 0 {
		bw.WriteString("\n")
	}
	bw.WriteString("]\n")
	return bw.Flush()
}

// pairRecord is one pair as rank's JSON writes it, numbers rounded by
// data.Round (pair adds its own keys). The nine contract keys come first;
// the keys after them are added at the end only, so that a reader of an
// older output still finds every key it knew where it was.
func pairRecord(p thermo.Pair, u thermo.Units, c thermo.Conditions, working *thermo.Solvent) object {
	sfx := u.Suffix()
	en := func(v float64) float64 { return round(u.From(v)) }
	d, a := p.Donor, p.Acceptor
	o := object{}.
		add("donor", d.Couple.ID).
		add("acceptor", a.Couple.ID).
		add("dg_"+sfx, en(p.DG.Kcal)).
		add("sigma_"+sfx, en(p.DG.Sigma())).
		add("log10_k", round(p.Log10K)).
		add("donor_bdfe_"+sfx, en(d.BDFE.Kcal)).
		add("acceptor_bdfe_"+sfx, en(a.BDFE.Kcal)).
		add("donor_h2_margin_"+sfx, en(d.Margin.Kcal)).
		add("h2_tendency", d.Tendency.String()).
		add("donor_bdfe_sigma_"+sfx, en(d.BDFE.Sigma())).
		add("acceptor_bdfe_sigma_"+sfx, en(a.BDFE.Sigma())).
		add("h2_wins", p.H2Wins).
		add("cross_solvent", p.CrossSolvent).
		add("donor_route", d.Route.String()).
		add("acceptor_route", a.Route.String()).
		add("donor_solvent", d.Couple.Solvent.Key).
		add("acceptor_solvent", a.Couple.Solvent.Key).
		add("p_h2_atm", c.PH2Atm()).
		add("c_g_basis", c.BasisLabel(working)).
		add("on_estimate", p.OnEstimate(c)).
		add("notes", strings.Join(p.Notes(c), "; "))
	return o
}

// writePairsTable writes the ranked pairs as an aligned text table under a
// line that names the conditions.
func writePairsTable(w io.Writer, ev *data.Evaluated, pairs []thermo.Pair, u thermo.Units, o thermo.RankOptions) error {
	ul := u.Label()
	lib := strings.Join(ev.Lib.Titles, " + ")
	if lib == "" {
		lib = strings.Join(ev.Lib.Files, ", ")
	}
	// Text from the library goes through the one sanitiser: this table is
	// for a terminal (the CSV and JSON keep the text as written).
	fmt.Fprintf(w, "library: %s\n", data.Printable(lib))
	order := "best first"
	if o.Reverse {
		order = "reversed"
	}
	other := ""
	if hasOtherSolvents(ev) {
		other = " | + couples of other solvents (× pairs)"
	}
	fmt.Fprintf(w, "solvent %s%s | %d donors, %d acceptors | sorted by %v, %s\n",
		data.Printable(conditionsLine(ev.Cond, ev.Working, u)), other, len(ev.Donors), len(ev.Acceptors), o.Sort, order)
	if len(pairs) == 0 {
		_, err := fmt.Fprintln(w, "no pairs (no donor and acceptor pass the filters)")
		return err
	}
	rows := tableRows{pairs: pairs, u: u, cond: ev.Cond}
	if err := rows.write(w); err != nil {
		return err
	}
	legend := rows.legend
	notes := []string{"energies in " + ul}
	if legend[0] {
		notes = append(notes, "× cross-solvent pair")
	}
	if legend[1] {
		notes = append(notes, "! a cycle does not close (routes disagree)")
	}
	if legend[2] {
		notes = append(notes, "H2: acceptor below the H2 line, H2 formation wins")
	}
	if legend[3] {
		notes = append(notes, "est: the verdict rests on an estimated constant (see 'hatsieve solvents')")
	}
	_, err := fmt.Fprintln(w, strings.Join(notes, "; "))
	return err
}

// conditionsLine is thermo.ConditionsText with the H2 pressure always
// said, also at the standard 1 atm (ConditionsText names only another one).
func conditionsLine(c thermo.Conditions, s *thermo.Solvent, u thermo.Units) string {
	text := thermo.ConditionsText(c, s, u)
	if c.PH2Atm() != thermo.StandardH2Pressure {
		return text
	}
	p := fmt.Sprintf("p(H2) %g atm", c.PH2Atm())
	t := " · " + thermo.TemperatureText(c)
	if i := strings.Index(text, t); i >= 0 {
		return text[:i] + " · " + p + text[i:]
	}
	return text + " · " + p
}

// tableRows writes the pairs as aligned columns. The cells of a row are
// made twice, once to measure each column and once to write it, so the
// table holds no more than one row at a time however many pairs it shows.
type tableRows struct {
	pairs  []thermo.Pair
	u      thermo.Units
	cond   thermo.Conditions
	legend [4]bool // ×, !, H2 and est flags seen
}

var tableHeader = []string{"#", "donor", "acceptor", "ΔG°", "σ", "log K", "BDFE(D)", "BDFE(A)", "H2 margin(D)", "H2 tendency", "flags"}

// cells makes row i's cells into buf. Numbers are data.Round's values,
// shown to one decimal (energies) or two (log K).
func (t *tableRows) cells(i int, buf []string) []string {
	p, u := t.pairs[i], t.u
	d, a := p.Donor, p.Acceptor
	var flags []string
	if p.CrossSolvent {
		flags, t.legend[0] = append(flags, "×"), true
	}
	if d.Closure != nil || a.Closure != nil {
		flags, t.legend[1] = append(flags, "!"), true
	}
	if p.H2Wins {
		flags, t.legend[2] = append(flags, "H2"), true
	}
	if p.OnEstimate(t.cond) {
		flags, t.legend[3] = append(flags, "est"), true
	}
	f := func(format string, v float64) string { return fmt.Sprintf(format, round(v)) }
	return append(buf[:0], strconv.Itoa(i+1), data.Printable(d.Couple.ID), data.Printable(a.Couple.ID),
		f("%+.1f", u.From(p.DG.Kcal)), f("%.1f", u.From(p.DG.Sigma())), f("%.2f", p.Log10K),
		f("%.1f", u.From(d.BDFE.Kcal)), f("%.1f", u.From(a.BDFE.Kcal)), f("%+.1f", u.From(d.Margin.Kcal)),
		d.Tendency.Symbol()+" "+d.Tendency.String(), strings.Join(flags, " "))
}

// write writes the header and the rows, each column as wide as its widest
// cell and two spaces, with no spaces at the end of a line.
func (t *tableRows) write(w io.Writer) error {
	width := make([]int, len(tableHeader))
	measure := func(cells []string) {
		for c, cell := range cells {
			width[c] = max(width[c], utf8.RuneCountInString(cell))
		}
	}
	measure(tableHeader)
	var buf []string
	for i := range t.pairs {
		buf = t.cells(i, buf)
		measure(buf)
	}
	bw := bufio.NewWriterSize(w, 64<<10)
	var line strings.Builder
	put := func(cells []string) {
		line.Reset()
		for c, cell := range cells {
			line.WriteString(cell)
			if c < len(cells)-1 {
				line.WriteString(strings.Repeat(" ", width[c]-utf8.RuneCountInString(cell)+2))
			}
		}
		bw.WriteString(strings.TrimRight(line.String(), " "))
		bw.WriteByte('\n')
	}
	put(tableHeader)
	for i := range t.pairs {
		buf = t.cells(i, buf)
		put(buf)
	}
	return bw.Flush()
}

func hasOtherSolvents(ev *data.Evaluated) bool {
	for _, e := range ev.All {
		if e.R.Couple.Solvent != ev.Working {
			return true
		}
	}
	return false
}
