package units_test

import (
	"encoding/json"
	"fmt"

	"stagewright/api/units"
)

func ExampleParsePressure() {
	for _, s := range []string{"14.7 psia", "12 barg", "750 mmHg", "14.7 psai"} {
		p, err := units.ParsePressure(s, units.StandardAtmosphere)
		if err != nil {
			fmt.Println(err)
			continue
		}
		fmt.Printf("%s = %.1f Pa\n", s, p)
	}
	// Output:
	// 14.7 psia = 101352.9 Pa
	// 12 barg = 1301325.0 Pa
	// 750 mmHg = 99991.8 Pa
	// units: unknown pressure unit "psai"; use Pa, kPa, MPa, bar, bara, barg, psia, psig, atm, mmHg (also hPa, mbar, kPag, MPag, inHg, torr)
}

func ExampleParseTemperature() {
	t, err := units.ParseTemperature("95 degF")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f K\n", t)
	// Output: 308.15 K
}

func ExampleParseStandardVolumeFlow() {
	f, err := units.ParseStandardVolumeFlow("48 MMSCFD")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f m3/s at %s conditions\n", f.Flow, f.Reference)
	// Output: 15.7316 m3/s at us-standard conditions
}

func ExampleQuantity() {
	var in struct {
		Pressure units.Quantity `json:"pressure"`
		Speed    units.Quantity `json:"speed"`
	}
	if err := json.Unmarshal([]byte(`{"pressure": "3.5 MPa", "speed": 21000}`), &in); err != nil {
		fmt.Println(err)
		return
	}
	p, _ := in.Pressure.Pressure(units.StandardAtmosphere)
	n, _ := in.Speed.Speed()
	fmt.Printf("p = %.0f Pa, N = %.0f rev/min\n", p, n)
	// Output: p = 3500000 Pa, N = 21000 rev/min
}
