package cubic_test

import (
	"fmt"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// CO2 at 280 K and 0.5 MPa with Peng-Robinson; critical constants of
// Span & Wagner (1996). The reference pack gives PR Z = 0.96640.
func ExampleMixture_Residual() {
	m, err := cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{304.1282}, []physics.Pascal{7377.3e3}, []float64{0.22394}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := m.Residual([]float64{1}, 280, 0.5e6)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Z = %.5f, root %v\n", r.Z, r.Root)
	fmt.Printf("(h-h_ig)/RT = %.4f, (s-s_ig)/R = %.4f\n", r.HDep, r.SDep)
	// Output:
	// Z = 0.96640, root only-gas-like
	// (h-h_ig)/RT = -0.0996, (s-s_ig)/R = -0.0663
}

func ExampleNewMixture() {
	// methane + nitrogen with kij = 0.03 (illustrative)
	m, err := cubic.NewMixture(cubic.SoaveRedlichKwong,
		[]physics.Kelvin{190.564, 126.192}, []physics.Pascal{4599.2e3, 3395.8e3}, []float64{0.01142, 0.0372},
		[][]float64{{0, 0.03}, {0.03, 0}})
	fmt.Println(m.Len(), m.Kind(), err)
	_, err = cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{190.564}, []physics.Pascal{-1}, []float64{0.01142}, nil)
	fmt.Println(err)
	// Output:
	// 2 srk <nil>
	// physics: critical pressure of component 0 must be a finite pressure above 0 Pa
}

func ExampleMixture_LnPhi() {
	m, _ := cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{190.564, 305.322}, []physics.Pascal{4599.2e3, 4872.2e3}, []float64{0.01142, 0.099}, nil)
	lnphi := make([]float64, 2)
	z, err := m.LnPhi([]float64{0.9, 0.1}, 300, 5e6, lnphi)
	fmt.Printf("Z = %.4f, ln phi = [%.4f %.4f], err %v\n", z, lnphi[0], lnphi[1], err)
	// Output:
	// Z = 0.8791, ln phi = [-0.1027 -0.3395], err <nil>
}

func ExampleMixture_Stable() {
	m, _ := cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{304.1282}, []physics.Pascal{7377.3e3}, []float64{0.22394}, nil)
	for _, p := range []physics.Pascal{0.5e6, 5e6} {
		ok, err := m.Stable([]float64{1}, 280, p)
		fmt.Println(p, ok, err)
	}
	// Output:
	// 500000 true <nil>
	// 5e+06 false <nil>
}

func ExampleMixture_VapourPressure() {
	m, _ := cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{304.1282}, []physics.Pascal{7377.3e3}, []float64{0.22394}, nil)
	p, err := m.VapourPressure(0, 280)
	fmt.Printf("%.4f MPa %v (Span & Wagner 1996: 4.1607 MPa)\n", float64(p)/1e6, err)
	// Output:
	// 4.1601 MPa <nil> (Span & Wagner 1996: 4.1607 MPa)
}

func ExampleMixture_DewTemperature() {
	m, _ := cubic.NewMixture(cubic.PengRobinson,
		[]physics.Kelvin{190.564, 369.89}, []physics.Pascal{4599.2e3, 4251.2e3}, []float64{0.01142, 0.1521}, nil)
	t, err := m.DewTemperature([]float64{0.9, 0.1}, 1e6)
	fmt.Printf("%.2f K %v\n", float64(t), err)
	// Output:
	// 227.64 K <nil>
}

func ExampleKind_String() {
	fmt.Println(cubic.PengRobinson, cubic.SoaveRedlichKwong)
	// Output: peng-robinson srk
}
