package path

import (
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// Step control of the stepwise path.
const (
	// StepTolerance is the relative change of the polytropic head (and of
	// cp·T2 against the head) between n and 2n steps below which the
	// stepwise path counts as converged.
	StepTolerance = 1e-6
	// MaxSteps is the largest number of Runge-Kutta steps tried.
	MaxSteps   = 4096
	firstSteps = 4
)

// StepwiseResult is the path of constant polytropic efficiency.
type StepwiseResult struct {
	// Discharge is the state at the end of the path, model.State(T2, p2).
	Discharge gas.State
	// Head is the polytropic head Hp = ∫ v dp along the path.
	Head physics.JoulePerKg
	// Efficiency is the polytropic efficiency of the path.
	Efficiency float64
	// Steps is the number of Runge-Kutta steps in ln p of the answer (0:
	// the closed form of a constant-property gas).
	Steps int
	// HeadError is the estimated relative error of Head: the change
	// between Steps/2 and Steps divided by 2⁴ − 1 (Richardson, 4th order).
	HeadError float64
	// Closure is (Hp/ηp − (h2 − h1))/(h2 − h1): how well the model's own
	// enthalpy at the end of the path agrees with the work of the path. It
	// is of the order of HeadError for a thermodynamically consistent model.
	Closure float64
}

// StepwisePath integrates the compression path of constant polytropic
// (small-stage) efficiency etaP from the suction stagnation state to the
// total pressure p2, for any gas model:
//
//	dh = v dp / ηp   ⇔   dT/d(ln p) = (p v / cp)(1/ηp + X),  dHp/d(ln p) = p v
//
// with X = (T/v)(∂v/∂T)_p − 1 (so that dh = cp dT − v X dp), by the
// classical fourth-order Runge-Kutta method in ln p, with model.State at
// every stage. The number of steps starts at 4 and doubles until the head
// and cp1·T2 change by less than StepTolerance of the head; at most
// MaxSteps. The local exponent (p v / (T cp))(1/ηp + X) is the Schultz
// temperature exponent m.
//
// Source: the polytropic path definition ηp = v dp/dh of Dixon & Hall,
// Fluid Mechanics and Thermodynamics of Turbomachinery, 7th ed. (2014),
// ch. 2; step-wise integration as the real-gas reference after Mallen &
// Saville (1977) and Huntington (1985) (from memory); Runge-Kutta: Press et
// al., Numerical Recipes, 3rd ed. (2007), §17.1. Valid for p2 > suction
// pressure, 0 < etaP ≤ 1, and wherever the model gives single-phase states
// along the path.
func StepwisePath(m gas.Model, suction gas.State, p2 physics.Pascal, etaP float64) (StepwiseResult, error) {
	if err := checkInputs(m, suction, p2); err != nil {
		return StepwiseResult{}, err
	}
	if err := checkEfficiency("polytropic efficiency", etaP); err != nil {
		return StepwiseResult{}, err
	}
	switch c := m.(type) {
	case gas.Constant:
		return constantPath(c, suction, p2, etaP)
	case *gas.Constant:
		if c != nil {
			return constantPath(*c, suction, p2, etaP)
		}
	}
	return stepwiseConverged(m, suction, p2, etaP, firstSteps)
}

// constantPath is the path of constant polytropic efficiency of a
// calorically perfect gas in closed form, the exact solution of the
// equation StepwisePath integrates (X = 0, p v = R T, constant cp):
//
//	T2 = T1 (p2/p1)^(R/(cp ηp)),   Hp = ∫ v dp = ηp cp (T2 − T1)
//
// (Dixon & Hall 2014, ch. 2, polytropic efficiency; Saravanamuttoo et al.
// 2009, §2.2). Steps is 0 and HeadError 0: no integration was needed.
func constantPath(c gas.Constant, suction gas.State, p2 physics.Pascal, etaP float64) (StepwiseResult, error) {
	cp := float64(suction.Cp)
	r := cp - float64(suction.Cv) // specific gas constant of the model
	t1 := float64(suction.Temperature)
	t2 := t1 * math.Pow(float64(p2)/float64(suction.Pressure), r/(cp*etaP))
	head := etaP * cp * (t2 - t1)
	if !physics.Finite(t2, head) || !(r > 0) {
		return StepwiseResult{}, &physics.DomainError{Name: "state", Value: t2, Want: "a finite discharge temperature",
			Reason: "the constant-property path gives no finite discharge temperature for this pressure ratio"}
	}
	return stepwiseResult(c, suction, p2, etaP, t2, head, 0, 0)
}

// stepwiseConverged integrates with n steps and doubles them until the
// path converges.
func stepwiseConverged(m gas.Model, suction gas.State, p2 physics.Pascal, etaP float64, n int) (StepwiseResult, error) {
	n = max(n, 2)
	tPrev, hPrev, err := integrate(m, suction, p2, 1/etaP, n)
	if err != nil {
		return StepwiseResult{}, err
	}
	cp1 := float64(suction.Cp)
	for n < MaxSteps {
		n *= 2
		t2, head, err := integrate(m, suction, p2, 1/etaP, n)
		if err != nil {
			return StepwiseResult{}, err
		}
		change := math.Max(math.Abs(head-hPrev), cp1*math.Abs(t2-tPrev)) / head
		if change <= StepTolerance {
			return stepwiseResult(m, suction, p2, etaP, t2, head, n, change/15)
		}
		tPrev, hPrev = t2, head
	}
	return StepwiseResult{}, &physics.DomainError{Name: "polytropic efficiency", Value: etaP, Want: "a path that converges",
		Reason: fmt.Sprintf("the stepwise polytropic path did not converge in %d steps; the gas model varies too sharply along this path", MaxSteps)}
}

func stepwiseResult(m gas.Model, suction gas.State, p2 physics.Pascal, etaP, t2, head float64, n int, headErr float64) (StepwiseResult, error) {
	dis, err := m.State(physics.Kelvin(t2), p2)
	if err != nil {
		return StepwiseResult{}, fmt.Errorf("discharge state of the stepwise path at %.6g K, %.6g Pa: %w", t2, float64(p2), err)
	}
	work := float64(dis.Enthalpy - suction.Enthalpy)
	if !(work > 0) || !physics.Finite(work, head) {
		return StepwiseResult{}, &physics.DomainError{Name: "discharge enthalpy", Value: work, Want: "h2 > h1",
			Reason: "the gas model gives no rise of enthalpy along the compression path; its states are inconsistent"}
	}
	return StepwiseResult{
		Discharge:  dis,
		Head:       physics.JoulePerKg(head),
		Efficiency: etaP,
		Steps:      n,
		HeadError:  headErr,
		Closure:    (head/etaP - work) / work,
	}, nil
}

// integrate runs n classical Runge-Kutta steps in u = ln p of
// dT/du = (p v/cp)(a + X), dH/du = p v, with a = 1/ηp, and returns T2 and H.
func integrate(m gas.Model, suction gas.State, p2 physics.Pascal, a float64, n int) (t2, head float64, err error) {
	p1 := float64(suction.Pressure)
	du := math.Log(float64(p2)/p1) / float64(n)
	half := math.Exp(du / 2) // pressure factor of half a step
	t := float64(suction.Temperature)
	pa := p1
	for k := range n {
		pm := pa * half
		pb := pm * half
		if k == n-1 {
			pb = float64(p2)
		}
		var dt1, dh1 float64
		if k == 0 {
			dt1, dh1 = slopes(suction, a)
		} else if dt1, dh1, err = slopesAt(m, t, pa, a); err != nil {
			return 0, 0, err
		}
		dt2, dh2, err := slopesAt(m, t+0.5*du*dt1, pm, a)
		if err != nil {
			return 0, 0, err
		}
		dt3, dh3, err := slopesAt(m, t+0.5*du*dt2, pm, a)
		if err != nil {
			return 0, 0, err
		}
		dt4, dh4, err := slopesAt(m, t+du*dt3, pb, a)
		if err != nil {
			return 0, 0, err
		}
		t += du / 6 * (dt1 + 2*dt2 + 2*dt3 + dt4)
		head += du / 6 * (dh1 + 2*dh2 + 2*dh3 + dh4)
		pa = pb
	}
	if !physics.Finite(t, head) || !(t > 0) {
		return 0, 0, &physics.DomainError{Name: "polytropic efficiency", Value: 1 / a, Want: "a finite discharge temperature",
			Reason: "the polytropic path leaves every finite temperature; the efficiency is too low for this pressure ratio"}
	}
	return t, head, nil
}

func slopesAt(m gas.Model, t, p, a float64) (dt, dh float64, err error) {
	if !(t > 0) || math.IsInf(t, 0) {
		return 0, 0, &physics.DomainError{Name: "temperature", Value: t, Want: "finite, > 0 K",
			Reason: "the polytropic path leaves every finite temperature; the efficiency is too low for this pressure ratio"}
	}
	st, err := m.State(physics.Kelvin(t), physics.Pascal(p))
	if err != nil {
		return 0, 0, fmt.Errorf("state on the polytropic path at %.6g K, %.6g Pa: %w", t, p, err)
	}
	dt, dh = slopes(st, a)
	if !physics.Finite(dt, dh) {
		return 0, 0, &physics.DomainError{Name: "state", Value: t, Want: "finite properties",
			Reason: fmt.Sprintf("the gas model returned non-finite properties at %.6g K, %.6g Pa", t, p)}
	}
	return dt, dh, nil
}

func slopes(st gas.State, a float64) (dt, dh float64) {
	pv := float64(st.Pressure) / float64(st.Density)
	return pv / float64(st.Cp) * (a + st.SchultzX), pv
}
