package tui

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"

	tea "github.com/charmbracelet/bubbletea"

	"github.com/hatsieve/hatsieve/data"
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
// embedded contents). It reads the files: call it from a command.
func LibraryKey(lib *data.Library) string {
	h := sha256.New()
	files := slices.Clone(lib.Files)
	slices.Sort(files)
	embedded := map[string][]byte{}
	for _, f := range data.DefaultFiles() {
		embedded[f.Name] = f.Data
	}
	for _, f := range files {
		if b, ok := embedded[f]; ok && strings.HasPrefix(f, data.EmbeddedPrefix) {
			fmt.Fprintf(h, "%s\x00", f)
			h.Write(b)
			h.Write([]byte{0})
			continue
		}
		abs, err := filepath.Abs(f)
		if err != nil {
			abs = f
		}
		fmt.Fprintf(h, "%s\x00", abs)
		if b, err := os.ReadFile(f); err == nil {
			h.Write(b)
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

// ReadShortlist reads a saved shortlist; a missing file is an empty list.
func ReadShortlist(path string) ([]markKey, error) {
	b, err := os.ReadFile(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, fmt.Errorf("read shortlist: %w", err)
	}
	var f marksFile
	if err := json.Unmarshal(b, &f); err != nil {
		return nil, fmt.Errorf("shortlist %s is damaged (%v); it will be rewritten when you mark a pair", path, err)
	}
	out := make([]markKey, 0, len(f.Marks))
	for _, p := range f.Marks {
		out = append(out, markKey{p.Donor, p.Acceptor})
	}
	return out, nil
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

// writeAtomic writes b to path through a temporary file in the same folder,
// synced and renamed over the target, then syncs the folder: a crash leaves
// either the old file or the new one, whole.
func writeAtomic(path string, b []byte) (err error) {
	dir := filepath.Dir(path)
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	tmp := f.Name()
	defer func() {
		if err != nil {
			os.Remove(tmp)
		}
	}()
	if _, err = f.Write(b); err != nil {
		f.Close()
		return err
	}
	if err = f.Sync(); err != nil {
		f.Close()
		return err
	}
	if err = f.Close(); err != nil {
		return err
	}
	if err = os.Rename(tmp, path); err != nil {
		return err
	}
	if d, derr := os.Open(dir); derr == nil {
		_ = d.Sync()
		d.Close()
	}
	return nil
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
