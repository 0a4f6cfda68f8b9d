package gas

import (
	"strconv"
	"strings"
	"sync"

	"stagewright/physics"
)

// Component is one entry of the gas catalogue: identity, molar mass,
// critical constants, acentric factor and ideal-gas heat capacity.
type Component struct {
	// ID is the catalogue's canonical name, e.g. "n-butane".
	ID string
	// Formula is the chemical formula, e.g. "n-C4H10"; "air" for the
	// pseudo-component.
	Formula string
	// Names are the accepted aliases (formulas and common names); lookup is
	// case-insensitive and ignores spaces, '-' and '_'.
	Names []string
	// MolarMass in kg/mol.
	MolarMass float64
	// Tc, Pc and Omega are the critical temperature, critical pressure and
	// Pitzer acentric factor used by the cubic equations of state.
	Tc    physics.Kelvin
	Pc    physics.Pascal
	Omega float64
	// HeatCapacity is the ideal-gas cp(T) correlation with its ranges.
	HeatCapacity HeatCapacity
	// Sources names where each number comes from.
	Sources []string
}

// TemperatureRange returns the lowest and highest temperature covered by
// the component's ideal-gas cp correlation (before extrapolation margins).
func (c Component) TemperatureRange() (lo, hi physics.Kelvin) {
	_, l, h := componentTerms(c, 1)
	return physics.Kelvin(l), physics.Kelvin(h)
}

// Source texts shared by several components.
const (
	srcShomate = "ideal-gas cp: NIST Chemistry WebBook, Shomate equation (M. W. Chase, NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, 1998); coefficients as in testdata/reference/shomate.csv, which says which were confirmed by stored copies and which are from memory"
	srcPoling  = "ideal-gas cp: B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), Appendix A Section C, cp/R polynomial; coefficients from memory"
	srcCrit    = "M, Tc, Pc, omega: values of the reference equation of state "
	srcMono    = "ideal-gas cp: monatomic ideal gas, cp = 5/2 R (kinetic theory; NIST Shomate A = 20.786 J/(mol K) for argon agrees)"
	srcFitGERG = "ideal-gas cp: cp/R polynomial (the form of Poling et al. 2001) fitted here by relative least squares over 200-1000 K to the GERG-2008 ideal-gas heat capacity (Jaeschke & Schley 1995, Int. J. Thermophys. 16:1381; coefficients in testdata/reference/gerg2008/ideal_gas.csv); largest deviation from it over 200-1000 K"
)

// ISO 2533 dry-air composition restricted to N2, O2, Ar and CO2 (mole
// fractions 0.78084, 0.209476, 0.00934, 0.000314; ISO 2533:1975 Standard
// Atmosphere, Table 1, from memory). They sum to 0.99997 (Ne, He, Kr, ...
// are left out) and are normalised to 1 where used.
func isoAirFractions() []Fraction {
	return []Fraction{
		{Name: "nitrogen", Value: 0.78084},
		{Name: "oxygen", Value: 0.209476},
		{Name: "argon", Value: 0.00934},
		{Name: "carbon-dioxide", Value: 0.000314},
	}
}

func shomate(lo, hi physics.Kelvin, a, b, c, d, e float64, note string) CpRange {
	src := srcShomate
	if note != "" {
		src += "; " + note
	}
	return CpRange{Form: FormShomate, TLow: lo, THigh: hi, Coef: [5]float64{a, b, c, d, e}, Source: src}
}

// poling takes the coefficients as printed in the book (a1·10³, a2·10⁵,
// a3·10⁸, a4·10¹¹) and stores them in SI.
func poling(lo, hi physics.Kelvin, a0, a1, a2, a3, a4 float64) CpRange {
	return CpRange{Form: FormPolyR, TLow: lo, THigh: hi,
		Coef: [5]float64{a0, a1 * 1e-3, a2 * 1e-5, a3 * 1e-8, a4 * 1e-11}, Source: srcPoling}
}

// fitGERG is poling for the heavy alkanes, whose polynomials were fitted
// to the GERG-2008 ideal-gas cp (srcFitGERG; physics/gas tests compare
// them with it).
func fitGERG(lo, hi physics.Kelvin, a0, a1, a2, a3, a4 float64) CpRange {
	r := poling(lo, hi, a0, a1, a2, a3, a4)
	r.Source = srcFitGERG
	return r
}

func monatomic(lo, hi physics.Kelvin) CpRange {
	return CpRange{Form: FormPolyR, TLow: lo, THigh: hi, Coef: [5]float64{2.5}, Source: srcMono}
}

// Components returns the gas catalogue, a fresh slice on every call: air
// (pseudo-component), N2, O2, Ar, CO2, H2O, H2, He, CO, H2S, CH4, C2H6,
// C3H8, i-C4H10, n-C4H10, i-C5H12, n-C5H12, n-C6H14, n-C7H16, n-C8H18,
// n-C9H20, n-C10H22, C2H4, C3H6, NH3.
//
// Molar mass, Tc, Pc and omega are the values carried by the reference
// equation of state of each fluid (the EOS paper is named in Sources); the
// ideal-gas cp correlations are NIST Shomate fits where NIST gives one and
// the Poling et al. (2001) polynomials otherwise, each range with its
// source.
func Components() []Component {
	return []Component{
		{
			ID: "air", Formula: "air", Names: []string{"air", "dry air"},
			MolarMass: 28.96546e-3, Tc: 132.5306, Pc: 3786.0e3, Omega: 0.0816749632704,
			HeatCapacity: HeatCapacity{Blend: []BlendTerm{
				{"nitrogen", 0.78084}, {"oxygen", 0.209476}, {"argon", 0.00934}, {"carbon-dioxide", 0.000314},
			}},
			Sources: []string{
				srcCrit + "(pseudo-pure air; Lemmon, Jacobsen, Penoncello & Friend 2000, J. Phys. Chem. Ref. Data 29:331, from memory); Tc/Pc are the maxcondentherm reducing point; the omega 0.0817 is that file's value (a value near 0.035 is often quoted, from memory)",
				"ideal-gas cp: mole-weighted N2/O2/Ar/CO2 of ISO 2533:1975 dry air (from memory), each by its own catalogue correlation",
				"for mixtures with air prefer the dry-air mixture (N2+O2+Ar+CO2) over the pseudo-component (common practice)",
			},
		},
		{
			ID: "nitrogen", Formula: "N2", Names: []string{"N2", "nitrogen"},
			MolarMass: 28.01348e-3, Tc: 126.192, Pc: 3395.8e3, Omega: 0.0372,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				shomate(100, 500, 28.98641, 1.853978, -9.647459, 16.63537, 0.000117, ""),
				shomate(500, 2000, 19.50583, 19.88705, -8.598535, 1.369784, 0.527601, ""),
				shomate(2000, 6000, 35.51872, 1.128728, -0.196103, 0.014662, -4.55376, ""),
			}},
			Sources: []string{srcCrit + "(Span, Lemmon, Jacobsen, Wagner & Yokozeki 2000, J. Phys. Chem. Ref. Data 29:1361)", srcShomate},
		},
		{
			ID: "oxygen", Formula: "O2", Names: []string{"O2", "oxygen"},
			MolarMass: 31.9988e-3, Tc: 154.581, Pc: 5043.0e3, Omega: 0.0222,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				shomate(100, 700, 31.32234, -20.23531, 57.86644, -36.50624, -0.007374, ""),
				shomate(700, 2000, 30.03235, 8.772972, -3.988133, 0.788313, -0.741599, ""),
			}},
			Sources: []string{srcCrit + "(Schmidt & Wagner 1985 oxygen EOS, from memory)", srcShomate},
		},
		{
			ID: "argon", Formula: "Ar", Names: []string{"Ar", "argon"},
			MolarMass: 39.948e-3, Tc: 150.687, Pc: 4863.0e3, Omega: -0.00219,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				monatomic(50, 298),
				shomate(298, 6000, 20.786, 2.825911e-07, -1.464191e-07, 1.092131e-08, -3.661371e-08, ""),
			}},
			Sources: []string{srcCrit + "(Tegeler, Span & Wagner 1999, J. Phys. Chem. Ref. Data 28:779)", srcMono + " below 298 K", srcShomate},
		},
		{
			ID: "carbon-dioxide", Formula: "CO2", Names: []string{"CO2", "carbon dioxide"},
			MolarMass: 44.0098e-3, Tc: 304.1282, Pc: 7377.3e3, Omega: 0.22394,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 298, 3.259, 1.356, 1.502, -2.374, 1.056),
				shomate(298, 1200, 24.99735, 55.18696, -33.69137, 7.948387, -0.136638, ""),
				shomate(1200, 6000, 58.16639, 2.720074, -0.492289, 0.038844, -6.447293, ""),
			}},
			Sources: []string{srcCrit + "(Span & Wagner 1996, J. Phys. Chem. Ref. Data 25:1509)", srcPoling + " (below 298 K)", srcShomate},
		},
		{
			ID: "water", Formula: "H2O", Names: []string{"H2O", "water", "steam", "water vapour", "water vapor"},
			MolarMass: 18.015268e-3, Tc: 647.096, Pc: 22064.0e3, Omega: 0.3442920843,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 500, 4.395, -4.186, 1.405, -1.564, 0.632),
				shomate(500, 1700, 30.092, 6.832514, 6.793435, -2.53448, 0.082139, ""),
				shomate(1700, 6000, 41.96426, 8.622053, -1.49978, 0.098119, -11.15764, ""),
			}},
			Sources: []string{srcCrit + "(IAPWS-95, Wagner & Pruss 2002, J. Phys. Chem. Ref. Data 31:387)", srcPoling + " (below 500 K, where NIST gives no gas-phase Shomate fit)", srcShomate},
		},
		{
			ID: "hydrogen", Formula: "H2", Names: []string{"H2", "hydrogen", "normal hydrogen"},
			MolarMass: 2.01588e-3, Tc: 33.145, Pc: 1296.4e3, Omega: -0.219,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 298, 2.883, 3.681, -0.772, 0.692, -0.213),
				shomate(298, 1000, 33.066178, -11.363417, 11.432816, -2.772874, -0.158558, ""),
				shomate(1000, 2500, 18.563083, 12.257357, -2.859786, 0.268238, 1.97799, "1000-2500 K coefficients from memory (not confirmed by a stored copy)"),
			}},
			Sources: []string{srcCrit + "(normal hydrogen, Leachman et al. 2009, from memory); cubic-EOS users often prefer quantum-corrected effective Tc/Pc (common practice)", srcPoling + " (below 298 K)", srcShomate},
		},
		{
			ID: "helium", Formula: "He", Names: []string{"He", "helium"},
			MolarMass: 4.002602e-3, Tc: 5.1953, Pc: 227.6e3, Omega: -0.385,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{monatomic(2.2, 6000)}},
			Sources:      []string{srcCrit + "(Ortiz-Vega 2010 helium EOS reducing state)", srcMono},
		},
		{
			ID: "carbon-monoxide", Formula: "CO", Names: []string{"CO", "carbon monoxide"},
			MolarMass: 28.0101e-3, Tc: 132.86, Pc: 3494.0e3, Omega: 0.0497,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 298, 3.912, -3.913, 1.182, -1.302, 0.515),
				shomate(298, 1300, 25.56759, 6.09613, 4.054656, -2.671301, 0.131021, ""),
				shomate(1300, 6000, 35.1507, 1.300095, -0.205921, 0.01355, -3.28278, ""),
			}},
			Sources: []string{srcCrit + "(Lemmon & Span 2006 short form, from memory)", srcPoling + " (below 298 K)", srcShomate},
		},
		{
			ID: "hydrogen-sulfide", Formula: "H2S", Names: []string{"H2S", "hydrogen sulfide", "hydrogen sulphide"},
			MolarMass: 34.08088e-3, Tc: 373.1, Pc: 9000.0e3, Omega: 0.1005,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 4.266, -3.438, 1.319, -1.331, 0.488)}},
			Sources:      []string{srcCrit + "(Lemmon & Span 2006 short form, from memory)", srcPoling},
		},
		{
			ID: "methane", Formula: "CH4", Names: []string{"CH4", "methane", "C1"},
			MolarMass: 16.0428e-3, Tc: 190.564, Pc: 4599.2e3, Omega: 0.01142,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 298, 4.568, -8.975, 3.631, -3.407, 1.091),
				shomate(298, 1300, -0.703029, 108.4773, -42.52157, 5.862788, 0.678565, ""),
				shomate(1300, 6000, 85.81217, 11.26467, -2.114146, 0.13819, -26.42221, ""),
			}},
			Sources: []string{srcCrit + "(Setzmann & Wagner 1991, J. Phys. Chem. Ref. Data 20:1061)", srcPoling + " (below 298 K)", srcShomate},
		},
		{
			ID: "ethane", Formula: "C2H6", Names: []string{"C2H6", "ethane", "C2"},
			MolarMass: 30.06904e-3, Tc: 305.322, Pc: 4872.2e3, Omega: 0.099,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 4.178, -4.427, 5.660, -6.651, 2.487)}},
			Sources:      []string{srcCrit + "(Buecker & Wagner 2006, J. Phys. Chem. Ref. Data 35:205)", srcPoling},
		},
		{
			ID: "propane", Formula: "C3H8", Names: []string{"C3H8", "propane", "C3"},
			MolarMass: 44.09562e-3, Tc: 369.89, Pc: 4251.2e3, Omega: 0.1521,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 3.847, 5.131, 6.011, -7.893, 3.079)}},
			Sources:      []string{srcCrit + "(Lemmon, McLinden & Wagner 2009, J. Chem. Eng. Data 54:3141)", srcPoling},
		},
		{
			ID: "isobutane", Formula: "i-C4H10", Names: []string{"i-C4H10", "isobutane", "i-butane", "iC4", "2-methylpropane", "R600a"},
			MolarMass: 58.1222e-3, Tc: 407.817, Pc: 3629.0e3, Omega: 0.183531783208,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 3.351, 17.883, 5.477, -8.099, 3.243)}},
			Sources:      []string{srcCrit + "(Buecker & Wagner 2006 butane EOS, from memory)", srcPoling},
		},
		{
			ID: "n-butane", Formula: "n-C4H10", Names: []string{"n-C4H10", "n-butane", "butane", "nC4", "R600"},
			MolarMass: 58.1222e-3, Tc: 425.125, Pc: 3796.0e3, Omega: 0.200810094644,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(200, 1000, 5.547, 5.536, 8.057, -10.571, 4.134)}},
			Sources:      []string{srcCrit + "(Buecker & Wagner 2006 butane EOS, from memory)", srcPoling},
		},
		{
			ID: "isopentane", Formula: "i-C5H12", Names: []string{"i-C5H12", "isopentane", "i-pentane", "iC5", "2-methylbutane"},
			MolarMass: 72.14878e-3, Tc: 460.35, Pc: 3378.0e3, Omega: 0.2274,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(200, 1000, 1.959, 38.191, 2.434, -5.175, 2.165)}},
			Sources:      []string{srcCrit + "(Lemmon & Span 2006 short form, from memory)", srcPoling},
		},
		{
			ID: "n-pentane", Formula: "n-C5H12", Names: []string{"n-C5H12", "n-pentane", "pentane", "nC5"},
			MolarMass: 72.14878e-3, Tc: 469.7, Pc: 3370.0e3, Omega: 0.251,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(200, 1000, 7.554, -0.368, 11.846, -14.939, 5.753)}},
			Sources:      []string{srcCrit + "(Span & Wagner 2003, Int. J. Thermophys. 24:41)", srcPoling},
		},
		{
			ID: "n-hexane", Formula: "n-C6H14", Names: []string{"n-C6H14", "n-hexane", "hexane", "nC6"},
			MolarMass: 86.17536e-3, Tc: 507.82, Pc: 3034.0e3, Omega: 0.299,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(200, 1000, 8.831, -0.166, 14.302, -18.314, 7.124)}},
			Sources:      []string{srcCrit + "(Span & Wagner 2003 short form, from memory)", srcPoling},
		},
		{
			ID: "n-heptane", Formula: "n-C7H16", Names: []string{"n-C7H16", "n-heptane", "heptane", "nC7"},
			MolarMass: 100.20194e-3, Tc: 540.13, Pc: 2736.0e3, Omega: 0.349,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{fitGERG(200, 1000, 10.602425, -4.878826, 18.488168, -24.160358, 9.718748)}},
			Sources:      []string{srcCrit + "(Span & Wagner 2003, Int. J. Thermophys. 24:41, short form; from the stored fluid file of an open-source property library, as critical-constants.csv is); M of GERG-2008 (Kunz & Wagner 2012)", srcFitGERG + " 0.71 %"},
		},
		{
			ID: "n-octane", Formula: "n-C8H18", Names: []string{"n-C8H18", "n-octane", "octane", "nC8"},
			MolarMass: 114.22852e-3, Tc: 569.32, Pc: 2497.0e3, Omega: 0.395,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{fitGERG(200, 1000, 11.749078, -3.824470, 20.736236, -27.295451, 10.987962)}},
			Sources:      []string{srcCrit + "(Span & Wagner 2003, Int. J. Thermophys. 24:41, short form; from the stored fluid file of an open-source property library, as critical-constants.csv is); M of GERG-2008 (Kunz & Wagner 2012)", srcFitGERG + " 0.81 %"},
		},
		{
			ID: "n-nonane", Formula: "n-C9H20", Names: []string{"n-C9H20", "n-nonane", "nonane", "nC9"},
			MolarMass: 128.2551e-3, Tc: 594.55, Pc: 2281.0e3, Omega: 0.4433,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{fitGERG(200, 1000, 13.036076, -3.975887, 23.371114, -30.961092, 12.512463)}},
			Sources:      []string{srcCrit + "(Lemmon & Span 2006, J. Chem. Eng. Data 51:785, short form; from the stored fluid file of an open-source property library, as critical-constants.csv is); M of GERG-2008 (Kunz & Wagner 2012)", srcFitGERG + " 0.84 %"},
		},
		{
			ID: "n-decane", Formula: "n-C10H22", Names: []string{"n-C10H22", "n-decane", "decane", "nC10"},
			MolarMass: 142.28168e-3, Tc: 617.7, Pc: 2103.0e3, Omega: 0.4884,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{fitGERG(200, 1000, 14.655666, -6.836978, 26.773440, -35.497488, 14.381140)}},
			Sources:      []string{srcCrit + "(Lemmon & Span 2006, J. Chem. Eng. Data 51:785, short form; from the stored fluid file of an open-source property library, as critical-constants.csv is); M of GERG-2008 (Kunz & Wagner 2012)", srcFitGERG + " 0.70 %"},
		},
		{
			ID: "ethylene", Formula: "C2H4", Names: []string{"C2H4", "ethylene", "ethene"},
			MolarMass: 28.05376e-3, Tc: 282.35, Pc: 5041.8e3, Omega: 0.0866,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 4.221, -8.782, 5.795, -6.729, 2.511)}},
			Sources:      []string{srcCrit + "(Smukala, Span & Wagner 2000, from memory)", srcPoling},
		},
		{
			ID: "propylene", Formula: "C3H6", Names: []string{"C3H6", "propylene", "propene"},
			MolarMass: 42.07974e-3, Tc: 364.211, Pc: 4555.0e3, Omega: 0.146,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{poling(50, 1000, 3.834, 3.893, 4.688, -6.013, 2.283)}},
			Sources:      []string{srcCrit + "(Lemmon et al. propylene EOS, from memory)", srcPoling},
		},
		{
			ID: "ammonia", Formula: "NH3", Names: []string{"NH3", "ammonia", "R717"},
			MolarMass: 17.03026e-3, Tc: 405.4, Pc: 11333.0e3, Omega: 0.25601,
			HeatCapacity: HeatCapacity{Ranges: []CpRange{
				poling(50, 298, 4.238, -4.215, 2.041, -2.126, 0.761),
				shomate(298, 1400, 19.99563, 49.77119, -15.37599, 1.921168, 0.189174, "T range 298-1400 K from memory"),
			}},
			Sources: []string{srcCrit + "(Tillner-Roth et al. 1993, from memory)", srcPoling + " (below 298 K)", srcShomate},
		},
	}
}

// normName folds a component name for lookup: lower case without spaces,
// '-' and '_'.
func normName(s string) string {
	var b strings.Builder
	b.Grow(len(s))
	for _, r := range strings.ToLower(s) {
		if r == ' ' || r == '-' || r == '_' || r == '\t' {
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

// LookupComponent returns the catalogue component with id, formula or
// alias name (case-insensitive; spaces, '-' and '_' ignored, so "nC4",
// "n-butane" and "N-C4H10" all find n-butane). An unknown name returns a
// *physics.DomainError naming it that also matches ErrUnknownComponent.
func LookupComponent(name string) (Component, error) {
	if c, ok := lookupIndex()[normName(name)]; ok && name != "" {
		return c.clone(), nil
	}
	return Component{}, unknownComponent(name)
}

// componentID returns the catalogue id of a component name without
// copying the component (for hot paths that only compare identities).
func componentID(name string) (string, bool) {
	c, ok := lookupIndex()[normName(name)]
	if !ok || name == "" {
		return "", false
	}
	return c.ID, true
}

// clone returns c with its own copies of every slice, so that a caller
// who changes the returned component cannot change the shared index.
func (c Component) clone() Component {
	c.Names = append([]string(nil), c.Names...)
	c.Sources = append([]string(nil), c.Sources...)
	c.HeatCapacity.Ranges = append([]CpRange(nil), c.HeatCapacity.Ranges...)
	c.HeatCapacity.Blend = append([]BlendTerm(nil), c.HeatCapacity.Blend...)
	return c
}

// lookupIndex maps every folded id and alias to its component. It is built
// once, on first use, and never changed afterwards (an immutable value, not
// mutable package state); LookupComponent hands out deep copies (clone), so
// no caller can reach the index's slices.
var lookupIndex = sync.OnceValue(func() map[string]Component {
	idx := map[string]Component{}
	for _, c := range Components() {
		idx[normName(c.ID)] = c
		for _, n := range c.Names {
			idx[normName(n)] = c
		}
	}
	return idx
})

// componentIndex returns the position of the component with id in the
// catalogue, or -1.
func componentIndex(cat []Component, id string) int {
	for i := range cat {
		if cat[i].ID == id {
			return i
		}
	}
	return -1
}

// componentTerms returns the prepared cp terms of component c scaled by
// weight, and the temperature limits shared by all of them.
func componentTerms(c Component, weight float64) (terms []cpTerm, lo, hi float64) {
	if len(c.HeatCapacity.Blend) == 0 {
		r := c.HeatCapacity.Ranges
		return []cpTerm{{weight: weight, pieces: preparePieces(r)}}, float64(r[0].TLow), float64(r[len(r)-1].THigh)
	}
	cat := Components()
	lo, hi = 0, 1e300
	sum := 0.0
	for _, b := range c.HeatCapacity.Blend {
		sum += b.Fraction
	}
	for _, b := range c.HeatCapacity.Blend {
		sub := cat[componentIndex(cat, b.Component)]
		t, l, h := componentTerms(sub, weight*b.Fraction/sum)
		terms = append(terms, t...)
		lo, hi = max(lo, l), min(hi, h)
	}
	return terms, lo, hi
}

func formatK(t float64) string {
	return strconv.FormatFloat(t, 'g', 6, 64) + " K"
}
