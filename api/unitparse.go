package api

import (
	"fmt"

	"stagewright/api/units"
)

// parseUnit parses a string with a unit into SI for dimension dim. Gauge
// pressures add ambient (Pa absolute).
func parseUnit(dim dimension, text string, ambient float64) (float64, error) {
	switch dim {
	case dimPressure:
		return units.ParsePressure(text, ambient)
	case dimTemperature:
		return units.ParseTemperature(text)
	case dimMassFlow:
		return units.ParseMassFlow(text)
	case dimVolumeFlow:
		return units.ParseVolumeFlow(text)
	case dimSpeed:
		return units.ParseSpeed(text)
	case dimVelocity:
		return units.ParseVelocity(text)
	}
	return 0, fmt.Errorf("no unit parser for dimension %d", dim)
}
