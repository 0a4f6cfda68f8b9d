package service

import (
	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/similarity"
)

// similarityOf compares the new duty's point with the baseline's by the
// PTC 10 similarity quantities (nil when a point lacks one of them).
func similarityOf(b, a opPoint) []SimilarityCheck {
	pt := func(p opPoint) similarity.Point {
		out := similarity.Point{MachineMach: p.MachineMach, FlowCoefficient: p.Point.FlowCoefficient}
		if p.DischargeDensity > 0 {
			out.SpecificVolumeRatio = p.DischargeDensity / p.Density
		}
		if p.Viscosity > 0 {
			re, err := similarity.MachineReynoldsNumber(physics.MeterPerS(p.TipSpeed), physics.Meter(p.ExitWidth),
				physics.KgPerCubicMeter(p.Density), similarity.PascalSecond(p.Viscosity))
			if err == nil {
				out.MachineReynolds = re
			}
		}
		return out
	}
	ds, err := similarity.Compare(pt(b), pt(a))
	if err != nil {
		return nil
	}
	out := make([]SimilarityCheck, len(ds))
	for i, d := range ds {
		out[i] = SimilarityCheck{Quantity: d.Quantity, Baseline: d.Reference, Duty: d.Value, Measure: d.Measure, Kind: d.Kind,
			Low: d.Low, High: d.High, Within: d.Within, Basis: d.Basis}
	}
	return out
}

// viscosityOf returns the dilute-gas viscosity of the model's gas at t
// (Lucas with Wilke's rule), or 0 when the model has no composition.
func viscosityOf(m gas.Model, t float64) float64 {
	comp, ok := compositionOfModel(m)
	if !ok {
		return 0
	}
	sp := make([]similarity.Species, comp.Len())
	for i := range sp {
		sp[i] = similarity.SpeciesOf(comp.Component(i))
	}
	eta, err := similarity.MixtureViscosity(physics.Kelvin(t), sp, comp.MoleFractions())
	if err != nil {
		return 0
	}
	return float64(eta)
}
