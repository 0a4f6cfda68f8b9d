package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"

	"stagewright/physics/gas"
	"stagewright/physics/offdesign"
)

// Map defaults.
const (
	// DefaultMapPoints is the number of points per speed line.
	DefaultMapPoints = 25
	// MaxMapPoints and MaxMapSpeeds bound a map request.
	MaxMapPoints = 200
	MaxMapSpeeds = 12
	// mapChokeFraction is how far towards the choke flow the last point
	// of a line lies (the efficiency falls to zero at choke itself).
	mapChokeFraction = 0.995
)

// DefaultMapSpeedFractions are the speed lines of a map when none are
// asked for, as fractions of the first stage's design speed: 70, 80, 90,
// 100 and 105 % (the usual spread of a variable-speed process machine's
// map, common practice, no source).
func DefaultMapSpeedFractions() []float64 { return []float64{0.70, 0.80, 0.90, 1.00, 1.05} }

// MapDuty asks for a machine's estimated performance map for a gas at a
// suction state, SI. Speeds are the first stage's, rev/min (nil: the
// defaults); Points per line (0: DefaultMapPoints); OperatingPoint, when
// given, is rated and marked.
type MapDuty struct {
	Machine            Machine           `json:"machine"`
	Gas                GasInput          `json:"gas"`
	SuctionPressure    float64           `json:"suction_pressure"`
	SuctionTemperature float64           `json:"suction_temperature"`
	Speeds             []float64         `json:"speeds,omitempty"`
	Points             int               `json:"points,omitempty"`
	OperatingPoint     *MapOperatingDuty `json:"operating_point,omitempty"`
}

// MapOperatingDuty is the operating point to mark: an actual volume flow
// at suction (m3/s) and the first stage's speed (rev/min).
type MapOperatingDuty struct {
	ActualVolumeFlow float64 `json:"actual_volume_flow"`
	Speed            float64 `json:"speed"`
}

// MapPoint is one point of a speed line: flows at the machine's suction
// (m3/s, kg/s), the polytropic head summed over the stages (J/kg), the
// overall pressure ratio, the polytropic efficiency and the shaft power (W).
type MapPoint struct {
	ActualVolumeFlow, MassFlow, Head, PressureRatio, Efficiency, Power float64
}

// SpeedLine is one speed line of a map.
type SpeedLine struct {
	Speed  float64
	Points []MapPoint
}

// MapEdgePoint is a point of the surge or choke line.
type MapEdgePoint struct {
	Speed, ActualVolumeFlow, Head float64
}

// MapMarker is the design or operating point on the map.
type MapMarker struct {
	Speed, ActualVolumeFlow, Head, Efficiency float64
}

// Map is a machine's estimated performance map.
type Map struct {
	GasModel                            string
	SuctionPressure, SuctionTemperature float64
	SpeedLines                          []SpeedLine
	SurgeLine, ChokeLine                []MapEdgePoint
	DesignPoint                         MapMarker
	// OperatingPoint is the marked operating point, nil when none was asked.
	OperatingPoint *MapMarker
	SpeedRange     SpeedRange
	Warnings       []Warning
	Provenance     Provenance
	Cautions       []string
}

// MapMachine estimates the performance map of d.Machine: each speed line
// from the estimated surge flow to just short of the estimated choke flow,
// stacked stage after stage as RateMachine does, with the surge and choke
// lines, the design point (the rating at the design flow and speed) and,
// when asked, the operating point.
func (s *Service) MapMachine(ctx context.Context, d MapDuty) (Map, error) {
	if err := ctx.Err(); err != nil {
		return Map{}, err
	}
	var out Map
	prov := &out.Provenance
	prov.ModelVersion = ModelVersion
	prov.ServiceVersion = s.version
	prov.InputHash = hashOf(d)
	pm, err := s.prepareMachine(d.Machine, prov)
	if err != nil {
		return Map{}, err
	}
	op, err := s.operatingGas(d.Gas, d.SuctionTemperature, d.SuctionPressure, nil, nil, nil, "", prov)
	if err != nil {
		return Map{}, err
	}
	n1d := pm.stages[0].speed
	speeds := d.Speeds
	defaulted := len(speeds) == 0
	if defaulted {
		for _, f := range DefaultMapSpeedFractions() {
			speeds = append(speeds, f*n1d)
		}
		prov.Defaults = append(prov.Defaults, Default{Field: "speeds", Value: "70, 80, 90, 100, 105 % of the design speed",
			Note: "the usual spread of a variable-speed machine's map (common practice, no source)"})
	}
	if len(speeds) > MaxMapSpeeds {
		return Map{}, shapeErr("speeds", fmt.Errorf("at most %d speed lines", MaxMapSpeeds))
	}
	for i, n := range speeds {
		if err := checkSpeed(pm, n, "speeds."+strconv.Itoa(i)); err != nil {
			return Map{}, err
		}
	}
	points := d.Points
	if points == 0 {
		points = DefaultMapPoints
	}
	if points < 3 || points > MaxMapPoints {
		return Map{}, fieldErr("points", reason("points", fmt.Sprintf("the points per speed line must lie between 3 and %d", MaxMapPoints), float64(points)))
	}
	out.GasModel = op.model.Name()
	out.SuctionPressure, out.SuctionTemperature = d.SuctionPressure, d.SuctionTemperature
	out.SpeedRange = pm.speedRange
	rho := float64(op.suction.Density)
	for i, n := range speeds {
		if err := ctx.Err(); err != nil {
			return Map{}, err
		}
		line, qs, qc, err := s.mapLine(ctx, pm, op, n, points)
		if err != nil {
			return Map{}, prefixSpeedErr(err, i, defaulted)
		}
		out.SpeedLines = append(out.SpeedLines, line)
		first, last := line.Points[0], line.Points[len(line.Points)-1]
		out.SurgeLine = append(out.SurgeLine, MapEdgePoint{Speed: n, ActualVolumeFlow: qs, Head: first.Head})
		// The choke line carries the head of the last computed point (just
		// short of choke, where the head falls steeply to nothing).
		out.ChokeLine = append(out.ChokeLine, MapEdgePoint{Speed: n, ActualVolumeFlow: qc, Head: last.Head})
	}
	// Design point: the first stage's design volume flow at its design
	// speed, rated for this gas and suction.
	dq := pm.stages[0].designMass / float64(pm.stages[0].design.Compression.Suction.Density)
	dp, err := s.markAt(ctx, pm, op, dq*rho, n1d)
	if err != nil {
		out.Warnings = append(out.Warnings, Warning{Code: "map-design-point", Severity: "notice",
			Message: "the design point cannot be rated with this gas and suction state: " + err.Error(), Unit: "-", Basis: "rating at the design flow and speed"})
	} else {
		out.DesignPoint = dp
	}
	if o := d.OperatingPoint; o != nil {
		if !(o.ActualVolumeFlow > 0) || math.IsInf(o.ActualVolumeFlow, 0) {
			return Map{}, fieldErr("operating_point.flow", reason("flow", "the operating point's flow must be a positive number of m3/s", o.ActualVolumeFlow))
		}
		if err := checkSpeed(pm, o.Speed, "operating_point.speed"); err != nil {
			return Map{}, err
		}
		mk, err := s.markAt(ctx, pm, op, o.ActualVolumeFlow*rho, o.Speed)
		if err != nil {
			var ie *InputError
			if errors.As(err, &ie) && ie.Field == "flow" {
				ie.Field = "operating_point.flow"
			}
			return Map{}, err
		}
		out.OperatingPoint = &mk
	}
	prov.GasModel = out.GasModel
	prov.Methods = append(prov.Methods, op.notes.methods...)
	prov.Methods = append(prov.Methods, machineMethods(pm)...)
	out.Warnings = append(out.Warnings, op.notes.warnings...)
	out.Cautions = mapCautions(op.model)
	return out, nil
}

// prefixSpeedErr names speed line i as the field of a flow error; with
// the default speeds (the caller sent none) it names "speeds" and says
// which default line failed.
func prefixSpeedErr(err error, i int, defaulted bool) error {
	var ie *InputError
	if errors.As(err, &ie) && ie.Field == "flow" {
		out := *ie
		out.Field = "speeds." + strconv.Itoa(i)
		if defaulted {
			out.Field = "speeds"
			out.Err = fmt.Errorf("the default speed line at %.0f %% of the design speed: %w (give speeds for the lines to draw)",
				100*DefaultMapSpeedFractions()[i], ie.Err)
		}
		return &out
	}
	return err
}

// markAt rates the machine at mass flow mdot and first-stage speed n and
// returns it as a map marker.
func (s *Service) markAt(ctx context.Context, pm *preparedMachine, op operating, mdot, n float64) (MapMarker, error) {
	o := op
	o.mdot = mdot
	st, err := s.stack(ctx, pm, o, n, false)
	if err != nil {
		return MapMarker{}, err
	}
	hp, w := 0.0, 0.0
	for _, sr := range st.stages {
		hp += float64(sr.Point.Compression.PolytropicHead)
		w += float64(sr.Point.Compression.Work)
	}
	return MapMarker{Speed: n, ActualVolumeFlow: mdot / float64(op.suction.Density), Head: hp, Efficiency: hp / w}, nil
}

// mapLine computes one speed line at first-stage speed n: the machine's
// surge and choke flows at that speed (the first stage to reach each),
// then points evenly spaced from surge to mapChokeFraction of the way to
// choke. It returns the line and the surge and choke volume flows.
func (s *Service) mapLine(ctx context.Context, pm *preparedMachine, op operating, n float64, points int) (SpeedLine, float64, float64, error) {
	rho := float64(op.suction.Density)
	first := pm.stages[0]
	line1, err := first.lineFor(op.model, op.suction, n)
	if err != nil {
		return SpeedLine{}, 0, 0, stageErr(first.field, err)
	}
	ms, err := line1.Surge()
	if err != nil {
		return SpeedLine{}, 0, 0, fieldErr("flow", err)
	}
	mc, _, err := line1.Choke()
	if err != nil {
		return SpeedLine{}, 0, 0, fieldErr("flow", err)
	}
	if len(pm.stages) > 1 {
		// Later stages may surge or choke first: rate at the middle of the
		// first stage's range and take the machine's margins there.
		o := op
		o.mdot = 0.5 * (ms + mc)
		st, err := s.stack(ctx, pm, o, n, true)
		if err == nil {
			var r Rating
			r.ActualVolumeFlow = o.mdot / rho
			fillRating(&r, pm, st)
			ms = math.Max(ms, r.OperatingPoint.SurgeFlow*rho)
			mc = math.Min(mc, r.OperatingPoint.ChokeFlow*rho)
		}
	}
	if len(pm.stages) > 1 && ms < mc {
		// Far from the middle of the range a later stage may choke well
		// before the estimate above (stage mismatch): the line ends at the
		// largest flow the stack passes, found by bisection.
		top := ms + (mc-ms)*mapChokeFraction
		o := op
		o.mdot = top
		if _, err := s.stack(ctx, pm, o, n, false); err != nil {
			lo, hi := ms, top
			o.mdot = ms
			if _, err := s.stack(ctx, pm, o, n, false); err != nil {
				hi = ms // choked already at the surge flow: no stable range
			}
			for hi-lo > 1e-6*hi {
				if err := ctx.Err(); err != nil {
					return SpeedLine{}, 0, 0, err
				}
				o.mdot = 0.5 * (lo + hi)
				if _, err := s.stack(ctx, pm, o, n, false); err != nil {
					hi = o.mdot
				} else {
					lo = o.mdot
				}
			}
			mc = ms + (lo-ms)/mapChokeFraction
		}
	}
	if !(ms < mc) {
		return SpeedLine{}, 0, 0, fieldErr("flow", reason("speed", fmt.Sprintf("at %.0f rev/min the estimated surge flow is not below the estimated choke flow: the machine has no stable range at this speed", n), n))
	}
	out := SpeedLine{Speed: n}
	p1 := float64(op.suction.Pressure)
	var prev *offdesign.Point
	for i := range points {
		if err := ctx.Err(); err != nil {
			return SpeedLine{}, 0, 0, err
		}
		mdot := ms + (mc-ms)*mapChokeFraction*float64(i)/float64(points-1)
		if len(pm.stages) == 1 {
			// One stage: walk the line from its neighbour (no stacking).
			p, err := line1.AtFrom(mdot, prev)
			if err != nil {
				return SpeedLine{}, 0, 0, fieldErr("flow", err)
			}
			prev = &p
			c := p.Compression
			out.Points = append(out.Points, MapPoint{ActualVolumeFlow: mdot / rho, MassFlow: mdot, Head: float64(c.PolytropicHead),
				PressureRatio: float64(c.Discharge.Pressure) / p1, Efficiency: float64(c.PolytropicHead) / float64(c.Work),
				Power: mdot * float64(c.Work) / pm.mechEff})
			continue
		}
		o := op
		o.mdot = mdot
		st, err := s.stack(ctx, pm, o, n, false)
		if err != nil {
			return SpeedLine{}, 0, 0, err
		}
		hp, w, gp := 0.0, 0.0, 0.0
		for _, sr := range st.stages {
			hp += float64(sr.Point.Compression.PolytropicHead)
			w += float64(sr.Point.Compression.Work)
			gp += sr.GasPower
		}
		out.Points = append(out.Points, MapPoint{ActualVolumeFlow: mdot / rho, MassFlow: mdot, Head: hp,
			PressureRatio: float64(st.discharge.Pressure) / p1, Efficiency: hp / w, Power: gp / pm.mechEff})
	}
	return out, ms / rho, mc / rho, nil
}

func mapCautions(m gas.Model) []string {
	out := []string{
		"Estimated performance map of an installed machine from its geometry and design point by published methods, not the manufacturer's tested map: confirm it with the manufacturer's curves and field tests.",
		"The surge and choke lines are estimates: real surge lines scatter by some ±10-15 % in flow about such estimates; set the anti-surge control line from the manufacturer's map and tests, never from this chart.",
		"Speeds outside the machine's speed range are shown only as estimates; the trip speed and overspeed protection are set by the manufacturer.",
	}
	out = append(out, gasHazards(m)...)
	out = append(out, "Defer to the machine's manufacturer, the applicable standards (API 617, ISO 10439 and their peers), local codes and licensed engineering practice.")
	return out
}
