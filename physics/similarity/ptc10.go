package similarity

import (
	"math"

	"stagewright/physics"
)

// Point is one operating point of a machine as the PTC 10 similarity
// checks see it.
type Point struct {
	// SpecificVolumeRatio is vi/vd, the inlet over the discharge specific
	// volume of the machine (or section).
	SpecificVolumeRatio float64
	// MachineMach is the first stage's tip speed over the inlet speed of
	// sound, U/ai.
	MachineMach float64
	// MachineReynolds is U b / νi (MachineReynolds); 0 when the viscosity
	// is not known (the Reynolds check is then left out).
	MachineReynolds float64
	// FlowCoefficient is the first stage's inlet flow coefficient, in any
	// one definition used for both points (only the ratio is judged).
	FlowCoefficient float64
}

// Similarity quantities, the Quantity of a Departure.
const (
	SpecificVolumeRatio = "specific-volume-ratio"
	MachineMach         = "machine-mach"
	MachineReynolds     = "machine-reynolds"
	FlowCoefficient     = "flow-coefficient"
)

// Departure is one similarity check: the reference (specified) value, the
// new (test) value, the measure compared with the code's band (a ratio
// new/reference, or for the Mach number the difference new − reference)
// and whether it lies within the band.
type Departure struct {
	Quantity  string
	Reference float64
	Value     float64
	// Measure is Value/Reference, or Value − Reference for the machine Mach number.
	Measure float64
	// Kind is "ratio" or "difference".
	Kind      string
	Low, High float64
	Within    bool
	Basis     string
}

// Bases of the bands, quoted from memory.
const (
	basisTable  = "ASME PTC 10-1997, Table 3.2, limits for a Type 2 test (from memory)"
	basisMach   = "ASME PTC 10-1997, Fig. 3.3, centrifugal compressors (from memory; the three pieces meet at 0.214 and 0.86)"
	basisReynol = "ASME PTC 10-1997, Fig. 3.5, centrifugal compressors (from memory, simplified to a ratio of 0.1 to 10; the code narrows it outside 9e4 to 1e7)"
)

// MachineReynoldsNumber returns PTC 10's machine Reynolds number
//
//	Re_m = U b / ν,  ν = η / ρ
//
// with U the first impeller's tip speed, b its exit width and ν the
// kinematic viscosity at the inlet (ASME PTC 10-1997, section 2, from
// memory). Valid for positive finite inputs.
func MachineReynoldsNumber(tipSpeed physics.MeterPerS, exitWidth physics.Meter, density physics.KgPerCubicMeter, viscosity PascalSecond) (float64, error) {
	for _, c := range []struct {
		name string
		v    float64
	}{{"tip speed", float64(tipSpeed)}, {"exit width", float64(exitWidth)}, {"density", float64(density)}, {"viscosity", float64(viscosity)}} {
		if !(c.v > 0) || math.IsInf(c.v, 0) {
			return 0, &physics.DomainError{Name: c.name, Value: c.v, Want: "finite, > 0"}
		}
	}
	re := float64(tipSpeed) * float64(exitWidth) * float64(density) / float64(viscosity)
	if math.IsInf(re, 0) {
		return 0, &physics.DomainError{Name: "density", Value: float64(density), Want: "a finite Reynolds number"}
	}
	return re, nil
}

// MachBand returns the allowed departure Mm,new − Mm,ref of the machine
// Mach number of a centrifugal compressor for a reference Mach number
// mRef (ASME PTC 10-1997, Fig. 3.3, from memory):
//
//	mRef < 0.214:          −mRef               to 0.286 − 0.25 mRef
//	0.214 ≤ mRef ≤ 0.86:   0.266 mRef − 0.271  to 0.286 − 0.25 mRef
//	mRef > 0.86:           −0.042              to +0.07
func MachBand(mRef float64) (low, high float64) {
	switch {
	case mRef < 0.214:
		return -mRef, 0.286 - 0.25*mRef
	case mRef <= 0.86:
		return 0.266*mRef - 0.271, 0.286 - 0.25*mRef
	}
	return -0.042, 0.07
}

// Compare returns the PTC 10 similarity checks of the point pt against the
// reference point ref, in the order specific-volume ratio, machine Mach
// number, machine Reynolds number (only when both are known) and flow
// coefficient. Bands (ASME PTC 10-1997, Table 3.2 and Figs. 3.3 and 3.5,
// from memory): specific-volume ratio 0.95 to 1.05 of the reference, flow
// coefficient 0.96 to 1.04, Mach number by MachBand, Reynolds number 0.1 to
// 10 times the reference.
func Compare(ref, pt Point) ([]Departure, error) {
	for _, c := range []struct {
		name string
		a, b float64
	}{
		{"specific volume ratio", ref.SpecificVolumeRatio, pt.SpecificVolumeRatio},
		{"machine Mach number", ref.MachineMach, pt.MachineMach},
		{"flow coefficient", ref.FlowCoefficient, pt.FlowCoefficient},
	} {
		for _, v := range []float64{c.a, c.b} {
			if !(v > 0) || math.IsInf(v, 0) {
				return nil, &physics.DomainError{Name: c.name, Value: v, Want: "finite, > 0"}
			}
		}
	}
	for _, v := range []float64{ref.MachineReynolds, pt.MachineReynolds} {
		if !(v >= 0) || math.IsInf(v, 0) {
			return nil, &physics.DomainError{Name: "machine Reynolds number", Value: v, Want: "finite, >= 0 (0: not known)"}
		}
	}
	ratio := func(q string, a, b, lo, hi float64, basis string) Departure {
		m := b / a
		return Departure{Quantity: q, Reference: a, Value: b, Measure: m, Kind: "ratio", Low: lo, High: hi,
			Within: m >= lo && m <= hi, Basis: basis}
	}
	out := []Departure{ratio(SpecificVolumeRatio, ref.SpecificVolumeRatio, pt.SpecificVolumeRatio, 0.95, 1.05, basisTable)}
	lo, hi := MachBand(ref.MachineMach)
	d := pt.MachineMach - ref.MachineMach
	out = append(out, Departure{Quantity: MachineMach, Reference: ref.MachineMach, Value: pt.MachineMach, Measure: d, Kind: "difference",
		Low: lo, High: hi, Within: d >= lo && d <= hi, Basis: basisMach})
	if ref.MachineReynolds > 0 && pt.MachineReynolds > 0 {
		out = append(out, ratio(MachineReynolds, ref.MachineReynolds, pt.MachineReynolds, 0.1, 10, basisReynol))
	}
	out = append(out, ratio(FlowCoefficient, ref.FlowCoefficient, pt.FlowCoefficient, 0.96, 1.04, basisTable))
	return out, nil
}
