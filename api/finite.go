package api

import (
	"fmt"
	"math"
	"reflect"
)

// allFinite walks v (structs, pointers, slices, maps) and fails on the
// first float that is NaN or ±Inf, naming its path. gin would otherwise
// answer 200 with an empty body when JSON encoding fails on such a value.
func allFinite(v any) error {
	return finiteWalk(reflect.ValueOf(v), "")
}

func finiteWalk(v reflect.Value, path string) error {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return fmt.Errorf("%w: %s = %v", errNotFinite, path, f)
		}
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			return finiteWalk(v.Elem(), path)
		}
	case reflect.Struct:
		t := v.Type()
		for i := range v.NumField() {
			if !t.Field(i).IsExported() {
				continue
			}
			if err := finiteWalk(v.Field(i), path+"."+t.Field(i).Name); err != nil {
				return err
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			if err := finiteWalk(v.Index(i), fmt.Sprintf("%s[%d]", path, i)); err != nil {
				return err
			}
		}
	case reflect.Map:
		it := v.MapRange()
		for it.Next() {
			if err := finiteWalk(it.Value(), fmt.Sprintf("%s[%v]", path, it.Key())); err != nil {
				return err
			}
		}
	}
	return nil
}
