package api

import (
	"bytes"
	"context"
	"errors"
	"math"
	"net/http/httptest"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// floatSlots returns a setter for every float64 reachable in v (through
// nested structs, non-nil pointers and slice elements), with its path in
// the form finiteWalk names it.
func floatSlots(v reflect.Value, path string) map[string]reflect.Value {
	out := map[string]reflect.Value{}
	switch v.Kind() {
	case reflect.Float64:
		out[path] = v
	case reflect.Pointer:
		if !v.IsNil() {
			for p, s := range floatSlots(v.Elem(), path) {
				out[p] = s
			}
		}
	case reflect.Struct:
		for i := range v.NumField() {
			if v.Type().Field(i).IsExported() {
				for p, s := range floatSlots(v.Field(i), path+"."+v.Type().Field(i).Name) {
					out[p] = s
				}
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			for p, s := range floatSlots(v.Index(i), path+"["+strconv.Itoa(i)+"]") {
				out[p] = s
			}
		}
	}
	return out
}

// TestFiniteGuardCoversEveryFloat: every float of every demo answer
// (between them: axial eyes and radial inlets, slip-model blade counts,
// standard flows, water dew points, limits with and without a limit
// level, warnings) set in turn to NaN, +Inf and -Inf fails the
// precomputed guard, and the error names the field's path; the untouched
// answers pass.
func TestFiniteGuardCoversEveryFloat(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("..", "testdata", "stages", "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) { guardEveryFloat(t, answerOf(t, filepath.Base(f))) })
	}
}

func guardEveryFloat(t *testing.T, out StageResponse) {
	require.NoError(t, stageFinite.check(&out))
	slots := floatSlots(reflect.ValueOf(&out).Elem(), "")
	require.Greater(t, len(slots), 100, "an answer has well over 100 numbers")
	for path, s := range slots {
		for _, bad := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
			was := s.Float()
			s.SetFloat(bad)
			err := stageFinite.check(&out)
			s.SetFloat(was)
			require.Error(t, err, "%s = %v passed the guard", path, bad)
			assert.True(t, errors.Is(err, errNotFinite))
			assert.Contains(t, err.Error(), path+" = ", "the error names the field")
		}
	}
	require.NoError(t, stageFinite.check(&out))
}

// TestFiniteGuardPlans: the plan follows pointers and slices, and falls
// back to the reflective walk for a type holding a map.
func TestFiniteGuardPlans(t *testing.T) {
	type inner struct {
		A float64
		P *float64
	}
	type outer struct {
		X  [2]float64
		In []inner
		M  map[string]float64
	}
	nan := math.NaN()
	g := newFiniteGuard[outer]()
	assert.Nil(t, g.plan.walk, "only the map is walked by reflection, not the whole value")
	assert.Len(t, g.plan.maps, 1, "a map is walked by reflection")
	assert.Error(t, g.check(&outer{M: map[string]float64{"k": nan}}))
	assert.Error(t, g.check(&outer{X: [2]float64{1, nan}, M: map[string]float64{"k": 1}}))
	assert.NoError(t, g.check(&outer{In: []inner{{A: 1}}, M: map[string]float64{"k": 1}}))
	type deep struct {
		Ptr *outer
	}
	d := newFiniteGuard[deep]()
	assert.Error(t, d.check(&deep{Ptr: &outer{M: map[string]float64{"k": math.Inf(1)}}}), "a map behind a pointer")
	assert.NoError(t, d.check(&deep{Ptr: &outer{M: map[string]float64{"k": 2}}}))
	type flat struct {
		X  [2]float64
		In []inner
		S  string
	}
	h := newFiniteGuard[flat]()
	require.Nil(t, h.plan.walk)
	tests := []struct {
		name string
		v    flat
		bad  bool
	}{
		{"all finite", flat{X: [2]float64{1, 2}, In: []inner{{A: 1}, {A: 2, P: new(float64)}}}, false},
		{"array element", flat{X: [2]float64{1, nan}}, true},
		{"slice element", flat{In: []inner{{A: 1}, {A: math.Inf(1)}}}, true},
		{"pointer in slice element", flat{In: []inner{{A: 1, P: &nan}}}, true},
		{"nil pointer", flat{In: []inner{{A: 1, P: nil}}}, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			assert.Equal(t, tt.bad, h.check(&tt.v) != nil)
		})
	}
}

// answerOf is the answer to one demo duty.
func answerOf(t testing.TB, file string) StageResponse {
	body, err := os.ReadFile(filepath.Join("..", "testdata", "stages", file))
	require.NoError(t, err)
	var req StageRequest
	dec := newRequestDecoder(StageRequest{})
	require.NoError(t, decodeStrict(httptest.NewRequest("POST", "/v1/stage/size", bytes.NewReader(body)), &req, dec))
	duty, err := dutyOf(req)
	require.NoError(t, err)
	res, err := service.New().SizeStage(context.Background(), duty)
	require.NoError(t, err)
	out, err := responseOf(res)
	require.NoError(t, err)
	return out
}
