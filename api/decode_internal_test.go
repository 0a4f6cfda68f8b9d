package api

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// This file keeps the strict decoder as it was before the key walk (a
// generic map[string]any pass, then a typed pass) as the oracle of a
// differential fuzz: on every body, the key walk must find exactly the
// unknown keys and quantity problems the map pass found, accept exactly
// what it accepted (into the same values), and refuse what its typed pass
// refused. The intended differences are duplicate keys (refused now) and
// the pointers and words of type errors (now with array indexes and
// "out of range" / "must be an integer"); echoed input is clipped in both,
// and an unknown key longer than maxEcho is pointed at by its object.

// legacyDecode is the former decodeStrict after reading the body.
func legacyDecode(body []byte, dst any) error {
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
	if probs := legacyUnknownFields(raw, reflect.TypeOf(dst), ""); len(probs) > 0 {
		return probs
	}
	strict := json.NewDecoder(bytes.NewReader(body))
	strict.DisallowUnknownFields()
	if err := strict.Decode(dst); err != nil {
		var ute *json.UnmarshalTypeError
		if errors.As(err, &ute) {
			return legacyTypeError{ute}
		}
		return fmt.Errorf("%w: %w", errBadBody, err)
	}
	return nil
}

type legacyTypeError struct{ *json.UnmarshalTypeError }

// legacyUnknownFields is the former generic walk (map keys in sorted order
// here, where the former one followed Go's random map order).
func legacyUnknownFields(raw any, t reflect.Type, ptr string) fieldErrors {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == quantityType {
		if msg := legacyQuantityProblem(raw); msg != "" {
			name := orBody(strings.ReplaceAll(strings.TrimPrefix(ptr, "/"), "/", "."))
			if n, ok := raw.(json.Number); ok {
				name += " = " + clip(string(n))
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
			return nil
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
		sorted := append([]string(nil), names...)
		sort.Strings(sorted)
		for _, k := range sortedKeys(obj) {
			ft, ok := fields[k]
			p := ptr + "/" + escapePointer(k)
			if !ok {
				if len(k) > maxEcho { // intended change: a long key is not echoed in the pointer
					p = ptr
				}
				out = append(out, FieldProblem{Pointer: p, Detail: unknownDetail(k, names, sorted)})
				continue
			}
			out = append(out, legacyUnknownFields(obj[k], ft, p)...)
		}
	case reflect.Slice, reflect.Array:
		arr, ok := raw.([]any)
		if !ok {
			return nil
		}
		for i, e := range arr {
			out = append(out, legacyUnknownFields(e, t.Elem(), ptr+"/"+strconv.Itoa(i))...)
		}
	case reflect.Map:
		obj, ok := raw.(map[string]any)
		if !ok {
			return nil
		}
		for _, k := range sortedKeys(obj) {
			out = append(out, legacyUnknownFields(obj[k], t.Elem(), ptr+"/"+escapePointer(k))...)
		}
	}
	return out
}

func sortedKeys(m map[string]any) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

func legacyQuantityProblem(raw any) string {
	switch v := raw.(type) {
	case nil:
		return ""
	case json.Number:
		var q Quantity
		if err := q.UnmarshalJSON([]byte(v)); err != nil {
			return "is not a finite number"
		}
		return ""
	case string:
		if strings.TrimSpace(v) == "" {
			return "must not be an empty string: give a number in SI units or a string with a unit, e.g. \"35 degC\""
		}
		return ""
	}
	return "must be a number in SI units or a string with a unit, e.g. \"35 degC\""
}

// hasDuplicateKeys reports whether any object in a valid JSON document
// repeats a key, with encoding/json's own token reader (independent of the
// key walk).
func hasDuplicateKeys(body []byte) bool {
	dec := json.NewDecoder(bytes.NewReader(body))
	var stack []*frame
	for {
		tok, err := dec.Token()
		if err != nil {
			return false
		}
		var top *frame
		if len(stack) > 0 {
			top = stack[len(stack)-1]
		}
		if top != nil && top.obj && top.expKey {
			if d, ok := tok.(json.Delim); ok && d == '}' {
				stack = stack[:len(stack)-1]
				if len(stack) > 0 {
					markValueDone(stack[len(stack)-1])
				}
				continue
			}
			k := tok.(string)
			if top.keys[k] {
				return true
			}
			top.keys[k] = true
			top.expKey = false
			continue
		}
		switch tok {
		case json.Delim('{'):
			stack = append(stack, &frame{obj: true, keys: map[string]bool{}, expKey: true})
		case json.Delim('['):
			stack = append(stack, &frame{})
		case json.Delim(']'):
			stack = stack[:len(stack)-1]
			if len(stack) > 0 {
				markValueDone(stack[len(stack)-1])
			}
		default:
			if top != nil {
				markValueDone(top)
			}
		}
	}
}

func markValueDone(f *frame) {
	if f.obj {
		f.expKey = true
	}
}

type frame struct {
	obj    bool
	keys   map[string]bool
	expKey bool
}

// differential decodes body with both decoders into fresh values of the
// type of dst and fails t when they disagree beyond the intended changes.
func differential(t *testing.T, d *requestDecoder, body []byte, newDst func() any) {
	oldDst, curDst := newDst(), newDst()
	oldErr := legacyDecode(body, oldDst)
	// the new decoder without the validator: the validator is the same for both
	root := d.roots[reflect.TypeOf(curDst)]
	var curErr error
	var kinds []walkKind
	switch {
	case len(bytes.TrimSpace(body)) == 0:
		curErr = fmt.Errorf("%w: the request body is empty; send a JSON object", errBadBody)
	case !json.Valid(body):
		curErr = syntaxError(body)
	default:
		var errs fieldErrors
		errs, kinds = walkKeys(body, root)
		if len(errs) > 0 {
			curErr = errs
		} else if err := json.Unmarshal(body, curDst); err != nil {
			t.Fatalf("the key walk passed %q but the typed pass failed: %v", body, err)
		}
	}
	dups := json.Valid(body) && hasDuplicateKeys(body)
	has := func(k walkKind) bool {
		for _, x := range kinds {
			if x == k {
				return true
			}
		}
		return false
	}
	var oldFE fieldErrors
	var oldTE legacyTypeError
	switch {
	case oldErr == nil:
		if dups {
			require.True(t, has(kindDuplicate), "duplicate keys in %q not reported: %v", body, curErr)
			return
		}
		require.NoError(t, curErr, "the map pass accepted %q", body)
		require.Equal(t, oldDst, curDst, "decoded values differ for %q", body)
	case errors.Is(oldErr, errBadBody):
		require.Error(t, curErr)
		require.Equal(t, oldErr.Error(), curErr.Error(), "syntax error of %q", body)
	case errors.As(oldErr, &oldFE):
		var cur fieldErrors
		require.ErrorAs(t, curErr, &cur, "the map pass found %v in %q", oldFE, body)
		var same fieldErrors
		for i, e := range cur {
			if kinds[i] == kindUnknown || kinds[i] == kindQuantity {
				same = append(same, e)
			}
		}
		if dups { // a duplicate key hides its first value from the map pass (and one under an unknown key is not walked)
			return
		}
		require.Equal(t, oldFE, same, "unknown keys and quantity problems of %q", body)
	case errors.As(oldErr, &oldTE):
		require.Error(t, curErr, "the typed pass refused %q: %v", body, oldErr)
		require.True(t, has(kindType) || (dups && has(kindDuplicate)), "no type error for %q (the typed pass: %v); got %v", body, oldErr, curErr)
	default:
		t.Fatalf("unexpected legacy error %v", oldErr)
	}
}

func seedBodies(tb testing.TB) [][]byte {
	var out [][]byte
	for _, dir := range []string{"../testdata/stages", "../testdata/problems"} {
		files, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
		require.NoError(tb, err)
		for _, f := range files {
			b, err := os.ReadFile(f)
			require.NoError(tb, err)
			out = append(out, b)
		}
	}
	return out
}

// FuzzDecodeDifferential: the key walk against the former map pass, on
// StageRequest, BatchRequest and PropertiesRequest bodies.
func FuzzDecodeDifferential(f *testing.F) {
	for _, b := range seedBodies(f) {
		f.Add(uint8(0), b)
		f.Add(uint8(1), []byte(`{"duties":[`+string(b)+`]}`))
	}
	f.Add(uint8(2), []byte(`{"gas":{"model":"peng-robinson","composition":{"CH4":0.9,"C2H6":0.1}},"temperature":300,"pressure":"5 bara"}`))
	f.Add(uint8(0), []byte(`{"gas":{"model":"ideal","Composition":{"CH4":1}},"g\u0061s":1,"suction":{"pressure":1e400}}`))
	f.Add(uint8(1), []byte(`{"duties":[0,1,[{}],{"pressure_ratio":"2","impeller":{"blade_count":2.5}}]}`))
	d := newRequestDecoder(StageRequest{}, BatchRequest{}, PropertiesRequest{})
	news := []func() any{
		func() any { return &StageRequest{} },
		func() any { return &BatchRequest{} },
		func() any { return &PropertiesRequest{} },
	}
	f.Fuzz(func(t *testing.T, which uint8, body []byte) {
		differential(t, d, body, news[int(which)%len(news)])
	})
}

// TestDecodeDifferentialSeeds runs the differential on the stored duties
// and on hand-made variants of each (every key renamed, duplicated,
// retyped) in a plain go test.
func TestDecodeDifferentialSeeds(t *testing.T) {
	d := newRequestDecoder(StageRequest{}, BatchRequest{}, PropertiesRequest{})
	stage := func() any { return &StageRequest{} }
	for _, b := range seedBodies(t) {
		differential(t, d, b, stage)
		differential(t, d, []byte(`{"duties":[`+string(b)+`,`+string(b)+`]}`), func() any { return &BatchRequest{} })
		for i := 0; i < len(b); i++ {
			if b[i] != '"' {
				continue
			}
			for _, mut := range [][]byte{
				append(append(append([]byte{}, b[:i+1]...), 'X'), b[i+1:]...),
				append(append(append([]byte{}, b[:i]...), []byte(`"`)...), b[i:]...),
				append(append(append([]byte{}, b[:i]...), []byte(`1,`)...), b[i:]...),
				bytes.Replace(b, []byte(`"`), []byte(`["`), 1),
			} {
				differential(t, d, mut, stage)
			}
		}
	}
}

func TestWalkKeysFindings(t *testing.T) {
	d := newRequestDecoder(StageRequest{}, BatchRequest{}, PropertiesRequest{})
	stage, batch := d.roots[reflect.TypeFor[StageRequest]()], d.roots[reflect.TypeFor[BatchRequest]()]
	tests := []struct {
		name   string
		root   *shape
		body   string
		want   []string // pointers
		detail string   // in the first detail
	}{
		// issue 13 item 13: duplicate keys are refused, naming the key
		{"duplicate top-level key", stage, `{"speed":1,"speed":2}`, []string{"/speed"}, `duplicate key "speed"`},
		{"duplicate after an escape", stage, `{"gas":{},"g\u0061s":{}}`, []string{"/gas"}, `duplicate key "gas"`},
		{"duplicate in a map", stage, `{"gas":{"composition":{"CH4":0.5,"CH4":0.5}}}`, []string{"/gas/composition/CH4"}, `duplicate key "CH4"`},
		{"duplicate in a batch duty", batch, `{"duties":[{},{"flow":{"mass":1,"mass":2}}]}`, []string{"/duties/1/flow/mass"}, "duplicate key"},
		// issue 13 item 1: batch type errors keep the index
		{"batch wrong type", batch, `{"duties":[{},{"pressure_ratio":"2"}]}`, []string{"/duties/1/pressure_ratio"}, "duties.1.pressure_ratio must be a JSON number, not string"},
		{"batch array for a duty", batch, `{"duties":[{},[{}]]}`, []string{"/duties/1"}, "duties.1 must be a JSON object, not array"},
		{"batch numbers for duties", batch, `{"duties":[0,1]}`, []string{"/duties/0", "/duties/1"}, "duties.0 must be a JSON object, not number"},
		// issue 13 item 8: the words of number errors
		{"float out of range", stage, `{"pressure_ratio":-1e400}`, []string{"/pressure_ratio"}, "pressure_ratio = -1e400 is out of range"},
		{"integer with a fraction", stage, `{"impeller":{"blade_count":2.5}}`, []string{"/impeller/blade_count"}, "impeller.blade_count = 2.5 must be an integer"},
		{"integer too large", stage, `{"impeller":{"blade_count":99999999999999999999}}`, []string{"/impeller/blade_count"}, "too large"},
		// unchanged findings
		{"unknown key", stage, `{"sucton":{}}`, []string{"/sucton"}, `did you mean "suction"`},
		{"miscased key", stage, `{"Gas":{}}`, []string{"/Gas"}, `unknown field "Gas"`},
		{"quantity not finite", stage, `{"speed":1e999}`, []string{"/speed"}, "speed = 1e999 is not a finite number"},
		{"quantity blank", stage, `{"speed":"  "}`, []string{"/speed"}, "must not be an empty string"},
		{"problems ordered by key", stage, `{"zz":1,"aa":2,"speed":true}`, []string{"/aa", "/speed", "/zz"}, `unknown field "aa"`},
		{"root of the wrong type", stage, `[1]`, []string{""}, "the body must be a JSON object, not array"},
		{"nulls are no-ops", stage, `{"gas":null,"speed":null,"impeller":{"blade_count":null}}`, nil, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			require.True(t, json.Valid([]byte(tt.body)))
			errs, _ := walkKeys([]byte(tt.body), tt.root)
			var ptrs []string
			for _, e := range errs {
				ptrs = append(ptrs, e.Pointer)
			}
			assert.Equal(t, tt.want, ptrs)
			if tt.detail != "" && assert.NotEmpty(t, errs) {
				assert.Contains(t, errs[0].Detail, tt.detail)
			}
		})
	}
}

// TestClipEchoedInput (issue 13 item 9): a long key or number is quoted
// in part, with its length.
func TestClipEchoedInput(t *testing.T) {
	d := newRequestDecoder(StageRequest{})
	long := strings.Repeat("k", 900_000)
	errs, _ := walkKeys([]byte(`{"`+long+`":1,"speed":`+strings.Repeat("9", 5000)+`e999}`), d.roots[reflect.TypeFor[StageRequest]()])
	require.Len(t, errs, 2)
	for _, e := range errs {
		assert.Less(t, len(e.Detail), 600, e.Detail[:100])
		assert.Contains(t, e.Detail, "bytes)")
	}
	assert.Equal(t, "héllo", clip("héllo"))
	c := clip(strings.Repeat("é", 100))
	assert.True(t, strings.HasSuffix(c, "… (200 bytes)"), c)
	assert.True(t, len(c) < 100, c)
}

// BenchmarkDecode: the strict decode of the instrument-air demo duty, key
// walk and typed pass and validation (decodeBody), beside the former map
// pass and typed pass (legacyDecode, no validation).
func BenchmarkDecode(b *testing.B) {
	body, err := os.ReadFile("../testdata/stages/kestrel-instrument-air.in.json")
	require.NoError(b, err)
	d := newRequestDecoder(StageRequest{}, BatchRequest{}, PropertiesRequest{})
	b.Run("walk+typed+validate", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			var r StageRequest
			if err := decodeBody(body, &r, d); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("walk+typed", func(b *testing.B) {
		b.ReportAllocs()
		root := d.roots[reflect.TypeFor[StageRequest]()]
		for b.Loop() {
			var r StageRequest
			if errs, _ := walkKeys(body, root); len(errs) > 0 {
				b.Fatal(errs)
			}
			if err := json.Unmarshal(body, &r); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("legacy map+typed", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			var r StageRequest
			if err := legacyDecode(body, &r); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("validate", func(b *testing.B) {
		b.ReportAllocs()
		var r StageRequest
		require.NoError(b, json.Unmarshal(body, &r))
		for b.Loop() {
			if err := d.validate.Struct(&r); err != nil {
				b.Fatal(err)
			}
		}
	})
}
