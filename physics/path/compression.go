package path

import (
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// Result is the total-to-total compression of one stage or section.
type Result struct {
	// Suction is the suction stagnation state given.
	Suction gas.State
	// Discharge is the discharge stagnation state.
	Discharge gas.State
	// IsentropicDischarge is the state at the discharge pressure and the
	// suction entropy.
	IsentropicDischarge gas.State
	// Work is the actual specific work h2 − h1.
	Work physics.JoulePerKg
	// IsentropicHead is h2s − h1.
	IsentropicHead physics.JoulePerKg
	// PolytropicHead is the polytropic head by Method.
	PolytropicHead physics.JoulePerKg
	// IsentropicEfficiency is (h2s − h1)/(h2 − h1).
	IsentropicEfficiency float64
	// PolytropicEfficiency is PolytropicHead/Work, by Method.
	PolytropicEfficiency float64
	// Method is the method that PolytropicHead, PolytropicEfficiency and,
	// for a polytropic efficiency given, Discharge come from.
	Method Method
	// Schultz is the Schultz / PTC 10 analysis of Suction, Discharge and
	// IsentropicDischarge.
	Schultz SchultzResult
	// Stepwise is the path of constant polytropic efficiency from Suction
	// that ends at the enthalpy of Discharge.
	Stepwise StepwiseResult
	// HeadDifference is (Schultz.Head − Stepwise.Head)/Stepwise.Head for
	// the same end states.
	HeadDifference float64
}

// Compression returns the total-to-total compression of a gas from the
// suction stagnation state (as model.State(T1, p1) returns it) to the
// discharge total pressure p2 at the efficiency eff:
//
//	h2s = h(p2, s1),  Hs = h2s − h1
//	isentropic eff. given:  h2 = h1 + Hs/ηs, state by (P,h) flash
//	polytropic eff. given:  Stepwise: end of the path dh = v dp/ηp
//	                        Schultz: the state at p2 whose Schultz/PTC 10
//	                        efficiency Hp/(h2 − h1) equals ηp
//
// Both heads are always evaluated for the same end states: the Schultz
// analysis (SchultzAnalysis), and the stepwise path (StepwisePath) whose
// polytropic efficiency is found by a one-dimensional root so that the
// path ends at h2; this is the real-gas conversion between isentropic and
// polytropic efficiency. method (zero value Stepwise) picks which of the
// two gives PolytropicHead and PolytropicEfficiency.
//
// Sources: Dixon & Hall (2014), ch. 2 (definitions); Schultz (1962) and
// ASME PTC 10-1997 (head factor); Mallen & Saville (1977), Huntington
// (1985) (stepwise reference, from memory). Valid for p2 > p1,
// 0 < eff.Value ≤ 1, and single-phase states of the model along the path.
func Compression(m gas.Model, suction gas.State, p2 physics.Pascal, eff Efficiency, method Method) (Result, error) {
	return compression(m, suction, p2, eff, method, nil)
}

// pathEnd is what dischargeAt found at a discharge pressure, for
// compression to take instead of solving it again (the last Newton step
// of CompressionForWork is at the pressure it returns).
type pathEnd struct {
	p2   physics.Pascal
	step StepwiseResult // method Stepwise
	iso  gas.State      // method Schultz, with dis and sch
	dis  gas.State
	sch  SchultzResult
}

// compression is Compression with, for a polytropic efficiency, the end
// of the path at p2 already found (end.p2 == p2; nil: none).
func compression(m gas.Model, suction gas.State, p2 physics.Pascal, eff Efficiency, method Method, end *pathEnd) (Result, error) {
	if err := checkInputs(m, suction, p2); err != nil {
		return Result{}, err
	}
	if err := checkChoice(eff, method); err != nil {
		return Result{}, err
	}
	if end != nil && (end.p2 != p2 || eff.Basis != Polytropic) {
		end = nil
	}
	var iso gas.State
	var err error
	if end != nil && method != Stepwise {
		iso = end.iso
	} else if iso, err = isentropicDischarge(m, suction, p2); err != nil {
		return Result{}, err
	}
	h1 := suction.Enthalpy
	hs := float64(iso.Enthalpy - h1)

	var dis gas.State
	var sch SchultzResult
	var step StepwiseResult
	switch {
	case eff.Basis == Isentropic:
		h2 := h1 + physics.JoulePerKg(hs/eff.Value)
		if dis, err = m.StateFromPH(p2, h2); err != nil {
			return Result{}, fmt.Errorf("discharge state at %.6g Pa, %.6g J/kg: %w", float64(p2), float64(h2), err)
		}
		if sch, err = SchultzAnalysis(suction, dis, iso); err != nil {
			return Result{}, err
		}
		if step, err = stepwiseToEnthalpy(m, suction, dis, sch.Efficiency); err != nil {
			return Result{}, err
		}
	case method == Stepwise:
		if end != nil {
			step = end.step
		} else if step, err = StepwisePath(m, suction, p2, eff.Value); err != nil {
			return Result{}, err
		}
		dis = step.Discharge
		if sch, err = SchultzAnalysis(suction, dis, iso); err != nil {
			return Result{}, err
		}
	default: // polytropic, Schultz
		if end != nil {
			dis, sch = end.dis, end.sch
		} else if dis, sch, err = schultzDischarge(m, suction, iso, p2, eff.Value); err != nil {
			return Result{}, err
		}
		if step, err = stepwiseToEnthalpy(m, suction, dis, eff.Value); err != nil {
			return Result{}, err
		}
	}

	work := float64(dis.Enthalpy - h1)
	r := Result{
		Suction:              suction,
		Discharge:            dis,
		IsentropicDischarge:  iso,
		Work:                 physics.JoulePerKg(work),
		IsentropicHead:       physics.JoulePerKg(hs),
		IsentropicEfficiency: hs / work,
		Method:               method,
		Schultz:              sch,
		Stepwise:             step,
		HeadDifference:       float64(sch.Head-step.Head) / float64(step.Head),
	}
	if method == Schultz {
		r.PolytropicHead, r.PolytropicEfficiency = sch.Head, sch.Efficiency
	} else {
		r.PolytropicHead, r.PolytropicEfficiency = step.Head, float64(step.Head)/work
	}
	r.IsentropicEfficiency = capAtOne(r.IsentropicEfficiency)
	r.PolytropicEfficiency = capAtOne(r.PolytropicEfficiency)
	if !physics.Finite(work, r.IsentropicEfficiency, r.PolytropicEfficiency, r.HeadDifference) {
		return Result{}, &physics.DomainError{Name: "state", Value: work, Want: "finite results",
			Reason: "the compression gives no finite result; the gas model returned inconsistent states"}
	}
	return r, nil
}

// CompressionForWork returns the compression that the specific work w
// (h2 − h1) makes from the suction state at the efficiency eff: the
// inverse of Compression in the discharge pressure, for rating.
//
//	isentropic: h(p2, s1) = h1 + ηs w, solved by gas.StateFromHS
//	polytropic: h2(p2) − h1 = w, Newton in ln p2 with the exact path
//	            slope dh2/d(ln p2) = p2 v2/ηp
//
// Source: the Gibbs relation (∂h/∂p)_s = v and the path definition of
// Dixon & Hall (2014), ch. 2. Valid for finite w > 0 and the ranges of
// Compression.
func CompressionForWork(m gas.Model, suction gas.State, w physics.JoulePerKg, eff Efficiency, method Method) (Result, error) {
	return CompressionForWorkNear(m, suction, w, eff, method, 0)
}

// CompressionForWorkNear is CompressionForWork with a first guess of the
// discharge pressure (near > suction pressure; 0: none), for callers that
// solve many neighbouring compressions (a speed line, an iteration): the
// Newton steps in ln p2 then start next to the root. Same result to the
// solver tolerance; same sources and validity.
func CompressionForWorkNear(m gas.Model, suction gas.State, w physics.JoulePerKg, eff Efficiency, method Method, near physics.Pascal) (Result, error) {
	r, _, err := compressionForWork(m, suction, w, eff, method, near, nil)
	return r, err
}

// End is where a polytropic CompressionForWorkFrom ended: its discharge
// pressure and the path there, with the suction, efficiency and method
// it belongs to. The zero value is none.
type End struct {
	suction gas.State
	etaP    float64
	method  Method
	end     pathEnd
}

// CompressionForWorkFrom is CompressionForWorkNear for an iteration that
// changes only the work: prev is the End of the previous call (nil:
// none). When prev has the same suction, polytropic efficiency and method
// and the first Newton step lands on its pressure, that step takes the
// path prev already integrated instead of integrating it again, which
// gives the same answer bit for bit (the path at a pressure does not
// depend on the work). It returns the End of this call. Same sources and
// validity as CompressionForWork.
func CompressionForWorkFrom(m gas.Model, suction gas.State, w physics.JoulePerKg, eff Efficiency, method Method, near physics.Pascal, prev *End) (Result, End, error) {
	var known *pathEnd
	if prev != nil && eff.Basis == Polytropic && prev.etaP == eff.Value && prev.method == method && prev.suction == suction && prev.end.p2 > 0 {
		known = &prev.end
	}
	r, end, err := compressionForWork(m, suction, w, eff, method, near, known)
	if err != nil || eff.Basis != Polytropic {
		return r, End{}, err
	}
	return r, End{suction: suction, etaP: eff.Value, method: method, end: end}, nil
}

// compressionForWork is CompressionForWorkNear with, for a polytropic
// efficiency, the path end already known at one pressure (nil: none),
// and the end it arrives at.
func compressionForWork(m gas.Model, suction gas.State, w physics.JoulePerKg, eff Efficiency, method Method, near physics.Pascal, known *pathEnd) (Result, pathEnd, error) {
	if err := checkModel(m, suction); err != nil {
		return Result{}, pathEnd{}, err
	}
	if !(w > 0) || math.IsInf(float64(w), 1) {
		return Result{}, pathEnd{}, &physics.DomainError{Name: "work", Value: float64(w), Want: "finite, > 0 J/kg",
			Reason: "the specific work must be a finite number above 0 J/kg"}
	}
	if err := checkChoice(eff, method); err != nil {
		return Result{}, pathEnd{}, err
	}
	p1 := float64(suction.Pressure)
	pv1 := p1 / float64(suction.Density)
	var p2 float64
	if eff.Basis == Isentropic {
		h2s := suction.Enthalpy + physics.JoulePerKg(eff.Value)*w
		guess := p1 * math.Exp(math.Min(eff.Value*float64(w)/pv1, 20))
		st, err := gas.StateFromHS(m, h2s, suction.Entropy, physics.Pascal(guess))
		if err != nil {
			return Result{}, pathEnd{}, fmt.Errorf("discharge pressure for %.6g J/kg: %w", float64(w), err)
		}
		p2 = float64(st.Pressure)
	} else {
		end, err := polytropicPressure(m, suction, float64(w), eff.Value, method, float64(near), known)
		if err != nil {
			return Result{}, pathEnd{}, err
		}
		if !(end.p2 > suction.Pressure) {
			return Result{}, pathEnd{}, pressureNotAbove(end.p2)
		}
		r, err := compression(m, suction, end.p2, eff, method, &end)
		return r, end, err
	}
	if !(p2 > p1) {
		return Result{}, pathEnd{}, pressureNotAbove(physics.Pascal(p2))
	}
	r, err := Compression(m, suction, physics.Pascal(p2), eff, method)
	return r, pathEnd{}, err
}

// polytropicPressure finds p2 with h2(p2) − h1 = w along the polytropic
// path of the method, by Newton steps in u = ln(p2/p1), and returns the
// path's end there.
func polytropicPressure(m gas.Model, suction gas.State, w, etaP float64, method Method, near float64, known *pathEnd) (pathEnd, error) {
	p1 := float64(suction.Pressure)
	pv1 := p1 / float64(suction.Density)
	// Isothermal perfect-gas estimate, an upper bound of the ratio: Hp = pv ln pr.
	u := math.Min(etaP*w/pv1, 20)
	if near > p1 && math.Log(near/p1) < u {
		u = math.Log(near / p1)
	}
	for range 40 {
		p2 := physics.Pascal(p1 * math.Exp(u))
		var end pathEnd
		var err error
		if known != nil && known.p2 == p2 {
			end, known = *known, nil // the path there is already integrated
		} else if end, err = dischargeAt(m, suction, p2, etaP, method); err != nil {
			return pathEnd{}, err
		}
		dis := end.dis
		res := w - float64(dis.Enthalpy-suction.Enthalpy)
		if math.Abs(res) <= 1e-10*w {
			return end, nil
		}
		slope := float64(dis.Pressure) / float64(dis.Density) / etaP
		next := u + res/slope
		next = math.Max(math.Min(next, 4*u), u/4)
		if math.Abs(next-u) <= 1e-13*math.Max(u, 1) {
			return end, nil
		}
		u = next
	}
	return pathEnd{}, &physics.DomainError{Name: "work", Value: w, Want: "a reachable discharge pressure",
		Reason: "no discharge pressure of the gas model takes up this work at this efficiency (the search did not converge)"}
}

// dischargeAt returns the end of the path of a polytropic efficiency by
// the method at p2 (dis: the discharge state).
func dischargeAt(m gas.Model, suction gas.State, p2 physics.Pascal, etaP float64, method Method) (pathEnd, error) {
	end := pathEnd{p2: p2}
	var err error
	if method == Stepwise {
		end.step, err = StepwisePath(m, suction, p2, etaP)
		end.dis = end.step.Discharge
		return end, err
	}
	if end.iso, err = isentropicDischarge(m, suction, p2); err != nil {
		return pathEnd{}, err
	}
	end.dis, end.sch, err = schultzDischarge(m, suction, end.iso, p2, etaP)
	return end, err
}

func isentropicDischarge(m gas.Model, suction gas.State, p2 physics.Pascal) (gas.State, error) {
	iso, err := m.StateFromPS(p2, suction.Entropy)
	if err != nil {
		return gas.State{}, fmt.Errorf("isentropic discharge state at %.6g Pa: %w", float64(p2), err)
	}
	if !(iso.Enthalpy > suction.Enthalpy) {
		return gas.State{}, &physics.DomainError{Name: "isentropic discharge enthalpy", Value: float64(iso.Enthalpy),
			Want:   "above the suction enthalpy",
			Reason: "the gas model gives no rise of enthalpy along the isentrope; its states are inconsistent"}
	}
	return iso, nil
}

// schultzDischarge finds the discharge temperature at p2 for which the
// Schultz analysis gives the polytropic efficiency etaP. The residual
// ηp (h2 − h1) − Hp rises with T2; it starts from the stepwise path end.
func schultzDischarge(m gas.Model, suction, iso gas.State, p2 physics.Pascal, etaP float64) (gas.State, SchultzResult, error) {
	if etaP == 1 { // the isentrope: Hp = Hs exactly
		sch, err := SchultzAnalysis(suction, iso, iso)
		return iso, sch, err
	}
	start, err := StepwisePath(m, suction, p2, etaP)
	if err != nil {
		return gas.State{}, SchultzResult{}, err
	}
	var dis gas.State
	var sch SchultzResult
	residual := func(t float64) (float64, error) {
		var err error
		if dis, err = m.State(physics.Kelvin(t), p2); err != nil {
			return 0, fmt.Errorf("discharge state at %.6g K, %.6g Pa: %w", t, float64(p2), err)
		}
		if !(dis.Enthalpy > iso.Enthalpy) {
			return float64(dis.Enthalpy - iso.Enthalpy), nil // below the isentrope: push T2 up
		}
		if sch, err = SchultzAnalysis(suction, dis, iso); err != nil {
			return 0, err
		}
		return etaP*float64(dis.Enthalpy-suction.Enthalpy) - float64(sch.Head), nil
	}
	t0 := float64(start.Discharge.Temperature)
	t1 := float64(iso.Temperature)
	work := float64(start.Discharge.Enthalpy - suction.Enthalpy)
	tol := 1e-12 * work
	t, err := rootIncreasing(residual, t0, t0+1e-4*(t0-t1)+1e-6, t1, 1e3*t0, tol, 1e-13*t0)
	if err != nil {
		return gas.State{}, SchultzResult{}, err
	}
	if _, err := residual(t); err != nil {
		return gas.State{}, SchultzResult{}, err
	}
	if !(dis.Enthalpy > iso.Enthalpy) {
		return gas.State{}, SchultzResult{}, noRoot()
	}
	return dis, sch, nil
}

// stepwiseToEnthalpy finds the polytropic efficiency whose stepwise path
// from suction ends at the enthalpy of dis, by a root in a = 1/ηp ≥ 1 at
// the step count that converges at the first guess, then returns the
// converged path at that efficiency.
func stepwiseToEnthalpy(m gas.Model, suction, dis gas.State, etaGuess float64) (StepwiseResult, error) {
	p2 := dis.Pressure
	work := float64(dis.Enthalpy - suction.Enthalpy)
	first, err := stepwiseConverged(m, suction, p2, etaGuess, firstSteps)
	if err != nil {
		return StepwiseResult{}, err
	}
	n := first.Steps
	residual := func(a float64) (float64, error) {
		t2, _, err := integrate(m, suction, p2, a, n)
		if err != nil {
			return 0, err
		}
		st, err := m.State(physics.Kelvin(t2), p2)
		if err != nil {
			return 0, fmt.Errorf("end of the polytropic path at %.6g K, %.6g Pa: %w", t2, float64(p2), err)
		}
		return float64(st.Enthalpy - dis.Enthalpy), nil
	}
	tol := 1e-11 * work
	a0 := math.Max(1/etaGuess, 1)
	// Along the path h2 − h1 = a·Hp, so dh2/da ≈ Hp: a Newton second point.
	gFirst := float64(first.Discharge.Enthalpy - dis.Enthalpy)
	a1 := math.Max(a0-gFirst/float64(first.Head), 1)
	if math.Abs(a1-a0) < 1e-9*a0 {
		a1 = a0 * (1 + 1e-6)
	}
	a, err := rootIncreasing(residual, a0, a1, 1, 1e6, tol, 1e-14*a0)
	if err != nil {
		// At ηs → 1 the root sits on a = 1 (ηp = 1) within the
		// integration error; accept the isentropic path there.
		g1, err1 := residual(1)
		if err1 != nil || g1 < -tol {
			return StepwiseResult{}, err
		}
		a = 1
	}
	return stepwiseConverged(m, suction, p2, 1/a, n/2)
}

// capAtOne reports an efficiency that exceeds 1 only by the flash and
// integration tolerances (an isentropic compression) as 1.
func capAtOne(eta float64) float64 {
	if eta > 1 && eta <= 1+StepTolerance {
		return 1
	}
	return eta
}

func checkModel(m gas.Model, suction gas.State) error {
	if m == nil {
		return &physics.DomainError{Name: "model", Value: 0, Want: "a gas model", Reason: "a gas model is required"}
	}
	return checkState("suction", suction)
}

func checkInputs(m gas.Model, suction gas.State, p2 physics.Pascal) error {
	if err := checkModel(m, suction); err != nil {
		return err
	}
	if !(p2 > 0) || math.IsInf(float64(p2), 1) {
		return &physics.DomainError{Name: "discharge pressure", Value: float64(p2), Want: "finite, > 0 Pa",
			Reason: "the discharge pressure must be a finite absolute pressure in Pa"}
	}
	if !(p2 > suction.Pressure) {
		return pressureNotAbove(p2)
	}
	return nil
}

func checkChoice(eff Efficiency, method Method) error {
	switch {
	case eff.Basis != Isentropic && eff.Basis != Polytropic:
		return &physics.DomainError{Name: "efficiency basis", Value: float64(eff.Basis), Want: "isentropic or polytropic",
			Reason: "the efficiency basis must be isentropic or polytropic"}
	case method != Stepwise && method != Schultz:
		return &physics.DomainError{Name: "method", Value: float64(method), Want: "stepwise or schultz",
			Reason: "the polytropic method must be stepwise or schultz"}
	}
	if eff.Basis == Isentropic {
		return checkEfficiency("isentropic efficiency", eff.Value)
	}
	return checkEfficiency("polytropic efficiency", eff.Value)
}

func checkState(name string, s gas.State) error {
	ok := s.Temperature > 0 && s.Pressure > 0 && s.Density > 0 && s.Cp > 0 &&
		physics.Finite(float64(s.Temperature), float64(s.Pressure), float64(s.Density), float64(s.Cp),
			float64(s.Enthalpy), float64(s.Entropy), s.SchultzX, s.SchultzY)
	if !ok {
		return &physics.DomainError{Name: name, Value: float64(s.Temperature), Want: "a state from the gas model",
			Reason: "the " + name + " state must be a gas state from the model (finite temperature, pressure, density, cp, enthalpy and entropy, all positive where they must be)"}
	}
	return nil
}

func pressureNotAbove(p2 physics.Pascal) error {
	return &physics.DomainError{Name: "discharge pressure", Value: float64(p2), Want: "above the suction pressure",
		Reason: "discharge pressure must exceed suction pressure"}
}
