package similarity_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/similarity"
)

func species(t *testing.T, name string) similarity.Species {
	t.Helper()
	c, err := gas.LookupComponent(name)
	require.NoError(t, err)
	return similarity.SpeciesOf(c)
}

// Dilute-gas viscosities at about 0.1 MPa from the NIST Chemistry WebBook
// fluid tables (from memory); Lucas claims a few per cent for non-polar
// gases (Poling et al. 2001, §9-4), more for the quantum and polar ones.
func TestDiluteViscosityAgainstNIST(t *testing.T) {
	for _, tc := range []struct {
		name string
		t    physics.Kelvin
		want float64 // μPa s
		tol  float64
	}{
		{"nitrogen", 300, 17.89, 0.04},
		{"methane", 300, 11.18, 0.05},
		{"carbon-dioxide", 300, 15.02, 0.05},
		{"propane", 300, 8.20, 0.06},
		{"argon", 300, 22.7, 0.05},
		{"hydrogen", 300, 8.96, 0.10},
		{"helium", 300, 19.9, 0.10},
		{"water", 400, 13.3, 0.10},
		{"nitrogen", 500, 25.8, 0.05},
	} {
		t.Run(tc.name, func(t *testing.T) {
			eta, err := similarity.DiluteViscosity(tc.t, species(t, tc.name))
			require.NoError(t, err)
			assert.InEpsilon(t, tc.want, float64(eta)*1e6, tc.tol)
		})
	}
}

// Air at 300 K and 0.1 MPa: 18.54 μPa s (Lemmon & Jacobsen 2004,
// Int. J. Thermophys. 25:21, from memory), from its three main parts by
// Wilke's rule.
func TestMixtureViscosityAir(t *testing.T) {
	sp := []similarity.Species{species(t, "nitrogen"), species(t, "oxygen"), species(t, "argon")}
	eta, err := similarity.MixtureViscosity(300, sp, []float64{0.7812, 0.2096, 0.0092})
	require.NoError(t, err)
	assert.InEpsilon(t, 18.54, float64(eta)*1e6, 0.04)
}

// Wilke's φii = [1 + 1]²/√16 = 1: a pure gas (or a gas split into two
// equal parts) keeps its own viscosity.
func TestMixtureViscosityPureLimit(t *testing.T) {
	n2 := species(t, "nitrogen")
	pure, err := similarity.DiluteViscosity(320, n2)
	require.NoError(t, err)
	mix, err := similarity.MixtureViscosity(320, []similarity.Species{n2, n2}, []float64{0.3, 0.7})
	require.NoError(t, err)
	assert.InEpsilon(t, float64(pure), float64(mix), 1e-12)
}

func TestViscosityDomain(t *testing.T) {
	n2 := species(t, "nitrogen")
	for _, tc := range []struct {
		name string
		t    physics.Kelvin
		s    similarity.Species
	}{
		{"zero temperature", 0, n2},
		{"NaN temperature", physics.Kelvin(math.NaN()), n2},
		{"infinite temperature", physics.Kelvin(math.Inf(1)), n2},
		{"no molar mass", 300, similarity.Species{Tc: 100, Pc: 1e6}},
		{"NaN Tc", 300, similarity.Species{MolarMass: 0.028, Tc: physics.Kelvin(math.NaN()), Pc: 1e6}},
		{"no Pc", 300, similarity.Species{MolarMass: 0.028, Tc: 100}},
		{"negative dipole", 300, similarity.Species{MolarMass: 0.028, Tc: 100, Pc: 1e6, Dipole: -1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := similarity.DiluteViscosity(tc.t, tc.s)
			require.ErrorIs(t, err, physics.ErrDomain)
		})
	}
	for _, y := range [][]float64{{0.5}, {0, 0}, {math.NaN(), 1}, {-0.1, 1.1}, {math.Inf(1), 0}} {
		_, err := similarity.MixtureViscosity(300, []similarity.Species{n2, n2}, y)
		require.ErrorIs(t, err, physics.ErrDomain, "y = %v", y)
	}
}
