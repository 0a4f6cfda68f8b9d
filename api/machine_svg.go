package api

import (
	"bytes"
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Chart size of the map, inches.
const (
	mapChartWidth  = 10 * vg.Inch
	mapChartHeight = 7 * vg.Inch
)

// lineColour is speed line i's colour (chosen for contrast on white).
func lineColour(i int) color.RGBA {
	cs := [...]color.RGBA{
		{0x1b, 0x4f, 0x72, 0xff}, {0x21, 0x8c, 0x8d, 0xff}, {0x2e, 0x7d, 0x32, 0xff}, {0x6a, 0x1b, 0x9a, 0xff},
		{0xad, 0x5f, 0x00, 0xff}, {0x45, 0x5a, 0x64, 0xff}, {0x00, 0x60, 0x64, 0xff}, {0x8e, 0x24, 0xaa, 0xff},
	}
	return cs[i%len(cs)]
}

// mapSVG draws the map as an SVG chart with gonum/plot: polytropic head
// against actual inlet volume flow, one labelled line per speed, the
// polytropic efficiency written at every few points, the estimated surge
// and choke lines, the design point and the operating point, axes with
// units and a title naming the gas and suction state and saying it is an
// estimate.
func mapSVG(m MapResponse) ([]byte, error) {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("Estimated performance map, %s gas, suction %.4g kPa abs, %.1f K\n(estimate from the machine's geometry and design point; surge and choke lines are estimates)",
		m.Gas, m.Suction.Pressure/1e3, m.Suction.Temperature)
	p.X.Label.Text = "actual inlet volume flow (m3/s)"
	p.Y.Label.Text = "polytropic head (kJ/kg)"
	p.Add(plotter.NewGrid())
	p.Legend.Top = true
	p.Legend.Left = true
	p.Legend.XOffs = vg.Points(10)
	design := 0.0
	if m.DesignPoint.Speed > 0 {
		design = m.DesignPoint.Speed
	}
	for i, l := range m.SpeedLines {
		xys := make(plotter.XYs, len(l.Points))
		var effXY plotter.XYs
		var effText []string
		step := max(len(l.Points)/5, 1)
		for k, pt := range l.Points {
			xys[k].X, xys[k].Y = finiteOr0(pt.ActualVolumeFlow), finiteOr0(pt.Head/1e3)
			if k%step == 0 && k < len(l.Points)-1 {
				effXY = append(effXY, xys[k])
				effText = append(effText, fmt.Sprintf("%.2f", pt.Efficiency))
			}
		}
		line, err := plotter.NewLine(xys)
		if err != nil {
			return nil, err
		}
		line.Color = lineColour(i)
		line.Width = vg.Points(1.6)
		p.Add(line)
		name := fmt.Sprintf("%.0f rev/min", l.Speed)
		if design > 0 {
			name = fmt.Sprintf("%.0f rev/min (%.0f %%)", l.Speed, 100*l.Speed/design)
		}
		if len(xys) > 0 {
			// the label sits above the line's highest point
			top := 0
			for k := range xys {
				if xys[k].Y > xys[top].Y {
					top = k
				}
			}
			lab, err := plotter.NewLabels(plotter.XYLabels{XYs: xys[top : top+1], Labels: []string{name}})
			if err != nil {
				return nil, err
			}
			lab.Offset = vg.Point{X: vg.Points(-30), Y: vg.Points(5)}
			for j := range lab.TextStyle {
				lab.TextStyle[j].Color = line.Color
				lab.TextStyle[j].Font.Size = vg.Points(8)
			}
			p.Add(lab)
		}
		if len(effXY) > 0 {
			dots, err := plotter.NewScatter(effXY)
			if err != nil {
				return nil, err
			}
			dots.GlyphStyle.Color = line.Color
			dots.GlyphStyle.Radius = vg.Points(1.8)
			p.Add(dots)
			lab, err := plotter.NewLabels(plotter.XYLabels{XYs: effXY, Labels: effText})
			if err != nil {
				return nil, err
			}
			lab.Offset = vg.Point{X: vg.Points(2), Y: vg.Points(-9)}
			for j := range lab.TextStyle {
				lab.TextStyle[j].Color = color.RGBA{0x44, 0x44, 0x44, 0xff}
				lab.TextStyle[j].Font.Size = vg.Points(6.5)
			}
			p.Add(lab)
		}
	}
	edge := func(pts []MapEdgeOut, c color.RGBA, dash []vg.Length, legend string) error {
		if len(pts) == 0 {
			return nil
		}
		xys := make(plotter.XYs, len(pts))
		for k, e := range pts {
			xys[k].X, xys[k].Y = finiteOr0(e.ActualVolumeFlow), finiteOr0(e.Head/1e3)
		}
		l, err := plotter.NewLine(xys)
		if err != nil {
			return err
		}
		l.Color, l.Width, l.Dashes = c, vg.Points(2), dash
		p.Add(l)
		p.Legend.Add(legend, l)
		return nil
	}
	if err := edge(m.SurgeLine, color.RGBA{0xc6, 0x28, 0x28, 0xff}, []vg.Length{vg.Points(6), vg.Points(3)}, "surge line (estimate)"); err != nil {
		return nil, err
	}
	if err := edge(m.ChokeLine, color.RGBA{0x37, 0x37, 0x37, 0xff}, []vg.Length{vg.Points(2), vg.Points(3)}, "choke (estimate)"); err != nil {
		return nil, err
	}
	marker := func(mk MapMarkerOut, c color.RGBA, legend string, shape draw.GlyphDrawer) error {
		s, err := plotter.NewScatter(plotter.XYs{{X: finiteOr0(mk.ActualVolumeFlow), Y: finiteOr0(mk.Head / 1e3)}})
		if err != nil {
			return err
		}
		s.GlyphStyle.Color, s.GlyphStyle.Radius, s.GlyphStyle.Shape = c, vg.Points(5), shape
		p.Add(s)
		p.Legend.Add(fmt.Sprintf("%s: %.3g m3/s, %.1f kJ/kg, eff. %.3f", legend, mk.ActualVolumeFlow, mk.Head/1e3, mk.Efficiency), s)
		return nil
	}
	if m.DesignPoint.Speed > 0 {
		if err := marker(m.DesignPoint, color.RGBA{0x0d, 0x47, 0xa1, 0xff}, "design point", draw.PyramidGlyph{}); err != nil {
			return nil, err
		}
	}
	if m.OperatingPoint != nil {
		if err := marker(*m.OperatingPoint, color.RGBA{0xe6, 0x51, 0x00, 0xff}, "operating point", draw.CrossGlyph{}); err != nil {
			return nil, err
		}
	}
	p.Legend.TextStyle.Font.Size = vg.Points(8)
	p.X.Min = 0
	p.Y.Min = 0
	c := vgsvg.NewWith(vgsvg.UseWH(mapChartWidth, mapChartHeight))
	p.Draw(draw.New(c))
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}
