package service_test

import (
	"context"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// TestEveryComponentUnderEveryModel: issue 3 asks that the endpoints work
// for every catalogue component and for mixtures under all the models.
// Each pure component is taken at 1 bar and T = max(300 K, 1.2 Tc), where
// it is a gas by any model (reduced temperature above 1, low reduced
// pressure); properties must be finite and near the ideal-gas limit
// (Z within 5 % of 1 at p/Pc < 0.05; common practice for the second-virial
// regime), and a small stage must size.
func TestEveryComponentUnderEveryModel(t *testing.T) {
	svc := service.New()
	for _, c := range svc.Components() {
		temp := math.Max(300, 1.2*float64(c.Tc))
		for _, model := range []string{"ideal", "peng-robinson", "srk"} {
			g := service.GasInput{Model: model, Composition: map[string]float64{c.ID: 1}}
			res, err := svc.GasProperties(context.Background(), g, temp, 1e5)
			require.NoError(t, err, "%s %s", c.ID, model)
			st := res.State
			assert.InDelta(t, 1, st.Compressibility, 0.05, "%s %s", c.ID, model)
			assert.Greater(t, float64(st.Cp), float64(st.Cv), "%s %s", c.ID, model)
			assert.Greater(t, float64(st.SoundSpeed), 0.0, "%s %s", c.ID, model)
			d := service.StageDuty{Gas: g, SuctionPressure: 1e5, SuctionTemperature: temp, PressureRatio: f(1.5),
				MassFlow: f(1), Speed: f(15000), PolytropicEfficiency: f(0.8),
				Impeller: service.ImpellerInput{BladeExitAngle: f(30), SlipFactor: f(0.88), ExitMeridionalVelocity: f(60),
					Inlet: service.InletInput{Type: "radial", DiameterRatio: f(0.45), MeridionalVelocity: f(60)}}}
			_, err = svc.SizeStage(context.Background(), d)
			require.NoError(t, err, "%s %s", c.ID, model)
		}
	}
	// ideal-constant takes cp and gamma (air, Çengel & Boles Table A-2: 1005 J/(kg K), 1.4)
	res, err := svc.GasProperties(context.Background(), service.GasInput{Model: "ideal-constant", Cp: f(1005), Gamma: f(1.4)}, 300, 1e5)
	require.NoError(t, err)
	assert.InEpsilon(t, 1e5/(287.14*300), float64(res.State.Density), 1e-3) // p/(R T), R = cp (γ−1)/γ
}

// TestNamedMixtureAndMassBasis: "dry-air" (ISO 2533 N2/O2/Ar/CO2, from
// memory, normalised) expands into its components, and its molar mass is
// that of the standard, 28.9644 g/mol (ISO 2533, from memory; 1e-4 for the
// dropped minor gases). A mass-basis composition of equal masses of CH4 and
// C2H6 has x_CH4 = (1/16.0428)/(1/16.0428 + 1/30.069) (definition; molar
// masses from critical-constants.csv).
func TestNamedMixtureAndMassBasis(t *testing.T) {
	svc := service.New()
	for _, model := range []string{"ideal", "peng-robinson", "srk"} {
		res, err := svc.GasProperties(context.Background(), service.GasInput{Model: model, Composition: map[string]float64{"dry-air": 1}}, 300, 1e5)
		require.NoError(t, err, model)
		assert.InEpsilon(t, 0.0289644, res.State.MolarMass, 1e-4, model)
		assert.Len(t, res.Components, 4)
	}
	res, err := svc.GasProperties(context.Background(), service.GasInput{Model: "ideal", CompositionBasis: "mass",
		Composition: map[string]float64{"CH4": 0.5, "C2H6": 0.5}}, 300, 1e5)
	require.NoError(t, err)
	want := (1 / 16.0428) / (1/16.0428 + 1/30.06904)
	for i, n := range res.Components {
		if n == "methane" {
			assert.InEpsilon(t, want, res.MoleFractions[i], 1e-9)
		}
	}
}

func TestCompositionMerging(t *testing.T) {
	svc := service.New()
	// dry air plus extra nitrogen: the nitrogen parts merge (definition).
	res, err := svc.GasProperties(context.Background(), service.GasInput{Model: "ideal",
		Composition: map[string]float64{"dry-air": 0.5, "N2": 0.5}}, 300, 1e5)
	require.NoError(t, err)
	assert.Len(t, res.Components, 4)
	// the same component under two names is an error naming the second
	_, err = svc.GasProperties(context.Background(), service.GasInput{Model: "ideal",
		Composition: map[string]float64{"CH4": 0.5, "methane": 0.5}}, 300, 1e5)
	var ie *service.InputError
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, "gas.composition.methane", ie.Field)
	assert.True(t, ie.Shape)
}
