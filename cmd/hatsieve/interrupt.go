package main

import (
	"fmt"
	"io"
	"os"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/internal/atomicfile"
)

// onInterrupt guards a file being written: until stop is called, SIGINT or
// SIGTERM removes the temporary files of writes under way, says on stderr
// that path was left as it was, and exits with 130 (SIGINT) or 143
// (SIGTERM), as shells report a command stopped by the signal. The file at
// path is only ever replaced whole, by a rename, so it is the old file or
// the new one, never a part.
func onInterrupt(e env, path string) (stop func()) {
	return atomicfile.OnInterrupt(func(s os.Signal) {
		fmt.Fprintf(e.stderr, "hatsieve: interrupted; %s left as it was\n", data.Printable(path))
		os.Exit(atomicfile.ExitStatus(s))
	})
}

// testWriteHook, when set by a test, wraps the writer of rank --out, to
// stop a write half-way in a child process. Nil in the command.
var testWriteHook func(io.Writer) io.Writer
