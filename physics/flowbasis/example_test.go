package flowbasis_test

import (
	"fmt"

	"stagewright/physics/flowbasis"
	"stagewright/physics/gas"
)

// exampleAir is dry air as a constant-property ideal gas (R = 287.05).
func exampleAir() gas.Constant {
	m, _ := gas.NewConstant(3.5*287.05, 1.4)
	return m
}

func ExampleReferenceNamed() {
	ref, err := flowbasis.ReferenceNamed("us-standard")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %.4f K, %.2f Pa\n", ref.Name, float64(ref.Temperature), float64(ref.Pressure))
	// Output: us-standard: 288.7056 K, 101325.35 Pa
}

func ExampleNormal() {
	ref := flowbasis.Normal()
	fmt.Printf("%s: %.2f K, %.0f Pa\n", ref.Name, float64(ref.Temperature), float64(ref.Pressure))
	// Output: normal: 273.15 K, 101325 Pa
}

func ExampleStandard() {
	ref := flowbasis.Standard()
	fmt.Printf("%s: %.2f K, %.0f Pa\n", ref.Name, float64(ref.Temperature), float64(ref.Pressure))
	// Output: standard: 288.15 K, 101325 Pa
}

func ExampleUSStandard() {
	ref := flowbasis.USStandard()
	fmt.Printf("%.3f K, %.3f Pa\n", float64(ref.Temperature), float64(ref.Pressure))
	// Output: 288.706 K, 101325.353 Pa
}

func ExampleMMSCFD() {
	q := 48 * flowbasis.MMSCFD // m3/s at us-standard conditions
	fmt.Printf("%.4f m3/s\n", float64(q))
	// Output: 15.7316 m3/s
}

func ExampleIdealMolarVolume() {
	v, err := flowbasis.IdealMolarVolume(flowbasis.Normal())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.6f L/mol\n", v*1e3)
	// Output: 22.413970 L/mol
}

func ExampleIdealMolarFlow() {
	n, err := flowbasis.IdealMolarFlow(flowbasis.MMSCFD, flowbasis.USStandard())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("1 MMSCFD = %.2f kmol/h\n", n*3.6)
	// Output: 1 MMSCFD = 49.80 kmol/h
}

func ExampleIdealReferenceDensity() {
	rho, err := flowbasis.IdealReferenceDensity(0.0289647, flowbasis.Normal()) // dry air
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f kg/m3\n", float64(rho))
	// Output: 1.2923 kg/m3
}

func ExampleReferenceDensity() {
	rho, err := flowbasis.ReferenceDensity(exampleAir(), flowbasis.Standard())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f kg/m3\n", float64(rho))
	// Output: 1.2250 kg/m3
}

func ExampleMassFlow() {
	mdot, err := flowbasis.MassFlow(2, 1.2) // 2 m3/s at 1.2 kg/m3
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.1f kg/s\n", float64(mdot))
	// Output: 2.4 kg/s
}

func ExampleVolumeFlow() {
	q, err := flowbasis.VolumeFlow(2.4, 1.2) // 2.4 kg/s at 1.2 kg/m3
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.1f m3/s\n", float64(q))
	// Output: 2.0 m3/s
}

func ExampleActualVolumeFlow() {
	q, err := flowbasis.ActualVolumeFlow(10, exampleAir(), 308.15, 3.5e5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f m3/s\n", float64(q))
	// Output: 2.5273 m3/s
}

func ExampleMassFlowFromActual() {
	mdot, err := flowbasis.MassFlowFromActual(2.5273, exampleAir(), 308.15, 3.5e5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.3f kg/s\n", float64(mdot))
	// Output: 10.000 kg/s
}

func ExampleStandardVolumeFlow() {
	q, err := flowbasis.StandardVolumeFlow(1, exampleAir(), flowbasis.Normal())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("1 kg/s of air = %.1f Nm3/h\n", float64(q/flowbasis.NormalCubicMeterPerHour))
	// Output: 1 kg/s of air = 2785.8 Nm3/h
}

func ExampleMassFlowFromStandard() {
	mdot, err := flowbasis.MassFlowFromStandard(2400*flowbasis.NormalCubicMeterPerHour, exampleAir(), flowbasis.Normal())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f kg/s\n", float64(mdot))
	// Output: 0.8615 kg/s
}

func ExampleActualFromStandard() {
	q, err := flowbasis.ActualFromStandard(2400*flowbasis.NormalCubicMeterPerHour, exampleAir(), flowbasis.Normal(), 308.15, 3.5e5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.5f m3/s\n", float64(q))
	// Output: 0.21773 m3/s
}

func ExampleStandardFromActual() {
	q, err := flowbasis.StandardFromActual(0.21773, exampleAir(), 308.15, 3.5e5, flowbasis.Normal())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.0f Nm3/h\n", float64(q/flowbasis.NormalCubicMeterPerHour))
	// Output: 2400 Nm3/h
}
