package data

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// FuzzParseRateConstant: whatever the text, a rate constant is either
// refused with a message that quotes it, or lies in (0, Z) and survives a
// round trip through its own decimal form.
func FuzzParseRateConstant(f *testing.F) {
	for _, s := range []string{"4.7", "4.7e3 M-1 s-1", "220 M⁻¹ s⁻¹", "−3", "1e11", "0", "NaN", "inf", " 3.2e5 ", "1e-300"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := ParseRateConstant(s)
		if err != nil {
			if !strings.Contains(err.Error(), "rate constant") {
				t.Fatalf("%q: message %q does not say what is wanted", s, err)
			}
			return
		}
		if !(v > 0) || v >= thermo.CollisionZ || math.IsNaN(v) {
			t.Fatalf("%q accepted as %g, outside (0, Z)", s, v)
		}
		if w, err := ParseRateConstant(strconv.FormatFloat(v, 'g', -1, 64)); err != nil || w != v {
			t.Fatalf("%q: %g does not round-trip (%g, %v)", s, v, w, err)
		}
	})
}
