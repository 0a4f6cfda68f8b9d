package gerg_test

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gerg"
)

// FuzzGERG: for any temperature, pressure and a mixture of up to four
// components (indices and weights from the input), StateTP returns a
// DomainError or a state with finite properties whose pressure is the one
// asked for and whose root lies where (∂p/∂ρ)_T > 0.
func FuzzGERG(f *testing.F) {
	f.Add(300.0, 5e6, uint8(0), uint8(3), uint8(4), uint8(14), 0.9, 0.05, 0.03, 0.02)
	f.Add(60.0, 7e7, uint8(2), uint8(2), uint8(17), uint8(20), 1.0, 0.0, 0.5, 0.0)
	f.Add(700.0, 1.0, uint8(13), uint8(12), uint8(19), uint8(1), 0.1, 0.2, 0.3, 0.4)
	f.Add(280.0, 1e7, uint8(2), uint8(2), uint8(2), uint8(2), 1.0, 1.0, 1.0, 1.0)
	f.Add(math.NaN(), math.Inf(1), uint8(255), uint8(0), uint8(0), uint8(0), -1.0, 2.0, 0.0, 0.0)
	f.Fuzz(func(t *testing.T, temp, p float64, i1, i2, i3, i4 uint8, w1, w2, w3, w4 float64) {
		x := make([]float64, gerg.NumComponents)
		sum := 0.0
		for k, w := range []float64{w1, w2, w3, w4} {
			w = math.Abs(w)
			if !(w <= 1e3) { // NaN, Inf, huge: leave out
				continue
			}
			i := int([]uint8{i1, i2, i3, i4}[k]) % gerg.NumComponents
			x[i] += w
			sum += w
		}
		if !(sum > 1e-9) {
			return
		}
		for i := range x {
			x[i] /= sum
		}
		m, err := gerg.NewMixture(x)
		if err != nil {
			require.ErrorIs(t, err, physics.ErrDomain)
			return
		}
		st, err := m.StateTP(temp, p)
		if err != nil {
			var de *physics.DomainError
			require.True(t, errors.As(err, &de), "%v", err)
			return
		}
		for _, v := range []float64{st.Rho, st.Z, st.H, st.S, st.Cp, st.Cv, st.W, st.Kappa, st.JT, st.DPDRho, st.DPDT} {
			require.False(t, math.IsNaN(v) || math.IsInf(v, 0), "%+v", st)
		}
		require.InDelta(t, p, st.P, 1e-7*p)
		require.Greater(t, st.DPDRho, 0.0)
	})
}
