package api

import (
	"fmt"
	"math"
	"reflect"
)

// allFinite walks v (structs, pointers, slices, maps) and fails on the
// first float that is NaN or ±Inf, naming its path. gin would otherwise
// answer 200 with an empty body when JSON encoding fails on such a value.
// It runs on every answer, so the path is built only for a failure.
func allFinite(v any) error {
	if path, f, bad := finiteWalk(reflect.ValueOf(v)); bad {
		return fmt.Errorf("%w: %s = %v", errNotFinite, path, f)
	}
	return nil
}

// finiteWalk reports the first non-finite float under v and its path.
func finiteWalk(v reflect.Value) (path string, f float64, bad bool) {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return "", f, true
		}
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			return finiteWalk(v.Elem())
		}
	case reflect.Struct:
		t := v.Type()
		for i := range v.NumField() {
			sf := t.Field(i)
			if !sf.IsExported() {
				continue
			}
			if path, f, bad := finiteWalk(v.Field(i)); bad {
				return "." + sf.Name + path, f, true
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			if path, f, bad := finiteWalk(v.Index(i)); bad {
				return fmt.Sprintf("[%d]%s", i, path), f, true
			}
		}
	case reflect.Map:
		it := v.MapRange()
		for it.Next() {
			if path, f, bad := finiteWalk(it.Value()); bad {
				return fmt.Sprintf("[%v]%s", it.Key(), path), f, true
			}
		}
	}
	return "", 0, false
}
