package tui

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
)

// stateStore serialises writes of the shortlist: save commands run on their
// own goroutines, and an older snapshot must never replace a newer one.
type stateStore struct {
	dir  string // "" until resolved
	mu   sync.Mutex
	last uint64
}

// StateDir returns the folder for hatsieve's saved state: $XDG_STATE_HOME/
// hatsieve, else ~/.local/state/hatsieve, else the user config folder.
func StateDir() (string, error) {
	if d := os.Getenv("XDG_STATE_HOME"); d != "" {
		return filepath.Join(d, "hatsieve"), nil
	}
	if h, err := os.UserHomeDir(); err == nil {
		return filepath.Join(h, ".local", "state", "hatsieve"), nil
	}
	d, err := os.UserConfigDir()
	if err != nil {
		return "", fmt.Errorf("no folder to keep the shortlist in: %w", err)
	}
	return filepath.Join(d, "hatsieve"), nil
}

// LibraryKey names a library by its files' paths and contents, so a
// shortlist belongs to one library (the embedded library by its names and
// embedded contents). The contents are those loaded (the digests in
// lib.Sums()): a file changed or removed since does not change the key.
// Files loaded without digests are read again.
func LibraryKey(lib *data.Library) string {
	h := sha256.New()
	type file struct {
		name string
		sum  [32]byte
		ok   bool
	}
	files := make([]file, len(lib.Files))
	sums := lib.Sums()
	for i, f := range lib.Files {
		files[i].name = f
		if i < len(sums) {
			files[i].sum, files[i].ok = sums[i], true
		}
	}
	slices.SortStableFunc(files, func(a, b file) int { return strings.Compare(a.name, b.name) })
	embedded := map[string][]byte{}
	for _, f := range data.DefaultFiles() {
		embedded[f.Name] = f.Data
	}
	for _, f := range files {
		name := f.name
		if _, ok := embedded[name]; !ok || !strings.HasPrefix(name, data.EmbeddedPrefix) {
			if abs, err := filepath.Abs(name); err == nil {
				name = abs
			}
		}
		fmt.Fprintf(h, "%s\x00", name)
		switch b, emb := embedded[f.name]; {
		case f.ok:
			h.Write(f.sum[:])
		case emb && strings.HasPrefix(f.name, data.EmbeddedPrefix):
			sum := sha256.Sum256(b)
			h.Write(sum[:])
		default:
			if st, err := os.Stat(f.name); err == nil && st.Mode().IsRegular() {
				if b, err := os.ReadFile(f.name); err == nil {
					sum := sha256.Sum256(b)
					h.Write(sum[:])
				}
			}
		}
		h.Write([]byte{0})
	}
	if len(files) == 0 {
		fmt.Fprintf(h, "titles\x00%s", strings.Join(lib.Titles, "\x00"))
	}
	return hex.EncodeToString(h.Sum(nil))[:20]
}

// marksFile is the saved shortlist.
type marksFile struct {
	Format string     `json:"format"`
	Files  []string   `json:"files"`
	Titles []string   `json:"titles"`
	Marks  []markPair `json:"marks"`
}

type markPair struct {
	Donor    string `json:"donor"`
	Acceptor string `json:"acceptor"`
}

const marksFormat = "hatsieve-shortlist/1"

// stateMsg reports the saved state found at start.
type stateMsg struct {
	path        string
	marks       []markKey
	cautionSeen bool
	err         error
}

// loadStateCmd finds the state folder and reads the shortlist of lib.
func loadStateCmd(s *stateStore, lib *data.Library, noCaution bool) tea.Cmd {
	dir := s.dir
	return func() tea.Msg {
		if dir == "" {
			d, err := StateDir()
			if err != nil {
				return stateMsg{err: err, cautionSeen: noCaution}
			}
			dir = d
		}
		path := filepath.Join(dir, "shortlist-"+LibraryKey(lib)+".json")
		msg := stateMsg{path: path, cautionSeen: noCaution}
		if _, err := os.Stat(filepath.Join(dir, "caution-seen")); err == nil {
			msg.cautionSeen = true
		}
		marks, err := ReadShortlist(path)
		msg.marks, msg.err = marks, err
		return msg
	}
}

// maxShortlistBytes is the largest shortlist file read (some 10^5 marks).
const maxShortlistBytes = 16 << 20

// ReadShortlist reads a saved shortlist; a missing file is an empty list.
// A damaged one (not the shortlist format, cut short, or too large) is
// kept under a new name beside it, PATH.damaged-TIME, and reported; the
// list starts empty, and the next mark writes a new file. A path that is
// not a regular file is reported and never opened (a named pipe would
// wait for ever).
func ReadShortlist(path string) ([]markKey, error) {
	st, err := os.Stat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, fmt.Errorf("read shortlist: %w", err)
	}
	if !st.Mode().IsRegular() {
		return nil, fmt.Errorf("shortlist %s is not a regular file; marks will not be kept", path)
	}
	var problem string
	var f marksFile
	if st.Size() > maxShortlistBytes {
		problem = fmt.Sprintf("%d bytes, more than a shortlist holds", st.Size())
	} else {
		b, err := os.ReadFile(path)
		if err != nil {
			return nil, fmt.Errorf("read shortlist: %w", err)
		}
		problem = checkShortlist(b, &f)
	}
	if problem != "" {
		keep := fmt.Sprintf("%s.damaged-%s", path, time.Now().UTC().Format("20060102T150405.000000000Z"))
		if err := os.Rename(path, keep); err != nil {
			return nil, fmt.Errorf("shortlist %s is damaged (%s) and could not be set aside (%v); marks start empty", path, problem, err)
		}
		return nil, &damagedError{path: path, kept: keep, problem: problem}
	}
	out := make([]markKey, 0, len(f.Marks))
	for _, p := range f.Marks {
		out = append(out, markKey{p.Donor, p.Acceptor})
	}
	return out, nil
}

// damagedError reports a damaged shortlist, kept aside.
type damagedError struct{ path, kept, problem string }

func (e *damagedError) Error() string {
	return fmt.Sprintf("shortlist was damaged (%s): kept as %s; marks start empty", e.problem, filepath.Base(e.kept))
}

// checkShortlist decodes a shortlist into f, or says what is wrong with it.
func checkShortlist(b []byte, f *marksFile) string {
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(f); err != nil {
		return err.Error()
	}
	if dec.More() {
		return "data after the shortlist"
	}
	if f.Format != marksFormat {
		return fmt.Sprintf("format %q, want %q", f.Format, marksFormat)
	}
	for i, p := range f.Marks {
		if p.Donor == "" || p.Acceptor == "" {
			return fmt.Sprintf("mark %d names no donor or no acceptor", i+1)
		}
	}
	return ""
}

type savedMsg struct {
	seq uint64
	err error
}

// saveCmd writes the shortlist atomically; seq orders the snapshots.
func saveCmd(s *stateStore, path string, seq uint64, lib *data.Library, marks []markKey) tea.Cmd {
	f := marksFile{Format: marksFormat, Files: lib.Files, Titles: lib.Titles}
	for _, k := range marks {
		f.Marks = append(f.Marks, markPair{k.D, k.A})
	}
	return func() tea.Msg {
		b, err := json.MarshalIndent(f, "", "  ")
		if err != nil {
			return savedMsg{seq, err}
		}
		s.mu.Lock()
		defer s.mu.Unlock()
		if seq < s.last {
			return savedMsg{seq: seq} // a newer shortlist is already on disk
		}
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			return savedMsg{seq, err}
		}
		if err := writeAtomic(path, b); err != nil {
			return savedMsg{seq, err}
		}
		s.last = seq
		return savedMsg{seq: seq}
	}
}

func cautionSeenCmd(s *stateStore) tea.Cmd {
	dir := s.dir
	return func() tea.Msg {
		if dir == "" {
			d, err := StateDir()
			if err != nil {
				return nil
			}
			dir = d
		}
		if os.MkdirAll(dir, 0o755) == nil {
			_ = writeAtomic(filepath.Join(dir, "caution-seen"), []byte("The first-start caution was shown and dismissed.\n"))
		}
		return nil
	}
}

// writeAtomic replaces path with b through atomicfile.Write (an
// unnamed temporary file where the system has them, synced, then named):
// a crash leaves either the old file or the new one, whole, and no
// temporary file.
func writeAtomic(path string, b []byte) error {
	return atomicfile.Write(path, true, func(w io.Writer) error {
		_, err := w.Write(b)
		return err
	})
}

// sortedMarks lists the marks in a stable order for saving.
func sortedMarks(m map[markKey]struct{}) []markKey {
	out := make([]markKey, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	slices.SortFunc(out, func(a, b markKey) int {
		if c := strings.Compare(a.D, b.D); c != 0 {
			return c
		}
		return strings.Compare(a.A, b.A)
	})
	return out
}
