package stage_test

import (
	"math"
	"reflect"
	"strconv"
	"testing"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/stage"
)

// FuzzSize: any inputs give an error or a finite sizing with positive
// lengths (STYLE.md: fuzz physics, err != nil or a finite result). It
// covers the eye choices (given eye tip diameter, given cm1, optimum eye
// when both are 0), prewhirl and exit blockage.
func FuzzSize(f *testing.F) {
	f.Add(194e3, 0.9, 1.04, 0.0, 142.6, 142.6, 0.5, 0.0, 9.0, 17400.0, 0.78, true, 0.0, 0.0, 0.0)
	f.Add(60e3, 0.88, 1.02, 40.0, 60.0, 60.0, 0.4, 0.45, 12.0, 14500.0, 0.8, false, 0.0, 0.0, 0.05)
	f.Add(1e3, 1.0, 1.0, 75.0, 1.0, 1.0, 0.0, 0.99, 1e-3, 1e5, 1.0, false, 0.0, 0.0, 0.0)
	f.Add(194e3, 0.9, 1.04, 0.0, 142.6, 0.0, 0.5, 0.0, 9.0, 17400.0, 0.78, true, 0.3, 0.0, 0.0)
	f.Add(194e3, 0.9, 1.04, 30.0, 142.6, 0.0, 0.5, 0.0, 9.0, 17400.0, 0.78, true, 0.0, 30.0, 0.1)
	f.Add(20e3, 0.9, 1.0, 0.0, 50.0, 0.0, 0.7, 0.0, 30.0, 17400.0, 0.78, true, 0.0, 60.0, 0.0)
	f.Add(194e3, 0.9, 1.04, 0.0, 142.6, 0.0, 0.5, 0.0, 9.0, 17400.0, 0.78, true, 0.1, -30.0, 0.0)
	air, err := gas.NewConstant(1005, 1.4)
	if err != nil {
		f.Fatal(err)
	}
	s01, err := air.State(295, 1.1e5)
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, w, slip, psi, beta, cr2, cm1, hub, ratio, mdot, speed, eta float64, eye bool, eyeTip, prewhirl, blockage float64) {
		d := stage.Duty{Model: air, Suction: s01, Work: physics.JoulePerKg(w), IsentropicEfficiency: eta,
			ImpellerLossShare: 0.5, MassFlow: physics.KgPerS(mdot), Speed: physics.RevPerMin(speed)}
		imp := stage.Impeller{BladeExitAngle: beta, SlipFactor: slip, PowerInputFactor: psi,
			ExitMeridionalVelocity: physics.MeterPerS(cr2), ExitBlockage: blockage}
		in := stage.Inlet{Kind: stage.InletRadial, DiameterRatio: ratio, MeridionalVelocity: physics.MeterPerS(cm1), PrewhirlAngle: prewhirl}
		if eye {
			in = stage.Inlet{Kind: stage.InletAxialEye, HubRatio: hub, MeridionalVelocity: physics.MeterPerS(cm1),
				EyeTipDiameter: physics.Meter(eyeTip), PrewhirlAngle: prewhirl}
		}
		got, err := stage.Size(d, imp, in)
		if err != nil {
			return
		}
		if bad := nonFinite(reflect.ValueOf(got), "result"); bad != "" {
			t.Fatalf("non-finite %s for %+v %+v %+v", bad, d, imp, in)
		}
		g, v := got.Geometry, got.Velocities
		for _, x := range []float64{float64(g.TipDiameter), float64(g.InletDiameter), float64(g.InletWidth), float64(g.ExitWidth),
			float64(v.TipSpeed), float64(got.Exit.Static.Density), float64(got.Inlet.Static.Density),
			float64(v.InletMeridional), v.InletRelativeMach, v.InletAbsoluteMach, g.ExitArea, g.InletArea} {
			if !(x > 0) || math.IsInf(x, 0) {
				t.Fatalf("non-positive or non-finite output %v for %+v %+v %+v", x, d, imp, in)
			}
		}
		if !physics.Finite(float64(v.InletWhirl), v.InletBladeAngleHub, v.InletBladeAngleMean, v.InletBladeAngleShroud,
			got.Coefficients.SpecificDiameter) {
			t.Fatalf("non-finite inlet output %+v for %+v %+v %+v", v, d, imp, in)
		}
		if eye && g.InletDiameter >= g.TipDiameter {
			t.Fatalf("eye %v not smaller than the impeller %v", g.InletDiameter, g.TipDiameter)
		}
	})
}

// nonFinite names the first NaN or infinite float in v (structs, arrays,
// slices and pointers walked; interfaces such as the gas model skipped),
// or returns "".
func nonFinite(v reflect.Value, path string) string {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return path + " = " + strconv.FormatFloat(f, 'g', -1, 64)
		}
	case reflect.Struct:
		for i := range v.NumField() {
			if bad := nonFinite(v.Field(i), path+"."+v.Type().Field(i).Name); bad != "" {
				return bad
			}
		}
	case reflect.Array, reflect.Slice:
		for i := range v.Len() {
			if bad := nonFinite(v.Index(i), path+"["+strconv.Itoa(i)+"]"); bad != "" {
				return bad
			}
		}
	case reflect.Pointer:
		if !v.IsNil() {
			return nonFinite(v.Elem(), path)
		}
	}
	return ""
}
