package water_test

import (
	"fmt"

	"stagewright/physics/water"
)

func ExampleSaturationPressure() {
	p, err := water.SaturationPressure(500) // K
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.6f MPa\n", float64(p)/1e6)
	// Output: 2.638898 MPa
}

func ExampleSaturationTemperature() {
	t, err := water.SaturationTemperature(1e6) // Pa
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f K\n", float64(t))
	// Output: 453.0356 K
}

func ExampleWaterMoleFraction() {
	// Air at 25 °C, 60 % relative humidity, 1 atm.
	x, err := water.WaterMoleFraction(0.6, 298.15, 101325)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("x_w = %.5f\n", x)
	// Output: x_w = 0.01877
}

func ExampleDewPointTemperature() {
	// 2 mol % water in a gas at 35 bar.
	tdp, err := water.DewPointTemperature(0.02, 35e5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("dew point %.1f °C\n", float64(tdp)-273.15)
	// Output: dew point 89.9 °C
}

func ExampleWaterCondensation() {
	// Suction air at 30 °C, 80 % RH, 1 atm, after a first stage and an
	// intercooler back to 35 °C at 3.5 bar(a).
	x, err := water.WaterMoleFraction(0.8, 303.15, 101325)
	if err != nil {
		fmt.Println(err)
		return
	}
	c, err := water.WaterCondensation(308.15, x, 3.5e5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("condenses: %v, dew point %.1f °C\n", c.Condenses, float64(c.DewPoint)-273.15)
	// Output: condenses: true, dew point 49.0 °C
}
