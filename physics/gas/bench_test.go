package gas_test

import (
	"testing"

	"stagewright/physics"
	"stagewright/physics/cubic"
	"stagewright/physics/gas"
)

func benchReal(b *testing.B) gas.Real {
	c, err := gas.NewComposition(naturalGas(), gas.BasisMole)
	if err != nil {
		b.Fatal(err)
	}
	m, err := gas.NewReal(cubic.PengRobinson, c, nil)
	if err != nil {
		b.Fatal(err)
	}
	return m
}

// BenchmarkPRState5 is the full Peng-Robinson state of the 5-component
// natural gas at 300 K, 5 MPa, stability test included.
func BenchmarkPRState5(b *testing.B) {
	m := benchReal(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.State(300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPRGasState5 is the same state without the stability test (the
// path used inside flashes). Target: <= 0.5 us, 0 allocs.
func BenchmarkPRGasState5(b *testing.B) {
	m := benchReal(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.GasState(300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPRStateFromPS5 is an isentropic (P,s) flash of the same gas
// from 300 K, 5 MPa to 12 MPa.
func BenchmarkPRStateFromPS5(b *testing.B) {
	m := benchReal(b)
	st, err := m.State(300, 5e6)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.StateFromPS(12e6, st.Entropy); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkIdealState5 is the "ideal" model state of the same gas.
func BenchmarkIdealState5(b *testing.B) {
	c, err := gas.NewComposition(naturalGas(), gas.BasisMole)
	if err != nil {
		b.Fatal(err)
	}
	m, err := gas.NewIdeal(c)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.State(physics.Kelvin(300), 5e6); err != nil {
			b.Fatal(err)
		}
	}
}
