package data

import "testing"

// Text that the fast paths of ParseQuantity skip or take must read as it
// always did: with a space but no letter, with letters in either case, and
// what strconv.ParseFloat alone would accept or refuse.
func TestParseQuantityFastPaths(t *testing.T) {
	cases := []struct {
		in       string
		v, sigma float64
		hasSigma bool
		unit     string
	}{
		{"0x1p-2", 0.25, 0, false, ""}, // a hexadecimal float, as strconv reads it
		{"+7", 7, 0, false, ""},
		{"68.27 ± 0.5", 68.27, 0.5, true, ""},
		{"68.27 ±0.5", 68.27, 0.5, true, ""},
		{"−68.27 ± 0.5", -68.27, 0.5, true, ""}, // U+2212 minus sign
		{"77 KCAL/MOL", 77, 0, false, "KCAL/MOL"},
		{"77 ± 1 Kcal/Mol", 77, 1, true, "Kcal/Mol"},
		{"0.5 ± 0.01 V", 0.5, 0.01, true, "V"},
	}
	for _, c := range cases {
		q, err := ParseQuantity(c.in)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if q.V != c.v || q.Sigma != c.sigma || q.HasSigma != c.hasSigma || q.Unit != c.unit || q.Vs != "" {
			t.Errorf("%q: got %+v", c.in, q)
		}
	}
	bad := map[string]string{
		"inf":          `"inf" is not a finite number`,
		"NaN ± 1":      `"NaN ± 1" is not a finite number`,
		"1 000":        `"1 000" is not a number`,
		"68.27 ± -0.5": `uncertainty -0.5 in "68.27 ± -0.5" is negative`,
		"68.27 ± x":    `"68.27 ± x" is not a number`,
		"1 V vs":       `"1 V vs" names no electrode after "vs"`,
	}
	for in, want := range bad {
		if _, err := ParseQuantity(in); err == nil || err.Error() != want {
			t.Errorf("%q: got error %v, want %s", in, err, want)
		}
	}
}

// A number with its uncertainty, as most library cells hold, is read
// without allocating.
func TestParseQuantityAllocations(t *testing.T) {
	for _, in := range []string{"68.27", "68.27 ± 0.5", "-0.198", "77 kcal/mol"} {
		if n := testing.AllocsPerRun(100, func() { _, _ = ParseQuantity(in) }); n != 0 {
			t.Errorf("%q: %.0f allocations per parse, want 0", in, n)
		}
	}
}
