package api

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net/http"
	"reflect"
	"sort"
	"strconv"
	"strings"

	"github.com/go-playground/validator/v10"
)

// newValidator returns a validator that names fields by their JSON names,
// so that error namespaces read "StageRequest.suction.pressure".
func newValidator() *validator.Validate {
	v := validator.New(validator.WithRequiredStructEnabled())
	v.SetTagName("binding")
	v.RegisterTagNameFunc(func(f reflect.StructField) string {
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if name == "-" {
			return ""
		}
		return name
	})
	return v
}

// requestDecoder holds what strict decoding needs, built once with the
// router and read-only afterwards: the validator and, for every struct
// type reachable from the request types, its fields by exact JSON name.
type requestDecoder struct {
	validate *validator.Validate
	fields   map[reflect.Type]map[string]reflect.Type
}

// newRequestDecoder indexes the fields of the request types reqs (values
// or pointers of the request structs).
func newRequestDecoder(reqs ...any) *requestDecoder {
	d := &requestDecoder{validate: newValidator(), fields: map[reflect.Type]map[string]reflect.Type{}}
	for _, r := range reqs {
		d.index(reflect.TypeOf(r))
	}
	return d
}

func (d *requestDecoder) index(t reflect.Type) {
	for t.Kind() == reflect.Pointer || t.Kind() == reflect.Slice || t.Kind() == reflect.Array || t.Kind() == reflect.Map {
		t = t.Elem()
	}
	if t.Kind() != reflect.Struct || t == quantityType {
		return
	}
	if _, done := d.fields[t]; done {
		return
	}
	m := map[string]reflect.Type{}
	d.fields[t] = m
	for i := range t.NumField() {
		f := t.Field(i)
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if !f.IsExported() || name == "-" {
			continue
		}
		if name == "" {
			name = f.Name
		}
		m[name] = f.Type
		d.index(f.Type)
	}
}

// decodeStrict reads one JSON value into dst (a pointer to a request
// struct), rejecting malformed JSON, trailing data, unknown or miscased
// field names (each reported with its JSON pointer) and wrong JSON types,
// and then runs the validator's shape checks. The body's size is bounded
// by the bodyLimit middleware; its *http.MaxBytesError is returned as is.
func decodeStrict(r *http.Request, dst any, d *requestDecoder) error {
	body, err := io.ReadAll(r.Body)
	if err != nil {
		var mbe *http.MaxBytesError
		if errors.As(err, &mbe) {
			return mbe
		}
		return fmt.Errorf("%w: body unreadable", errBadBody)
	}
	if len(bytes.TrimSpace(body)) == 0 {
		return fmt.Errorf("%w: the request body is empty; send a JSON object", errBadBody)
	}
	var raw any
	dec := json.NewDecoder(bytes.NewReader(body))
	dec.UseNumber()
	if err := dec.Decode(&raw); err != nil {
		return fmt.Errorf("%w: %w", errBadBody, err)
	}
	if _, err := dec.Token(); err != io.EOF {
		return fmt.Errorf("%w: unexpected data after the JSON object", errBadBody)
	}
	if !d.keysKnown(raw, reflect.TypeOf(dst)) {
		if probs := unknownFields(raw, reflect.TypeOf(dst), ""); len(probs) > 0 {
			return probs
		}
	}
	strict := json.NewDecoder(bytes.NewReader(body))
	strict.DisallowUnknownFields()
	if err := strict.Decode(dst); err != nil {
		var ute *json.UnmarshalTypeError
		if errors.As(err, &ute) {
			return fieldErrors{{Pointer: dottedPointer(ute.Field), Detail: fmt.Sprintf("%s must be a JSON %s, not %s",
				orBody(ute.Field), jsonKind(ute.Type), ute.Value)}}
		}
		return fmt.Errorf("%w: %w", errBadBody, err)
	}
	if err := d.validate.Struct(dst); err != nil {
		return err
	}
	return nil
}

func orBody(field string) string {
	if field == "" {
		return "the body"
	}
	return field
}

func jsonKind(t reflect.Type) string {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	switch t.Kind() {
	case reflect.Float32, reflect.Float64, reflect.Int, reflect.Int64, reflect.Int32:
		return "number"
	case reflect.String:
		return "string"
	case reflect.Bool:
		return "boolean"
	case reflect.Slice, reflect.Array:
		return "array"
	case reflect.Map, reflect.Struct:
		return "object"
	}
	return t.Kind().String()
}

var (
	unmarshalerType = reflect.TypeFor[json.Unmarshaler]()
	quantityType    = reflect.TypeFor[Quantity]()
)

// unknownFields walks a generic JSON value against the Go type it will be
// decoded into and reports every object key that names no field, with its
// JSON pointer and the nearest field name. encoding/json matches keys
// case-insensitively and reports unknown keys without their path; this walk
// makes both strict and precise.
func unknownFields(raw any, t reflect.Type, ptr string) fieldErrors {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == quantityType {
		if msg := quantityProblem(raw); msg != "" {
			name := orBody(strings.ReplaceAll(strings.TrimPrefix(ptr, "/"), "/", "."))
			if n, ok := raw.(json.Number); ok {
				name += " = " + string(n)
			}
			return fieldErrors{{Pointer: ptr, Detail: name + " " + msg}}
		}
		return nil
	}
	if reflect.PointerTo(t).Implements(unmarshalerType) {
		return nil
	}
	var out fieldErrors
	switch t.Kind() {
	case reflect.Struct:
		obj, ok := raw.(map[string]any)
		if !ok {
			return nil // the typed decode reports the wrong JSON type
		}
		fields := map[string]reflect.Type{}
		var names []string
		for i := range t.NumField() {
			f := t.Field(i)
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if !f.IsExported() || name == "-" {
				continue
			}
			if name == "" {
				name = f.Name
			}
			fields[name] = f.Type
			names = append(names, name)
		}
		keys := make([]string, 0, len(obj))
		for k := range obj {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			ft, ok := fields[k]
			p := ptr + "/" + escapePointer(k)
			if !ok {
				out = append(out, FieldProblem{Pointer: p, Detail: unknownDetail(k, names)})
				continue
			}
			out = append(out, unknownFields(obj[k], ft, p)...)
		}
	case reflect.Slice, reflect.Array:
		arr, ok := raw.([]any)
		if !ok {
			return nil
		}
		for i, e := range arr {
			out = append(out, unknownFields(e, t.Elem(), ptr+"/"+strconv.Itoa(i))...)
		}
	case reflect.Map:
		obj, ok := raw.(map[string]any)
		if !ok {
			return nil
		}
		for k, e := range obj {
			out = append(out, unknownFields(e, t.Elem(), ptr+"/"+escapePointer(k))...)
		}
	}
	return out
}

// keysKnown is the quick form of unknownFields for the common case: it
// reports whether every object key of raw names a field of t (exact case)
// and every quantity has an acceptable JSON shape, without building
// pointers, suggestions or sorted key lists; unknownFields then runs only
// when there is something to report.
func (d *requestDecoder) keysKnown(raw any, t reflect.Type) bool {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == quantityType {
		return quantityProblem(raw) == ""
	}
	if reflect.PointerTo(t).Implements(unmarshalerType) {
		return true
	}
	switch t.Kind() {
	case reflect.Struct:
		obj, ok := raw.(map[string]any)
		if !ok {
			return true // the typed decode reports the wrong JSON type
		}
		fields, indexed := d.fields[t]
		for k, v := range obj {
			var ft reflect.Type
			var ok bool
			if indexed {
				ft, ok = fields[k]
			} else {
				ft, ok = fieldNamed(t, k)
			}
			if !ok || !d.keysKnown(v, ft) {
				return false
			}
		}
	case reflect.Slice, reflect.Array:
		if arr, ok := raw.([]any); ok {
			for _, e := range arr {
				if !d.keysKnown(e, t.Elem()) {
					return false
				}
			}
		}
	case reflect.Map:
		if obj, ok := raw.(map[string]any); ok {
			for _, e := range obj {
				if !d.keysKnown(e, t.Elem()) {
					return false
				}
			}
		}
	}
	return true
}

// fieldNamed returns the type of the exported field of struct t whose JSON
// name is exactly name.
func fieldNamed(t reflect.Type, name string) (reflect.Type, bool) {
	for i := range t.NumField() {
		f := t.Field(i)
		if !f.IsExported() {
			continue
		}
		n, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if n == "" {
			n = f.Name
		}
		if n == name && n != "-" {
			return f.Type, true
		}
	}
	return nil, false
}

// escapePointer escapes a key for a JSON pointer (RFC 6901 §3).
func escapePointer(k string) string {
	return strings.ReplaceAll(strings.ReplaceAll(k, "~", "~0"), "/", "~1") // "~" first (RFC 6901 §3)
}

func unknownDetail(key string, names []string) string {
	best, dist := "", 1<<30
	for _, n := range names {
		if d := editDistance(strings.ToLower(key), n); d < dist {
			best, dist = n, d
		}
	}
	msg := fmt.Sprintf("unknown field %q", key)
	if best != "" && dist <= max(2, len(key)/3) {
		msg += fmt.Sprintf("; did you mean %q?", best)
	}
	if len(names) > 0 {
		sorted := append([]string(nil), names...)
		sort.Strings(sorted)
		msg += " (fields here: " + strings.Join(sorted, ", ") + ")"
	}
	return msg
}

// editDistance is the Levenshtein distance of a and b.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
