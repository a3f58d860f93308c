// Package data reads and checks hatsieve library files (YAML, format
// hatsieve/1, and CSV), holds the embedded default library, and writes
// exports. It turns files into thermo couples; the science stays in thermo.
package data

import (
	"fmt"

	"github.com/hatsieve/hatsieve/thermo"
)

// Pos is a place in a library file.
type Pos struct {
	File string
	Line int
}

func (p Pos) String() string {
	if p.Line > 0 {
		return fmt.Sprintf("%s:%d", Printable(p.File), p.Line)
	}
	return Printable(p.File)
}

// Couple is a thermo couple with what the file said about it beyond numbers.
type Couple struct {
	thermo.Couple
	Source string   // where the values come from
	Status string   // checked, derived, from memory, estimate, invented...
	Tags   []string // free labels ("demo", "invented", "reference", ...)
	Note   string
	Pos    Pos

	// A combined donor (an acid with a reductant or electrode) names its
	// parts; both are empty for an ordinary couple.
	AcidID, ReductantID string

	// KSelf is the couple's H-atom self-exchange rate constant, when a file
	// gives one (see FORMAT.md, k_self).
	KSelf *thermo.SelfExchange
}

// Series is an ordered list of acceptor couple ids (data/FORMAT.md).
type Series struct {
	ID     string
	Name   string
	Steps  []string
	Note   string
	Source string
	Pos    Pos
}

// Library is one or more library files merged.
type Library struct {
	Titles         []string
	Files          []string
	DefaultSolvent string        // solvent for couples that name none
	Solvents       *thermo.Table // built-in table plus the files' own solvents
	Couples        []*Couple     // ordinary couples then combined donors
	Acids          []*Acid
	Reductants     []*Reductant
	Series         []Series

	sums func() [][32]byte // see Sums
}

// Sums returns the SHA-256 of each file's contents as loaded, beside Files;
// nil for a library not loaded from files. A library of LoadFiles hashes
// its files on the first call (only the screens ask), one of Load as it
// loads them.
func (l *Library) Sums() [][32]byte {
	if l.sums == nil {
		return nil
	}
	return l.sums()
}

// Acid is a proton source that a combined donor pairs with a reductant.
type Acid struct {
	ID, Name, Bond string
	PKa            thermo.Value
	Solvent        *thermo.Solvent // nil: the working solvent
	Source, Status string
	Tags           []string
	Note           string
	Pos            Pos
}

// Reductant is an electron source (a reagent, or an electrode held at a
// potential) that a combined donor pairs with an acid.
type Reductant struct {
	ID, Name       string
	E              thermo.Potential // E°(Red+/Red) or the electrode potential
	Solvent        *thermo.Solvent  // nil: the working solvent
	Source, Status string
	Tags           []string
	Note           string
	Pos            Pos
}
