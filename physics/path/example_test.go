package path_test

import (
	"fmt"

	"stagewright/physics/gas"
	"stagewright/physics/path"
)

// The ideal-gas check case of the reference pack (stage-examples.md §8):
// air, T1 = 300 K, pressure ratio 3, polytropic efficiency 0.80.
func ExampleCompression() {
	air, _ := gas.NewConstant(1004.6925, 1.4) // R = 287.055 J/(kg K)
	suction, _ := air.State(300, 100e3)
	r, err := path.Compression(air, suction, 300e3, path.Efficiency{Basis: path.Polytropic, Value: 0.80}, path.Stepwise)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T2 %.2f K, work %.3f kJ/kg\n", r.Discharge.Temperature, r.Work/1e3)
	fmt.Printf("Hp %.3f kJ/kg (%s), Hs %.3f kJ/kg\n", r.PolytropicHead/1e3, r.Method, r.IsentropicHead/1e3)
	fmt.Printf("eta_s %.4f, eta_p %.4f, f %.4f, n %.4f\n", r.IsentropicEfficiency, r.PolytropicEfficiency, r.Schultz.HeadFactor, r.Schultz.N)
	// Output:
	// T2 444.14 K, work 144.818 kJ/kg
	// Hp 115.855 kJ/kg (stepwise), Hs 111.141 kJ/kg
	// eta_s 0.7674, eta_p 0.8000, f 1.0000, n 1.5556
}

func ExampleStepwisePath() {
	air, _ := gas.NewConstant(1004.6925, 1.4)
	suction, _ := air.State(300, 100e3)
	p, err := path.StepwisePath(air, suction, 300e3, 0.80)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("T2 %.2f K, Hp %.3f kJ/kg, converged: %v\n", p.Discharge.Temperature, p.Head/1e3, p.HeadError < path.StepTolerance)
	// Output:
	// T2 444.14 K, Hp 115.855 kJ/kg, converged: true
}

func ExampleSchultzAnalysis() {
	air, _ := gas.NewConstant(1004.6925, 1.4)
	suction, _ := air.State(300, 100e3)
	discharge, _ := air.State(444.1419, 300e3)
	isentropic, _ := air.StateFromPS(300e3, suction.Entropy)
	s, err := path.SchultzAnalysis(suction, discharge, isentropic)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("n %.4f, n_s %.4f, f %.4f, Hp %.3f kJ/kg, eta_p %.4f\n", s.N, s.IsentropicN, s.HeadFactor, s.Head/1e3, s.Efficiency)
	// Output:
	// n 1.5556, n_s 1.4000, f 1.0000, Hp 115.855 kJ/kg, eta_p 0.8000
}

// Rating: the pressure that 144.818 kJ/kg makes at eta_p = 0.80.
func ExampleCompressionForWork() {
	air, _ := gas.NewConstant(1004.6925, 1.4)
	suction, _ := air.State(300, 100e3)
	r, err := path.CompressionForWork(air, suction, 144818, path.Efficiency{Basis: path.Polytropic, Value: 0.80}, path.Stepwise)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p2 %.1f kPa\n", r.Discharge.Pressure/1e3)
	// Output:
	// p2 300.0 kPa
}

func ExamplePerfectGasIsentropicEfficiency() {
	etaS, _ := path.PerfectGasIsentropicEfficiency(0.80, 3, 1.4)
	fmt.Printf("%.4f\n", etaS)
	// Output:
	// 0.7674
}

func ExamplePerfectGasPolytropicEfficiency() {
	etaP, _ := path.PerfectGasPolytropicEfficiency(0.7674, 3, 1.4)
	fmt.Printf("%.4f\n", etaP)
	// Output:
	// 0.8000
}
