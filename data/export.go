package data

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
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
	}
}

// WritePairsCSV writes pairs as CSV (RFC 4180, UTF-8, CRLF line ends): a
// header row whose names carry units, then one self-contained row per pair
// with the solvents, the H2 line, the C_G basis and value, the temperature
// and the constants F and 2.303RT used. Numbers are written in their
// shortest round-trip form; text cells that a spreadsheet would read as a
// formula are neutralised with a leading apostrophe.
func WritePairsCSV(w io.Writer, ev *Evaluated, pairs []thermo.Pair, u thermo.Units) error {
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
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
	for _, p := range pairs {
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
			Neutralise(d.Couple.Solvent.Key), Neutralise(a.Couple.Solvent.Key), ds.h2, ev.Cond.Basis.String(), ds.cg, ds.ref,
			num(t), faraday, rtln10,
			Neutralise(d.Couple.Name), Neutralise(a.Couple.Name),
			Neutralise(status(de)), Neutralise(status(ae)), Neutralise(source(de)), Neutralise(source(ae)),
		)
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
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

// num writes a number in its shortest round-trip form ("-1.25", "1e-07").
func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// Neutralise makes a text cell safe to open in a spreadsheet: a cell that
// begins with = + - @ tab or carriage return is prefixed with an apostrophe,
// so it is shown as text rather than run as a formula.
func Neutralise(s string) string {
	if s != "" && strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return "'" + s
	}
	return s
}

// ErrExists is returned by WriteFileAtomic for a file that exists when
// overwriting was not allowed.
var ErrExists = errors.New("file exists; not overwritten")

// WriteFileAtomic writes a file through a temporary file in the same folder,
// then renames it into place, so an interrupted write leaves any old file
// whole. Without force an existing file is refused (ErrExists); a missing
// folder is an error, never created.
func WriteFileAtomic(path string, force bool, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	switch {
	case os.IsNotExist(err):
		return fmt.Errorf("%s: folder %s does not exist", path, dir)
	case err != nil:
		return fmt.Errorf("%s: %v", path, err)
	case !st.IsDir():
		return fmt.Errorf("%s: %s is not a folder", path, dir)
	}
	mode := os.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		if fi.IsDir() {
			return fmt.Errorf("%s is a folder", path)
		}
		if !force {
			return fmt.Errorf("%s: %w", path, ErrExists)
		}
		mode = fi.Mode().Perm()
	}
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	bw := bufio.NewWriter(tmp)
	if err = write(bw); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if err = bw.Flush(); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if err = tmp.Chmod(mode); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if force {
		if err = os.Rename(tmp.Name(), path); err != nil {
			return fmt.Errorf("%s: %v", path, err)
		}
		return nil
	}
	// Without force, a hard link refuses to replace a file that appeared
	// since the check above; where links are not supported, rename.
	if lerr := os.Link(tmp.Name(), path); lerr == nil {
		os.Remove(tmp.Name())
		return nil
	} else if _, serr := os.Lstat(path); serr == nil {
		err = fmt.Errorf("%s: %w", path, ErrExists)
		return err
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	return nil
}
