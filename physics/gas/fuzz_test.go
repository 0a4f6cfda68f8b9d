package gas_test

import (
	"testing"

	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

func finiteState(t *testing.T, st gas.State) {
	t.Helper()
	require.True(t, physics.Finite(float64(st.Temperature), float64(st.Pressure), float64(st.Density), st.Compressibility,
		float64(st.Enthalpy), float64(st.Entropy), float64(st.Cp), float64(st.Cv), st.IsentropicExponent,
		float64(st.SoundSpeed), st.JouleThomson, st.SchultzX, st.SchultzY), "%+v", st)
}

// FuzzModels: every entry point returns an error or a finite state.
func FuzzModels(f *testing.F) {
	f.Add(300.0, 5e6, 1e5, 100.0)
	f.Add(50.0, 1e8, -1e6, -5000.0)
	f.Add(1e4, 1.0, 1e9, 1e9)
	f.Fuzz(func(t *testing.T, temp, p, h, s float64) {
		c, err := gas.NewComposition(naturalGas(), gas.BasisMole)
		require.NoError(t, err)
		for _, name := range []string{"ideal", "peng-robinson", "srk", "gerg-2008"} {
			m, err := gas.NewModel(name, c, nil)
			require.NoError(t, err)
			if st, err := m.State(physics.Kelvin(temp), physics.Pascal(p)); err == nil {
				finiteState(t, st)
			}
			if st, err := m.StateFromPH(physics.Pascal(p), physics.JoulePerKg(h)); err == nil {
				finiteState(t, st)
			}
			if st, err := m.StateFromPS(physics.Pascal(p), physics.JoulePerKgK(s)); err == nil {
				finiteState(t, st)
			}
		}
	})
}
