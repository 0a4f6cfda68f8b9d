package gerg

import (
	"embed"
	"encoding/csv"
	"fmt"
	"strconv"
	"sync"
)

// The coefficient tables of GERG-2008 (Kunz & Wagner, J. Chem. Eng. Data
// 57:3032, 2012; ISO 20765-2; AGA Report No. 8 Part 2, 2017) as the
// shared reference pack holds them (testdata/reference/gerg2008/README.md
// describes every column). They are data, read once; the code that uses
// them is written from the equations of the paper.
//
//go:embed data/*.csv
var dataFS embed.FS

// NumComponents is the number of GERG-2008 components.
const NumComponents = 21

// component is one row of components.csv with its ideal-gas row.
type component struct {
	formula, name string
	m             float64 // kg/mol
	tc            float64 // K
	rhoc          float64 // mol/m³
	res           []pureTerm
	ideal         [11]float64 // n1, n2, n3, n4, θ4, n5, θ5, n6, θ6, n7, θ7
}

// pureTerm is n δ^d τ^t exp(−δ^c) (c = 0: polynomial term).
type pureTerm struct {
	n, t   float64
	d, c   int
	gi, ti int32 // global group and exponent index (tables.groups, tables.tvals)
}

// depTerm is n δ^d τ^t exp(−η(δ−ε)² − β(δ−γ)) (all four 0: polynomial).
type depTerm struct {
	n, t                  float64
	d                     int
	eta, eps, beta, gamma float64
	gi, ti                int32 // global group and exponent index
}

// binary holds the reducing parameters and the departure weight of a pair
// i < j; model is the departure model number, or −1.
type binary struct {
	betaV, gammaV, betaT, gammaT, f float64
	model                           int
}

// tables is the whole coefficient set.
type tables struct {
	comps [NumComponents]component
	pairs [NumComponents][NumComponents]binary // [i][j] for i < j
	dep   [maxModel + 1][]depTerm              // by departure model number
	// every distinct δ function (group) and τ exponent of all the terms,
	// so that a mixture merges its terms by index (Mixture.compile)
	groups []group
	tvals  []float64
}

// maxModel is the highest departure model number of the tables.
const maxModel = 10

// loadTables parses the embedded tables once. The value is never changed
// after it is built (an immutable value, not mutable package state).
var loadTables = sync.OnceValues(func() (*tables, error) {
	tb := &tables{}
	rows, err := readCSV("data/components.csv", 8)
	if err != nil {
		return nil, err
	}
	if len(rows) != NumComponents {
		return nil, fmt.Errorf("gerg: components.csv has %d rows, want %d", len(rows), NumComponents)
	}
	for _, r := range rows {
		i := int(r.f[0]) - 1
		tb.comps[i] = component{formula: r.s[1], name: r.s[2], m: r.f[3] * 1e-3, tc: r.f[4], rhoc: r.f[5] * 1e3}
	}
	if rows, err = readCSV("data/pure_residual.csv", 6); err != nil {
		return nil, err
	}
	for _, r := range rows {
		i := int(r.f[0]) - 1
		tb.comps[i].res = append(tb.comps[i].res, pureTerm{n: r.f[2], d: int(r.f[3]), t: r.f[4], c: int(r.f[5])})
	}
	if rows, err = readCSV("data/ideal_gas.csv", 12); err != nil {
		return nil, err
	}
	for _, r := range rows {
		i := int(r.f[0]) - 1
		copy(tb.comps[i].ideal[:], r.f[1:12])
	}
	if rows, err = readCSV("data/binary_reducing.csv", 8); err != nil {
		return nil, err
	}
	for i := range NumComponents {
		for j := i + 1; j < NumComponents; j++ {
			tb.pairs[i][j] = binary{betaV: 1, gammaV: 1, betaT: 1, gammaT: 1, model: -1}
		}
	}
	for _, r := range rows {
		i, j := int(r.f[0])-1, int(r.f[1])-1
		if !(i >= 0 && i < j && j < NumComponents) {
			return nil, fmt.Errorf("gerg: binary_reducing.csv pair %d,%d", i+1, j+1)
		}
		tb.pairs[i][j] = binary{betaV: r.f[2], gammaV: r.f[3], betaT: r.f[4], gammaT: r.f[5], f: r.f[6], model: int(r.f[7])}
	}
	if rows, err = readCSV("data/departure.csv", 11); err != nil {
		return nil, err
	}
	for _, r := range rows {
		m := int(r.f[0])
		if m < 1 || m > maxModel {
			return nil, fmt.Errorf("gerg: departure.csv model %d", m)
		}
		tb.dep[m] = append(tb.dep[m], depTerm{n: r.f[2], d: int(r.f[3]), t: r.f[4], eta: r.f[5], eps: r.f[6], beta: r.f[7], gamma: r.f[8]})
	}
	tb.index()
	return tb, nil
})

// index gives every term the global index of its δ function (group) and
// of its τ exponent.
func (tb *tables) index() {
	gIndex := map[group]int32{}
	tIndex := map[float64]int32{}
	idx := func(g group, t float64) (int32, int32) {
		gi, ok := gIndex[g]
		if !ok {
			gi = int32(len(tb.groups))
			gIndex[g] = gi
			tb.groups = append(tb.groups, g)
		}
		ti, ok := tIndex[t]
		if !ok {
			ti = int32(len(tb.tvals))
			tIndex[t] = ti
			tb.tvals = append(tb.tvals, t)
		}
		return gi, ti
	}
	for i := range tb.comps {
		for k := range tb.comps[i].res {
			rt := &tb.comps[i].res[k]
			rt.gi, rt.ti = idx(group{kind: 0, d: rt.d, c: rt.c}, rt.t)
		}
	}
	for m := range tb.dep {
		for k := range tb.dep[m] {
			dt := &tb.dep[m][k]
			g := group{kind: 0, d: dt.d}
			if dt.eta != 0 || dt.beta != 0 {
				g = group{kind: 1, d: dt.d, eta: dt.eta, eps: dt.eps, beta: dt.beta, gamma: dt.gamma}
			}
			dt.gi, dt.ti = idx(g, dt.t)
		}
	}
}

// row is one CSV row: the raw strings and their numeric values (NaN-free;
// non-numeric cells are 0 in f).
type row struct {
	s []string
	f []float64
}

func readCSV(name string, cols int) ([]row, error) {
	fh, err := dataFS.Open(name)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	recs, err := csv.NewReader(fh).ReadAll()
	if err != nil {
		return nil, fmt.Errorf("gerg: %s: %w", name, err)
	}
	out := make([]row, 0, len(recs))
	for k, rec := range recs {
		if k == 0 {
			continue // header
		}
		if len(rec) != cols {
			return nil, fmt.Errorf("gerg: %s line %d has %d columns, want %d", name, k+1, len(rec), cols)
		}
		r := row{s: rec, f: make([]float64, cols)}
		for c, cell := range rec {
			if v, err := strconv.ParseFloat(cell, 64); err == nil {
				r.f[c] = v
			}
		}
		out = append(out, r)
	}
	return out, nil
}
