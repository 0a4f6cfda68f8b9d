package similarity_test

import (
	"fmt"

	"stagewright/physics/gas"
	"stagewright/physics/similarity"
)

func ExampleDiluteViscosity() {
	c, _ := gas.LookupComponent("nitrogen")
	eta, _ := similarity.DiluteViscosity(300, similarity.SpeciesOf(c))
	fmt.Printf("%.1f μPa s\n", float64(eta)*1e6)
	// Output: 17.9 μPa s
}

func ExampleMixtureViscosity() {
	var sp []similarity.Species
	for _, n := range []string{"nitrogen", "oxygen", "argon"} {
		c, _ := gas.LookupComponent(n)
		sp = append(sp, similarity.SpeciesOf(c))
	}
	eta, _ := similarity.MixtureViscosity(300, sp, []float64{0.7812, 0.2096, 0.0092})
	fmt.Printf("%.1f μPa s\n", float64(eta)*1e6)
	// Output: 18.5 μPa s
}

func ExampleMachineReynoldsNumber() {
	re, _ := similarity.MachineReynoldsNumber(250, 0.02, 1.2, 1.8e-5)
	fmt.Printf("%.3g\n", re)
	// Output: 3.33e+05
}

func ExampleMachBand() {
	lo, hi := similarity.MachBand(0.5)
	fmt.Printf("%.3f to %.3f\n", lo, hi)
	// Output: -0.138 to 0.161
}

func ExampleCompare() {
	ref := similarity.Point{SpecificVolumeRatio: 0.55, MachineMach: 0.7, MachineReynolds: 2e6, FlowCoefficient: 0.08}
	pt := similarity.Point{SpecificVolumeRatio: 0.60, MachineMach: 0.75, MachineReynolds: 1.5e6, FlowCoefficient: 0.0812}
	ds, _ := similarity.Compare(ref, pt)
	for _, d := range ds {
		fmt.Printf("%s %.3f within %v\n", d.Quantity, d.Measure, d.Within)
	}
	// Output:
	// specific-volume-ratio 1.091 within false
	// machine-mach 0.050 within true
	// machine-reynolds 0.750 within true
	// flow-coefficient 1.015 within true
}
