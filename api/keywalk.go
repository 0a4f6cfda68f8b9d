package api

import (
	"bytes"
	"encoding/json"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"
)

// walkKind sorts what walkKeys finds, for its tests.
type walkKind uint8

const (
	kindUnknown   walkKind = iota + 1 // a key that names no field (exact case)
	kindQuantity                      // a value a Quantity cannot hold
	kindDuplicate                     // a key given twice in one object
	kindType                          // a value of the wrong JSON type, or a number its field cannot hold
)

// walkKeys walks body, which must be valid JSON (json.Valid), against the
// shape of the Go type it will be decoded into, and reports every problem
// the typed decode would hide or misplace: unknown and miscased keys (the
// nearest field is suggested), duplicate keys (encoding/json keeps the last
// silently), values of the wrong JSON type and numbers out of their field's
// range (encoding/json names them without array indexes). Every problem
// carries its JSON pointer. Within one object the problems are ordered by
// key, so that the answer does not depend on the order of the keys. The
// common case (nothing wrong) allocates nothing but the scan's own state.
func walkKeys(body []byte, root *shape) (fieldErrors, []walkKind) {
	w := walker{b: body}
	w.ws()
	w.value(root)
	return w.errs, w.kinds
}

type walker struct {
	b     []byte
	i     int
	path  []segment
	errs  fieldErrors
	kinds []walkKind
}

// segment is one step of the path to the current value: an object key
// (unescaped) or an array index (idx >= 0).
type segment struct {
	key []byte
	idx int
}

func (w *walker) ws() {
	for w.i < len(w.b) {
		switch w.b[w.i] {
		case ' ', '\t', '\n', '\r':
			w.i++
		default:
			return
		}
	}
}

// pointer is the JSON pointer of the current value.
func (w *walker) pointer() string {
	var sb strings.Builder
	for _, s := range w.path {
		sb.WriteByte('/')
		if s.idx >= 0 {
			sb.WriteString(strconv.Itoa(s.idx))
		} else {
			sb.WriteString(escapePointer(string(s.key)))
		}
	}
	return sb.String()
}

// name is the current value's path for a message: the pointer without its
// first slash and with dots between the steps ("duties.1.pressure_ratio"),
// or "the body".
func (w *walker) name() string {
	return orBody(strings.ReplaceAll(strings.TrimPrefix(w.pointer(), "/"), "/", "."))
}

func (w *walker) add(k walkKind, detail string) {
	w.errs = append(w.errs, FieldProblem{Pointer: w.pointer(), Detail: detail})
	w.kinds = append(w.kinds, k)
}

// jsonKindAt names the JSON type of the value at w.i as encoding/json's
// type errors do.
func (w *walker) jsonKindAt() string {
	switch w.b[w.i] {
	case '{':
		return "object"
	case '[':
		return "array"
	case '"':
		return "string"
	case 't', 'f':
		return "bool"
	}
	return "number"
}

// wrongType reports the value at w.i as not of s's JSON type and skips it.
func (w *walker) wrongType(s *shape) {
	w.add(kindType, w.name()+" must be a JSON "+jsonKind(s.typ)+", not "+w.jsonKindAt())
	w.skip()
}

func (w *walker) value(s *shape) {
	c := w.b[w.i]
	if c == 'n' { // null: leaves any field as it is
		w.i += len("null")
		return
	}
	switch s.kind {
	case shapeAny:
		w.skip()
	case shapeQuantity:
		w.quantity()
	case shapeStruct, shapeMap:
		if c != '{' {
			w.wrongType(s)
			return
		}
		w.object(s)
	case shapeSlice:
		if c != '[' {
			w.wrongType(s)
			return
		}
		w.array(s.elem)
	case shapeString:
		if c != '"' {
			w.wrongType(s)
			return
		}
		w.skip()
	case shapeBool:
		if c != 't' && c != 'f' {
			w.wrongType(s)
			return
		}
		w.skip()
	case shapeFloat, shapeInt, shapeUint:
		if c != '-' && (c < '0' || c > '9') {
			w.wrongType(s)
			return
		}
		start := w.i
		w.skip()
		w.number(s, w.b[start:w.i])
	}
}

// number checks that a JSON number fits its field, as encoding/json would
// refuse it, with a message that says why.
func (w *walker) number(s *shape, lit []byte) {
	text := string(lit) // only on the number path; the fields are few
	switch s.kind {
	case shapeFloat:
		if _, err := strconv.ParseFloat(text, s.bits); err != nil {
			w.add(kindType, w.name()+" = "+clip(text)+" is out of range: a number here must be finite, of magnitude below 1.8e308")
		}
	case shapeInt:
		if _, err := strconv.ParseInt(text, 10, s.bits); err != nil {
			w.add(kindType, w.name()+" = "+clip(text)+integerReason(err))
		}
	case shapeUint:
		if _, err := strconv.ParseUint(text, 10, s.bits); err != nil {
			w.add(kindType, w.name()+" = "+clip(text)+integerReason(err))
		}
	}
}

func integerReason(err error) string {
	if ne, ok := err.(*strconv.NumError); ok && ne.Err == strconv.ErrRange {
		return " is too large: out of range for an integer"
	}
	return " must be an integer (digits only, no fraction or exponent)"
}

// quantity checks a value meant for a Quantity: a finite number, or a
// non-blank string (read with its field's unit later).
func (w *walker) quantity() {
	start := w.i
	c := w.b[w.i]
	w.skip()
	lit := w.b[start:w.i]
	switch {
	case c == '"':
		s := unquote(lit)
		if strings.TrimSpace(s) == "" {
			w.add(kindQuantity, w.name()+" must not be an empty string: give a number in SI units or a string with a unit, e.g. \"35 degC\"")
		}
	case c == '-' || (c >= '0' && c <= '9'):
		var q Quantity
		if err := q.UnmarshalJSON(lit); err != nil {
			w.add(kindQuantity, w.name()+" = "+clip(string(lit))+" is not a finite number")
		}
	default:
		w.add(kindQuantity, w.name()+" must be a number in SI units or a string with a unit, e.g. \"35 degC\"")
	}
}

// keyGroup is the range of problems found under one key of an object.
type keyGroup struct {
	key        []byte
	start, end int
}

// object walks an object for a struct (known keys) or a map (any keys).
func (w *walker) object(s *shape) {
	w.i++ // {
	w.ws()
	var seen [][]byte
	var seenSet map[string]bool // for large objects
	var groups []keyGroup
	depth := len(w.path)
	w.path = append(w.path, segment{idx: -1})
	for w.b[w.i] != '}' {
		kstart := w.i
		w.skipString()
		key := w.b[kstart+1 : w.i-1]
		if needsUnquote(key) {
			key = []byte(unquote(w.b[kstart:w.i]))
		}
		w.ws()
		w.i++ // :
		w.ws()
		w.path[depth] = segment{key: key, idx: -1}
		n0 := len(w.errs)
		dup := false
		if seenSet != nil {
			dup = seenSet[string(key)]
			seenSet[string(key)] = true
		} else {
			for _, k := range seen {
				if bytes.Equal(k, key) {
					dup = true
					break
				}
			}
			seen = append(seen, key)
			if len(seen) > 32 {
				seenSet = make(map[string]bool, 2*len(seen))
				for _, k := range seen {
					seenSet[string(k)] = true
				}
			}
		}
		if len(key) > maxEcho {
			// a problem with this key points at its object: its own
			// pointer would echo the whole key
			w.path = w.path[:depth]
		}
		switch {
		case dup:
			w.add(kindDuplicate, "duplicate key "+strconv.Quote(clip(string(key)))+": each key may appear once in an object (the service does not guess which one you meant)")
			w.skip()
		case s.kind == shapeMap:
			w.path = append(w.path[:depth], segment{key: key, idx: -1})
			w.value(s.elem)
		default:
			if f, ok := s.fields[string(key)]; ok {
				w.path = append(w.path[:depth], segment{key: key, idx: -1})
				w.value(f)
			} else {
				w.add(kindUnknown, unknownDetail(string(key), s.order, s.names))
				w.skip()
			}
		}
		w.path = append(w.path[:depth], segment{idx: -1})
		if len(w.errs) > n0 {
			groups = append(groups, keyGroup{key: key, start: n0, end: len(w.errs)})
		}
		w.ws()
		if w.b[w.i] == ',' {
			w.i++
			w.ws()
		}
	}
	w.i++ // }
	w.path = w.path[:depth]
	w.sortGroups(groups)
}

// sortGroups orders the problems found in one object by key (stable: a
// key's own problems keep their order), as a sorted walk would find them.
func (w *walker) sortGroups(groups []keyGroup) {
	if len(groups) < 2 || sort.SliceIsSorted(groups, func(a, b int) bool { return bytes.Compare(groups[a].key, groups[b].key) < 0 }) {
		return
	}
	sort.SliceStable(groups, func(a, b int) bool { return bytes.Compare(groups[a].key, groups[b].key) < 0 })
	first := len(w.errs)
	for _, g := range groups {
		first = min(first, g.start)
	}
	errs := make(fieldErrors, 0, len(w.errs)-first)
	kinds := make([]walkKind, 0, len(w.errs)-first)
	for _, g := range groups {
		errs = append(errs, w.errs[g.start:g.end]...)
		kinds = append(kinds, w.kinds[g.start:g.end]...)
	}
	copy(w.errs[first:], errs)
	copy(w.kinds[first:], kinds)
}

func (w *walker) array(elem *shape) {
	w.i++ // [
	w.ws()
	depth := len(w.path)
	w.path = append(w.path, segment{})
	for n := 0; w.b[w.i] != ']'; n++ {
		w.path[depth] = segment{idx: n}
		w.value(elem)
		w.ws()
		if w.b[w.i] == ',' {
			w.i++
			w.ws()
		}
	}
	w.i++ // ]
	w.path = w.path[:depth]
}

// skip moves past the value at w.i (valid JSON).
func (w *walker) skip() {
	depth := 0
	for {
		switch c := w.b[w.i]; c {
		case '"':
			w.skipString()
		case '{', '[':
			depth++
			w.i++
		case '}', ']':
			depth--
			w.i++
		case ',', ':', ' ', '\t', '\n', '\r':
			w.i++
		default: // a number or a literal
		literal:
			for w.i < len(w.b) {
				switch w.b[w.i] {
				case ',', '}', ']', ' ', '\t', '\n', '\r':
					break literal
				}
				w.i++
			}
		}
		if depth == 0 {
			return
		}
	}
}

// skipString moves past the string starting at w.i.
func (w *walker) skipString() {
	w.i++ // opening quote
	for {
		switch w.b[w.i] {
		case '\\':
			w.i += 2
		case '"':
			w.i++
			return
		default:
			w.i++
		}
	}
}

// needsUnquote reports whether a key's raw bytes differ from its text:
// escapes, or bytes that may be invalid UTF-8 (replaced by U+FFFD).
func needsUnquote(raw []byte) bool {
	for _, c := range raw {
		if c == '\\' || c >= utf8.RuneSelf {
			return true
		}
	}
	return false
}

// unquote is the text of a JSON string literal (quotes included), as
// encoding/json reads it.
func unquote(lit []byte) string {
	var s string
	_ = json.Unmarshal(lit, &s) // valid JSON: cannot fail
	return s
}
