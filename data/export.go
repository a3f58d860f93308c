package data

import (
	"bufio"
	"io"
	"iter"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/hatsieve/hatsieve/thermo"
)

// PairColumns returns the CSV header for pairs in units u. Energy columns end
// in the unit (dg_kcal_mol or dg_kj_mol). The first nine are the keys of
// 'hatsieve rank --format json'.
func PairColumns(u thermo.Units) []string {
	s := u.Suffix()
	return []string{
		"donor", "acceptor", "dg_" + s, "sigma_" + s, "log10_k",
		"donor_bdfe_" + s, "acceptor_bdfe_" + s, "donor_h2_margin_" + s, "h2_tendency",
		"donor_bdfe_sigma_" + s, "acceptor_bdfe_sigma_" + s, "donor_h2_margin_sigma_" + s,
		"acceptor_h2_margin_" + s, "h2_wins", "cross_solvent",
		"dg_pt_first_" + s, "dg_et_first_" + s,
		"donor_route", "acceptor_route", "donor_cycle_closes", "acceptor_cycle_closes",
		"donor_solvent", "acceptor_solvent", "h2_line_" + s, "c_g_basis", "c_g_" + s, "c_g_ref",
		"temperature_k", "faraday_" + s + "_per_v", "rt_ln10_" + s,
		"donor_name", "acceptor_name", "donor_status", "acceptor_status", "donor_source", "acceptor_source",
		"p_h2_atm", "on_estimate", "notes", "bdfe_temperature_k",
	}
}

// WritePairsCSV writes pairs as CSV (RFC 4180, UTF-8, CRLF line ends): a
// header row whose names carry units, then one self-contained row per pair
// with the solvents, the H2 line, the C_G basis and value, the temperature
// and the constants F and 2.303RT used. Numbers are rounded by Round; text
// cells that a spreadsheet would read as a formula are neutralised with a
// leading apostrophe.
func WritePairsCSV(w io.Writer, ev *Evaluated, pairs []thermo.Pair, u thermo.Units) error {
	return WritePairsCSVSeq(w, ev, slices.Values(pairs), u)
}

// WritePairsCSVSeq is WritePairsCSV for pairs that come one at a time: each
// row is written as its pair comes, through a 64 kB buffer, so the memory
// it holds does not grow with the number of pairs.
func WritePairsCSVSeq(w io.Writer, ev *Evaluated, pairs iter.Seq[thermo.Pair], u thermo.Units) error {
	cw := newCSVWriter(w)
	if err := cw.Write(PairColumns(u)); err != nil {
		return err
	}
	t := ev.Cond.T()
	faraday, rtln10 := num(u.From(thermo.FaradayKcal)), num(u.From(thermo.RTLn10(t)))
	type solventInfo struct{ h2, cg, ref string }
	info := map[*thermo.Solvent]solventInfo{}
	solv := func(s *thermo.Solvent) solventInfo {
		if si, ok := info[s]; ok {
			return si
		}
		var si solventInfo
		if gh, err := ev.Cond.H2LineOf(s); err == nil {
			si.h2 = num(u.From(gh.V))
		}
		if cg, err := ev.Cond.CGOf(s); err == nil {
			si.cg, si.ref = num(u.From(cg.V)), s.Ref.String()
		}
		info[s] = si
		return si
	}
	e := func(v float64) string { return num(u.From(v)) }
	opt := func(p *float64) string {
		if p == nil {
			return ""
		}
		return e(*p)
	}
	row := make([]string, 0, len(PairColumns(u)))
	for p := range pairs {
		d, a := p.Donor, p.Acceptor
		ds := solv(d.Couple.Solvent)
		de, ae := ev.Entry(d.Couple), ev.Entry(a.Couple)
		row = append(row[:0],
			Neutralise(d.Couple.ID), Neutralise(a.Couple.ID), e(p.DG.Kcal), e(p.DG.Sigma()), num(p.Log10K),
			e(d.BDFE.Kcal), e(a.BDFE.Kcal), e(d.Margin.Kcal), d.Tendency.String(),
			e(d.BDFE.Sigma()), e(a.BDFE.Sigma()), e(d.Margin.Sigma()),
			e(a.Margin.Kcal), strconv.FormatBool(p.H2Wins), strconv.FormatBool(p.CrossSolvent),
			opt(p.PTFirst), opt(p.ETFirst),
			d.Route.String(), a.Route.String(), strconv.FormatBool(d.Closure == nil), strconv.FormatBool(a.Closure == nil),
			Neutralise(d.Couple.Solvent.Key), Neutralise(a.Couple.Solvent.Key), ds.h2, ev.Cond.BasisLabel(d.Couple.Solvent), ds.cg, ds.ref,
			num(t), faraday, rtln10,
			Neutralise(d.Couple.Name), Neutralise(a.Couple.Name),
			Neutralise(status(de)), Neutralise(status(ae)), Neutralise(source(de)), Neutralise(source(ae)),
			num(ev.Cond.PH2Atm()), strconv.FormatBool(p.OnEstimate(ev.Cond)),
			Neutralise(strings.Join(p.Notes(ev.Cond), "; ")), num(thermo.BDFETemperature),
		)
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	return cw.Flush()
}

// needsQuotes reports whether a cell must be quoted: it holds a comma, a
// quote, a CR or an LF, or starts with a space or a tab.
func needsQuotes(f string) bool {
	if f == "" {
		return false
	}
	if f[0] == ' ' || f[0] == '\t' {
		return true
	}
	for i := 0; i < len(f); i++ {
		switch f[i] {
		case ',', '"', '\r', '\n':
			return true
		}
	}
	return false
}

// csvWriter writes RFC 4180 records with CRLF line ends. Unlike
// encoding/csv with UseCRLF, which drops a lone carriage return inside a
// cell, it keeps every cell's text exactly: a cell holding a comma, a
// quote, a CR or an LF, or starting with a space, is quoted, and its quotes
// doubled.
type csvWriter struct {
	w   *bufio.Writer
	err error
}

func newCSVWriter(w io.Writer) *csvWriter { return &csvWriter{w: bufio.NewWriterSize(w, 64<<10)} }

func (c *csvWriter) Write(rec []string) error {
	if c.err != nil {
		return c.err
	}
	for i, f := range rec {
		if i > 0 {
			c.w.WriteByte(',')
		}
		if !needsQuotes(f) {
			c.w.WriteString(f)
			continue
		}
		c.w.WriteByte('"')
		for {
			j := strings.IndexByte(f, '"')
			if j < 0 {
				break
			}
			c.w.WriteString(f[:j+1])
			c.w.WriteByte('"')
			f = f[j+1:]
		}
		c.w.WriteString(f)
		c.w.WriteByte('"')
	}
	_, c.err = c.w.WriteString("\r\n")
	return c.err
}

func (c *csvWriter) Flush() error {
	if c.err != nil {
		return c.err
	}
	return c.w.Flush()
}

func status(e *Entry) string {
	if e == nil {
		return ""
	}
	return e.Status
}

func source(e *Entry) string {
	if e == nil {
		return ""
	}
	return e.Source
}

// Decimals is how many decimals every number hatsieve writes to CSV and JSON
// keeps (data/FORMAT.md, Numbers): 10^-4 kcal/mol, kJ/mol, V or log10 K is
// finer than any input's precision, and the rounding removes float noise
// such as 73.10000000000001. The table rounds the same values further for
// reading (one decimal for energies, two for log10 K).
const Decimals = 4

// Round rounds v to Decimals decimals (half away from zero).
func Round(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return v
	}
	r := math.Round(v*1e4) / 1e4
	if r == 0 {
		return 0 // no "-0"
	}
	return r
}

// FormatNumber writes v rounded by Round, in the shortest decimal form that
// reads back as the rounded value ("73.1", "-0.0001", "298.15").
func FormatNumber(v float64) string { return strconv.FormatFloat(Round(v), 'f', -1, 64) }

func num(v float64) string { return FormatNumber(v) }

// Neutralise makes a text cell safe to open in a spreadsheet: a cell that
// begins with = + - @ tab or carriage return is prefixed with an apostrophe,
// so it is shown as text rather than run as a formula.
func Neutralise(s string) string {
	if s != "" && strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return "'" + s
	}
	return s
}
