// Package thermo holds the thermochemistry of hatsieve: physical constants,
// the solvent and reference-electrode tables, the routes from pKa and E° to a
// bond dissociation free energy (BDFE), the metrics of a donor/acceptor pair,
// multi-step series, the electrode view and the ranking of pairs.
//
// Everything here is pure computation: no file or terminal I/O. Energies are
// carried in kcal/mol and potentials in volts throughout; conversion to kJ/mol
// happens only when a caller formats a number for display (see Units).
//
// The central relation is the thermochemical cycle
//
//	BDFE(X–H) = 2.303RT·pKa(X–H) + F·E°(X•/X⁻) + C_G
//
// with a solvent-specific constant C_G (Bordwell; Warren, Tronic, Mayer,
// Chem. Rev. 2010, 110, 6961; revised in Agarwal et al., Chem. Rev. 2022,
// 122, 1). The package keeps the uncertainty of C_G as its own component so
// that it cancels in a difference of two cycle-derived BDFEs in one solvent.
//
// Every BDFE, ΔG° and H2 line is a 298.15 K quantity (BDFETemperature): the
// temperature in Conditions enters only log10 K. Couples from different
// media are compared on their H2 margins, BDFE(solution) ≈ BDFE(gas) +
// ΔG°solv(H•) (see CrossPhaseNote), which is the same on either C_G basis.
package thermo
