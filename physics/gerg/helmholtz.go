package gerg

import "math"

// Residual holds the reduced residual Helmholtz energy α_r(δ, τ) of the
// mixture and its derivatives, each multiplied by the powers of δ and τ
// that make it dimensionless in the usual way.
type Residual struct {
	A  float64 // α_r
	D  float64 // δ ∂α_r/∂δ
	DD float64 // δ² ∂²α_r/∂δ²
	T  float64 // τ ∂α_r/∂τ
	TT float64 // τ² ∂²α_r/∂τ²
	DT float64 // δ τ ∂²α_r/∂δ∂τ
}

// tauWork is the per-temperature part of α_r: for each group g,
// b = Σ w τ^t, bt = Σ w t τ^t and btt = Σ w t (t−1) τ^t. It lives on the
// caller's stack.
type tauWork struct {
	b, bt, btt [maxGroups]float64
}

// setTau fills w for τ.
func (mx *Mixture) setTau(tau float64, w *tauWork) {
	var pw [maxTVals]float64
	var ti [maxTInt + 1]float64 // τ^i
	var tj [tDiv]float64        // τ^(j/tDiv)
	ti[0], tj[0] = 1, 1
	for i := 1; i <= mx.tMaxI; i++ {
		ti[i] = ti[i-1] * tau
	}
	lt := math.Log(tau)
	r := math.Exp(lt / tDiv)
	for j := 1; j < tDiv; j++ {
		tj[j] = tj[j-1] * r
	}
	for i, tp := range mx.tpow {
		if tp.exp {
			pw[i] = math.Exp(mx.tvals[i] * lt)
			continue
		}
		pw[i] = ti[tp.i] * tj[tp.j]
	}
	ng := len(mx.groups)
	clear(w.b[:ng])
	clear(w.bt[:ng])
	clear(w.btt[:ng])
	for _, tm := range mx.terms {
		t := mx.tvals[tm.ti]
		v := tm.w * pw[tm.ti]
		w.b[tm.g] += v
		w.bt[tm.g] += t * v
		w.btt[tm.g] += t * (t - 1) * v
	}
}

// residual evaluates α_r and its derivatives at δ with the τ part w.
//
// For a group f(δ) = δ^d e^φ(δ) with g = δ f'/f = d + δ φ':
//
//	δ f' = f g,  δ² f'' = f (g² − g + δ φ' + δ² φ'');
//
// so φ = −δ^c gives g = d − c δ^c and δ² f”/f = g (g − 1) − c² δ^c;
// φ = −η(δ−ε)² − β(δ−γ) gives g = d − 2ηδ(δ−ε) − βδ and
// δ² f”/f = g² − d − 2ηδ². The τ derivatives are the sums bt and btt.
// Source: Kunz & Wagner (2012), Table B4 (derivatives of the residual part),
// derived here from the term forms in the reference pack README.
func (mx *Mixture) residual(delta float64, w *tauWork) Residual {
	var dp [maxD + 1]float64
	dp[0] = 1
	for k := 1; k <= mx.dMax; k++ {
		dp[k] = dp[k-1] * delta
	}
	var dc, ec [maxC + 1]float64 // δ^c and exp(−δ^c)
	for c := 1; c <= mx.cMax; c++ {
		dc[c] = dp[c]
		ec[c] = math.Exp(-dp[c])
	}
	u := delta - 0.5
	var pa [maxA + 1]float64 // exp(−u²/8)^k
	var pb [maxB + 1]float64 // exp(−u/4)^k
	pa[0], pb[0] = 1, 1
	ea, eb := math.Exp(-u*u/8), math.Exp(-u/4)
	for k := 1; k <= maxA; k++ {
		pa[k] = pa[k-1] * ea
	}
	for k := 1; k <= maxB; k++ {
		pb[k] = pb[k-1] * eb
	}
	var r Residual
	d2 := delta * delta
	for i := range mx.groups {
		gr := &mx.groups[i]
		var f, g, g2 float64
		d := float64(gr.d)
		switch {
		case gr.kind == 1:
			dm := delta - gr.eps
			if tab := mx.expTab[i]; tab[0] >= 0 {
				f = dp[gr.d] * pa[tab[0]] * pb[tab[1]]
			} else {
				f = dp[gr.d] * math.Exp(-gr.eta*dm*dm-gr.beta*(delta-gr.gamma))
			}
			g = d - 2*gr.eta*delta*dm - gr.beta*delta
			g2 = g*g - d - 2*gr.eta*d2
		case gr.c == 0:
			f = dp[gr.d]
			g = d
			g2 = d * (d - 1)
		default:
			c := float64(gr.c)
			f = dp[gr.d] * ec[gr.c]
			g = d - c*dc[gr.c]
			g2 = g*(g-1) - c*c*dc[gr.c]
		}
		b := w.b[i] * f
		bt := w.bt[i] * f
		r.A += b
		r.D += b * g
		r.DD += b * g2
		r.T += bt
		r.TT += w.btt[i] * f
		r.DT += bt * g
	}
	return r
}

// ResidualAt returns α_r and its derivatives at reduced density δ and
// inverse reduced temperature τ (both > 0).
func (mx *Mixture) ResidualAt(delta, tau float64) Residual {
	var w tauWork
	mx.setTau(tau, &w)
	return mx.residual(delta, &w)
}
