package main

import (
	"encoding/json"
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// libraryConfig holds the options of the library command.
type libraryConfig struct {
	files   fileList
	c       common
	solvent string
	find    string
	bond    string
	role    string
	format  string
}

func (lc *libraryConfig) register(fs interface {
	StringVar(p *string, name, value, usage string)
}) {
	fs.StringVar(&lc.solvent, "solvent", "", "list only couples in this solvent (name or alias; also the solvent of couples that name none)")
	fs.StringVar(&lc.find, "find", "", "list only couples whose id, name or source contains TEXT (any case)")
	fs.StringVar(&lc.bond, "bond", "", "list only this bond class: O-H, N-H, C-H, S-H, ... or M-H for any metal–H")
	fs.StringVar(&lc.role, "role", "", "list only donors or acceptors: donor or acceptor")
	fs.StringVar(&lc.format, "format", "text", "output format: text or json")
}

// libraryRow is one couple as the library command lists it.
type libraryRow struct {
	e       *data.Couple
	r       *thermo.Resolved // nil when the couple could not be resolved
	problem string
	basis   string
}

// cmdLibrary lists the couples of the library (embedded, or the files given)
// with their BDFE on the basis in force, each in its own solvent.
func cmdLibrary(args []string, e env) error {
	fs := newFlagSet("library")
	var lc libraryConfig
	lc.files.register(fs)
	lc.c.register(fs)
	lc.register(fs)
	if err := parse(fs, args, e); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("library: unexpected argument %q", fs.Arg(0))
	}
	if lc.format != "text" && lc.format != "json" {
		return usagef("library: --format: want text or json, got %q", lc.format)
	}
	role, err := parseRoleFilter(lc.role)
	if err != nil {
		return err
	}
	bond, err := parseBondFilter(lc.bond)
	if err != nil {
		return err
	}
	early := lc.c
	early.cg = optFloat{}
	if _, _, err := early.conditions(nil); err != nil {
		return err
	}
	rows, cond, units, err := lc.evaluate(e)
	if err != nil {
		return err
	}
	find := strings.ToLower(lc.find)
	kept := rows[:0]
	for _, row := range rows {
		c := row.e
		if role != 0 && c.Roles&role == 0 {
			continue
		}
		if bond != "" && !bondMatches(bond, c.Bond) {
			continue
		}
		if find != "" && !strings.Contains(strings.ToLower(c.ID), find) &&
			!strings.Contains(strings.ToLower(c.Name), find) && !strings.Contains(strings.ToLower(c.Source), find) {
			continue
		}
		kept = append(kept, row)
	}
	if lc.format == "json" {
		return writeLibraryJSON(e.stdout, kept, units)
	}
	return writeLibraryText(e.stdout, kept, cond, units)
}

// evaluate loads the library and resolves every couple in its own solvent.
// With --solvent, only couples in that solvent are kept.
func (lc *libraryConfig) evaluate(e env) ([]libraryRow, thermo.Conditions, thermo.Units, error) {
	lib, err := loadLibrary(e, lc.files)
	if err != nil {
		return nil, thermo.Conditions{}, 0, err
	}
	name := lc.solvent
	if name == "" {
		name = lib.DefaultSolvent
	}
	if name == "" {
		name = "acetonitrile"
	}
	working, err := lib.Solvents.Lookup(name)
	if err != nil {
		return nil, thermo.Conditions{}, 0, fmt.Errorf("--solvent: %v", err)
	}
	if lc.c.cg.set && lc.solvent == "" {
		return nil, thermo.Conditions{}, 0, usagef("--cg needs the solvent it applies to (--solvent)")
	}
	cond, units, err := lc.c.conditions(working)
	if err != nil {
		return nil, thermo.Conditions{}, 0, err
	}
	ev, err := data.Evaluate(lib, data.Options{Solvent: working.Key, Cross: true, Cond: cond})
	if err != nil {
		return nil, cond, units, fmt.Errorf("--solvent %s: %v", working.Key, err)
	}
	basisOf := func(s *thermo.Solvent) string {
		switch {
		case s == nil || s.IsGas():
			return thermo.BasisAbsolute.String()
		case lc.c.cg.set && s == working:
			return "explicit"
		}
		return cond.Basis.String()
	}
	inSolvent := func(s *thermo.Solvent) bool { return lc.solvent == "" || s == working }
	rows := make([]libraryRow, 0, len(ev.All)+len(ev.Problems))
	for _, en := range ev.All {
		if inSolvent(en.Solvent) {
			rows = append(rows, libraryRow{e: en.Couple, r: en.R, basis: basisOf(en.Solvent)})
		}
	}
	for _, p := range ev.Problems {
		s := p.Couple.Solvent
		if s == nil {
			s = working
		}
		if inSolvent(s) {
			rows = append(rows, libraryRow{e: p.Couple, problem: p.Err.Error(), basis: basisOf(s)})
		}
	}
	return rows, cond, units, nil
}

// parseRoleFilter reads --role.
func parseRoleFilter(s string) (thermo.Role, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "":
		return 0, nil
	case "donor", "donors":
		return thermo.RoleDonor, nil
	case "acceptor", "acceptors":
		return thermo.RoleAcceptor, nil
	}
	return 0, usagef("library: --role: want donor or acceptor, got %q", s)
}

// metalBond is the --bond value that stands for any metal–H bond.
const metalBond = "M–H"

// parseBondFilter reads --bond: "O-H" or "O–H" (any dash), or M-H for any
// metal–H bond. It returns the bond with an en dash.
func parseBondFilter(s string) (string, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return "", nil
	}
	b := normBond(s)
	atom, h, ok := strings.Cut(b, "–")
	if !ok || !strings.EqualFold(h, "H") || atom == "" {
		return "", usagef("library: --bond: want a bond to H such as O-H, C-H or M-H, got %q", s)
	}
	if strings.EqualFold(atom, "M") || strings.EqualFold(atom, "metal") {
		return metalBond, nil
	}
	return b, nil
}

// normBond writes a bond with an en dash whatever dash it was typed with.
func normBond(s string) string {
	r := strings.NewReplacer("-", "–", "‐", "–", "‑", "–", "—", "–", "−", "–")
	return strings.TrimSpace(r.Replace(s))
}

// bondMatches reports whether a couple's bond falls under the --bond filter.
func bondMatches(filter, bond string) bool {
	b := normBond(bond)
	if filter == metalBond {
		atom, _, _ := strings.Cut(b, "–")
		return isMetal(atom)
	}
	return strings.EqualFold(b, filter)
}

// metals are the element symbols counted as metals for --bond M-H: the
// alkali and alkaline-earth metals, the d and f blocks, and Al, Ga, In, Tl,
// Sn, Pb, Bi.
var metals = strings.Fields(`Li Na K Rb Cs Be Mg Ca Sr Ba
	Sc Ti V Cr Mn Fe Co Ni Cu Zn Y Zr Nb Mo Tc Ru Rh Pd Ag Cd
	La Hf Ta W Re Os Ir Pt Au Hg Ce Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu
	Th U Al Ga In Tl Sn Pb Bi`)

func isMetal(sym string) bool { return slices.Contains(metals, strings.TrimSpace(sym)) }

// rolesList gives a couple's roles as a JSON list.
func rolesList(r thermo.Role) []string {
	out := []string{}
	if r&thermo.RoleDonor != 0 {
		out = append(out, "donor")
	}
	if r&thermo.RoleAcceptor != 0 {
		out = append(out, "acceptor")
	}
	return out
}

func solventKey(c *data.Couple) string {
	if c.Solvent == nil {
		return ""
	}
	return c.Solvent.Key
}

func writeLibraryJSON(w io.Writer, rows []libraryRow, units thermo.Units) error {
	sfx := units.Suffix()
	out := make([]object, 0, len(rows))
	for _, row := range rows {
		c := row.e
		o := object{}.add("id", c.ID).add("name", c.Name).add("bond", c.Bond).
			add("solvent", solventKey(c)).add("roles", rolesList(c.Roles))
		if row.r != nil {
			o = o.add("bdfe_"+sfx, round(units.From(row.r.BDFE.Kcal))).
				add("sigma_"+sfx, round(units.From(row.r.BDFE.Sigma()))).
				add("basis", row.basis).add("route", row.r.Route.String()).
				add("h2_tendency", row.r.Tendency.String())
		} else {
			o = o.add("bdfe_"+sfx, nil).add("sigma_"+sfx, nil).add("basis", row.basis).
				add("route", nil).add("h2_tendency", nil)
		}
		o = o.add("source", c.Source).add("status", c.Status).add("note", c.Note).
			add("tags", nonNil(c.Tags)).add("file", c.Pos.File)
		if row.problem != "" {
			o = o.add("problem", row.problem)
		}
		out = append(out, o)
	}
	b, err := json.MarshalIndent(out, "", "  ")
	if err != nil {
		return err
	}
	_, err = fmt.Fprintln(w, string(b))
	return err
}

func writeLibraryText(w io.Writer, rows []libraryRow, cond thermo.Conditions, units thermo.Units) error {
	tw := tabwriter.NewWriter(w, 2, 4, 2, ' ', 0)
	fmt.Fprintf(tw, "id\tname\tbond\tsolvent\troles\tBDFE ± σ\troute\tstatus\n")
	for _, row := range rows {
		c := row.e
		val, route := "–", "–"
		if row.r != nil {
			val = fmt.Sprintf("%.1f ± %.1f", units.From(row.r.BDFE.Kcal), units.From(row.r.BDFE.Sigma()))
			route = row.r.Route.Short()
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", data.Printable(c.ID), data.Printable(data.Clip(c.Name, 40, "…")),
			data.Printable(c.Bond), solventKey(c), strings.Join(rolesList(c.Roles), ","), val, route, data.Printable(c.Status))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	basis := fmt.Sprintf("on the %v C_G basis", cond.Basis)
	for key, v := range cond.CG {
		basis += fmt.Sprintf(", with an explicit C_G %.2f %s in %s", units.From(v), units.Label(), data.Printable(key))
	}
	_, err := fmt.Fprintf(w, "%d couples; BDFEs in %s %s (gas phase: absolute); 'hatsieve library --format json' gives sources and notes\n",
		len(rows), units.Label(), basis)
	return err
}
