// Package gerg is the GERG-2008 wide-range equation of state for natural
// gases and related mixtures of its 21 components (O. Kunz and W. Wagner,
// J. Chem. Eng. Data 57:3032-3091, 2012; ISO 20765-2; AGA Report No. 8
// Part 2, 2017), written from the equations in
// testdata/reference/gerg2008/README.md with the published coefficient
// tables (data/*.csv, the shared reference pack's copy of the values of
// NIST's public-domain reference implementation).
//
// The mixture's reduced Helmholtz energy α = α° + α_r is a function of
// δ = ρ/ρ_r(x) and τ = T_r(x)/T. NewMixture evaluates the reducing
// functions and merges every residual term of the composition (pure-fluid
// terms weighted by x_i, departure terms by x_i x_j F_ij) into groups that
// share their δ function; a state then needs the τ powers once per
// temperature and a pass over the groups per density. Residual.D, DD, T,
// TT and DT are the analytic derivatives (δ ∂/∂δ ...), checked against
// finite differences in the tests.
//
// StateTP solves p(ρ) = p on the vapour-like branch (a safeguarded Newton
// search from the second-virial estimate that never crosses the unstable
// region) and falls back to the liquid-like root, saying which in Branch;
// a state without a physical root is an error wrapping ErrNoRoot. LiquidTP
// gives the liquid-like root for the comparison of Gibbs energies of a
// pure fluid. Range: 60-700 K, up to 70 MPa (Range); outside is a
// *physics.DomainError.
//
// Units: SI, molar (J/mol, J/(mol K), mol/m³); R = 8.314472 J/(mol K), the
// constant of the equation. Reference state: h = 0 and s = 0 for each pure
// component as an ideal gas at 298.15 K and 101 325 Pa, the mixture adding
// −R Σ x ln x (the convention of package gas). Evaluations allocate
// nothing; a Mixture is immutable and safe for concurrent use.
package gerg
