package gas_test

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/gas"
)

// TestDefaultBinaryParametersTable: every built-in kij names two different
// catalogue components, once, with |kij| < 1 and a cited publication
// (marked "from memory" where no stored copy was checked).
func TestDefaultBinaryParametersTable(t *testing.T) {
	for _, model := range []string{"peng-robinson", "srk"} {
		seen := map[[2]string]bool{}
		for _, bp := range gas.DefaultBinaryParameters(model) {
			a, err := gas.LookupComponent(bp.A)
			require.NoError(t, err, bp.A)
			b, err := gas.LookupComponent(bp.B)
			require.NoError(t, err, bp.B)
			assert.NotEqual(t, a.ID, b.ID)
			key := [2]string{min(a.ID, b.ID), max(a.ID, b.ID)}
			assert.False(t, seen[key], "%s %v given twice", model, key)
			seen[key] = true
			assert.Less(t, bp.Kij, 1.0)
			assert.Greater(t, bp.Kij, -1.0)
			assert.Contains(t, bp.Source, "Knapp", "%s %v", model, key)
			assert.Contains(t, bp.Source, "from memory", "%s %v", model, key)
		}
	}
}

// The gaps the audit of issue 12 found (N2-C3H8, C2H6-H2S and C3H8-H2S were
// 0 under Peng-Robinson while CH4-CO2 0.0919 and N2-C2H6 0.0515 were set)
// are filled from the same table: Knapp et al., DECHEMA Chemistry Data
// Series Vol. VI (1982), Peng-Robinson kij, from memory: N2-C3H8 0.0852,
// C2H6-H2S 0.0840, C3H8-H2S 0.0750, N2-H2S 0.1767.
func TestDefaultBinaryParametersFillTheGaps(t *testing.T) {
	want := map[[2]string]float64{
		{"nitrogen", "propane"}:          0.0852,
		{"ethane", "hydrogen-sulfide"}:   0.0840,
		{"propane", "hydrogen-sulfide"}:  0.0750,
		{"nitrogen", "hydrogen-sulfide"}: 0.1767,
		{"methane", "carbon-dioxide"}:    0.0919,
		{"nitrogen", "ethane"}:           0.0515,
	}
	got := map[[2]string]float64{}
	for _, bp := range gas.DefaultBinaryParameters("peng-robinson") {
		got[[2]string{bp.A, bp.B}] = bp.Kij
		got[[2]string{bp.B, bp.A}] = bp.Kij
	}
	for pair, k := range want {
		v, ok := got[pair]
		require.True(t, ok, "%v has a default", pair)
		assert.InDelta(t, k, v, 1e-12, "%v", pair)
	}
}

// TestModelReportsEveryPair: a cubic model reports the kij of every pair of
// its components with its source: the table, the request, or none (0).
// The hydrogen pairs have no built-in value and say so.
func TestModelReportsEveryPair(t *testing.T) {
	c, err := gas.NewComposition([]gas.Fraction{{"H2", 0.86}, {"CH4", 0.08}, {"C2H6", 0.03}, {"H2S", 0.01}, {"N2", 0.02}}, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewModel("peng-robinson", c, []gas.BinaryParameter{{"H2", "CH4", 0.02, "ignored: the model marks a caller's value"}})
	require.NoError(t, err)
	r, ok := m.(gas.Real)
	require.True(t, ok)
	pairs := r.BinaryParameters()
	require.Len(t, pairs, 5*4/2)
	by := map[string]gas.BinaryParameter{}
	for _, p := range pairs {
		by[p.A+"/"+p.B] = p
		by[p.B+"/"+p.A] = p
	}
	assert.InDelta(t, 0.02, by["hydrogen/methane"].Kij, 1e-12)
	assert.Equal(t, gas.SourceRequest, by["hydrogen/methane"].Source)
	assert.InDelta(t, 0.0840, by["ethane/hydrogen-sulfide"].Kij, 1e-12)
	assert.Contains(t, by["ethane/hydrogen-sulfide"].Source, "Knapp")
	assert.InDelta(t, 0.1767, by["nitrogen/hydrogen-sulfide"].Kij, 1e-12)
	for _, other := range []string{"ethane", "hydrogen-sulfide", "nitrogen"} {
		p := by["hydrogen/"+other]
		assert.Zero(t, p.Kij, other)
		assert.Equal(t, gas.SourceNoDefault, p.Source, other)
	}
	assert.Equal(t, gas.SourceHydrocarbons, by["methane/ethane"].Source)
	for _, p := range pairs {
		assert.NotEmpty(t, p.Source)
		assert.False(t, strings.Contains(p.Source, "ignored"), "the caller's own source text is not echoed")
	}
}
