package api

import (
	"fmt"
	"math"
	"reflect"
	"unsafe"
)

// finiteGuard checks that every float of a T is finite. It holds the
// offsets of T's float64 fields, precomputed once from T's type (plain
// fields, through nested structs and arrays, behind pointers and in
// slices), so a check reads those floats directly: no reflection, no
// allocation. Only when a float is NaN or ±Inf does it walk the value by
// reflection to name the field's path. gin would otherwise answer 200 with
// an empty body when JSON encoding fails on such a value.
//
// A guard is built once (package-level values below) and only read
// afterwards, so it is safe for concurrent use.
type finiteGuard[T any] struct {
	plan *finitePlan
}

// Guards of the answers the handlers build; immutable after start-up.
var (
	stageFinite = newFiniteGuard[StageResponse]()
	propsFinite = newFiniteGuard[PropertiesResponse]()
)

func newFiniteGuard[T any]() finiteGuard[T] {
	return finiteGuard[T]{plan: planFinite(reflect.TypeFor[T]())}
}

// check fails on the first float of v that is NaN or ±Inf, naming its path.
func (g finiteGuard[T]) check(v *T) error {
	if g.plan.ok(unsafe.Pointer(v)) {
		return nil
	}
	return allFinite(v)
}

// finitePlan lists where the floats of one struct type lie.
type finitePlan struct {
	floats []uintptr    // offsets of float64 values (nested structs and arrays flattened)
	refs   []finiteRef  // pointers and slices that may lead to floats
	maps   []finiteMap  // maps and interfaces: checked by reflection, each on its own
	walk   reflect.Type // non-nil when the type holds a float32 or complex: checked by reflection
}

// finiteMap is a map or interface field at off, walked by reflection (the
// composition of a machine's gas, limit overrides): small, and rare in the
// answers, so the rest of the plan keeps its direct reads.
type finiteMap struct {
	off uintptr
	t   reflect.Type
}

// finiteRef is a pointer or slice field at off whose target holds floats.
type finiteRef struct {
	off   uintptr
	slice bool        // a slice (else a pointer)
	size  uintptr     // element size of a slice
	elem  *finitePlan // plan of the pointed-to or element type
}

// sliceHeader is the layout of a Go slice.
type sliceHeader struct {
	data     unsafe.Pointer
	len, cap int
}

// planFinite returns the plan of type t (any kind: the plan of a value
// of t at offset 0).
func planFinite(t reflect.Type) *finitePlan {
	p := &finitePlan{}
	if !p.add(t, 0) {
		p = &finitePlan{walk: t}
	}
	return p
}

// add records the floats of a t at off; maps and interfaces are recorded
// to be walked by reflection; false when t holds a kind the plan does not
// cover (float32, complex).
func (p *finitePlan) add(t reflect.Type, off uintptr) bool {
	switch t.Kind() {
	case reflect.Float64:
		p.floats = append(p.floats, off)
	case reflect.Float32, reflect.Complex64, reflect.Complex128:
		return false
	case reflect.Map, reflect.Interface:
		p.maps = append(p.maps, finiteMap{off: off, t: t})
	case reflect.Struct:
		for i := range t.NumField() {
			f := t.Field(i)
			if f.IsExported() && !p.add(f.Type, off+f.Offset) {
				return false
			}
		}
	case reflect.Array:
		for i := range t.Len() {
			if !p.add(t.Elem(), off+uintptr(i)*t.Elem().Size()) {
				return false
			}
		}
	case reflect.Pointer, reflect.Slice:
		elem := planFinite(t.Elem())
		if elem.walk != nil {
			return false
		}
		if len(elem.floats) > 0 || len(elem.refs) > 0 || len(elem.maps) > 0 {
			p.refs = append(p.refs, finiteRef{off: off, slice: t.Kind() == reflect.Slice, size: t.Elem().Size(), elem: elem})
		}
	}
	return true
}

// ok reports whether every float of the value at v is finite.
func (p *finitePlan) ok(v unsafe.Pointer) bool {
	if p.walk != nil {
		_, _, bad := finiteWalk(reflect.NewAt(p.walk, v).Elem())
		return !bad
	}
	for _, off := range p.floats {
		f := *(*float64)(unsafe.Add(v, off))
		if math.IsNaN(f) || math.IsInf(f, 0) {
			return false
		}
	}
	for _, m := range p.maps {
		if _, _, bad := finiteWalk(reflect.NewAt(m.t, unsafe.Add(v, m.off)).Elem()); bad {
			return false
		}
	}
	for _, r := range p.refs {
		at := unsafe.Add(v, r.off)
		if !r.slice {
			if q := *(*unsafe.Pointer)(at); q != nil && !r.elem.ok(q) {
				return false
			}
			continue
		}
		s := (*sliceHeader)(at)
		for i := range s.len {
			if !r.elem.ok(unsafe.Add(s.data, uintptr(i)*r.size)) {
				return false
			}
		}
	}
	return true
}

// allFinite walks v (structs, pointers, slices, maps) by reflection and
// fails on the first float that is NaN or ±Inf, naming its path. The
// handlers check through a finiteGuard, which calls this only to name a
// failure.
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
