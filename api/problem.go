package api

import (
	"context"
	"errors"
	"fmt"
	"log/slog"
	"net/http"
	"strings"

	"github.com/gin-gonic/gin"
	"github.com/go-playground/validator/v10"

	"stagewright/physics"
	"stagewright/service"
)

// problemBase prefixes our problem type URIs (RFC 9457 §3.1.1: a URI
// reference; these name our own problem kinds and need not resolve).
const problemBase = "https://stagewright.invalid/problems/"

// Problem is an RFC 9457 problem detail with the field errors extension.
type Problem struct {
	Type     string         `json:"type" example:"https://stagewright.invalid/problems/invalid-request" validate:"required"`
	Title    string         `json:"title" example:"Request failed validation" validate:"required"`
	Status   int            `json:"status" example:"400" validate:"required"`
	Detail   string         `json:"detail,omitempty" example:"1 field is wrong; see errors"`
	Instance string         `json:"instance,omitempty" example:"/v1/stage/size"`
	Errors   []FieldProblem `json:"errors,omitempty"`
	// RequestID is the X-Request-ID of the request, to quote when asking
	// about it.
	RequestID string `json:"request_id,omitempty" example:"4f9c2d7e0b1a4c3d8e6f5a4b3c2d1e0f"`
}

// FieldProblem names one offending field by its JSON pointer (RFC 6901).
type FieldProblem struct {
	Pointer string `json:"pointer" example:"/suction/pressure" validate:"required"`
	Detail  string `json:"detail" example:"suction pressure is required (Pa absolute)" validate:"required"`
}

// errBadBody marks a body that is not JSON or not of the request's shape.
var errBadBody = errors.New("api: malformed request body")

// fieldErrors is a list of shape errors found while decoding.
type fieldErrors []FieldProblem

func (f fieldErrors) Error() string {
	parts := make([]string, len(f))
	for i, p := range f {
		parts[i] = p.Pointer + ": " + p.Detail
	}
	return "api: " + strings.Join(parts, "; ")
}

// problemFor maps any error of a request to its problem detail.
func problemFor(err error) Problem {
	var ve validator.ValidationErrors
	var fe fieldErrors
	var ie *service.InputError
	var de *physics.DomainError
	var mbe *http.MaxBytesError
	switch {
	case errors.As(err, &fe):
		return Problem{Type: problemBase + "invalid-request", Title: "Request failed validation", Status: http.StatusBadRequest,
			Detail: count(len(fe)), Errors: fe}
	case errors.As(err, &ve):
		p := Problem{Type: problemBase + "invalid-request", Title: "Request failed validation", Status: http.StatusBadRequest,
			Detail: count(len(ve))}
		for _, e := range ve {
			p.Errors = append(p.Errors, FieldProblem{Pointer: pointerFor(e), Detail: validationDetail(e)})
		}
		return p
	case errors.As(err, &mbe):
		return Problem{Type: problemBase + "body-too-large", Title: "Request body too large", Status: http.StatusRequestEntityTooLarge,
			Detail: fmt.Sprintf("the body exceeds %d bytes; split a batch into smaller ones", mbe.Limit)}
	case errors.Is(err, errReadTimeout):
		return Problem{Type: problemBase + "request-timeout", Title: "Request body timed out", Status: http.StatusRequestTimeout,
			Detail: "the request body did not arrive within the server's read timeout; send it at once, or ask for a longer STAGEWRIGHT_READ_TIMEOUT"}
	case errors.Is(err, context.DeadlineExceeded):
		return Problem{Type: problemBase + "compute-timeout", Title: "Computation timed out", Status: http.StatusGatewayTimeout,
			Detail: "the computation did not finish within the service's compute deadline; split a batch into smaller ones or retry later"}
	case errors.Is(err, context.Canceled):
		return Problem{Type: problemBase + "cancelled", Title: "Request cancelled", Status: http.StatusServiceUnavailable,
			Detail: "the request was cancelled before the computation finished"}
	case errors.Is(err, errBadBody):
		return Problem{Type: problemBase + "malformed-body", Title: "Body is not valid JSON", Status: http.StatusBadRequest,
			Detail: strings.TrimPrefix(strings.TrimPrefix(err.Error(), errBadBody.Error()+": "), "json: ")}
	case errors.As(err, &ie):
		status, kind, title := http.StatusUnprocessableEntity, "unprocessable", "Input outside what the model covers"
		if ie.Shape {
			status, kind, title = http.StatusBadRequest, "invalid-request", "Request failed validation"
		}
		return Problem{Type: problemBase + kind, Title: title, Status: status, Detail: ie.Sentence(),
			Errors: []FieldProblem{{Pointer: dottedPointer(ie.Field), Detail: ie.Sentence()}}}
	case errors.As(err, &de):
		return Problem{Type: problemBase + "unprocessable", Title: "Input outside what the model covers",
			Status: http.StatusUnprocessableEntity, Detail: strings.TrimPrefix(de.Error(), "physics: ")}
	default: // logged by the caller, never echoed
		return Problem{Type: "about:blank", Title: "Internal Server Error", Status: http.StatusInternalServerError}
	}
}

func count(n int) string {
	if n == 1 {
		return "1 field is wrong; see errors"
	}
	return fmt.Sprintf("%d fields are wrong; see errors", n)
}

// dottedPointer turns "impeller.inlet.hub_ratio" into "/impeller/inlet/hub_ratio".
func dottedPointer(field string) string {
	if field == "" {
		return ""
	}
	return "/" + strings.ReplaceAll(field, ".", "/")
}

// pointerFor returns the JSON pointer of a validation error: the namespace
// uses JSON names (registered in newValidator) and starts with the root
// type's name, which is dropped. Slice indexes [i] become /i.
func pointerFor(fe validator.FieldError) string {
	ns := fe.Namespace()
	if i := strings.IndexByte(ns, '.'); i >= 0 {
		ns = ns[i+1:]
	}
	ns = strings.NewReplacer("[", ".", "]", "").Replace(ns)
	return dottedPointer(ns)
}

// validationDetail is a sentence for one failed validator tag.
func validationDetail(fe validator.FieldError) string {
	name := strings.ReplaceAll(strings.TrimPrefix(pointerFor(fe), "/"), "/", ".")
	switch fe.Tag() {
	case "required":
		return name + " is required"
	case "required_without":
		return fmt.Sprintf("%s is required, unless %s is given", name, jsonName(fe.Param()))
	case "excluded_with":
		return fmt.Sprintf("give only one of %s and %s", fe.Field(), jsonName(fe.Param()))
	case "oneof":
		return fmt.Sprintf("%s must be one of: %s", name, strings.ReplaceAll(fe.Param(), " ", ", "))
	case "gte", "min":
		return fmt.Sprintf("%s must be at least %s", name, fe.Param())
	case "lte", "max":
		return fmt.Sprintf("%s must be at most %s", name, fe.Param())
	case "gt":
		return fmt.Sprintf("%s must be greater than %s", name, fe.Param())
	case "required_if":
		field, value, _ := strings.Cut(fe.Param(), " ")
		return fmt.Sprintf("%s is required when %s is %q", name, jsonName(field), value)
	case "excluded_unless":
		field, value, _ := strings.Cut(fe.Param(), " ")
		return fmt.Sprintf("%s applies only when %s is %q; leave it out", name, jsonName(field), value)
	case "len":
		return fmt.Sprintf("%s must have exactly %s entries", name, fe.Param())
	case "dive", "required_with":
		return fmt.Sprintf("%s is incomplete (%s %s)", name, fe.Tag(), fe.Param())
	}
	return strings.TrimSpace(fmt.Sprintf("%s fails %s %s", name, fe.Tag(), fe.Param()))
}

// jsonName maps a Go field name used in a validator parameter to its JSON
// name (snake case of the Go name, as our types use).
func jsonName(goName string) string {
	var b strings.Builder
	for i, r := range goName {
		if r >= 'A' && r <= 'Z' {
			if i > 0 {
				b.WriteByte('_')
			}
			r += 'a' - 'A'
		}
		b.WriteRune(r)
	}
	return b.String()
}

// writeProblem writes p as application/problem+json with the request id
// and aborts the chain; the type is kept for the log line and the metrics.
func writeProblem(c *gin.Context, p Problem) {
	if p.Instance == "" {
		p.Instance = c.Request.URL.Path
	}
	if p.RequestID == "" {
		p.RequestID = c.GetString(requestIDKey)
	}
	c.Set(problemTypeKey, p.Type)
	c.Header("Content-Type", "application/problem+json")
	c.AbortWithStatusJSON(p.Status, p)
}

// fail maps err to a problem, logs server faults (500: the error is logged,
// never echoed), and writes it. Timeouts and shed requests show in the
// request's log line.
func fail(c *gin.Context, log *slog.Logger, err error) {
	p := problemFor(err)
	if p.Status == http.StatusInternalServerError {
		log.Error("request failed", "request_id", c.GetString(requestIDKey), "route", routeLabel(c), "err", err)
	}
	writeProblem(c, p)
}
