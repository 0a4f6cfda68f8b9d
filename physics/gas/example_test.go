package gas_test

import (
	"fmt"

	"stagewright/physics/cubic"
	"stagewright/physics/gas"
)

func ExampleLookupComponent() {
	c, err := gas.LookupComponent("nC4")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s %s M=%.4f kg/mol Tc=%.3f K\n", c.ID, c.Formula, c.MolarMass, c.Tc)
	_, err = gas.LookupComponent("kryptonite")
	fmt.Println(err)
	// Output:
	// n-butane n-C4H10 M=0.0581 kg/mol Tc=425.125 K
	// physics: unknown gas component "kryptonite"; see the component catalogue for accepted names
}

func ExampleComponents() {
	n := 0
	for _, c := range gas.Components() {
		if c.Formula == "N2" || c.Formula == "air" {
			n++
		}
	}
	fmt.Println(len(gas.Components()), n)
	// Output: 25 2
}

func ExampleIdealGasProperties() {
	// nitrogen from 300 K to 400 K (NIST Shomate fit): about 2917 J/mol
	_, h1, _, _, _ := gas.IdealGasProperties("N2", 300)
	_, h2, _, _, _ := gas.IdealGasProperties("N2", 400)
	fmt.Printf("%.0f J/mol\n", h2-h1)
	// Output: 2917 J/mol
}

func ExampleNewComposition() {
	c, err := gas.NewComposition([]gas.Fraction{{Name: "methane", Value: 0.5}, {Name: "CO2", Value: 0.5}}, gas.BasisMass)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("x = %.4f %.4f, M = %.3f g/mol\n", c.MoleFractions()[0], c.MoleFractions()[1], 1e3*c.MolarMass())
	_, err = gas.NewComposition([]gas.Fraction{{Name: "N2", Value: 0.79}, {Name: "O2", Value: 0.2}}, gas.BasisMole)
	fmt.Println(err)
	// Output:
	// x = 0.7329 0.2671, M = 23.514 g/mol
	// physics: the mole fractions sum to 0.99, not 1 (tolerance 1e-6): correct or normalise the analysis
}

func ExampleNamedMixture() {
	air, _ := gas.NamedMixture("dry-air")
	fmt.Printf("%v %.3f g/mol\n", air.IDs(), 1e3*air.MolarMass())
	// Output: [nitrogen oxygen argon carbon-dioxide] 28.965 g/mol
}

func ExampleNewIdeal() {
	air, _ := gas.NamedMixture("dry-air")
	m, _ := gas.NewIdeal(air)
	st, _ := m.State(300, 101325)
	fmt.Printf("cp = %.1f J/(kg K), kappa = %.3f, a = %.1f m/s\n", st.Cp, st.IsentropicExponent, st.SoundSpeed)
	// Output: cp = 1004.9 J/(kg K), kappa = 1.400, a = 347.2 m/s
}

func ExampleNewModel() {
	c, _ := gas.NewComposition([]gas.Fraction{{Name: "CH4", Value: 0.9}, {Name: "C2H6", Value: 0.1}}, gas.BasisMole)
	m, err := gas.NewModel("peng-robinson", c, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	st, _ := m.State(300, 5e6)
	fmt.Printf("%s: Z = %.4f, rho = %.2f kg/m3, phase %s\n", m.Name(), st.Compressibility, st.Density, st.Phase)
	out, _ := m.StateFromPS(10e6, st.Entropy)
	fmt.Printf("isentropic to 10 MPa: T = %.1f K\n", out.Temperature)
	// Output:
	// peng-robinson: Z = 0.8791, rho = 39.78 kg/m3, phase supercritical
	// isentropic to 10 MPa: T = 354.0 K
}

func ExampleNewReal() {
	c, _ := gas.PureComposition("CO2")
	m, _ := gas.NewReal(cubic.SoaveRedlichKwong, c, nil)
	st, _ := m.State(280, 5e6)
	fmt.Println(st.Phase, st.Validity.Notes())
	// Output: liquid [the equation of state reports a liquid or two-phase state: the gas may condense]
}

func ExampleDefaultBinaryParameters() {
	for _, bp := range gas.DefaultBinaryParameters("peng-robinson")[:2] {
		fmt.Printf("%s/%s %.4f\n", bp.A, bp.B, bp.Kij)
	}
	// Output:
	// methane/carbon-dioxide 0.0919
	// nitrogen/methane 0.0311
}
