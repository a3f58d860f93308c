package data

import (
	"bufio"
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"syscall"

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
		"p_h2_atm",
	}
}

// WritePairsCSV writes pairs as CSV (RFC 4180, UTF-8, CRLF line ends): a
// header row whose names carry units, then one self-contained row per pair
// with the solvents, the H2 line, the C_G basis and value, the temperature
// and the constants F and 2.303RT used. Numbers are written in their
// shortest round-trip form; text cells that a spreadsheet would read as a
// formula are neutralised with a leading apostrophe.
func WritePairsCSV(w io.Writer, ev *Evaluated, pairs []thermo.Pair, u thermo.Units) error {
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
			num(ev.Cond.PH2Atm()),
		)
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	return cw.Flush()
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
		if f == "" || (!strings.ContainsAny(f, ",\"\r\n") && f[0] != ' ' && f[0] != '\t') {
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

// errNoAnon: the file system cannot make an unnamed temporary file.
var errNoAnon = errors.New("no unnamed temporary files here")

// WriteFileAtomic writes a file so that the file at path is only ever the
// old one, whole, or the new one, whole. The data goes to a temporary file
// in the same folder, synced, which then takes the name: on Linux an
// unnamed file (O_TMPFILE), so that even a process killed mid-write leaves
// nothing behind; elsewhere, or where the file system cannot, a hidden
// ".NAME.tmp-*" file, removed on any error and by RemoveTemps (called on
// an interrupt). Without force an existing file is refused (ErrExists),
// also one that appears while the data is written; a missing folder is an
// error, never created. Errors name the path and say what went wrong in
// a few words (errors.Is still sees the cause).
func WriteFileAtomic(path string, force bool, write func(io.Writer) error) error {
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return fmt.Errorf("%s: folder %s does not exist", Printable(path), Printable(dir))
	case errors.Is(err, syscall.ENOTDIR):
		return fmt.Errorf("%s: a part of the path is a file, not a folder", Printable(path))
	case err != nil:
		return writeErr(path, err)
	case !st.IsDir():
		return fmt.Errorf("%s: %s is not a folder", Printable(path), Printable(dir))
	}
	mode := os.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		if !fi.Mode().IsRegular() {
			return fmt.Errorf("%s %s; nothing written", Printable(path), notRegular(fi.Mode()))
		}
		if !force {
			return fmt.Errorf("%s: %w", Printable(path), ErrExists)
		}
		mode = fi.Mode().Perm()
	}
	err = errNoAnon
	if useAnon {
		err = writeAnon(dir, path, force, mode, write)
	}
	if errors.Is(err, errNoAnon) {
		err = writeNamed(dir, path, force, mode, write)
	}
	if err != nil {
		return err
	}
	if d, derr := os.Open(dir); derr == nil {
		_ = d.Sync() // the new name, on disk
		d.Close()
	}
	return nil
}

// writeErr describes a failed write of path: the cause in a few words, and
// that the file at path is as it was.
func writeErr(path string, err error) error {
	cause := err
	var pe *fs.PathError
	var le *os.LinkError
	switch {
	case errors.As(err, &pe):
		cause = pe.Err
	case errors.As(err, &le):
		cause = le.Err
	}
	return fmt.Errorf("%s: %w (nothing written; any file of that name is as it was)", Printable(path), cause)
}

// fill writes the data into f through a buffer, then sets the mode and
// syncs, so that only a complete file is ever given the name.
func fill(f *os.File, mode os.FileMode, write func(io.Writer) error) error {
	bw := bufio.NewWriterSize(tempWriter(f), 64<<10)
	if err := write(bw); err != nil {
		return err
	}
	if err := bw.Flush(); err != nil {
		return err
	}
	if err := f.Chmod(mode); err != nil {
		return err
	}
	return f.Sync()
}

// useAnon is false in tests of the named temporary file.
var useAnon = true

// tempWriter is what fill writes through; tests put a failing writer here
// to stand for a full disk at the same place in the code.
var tempWriter = func(f *os.File) io.Writer { return f }

// writeAnon writes through an unnamed temporary file (errNoAnon where
// there is none to be had).
func writeAnon(dir, path string, force bool, mode os.FileMode, write func(io.Writer) error) error {
	f, err := openAnon(dir)
	if err != nil {
		if errors.Is(err, errNoAnon) {
			return err
		}
		return writeErr(path, err)
	}
	defer f.Close()
	if err := fill(f, mode, write); err != nil {
		return writeErr(path, err)
	}
	if !force {
		err := linkAnon(f, path)
		if errors.Is(err, fs.ErrExist) {
			return fmt.Errorf("%s: %w", Printable(path), ErrExists)
		}
		if err != nil && !errors.Is(err, errNoAnon) {
			return writeErr(path, err)
		}
		return err
	}
	// To replace a file, name the data first, then rename it over the old
	// file: the temporary name lives only between these two calls.
	tmp := tempName(dir, path)
	track(tmp)
	defer untrack(tmp)
	if err := linkAnon(f, tmp); err != nil {
		if errors.Is(err, errNoAnon) {
			return err
		}
		return writeErr(path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return writeErr(path, err)
	}
	return nil
}

// writeNamed writes through a hidden temporary file beside path.
func writeNamed(dir, path string, force bool, mode os.FileMode, write func(io.Writer) error) (err error) {
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return writeErr(path, err)
	}
	name := tmp.Name()
	track(name)
	defer untrack(name)
	defer func() {
		tmp.Close()
		if err != nil {
			os.Remove(name)
		}
	}()
	if err = fill(tmp, mode, write); err != nil {
		return writeErr(path, err)
	}
	if err = tmp.Close(); err != nil {
		return writeErr(path, err)
	}
	if force {
		if err = os.Rename(name, path); err != nil {
			return writeErr(path, err)
		}
		return nil
	}
	// Without force, a hard link refuses to replace a file that appeared
	// since the check; where links are not supported, rename.
	if lerr := os.Link(name, path); lerr == nil {
		os.Remove(name)
		return nil
	} else if _, serr := os.Lstat(path); serr == nil {
		err = fmt.Errorf("%s: %w", Printable(path), ErrExists)
		return err
	}
	if err = os.Rename(name, path); err != nil {
		return writeErr(path, err)
	}
	return nil
}

// tempName is a fresh hidden name beside path.
func tempName(dir, path string) string {
	var b [6]byte
	_, _ = rand.Read(b[:])
	return filepath.Join(dir, "."+filepath.Base(path)+".tmp-"+hex.EncodeToString(b[:]))
}

// temps are the named temporary files being written now.
var temps struct {
	sync.Mutex
	names map[string]struct{}
}

func track(name string) {
	temps.Lock()
	defer temps.Unlock()
	if temps.names == nil {
		temps.names = map[string]struct{}{}
	}
	temps.names[name] = struct{}{}
}

func untrack(name string) {
	temps.Lock()
	defer temps.Unlock()
	delete(temps.names, name)
}

// RemoveTemps removes the named temporary files of writes still under way,
// so that a command stopped by an interrupt leaves no trace; the files the
// writes were to replace are untouched. It is safe to call from any
// goroutine, and the writes it cuts short fail.
func RemoveTemps() {
	temps.Lock()
	defer temps.Unlock()
	for n := range temps.names {
		os.Remove(n)
		delete(temps.names, n)
	}
}
