package data

import (
	"bytes"
	"crypto/sha256"
	"errors"
	"fmt"
	"hash/maphash"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"syscall"
	"unicode"
	"unicode/utf8"

	"github.com/hatsieve/hatsieve/thermo"
)

// Format is the format line a YAML library must carry.
const Format = "hatsieve/1"

// File is a library file's name (as it is to be shown in messages) and
// contents.
type File struct {
	Name string
	Data []byte
}

// Limits on what a library may hold. A file beyond them is refused with one
// clear line before it is read (or, for CSV lines, before it is parsed), so
// a huge or endless input never runs the machine out of memory.
const (
	// MaxFileBytes is the most a library file, and all the files loaded
	// together, may hold: 64 MiB, some eight times a 10^5-couple library
	// (data/FORMAT.md, Limits).
	MaxFileBytes = 64 << 20
	// MaxCSVLines is the most lines a CSV library may have: 10^6 rows.
	MaxCSVLines = 1_000_000
	// MaxCouples is the most couples the files loaded together may hold.
	MaxCouples = 1_000_000
)

// maxCouples is MaxCouples, lowered by a test.
var maxCouples = MaxCouples

// ReadFiles reads library files from disk. A file that cannot be read is an
// Issue naming it. Only regular files are opened: a folder, a named pipe
// (which would wait for a writer for ever) or a device is refused by its
// mode first, and a file larger than MaxFileBytes by its size; the read
// itself stops past MaxFileBytes, should the file grow meanwhile.
func ReadFiles(paths ...string) ([]File, error) {
	var c collector
	files := make([]File, 0, len(paths))
	total := 0
	for _, p := range paths {
		b, msg := readLibraryFile(p, MaxFileBytes-total)
		total += len(b)
		if msg != "" {
			c.add(Pos{File: p}, "", "cannot read: %s", msg)
			continue
		}
		files = append(files, File{Name: p, Data: b})
	}
	if is := c.result(); is != nil {
		return nil, is
	}
	return files, nil
}

// readLibraryFile reads one file, or says in a few words why it cannot;
// room is what is left of MaxFileBytes for all the files together.
func readLibraryFile(p string, room int) ([]byte, string) {
	why := func(err error) string {
		switch {
		case errors.Is(err, fs.ErrNotExist):
			return "no such file"
		case errors.Is(err, fs.ErrPermission):
			return "permission denied"
		case errors.Is(err, syscall.ENOTDIR):
			return "a part of the path is a file, not a folder"
		}
		var pe *fs.PathError
		if errors.As(err, &pe) {
			return pe.Err.Error()
		}
		return err.Error()
	}
	st, err := os.Stat(p)
	if err != nil {
		return nil, why(err)
	}
	if msg := notRegular(st.Mode()); msg != "" {
		return nil, msg
	}
	if st.Size() > MaxFileBytes {
		return nil, fmt.Sprintf("the file is %s; a library file may be at most %s (split it, or keep only the couples to screen)",
			byteSize(st.Size()), byteSize(MaxFileBytes))
	}
	if st.Size() > int64(room) {
		return nil, fmt.Sprintf("the file is %s, and with the files before it more than %s; the files loaded together may be at most that",
			byteSize(st.Size()), byteSize(MaxFileBytes))
	}
	f, err := os.Open(p)
	if err != nil {
		return nil, why(err)
	}
	defer f.Close()
	// The path may have been replaced since the Stat: look again at what
	// was opened.
	if st, err = f.Stat(); err != nil {
		return nil, why(err)
	}
	if msg := notRegular(st.Mode()); msg != "" {
		return nil, msg
	}
	b, err := readAtMost(f, st.Size(), room)
	if err != nil {
		return nil, why(err)
	}
	if len(b) > room {
		return nil, fmt.Sprintf("the file grew past %s while it was read; the library files may be at most that", byteSize(MaxFileBytes))
	}
	return b, ""
}

// readAtMost reads f to its end, or to one byte past room. The buffer is
// sized for the size the file had when it was opened (and grows should the
// file have grown), so a file is read without the copies of a growing one.
//
// A large file is first read in two halves at once (readHalves), then, from
// where they end, to its end as any other.
func readAtMost(f io.Reader, size int64, room int) ([]byte, error) {
	b := make([]byte, 0, min(size, int64(room))+1)
	if r, ok := f.(interface {
		io.ReaderAt
		io.Seeker
	}); ok && size >= 1<<20 && size <= int64(room) {
		if readHalves(r, b[:size]) {
			if _, err := r.Seek(size, io.SeekStart); err == nil {
				b = b[:size]
			}
		}
	}
	for {
		if len(b) == cap(b) {
			b = append(b, 0)[:len(b)]
		}
		n, err := f.Read(b[len(b):cap(b)])
		b = b[:len(b)+n]
		if len(b) > room {
			return b[:room+1], nil
		}
		if err == io.EOF {
			return b, nil
		}
		if err != nil {
			return b, err
		}
	}
}

// readHalves fills b with the start of f, its two halves read at once on
// two cores (each page a read fills is a fault, and two cores take them in
// half the time). It reports whether f gave all of b; if not (the file
// changed meanwhile), b is to be read again in order.
func readHalves(f io.ReaderAt, b []byte) bool {
	half := len(b) / 2
	var n1 int
	var err1 error
	var wg sync.WaitGroup
	wg.Go(func() { n1, err1 = f.ReadAt(b[:half], 0) })
	n2, err2 := f.ReadAt(b[half:], int64(half))
	wg.Wait()
	whole := func(n, want int, err error) bool { return n == want && (err == nil || err == io.EOF) }
	return whole(n1, half, err1) && whole(n2, len(b)-half, err2)
}

// notRegular says what a file that is not a regular file is, or "".
func notRegular(m fs.FileMode) string {
	switch {
	case m.IsRegular():
		return ""
	case m.IsDir():
		return "is a folder, not a library file"
	case m&fs.ModeNamedPipe != 0:
		return "is a named pipe (FIFO), not a library file; save the data to a file first"
	case m&fs.ModeSocket != 0:
		return "is a socket, not a library file"
	case m&fs.ModeDevice != 0:
		return "is a device, not a library file"
	}
	return "is not a regular file"
}

// byteSize writes a size for people: 512 bytes, 3.2 MB, 1.0 GB (MiB and
// GiB, as file managers count them).
func byteSize(n int64) string {
	switch {
	case n < 1<<10:
		return fmt.Sprintf("%d bytes", n)
	case n < 1<<20:
		return fmt.Sprintf("%.1f kB", float64(n)/(1<<10))
	case n < 1<<30:
		return fmt.Sprintf("%.1f MB", float64(n)/(1<<20))
	}
	return fmt.Sprintf("%.1f GB", float64(n)/(1<<30))
}

// LoadFiles reads and loads library files from disk, merged.
//
// The files' bytes are read here and go nowhere else, so the couples of a
// CSV file keep their text as views of them rather than copies.
func LoadFiles(paths ...string) (*Library, error) {
	files, err := ReadFiles(paths...)
	if err != nil {
		return nil, err
	}
	return loadFiles(files, true)
}

// Load parses, checks and merges library files: YAML (format hatsieve/1) or,
// for a name ending in .csv, CSV with a header row. Every problem found is
// returned as Issues (at most MaxIssuesPerFile per file); the library is
// returned only when there is none.
//
// Load keeps no reference to the files' bytes: the caller may change them
// afterwards.
func Load(files ...File) (*Library, error) { return loadFiles(files, false) }

// loadFiles is Load; with owned, the files' bytes are the load's own, never
// to be changed, and a couple may keep views of them (see slab.views).
func loadFiles(files []File, owned bool) (*Library, error) {
	lib, st, err := load(files, true, owned)
	if st.retry {
		// A run of couples did not parse on its own (yaml_runs.go): load
		// again with every file parsed whole, which reports the problem
		// as it is.
		lib, _, err = load(files, false, owned)
	}
	return lib, err
}

// sums are the SHA-256 sums of the files' contents.
func sums(files []File) [][32]byte {
	out := make([][32]byte, len(files))
	for i, f := range files {
		out[i] = sum(f.Data)
	}
	return out
}

// sum is the SHA-256 of b, hashed 64 kB at a time: the hashing runs in
// assembly, which the scheduler cannot stop midway, and one call over a
// large file (1–2 ms for 2.5 MB) would make a stop-the-world step of the
// collector wait that long for it.
func sum(b []byte) [32]byte {
	h := sha256.New()
	for len(b) > 0 {
		n := min(len(b), 64<<10)
		h.Write(b[:n])
		b = b[n:]
	}
	var out [32]byte
	h.Sum(out[:0])
	return out
}

// loadStats says how a load read its files: how many YAML files were read
// in runs of couples, and whether a run failed, so that the load must be
// done again with every file parsed whole.
type loadStats struct {
	runFiles int
	retry    bool
}

// load is Load; runs lets large YAML files be read in runs of couples.
func load(files []File, runs, owned bool) (*Library, loadStats, error) {
	ld := newLoader()
	ld.owned = owned
	var st loadStats
	// The files' SHA-256 sums (the screens' shortlist key): found when asked
	// for, from bytes the load owns (LoadFiles), which no one changes;
	// from a caller's bytes, which may change once Load returns, now.
	if owned {
		ld.lib.sums = sync.OnceValue(func() [][32]byte { return sums(files) })
	} else {
		s := sums(files)
		ld.lib.sums = func() [][32]byte { return s }
	}
	for _, f := range files {
		ld.lib.Files = append(ld.lib.Files, f.Name)
	}
	ld.c.expect(ld.lib.Files)
	docs := ld.parseAll(files, runs)
	for _, d := range docs {
		if d.runs != nil {
			st.runFiles++
		}
	}
	// Headers and solvents of every file first: a file may use a solvent
	// another one defines.
	for _, d := range docs {
		if d.csv == nil {
			ld.header(d)
		}
	}
	for _, d := range docs {
		if d.csv == nil {
			ld.solventsOf(d)
		}
	}
	for _, d := range docs {
		if d.csv != nil {
			ld.loadCSV(d.file, d.csv)
		} else if !ld.body(d) {
			st.retry = true
			return nil, st, nil
		}
	}
	ld.combineAll()
	ld.indexCouples()
	ld.linkSeries()
	ld.linkKSelf()
	if n := len(ld.lib.Couples); n > maxCouples && ld.c.result() == nil {
		ld.c.add(Pos{File: ld.lib.Files[len(ld.lib.Files)-1]}, "", "%d couples in all; hatsieve loads at most %d at once (split the library, or keep only the couples to screen)", n, maxCouples)
	}
	if is := ld.c.result(); is != nil {
		return nil, st, is
	}
	return ld.lib, st, nil
}

// parseAll checks each file and parses the YAML ones; a CSV file is kept
// as text, to be read once the solvents of every file are known.
func (ld *loader) parseAll(files []File, runs bool) []*yamlDoc {
	var docs []*yamlDoc
	for _, f := range files {
		switch {
		case !ld.sane(f):
		case strings.EqualFold(filepath.Ext(f.Name), ".csv"):
			if !ld.tooManyLines(f) {
				docs = append(docs, &yamlDoc{file: f.Name, csv: f.Data})
			}
		default:
			if d := ld.parseYAML(f, runs); d != nil {
				docs = append(docs, d)
			}
		}
	}
	return docs
}

// sane refuses empty, binary and oversized files, and text that is not
// UTF-8 (naming the line of the first bad byte).
func (ld *loader) sane(f File) bool {
	p := Pos{File: f.Name}
	if len(f.Data) > MaxFileBytes {
		ld.c.add(p, "", "the file is %s; a library file may be at most %s", byteSize(int64(len(f.Data))), byteSize(MaxFileBytes))
		return false
	}
	if bytes.IndexByte(f.Data, 0) >= 0 || !validUTF8(f.Data) {
		hint := ""
		switch {
		case bytes.HasPrefix(f.Data, []byte("PK\x03\x04")):
			hint = "; it looks like a spreadsheet workbook: save it as CSV (UTF-8)"
		case bytes.HasPrefix(f.Data, []byte{0xff, 0xfe}) || bytes.HasPrefix(f.Data, []byte{0xfe, 0xff}):
			hint = "; it looks like UTF-16 text: save it as UTF-8"
		case bytes.IndexByte(f.Data, 0) < 0:
			// Text in another encoding (often Latin-1 or Windows-1252 from
			// an older spreadsheet): point at the first bad byte.
			at := firstInvalidUTF8(f.Data)
			p.Line = 1 + bytes.Count(f.Data[:at], []byte{'\n'})
			ld.c.add(p, "", "not UTF-8 text (byte 0x%02x): save the file as UTF-8", f.Data[at])
			return false
		}
		ld.c.add(p, "", "binary file: a library is UTF-8 text (YAML or CSV)%s", hint)
		return false
	}
	if len(bytes.TrimSpace(bytes.TrimPrefix(f.Data, []byte("\uFEFF")))) == 0 {
		ld.c.add(p, "", "empty file: no library in it")
		return false
	}
	return true
}

// validUTF8 is utf8.Valid, a large text checked in two halves at once. The
// text is cut before a byte that starts a character, so that each half is
// valid exactly when the whole is.
func validUTF8(b []byte) bool {
	if len(b) < 1<<20 {
		return utf8.Valid(b)
	}
	mid := len(b) / 2
	for mid < len(b) && !utf8.RuneStart(b[mid]) {
		mid++
	}
	var first bool
	var wg sync.WaitGroup
	wg.Go(func() { first = utf8.Valid(b[:mid]) })
	second := utf8.Valid(b[mid:])
	wg.Wait()
	return first && second
}

// firstInvalidUTF8 is the offset of the first byte of b that does not start
// a valid UTF-8 sequence (len(b) when there is none).
func firstInvalidUTF8(b []byte) int {
	for i := 0; i < len(b); {
		if b[i] < utf8.RuneSelf {
			i++
			continue
		}
		r, n := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && n <= 1 {
			return i
		}
		i += n
	}
	return len(b)
}

// tooManyLines refuses a CSV file of more than MaxCSVLines lines before it
// is parsed (a quoted cell may span lines, so rows are at most the lines).
func (ld *loader) tooManyLines(f File) bool {
	n := bytes.Count(f.Data, []byte{'\n'})
	if len(f.Data) > 0 && f.Data[len(f.Data)-1] != '\n' {
		n++
	}
	if n <= MaxCSVLines {
		return false
	}
	ld.c.add(Pos{File: f.Name}, "", "%d lines; a CSV library may have at most %d (split it, or keep only the couples to screen)", n, MaxCSVLines)
	return true
}

type loader struct {
	c   collector
	lib *Library

	ids        idIndex            // the ordinary couples in lib.Couples by id, while the files are read
	couples    map[string]*Couple // every couple by id, once the files are read (see indexCouples)
	acids      map[string]*Acid
	reductants map[string]*Reductant
	series     map[string]Pos

	combineGiven bool
	combines     []combineReq
	kselfs       []kselfReq    // top-level k_self items, linked once every file is read (kself.go)
	rules        []combineRule // combine items naming sets (combine.go)

	mem slab // couples and values, allocated in blocks (csv.go)

	// deferIDs is set in a loader that reads a part of a file: its
	// couples' ids are checked when the parts are joined (csv_parts.go).
	deferIDs bool
	// owned is set when the files' bytes are the load's own (LoadFiles):
	// the couples of a CSV file then keep views of its text (slab.views).
	owned  bool
	hashes []uint64 // of the ids of lib.Couples, beside them (ids.hash)
}

type combineReq struct {
	acid, red string
	pos       Pos
}

func newLoader() *loader {
	return &loader{
		lib:        &Library{Solvents: thermo.Builtin()},
		couples:    map[string]*Couple{},
		acids:      map[string]*Acid{},
		reductants: map[string]*Reductant{},
		series:     map[string]Pos{},
	}
}

// ---- shared checks, used by the YAML and the CSV readers

// checkID reports an id that is empty or holds spaces, control characters
// or '+', which joins an acid and a reductant in a combined donor's id.
func (ld *loader) checkID(p Pos, field, id string) bool {
	switch {
	case id == "":
		ld.c.add(p, field, "missing: every entry needs an id")
		return false
	case len(id) > 200:
		ld.c.add(p, field, "id is longer than 200 characters")
		return false
	case strings.Contains(id, "+"):
		ld.c.add(p, field, "%q: '+' is kept for combined donors (ACID+REDUCTANT); use another character", id)
		return false
	case !plainASCII(id) && strings.IndexFunc(id, func(r rune) bool { return unicode.IsSpace(r) || unicode.IsControl(r) }) >= 0:
		ld.c.add(p, field, "%q: an id cannot hold spaces or control characters", id)
		return false
	}
	return true
}

// plainASCII reports whether s is printable ASCII without spaces.
func plainASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c <= ' ' || c >= 0x7f {
			return false
		}
	}
	return true
}

// energy checks a BDFE or BDE.
func (ld *loader) energy(p Pos, field string, q Quantity) *thermo.Value {
	q, err := checkQuantity(q, KindEnergy)
	if err == nil {
		err = checkBDFERange(q.V)
	}
	if err != nil {
		ld.c.add(p, field, "%v", err)
		return nil
	}
	if q.HasSigma && q.Sigma > 50 {
		ld.c.add(p, field, "uncertainty %g kcal/mol is larger than 50", q.Sigma)
		return nil
	}
	return ld.mem.value(q)
}

func (ld *loader) pka(p Pos, field string, q Quantity) *thermo.Value {
	q, err := checkQuantity(q, KindPKa)
	if err != nil {
		ld.c.add(p, field, "%v", err)
		return nil
	}
	if q.HasSigma && q.Sigma > 20 {
		ld.c.add(p, field, "uncertainty %g is larger than 20 pKa units", q.Sigma)
		return nil
	}
	return ld.mem.value(q)
}

// potential checks a potential and its electrode. With no electrode written
// it takes the solvent's default (Fc+/Fc, or NHE in water) and is marked
// assumed; with no solvent known yet the electrode is left for Evaluate.
func (ld *loader) potential(p Pos, field string, q Quantity, s *thermo.Solvent) *thermo.Potential {
	q, err := checkQuantity(q, KindPotential)
	if err != nil {
		ld.c.add(p, field, "%v", err)
		return nil
	}
	pot := ld.mem.potential()
	*pot = thermo.Potential{Value: thermo.Value{V: q.V, Sigma: q.Sigma, SigmaGiven: q.HasSigma}}
	if q.Vs == "" {
		pot.VsAssumed = true
		if s != nil {
			pot.Vs = s.DefaultElectrode()
		}
		return pot
	}
	e, ok := ld.electrode(p, field, q.Vs)
	if !ok {
		return nil
	}
	pot.Vs = e
	return pot
}

var electrodeNames = []string{"fc+/fc", "sce", "nhe", "she", "ag/agcl"}

func (ld *loader) electrode(p Pos, field, name string) (thermo.Electrode, bool) {
	if e, ok := ld.mem.electrodes[name]; ok {
		return e, true
	}
	e, err := thermo.ParseElectrode(name)
	if err == nil {
		ld.mem.keepElectrode(name, e)
		return e, true
	}
	msg := fmt.Sprintf("unknown electrode %q", name)
	if near := thermo.Nearest(strings.ToLower(strings.Join(strings.Fields(name), "")), electrodeNames); near != "" {
		e, _ := thermo.ParseElectrode(near)
		msg += fmt.Sprintf(" (did you mean %v?)", e)
	}
	ld.c.add(p, field, "%s; known: Fc+/Fc, SCE, NHE (SHE), Ag/AgCl", msg)
	return thermo.NoElectrode, false
}

func (ld *loader) solvent(p Pos, field, name string) (*thermo.Solvent, bool) {
	s, err := ld.lib.Solvents.Lookup(name)
	if err != nil {
		ld.c.add(p, field, "%v; 'hatsieve solvents' lists them, or add one under solvents:", err)
		return nil, false
	}
	return s, true
}

var roleNames = []string{"donor", "acceptor", "both"}

func (ld *loader) roles(p Pos, field string, parts []string) (thermo.Role, bool) {
	var r thermo.Role
	ok := true
	for _, part := range parts {
		switch strings.ToLower(strings.TrimSpace(part)) {
		case "":
		case "donor":
			r |= thermo.RoleDonor
		case "acceptor":
			r |= thermo.RoleAcceptor
		case "both":
			r |= thermo.RoleBoth
		default:
			msg := fmt.Sprintf("unknown role %q", part)
			if near := thermo.Nearest(strings.ToLower(part), roleNames); near != "" {
				msg += fmt.Sprintf(" (did you mean %s?)", near)
			}
			ld.c.add(p, field, "%s; roles are donor, acceptor or both", msg)
			ok = false
		}
	}
	if ok && r == 0 {
		ld.c.add(p, field, "empty: give donor, acceptor or both (or leave the field out for both)")
		ok = false
	}
	return r, ok
}

// Statuses a couple's values may carry, most trusted first.
var Statuses = []string{"checked", "measured", "derived", "computed", "user", "from memory", "estimate", "invented"}

func (ld *loader) status(p Pos, field, s string) string {
	k := strings.ToLower(strings.TrimSpace(s))
	if k == "" || slices.Contains(Statuses, k) {
		return k
	}
	msg := fmt.Sprintf("unknown status %q", s)
	if near := thermo.Nearest(k, Statuses); near != "" {
		msg += fmt.Sprintf(" (did you mean %s?)", near)
	}
	ld.c.add(p, field, "%s; known: %s", msg, strings.Join(Statuses, ", "))
	return ""
}

func (ld *loader) basis(p Pos, field, s string) (thermo.Basis, bool) {
	b, err := thermo.ParseBasis(s)
	if err != nil {
		ld.c.add(p, field, "unknown basis %q: want 2010, 2022 or absolute", s)
		return 0, false
	}
	return b, true
}

// phOf checks a couple's ph field: a pH between −2 and 16, in water only
// (its potentials are then formal potentials E°′ at that pH). It returns
// nil, with the problem noted, when the value is bad.
func (ld *loader) phOf(p Pos, v *thermo.Value, s *thermo.Solvent) *float64 {
	if v == nil {
		return nil
	}
	if v.V < -2 || v.V > 16 {
		ld.c.add(p, "ph", "pH %g is outside the range -2 to 16", v.V)
		return nil
	}
	if s != nil && s.Ref != thermo.NHE {
		ld.c.add(p, "ph", "a pH applies to couples in water, not %s", s.Name)
		return nil
	}
	ph := v.V
	return &ph
}

// addCouple checks what needs every field of a couple, then keeps it (a
// part of a file keeps it for join, which checks its id).
func (ld *loader) addCouple(c *Couple, idPos Pos) {
	ld.routeCheck(c)
	h := ld.ids.hash(c.ID)
	if ld.deferIDs {
		ld.lib.Couples = append(ld.lib.Couples, c)
		ld.hashes = append(ld.hashes, h)
		return
	}
	ld.keepCouple(c, idPos, h)
}

// routeCheck reports a couple with no BDFE and no data for a route.
func (ld *loader) routeCheck(c *Couple) {
	in := c.In
	if in.BDFE == nil && in.BDE == nil && !(in.PKa != nil && in.EAnion != nil) && !(in.PKaCation != nil && in.ECation != nil) && in.EPCET == nil {
		var have []string
		for _, f := range []struct {
			name string
			set  bool
		}{{"pka", in.PKa != nil}, {"e_anion", in.EAnion != nil}, {"pka_cation", in.PKaCation != nil}, {"e_cation", in.ECation != nil}} {
			if f.set {
				have = append(have, f.name)
			}
		}
		msg := "no BDFE and no data for a route: give bdfe, bde, pka with e_anion, pka_cation with e_cation, or (water) e_pcet with ph"
		if len(have) > 0 {
			msg += " (has only " + strings.Join(have, ", ") + ")"
		}
		ld.c.add(c.Pos, "bdfe", "couple %s: %s", c.ID, msg)
	}
}

// keepCouple adds c, whose id hashes to h (idIndex.hash), to the library
// unless its id is taken, which is reported at idPos.
func (ld *loader) keepCouple(c *Couple, idPos Pos, h uint64) {
	if old, dup := ld.ids.addHash(ld.lib.Couples, c.ID, h); dup {
		ld.c.add(idPos, "id", "duplicate id %q: also at %s", c.ID, ld.lib.Couples[old].Pos)
		return
	}
	ld.lib.Couples = append(ld.lib.Couples, c)
}

// idIndex finds the couples of a list by id: an open-addressed table, at
// most three quarters full, of the places of the couples in the list
// (1-based, 0 for an empty slot, in the low 22 bits) beside 10 bits of its
// id's hash; past 2^22 couples (more than MaxCouples, which the load then
// refuses) the ids go to a map. It holds no pointer, so the collector
// never scans it, and takes 4 bytes a slot (2×10^4 couples: 128 kB, against
// some 0.8 MB for a map; a small table also spans few pages, and a page not
// in the TLB is costly when the lookups land at random).
type idIndex struct {
	seed maphash.Seed
	// seeded is set once seed is made: the parts of a file hash their
	// ids with it before their couples are added (csv_parts.go).
	seeded bool
	slots  []uint32 // hash>>54<<22 | place+1
	n      int
	big    map[string]int // every id and its place, past maxPlace couples
}

const (
	placeBits = 22
	maxPlace  = 1<<placeBits - 2 // the last place that fits, 1-based
)

// reserve makes room for n ids in all, list holding those added so far.
func (x *idIndex) reserve(list []*Couple, n int) {
	if 4*n <= 3*len(x.slots) {
		return
	}
	size := 16
	for 4*n > 3*size {
		size *= 2
	}
	x.slots = make([]uint32, size)
	for i, c := range list {
		x.put(x.hash(c.ID), i)
	}
}

func (x *idIndex) put(h uint64, place int) {
	mask := len(x.slots) - 1
	i := int(h) & mask
	for x.slots[i] != 0 {
		i = (i + 1) & mask
	}
	x.slots[i] = uint32(h>>(64-32+placeBits))<<placeBits | uint32(place+1)
}

// add returns the place in list of the couple with id, if there is one;
// otherwise it records that the couple with id is next, at len(list).
func (x *idIndex) add(list []*Couple, id string) (int, bool) {
	return x.addHash(list, id, x.hash(id))
}

// hashSeed is the seed ids are hashed with, made if need be.
func (x *idIndex) hashSeed() maphash.Seed {
	if !x.seeded {
		x.seed, x.seeded = maphash.MakeSeed(), true
	}
	return x.seed
}

// hash is id's hash with the index's seed.
func (x *idIndex) hash(id string) uint64 { return maphash.String(x.hashSeed(), id) }

// addHash is add for an id whose hash is h (as hash gives it, or a part of
// a file hashed it with the same seed).
func (x *idIndex) addHash(list []*Couple, id string, h uint64) (int, bool) {
	if len(list) >= maxPlace {
		return x.addBig(list, id)
	}
	x.reserve(list, x.n+1)
	tag := uint32(h >> (64 - 32 + placeBits))
	mask := len(x.slots) - 1
	for i := int(h) & mask; x.slots[i] != 0; i = (i + 1) & mask {
		if s := x.slots[i]; s>>placeBits == tag {
			if p := int(s&(1<<placeBits-1)) - 1; list[p].ID == id {
				return p, true
			}
		}
	}
	x.put(h, len(list))
	x.n++
	return 0, false
}

// addBig is add past maxPlace couples.
func (x *idIndex) addBig(list []*Couple, id string) (int, bool) {
	if x.big == nil {
		x.big = make(map[string]int, len(list))
		for i, c := range list {
			x.big[c.ID] = i
		}
	}
	if p, ok := x.big[id]; ok {
		return p, true
	}
	x.big[id] = len(list)
	return 0, false
}

// ---- combined donors and series

// combineAll forms the combined donors: the pairs listed under combine and
// the sets its rules select, or, when no file has a combine list, every
// acid with every reductant of a compatible solvent (combine.go).
func (ld *loader) combineAll() { ld.combinePairs() }

func sameSolvent(a, b *thermo.Solvent) (*thermo.Solvent, bool) {
	switch {
	case a == nil:
		return b, true
	case b == nil || a == b:
		return a, true
	}
	return nil, false
}

// combine makes the donor ACID+REDUCTANT: its effective BDFE is
// 2.303RT·pKa(HA) + F·E°(Red+/Red) + C_G (README.md, The formulas).
func (ld *loader) combine(a *Acid, d *Reductant, p Pos) {
	s, _ := sameSolvent(a.Solvent, d.Solvent)
	pka, e := a.PKa, d.E
	if e.Vs == thermo.NoElectrode && s != nil {
		e.Vs = s.DefaultElectrode()
	}
	bond := a.Bond
	if bond == "" {
		bond = "H⁺ + e⁻"
	}
	name := nonEmpty(a.Name, a.ID) + " + " + nonEmpty(d.Name, d.ID)
	c := &Couple{
		Couple: thermo.Couple{
			ID: a.ID + "+" + d.ID, Name: name, Bond: bond, Roles: thermo.RoleDonor, Solvent: s,
			In: thermo.Inputs{AcidPKa: &pka, Reductant: &e},
		},
		Source:      joinNonEmpty("; ", "acid: "+a.Source, "reductant: "+d.Source),
		Status:      worstStatus(a.Status, d.Status),
		Tags:        appendUnique(append(append([]string{"combined"}, a.Tags...), d.Tags...)),
		Note:        joinNonEmpty("; ", a.Note, d.Note),
		Pos:         p,
		AcidID:      a.ID,
		ReductantID: d.ID,
	}
	ld.lib.Couples = append(ld.lib.Couples, c)
	ld.couples[c.ID] = c
}

// indexCouples fills the couples map, which series and k_self lists look
// their couples up in, when a file has such a list (most large libraries
// have none, and their couples need no map).
func (ld *loader) indexCouples() {
	for i, c := range ld.lib.Couples {
		c.Index = int32(i)
	}
	if len(ld.lib.Series) == 0 && len(ld.kselfs) == 0 {
		return
	}
	for _, c := range ld.lib.Couples {
		ld.couples[c.ID] = c
	}
}

// linkSeries checks that every series step names a couple that can accept.
func (ld *loader) linkSeries() {
	for _, s := range ld.lib.Series {
		for _, id := range s.Steps {
			c, ok := ld.couples[id]
			if !ok {
				ld.c.add(s.Pos, "steps", "series %s: step %q names no known couple%s", s.ID, id, suggest(id, keys(ld.couples)))
				continue
			}
			if c.Roles&thermo.RoleAcceptor == 0 {
				ld.c.add(s.Pos, "steps", "series %s: step %q is a donor only; a series step must be able to accept an H atom", s.ID, id)
			}
		}
	}
}

// ---- small helpers

func suggest(s string, names []string) string {
	if near := thermo.Nearest(s, names); near != "" {
		return fmt.Sprintf(" (did you mean %s?)", near)
	}
	return ""
}

func keys[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}

func nonEmpty(a, b string) string {
	if a != "" {
		return a
	}
	return b
}

func joinNonEmpty(sep string, parts ...string) string {
	var keep []string
	for _, p := range parts {
		if p != "" && !strings.HasSuffix(p, ": ") {
			keep = append(keep, p)
		}
	}
	return strings.Join(keep, sep)
}

func appendUnique(s []string) []string {
	var out []string
	for _, x := range s {
		if !slices.Contains(out, x) {
			out = append(out, x)
		}
	}
	return out
}

// worstStatus is the less trusted of two statuses.
func worstStatus(a, b string) string {
	rank := func(s string) int {
		if s == "" {
			return len(Statuses)
		}
		return slices.Index(Statuses, s)
	}
	if rank(a) >= rank(b) {
		return a
	}
	return b
}
