package similarity_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/similarity"
)

// U b ρ / η by hand: 250 m/s × 0.02 m × 1.2 kg/m3 / 1.8e-5 Pa s = 333 333.
func TestMachineReynoldsNumber(t *testing.T) {
	re, err := similarity.MachineReynoldsNumber(250, 0.02, 1.2, 1.8e-5)
	require.NoError(t, err)
	assert.InEpsilon(t, 250*0.02*1.2/1.8e-5, re, 1e-12)
	for _, bad := range [][4]float64{{0, 0.02, 1.2, 1.8e-5}, {250, math.NaN(), 1.2, 1.8e-5}, {250, 0.02, -1, 1.8e-5}, {250, 0.02, 1.2, 0}, {math.Inf(1), 0.02, 1.2, 1.8e-5}, {1e300, 1e300, 1e300, 1e-300}} {
		_, err := similarity.MachineReynoldsNumber(physics.MeterPerS(bad[0]), physics.Meter(bad[1]), physics.KgPerCubicMeter(bad[2]), similarity.PascalSecond(bad[3]))
		require.ErrorIs(t, err, physics.ErrDomain, "%v", bad)
	}
}

// The Mach band of PTC 10 Fig. 3.3 (from memory) is three pieces that meet:
// at 0.214 the lower line reaches −0.214 (a test Mach number of zero), at
// 0.86 the lines reach −0.042 and +0.07 of the high-Mach piece.
func TestMachBandPiecesMeet(t *testing.T) {
	lo, hi := similarity.MachBand(0.2139999)
	lo2, hi2 := similarity.MachBand(0.214)
	assert.InDelta(t, lo, lo2, 1e-3)
	assert.InDelta(t, hi, hi2, 1e-6)
	lo, hi = similarity.MachBand(0.86)
	assert.InDelta(t, -0.042, lo, 1e-3)
	assert.InDelta(t, 0.07, hi, 1e-3)
	lo, hi = similarity.MachBand(1.2)
	assert.InDelta(t, -0.042, lo, 1e-12)
	assert.InDelta(t, 0.07, hi, 1e-12)
}

func TestCompare(t *testing.T) {
	ref := similarity.Point{SpecificVolumeRatio: 0.55, MachineMach: 0.7, MachineReynolds: 2e6, FlowCoefficient: 0.08}
	same, err := similarity.Compare(ref, ref)
	require.NoError(t, err)
	require.Len(t, same, 4)
	for _, d := range same {
		assert.True(t, d.Within, d.Quantity)
	}
	// Band edges of PTC 10 Table 3.2 (from memory): 0.95-1.05 on the
	// specific-volume ratio, 0.96-1.04 on the flow coefficient.
	pt := ref
	pt.SpecificVolumeRatio = 0.55 * 1.06
	pt.FlowCoefficient = 0.08 * 1.03
	pt.MachineMach = 0.7 + 0.1 // band at 0.7: 0.266×0.7−0.271 = −0.0848 to 0.286−0.175 = 0.111
	pt.MachineReynolds = 2e5 * 0.9
	got, err := similarity.Compare(ref, pt)
	require.NoError(t, err)
	want := map[string]bool{similarity.SpecificVolumeRatio: false, similarity.FlowCoefficient: true,
		similarity.MachineMach: true, similarity.MachineReynolds: false}
	for _, d := range got {
		assert.Equal(t, want[d.Quantity], d.Within, d.Quantity)
	}
	assert.InDelta(t, 0.1, got[1].Measure, 1e-12)
	assert.InDelta(t, -0.0848, got[1].Low, 1e-4)
	// An unknown Reynolds number leaves its check out.
	pt.MachineReynolds = 0
	got, err = similarity.Compare(ref, pt)
	require.NoError(t, err)
	assert.Len(t, got, 3)
	for _, bad := range []similarity.Point{{}, {SpecificVolumeRatio: math.NaN(), MachineMach: 1, FlowCoefficient: 1},
		{SpecificVolumeRatio: 1, MachineMach: 1, FlowCoefficient: 1, MachineReynolds: -1}} {
		_, err := similarity.Compare(ref, bad)
		require.ErrorIs(t, err, physics.ErrDomain)
	}
}
