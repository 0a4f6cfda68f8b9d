// Package path computes the compression path of one stage or section,
// total-to-total, for any gas.Model: the isentropic discharge by a (P,s)
// flash, the polytropic path of constant small-stage efficiency integrated
// step by step, the ASME PTC 10 / Schultz polytropic analysis, the
// conversion between isentropic and polytropic efficiency for a real gas,
// and the inverse "compression made by a given work".
//
// Units are SI and per kg: pressure Pa absolute, temperature K, enthalpy,
// work and head J/kg, entropy J/(kg K). Efficiencies are ratios in (0, 1].
//
// Definitions used throughout (all total-to-total):
//
//	isentropic head   Hs = h2s − h1,  h2s = h(p2, s1)
//	actual work       W  = h2 − h1
//	isentropic eff.   ηs = Hs / W
//	polytropic head   Hp = ∫ v dp along the path with dh = v dp / ηp
//	polytropic eff.   ηp = Hp / W
//
// Two methods give the polytropic head: Stepwise (the reference) integrates
// the path of constant small-stage efficiency, written as the ODE in ln p
//
//	dT/d(ln p) = (p v / cp) (1/ηp + X),   dHp/d(ln p) = p v,
//
// with X = (T/v)(∂v/∂T)_p − 1; Schultz evaluates the end states with the
// polytropic head factor f of Schultz (1962) as adopted by ASME PTC 10.
// Both reduce to the perfect-gas closed forms for the ideal-constant model.
//
// References:
//   - J. M. Schultz, "The Polytropic Analysis of Centrifugal Compressors",
//     ASME J. Eng. Power 84(1):69-82 (1962); ASME PTC 10-1997, Performance
//     Test Code on Compressors and Exhausters (end-state form of n, ns, f;
//     equation forms from memory).
//   - R. L. Mallen and G. Saville, "Polytropic Processes in the Performance
//     Prediction of Centrifugal Compressors", IMechE C183/77 (1977), and
//     R. A. Huntington, "Evaluation of Polytropic Calculation Methods for
//     Turbomachinery Performance", ASME J. Eng. Gas Turbines Power
//     107(4):872-879 (1985): step-wise integration of the polytropic path
//     as the reference for real gases (from memory).
//   - S. L. Dixon and C. A. Hall, Fluid Mechanics and Thermodynamics of
//     Turbomachinery, 7th ed. (2014), ch. 2, small-stage (polytropic)
//     efficiency ηp = v dp / dh and the perfect-gas relations.
//   - W. H. Press et al., Numerical Recipes, 3rd ed. (2007), §17.1 (classical
//     Runge-Kutta), §9.2 (false position with the Illinois modification).
package path
