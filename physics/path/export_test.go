package path

import (
	"stagewright/physics"
	"stagewright/physics/gas"
)

// IntegrateSteps exposes the fixed-step Runge-Kutta path to the tests:
// discharge temperature and polytropic head after n steps.
func IntegrateSteps(m gas.Model, suction gas.State, p2 physics.Pascal, etaP float64, n int) (t2, head float64, err error) {
	return integrate(m, suction, p2, 1/etaP, n)
}

// EndPressure exposes the discharge pressure an End holds, so that a test
// can tell that a reuse was possible.
func EndPressure(e End) physics.Pascal { return e.end.p2 }
