package data

import (
	"fmt"
	"strings"
)

// Issue is one problem found in a library file: where, which field, and what
// is wrong. It prints as FILE:LINE: field: what is wrong.
type Issue struct {
	Pos   Pos
	Field string
	Msg   string
}

func (i Issue) String() string {
	if i.Field == "" {
		return fmt.Sprintf("%s: %s", i.Pos, i.Msg)
	}
	return fmt.Sprintf("%s: %s: %s", i.Pos, i.Field, i.Msg)
}

// MaxIssuesPerFile is how many problems of one file are reported; the rest
// are counted in one closing line.
const MaxIssuesPerFile = 20

// Issues is every problem found while loading; as an error it prints one
// line per problem.
type Issues []Issue

func (is Issues) Error() string {
	lines := make([]string, len(is))
	for i, x := range is {
		lines[i] = x.String()
	}
	return strings.Join(lines, "\n")
}

// collector gathers issues, at most MaxIssuesPerFile per file.
type collector struct {
	list     Issues
	perFile  map[string]int
	overflow map[string]int
	order    []string
}

func (c *collector) add(p Pos, field, format string, a ...any) {
	if c.full(p.File) {
		c.skip(p.File, 1)
		return
	}
	msg := format
	if len(a) > 0 {
		msg = fmt.Sprintf(format, a...)
	}
	c.addIssue(Issue{Pos: p, Field: clip(Printable(field), 100), Msg: oneLine(msg)})
}

// full reports whether file has had its MaxIssuesPerFile problems.
func (c *collector) full(file string) bool { return c.perFile[file] >= MaxIssuesPerFile }

// addIssue adds a problem already made safe to print (by add, in another
// collector).
func (c *collector) addIssue(x Issue) {
	if c.full(x.Pos.File) {
		c.skip(x.Pos.File, 1)
		return
	}
	c.note(x.Pos.File, 1)
	c.list = append(c.list, x)
}

// skip counts n problems of file that are not shown.
func (c *collector) skip(file string, n int) {
	if n > 0 {
		c.note(file, n)
		c.overflow[file] += n
	}
}

// note counts n problems of file.
func (c *collector) note(file string, n int) {
	if c.perFile == nil {
		c.perFile, c.overflow = map[string]int{}, map[string]int{}
	}
	if _, seen := c.perFile[file]; !seen {
		c.order = append(c.order, file)
	}
	c.perFile[file] += n
}

// MaxMessage is the longest problem message, in characters; a message that
// quotes a very long value is cut.
const MaxMessage = 1000

// oneLine makes a message safe to print: control characters escaped (see
// Printable), so that a problem stays on one line and text from a file
// cannot drive the terminal, and at most MaxMessage characters.
func oneLine(s string) string { return clip(Printable(s), MaxMessage) }

func (c *collector) count(file string) int { return c.perFile[file] }

// expect fixes the order in which files are reported: the order they were
// given, whatever order their problems were found in.
func (c *collector) expect(files []string) {
	if c.perFile == nil {
		c.perFile, c.overflow = map[string]int{}, map[string]int{}
	}
	for _, f := range files {
		if _, seen := c.perFile[f]; !seen {
			c.perFile[f] = 0
			c.order = append(c.order, f)
		}
	}
}

// result returns the issues grouped by file (in the order files first had a
// problem) and by line, with a closing line per file whose problems were cut.
func (c *collector) result() Issues {
	if len(c.list) == 0 {
		return nil
	}
	var out Issues
	for _, f := range c.order {
		var part Issues
		for _, x := range c.list {
			if x.Pos.File == f {
				part = append(part, x)
			}
		}
		sortIssues(part)
		out = append(out, part...)
		if n := c.overflow[f]; n > 0 {
			out = append(out, Issue{Pos: Pos{File: f}, Msg: fmt.Sprintf("%d more problems not shown (first %d above)", n, MaxIssuesPerFile)})
		}
	}
	return out
}

func sortIssues(is Issues) {
	// insertion sort: stable, and lists are at most MaxIssuesPerFile long
	for i := 1; i < len(is); i++ {
		for j := i; j > 0 && is[j].Pos.Line < is[j-1].Pos.Line; j-- {
			is[j], is[j-1] = is[j-1], is[j]
		}
	}
}
