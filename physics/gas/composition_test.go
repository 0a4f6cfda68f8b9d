package gas_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

func TestLookupComponentAliases(t *testing.T) {
	// Names and formulas as used in the trade; ids are the catalogue's own.
	tests := map[string]string{
		"CH4": "methane", "methane": "methane", "Methane": "methane", "nC4": "n-butane", "n-butane": "n-butane",
		"N-C4H10": "n-butane", "isobutane": "isobutane", "i-C4H10": "isobutane", "iC4": "isobutane",
		"i-pentane": "isopentane", "nC5": "n-pentane", "n_hexane": "n-hexane", "H2S": "hydrogen-sulfide",
		"hydrogen sulphide": "hydrogen-sulfide", "carbon dioxide": "carbon-dioxide", "co2": "carbon-dioxide",
		"propene": "propylene", "ethene": "ethylene", "steam": "water", "AIR": "air", "He": "helium", "nh3": "ammonia",
	}
	for name, id := range tests {
		c, err := gas.LookupComponent(name)
		require.NoError(t, err, name)
		assert.Equal(t, id, c.ID, name)
	}
	for _, bad := range []string{"", "   ", "butanes", "C4H10", "kryptonite"} {
		_, err := gas.LookupComponent(bad)
		require.ErrorIs(t, err, physics.ErrDomain, bad)
		require.ErrorIs(t, err, gas.ErrUnknownComponent, bad)
		assert.Contains(t, err.Error(), `"`+bad+`"`)
	}
}

func TestCatalogueAgainstCriticalConstants(t *testing.T) {
	// critical-constants.csv (values of each fluid's reference EOS): M in
	// g/mol, Tc in K, Pc in kPa, omega.
	want := map[string][4]float64{
		"N2": {28.01348, 126.192, 3395.8, 0.0372}, "O2": {31.9988, 154.581, 5043.0, 0.0222},
		"Ar": {39.948, 150.687, 4863.0, -0.00219}, "CO2": {44.0098, 304.1282, 7377.3, 0.22394},
		"H2O": {18.015268, 647.096, 22064.0, 0.3442920843}, "H2": {2.01588, 33.145, 1296.4, -0.219},
		"He": {4.002602, 5.1953, 227.6, -0.385}, "CO": {28.0101, 132.86, 3494.0, 0.0497},
		"H2S": {34.08088, 373.1, 9000.0, 0.1005}, "CH4": {16.0428, 190.564, 4599.2, 0.01142},
		"C2H6": {30.06904, 305.322, 4872.2, 0.099}, "C3H8": {44.09562, 369.89, 4251.2, 0.1521},
		"i-C4H10": {58.1222, 407.817, 3629.0, 0.183531783208}, "n-C4H10": {58.1222, 425.125, 3796.0, 0.200810094644},
		"i-C5H12": {72.14878, 460.35, 3378.0, 0.2274}, "n-C5H12": {72.14878, 469.7, 3370.0, 0.251},
		"n-C6H14": {86.17536, 507.82, 3034.0, 0.299}, "C2H4": {28.05376, 282.35, 5041.8, 0.0866},
		"C3H6": {42.07974, 364.211, 4555.0, 0.146}, "NH3": {17.03026, 405.4, 11333.0, 0.25601},
		"air": {28.96546, 132.5306, 3786.0, 0.0816749632704},
		// Not in critical-constants.csv: M and Tc from the GERG-2008 table
		// (testdata/reference/gerg2008, components.csv, Kunz & Wagner 2012);
		// Pc and omega from the stored reference-EOS fluid files of an
		// open-source property library, as critical-constants.csv (Span &
		// Wagner 2003, Lemmon & Span 2006).
		"n-C7H16": {100.20194, 540.13, 2736.0, 0.349}, "n-C8H18": {114.22852, 569.32, 2497.0, 0.395},
		"n-C9H20": {128.2551, 594.55, 2281.0, 0.4433}, "n-C10H22": {142.28168, 617.7, 2103.0, 0.4884},
	}
	cat := gas.Components()
	require.Len(t, cat, len(want))
	for f, w := range want {
		c, err := gas.LookupComponent(f)
		require.NoError(t, err)
		assert.InEpsilon(t, w[0]*1e-3, c.MolarMass, 1e-9, f)
		assert.InEpsilon(t, w[1], float64(c.Tc), 1e-9, f)
		assert.InEpsilon(t, w[2]*1e3, float64(c.Pc), 1e-9, f)
		assert.InEpsilon(t, w[3], c.Omega, 1e-9, f)
		assert.NotEmpty(t, c.Sources, f)
		lo, hi := c.TemperatureRange()
		assert.Less(t, float64(lo), 250.0, f)
		assert.GreaterOrEqual(t, float64(hi), 1000.0, f)
	}
	// fresh slices: mutating one result does not change the next
	cat[0].Names[0] = "changed"
	assert.NotEqual(t, "changed", gas.Components()[0].Names[0])
	// the same for LookupComponent, which reads a shared index
	n2, err := gas.LookupComponent("N2")
	require.NoError(t, err)
	n2.Names[0] = "changed"
	n2.HeatCapacity.Ranges[0].Coef[0] = -1
	again, err := gas.LookupComponent("N2")
	require.NoError(t, err)
	assert.NotEqual(t, "changed", again.Names[0])
	assert.Greater(t, again.HeatCapacity.Ranges[0].Coef[0], 0.0)
}

func TestNewCompositionMassBasis(t *testing.T) {
	// 50/50 by mass of CH4 and CO2: x_CH4 = (0.5/16.0428)/(0.5/16.0428 +
	// 0.5/44.0098) = 0.732857 (definition of mole fraction; M from
	// critical-constants.csv).
	c, err := gas.NewComposition([]gas.Fraction{{"methane", 0.5}, {"CO2", 0.5}}, gas.BasisMass)
	require.NoError(t, err)
	x := c.MoleFractions()
	want := (0.5 / 16.0428) / (0.5/16.0428 + 0.5/44.0098)
	assert.InEpsilon(t, want, x[0], 1e-12)
	w := c.MassFractions()
	assert.InEpsilon(t, 0.5, w[0], 1e-12)
	assert.InEpsilon(t, 0.5, w[1], 1e-12)
	// M = 1/Σ(w/M) for a mass basis
	assert.InEpsilon(t, 1/(0.5/16.0428e-3+0.5/44.0098e-3), c.MolarMass(), 1e-12)
}

func TestNewCompositionNormalisesWithinTolerance(t *testing.T) {
	c, err := gas.NewComposition([]gas.Fraction{{"N2", 0.5000004}, {"O2", 0.5}}, "")
	require.NoError(t, err)
	x := c.MoleFractions()
	assert.InDelta(t, 1, x[0]+x[1], 1e-15)
	assert.Equal(t, []string{"nitrogen", "oxygen"}, c.IDs())
}

func TestNewCompositionErrors(t *testing.T) {
	tests := []struct {
		name    string
		fr      []gas.Fraction
		basis   gas.Basis
		contain string
	}{
		{"empty", nil, gas.BasisMole, "empty"},
		{"unknown", []gas.Fraction{{"N2", 0.5}, {"xenon-ish", 0.5}}, gas.BasisMole, "xenon-ish"},
		{"negative", []gas.Fraction{{"N2", 1.1}, {"O2", -0.1}}, gas.BasisMole, "O2"},
		{"NaN", []gas.Fraction{{"N2", math.NaN()}}, gas.BasisMole, "N2"},
		{"Inf", []gas.Fraction{{"N2", math.Inf(1)}}, gas.BasisMole, "N2"},
		{"duplicate alias", []gas.Fraction{{"CH4", 0.5}, {"methane", 0.5}}, gas.BasisMole, "more than once"},
		{"sum", []gas.Fraction{{"N2", 0.79}, {"O2", 0.2}}, gas.BasisMole, "sum to 0.99"},
		{"sum just outside", []gas.Fraction{{"N2", 0.500002}, {"O2", 0.5}}, gas.BasisMole, "sum to"},
		{"basis", []gas.Fraction{{"N2", 1}}, gas.Basis("volume"), "basis"},
	}
	for _, tc := range tests {
		_, err := gas.NewComposition(tc.fr, tc.basis)
		require.ErrorIs(t, err, physics.ErrDomain, tc.name)
		assert.Contains(t, err.Error(), tc.contain, tc.name)
	}
}

func TestDryAirMolarMass(t *testing.T) {
	// ISO 2533:1975 gives M = 28.964420 g/mol for dry air (from memory);
	// the N2/O2/Ar/CO2 part normalised carries it within 2e-5.
	c, err := gas.NamedMixture("dry-air")
	require.NoError(t, err)
	assert.InEpsilon(t, 28.964420e-3, c.MolarMass(), 2e-5)
	assert.Equal(t, 4, c.Len())
	air, err := gas.LookupComponent("air")
	require.NoError(t, err)
	// Lemmon et al. (2000) pseudo-pure air 28.96546 g/mol (critical-constants.csv)
	assert.InEpsilon(t, air.MolarMass, c.MolarMass(), 5e-5)
	_, err = gas.NamedMixture("moon-air")
	require.ErrorIs(t, err, physics.ErrDomain)
}

func TestGERGMixtureMolarMassBookkeeping(t *testing.T) {
	// X-GERG-MIX-400-50000 in real-gas-checks.csv: the 21-component mixture
	// of the NIST AGA8/GERG-2008 reference code has M = 20.5427445016 g/mol
	// (also testdata/reference/gerg2008/README.md). The catalogue holds all
	// 21 components; its molar masses differ from GERG's by < 3e-5
	// relative (e.g. CH4 16.0428 vs 16.04246), hence the tolerance.
	all := []gas.Fraction{
		{"CH4", 0.77824}, {"N2", 0.02}, {"CO2", 0.06}, {"C2H6", 0.08}, {"C3H8", 0.03}, {"iC4", 0.0015},
		{"nC4", 0.003}, {"iC5", 0.0005}, {"nC5", 0.00165}, {"nC6", 0.00215}, {"nC7", 0.00088}, {"n-octane", 0.00024},
		{"nonane", 0.00015}, {"n-C10H22", 0.00009}, {"H2", 0.004}, {"O2", 0.005},
		{"CO", 0.002}, {"H2O", 0.0001}, {"H2S", 0.0025}, {"He", 0.007}, {"Ar", 0.001},
	}
	c, err := gas.NewComposition(all, gas.BasisMole)
	require.NoError(t, err)
	assert.Equal(t, 21, c.Len())
	assert.InEpsilon(t, 20.5427445016e-3, c.MolarMass(), 3e-5)
	// without the heavy ends the fractions no longer sum to 1
	_, err = gas.NewComposition(all[:10], gas.BasisMole)
	require.ErrorIs(t, err, physics.ErrDomain)
}

func TestMixingEntropy(t *testing.T) {
	// Equimolar binary: −R Σ x ln x = R ln 2 = 5.763 J/(mol K) (definition).
	c, err := gas.NewComposition([]gas.Fraction{{"N2", 0.5}, {"Ar", 0.5}}, gas.BasisMole)
	require.NoError(t, err)
	assert.InEpsilon(t, physics.UniversalGasConstant*math.Ln2, c.MixingEntropy(), 1e-12)
	p, err := gas.PureComposition("N2")
	require.NoError(t, err)
	assert.InDelta(t, 0, p.MixingEntropy(), 1e-15)
}
