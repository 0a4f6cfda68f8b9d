package service_test

import (
	"context"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// TestMapShapes: the map proofs. On the design speed line the
// efficiency peaks at the design flow; surge flow < design flow < choke
// flow on every line (design flow scaled with speed); the head rises
// towards surge for a backswept impeller; the map's design point equals
// the rating at the design duty (same relations; Casey & Robinson 2013
// shape of the efficiency characteristic, from memory).
func TestMapShapes(t *testing.T) {
	for _, gasIn := range []service.GasInput{textbookAir(), natGas()} {
		p1 := 1e5
		if gasIn.Model != "ideal-constant" {
			p1 = 30e5
		}
		d := service.StageDuty{Gas: gasIn, SuctionPressure: p1, SuctionTemperature: 300, PressureRatio: f(1.7), MassFlow: f(6)}
		res := size(t, d)
		m, err := service.New().MapMachine(context.Background(), service.MapDuty{Machine: res.Machine, Gas: gasIn, SuctionPressure: p1, SuctionTemperature: 300, Points: 41,
			OperatingPoint: &service.MapOperatingDuty{ActualVolumeFlow: res.SuctionVolumeFlow * 0.9, Speed: res.Speed * 0.95}})
		require.NoError(t, err)
		require.Len(t, m.SpeedLines, 5)
		r := rateAt(t, d, res)
		assert.InEpsilon(t, r.PolytropicHead, m.DesignPoint.Head, 1e-9, "design point = rating at the design duty")
		assert.InEpsilon(t, r.PolytropicEfficiency, m.DesignPoint.Efficiency, 1e-9)
		assert.InEpsilon(t, res.SuctionVolumeFlow, m.DesignPoint.ActualVolumeFlow, 1e-12)
		for i, line := range m.SpeedLines {
			qd := res.SuctionVolumeFlow * line.Speed / res.Speed
			assert.Less(t, m.SurgeLine[i].ActualVolumeFlow, qd, "surge < design flow at %g", line.Speed)
			assert.Less(t, qd, m.ChokeLine[i].ActualVolumeFlow, "design flow < choke at %g", line.Speed)
			pts := line.Points
			assert.Greater(t, pts[0].Head, pts[len(pts)/3].Head, "head rises towards surge at %g", line.Speed)
			for k := 1; k < len(pts); k++ {
				assert.Greater(t, pts[k].ActualVolumeFlow, pts[k-1].ActualVolumeFlow)
			}
		}
		// design line: the efficiency peaks at the design flow
		var design service.SpeedLine
		for _, l := range m.SpeedLines {
			if l.Speed == res.Speed {
				design = l
			}
		}
		require.NotEmpty(t, design.Points)
		best := design.Points[0]
		for _, p := range design.Points {
			if p.Efficiency > best.Efficiency {
				best = p
			}
		}
		step := design.Points[1].ActualVolumeFlow - design.Points[0].ActualVolumeFlow
		assert.InDelta(t, res.SuctionVolumeFlow, best.ActualVolumeFlow, step, "peak efficiency at the design flow")
		assert.LessOrEqual(t, best.Efficiency, m.DesignPoint.Efficiency*(1+1e-9))
		require.NotNil(t, m.OperatingPoint)
	}
}
