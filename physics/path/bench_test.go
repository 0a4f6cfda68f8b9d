package path_test

import (
	"testing"

	"stagewright/physics/gas"
	"stagewright/physics/path"
)

// The models are held as gas.Model, as a caller holds them, so that the
// conversion to the interface is not counted.

func BenchmarkStepwisePathConstant(b *testing.B) {
	var m gas.Model = airModel(b)
	s1 := suctionState(b, m, 300, 1e5)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := path.StepwisePath(m, s1, 3e5, 0.8); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStepwisePathVirial(b *testing.B) {
	var m gas.Model = co2Virial()
	s1 := suctionState(b, m, 310, 2e6)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := path.StepwisePath(m, s1, 6e6, 0.8); err != nil {
			b.Fatal(err)
		}
	}
}

func benchCompression(b *testing.B, virial bool, eff path.Efficiency, method path.Method) {
	var r path.Result
	var err error
	if virial {
		var m gas.Model = co2Virial()
		s1 := suctionState(b, m, 310, 2e6)
		b.ReportAllocs()
		for b.Loop() {
			if r, err = path.Compression(m, s1, 6e6, eff, method); err != nil {
				b.Fatal(err)
			}
		}
	} else {
		var m gas.Model = airModel(b)
		s1 := suctionState(b, m, 300, 1e5)
		b.ReportAllocs()
		for b.Loop() {
			if r, err = path.Compression(m, s1, 3e5, eff, method); err != nil {
				b.Fatal(err)
			}
		}
	}
	_ = r
}

func BenchmarkCompressionConstantPolytropicStepwise(b *testing.B) {
	benchCompression(b, false, path.Efficiency{Basis: path.Polytropic, Value: 0.8}, path.Stepwise)
}

func BenchmarkCompressionVirialPolytropicStepwise(b *testing.B) {
	benchCompression(b, true, path.Efficiency{Basis: path.Polytropic, Value: 0.8}, path.Stepwise)
}

func BenchmarkCompressionVirialPolytropicSchultz(b *testing.B) {
	benchCompression(b, true, path.Efficiency{Basis: path.Polytropic, Value: 0.8}, path.Schultz)
}

func BenchmarkCompressionVirialIsentropic(b *testing.B) {
	benchCompression(b, true, path.Efficiency{Basis: path.Isentropic, Value: 0.78}, path.Stepwise)
}
