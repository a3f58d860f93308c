package data

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Printable returns s as it may be shown on a terminal: every character
// that could move the cursor, clear the screen, set a window title or the
// clipboard, ring the bell or reorder the text around it is written as a
// visible escape instead. That is the C0 controls (\n, \r and \t by name,
// the rest as \x1b and so on), DEL, the C1 controls (U+0080–U+009F, among
// them the one-byte CSI U+009B), the bidirectional controls (U+202E and
// kin, as \u202e), the line and paragraph separators, and any byte that is
// not valid UTF-8 (as \xff). Everything else is kept, so a clean string is
// returned as it is.
//
// It is the one sanitiser for text from a library (ids, names, sources,
// notes, titles, tags, series and solvent names) on its way to a terminal:
// problem messages, the tables 'rank' and 'check' print, and the screens.
// Exports (CSV, JSON) keep the data as written.
func Printable(s string) string {
	i := 0
	for i < len(s) {
		c := s[i]
		if c >= 0x20 && c < 0x7f {
			i++
			continue
		}
		if c < utf8.RuneSelf {
			break // C0 or DEL
		}
		r, n := utf8.DecodeRuneInString(s[i:])
		if mustEscape(r, n) {
			break
		}
		i += n
	}
	if i == len(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n <= 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\r':
			b.WriteString(`\r`)
		case r == '\t':
			b.WriteString(`\t`)
		case r < 0x100 && mustEscape(r, n):
			fmt.Fprintf(&b, `\x%02x`, r)
		case mustEscape(r, n):
			fmt.Fprintf(&b, `\u%04x`, r)
		default:
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}

// mustEscape reports whether the rune r (n bytes long) is one Printable
// writes as an escape.
func mustEscape(r rune, n int) bool {
	switch {
	case r == utf8.RuneError && n <= 1:
		return true
	case r < 0x20, r >= 0x7f && r < 0xa0:
		return true
	case r == 0x2028, r == 0x2029: // line and paragraph separators
		return true
	}
	return r >= 0x600 && unicode.Is(unicode.Bidi_Control, r)
}

// IsPrintable reports whether Printable would return s unchanged.
func IsPrintable(s string) bool { return Printable(s) == s }

// clip cuts s to at most n runes, marking the cut, so that a message quoting
// a very long value stays readable.
func clip(s string, n int) string { return Clip(s, n, "… (cut)") }

// Clip cuts s to at most n runes and appends mark where it cut; s is
// returned unchanged when it is short enough.
func Clip(s string, n int, mark string) string {
	if len(s) <= n {
		return s
	}
	k := 0
	for i := range s {
		if k == n {
			return s[:i] + mark
		}
		k++
	}
	return s
}
