package tui

import (
	"strings"

	tea "github.com/charmbracelet/bubbletea"
	"unicode"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// bondClass narrows the screens to the couples of one kind of X–H bond.
type bondClass int

const (
	classAll bondClass = iota
	classOH
	classNH
	classCH
	classSH
	classMH // any metal–H
	classOther
	nClasses
)

var classNames = [nClasses]string{"all bonds", "O–H", "N–H", "C–H", "S–H", "M–H", "other bonds"}

// metals are the element symbols counted as M in M–H (and "M" itself).
var metals = map[string]bool{}

func init() {
	for _, s := range strings.Fields("M Li Be Na Mg Al K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Rb Sr Y Zr Nb Mo Tc Ru Rh " +
		"Pd Ag Cd In Sn Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Th U") {
		metals[s] = true
	}
}

// classOf reads the class of a bond as the library writes it: "O–H",
// "N-H", "Cr–H", "M–H"; the atom bound to H decides ("Fe–OH2" is O–H).
func classOf(bond string) bondClass {
	parts := strings.FieldsFunc(bond, func(r rune) bool { return r == '–' || r == '-' || r == '−' || r == '—' || r == ' ' })
	if len(parts) == 0 {
		return classOther
	}
	last := parts[len(parts)-1]
	atom := element(last)
	if last == "H" && len(parts) > 1 {
		atom = element(parts[len(parts)-2])
	}
	switch {
	case atom == "O":
		return classOH
	case atom == "N":
		return classNH
	case atom == "C":
		return classCH
	case atom == "S":
		return classSH
	case metals[atom]:
		return classMH
	}
	return classOther
}

// element is the element symbol a part starts with: "OH2" → "O", "Cr" → "Cr".
func element(s string) string {
	rs := []rune(s)
	if len(rs) == 0 || !unicode.IsUpper(rs[0]) {
		return ""
	}
	if len(rs) > 1 && unicode.IsLower(rs[1]) {
		return string(rs[:2])
	}
	return string(rs[:1])
}

// ofClass is ev narrowed to the couples of one bond class (ev itself for
// every class).
func ofClass(ev *data.Evaluated, c bondClass) *data.Evaluated {
	if c == classAll {
		return ev
	}
	return ev.Subset(func(cp *thermo.Couple) bool { return classOf(cp.Bond) == c })
}

// solventCounts counts the library's couples in each solvent; a couple
// that names none is counted in the working solvent.
func solventCounts(lib *data.Library, solvents []*thermo.Solvent, working *thermo.Solvent) []int {
	at := make(map[*thermo.Solvent]int, len(solvents))
	for i, s := range solvents {
		at[s] = i
	}
	out := make([]int, len(solvents))
	for _, c := range lib.Couples {
		s := c.Solvent
		if s == nil {
			s = working
		}
		if i, ok := at[s]; ok {
			out[i]++
		}
	}
	return out
}

// selectedPair is the pair under the Pairs cursor (nil if none).
func (m Model) selectedPair() *thermo.Pair {
	if m.t == nil {
		return nil
	}
	r := m.grids[panePairs].row()
	if r < 0 {
		return nil
	}
	return &m.t.pairs[r]
}

// selectedDonor is the donor last chosen in Donors, else the donor of the
// selected pair, else the first donor.
func (m Model) selectedDonor() *thermo.Resolved {
	if m.t == nil || len(m.t.ev.Donors) == 0 {
		return nil
	}
	if m.selDonor >= 0 {
		return m.t.ev.Donors[m.selDonor]
	}
	if p := m.selectedPair(); p != nil {
		return p.Donor
	}
	return m.t.ev.Donors[0]
}

// pickSolvent shows every solvent (key "") or one, made the working solvent.
func (m Model) pickSolvent(key string) (Model, tea.Cmd) {
	if key == "" {
		m.cond.Cross = true
		return m.reevaluate()
	}
	s, err := m.lib.Solvents.Lookup(key)
	if err != nil {
		m.status = err.Error()
		return m, nil
	}
	m.cond.Solvent, m.cond.Cross = s.Key, false
	if m.cond.Cond.CG != nil && m.t != nil && s != m.t.ev.Working {
		// An explicit C_G was for the old working solvent.
		m.cond.Cond.CG = nil
	}
	return m.reevaluate()
}
