package data

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

func TestParseQuantity(t *testing.T) {
	cases := []struct {
		in       string
		v, sigma float64
		hasSigma bool
		unit, vs string
	}{
		{"66.5", 66.5, 0, false, "", ""},
		{" 66.5 ", 66.5, 0, false, "", ""},
		{"66.5 ± 0.5", 66.5, 0.5, true, "", ""},
		{"66.5 +/- 0.5", 66.5, 0.5, true, "", ""},
		{"66.5+-0.5", 66.5, 0.5, true, "", ""},
		{"−1.91", -1.91, 0, false, "", ""}, // U+2212 minus sign
		{"-1.91 V vs Fc+/Fc", -1.91, 0, false, "V", "Fc+/Fc"},
		{"-1.91 ± 0.01 V vs SCE", -1.91, 0.01, true, "V", "SCE"},
		{"-1.91 V vs. SCE", -1.91, 0, false, "V", "SCE"},
		{"-1.91V vs NHE", -1.91, 0, false, "V", "NHE"},
		{"-450 mV vs Fc", -450, 0, false, "mV", "Fc"},
		{"0.3 vs Ag/AgCl", 0.3, 0, false, "", "Ag/AgCl"},
		{"77 kcal/mol", 77, 0, false, "kcal/mol", ""},
		{"77 ± 1 kcal/mol", 77, 1, true, "kcal/mol", ""},
		{"1e2", 100, 0, false, "", ""},
	}
	for _, c := range cases {
		q, err := ParseQuantity(c.in)
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if q.V != c.v || q.Sigma != c.sigma || q.HasSigma != c.hasSigma || q.Unit != c.unit || q.Vs != c.vs {
			t.Errorf("%q: got %+v", c.in, q)
		}
	}
	for _, bad := range []struct{ in, msg string }{
		{"", "no value"},
		{"abc", "not a number"},
		{"NaN", "not a finite number"},
		{"inf", "not a finite number"},
		{"-Infinity", "not a finite number"},
		{"66.5 ± -0.5", "negative"},
		{"66.5 ± x", "not a number"},
		{"66.5 ± NaN", "not a finite number"},
		{"-1.2 V vs", "names no electrode"},
		{"1e999", "not a number"},
		{"12 apples", "not a number"},
	} {
		if _, err := ParseQuantity(bad.in); err == nil || !strings.Contains(err.Error(), bad.msg) {
			t.Errorf("%q: error %v, want one containing %q", bad.in, err, bad.msg)
		}
	}
}

func TestCheckQuantityUnitsAndRanges(t *testing.T) {
	q, err := checkQuantity(Quantity{V: -450, Sigma: 10, HasSigma: true, Unit: "mV"}, KindPotential)
	if err != nil || q.V != -0.45 || q.Sigma != 0.01 {
		t.Errorf("mV: %+v %v", q, err)
	}
	for _, c := range []struct {
		q    Quantity
		k    Kind
		want string
	}{
		{Quantity{V: 1, Unit: "kcal/mol"}, KindPotential, "in V"},
		{Quantity{V: 6}, KindPotential, "outside"},
		{Quantity{V: 81}, KindPKa, "outside"},
		{Quantity{V: -31}, KindPKa, "outside"},
		{Quantity{V: 3, Unit: "V"}, KindPKa, "no unit"},
		{Quantity{V: 3, Vs: "SCE"}, KindEnergy, "only a potential"},
		{Quantity{V: 300, Unit: "kJ/mol"}, KindEnergy, "kJ/mol"},
	} {
		if _, err := checkQuantity(c.q, c.k); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: error %v, want %q", c.q, err, c.want)
		}
	}
	if err := checkBDFERange(150.1); err == nil {
		t.Error("BDFE 150.1 accepted")
	}
	if err := checkBDFERange(-13.5); err != nil {
		t.Errorf("BDFE -13.5 (a metastable radical) refused: %v", err)
	}
}

// FuzzParseQuantity: the parser never panics, never returns a non-finite
// value or a negative σ, and what it reads can be written back and read
// again to the same quantity.
func FuzzParseQuantity(f *testing.F) {
	for _, s := range []string{"66.5", "66.5 ± 0.5", "66.5 +/- 0.5", "-1.91 V vs Fc+/Fc", "−0.35", "-450 mV vs SCE",
		"77 kcal/mol", "1e-7 ± 1e-9 V vs. NHE", "NaN", "± 1", "V vs", "1 vs vs vs", "+-", "1 ±"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		q, err := ParseQuantity(s)
		if err != nil {
			return
		}
		if math.IsNaN(q.V) || math.IsInf(q.V, 0) || math.IsNaN(q.Sigma) || math.IsInf(q.Sigma, 0) || q.Sigma < 0 {
			t.Fatalf("%q: bad quantity %+v", s, q)
		}
		if !q.HasSigma && q.Sigma != 0 {
			t.Fatalf("%q: σ %v without HasSigma", s, q.Sigma)
		}
		num := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
		back := num(q.V)
		if q.HasSigma {
			back += " ± " + num(q.Sigma)
		}
		if q.Unit != "" {
			back += " " + q.Unit
		}
		if q.Vs != "" {
			back += " vs " + q.Vs
		}
		q2, err := ParseQuantity(back)
		if err != nil {
			t.Fatalf("%q read as %+v, written %q, which reads as error %v", s, q, back, err)
		}
		if q2 != q {
			t.Fatalf("%q read as %+v, written %q, read back as %+v", s, q, back, q2)
		}
	})
}
