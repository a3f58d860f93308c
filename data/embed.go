package data

import (
	"embed"
	"io/fs"
	"slices"
	"strings"
)

// The default library: published reference couples and an invented demo.
//
//go:embed library/*.yaml
var embedded embed.FS

// EmbeddedPrefix starts the name of an embedded library file in messages.
const EmbeddedPrefix = "embedded:"

// DefaultFiles returns the files of the embedded default library.
func DefaultFiles() []File {
	names, err := fs.Glob(embedded, "library/*.yaml")
	if err != nil {
		panic("data: embedded library: " + err.Error()) // a build-time pattern; cannot fail
	}
	// The reference couples come first (reference.yaml, then the other
	// reference-*.yaml files), then the demo, then anything else.
	rank := func(n string) int {
		switch {
		case n == "library/reference.yaml":
			return 0
		case strings.HasPrefix(n, "library/reference-"):
			return 1
		case n == "library/demo.yaml":
			return 2
		}
		return 3
	}
	slices.SortStableFunc(names, func(a, b string) int { return rank(a) - rank(b) })
	files := make([]File, 0, len(names))
	for _, n := range names {
		b, err := embedded.ReadFile(n)
		if err != nil {
			panic("data: embedded library: " + err.Error())
		}
		files = append(files, File{Name: EmbeddedPrefix + n[len("library/"):], Data: b})
	}
	return files
}

// Default loads the embedded default library.
func Default() (*Library, error) { return Load(DefaultFiles()...) }
