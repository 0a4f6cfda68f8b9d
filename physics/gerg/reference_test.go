package gerg_test

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/gerg"
)

// refDir holds the check values of the shared reference pack, copied
// unchanged: testdata/reference/gerg2008/README.md says how they were
// computed (NIST's public-domain AGA 8 Part 2 / GERG-2008 reference
// implementation, version 2.01, Lemmon, Bell et al. 2017).
const refDir = "../../testdata/reference/gerg2008/"

func readRows(t *testing.T, name string) []map[string]string {
	t.Helper()
	f, err := os.Open(refDir + name)
	require.NoError(t, err)
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	require.NoError(t, err)
	var out []map[string]string
	for _, rec := range recs[1:] {
		m := map[string]string{}
		for i, h := range recs[0] {
			m[h] = rec[i]
		}
		out = append(out, m)
	}
	return out
}

// mixtureOf parses "CH4:0.9 C2H6:0.05" (formulas of components.csv).
func mixtureOf(t testing.TB, spec string) *gerg.Mixture {
	t.Helper()
	x := make([]float64, gerg.NumComponents)
	for _, part := range strings.Fields(spec) {
		f, v, ok := strings.Cut(part, ":")
		require.True(t, ok, part)
		i, ok := gerg.Index(f)
		require.True(t, ok, f)
		x[i], _ = strconv.ParseFloat(v, 64)
	}
	m, err := gerg.NewMixture(x)
	require.NoError(t, err)
	return m
}

// tolOf returns the tolerance "to the digits given" for a printed value:
// the larger of rel·|v| and half a unit of its last printed significant
// digit (the pack prints most columns to 10 digits, Joule-Thomson to 6).
func tolOf(s string, rel float64) (float64, float64) {
	v, _ := strconv.ParseFloat(s, 64)
	mant := strings.ToLower(s)
	exp := 0
	if i := strings.IndexByte(mant, 'e'); i >= 0 {
		exp, _ = strconv.Atoi(mant[i+1:])
		mant = mant[:i]
	}
	dec := 0
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		dec = len(mant) - i - 1
	}
	half := 0.5 * math.Pow(10, float64(exp-dec))
	return v, max(rel*math.Abs(v), half)
}

func f64(t *testing.T, s string) float64 {
	v, err := strconv.ParseFloat(s, 64)
	require.NoError(t, err)
	return v
}

// TestChecksCSV reproduces every row of checks.csv (source: the NIST
// reference implementation, via testdata/reference/gerg2008/checks.csv):
// density and Z to 1e-7 relative, the rest to 1e-6 (or half a unit of the
// last printed digit, where fewer digits are printed).
func TestChecksCSV(t *testing.T) {
	rows := readRows(t, "checks.csv")
	require.Len(t, rows, 38)
	for _, r := range rows {
		t.Run(r["id"], func(t *testing.T) {
			m := mixtureOf(t, r["composition_mole"])
			st, err := m.StateTP(f64(t, r["T_K"]), f64(t, r["P_Pa"]))
			require.NoError(t, err)
			require.Equal(t, gerg.Vapour, st.Branch)
			mm := m.MolarMass()
			got := map[string]float64{
				"density_kg_m3":          st.Rho * mm,
				"Z":                      st.Z,
				"cp_J_kgK":               st.Cp / mm,
				"cv_J_kgK":               st.Cv / mm,
				"speed_of_sound_m_s":     st.W,
				"isentropic_exponent":    st.Kappa,
				"joule_thomson_K_per_Pa": st.JT,
			}
			for col, g := range got {
				rel := 1e-6
				if col == "density_kg_m3" || col == "Z" {
					rel = 1e-7
				}
				want, tol := tolOf(r[col], rel)
				assert.InDelta(t, want, g, tol, col)
			}
		})
	}
}

// TestDifferencesCSV reproduces every row of differences.csv (source as
// TestChecksCSV): h2 − h1 and s2 − s1 between two states, to 1e-6
// relative.
func TestDifferencesCSV(t *testing.T) {
	rows := readRows(t, "differences.csv")
	require.Len(t, rows, 5)
	for _, r := range rows {
		t.Run(r["id"], func(t *testing.T) {
			m := mixtureOf(t, r["composition_mole"])
			mm := m.MolarMass()
			s1, err := m.StateTP(f64(t, r["T1_K"]), f64(t, r["P1_Pa"]))
			require.NoError(t, err)
			s2, err := m.StateTP(f64(t, r["T2_K"]), f64(t, r["P2_Pa"]))
			require.NoError(t, err)
			want, tol := tolOf(r["h2_minus_h1_J_kg"], 1e-6)
			assert.InDelta(t, want, (s2.H-s1.H)/mm, tol, "dh")
			want, tol = tolOf(r["s2_minus_s1_J_kgK"], 1e-6)
			assert.InDelta(t, want, (s2.S-s1.S)/mm, tol, "ds")
		})
	}
}

// TestPublishedTestState is the reference implementation's own published
// test (the 21-component mixture at 400 K and 50 MPa, quoted in
// testdata/reference/gerg2008/README.md), to 1e-9 relative.
func TestPublishedTestState(t *testing.T) {
	m := mixtureOf(t, "CH4:0.77824 N2:0.02 CO2:0.06 C2H6:0.08 C3H8:0.03 i-C4H10:0.0015 n-C4H10:0.003 "+
		"i-C5H12:0.0005 n-C5H12:0.00165 n-C6H14:0.00215 n-C7H16:0.00088 n-C8H18:0.00024 n-C9H20:0.00015 "+
		"n-C10H22:0.00009 H2:0.004 O2:0.005 CO:0.002 H2O:0.0001 H2S:0.0025 He:0.007 Ar:0.001")
	st, err := m.StateTP(400, 50e6)
	require.NoError(t, err)
	rel := func(want, got float64, what string) {
		assert.InDelta(t, want, got, 1e-9*math.Abs(want), what)
	}
	rel(20.5427445016, m.MolarMass()*1e3, "molar mass g/mol") // printed to 12 digits
	rel(12.79828626082062, st.Rho/1e3, "molar density mol/L")
	rel(1.174690666383717, st.Z, "Z")
	rel(58.45522051000366, st.Cp, "cp J/(mol K)")
	rel(39.02948218156372, st.Cv, "cv J/(mol K)")
	rel(714.4248840596024, st.W, "speed of sound")
	rel(2.683820255058032, st.Kappa, "isentropic exponent")
	rel(7.155629581480913e-5, st.JT*1e3, "Joule-Thomson K/kPa")
}
