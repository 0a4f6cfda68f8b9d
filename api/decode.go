package api

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net"
	"net/http"
	"os"
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
// router and read-only afterwards: the validator and, for every request
// type, a tree of its JSON shape (fields by exact JSON name, element
// types, the JSON kind each Go type accepts).
type requestDecoder struct {
	validate *validator.Validate
	roots    map[reflect.Type]*shape
}

// newRequestDecoder builds the shapes of the request types reqs (values or
// pointers of the request structs).
func newRequestDecoder(reqs ...any) *requestDecoder {
	d := &requestDecoder{validate: newValidator(), roots: map[reflect.Type]*shape{}}
	built := map[reflect.Type]*shape{}
	for _, r := range reqs {
		t := reflect.TypeOf(r)
		d.roots[t] = shapeOf(t, built)
		d.roots[reflect.PointerTo(t)] = d.roots[t]
	}
	return d
}

// shapeKind is what JSON a Go type accepts.
type shapeKind uint8

const (
	shapeAny      shapeKind = iota // anything (an interface, or a json.Unmarshaler other than Quantity)
	shapeStruct                    // an object with known keys
	shapeMap                       // an object with any keys
	shapeSlice                     // an array
	shapeString                    // a string
	shapeBool                      // true or false
	shapeFloat                     // a number that fits a float64
	shapeInt                       // an integer number that fits an int
	shapeUint                      // a non-negative integer that fits a uint
	shapeQuantity                  // a finite number or a non-blank string (Quantity)
)

// shape is the JSON shape of one Go type.
type shape struct {
	kind   shapeKind
	typ    reflect.Type      // after pointers, for messages
	fields map[string]*shape // struct: by exact JSON name
	order  []string          // struct: the JSON names in declaration order
	names  []string          // struct: the JSON names, sorted
	elem   *shape            // map, slice
	bits   int               // float, int, uint
}

func shapeOf(t reflect.Type, built map[reflect.Type]*shape) *shape {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if s, ok := built[t]; ok {
		return s
	}
	s := &shape{typ: t}
	built[t] = s
	switch {
	case t == quantityType:
		s.kind = shapeQuantity
		return s
	case reflect.PointerTo(t).Implements(unmarshalerType):
		return s
	}
	switch t.Kind() {
	case reflect.Struct:
		s.kind, s.fields = shapeStruct, map[string]*shape{}
		for i := range t.NumField() {
			f := t.Field(i)
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if !f.IsExported() || name == "-" {
				continue
			}
			if name == "" {
				name = f.Name
			}
			s.fields[name] = shapeOf(f.Type, built)
			s.order = append(s.order, name)
		}
		s.names = append([]string(nil), s.order...)
		sort.Strings(s.names)
	case reflect.Map:
		s.kind, s.elem = shapeMap, shapeOf(t.Elem(), built)
	case reflect.Slice, reflect.Array:
		s.kind, s.elem = shapeSlice, shapeOf(t.Elem(), built)
	case reflect.String:
		s.kind = shapeString
	case reflect.Bool:
		s.kind = shapeBool
	case reflect.Float32, reflect.Float64:
		s.kind, s.bits = shapeFloat, t.Bits()
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		s.kind, s.bits = shapeInt, t.Bits()
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		s.kind, s.bits = shapeUint, t.Bits()
	}
	return s
}

// errReadTimeout marks a body that did not arrive within the server's
// read timeout.
var errReadTimeout = errors.New("api: the request body did not arrive in time")

// decodeStrict reads one JSON value into dst (a pointer to a request
// struct). It rejects malformed JSON and trailing data; one walk over the
// raw bytes (walkKeys) then reports, each with its JSON pointer, every
// unknown or miscased key, every key given twice in one object, every
// value of the wrong JSON type and every number its Go field cannot hold;
// only a body without any of these is decoded into dst, in one typed pass,
// and the validator's shape checks run. The body's size is bounded by the
// bodyLimit middleware; its *http.MaxBytesError is returned as is.
func decodeStrict(r *http.Request, dst any, d *requestDecoder) error {
	body, err := io.ReadAll(r.Body)
	if err != nil {
		var mbe *http.MaxBytesError
		var ne net.Error
		switch {
		case errors.As(err, &mbe):
			return mbe
		case errors.Is(err, os.ErrDeadlineExceeded), errors.As(err, &ne) && ne.Timeout():
			return errReadTimeout
		}
		return fmt.Errorf("%w: body unreadable", errBadBody)
	}
	return decodeBody(body, dst, d)
}

// decodeBody is decodeStrict on a body already read.
func decodeBody(body []byte, dst any, d *requestDecoder) error {
	if len(bytes.TrimSpace(body)) == 0 {
		return fmt.Errorf("%w: the request body is empty; send a JSON object", errBadBody)
	}
	if !json.Valid(body) {
		return syntaxError(body)
	}
	root, ok := d.roots[reflect.TypeOf(dst)]
	if !ok {
		root = shapeOf(reflect.TypeOf(dst), map[reflect.Type]*shape{})
	}
	if errs, _ := walkKeys(body, root); len(errs) > 0 {
		return errs
	}
	if err := json.Unmarshal(body, dst); err != nil {
		// walkKeys found nothing wrong, so this is not expected; kept so
		// that a disagreement is still a 400 and never a 500.
		var ute *json.UnmarshalTypeError
		if errors.As(err, &ute) {
			return fieldErrors{{Pointer: dottedPointer(ute.Field), Detail: fmt.Sprintf("%s must be a JSON %s, not %s",
				orBody(ute.Field), jsonKind(ute.Type), clip(ute.Value))}}
		}
		return fmt.Errorf("%w: %w", errBadBody, err)
	}
	if err := d.validate.Struct(dst); err != nil {
		return err
	}
	return nil
}

// syntaxError describes a body that is not one JSON value, with the words
// of encoding/json's decoder (as before the key walk replaced it).
func syntaxError(body []byte) error {
	var raw any
	dec := json.NewDecoder(bytes.NewReader(body))
	dec.UseNumber()
	if err := dec.Decode(&raw); err != nil {
		return fmt.Errorf("%w: %w", errBadBody, err)
	}
	return fmt.Errorf("%w: unexpected data after the JSON object", errBadBody)
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

// maxEcho bounds how much of a client's input a message quotes.
const maxEcho = 64

// clip shortens an echoed piece of input to maxEcho bytes (on a UTF-8
// boundary) and says how long it was.
func clip(s string) string {
	if len(s) <= maxEcho {
		return s
	}
	n := maxEcho
	for n > 0 && s[n]&0xC0 == 0x80 {
		n--
	}
	return s[:n] + "… (" + strconv.Itoa(len(s)) + " bytes)"
}

// escapePointer escapes a key for a JSON pointer (RFC 6901 §3).
func escapePointer(k string) string {
	return strings.ReplaceAll(strings.ReplaceAll(k, "~", "~0"), "/", "~1") // "~" first (RFC 6901 §3)
}

// unknownDetail describes an unknown key: the nearest field (in order,
// the first of the least edit distance) and the fields of its object
// (sorted).
func unknownDetail(key string, order, sorted []string) string {
	best, dist := "", 1<<30
	if len(key) <= 4*maxEcho { // a suggestion for a long key is noise
		for _, n := range order {
			if d := editDistance(strings.ToLower(key), n); d < dist {
				best, dist = n, d
			}
		}
	}
	msg := fmt.Sprintf("unknown field %q", clip(key))
	if best != "" && dist <= max(2, len(key)/3) {
		msg += fmt.Sprintf("; did you mean %q?", best)
	}
	if len(sorted) > 0 {
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
