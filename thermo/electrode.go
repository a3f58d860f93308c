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
)

var electrodeNames = [...]string{"", "Fc+/Fc", "SCE", "NHE", "Ag/AgCl"}

// Electrodes lists every electrode the tables know, in display order.
var Electrodes = []Electrode{Fc, SCE, NHE, AgCl}

func (e Electrode) String() string {
	if int(e) < len(electrodeNames) {
		return electrodeNames[e]
	}
	return fmt.Sprintf("Electrode(%d)", int(e))
}

// ParseElectrode reads an electrode name, case-insensitively: Fc+/Fc (also
// Fc, Fc/Fc+, Cp2Fe+/0, ferrocene), SCE, NHE or SHE, Ag/AgCl (also AgCl).
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
	}
	return NoElectrode, fmt.Errorf("unknown reference electrode %q (known: Fc+/Fc, SCE, NHE, SHE, Ag/AgCl)", s)
}
