package thermo

import (
	"fmt"
	"strings"
)

// Electrode is a reference electrode against which a potential is quoted.
type Electrode int

const (
	NoElectrode Electrode = iota
	Fc                    // ferrocenium/ferrocene, Cp2Fe+/0, in the same solvent
	SCE                   // saturated calomel electrode
	NHE                   // normal (= standard) hydrogen electrode, SHE
	AgCl                  // Ag/AgCl, saturated KCl
	AgAg                  // Ag/Ag+, 0.01 M AgNO3 in acetonitrile (a non-aqueous reference)
	RHE                   // reversible hydrogen electrode in water: E(RHE) = E(NHE) + 0.05916·pH
)

var electrodeNames = [...]string{"", "Fc+/Fc", "SCE", "NHE", "Ag/AgCl", "Ag/Ag+", "RHE"}

// Electrodes lists every electrode the tables know, in display order. RHE
// converts only in water and only with a pH (see Solvent.ConvertAt).
var Electrodes = []Electrode{Fc, SCE, NHE, AgCl, AgAg, RHE}

func (e Electrode) String() string {
	if int(e) < len(electrodeNames) {
		return electrodeNames[e]
	}
	return fmt.Sprintf("Electrode(%d)", int(e))
}

// ParseElectrode reads an electrode name, case-insensitively: Fc+/Fc (also
// Fc, Fc/Fc+, Cp2Fe+/0, ferrocene), SCE, NHE or SHE, Ag/AgCl (also AgCl),
// Ag/Ag+ (also Ag/AgNO3, Ag+/Ag), RHE.
func ParseElectrode(s string) (Electrode, error) {
	k := strings.ToLower(strings.Join(strings.Fields(s), ""))
	switch k {
	case "fc+/fc", "fc", "fc/fc+", "fc+/0", "cp2fe+/0", "cp2fe", "ferrocene", "fc+", "ferrocenium":
		return Fc, nil
	case "sce":
		return SCE, nil
	case "nhe", "she":
		return NHE, nil
	case "ag/agcl", "agcl", "ag/agcl(sat.kcl)", "ag/agcl(satkcl)":
		return AgCl, nil
	case "ag/ag+", "ag+/ag", "ag/agno3", "agno3", "ag/ag+(0.01magno3)", "ag/agno3(0.01m)":
		return AgAg, nil
	case "rhe":
		return RHE, nil
	}
	return NoElectrode, fmt.Errorf("unknown reference electrode %q (known: Fc+/Fc, SCE, NHE, SHE, Ag/AgCl, Ag/Ag+, RHE)", s)
}
