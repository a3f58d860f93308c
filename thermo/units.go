package thermo

import (
	"fmt"
	"strings"
)

// Units selects how energies are shown. Computation is always in kcal/mol.
type Units int

const (
	Kcal Units = iota // kcal/mol
	KJ                // kJ/mol
)

// ParseUnits reads "kcal" or "kj" (case-insensitive, with or without "/mol").
func ParseUnits(s string) (Units, error) {
	switch strings.TrimSuffix(strings.ToLower(strings.TrimSpace(s)), "/mol") {
	case "kcal":
		return Kcal, nil
	case "kj":
		return KJ, nil
	}
	return Kcal, fmt.Errorf("unknown units %q (want kcal or kj)", s)
}

// From converts an energy in kcal/mol to these units.
func (u Units) From(kcal float64) float64 {
	if u == KJ {
		return kcal * JoulePerCalorie
	}
	return kcal
}

// Label is the unit as people write it: "kcal/mol" or "kJ/mol".
func (u Units) Label() string {
	if u == KJ {
		return "kJ/mol"
	}
	return "kcal/mol"
}

// Suffix is the unit as it ends a JSON key or CSV column: "kcal_mol" or "kj_mol".
func (u Units) Suffix() string {
	if u == KJ {
		return "kj_mol"
	}
	return "kcal_mol"
}

func (u Units) String() string {
	if u == KJ {
		return "kj"
	}
	return "kcal"
}
