package limits_test

import (
	"fmt"

	"stagewright/physics/limits"
)

// A closed steel impeller at 320 m/s tip speed is past the 300 m/s caution
// limit of rules-of-thumb.md §1 (common practice, no source).
func ExampleRule_Check() {
	r, err := limits.TipSpeed(limits.ClosedSteel)
	if err != nil {
		fmt.Println(err)
		return
	}
	a, err := r.Check(320)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s, margin %.3f\n", a.Severity, a.Margin)
	fmt.Println(a.Message())
	// Output:
	// warning, margin -0.067
	// impeller tip speed (closed-steel) 320 m/s exceeds the warning level of 300 m/s
}

func ExampleDischargeTemperature() {
	r, err := limits.DischargeTemperature(limits.ServiceAir)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("warning %.2f K, limit %.2f K\n", r.Warning, r.Limit)
	// Output: warning 473.15 K, limit 503.15 K
}
