package service

import (
	"context"
	"errors"
	"fmt"
)

// CheckMachine runs a duty-change check of req.Machine: the operating
// point of the new duty and of the baseline by RateMachine (the speed that
// makes the discharge pressure, stages stacked), then the verdict, the
// margins before and after, what changed and the PTC 10 similarity.
func (s *Service) CheckMachine(ctx context.Context, req CheckRequest) (CheckResult, error) {
	return s.check(ctx, req, s.rateFor(req.Machine), nil)
}

// CheckMachineShared is CheckMachine for one check of a batch: the
// baseline operating point is found once per machine and baseline in memo.
func (s *Service) CheckMachineShared(ctx context.Context, req CheckRequest, memo *CheckMemo) (CheckResult, error) {
	return s.check(ctx, req, s.rateFor(req.Machine), memo)
}

// rateFor returns the check's view of RateMachine for machine m: a
// discharge pressure no speed reaches becomes ErrSpeedOutOfReach, a flow
// at or past choke at a given speed ErrChoked.
func (s *Service) rateFor(m Machine) rateFunc {
	return func(ctx context.Context, q rateQuery) (opPoint, error) {
		d := q.Duty
		rd := RateDuty{Machine: m, Gas: d.Gas, SuctionPressure: d.SuctionPressure, SuctionTemperature: d.SuctionTemperature,
			MassFlow: d.MassFlow, ActualVolumeFlow: d.ActualVolumeFlow, StandardVolumeFlow: d.StandardVolumeFlow, StandardReference: d.StandardReference}
		scale := func(p *float64) *float64 {
			if p == nil || q.FlowScale <= 0 {
				return p
			}
			v := *p * q.FlowScale
			return &v
		}
		rd.MassFlow, rd.ActualVolumeFlow, rd.StandardVolumeFlow = scale(rd.MassFlow), scale(rd.ActualVolumeFlow), scale(rd.StandardVolumeFlow)
		switch {
		case q.MassFlow > 0:
			mf := q.MassFlow
			rd.MassFlow, rd.ActualVolumeFlow, rd.StandardVolumeFlow, rd.StandardReference = &mf, nil, nil, ""
		case q.VolumeFlow > 0:
			v := q.VolumeFlow
			rd.MassFlow, rd.ActualVolumeFlow, rd.StandardVolumeFlow, rd.StandardReference = nil, &v, nil, ""
		}
		if q.SuctionPressure > 0 {
			rd.SuctionPressure = q.SuctionPressure
		}
		if q.Speed > 0 {
			n := q.Speed
			rd.Speed = &n
		} else {
			p2 := d.DischargePressure
			rd.DischargePressure = &p2
		}
		r, err := s.RateMachine(ctx, rd)
		if err != nil {
			var ie *InputError
			switch {
			case !errors.As(err, &ie):
			case q.Speed == 0 && ie.Field == "discharge_pressure":
				return opPoint{}, fmt.Errorf("%w: %w", ErrSpeedOutOfReach, err)
			case q.Speed > 0 && ie.Field == "flow":
				return opPoint{}, fmt.Errorf("%w: %w", ErrChoked, err)
			}
			return opPoint{}, err
		}
		return s.pointOf(r, m, d.Gas)
	}
}

// pointOf turns a rating into the check's operating point.
func (s *Service) pointOf(r Rating, m Machine, g GasInput) (opPoint, error) {
	op := r.OperatingPoint
	p := CheckPoint{Speed: r.Speed, MassFlow: r.MassFlow, VolumeFlow: r.ActualVolumeFlow,
		DischargePressure: r.DischargePressure, DischargeTemperature: r.DischargeTemperature,
		PolytropicHead: r.PolytropicHead, IsentropicHead: r.IsentropicHead,
		PolytropicEfficiency: r.PolytropicEfficiency, IsentropicEfficiency: r.IsentropicEfficiency,
		GasPower: r.Power.Gas, ShaftPower: r.Power.Shaft,
		SurgeFlow: op.SurgeFlow, ChokeFlow: op.ChokeFlow, SurgeStage: op.SurgeStage, ChokeStage: op.ChokeStage,
		SurgeMargin: op.SurgeMargin, ChokeMargin: op.ChokeMargin,
		FlowCoefficient: op.FlowCoefficient, DesignFlowRatio: op.DesignFlowRatio}
	if len(r.Stages) == 0 {
		return opPoint{}, errors.New("service: check: a rating without stages")
	}
	first, last := r.Stages[0], r.Stages[len(r.Stages)-1]
	p.SuctionPressure, p.SuctionTemperature = first.SuctionPressure, first.SuctionTemperature
	for _, st := range r.Stages {
		c := st.Point.Compression
		p.Stages = append(p.Stages, CheckStage{Stage: st.Stage, Speed: st.Speed,
			SuctionPressure: st.SuctionPressure, SuctionTemperature: st.SuctionTemperature,
			DischargePressure: float64(c.Discharge.Pressure), DischargeTemperature: float64(c.Discharge.Temperature),
			VolumeFlow: st.VolumeFlow, PolytropicHead: float64(c.PolytropicHead), PolytropicEfficiency: c.PolytropicEfficiency,
			SurgeFlow: st.SurgeFlow, ChokeFlow: st.ChokeFlow, SurgeMargin: st.SurgeMargin, ChokeMargin: st.ChokeMargin,
			FlowCoefficient: st.Point.FlowCoefficient, DesignFlowRatio: st.DesignFlowRatio})
	}
	out := opPoint{Point: p,
		Density:          r.MassFlow / r.ActualVolumeFlow,
		DischargeDensity: float64(last.Point.Compression.Discharge.Density),
		TipSpeed:         first.Point.TipSpeed, MachineMach: first.Point.TipMach, ExitWidth: m.Stages[0].ExitWidth,
		Limits: r.Assessments, Warnings: r.Warnings, Provenance: r.Provenance, Cautions: r.Cautions,
		MinSpeed: r.SpeedRange.Minimum, MaxSpeed: r.SpeedRange.MaximumContinuous, DriverRating: r.Power.DriverRating}
	model, _, err := s.gasModel(g, p.SuctionTemperature, p.SuctionPressure)
	if err != nil {
		return opPoint{}, err
	}
	out.MolarMass = model.MolarMass()
	out.Viscosity = viscosityOf(model, p.SuctionTemperature)
	if comp, ok := compositionOfModel(model); ok {
		out.Composition = map[string]float64{}
		x := comp.MoleFractions()
		for i := range comp.Len() {
			out.Composition[comp.Component(i).ID] += x[i]
		}
	}
	return out, nil
}
