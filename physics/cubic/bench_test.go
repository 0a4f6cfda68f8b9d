package cubic_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// Speed targets (brief): Residual ≤ 0.5 µs and 0 allocs/op for a
// 5-component natural gas.
func BenchmarkResidualNaturalGas(b *testing.B) {
	m, x := naturalGas(b, cubic.PengRobinson)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.Residual(x, 300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkFixedResidualNaturalGas: the same state at a composition fixed
// once (Mixture.At), as the gas models evaluate it.
func BenchmarkFixedResidualNaturalGas(b *testing.B) {
	m, x := naturalGas(b, cubic.PengRobinson)
	f, err := m.At(x)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := f.Residual(300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

// TestFixedIsResidual: at a fixed composition the residual properties are
// Mixture.Residual's exactly (the same sums in the same order, so equal to
// the last bit: the answers' bytes depend on it), over gas, liquid and
// three-root states and both cubics; a bad composition and a bad state are
// refused as Residual refuses them.
func TestFixedIsResidual(t *testing.T) {
	for _, kind := range []cubic.Kind{cubic.PengRobinson, cubic.SoaveRedlichKwong} {
		m, x := naturalGas(t, kind)
		f, err := m.At(x)
		require.NoError(t, err)
		for _, tt := range []physics.Kelvin{120, 150, 190, 250, 300, 450, 800} {
			for _, p := range []physics.Pascal{1e4, 1e5, 2e6, 5e6, 2e7} {
				want, werr := m.Residual(x, tt, p)
				got, gerr := f.Residual(tt, p)
				assert.Equal(t, werr, gerr)
				assert.Equal(t, want, got, "%v K, %v Pa", tt, p)
			}
		}
		_, err = f.Residual(-1, 1e5)
		assert.Error(t, err)
		_, err = m.At(x[:len(x)-1])
		assert.Error(t, err)
		_, err = m.At([]float64{0.5, 0.6, 0, 0, 0})
		assert.Error(t, err)
	}
}

func BenchmarkLnPhiNaturalGas(b *testing.B) {
	m, x := naturalGas(b, cubic.PengRobinson)
	out := make([]float64, len(x))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.LnPhi(x, 300, 5e6, out); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStableNaturalGas(b *testing.B) {
	m, x := naturalGas(b, cubic.PengRobinson)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.Stable(x, 300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkVapourPressureCO2(b *testing.B) {
	m := newMixture(b, cubic.PengRobinson, nil, carbonDioxide)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.VapourPressure(0, 280); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDewTemperatureNaturalGas(b *testing.B) {
	m, x := naturalGas(b, cubic.PengRobinson)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.DewTemperature(x, 3e6); err != nil {
			b.Fatal(err)
		}
	}
}

// TestNoAllocations: Residual, LnPhi, Stable, VapourPressure and
// DewTemperature do not allocate on success (design rule for physics hot
// paths; counts, not timings).
func TestNoAllocations(t *testing.T) {
	m, x := naturalGas(t, cubic.PengRobinson)
	out := make([]float64, len(x))
	co2 := newMixture(t, cubic.PengRobinson, nil, carbonDioxide)
	for name, fn := range map[string]func(){
		"Residual":       func() { _, _ = m.Residual(x, 300, 5e6) },
		"LnPhi":          func() { _, _ = m.LnPhi(x, 300, 5e6, out) },
		"Stable":         func() { _, _ = m.Stable(x, 300, 5e6) },
		"VapourPressure": func() { _, _ = co2.VapourPressure(0, 280) },
		"DewTemperature": func() { _, _ = m.DewTemperature(x, 3e6) },
	} {
		assert.Zero(t, testing.AllocsPerRun(20, fn), name)
	}
}
