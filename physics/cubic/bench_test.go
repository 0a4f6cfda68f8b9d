package cubic_test

import (
	"testing"

	"github.com/stretchr/testify/assert"

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
