package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/plot/vg"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/figure"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
	"github.com/hatsieve/hatsieve/thermo"
	"github.com/hatsieve/hatsieve/tui"
)

// DefaultMapTop is how many donors and acceptors figure map draws unless
// --top says otherwise: a grid a slide holds with every value legible (on
// a smaller page, fewer, as many as stay legible).
const DefaultMapTop = 20

// DefaultLadderMax is how many couples a side figure ladder draws unless
// --max says otherwise: labels a slide shows at 10 pt, mostly beside their
// ticks.
const DefaultLadderMax = 20

// figureUsage is the usage of figure and of its two figures.
var figureUsage = map[string]string{
	"": `usage:
  hatsieve figure ladder [-l FILE]... [--solvent S] [--max N] [--pick span|h2] -o FILE.svg|.png [--force]
  hatsieve figure map [-l FILE]... [--solvent S] [--top N] [--sort METRIC] [--shortlist FILE|saved] -o FILE.svg|.png [--force]

Writes a figure for a slide or a paper: "ladder", the BDFE scale with the H2 line across, or "map",
donors × acceptors coloured by ΔG°(HAT). The extension of --out (-o) picks SVG or PNG; the page is a
16:9 slide (--width 25.4cm --height 14.29cm) unless told otherwise. Each figure takes --help.
`,
	"ladder": `usage:
  hatsieve figure ladder [-l FILE]... [--solvent S] [--max N] [--pick span|h2] -o FILE.svg|.png [--force]
        [--width 25.4cm --height 14.29cm] [--dpi 192] [--title TEXT] [--p-h2 ATM] [--cg-basis 2010|2022]

The BDFE ladder: donors left, acceptors right, each couple a tick with its id, BDFE and ±1σ bar, the
H2 line across at the H2 pressure in force. --max N (default 20) draws at most N couples a side, chosen
by --pick: "span" (default) spans the BDFE range (the weakest and strongest bonds, the one nearest the
H2 line, then each next the one furthest from those shown), "h2" takes those nearest the H2 line; the
caption says how many of how many. --max 0 draws every couple, or fails when the page cannot hold them.
`,
	"map": `usage:
  hatsieve figure map [-l FILE]... [--solvent S] [--top N] [--sort METRIC] [--h2 TENDENCY] [--dg-min X]
        [--dg-max X] [--shortlist FILE|saved] -o FILE.svg|.png [--force] [--width W --height H] [--dpi 192]

The pairing map: donors × acceptors coloured by ΔG°(HAT), rows and columns in order of BDFE. --top N
(default 20, fewer when the page cannot hold 20 legibly) draws N donors and N acceptors spanning the
BDFE range, or with --sort those of the best pairs; a shortlist's couples are drawn first and its
pairs framed. The caption says how many of how many.
`,
}

// figureHelp writes the usage of figure name, then the options that
// parse wrote to opts (without its own usage lines).
func figureHelp(e env, name, opts string) {
	if i := strings.Index(opts, "\noptions:\n"); i >= 0 {
		opts = opts[i:]
	} else {
		opts = ""
	}
	fmt.Fprint(e.stdout, figureUsage[name]+opts)
}

// parseFigure parses the options of figure name; --help prints its usage.
func parseFigure(fs *flag.FlagSet, name string, args []string, e env) error {
	var opts bytes.Buffer
	pe := e
	pe.stdout = &opts
	err := parse(fs, args, pe)
	if errors.Is(err, flag.ErrHelp) {
		figureHelp(e, name, opts.String())
	}
	return err
}

// cmdFigure writes a figure: the BDFE ladder or the pairing map.
func cmdFigure(args []string, e env) error {
	if len(args) > 0 && (args[0] == "-h" || args[0] == "--help" || args[0] == "-help") {
		figureHelp(e, "", "")
		return flag.ErrHelp
	}
	if len(args) == 0 || strings.HasPrefix(args[0], "-") {
		return usagef("figure: name the figure: ladder or map (e.g. hatsieve figure ladder -o ladder.svg)")
	}
	switch args[0] {
	case "ladder":
		return figureLadder(args[1:], e)
	case "map":
		return figureMap(args[1:], e)
	}
	return usagef("figure: unknown figure %q (want ladder or map)", args[0])
}

// lengthFlag is a page length with its unit: 16cm, 160mm, 6in, 432pt.
type lengthFlag struct {
	v   vg.Length
	set bool
}

func (l *lengthFlag) String() string {
	if !l.set {
		return ""
	}
	return fmt.Sprintf("%.4gcm", l.v/vg.Centimeter)
}

func (l *lengthFlag) Set(s string) error {
	s = strings.ToLower(strings.TrimSpace(s))
	units := map[string]vg.Length{"cm": vg.Centimeter, "mm": vg.Millimeter, "in": vg.Inch, "pt": 1}
	for sfx, u := range units {
		if num, ok := strings.CutSuffix(s, sfx); ok {
			v, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
			if err != nil || !(v > 0) || v > 1e4 {
				return fmt.Errorf("want a positive length such as 16cm or 6in, got %q", s)
			}
			l.v, l.set = vg.Length(v)*u, true
			return nil
		}
	}
	return fmt.Errorf("want a length with its unit (cm, mm, in or pt), such as 16cm or 6in, got %q", s)
}

// figOut holds the options of the file a figure is written to.
type figOut struct {
	out           string
	force         bool
	width, height lengthFlag
	dpi           int
	title         string
}

func (f *figOut) register(fs *flag.FlagSet) {
	fs.StringVar(&f.out, "o", "", "write the figure to FILE; .svg or .png picks the format (refuses to overwrite without --force)")
	fs.StringVar(&f.out, "out", "", "same as -o")
	fs.BoolVar(&f.force, "force", false, "replace an existing file")
	fs.Var(&f.width, "width", "page width with its unit, e.g. 16cm or 6in (default 25.4cm, a 16:9 slide)")
	fs.Var(&f.height, "height", "page height with its unit (default 14.29cm)")
	fs.IntVar(&f.dpi, "dpi", figure.DefaultDPI, "dots per inch of a PNG (the default page is then 1920×1080)")
	fs.StringVar(&f.title, "title", "", "the figure's title (default: names the figure and the solvent)")
}

// check validates the options before any file is read.
func (f *figOut) check(name string) (string, figure.Page, error) {
	if f.out == "" {
		return "", figure.Page{}, usagef("figure %s: -o FILE is required (.svg or .png)", name)
	}
	format, err := figure.FormatOf(f.out)
	if err != nil {
		return "", figure.Page{}, usagef("figure %s: -o: %v", name, err)
	}
	pg := figure.Page{Width: f.width.v, Height: f.height.v, DPI: f.dpi}
	if f.dpi < 30 || f.dpi > 1200 {
		return "", pg, usagef("figure %s: --dpi: want 30 to 1200, got %d", name, f.dpi)
	}
	for _, l := range []struct {
		flag string
		v    lengthFlag
	}{{"--width", f.width}, {"--height", f.height}} {
		if l.v.set && (l.v.v < 5*vg.Centimeter || l.v.v > 100*vg.Centimeter) {
			return "", pg, usagef("figure %s: %s: want 5cm to 100cm, got %s", name, l.flag, l.v.String())
		}
	}
	return format, pg, nil
}

// write writes the figure atomically, as every export is.
func (f *figOut) write(e env, name string, draw func(io.Writer) error) error {
	stop := onInterrupt(e, f.out)
	defer stop()
	if err := atomicfile.Write(f.out, f.force, draw); err != nil {
		var tm *figure.TooManyError
		if errors.As(err, &tm) {
			return err
		}
		if errors.Is(err, figure.ErrTooSmall) {
			return usagef("figure %s: --width/--height: %v", name, err)
		}
		if errors.Is(err, atomicfile.ErrExists) {
			return fmt.Errorf("figure %s: -o %s: file exists; not overwritten (add --force to replace it)", name, f.out)
		}
		return fmt.Errorf("figure %s: -o %v", name, err)
	}
	return nil
}

func figureLadder(args []string, e env) error {
	fs := newFlagSet("figure ladder")
	var ec evalConfig
	var fo figOut
	ec.register(fs)
	fo.register(fs)
	maxN := fs.Int("max", DefaultLadderMax, "draw at most N donors and N acceptors, chosen by --pick (0: all, or fail when the page cannot hold them)")
	pickName := fs.String("pick", "span", "which couples --max keeps: span (the BDFE range, with the one nearest the H2 line) or h2 (those nearest the H2 line)")
	if err := parseFigure(fs, "ladder", args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("figure ladder: unexpected argument %q (library files go after -l)", fs.Arg(0))
	}
	if *maxN < 0 {
		return usagef("figure ladder: --max: want 0 (all) or more, got %d", *maxN)
	}
	picks := map[string]figure.Pick{"span": figure.PickSpan, "h2": figure.PickNearH2}
	pick, ok := picks[*pickName]
	if !ok {
		return usagef("figure ladder: --pick: want span or h2, got %q", *pickName)
	}
	strict := false
	fs.Visit(func(f *flag.Flag) { strict = strict || f.Name == "max" })
	format, pg, err := fo.check("ladder")
	if err != nil {
		return err
	}
	ev, _, units, err := ec.evaluate(e)
	if err != nil {
		return err
	}
	if len(ev.Donors)+len(ev.Acceptors) == 0 {
		return fmt.Errorf("figure ladder: no couple resolves under these conditions; nothing to draw")
	}
	in := figure.LadderFrom(ev, units, *maxN, pick)
	in.Page, in.Strict = pg, strict
	if fo.title != "" {
		in.Title = fo.title
	}
	err = fo.write(e, "ladder", func(w io.Writer) error { return figure.Ladder(w, format, in) })
	var tm *figure.TooManyError
	if errors.As(err, &tm) {
		return usagef("figure ladder: --max %d: %v; give --max %d or a taller --height", *maxN, tm, tm.Fit)
	}
	return err
}

// mapConfig holds figure map's options: rank's filters and sort choose
// the couples drawn.
type mapConfig struct {
	rankConfig
	fo        figOut
	top       int
	ranked    bool // --sort given: the couples of the best pairs
	shortlist string
}

func (mc *mapConfig) register(fs *flag.FlagSet) {
	rc := &mc.rankConfig
	rc.evalConfig.register(fs)
	mc.fo.register(fs)
	fs.IntVar(&mc.top, "top", DefaultMapTop, fmt.Sprintf("draw N donors and N acceptors (at most %d; 0 for all): spanning the BDFE range, or with --sort those of the best pairs (default: fewer when the page cannot hold 20 legibly)", figure.MaxMapSide))
	fs.StringVar(&rc.sort, "sort", "dg", "take the couples of the best pairs by: "+strings.Join(thermo.MetricNames(), ", "))
	fs.BoolVar(&rc.reverse, "reverse", false, "reverse the sort order")
	fs.Var(&rc.h2, "h2", "keep donors of this H2 tendency: downhill, near line, uphill (repeat or comma-list)")
	fs.Var(&rc.dgMin, "dg-min", "keep couples of pairs with ΔG° at or above this (in --units)")
	fs.Var(&rc.dgMax, "dg-max", "keep couples of pairs with ΔG° at or below this (in --units)")
	fs.StringVar(&mc.shortlist, "shortlist", "", "mark the pairs of a shortlist saved by the screens: a FILE, or \"saved\" for this library's")
}

func figureMap(args []string, e env) error {
	fs := newFlagSet("figure map")
	var mc mapConfig
	mc.register(fs)
	if err := parseFigure(fs, "map", args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("figure map: unexpected argument %q (library files go after -l)", fs.Arg(0))
	}
	if mc.top < 0 || mc.top > figure.MaxMapSide {
		return usagef("figure map: --top: want 0 (all) to %d, got %d", figure.MaxMapSide, mc.top)
	}
	topGiven := false
	fs.Visit(func(f *flag.Flag) {
		mc.ranked = mc.ranked || f.Name == "sort" || f.Name == "reverse"
		topGiven = topGiven || f.Name == "top"
	})
	mc.format = "table"
	o, err := mc.options()
	if err != nil {
		return err
	}
	format, pg, err := mc.fo.check("map")
	if err != nil {
		return err
	}
	ev, _, units, err := mc.evaluate(e)
	if err != nil {
		return err
	}
	marks, err := mc.marks(ev)
	if err != nil {
		return err
	}
	in, err := mc.build(ev, marks, o, units, pg, topGiven)
	if err != nil {
		return err
	}
	if off := len(marks) - len(in.Marked); off > 0 {
		fmt.Fprintf(e.stderr, "hatsieve: figure map: %d shortlisted pairs are not on the map (their couples are not drawn)\n", off)
	}
	return mc.fo.write(e, "map", func(w io.Writer) error { return figure.Map(w, format, in) })
}

// build chooses the map's couples and builds its input. Unless --top was
// given, the default shrinks until the page holds the map legibly.
func (mc *mapConfig) build(ev *data.Evaluated, marks map[figure.Mark]bool, o thermo.RankOptions, units thermo.Units, pg figure.Page, topGiven bool) (figure.MapInput, error) {
	keep := map[string]bool{}
	for m := range marks {
		keep[m.Donor], keep[m.Acceptor] = true, true
	}
	var in figure.MapInput
	for n := mc.top; ; n-- {
		sel := figure.MapSelect{N: n, Ranked: mc.ranked, Rank: o, Keep: keep}
		donors, acceptors := figure.MapCouples(ev, sel)
		if len(donors) == 0 || len(acceptors) == 0 {
			return in, fmt.Errorf("figure map: no pair passes the filters; nothing to draw")
		}
		if n := max(len(donors), len(acceptors)); n > figure.MaxMapSide {
			return in, usagef("figure map: %d donors and %d acceptors pass the filters; a map draws at most %d of each: give --top N",
				len(donors), len(acceptors), figure.MaxMapSide)
		}
		in = figure.MapOf(ev, donors, acceptors, marks, units)
		in.Page = pg
		if mc.fo.title != "" {
			in.Title = mc.fo.title
		}
		mc.caption(&in, ev, o, len(keep) > 0)
		if topGiven || n <= 4 || figure.MapReadable(in) {
			return in, nil
		}
	}
}

// caption says how many couples of how many the map draws, and how they
// were chosen.
func (mc *mapConfig) caption(in *figure.MapInput, ev *data.Evaluated, o thermo.RankOptions, kept bool) {
	d, a := len(in.Donors), len(in.Acceptors)
	if d == len(ev.Donors) && a == len(ev.Acceptors) {
		return
	}
	how := "chosen " + figure.PickSpan.Rule()
	if mc.ranked {
		how = fmt.Sprintf("the couples of the best pairs as rank --sort %v orders them", o.Sort)
	}
	if kept {
		how = "the shortlisted pairs' couples first, then " + how
	}
	if len(o.Tendencies) > 0 || o.DGMin != nil || o.DGMax != nil {
		how += ", among those that pass the filters"
	}
	in.Caption += fmt.Sprintf(" Shown: %d of %d donors and %d of %d acceptors, %s.", d, len(ev.Donors), a, len(ev.Acceptors), how)
}

// marks reads the shortlist named by --shortlist, if any.
func (mc *mapConfig) marks(ev *data.Evaluated) (map[figure.Mark]bool, error) {
	path := mc.shortlist
	switch path {
	case "":
		return nil, nil
	case "saved":
		dir, err := tui.StateDir()
		if err != nil {
			return nil, fmt.Errorf("figure map: --shortlist saved: %v", err)
		}
		path = filepath.Join(dir, "shortlist-"+tui.LibraryKey(ev.Lib)+".json")
		if _, err := os.Stat(path); errors.Is(err, os.ErrNotExist) {
			return nil, fmt.Errorf("figure map: --shortlist saved: the screens have saved no shortlist for this library (%s)", path)
		}
	}
	m, err := readShortlist(path)
	if err != nil {
		return nil, fmt.Errorf("figure map: --shortlist %s: %v", path, err)
	}
	return m, nil
}

// shortlistFile is the shortlist the screens save (format
// hatsieve-shortlist/1): the library's files and titles, and the marked
// pairs by their couples' ids.
type shortlistFile struct {
	Format string   `json:"format"`
	Files  []string `json:"files"`
	Titles []string `json:"titles"`
	Marks  []struct {
		Donor    string `json:"donor"`
		Acceptor string `json:"acceptor"`
	} `json:"marks"`
}

// readShortlist reads a saved shortlist; it never changes the file.
func readShortlist(path string) (map[figure.Mark]bool, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, errors.Unwrap(err)
	}
	if !st.Mode().IsRegular() {
		return nil, fmt.Errorf("not a regular file")
	}
	if st.Size() > 16<<20 {
		return nil, fmt.Errorf("%d bytes, more than a shortlist holds", st.Size())
	}
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, errors.Unwrap(err)
	}
	var f shortlistFile
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&f); err != nil {
		return nil, fmt.Errorf("not a shortlist: %v", err)
	}
	if f.Format != "hatsieve-shortlist/1" {
		return nil, fmt.Errorf("format %q, want \"hatsieve-shortlist/1\"", f.Format)
	}
	out := make(map[figure.Mark]bool, len(f.Marks))
	for i, m := range f.Marks {
		if m.Donor == "" || m.Acceptor == "" {
			return nil, fmt.Errorf("mark %d names no donor or no acceptor", i+1)
		}
		out[figure.Mark{Donor: m.Donor, Acceptor: m.Acceptor}] = true
	}
	return out, nil
}
