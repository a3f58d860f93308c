package main

import (
	"flag"
	"strings"

	"github.com/hatsieve/hatsieve/data"
)

// fileList is a repeatable -l FILE flag.
type fileList []string

func (f *fileList) String() string { return strings.Join(*f, ",") }

func (f *fileList) Set(s string) error {
	if strings.TrimSpace(s) == "" {
		return usagef("--library (-l) needs a file name")
	}
	*f = append(*f, s)
	return nil
}

func (f *fileList) register(fs *flag.FlagSet) {
	fs.Var(f, "l", "library file (YAML or CSV); repeat to merge several (default: the embedded library)")
	fs.Var(f, "library", "same as -l")
}

// loadLibrary loads the files given, merged, or the embedded library when
// there are none. Its error lists every problem, one per line.
func loadLibrary(e env, files []string) (*data.Library, error) {
	if len(files) == 0 {
		return data.Default()
	}
	return data.LoadFiles(files...)
}
