package api

import (
	"bytes"
	"encoding/csv"
	"math"
	"strconv"

	"stagewright/service"
)

// MapRequest asks for an installed machine's estimated performance map
// for a gas at a suction state.
type MapRequest struct {
	Machine MachineSpec `json:"machine" binding:"required"`
	Gas     GasSpec     `json:"gas" binding:"required"`
	Suction SuctionSpec `json:"suction" binding:"required"`
	// Speeds are the first stage's speeds of the lines, rev/min (numbers);
	// default 70, 80, 90, 100 and 105 % of the design speed.
	Speeds []float64 `json:"speeds,omitempty" binding:"omitempty,max=12" example:"8050,9200,10350,11500,12075"`
	// Points is the number of points per speed line; default 25.
	Points *int `json:"points,omitempty" binding:"omitempty,min=3,max=200" minimum:"3" maximum:"200" example:"25"`
	// OperatingPoint is a point to rate and mark on the map.
	OperatingPoint *MapOperatingPointSpec `json:"operating_point,omitempty"`
}

// MapOperatingPointSpec is an operating point to mark: actual volume flow
// at suction and the first stage's speed.
type MapOperatingPointSpec struct {
	// Flow is the actual volume flow at suction, m3/s (or "m3/h", "acfm").
	Flow *Quantity `json:"flow" binding:"required" swaggertype:"primitive,number" format:"double" example:"1.8" extensions:"x-unit-string=volume-flow" validate:"required"`
	// Speed is the first stage's speed, rev/min.
	Speed *Quantity `json:"speed" binding:"required" swaggertype:"primitive,number" format:"double" example:"11000" extensions:"x-unit-string=speed" validate:"required"`
}

// MapResponse is an estimated performance map: polytropic head against
// actual inlet volume flow, one line per speed, with the estimated surge
// and choke lines. Surge and choke are estimates (see cautions).
type MapResponse struct {
	// Gas is the gas model's name; Suction the suction state of the map.
	Gas     string      `json:"gas" example:"peng-robinson" validate:"required"`
	Suction MapStateOut `json:"suction" validate:"required"`
	// SpeedLines run from the estimated surge flow to just short of the estimated choke flow.
	SpeedLines []SpeedLineOut `json:"speed_lines" validate:"required"`
	// SurgeLine has one point per speed line: the estimated surge flow and the head there.
	SurgeLine []MapEdgeOut `json:"surge_line" validate:"required"`
	// ChokeLine has one point per speed line: the estimated choke flow and the head of the line's last point.
	ChokeLine []MapEdgeOut `json:"choke_line" validate:"required"`
	// DesignPoint is the rating at the design flow and speed for this gas and suction.
	DesignPoint MapMarkerOut `json:"design_point" validate:"required"`
	// OperatingPoint is the point asked for, rated.
	OperatingPoint *MapMarkerOut `json:"operating_point,omitempty"`
	// SpeedRange is the machine's speed range as used, rev/min.
	SpeedRange SpeedRangeOut `json:"speed_range" validate:"required"`
	Warnings   []WarningOut  `json:"warnings" validate:"required"`
	Provenance ProvenanceOut `json:"provenance" validate:"required"`
	Cautions   []string      `json:"cautions" validate:"required"`
}

// MapStateOut is the suction state of a map.
type MapStateOut struct {
	// Pressure, Pa absolute; Temperature, K.
	Pressure    float64 `json:"pressure" format:"double" example:"100000" validate:"required"`
	Temperature float64 `json:"temperature" format:"double" example:"300" validate:"required"`
}

// SpeedLineOut is one speed line.
type SpeedLineOut struct {
	// Speed is the first stage's speed, rev/min.
	Speed  float64       `json:"speed" format:"double" example:"11500" validate:"required"`
	Points []MapPointOut `json:"points" validate:"required"`
}

// MapPointOut is one point of a speed line.
type MapPointOut struct {
	// ActualVolumeFlow at suction, m3/s.
	ActualVolumeFlow float64 `json:"actual_volume_flow" format:"double" validate:"required"`
	// MassFlow, kg/s.
	MassFlow float64 `json:"mass_flow" format:"double" validate:"required"`
	// Head is the polytropic head summed over the stages, J/kg.
	Head float64 `json:"head" format:"double" validate:"required"`
	// PressureRatio is discharge over suction total pressure.
	PressureRatio float64 `json:"pressure_ratio" format:"double" validate:"required"`
	// Efficiency is the polytropic efficiency.
	Efficiency float64 `json:"efficiency" format:"double" validate:"required"`
	// Power is the shaft power, W.
	Power float64 `json:"power" format:"double" validate:"required"`
}

// MapEdgeOut is a point of the surge or choke line.
type MapEdgeOut struct {
	// Speed, rev/min; ActualVolumeFlow, m3/s; Head, J/kg.
	Speed            float64 `json:"speed" format:"double" validate:"required"`
	ActualVolumeFlow float64 `json:"actual_volume_flow" format:"double" validate:"required"`
	Head             float64 `json:"head" format:"double" validate:"required"`
}

// MapMarkerOut is the design or operating point on the map.
type MapMarkerOut struct {
	// Speed, rev/min; ActualVolumeFlow, m3/s; Head (polytropic), J/kg; Efficiency (polytropic).
	Speed            float64 `json:"speed" format:"double" validate:"required"`
	ActualVolumeFlow float64 `json:"actual_volume_flow" format:"double" validate:"required"`
	Head             float64 `json:"head" format:"double" validate:"required"`
	Efficiency       float64 `json:"efficiency" format:"double" validate:"required"`
}

// mapDutyOf converts a map request into SI.
func mapDutyOf(r MapRequest) (service.MapDuty, error) {
	m, err := machineOfSpec(r.Machine, "machine")
	if err != nil {
		return service.MapDuty{}, err
	}
	p, t, err := suctionOf(r.Suction)
	if err != nil {
		return service.MapDuty{}, err
	}
	d := service.MapDuty{Machine: m, Gas: gasInputOf(r.Gas), SuctionPressure: p, SuctionTemperature: t, Points: intOr0(r.Points)}
	d.Speeds = append(d.Speeds, r.Speeds...)
	if o := r.OperatingPoint; o != nil {
		q, err := si(o.Flow, dimVolumeFlow, "operating_point.flow", 0)
		if err != nil {
			return service.MapDuty{}, err
		}
		n, err := si(o.Speed, dimSpeed, "operating_point.speed", 0)
		if err != nil {
			return service.MapDuty{}, err
		}
		d.OperatingPoint = &service.MapOperatingDuty{ActualVolumeFlow: must(q), Speed: must(n)}
	}
	return d, nil
}

// mapResponseOf renders a map, refusing any non-finite number.
func mapResponseOf(m service.Map) (MapResponse, error) {
	out := MapResponse{Gas: m.GasModel, Suction: MapStateOut{Pressure: m.SuctionPressure, Temperature: m.SuctionTemperature},
		SpeedLines: []SpeedLineOut{}, SurgeLine: []MapEdgeOut{}, ChokeLine: []MapEdgeOut{},
		DesignPoint: MapMarkerOut(m.DesignPoint),
		SpeedRange:  SpeedRangeOut{Minimum: m.SpeedRange.Minimum, MaximumContinuous: m.SpeedRange.MaximumContinuous},
		Warnings:    []WarningOut{}, Provenance: provenanceOut(m.Provenance), Cautions: m.Cautions}
	for _, l := range m.SpeedLines {
		lo := SpeedLineOut{Speed: l.Speed, Points: make([]MapPointOut, 0, len(l.Points))}
		for _, p := range l.Points {
			lo.Points = append(lo.Points, MapPointOut(p))
		}
		out.SpeedLines = append(out.SpeedLines, lo)
	}
	for _, e := range m.SurgeLine {
		out.SurgeLine = append(out.SurgeLine, MapEdgeOut(e))
	}
	for _, e := range m.ChokeLine {
		out.ChokeLine = append(out.ChokeLine, MapEdgeOut(e))
	}
	if m.OperatingPoint != nil {
		o := MapMarkerOut(*m.OperatingPoint)
		out.OperatingPoint = &o
	}
	out.Warnings = appendWarnings(out.Warnings, m.Warnings)
	if err := allFinite(out); err != nil {
		return MapResponse{}, err
	}
	return out, nil
}

// mapCSV writes one row per point with a header naming the units.
func mapCSV(m MapResponse) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', 8, 64) }
	_ = w.Write([]string{"speed_rpm", "actual_volume_flow_m3_per_s", "mass_flow_kg_per_s", "polytropic_head_J_per_kg",
		"pressure_ratio", "polytropic_efficiency", "shaft_power_W"})
	for _, l := range m.SpeedLines {
		for _, p := range l.Points {
			_ = w.Write([]string{g(l.Speed), g(p.ActualVolumeFlow), g(p.MassFlow), g(p.Head), g(p.PressureRatio), g(p.Efficiency), g(p.Power)})
		}
	}
	w.Flush()
	return b.Bytes()
}

// finiteOr0 guards a chart coordinate.
func finiteOr0(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}
