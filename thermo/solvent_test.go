package thermo

import (
	"math"
	"strings"
	"testing"
)

func TestLookupNamesAndAliases(t *testing.T) {
	tab := Builtin()
	for _, x := range []struct{ name, key string }{
		{"acetonitrile", "acetonitrile"}, {"MeCN", "acetonitrile"}, {"mecn", "acetonitrile"}, {" CH3CN ", "acetonitrile"},
		{"H2O", "water"}, {"aqueous", "water"}, {"DMSO", "dmso"}, {"dimethyl sulfoxide", "dmso"},
		{"N,N-dimethylformamide", "dmf"}, {"THF", "thf"}, {"MeOH", "methanol"}, {"gas phase", "gas"},
	} {
		s, err := tab.Lookup(x.name)
		if err != nil || s.Key != x.key {
			t.Errorf("Lookup(%q) = %v, %v; want %s", x.name, s, err, x.key)
		}
	}
	_, err := tab.Lookup("acetonitirle")
	if err == nil || !strings.Contains(err.Error(), "did you mean acetonitrile") {
		t.Errorf("typo: %v", err)
	}
	_, err = tab.Lookup("supercritical xenon")
	if err == nil || strings.Contains(err.Error(), "did you mean") {
		t.Errorf("far-off name: %v", err)
	}
	defer func() {
		if recover() == nil {
			t.Error("MustLookup of an unknown name did not panic")
		}
	}()
	tab.MustLookup("nope")
}

func TestTablePutAndClone(t *testing.T) {
	tab := Builtin()
	n := len(tab.All())
	cl := tab.Clone()
	mine := &Solvent{Key: "acetonitrile", Name: "acetonitrile (lab)", Aliases: []string{"labcn"},
		CG2022: &Number{V: 53, Sigma: 0.5}, Ref: Fc}
	cl.Put(mine)
	if got := len(cl.All()); got != n {
		t.Errorf("override changed the count to %d, want %d", got, n)
	}
	for _, name := range []string{"acetonitrile", "labcn", "acetonitrile (lab)"} {
		if s, err := cl.Lookup(name); err != nil || s != mine {
			t.Errorf("clone Lookup(%q) = %v, %v; want the override", name, s, err)
		}
	}
	// The old aliases no longer reach the replaced solvent.
	if s, err := cl.Lookup("MeCN"); err == nil {
		t.Errorf("MeCN still finds %s after the override", s.Name)
	}
	// The original table is untouched.
	if s, _ := tab.Lookup("acetonitrile"); s == mine || s.CG2010 == nil {
		t.Error("Put on a clone changed the original table")
	}
	cl.Put(&Solvent{Key: "ionic liquid", Name: "ionic liquid", Ref: Fc})
	if len(cl.All()) != n+1 || len(tab.All()) != n {
		t.Error("adding a solvent to a clone: wrong counts")
	}
	// Builtin returns a fresh table each time.
	if Builtin().MustLookup("water") == tab.MustLookup("water") {
		t.Error("Builtin shares solvents between calls")
	}
}

// Every number in the built-in table says where it comes from and how far it
// is trusted: a source and a status for every number.
func TestBuiltinProvenance(t *testing.T) {
	for _, s := range Builtin().All() {
		check := func(what string, n *Number) {
			if n == nil {
				return
			}
			if n.Source == "" || n.Status == "" {
				t.Errorf("%s %s: source %q, status %q", s.Key, what, n.Source, n.Status)
			}
			if n.Sigma < 0 || math.IsNaN(n.V) {
				t.Errorf("%s %s: %v ± %v", s.Key, what, n.V, n.Sigma)
			}
		}
		check("C_G 2010", s.CG2010)
		check("C_G 2022", s.CG2022)
		check("E°(H+/H2)", s.EH2)
		check("G_H", s.GH)
		check("C_H", s.CH)
		for e, n := range s.Offsets {
			check("offset "+e.String(), &n)
			if e == s.Ref {
				t.Errorf("%s: offset for its own reference", s.Key)
			}
		}
		if !s.IsGas() && s.Ref == NoElectrode {
			t.Errorf("%s: a C_G without a reference electrode", s.Key)
		}
		if s.CrossSigma <= 0 {
			t.Errorf("%s: no cross-solvent σ", s.Key)
		}
		// The 2022 revision lowered C_G (Agarwal et al., Chem. Rev. 2022, 122, 1).
		if s.CG2010 != nil && s.CG2022 != nil && s.CG2022.V >= s.CG2010.V {
			t.Errorf("%s: C_G 2022 %.1f not below 2010 %.1f", s.Key, s.CG2022.V, s.CG2010.V)
		}
		// Every solvent has an H2 line on both bases.
		for _, c := range []Conditions{on2010, on2022} {
			if _, err := c.H2LineOf(s); err != nil {
				t.Errorf("%s: %v", s.Key, err)
			}
		}
	}
}

func TestCGAndH2LineRules(t *testing.T) {
	mecn, dmso, gas := solvent(t, "MeCN"), solvent(t, "DMSO"), solvent(t, "gas")
	// An explicit C_G wins on both bases and is marked as given.
	v := 57.0
	for _, b := range []Basis{Basis2010, Basis2022} {
		cg, err := mecn.CG(b, &v)
		if err != nil || cg.V != v || cg.Status != UserGiven {
			t.Errorf("CG(%v, override) = %+v, %v", b, cg, err)
		}
	}
	if _, err := gas.CG(Basis2022, nil); err == nil || !strings.Contains(err.Error(), "gas") {
		t.Errorf("gas C_G: %v", err)
	}
	// Without E°(H+/H2) the line is the 2022 G_H moved by the same amount as C_G,
	// so the margin of a cycle BDFE does not depend on the basis.
	g10, _ := dmso.H2Line(Basis2010, nil)
	g22, _ := dmso.H2Line(Basis2022, nil)
	near(t, "DMSO line shift", g10.V-g22.V, dmso.CG2010.V-dmso.CG2022.V, 1e-12)
	near(t, "DMSO 2022 line = G_H", g22.V, dmso.GH.V, 0)
	// A solvent with neither a 2022 C_G nor E°(H+/H2) has no line.
	odd := &Solvent{Key: "odd", Name: "odd", Ref: Fc, CG2010: &Number{V: 60}}
	if _, err := odd.H2Line(Basis2010, nil); err == nil {
		t.Error("H2 line made up for a solvent without the data")
	}
	if _, err := odd.BasisShift(Basis2010, Basis2022); err == nil {
		t.Error("basis shift made up for a solvent without a 2022 C_G")
	}
	if s, err := gas.BasisShift(Basis2010, Basis2022); err != nil || s != 0 {
		t.Errorf("gas basis shift = %v, %v; want 0", s, err)
	}
}

func TestParsers(t *testing.T) {
	for in, want := range map[string]Electrode{
		"Fc+/Fc": Fc, "fc": Fc, "Cp2Fe+/0": Fc, "ferrocene": Fc, "SCE": SCE, "sce": SCE,
		"NHE": NHE, "SHE": NHE, "she": NHE, "Ag/AgCl": AgCl, "agcl": AgCl, "Ag/AgCl (sat. KCl)": AgCl,
	} {
		if got, err := ParseElectrode(in); err != nil || got != want {
			t.Errorf("ParseElectrode(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "Hg/HgO", "RHE2", "Fc2"} {
		if _, err := ParseElectrode(bad); err == nil {
			t.Errorf("ParseElectrode(%q) accepted", bad)
		}
	}
	for _, e := range Electrodes {
		if got, err := ParseElectrode(e.String()); err != nil || got != e {
			t.Errorf("ParseElectrode(%v.String()) = %v, %v", e, got, err)
		}
	}

	for in, want := range map[string]Basis{"2010": Basis2010, "2022": Basis2022, " absolute ": BasisAbsolute} {
		if got, err := ParseBasis(in); err != nil || got != want {
			t.Errorf("ParseBasis(%q) = %v, %v", in, got, err)
		}
	}
	if _, err := ParseBasis("2015"); err == nil {
		t.Error("ParseBasis(2015) accepted")
	}
	for _, b := range []Basis{Basis2010, Basis2022, BasisAbsolute} {
		if got, _ := ParseBasis(b.String()); got != b {
			t.Errorf("basis %v does not round-trip", b)
		}
	}

	for in, want := range map[string]Tendency{"downhill": Downhill, "near line": NearLine, "near-line": NearLine,
		"Near Line": NearLine, "uphill": Uphill} {
		if got, err := ParseTendency(in); err != nil || got != want {
			t.Errorf("ParseTendency(%q) = %v, %v", in, got, err)
		}
	}
	if _, err := ParseTendency("sideways"); err == nil {
		t.Error("ParseTendency(sideways) accepted")
	}
	syms := map[string]bool{}
	for _, x := range []Tendency{Uphill, NearLine, Downhill} {
		if got, _ := ParseTendency(x.String()); got != x {
			t.Errorf("tendency %v does not round-trip", x)
		}
		syms[x.Symbol()] = true
	}
	if len(syms) != 3 {
		t.Error("tendency symbols are not distinct")
	}
}

func TestUnits(t *testing.T) {
	for in, want := range map[string]Units{"kcal": Kcal, "KCAL/mol": Kcal, "kj": KJ, "kJ/mol": KJ, " kJ ": KJ} {
		if got, err := ParseUnits(in); err != nil || got != want {
			t.Errorf("ParseUnits(%q) = %v, %v", in, got, err)
		}
	}
	if _, err := ParseUnits("eV"); err == nil {
		t.Error("ParseUnits(eV) accepted")
	}
	// Source: 1 thermochemical kcal = 4.184 kJ exactly (NIST SP 811, the thermochemical calorie).
	near(t, "84.8 kcal in kJ", KJ.From(84.8), 354.8032, 1e-9)
	near(t, "kcal.From", Kcal.From(84.8), 84.8, 0)
	if KJ.Suffix() != "kj_mol" || Kcal.Suffix() != "kcal_mol" || KJ.Label() != "kJ/mol" || Kcal.Label() != "kcal/mol" {
		t.Error("unit names do not match the JSON key suffixes of data/FORMAT.md")
	}
}

func TestRouteAndRoleNames(t *testing.T) {
	seen := map[string]bool{}
	for r := RouteNone; r <= RouteCombined; r++ {
		if r.String() == "" || r.Short() == "" || seen[r.Short()] {
			t.Errorf("route %d: %q / %q", r, r.String(), r.Short())
		}
		seen[r.Short()] = true
	}
	if RoleDonor.String() != "donor" || RoleAcceptor.String() != "acceptor" || RoleBoth&RoleDonor == 0 || Role(0).String() != "none" {
		t.Error("role names")
	}
}

func TestResolveErrors(t *testing.T) {
	mecn := solvent(t, "MeCN")
	if _, err := Resolve(&Couple{ID: "empty", Solvent: mecn}, on2022); err != ErrNoRoute {
		t.Errorf("no data: %v, want ErrNoRoute", err)
	}
	// A pKa without a potential is no route either.
	if _, err := Resolve(&Couple{ID: "half", Solvent: mecn, In: Inputs{PKa: val(10)}}, on2022); err != ErrNoRoute {
		t.Errorf("pKa only: %v, want ErrNoRoute", err)
	}
	// A route that cannot be computed reports why.
	meoh := solvent(t, "methanol")
	_, err := Resolve(&Couple{ID: "sce", Solvent: meoh, In: Inputs{PKa: val(10), EAnion: pot(0, SCE)}}, on2022)
	if err == nil || !strings.Contains(err.Error(), "SCE") {
		t.Errorf("unconvertible electrode: %v", err)
	}
	// ... but one good route is enough, the bad one is dropped.
	r, err := Resolve(&Couple{ID: "mixed", Solvent: meoh, In: Inputs{BDFE: val(80), PKa: val(10), EAnion: pot(0, SCE)}}, on2022)
	if err != nil || len(r.Routes) != 1 || r.Route != RouteDirect {
		t.Errorf("mixed: %v, %v", r.Routes, err)
	}
	// A BDE in a solvent without C_H cannot be converted.
	if _, err := Resolve(&Couple{ID: "bde", Solvent: meoh, In: Inputs{BDE: val(90)}}, on2022); err == nil {
		t.Error("BDE converted without C_H")
	}
	// A potential vs SCE in MeCN is converted, and the conversion is shown.
	r = *mustResolve(t, &Couple{ID: "sce", Solvent: mecn, In: Inputs{PKa: val(10), EAnion: pot(0.3, SCE)}}, on2022)
	if len(r.Notes) == 0 || !strings.Contains(r.Notes[0], "SCE") {
		t.Errorf("conversion not shown: %q", r.Notes)
	}
	// The temperature leaves a BDFE alone: pKa and E° were measured at
	// 298.15 K, so the cycle is a 298.15 K free energy (2010 review §3:
	// the tabulated values are at 298 K).
	hot := Conditions{Temperature: 350}
	a := mustResolve(t, &Couple{ID: "t", Solvent: mecn, In: Inputs{PKa: val(10), EAnion: pot(0, Fc)}}, hot)
	b := mustResolve(t, &Couple{ID: "t", Solvent: mecn, In: Inputs{PKa: val(10), EAnion: pot(0, Fc)}}, on2022)
	near(t, "temperature effect", a.BDFE.Kcal-b.BDFE.Kcal, 0, 0)
}

func TestConditionsOverrideAndDefaults(t *testing.T) {
	mecn, water := solvent(t, "MeCN"), solvent(t, "water")
	// Potentials without an electrode: NHE in water, Fc+/Fc elsewhere (README, potentials).
	if water.DefaultElectrode() != NHE || mecn.DefaultElectrode() != Fc || solvent(t, "DMSO").DefaultElectrode() != Fc {
		t.Error("default electrodes")
	}
	// A C_G override applies to its solvent only.
	c := Conditions{Basis: Basis2022, CG: map[string]float64{"acetonitrile": 60}}
	in := Inputs{PKa: val(10), EAnion: pot(0, Fc)}
	a := mustResolve(t, &Couple{ID: "a", Solvent: mecn, In: in}, c)
	b := mustResolve(t, &Couple{ID: "b", Solvent: mecn, In: in}, on2022)
	near(t, "override shift", a.BDFE.Kcal-b.BDFE.Kcal, 60-mecn.CG2022.V, 1e-12)
	near(t, "override margin", a.Margin.Kcal, b.Margin.Kcal, 1e-12)
	w := Inputs{PKa: val(10), EAnion: pot(0, NHE)}
	near(t, "other solvent untouched", mustResolve(t, &Couple{ID: "w", Solvent: water, In: w}, c).BDFE.Kcal,
		mustResolve(t, &Couple{ID: "w", Solvent: water, In: w}, on2022).BDFE.Kcal, 0)
	if Kcal.String() != "kcal" || KJ.String() != "kj" || Electrode(99).String() == "" {
		t.Error("names")
	}
}
