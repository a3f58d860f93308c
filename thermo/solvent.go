package thermo

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// Status says how far a tabulated number can be trusted.
type Status string

const (
	Checked    Status = "checked"     // read in a copy of the cited source
	Derived    Status = "derived"     // computed from checked numbers, arithmetic in Source
	FromMemory Status = "from memory" // recalled, not yet checked against the source
	Estimate   Status = "estimate"    // an assumption, stated as such
	UserGiven  Status = "user"        // supplied by a library file or the command line
)

// Number is a tabulated constant with its provenance.
type Number struct {
	V      float64
	Sigma  float64
	Source string
	Status Status
}

// Basis selects the set of C_G constants: the 2010 review (Warren, Tronic,
// Mayer, Chem. Rev. 2010, 110, 6961) or its 2022 revision (Agarwal et al.,
// Chem. Rev. 2022, 122, 1), which lowered C_G without changing pKa or E°.
type Basis uint8

const (
	Basis2022 Basis = iota // default
	Basis2010
	// BasisAbsolute marks a directly measured BDFE (calorimetry, gas phase).
	// It is treated as consistent with the 2022 basis.
	BasisAbsolute
)

func (b Basis) String() string {
	switch b {
	case Basis2010:
		return "2010"
	case BasisAbsolute:
		return "absolute"
	}
	return "2022"
}

// ParseBasis reads "2010", "2022" or "absolute".
func ParseBasis(s string) (Basis, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "2022":
		return Basis2022, nil
	case "2010":
		return Basis2010, nil
	case "absolute", "abs":
		return BasisAbsolute, nil
	}
	return Basis2022, fmt.Errorf("unknown C_G basis %q (want 2010 or 2022)", s)
}

// Solvent holds the constants hatsieve needs for one solvent. All potentials
// are in volts and all energies in kcal/mol.
type Solvent struct {
	Key     string   // canonical lower-case name, e.g. "acetonitrile"
	Name    string   // display name
	Aliases []string // other names people type: MeCN, CH3CN, ...

	// CG2010 and CG2022 are C_G on the two bases; nil where unknown. Both
	// refer to potentials against Ref.
	CG2010, CG2022 *Number
	Ref            Electrode

	// EH2 is E°(H+/H2) against Ref in this solvent, nil where unknown. Where
	// known, the H2 line on a basis is C_G(basis) + F·EH2, so that the H2
	// margin of a cycle-derived BDFE is the same on either basis.
	EH2 *Number
	// GH is the H2 line ΔfG°(H•, solution) on the 2022 basis, used where EH2
	// is unknown (and for the gas phase, which has no C_G).
	GH *Number

	// Offsets maps an electrode X to the potential that converts a value
	// quoted against X to one against Ref: E(vs Ref) = E(vs X) + Offset.
	Offsets map[Electrode]Number

	// CH is Bordwell's enthalpic constant (BDE = 1.37 pKa + 23.1 E° + C_H)
	// on the 2010 basis, used to turn a solution BDE into a BDFE; nil where
	// unknown.
	CH *Number

	// CrossSigma is the extra uncertainty (kcal/mol) added when a number from
	// this solvent is compared with one from another solvent.
	CrossSigma float64

	// Note is free text shown beside the solvent.
	Note string
}

// IsGas reports whether this is the gas phase, which has no C_G.
func (s *Solvent) IsGas() bool { return s.CG2010 == nil && s.CG2022 == nil }

// CG returns C_G on the basis; override, when non-nil, wins over the table.
func (s *Solvent) CG(b Basis, override *float64) (Number, error) {
	if override != nil {
		return Number{V: *override, Source: "given explicitly", Status: UserGiven}, nil
	}
	var n *Number
	if b == Basis2010 {
		n = s.CG2010
	} else {
		n = s.CG2022
	}
	if n == nil {
		if s.IsGas() {
			return Number{}, fmt.Errorf("solvent %s has no C_G (gas phase): give a BDFE directly", s.Name)
		}
		return Number{}, fmt.Errorf("no %v-basis C_G is known for %s: give one with --cg or switch basis", b, s.Name)
	}
	return *n, nil
}

// H2Line returns G_H, the free energy of ½H2(g, 1 atm) → H•(solution, 1 M)
// consistent with the C_G of basis b (or override), with its uncertainty.
// Where E°(H+/H2) is known it is C_G + F·E°(H+/H2); otherwise the tabulated
// 2022-basis G_H moved by the same amount as C_G.
func (s *Solvent) H2Line(b Basis, override *float64) (Number, error) {
	if s.IsGas() {
		if s.GH == nil {
			return Number{}, fmt.Errorf("solvent %s has no H2 line", s.Name)
		}
		return *s.GH, nil
	}
	cg, err := s.CG(b, override)
	if err != nil {
		return Number{}, err
	}
	return s.h2LineWith(cg)
}

// h2LineWith is the H2 line consistent with the C_G cg of this solvent.
func (s *Solvent) h2LineWith(cg Number) (Number, error) {
	if s.EH2 != nil {
		// Source is built without fmt: Resolve asks for the H2 line of
		// every couple.
		return Number{
			V:      cg.V + FaradayKcal*s.EH2.V,
			Sigma:  math.Hypot(cg.Sigma, FaradayKcal*s.EH2.Sigma),
			Source: "C_G + F·E°(H+/H2); E°(H+/H2) = " + strconv.FormatFloat(s.EH2.V, 'f', 3, 64) + " V vs " + s.Ref.String() + " (" + s.EH2.Source + ")",
			Status: worst(cg.Status, s.EH2.Status),
		}, nil
	}
	if s.GH == nil || s.CG2022 == nil {
		return Number{}, fmt.Errorf("no H2 line is known for %s", s.Name)
	}
	shift := cg.V - s.CG2022.V
	return Number{
		V:      s.GH.V + shift,
		Sigma:  math.Hypot(s.GH.Sigma, cg.Sigma),
		Source: s.GH.Source,
		Status: worst(s.GH.Status, cg.Status),
	}, nil
}

// BasisShift returns the amount to add to a BDFE reported on basis from so it
// can meet numbers on basis to: C_G(to) − C_G(from). Absolute counts as 2022.
func (s *Solvent) BasisShift(from, to Basis) (float64, error) {
	if from == BasisAbsolute {
		from = Basis2022
	}
	if to == BasisAbsolute {
		to = Basis2022
	}
	if from == to || s.IsGas() {
		return 0, nil
	}
	a, err := s.CG(from, nil)
	if err != nil {
		return 0, err
	}
	b, err := s.CG(to, nil)
	if err != nil {
		return 0, err
	}
	return b.V - a.V, nil
}

// ToRef converts a potential quoted against electrode vs into one against the
// solvent's C_G reference, adding the conversion's uncertainty.
func (s *Solvent) ToRef(p Potential) (Potential, error) {
	return s.Convert(p, s.Ref)
}

// Convert re-refers a potential in this solvent to electrode to. RHE needs
// a pH: use ConvertAt.
func (s *Solvent) Convert(p Potential, to Electrode) (Potential, error) {
	return s.ConvertAt(p, to, nil)
}

// ConvertAt is Convert with the pH of an aqueous solution, which a potential
// vs RHE needs: E(vs NHE) = E(vs RHE) − 2.303RT/F·pH at 298.15 K.
func (s *Solvent) ConvertAt(p Potential, to Electrode, pH *float64) (Potential, error) {
	if p.Vs == to {
		return p, nil
	}
	if p.Vs == RHE || to == RHE {
		if s.Ref != NHE {
			return p, fmt.Errorf("RHE is an aqueous reference; it has no conversion in %s", s.Name)
		}
		if pH == nil {
			return p, fmt.Errorf("a potential vs RHE needs a pH (give --ph or a ph field)")
		}
		if p.Vs == RHE {
			p.V, p.Vs = FromRHE(p.V, *pH), NHE
			return s.ConvertAt(p, to, pH)
		}
		q, err := s.ConvertAt(p, NHE, pH)
		if err != nil {
			return p, err
		}
		q.V, q.Vs = VsRHE(q.V, *pH), RHE
		return q, nil
	}
	from, err := s.offset(p.Vs)
	if err != nil {
		return p, err
	}
	back, err := s.offset(to)
	if err != nil {
		return p, err
	}
	out := p
	out.V = p.V + from.V - back.V
	out.Sigma = math.Sqrt(p.Sigma*p.Sigma + from.Sigma*from.Sigma + back.Sigma*back.Sigma)
	out.Vs = to
	return out, nil
}

func (s *Solvent) offset(e Electrode) (Number, error) {
	if e == s.Ref {
		return Number{}, nil
	}
	if n, ok := s.Offsets[e]; ok {
		return n, nil
	}
	return Number{}, fmt.Errorf("no conversion from %v to %v is known in %s", e, s.Ref, s.Name)
}

// AqueousConversion reports whether converting from electrode e to this
// solvent's reference applies offsets measured in water (SCE/NHE/Ag-AgCl
// against one another) in an organic solvent, across an unknown liquid
// junction: screens and notes should say so.
func (s *Solvent) AqueousConversion(e Electrode) bool {
	return s.Ref != NHE && (e == NHE || e == AgCl)
}

// ConversionNote is the note for a potential converted from electrode e in
// this solvent, "" when there is nothing to say.
func (s *Solvent) ConversionNote(e Electrode) string {
	if s.AqueousConversion(e) {
		return "aqueous " + e.String() + "/SCE offset applied in " + s.Name + " (liquid junction unknown)"
	}
	return ""
}

// DefaultElectrode is the electrode assumed for a potential written without
// one: NHE in water, Fc+/Fc elsewhere.
func (s *Solvent) DefaultElectrode() Electrode {
	if s.Ref == NHE {
		return NHE
	}
	return Fc
}

// Table is a set of solvents looked up by name or alias.
type Table struct {
	list  []*Solvent
	index map[string]*Solvent
}

// NewTable builds a table from solvents; a later solvent with the same key
// replaces an earlier one.
func NewTable(solvents ...*Solvent) *Table {
	t := &Table{index: map[string]*Solvent{}}
	for _, s := range solvents {
		t.Put(s)
	}
	return t
}

func normName(s string) string { return strings.ToLower(strings.Join(strings.Fields(s), "")) }

// Put adds s, or replaces the solvent of the same key (a library's override).
func (t *Table) Put(s *Solvent) {
	k := normName(s.Key)
	if old, ok := t.index[k]; ok {
		for i, x := range t.list {
			if x == old {
				t.list[i] = s
			}
		}
		for n, x := range t.index {
			if x == old {
				delete(t.index, n)
			}
		}
	} else {
		t.list = append(t.list, s)
	}
	t.index[k] = s
	t.index[normName(s.Name)] = s
	for _, a := range s.Aliases {
		t.index[normName(a)] = s
	}
}

// Clone returns a table that can be changed without changing t.
func (t *Table) Clone() *Table { return NewTable(t.list...) }

// All returns the solvents in table order.
func (t *Table) All() []*Solvent { return append([]*Solvent(nil), t.list...) }

// Lookup finds a solvent by key, name or alias, case-insensitively. The error
// suggests the nearest known name.
func (t *Table) Lookup(name string) (*Solvent, error) {
	if s, ok := t.index[normName(name)]; ok {
		return s, nil
	}
	names := make([]string, 0, len(t.index))
	for n := range t.index {
		names = append(names, n)
	}
	sort.Strings(names)
	if near := Nearest(normName(name), names); near != "" {
		return nil, fmt.Errorf("unknown solvent %q (did you mean %s?)", name, t.index[near].Key)
	}
	return nil, fmt.Errorf("unknown solvent %q", name)
}

// Nearest returns the candidate closest to s by edit distance, or "" if none
// is close enough to be a likely typo.
func Nearest(s string, candidates []string) string {
	best, bestD := "", math.MaxInt
	for _, c := range candidates {
		if d := editDistance(s, c); d < bestD {
			best, bestD = c, d
		}
	}
	if bestD <= max(2, len(s)/3) {
		return best
	}
	return ""
}

func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

func worst(a, b Status) Status {
	rank := func(s Status) int {
		switch s {
		case Checked:
			return 0
		case Derived:
			return 1
		case UserGiven:
			return 2
		case FromMemory:
			return 3
		}
		return 4
	}
	if rank(a) >= rank(b) {
		return a
	}
	return b
}
