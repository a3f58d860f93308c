package data

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Quantity is a value as written in a library file: a number with an
// optional uncertainty, an optional unit and, for a potential, an optional
// reference electrode.
type Quantity struct {
	V        float64
	Sigma    float64
	HasSigma bool
	Unit     string // "V", "kcal/mol" or "" as written
	Vs       string // electrode name as written after "vs", "" if none
}

var errEmpty = errors.New("no value")

// ParseQuantity reads "66.5", "66.5 ± 0.5", "66.5 +/- 0.5", "-1.91 V vs Fc+/Fc",
// "-1.91 ± 0.01 V vs SCE" or "77 kcal/mol". The Unicode minus sign is
// accepted. It refuses NaN, infinities and negative uncertainties.
func ParseQuantity(s string) (Quantity, error) {
	var q Quantity
	rest := strings.TrimSpace(s)
	if rest == "" {
		return q, errEmpty
	}
	// Fast path: a plain number. ParseFloat refuses any text with a space or
	// a byte beyond ASCII, so such text ("66.5 ± 0.5") skips the attempt
	// and the error it would allocate.
	if plainText(rest) {
		if v, err := strconv.ParseFloat(rest, 64); err == nil {
			if err := finite(v, s); err != nil {
				return q, err
			}
			q.V = v
			return q, nil
		}
	}
	rest = strings.ReplaceAll(rest, "−", "-")
	// Without an ASCII letter there is neither "vs" nor a unit to cut.
	letters := hasASCIILetter(rest)
	if letters {
		if i := indexFold(rest, " vs"); i >= 0 {
			vs := strings.TrimSpace(rest[i+3:])
			if strings.HasPrefix(vs, ".") {
				vs = strings.TrimSpace(vs[1:])
			}
			if vs == "" || strings.HasPrefix(vs, ".") {
				return q, fmt.Errorf("%q names no electrode after \"vs\"", s)
			}
			q.Vs = vs
			rest = strings.TrimSpace(rest[:i])
		}
		if u, ok := cutUnit(rest); ok {
			q.Unit = u
			rest = strings.TrimSpace(rest[:len(rest)-len(u)])
		}
	}
	num, sig, hasSig := rest, "", false
	for _, sep := range []string{"±", "+/-", "+-"} {
		if a, b, ok := strings.Cut(rest, sep); ok {
			num, sig, hasSig = strings.TrimSpace(a), strings.TrimSpace(b), true
			break
		}
	}
	v, err := parseNumber(num, s)
	if err != nil {
		return q, err
	}
	q.V = v
	if hasSig {
		if letters {
			if u, ok := cutUnit(sig); ok && q.Unit == "" {
				q.Unit = u
				sig = strings.TrimSpace(sig[:len(sig)-len(u)])
			}
		}
		sv, err := parseNumber(sig, s)
		if err != nil {
			return q, err
		}
		if sv < 0 {
			return q, fmt.Errorf("uncertainty %s in %q is negative", sig, s)
		}
		q.Sigma, q.HasSigma = sv, true
	}
	return q, nil
}

var units = []string{"kcal/mol", "kcal mol-1", "kj/mol", "mv", "v"}

// cutUnit reports the unit that s ends with, as written.
func cutUnit(s string) (string, bool) {
	low := asciiLower(s)
	for _, u := range units {
		if strings.HasSuffix(low, u) {
			head := strings.TrimSpace(s[:len(s)-len(u)])
			// "V" must follow a number, not be part of a word.
			if head == "" || strings.ContainsAny(head[len(head)-1:], "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ") {
				continue
			}
			return s[len(s)-len(u):], true
		}
	}
	return "", false
}

func indexFold(s, sub string) int { return strings.Index(asciiLower(s), sub) }

// plainText reports whether s has no space and no byte beyond ASCII.
func plainText(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c == ' ' || c >= 0x80 {
			return false
		}
	}
	return true
}

// hasASCIILetter reports whether s holds a letter A–Z or a–z.
func hasASCIILetter(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i] | 0x20; 'a' <= c && c <= 'z' {
			return true
		}
	}
	return false
}

// asciiLower lowers A–Z only, so byte offsets stay those of s.
func asciiLower(s string) string {
	if !strings.ContainsFunc(s, func(r rune) bool { return 'A' <= r && r <= 'Z' }) {
		return s
	}
	b := []byte(s)
	for i, c := range b {
		if 'A' <= c && c <= 'Z' {
			b[i] = c + 'a' - 'A'
		}
	}
	return string(b)
}

func parseNumber(t, whole string) (float64, error) {
	t = strings.TrimSpace(t)
	if t == "" {
		return 0, fmt.Errorf("%q is not a number", whole)
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", whole)
	}
	return v, finite(v, whole)
}

func finite(v float64, whole string) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%q is not a finite number", whole)
	}
	return nil
}

// Kind is what a field holds, and fixes its unit and valid range.
type Kind int

const (
	KindEnergy    Kind = iota // kcal/mol: bdfe, bde, c_g, h2_line
	KindPKa                   // pKa units
	KindPotential             // volts, with an electrode
	KindPlain                 // a plain number (σ of the cross-solvent term...)
)

// Valid ranges (data/FORMAT.md, Limits, and our own limits). The lower BDFE limit is below
// zero because a few metastable radicals have negative X–H BDFEs (N2H in the
// gas phase, for one).
const (
	MinBDFE, MaxBDFE = -30.0, 150.0
	MinPKa, MaxPKa   = -30.0, 80.0
	MinE, MaxE       = -5.0, 5.0
)

// checkQuantity converts q for a field of kind k, checks its unit and range,
// and returns the value in the field's own unit (V, kcal/mol, pKa units).
func checkQuantity(q Quantity, k Kind) (Quantity, error) {
	u := strings.ToLower(q.Unit)
	switch k {
	case KindPotential:
		switch u {
		case "", "v":
		case "mv":
			q.V /= 1000
			q.Sigma /= 1000
		default:
			return q, fmt.Errorf("a potential is in V, not %s", q.Unit)
		}
		if q.V < MinE || q.V > MaxE {
			return q, fmt.Errorf("%g V is outside %g to +%g V", q.V, MinE, MaxE)
		}
		if q.HasSigma && q.Sigma > 1 {
			return q, fmt.Errorf("uncertainty %g V is larger than 1 V", q.Sigma)
		}
		return q, nil
	case KindEnergy:
		switch u {
		case "", "kcal/mol", "kcal mol-1":
		case "kj/mol":
			return q, errors.New("energies in library files are in kcal/mol, not kJ/mol")
		default:
			return q, fmt.Errorf("an energy is in kcal/mol, not %s", q.Unit)
		}
	case KindPKa, KindPlain:
		if u != "" {
			return q, fmt.Errorf("this value takes no unit (got %s)", q.Unit)
		}
	}
	if q.Vs != "" {
		return q, errors.New("only a potential names an electrode (\"vs\")")
	}
	if k == KindPKa && (q.V < MinPKa || q.V > MaxPKa) {
		return q, fmt.Errorf("pKa %g is outside %g to %g", q.V, MinPKa, MaxPKa)
	}
	return q, nil
}

// checkBDFERange checks a BDFE or BDE in kcal/mol.
func checkBDFERange(v float64) error {
	if v < MinBDFE || v > MaxBDFE {
		return fmt.Errorf("%g kcal/mol is outside %g to %g kcal/mol", v, MinBDFE, MaxBDFE)
	}
	return nil
}
