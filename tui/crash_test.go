package tui

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"
)

const childEnv = "HATSIEVE_TUI_CRASH_CHILD"

// TestMain turns the test binary into the crash child when asked: a real
// Bubble Tea program on the test library, keys read from stdin, which never
// exits on its own.
func TestMain(m *testing.M) {
	if dir := os.Getenv(childEnv); dir != "" {
		crashChild(dir)
		return
	}
	os.Exit(m.Run())
}

// readyModel reports on stdout when the library and the saved state have
// loaded, so the parent knows keys will act on rows.
type readyModel struct {
	Model
	loaded, state bool
}

func (r readyModel) Update(msg tea.Msg) (tea.Model, tea.Cmd) {
	was := r.loaded && r.state
	switch msg.(type) {
	case loadedMsg:
		r.loaded = true
	case stateMsg:
		r.state = true
	}
	mm, cmd := r.Model.Update(msg)
	r.Model = mm.(Model)
	if !was && r.loaded && r.state {
		fmt.Println("READY")
	}
	return r, cmd
}

func crashChild(dir string) {
	m := New(testLibrary(), Options{StateDir: dir, NoCaution: true, Renderer: plainRenderer()})
	p := tea.NewProgram(readyModel{Model: m}, tea.WithInput(os.Stdin), tea.WithOutput(io.Discard), tea.WithoutSignalHandler())
	go p.Send(tea.WindowSizeMsg{Width: 120, Height: 40})
	if _, err := p.Run(); err != nil {
		fmt.Println("ERROR", err)
	}
	select {} // never exit by itself: only SIGKILL ends it
}

// The shortlist is saved as marks change: kill -9 the program mid-session
// and every mark made is still there.
func TestShortlistSurvivesSIGKILL(t *testing.T) {
	dir := t.TempDir()
	cmd := exec.Command(os.Args[0], "-test.run=^$")
	cmd.Env = append(os.Environ(), childEnv+"="+dir)
	stdin, err := cmd.StdinPipe()
	if err != nil {
		t.Fatal(err)
	}
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	defer cmd.Process.Kill()
	lines := make(chan string, 16)
	go func() {
		sc := bufio.NewScanner(stdout)
		for sc.Scan() {
			lines <- sc.Text()
		}
		close(lines)
	}()
	waitFor := func(want string) {
		t.Helper()
		deadline := time.After(20 * time.Second)
		for {
			select {
			case l, ok := <-lines:
				if !ok {
					t.Fatalf("child ended before %q", want)
				}
				if strings.HasPrefix(l, want) {
					return
				}
			case <-deadline:
				t.Fatalf("no %q from the child", want)
			}
		}
	}
	waitFor("READY")
	// Mark rows 1, 2 and 4 of the Pairs table: space, j, space, j, j, space.
	// One key per write: a burst of runes in one read arrives as a paste.
	for _, k := range " j jj " {
		if _, err := io.WriteString(stdin, string(k)); err != nil {
			t.Fatal(err)
		}
		time.Sleep(50 * time.Millisecond)
	}
	// Wait until the file holds three marks (the saves are asynchronous),
	// then kill without warning while the program is still running.
	m0 := open(t, testLibrary(), 80, 24, t.TempDir())
	path := filepath.Join(dir, filepath.Base(m0.marksPath)) // same library, same file name
	deadline := time.Now().Add(20 * time.Second)
	for {
		got, _ := ReadShortlist(path)
		if len(got) == 3 {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("the child never saved 3 marks (file has %d)", len(got))
		}
		time.Sleep(20 * time.Millisecond)
	}
	if err := cmd.Process.Signal(os.Kill); err != nil {
		t.Fatal(err)
	}
	err = cmd.Wait()
	if ee, ok := err.(*exec.ExitError); !ok || ee.ProcessState.String() != "signal: killed" {
		t.Fatalf("child did not die by SIGKILL: %v", err)
	}
	// A new session on the same library restores exactly those marks.
	m := open(t, testLibrary(), 80, 24, dir)
	want := map[markKey]bool{}
	for _, i := range []int{0, 1, 3} {
		want[pairKey(&m.t.pairs[m.grids[panePairs].perm[i]])] = true
	}
	if len(m.marks) != 3 {
		t.Fatalf("restored %d marks, want 3", len(m.marks))
	}
	for k := range m.marks {
		if !want[k] {
			t.Errorf("restored mark %v was not made", k)
		}
	}
	// No temporary file is left half-written beside the shortlist.
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp") {
			t.Errorf("temporary file left: %s", e.Name())
		}
	}
}
