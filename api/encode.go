package api

import (
	"bytes"
	"encoding/json"
	"log/slog"
	"reflect"
	"sync"
	"unicode/utf8"

	"github.com/bytedance/sonic/encoder"
	"github.com/gin-gonic/gin"
)

// Answers are encoded by bytedance/sonic with encoding/json's behaviour:
// the same bytes as encoding/json (HTML characters and U+2028/U+2029
// escaped, map keys sorted, invalid UTF-8 replaced, floats in the
// shortest form that round-trips, 'e' notation below 1e-6 and from 1e21),
// about 2.5 times faster. sonic compiles an encoder per type on amd64 and
// arm64 (Go and assembly, no cgo: the static CGO_ENABLED=0 build keeps
// it); on any other architecture, or a Go release it does not know, it is
// encoding/json itself. The golden tests pin the bytes: every demo answer
// must equal encoding/json's encoding of the same value.
//
// sonic's own HTML-escaping and UTF-8 passes copy the whole answer into a
// fresh buffer; the encoder below does both on pooled buffers instead, and
// only when the answer needs them.
const answerOpts = encoder.SortMapKeys | encoder.CompactMarshaler | encoder.NoEncoderNewline

// maxPooledAnswer is the largest buffer kept for reuse (a 500-duty batch
// encodes item by item, so buffers stay at one answer's size).
const maxPooledAnswer = 256 << 10

// answerEncoder encodes answers into pooled buffers. One is made per
// router; it is safe for concurrent use.
type answerEncoder struct {
	bufs sync.Pool // *[]byte
}

// newAnswerEncoder compiles sonic's encoders for the answer types ahead of
// the first request.
func newAnswerEncoder() (*answerEncoder, error) {
	err := encoder.PretouchMany([]reflect.Type{reflect.TypeFor[StageResponse](), reflect.TypeFor[BatchItem](),
		reflect.TypeFor[CompactStageResponse](), reflect.TypeFor[CompactBatchItem](),
		reflect.TypeFor[PropertiesResponse]()})
	if err != nil {
		return nil, err
	}
	return &answerEncoder{bufs: sync.Pool{New: func() any { b := make([]byte, 0, 16<<10); return &b }}}, nil
}

// get returns an empty buffer; put it back when its bytes are written.
func (e *answerEncoder) get() *[]byte {
	b := e.bufs.Get().(*[]byte)
	*b = (*b)[:0]
	return b
}

func (e *answerEncoder) put(b *[]byte) {
	if cap(*b) <= maxPooledAnswer {
		e.bufs.Put(b)
	}
}

// encode returns a pooled buffer holding the JSON encoding of v; put it
// back when its bytes are written.
func (e *answerEncoder) encode(v any) (*[]byte, error) {
	b := e.get()
	if err := appendJSON(b, v); err != nil {
		e.put(b)
		return nil, err
	}
	if needsHTMLEscape(*b) {
		d := e.get()
		*d = encoder.HTMLEscape(*d, *b)
		e.put(b)
		b = d
	}
	return b, nil
}

// appendJSON appends the JSON encoding of v to *b, HTML characters not yet
// escaped (see needsHTMLEscape).
func appendJSON(b *[]byte, v any) error {
	start := len(*b)
	if err := encoder.EncodeInto(b, v, answerOpts); err != nil {
		return err
	}
	if n := len(*b); n > start && (*b)[n-1] == '\n' { // encoding/json's Encoder (the fallback) ends with one
		*b = (*b)[:n-1]
	}
	if !utf8.Valid((*b)[start:]) { // a string with invalid UTF-8: encoding/json's replacement (rare)
		out, err := json.Marshal(v)
		if err != nil {
			return err
		}
		*b = append((*b)[:start], out...)
	}
	return nil
}

// needsHTMLEscape reports whether encoding/json would escape something in
// b: <, >, & or the line and paragraph separators U+2028 and U+2029.
func needsHTMLEscape(b []byte) bool {
	return bytes.IndexByte(b, '&') >= 0 || bytes.IndexByte(b, '<') >= 0 || bytes.IndexByte(b, '>') >= 0 ||
		bytes.Contains(b, []byte("\u2028")) || bytes.Contains(b, []byte("\u2029"))
}

// write answers status with the JSON encoding of v (a 500 problem when v
// cannot be encoded: never an empty 200).
func (e *answerEncoder) write(c *gin.Context, log *slog.Logger, status int, v any) {
	b, err := e.encode(v)
	if err != nil {
		fail(c, log, err)
		return
	}
	c.Data(status, "application/json; charset=utf-8", *b)
	e.put(b)
}
