package tui

import (
	"strings"

	"github.com/hatsieve/hatsieve/data"
)

// maxShown is the most characters of one library text the screens show
// (a name, a note); the grid cuts cells to their columns anyway.
const maxShown = 2000

// shown is library text as the screens draw it: control characters as
// visible escapes (data.Printable, the one sanitiser), and at most maxShown
// characters.
func shown(s string) string { return data.Clip(data.Printable(s), maxShown, "…") }

// screenSafe is the last guard before the terminal: the whole screen keeps
// its line breaks and the colour sequences (ESC [ … m) the styles write;
// any other control character, from wherever it came, goes through
// data.Printable and is shown as an escape, never acted on.
func screenSafe(s string) string {
	if cleanScreen(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 32)
	for i := 0; i < len(s); {
		if s[i] == '\n' {
			b.WriteByte('\n')
			i++
			continue
		}
		if n := sgrLen(s[i:]); n > 0 {
			b.WriteString(s[i : i+n])
			i += n
			continue
		}
		// A run of text up to the next line break or escape.
		j := i + 1
		for j < len(s) && s[j] != '\n' && s[j] != 0x1b {
			j++
		}
		b.WriteString(data.Printable(s[i:j]))
		i = j
	}
	return b.String()
}

// cleanScreen reports whether s needs no change: printable text, line
// breaks and colour sequences only.
func cleanScreen(s string) bool {
	for i := 0; i < len(s); {
		c := s[i]
		switch {
		case c == '\n':
			i++
		case c == 0x1b:
			n := sgrLen(s[i:])
			if n == 0 {
				return false
			}
			i += n
		case c < 0x20 || c == 0x7f:
			return false
		case c < 0x80:
			i++
		default:
			j := i + 1
			for j < len(s) && s[j] >= 0x80 {
				j++
			}
			if !data.IsPrintable(s[i:j]) {
				return false
			}
			i = j
		}
	}
	return true
}

// sgrLen is the length of the colour sequence (ESC [ digits and ; or : m)
// at the start of s, or 0.
func sgrLen(s string) int {
	if len(s) < 3 || s[0] != 0x1b || s[1] != '[' {
		return 0
	}
	for i := 2; i < len(s) && i < 64; i++ {
		switch c := s[i]; {
		case c == 'm':
			return i + 1
		case c >= '0' && c <= '9', c == ';', c == ':':
		default:
			return 0
		}
	}
	return 0
}
