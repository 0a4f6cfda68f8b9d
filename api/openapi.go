package api

import (
	"context"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/getkin/kin-openapi/openapi2"
	"github.com/getkin/kin-openapi/openapi2conv"
	"github.com/getkin/kin-openapi/openapi3"
)

// openAPI3 converts swag's Swagger 2.0 document to OpenAPI 3.0 with
// kin-openapi, widens every physical-quantity field (marked by swag's
// x-unit-string extension) to "a number or a string with a unit", and
// validates the result.
func openAPI3(spec []byte) ([]byte, error) {
	var doc2 openapi2.T
	if err := json.Unmarshal(spec, &doc2); err != nil {
		return nil, fmt.Errorf("api: read swagger 2.0 document: %w", err)
	}
	doc3, err := openapi2conv.ToV3(&doc2)
	if err != nil {
		return nil, fmt.Errorf("api: convert to openapi 3: %w", err)
	}
	doc3.Servers = openapi3.Servers{{URL: "/", Description: "this service"}}
	if doc3.Components != nil {
		for _, s := range doc3.Components.Schemas {
			widenQuantities(s.Value)
			exclusiveMinimums(s.Value)
			doubleNumbers(s.Value, map[*openapi3.Schema]bool{})
		}
	}
	problemContent(doc3)
	textContent(doc3)
	bearerSecurity(doc3)
	transportErrors(doc3)
	if err := doc3.Validate(context.Background()); err != nil {
		return nil, fmt.Errorf("api: openapi 3 document invalid: %w", err)
	}
	out, err := json.MarshalIndent(doc3, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("api: write openapi 3: %w", err)
	}
	return out, nil
}

// widenQuantities replaces each property carrying x-unit-string with
// oneOf [number (SI), string (value and unit)].
func widenQuantities(s *openapi3.Schema) {
	if s == nil {
		return
	}
	for name, p := range s.Properties {
		if p == nil || p.Value == nil {
			continue
		}
		dim, ok := p.Value.Extensions["x-unit-string"]
		if !ok {
			continue
		}
		num := *p.Value
		num.Extensions = nil
		str := openapi3.NewStringSchema()
		str.Description = fmt.Sprintf("a %v with its unit, e.g. %s", dim, unitExample(fmt.Sprint(dim)))
		s.Properties[name] = &openapi3.SchemaRef{Value: &openapi3.Schema{
			Description: p.Value.Description,
			Extensions:  map[string]any{"x-unit-string": dim},
			OneOf:       openapi3.SchemaRefs{{Value: &num}, {Value: str}},
		}}
	}
}

func unitExample(dim string) string {
	switch dim {
	case "pressure":
		return `"14.7 psia", "1.2 bara", "0.3 barg"`
	case "temperature":
		return `"35 degC", "95 degF", "308.15 K"`
	case "mass-flow":
		return `"11.5 t/h", "3.2 kg/s"`
	case "volume-flow":
		return `"9700 m3/h", "5700 acfm"`
	case "speed":
		return `"21000 rpm", "2200 rad/s"`
	case "velocity":
		return `"130 m/s", "420 ft/s"`
	case "length":
		return `"310 mm", "12.2 in"`
	case "power":
		return `"520 kW", "700 hp"`
	case "pressure-difference":
		return `"0.3 bar", "4 psi"`
	}
	return `"1 unit"`
}

// doubleNumbers gives every number schema without a format (swag leaves it
// out for map values and array items of float64) the format "double", the
// OpenAPI name of a float64.
func doubleNumbers(s *openapi3.Schema, seen map[*openapi3.Schema]bool) {
	if s == nil || seen[s] {
		return
	}
	seen[s] = true
	if s.Type != nil && s.Type.Is("number") && (s.Format == "" || s.Format == "float64") {
		s.Format = "double"
	}
	for _, p := range s.Properties {
		if p != nil {
			doubleNumbers(p.Value, seen)
		}
	}
	if s.Items != nil {
		doubleNumbers(s.Items.Value, seen)
	}
	if s.AdditionalProperties.Schema != nil {
		doubleNumbers(s.AdditionalProperties.Schema.Value, seen)
	}
	for _, o := range s.OneOf {
		if o != nil {
			doubleNumbers(o.Value, seen)
		}
	}
}

// problemContent documents error responses (4xx, 5xx) as
// application/problem+json (RFC 9457 §3), which swag cannot express: its
// produce annotation applies to every response of an operation.
func problemContent(doc *openapi3.T) {
	if doc.Paths == nil {
		return
	}
	for _, item := range doc.Paths.Map() {
		for _, op := range item.Operations() {
			if op.Responses == nil {
				continue
			}
			for code, ref := range op.Responses.Map() {
				if ref == nil || ref.Value == nil || len(code) != 3 || (code[0] != '4' && code[0] != '5') {
					continue
				}
				if mt, ok := ref.Value.Content["application/json"]; ok {
					delete(ref.Value.Content, "application/json")
					ref.Value.Content["application/problem+json"] = mt
				}
			}
		}
	}
}

// bearerScheme names the HTTP bearer security scheme in the document.
const bearerScheme = "bearerAuth"

// securedPrefix is the path prefix of the routes behind bearerAuth (the
// /v1 group of NewRouter); every other route is open.
const securedPrefix = "/v1/"

// bearerSecurity declares the HTTP bearer scheme (RFC 6750) and, on every
// operation, whether it needs a token: those under /v1/ do, the others
// (probes, version, metrics, the documents and /docs) say security: []
// explicitly. Swagger 2.0, which swag writes, has no bearer type.
func bearerSecurity(doc *openapi3.T) {
	if doc.Components == nil {
		doc.Components = &openapi3.Components{}
	}
	if doc.Components.SecuritySchemes == nil {
		doc.Components.SecuritySchemes = openapi3.SecuritySchemes{}
	}
	doc.Components.SecuritySchemes[bearerScheme] = &openapi3.SecuritySchemeRef{Value: &openapi3.SecurityScheme{
		Type: "http", Scheme: "bearer",
		Description: "One of the service's API tokens (STAGEWRIGHT_API_TOKENS) as `Authorization: Bearer TOKEN`. " +
			"Required on the /v1 routes when the service is configured with tokens; without tokens the service asks for none.",
	}}
	if doc.Paths == nil {
		return
	}
	for path, item := range doc.Paths.Map() {
		for _, op := range item.Operations() {
			if strings.HasPrefix(path, securedPrefix) {
				op.Security = &openapi3.SecurityRequirements{{bearerScheme: []string{}}}
			} else {
				op.Security = &openapi3.SecurityRequirements{}
			}
		}
	}
}

// transportErrors documents, on every operation that has no 4xx answer of
// its own, the 400 that Go's HTTP server sends before the router sees the
// request: a request line or header it cannot parse. It is the one error
// that is not problem+json (see the README, Errors).
func transportErrors(doc *openapi3.T) {
	if doc.Paths == nil {
		return
	}
	for _, item := range doc.Paths.Map() {
		for _, op := range item.Operations() {
			if op.Responses == nil {
				op.Responses = openapi3.NewResponses()
			}
			has4xx := false
			for code := range op.Responses.Map() {
				if strings.HasPrefix(code, "4") {
					has4xx = true
				}
			}
			if has4xx {
				continue
			}
			desc := "a request Go's HTTP server cannot parse (request line or headers), answered in plain text before the service sees it"
			op.Responses.Set("400", &openapi3.ResponseRef{Value: &openapi3.Response{
				Description: &desc,
				Content:     openapi3.NewContentWithSchema(openapi3.NewStringSchema(), []string{"text/plain"}),
			}})
		}
	}
}

// exclusiveMinimums turns a property's x-exclusive-minimum extension
// (struct tag extensions:"x-exclusive-minimum=true"; swag has no tag for
// it) into exclusiveMinimum: the minimum itself is refused.
func exclusiveMinimums(s *openapi3.Schema) {
	if s == nil {
		return
	}
	for _, p := range s.Properties {
		if p == nil || p.Value == nil {
			continue
		}
		if v, ok := p.Value.Extensions["x-exclusive-minimum"]; ok {
			if v == true || v == "true" {
				p.Value.ExclusiveMin = openapi3.ExclusiveBound{Bool: openapi3.Ptr(true)}
			}
			delete(p.Value.Extensions, "x-exclusive-minimum")
			if len(p.Value.Extensions) == 0 {
				p.Value.Extensions = nil
			}
		}
	}
}

// textContent gives the non-JSON answers of an operation (a chart as
// image/svg+xml, a table as text/csv) a string schema: Swagger 2.0 has one
// schema for every media type an operation produces.
func textContent(doc *openapi3.T) {
	if doc.Paths == nil {
		return
	}
	for _, item := range doc.Paths.Map() {
		for _, op := range item.Operations() {
			if op.Responses == nil {
				continue
			}
			for _, r := range op.Responses.Map() {
				if r.Value == nil {
					continue
				}
				for mt, c := range r.Value.Content {
					if mt == "image/svg+xml" || mt == "text/csv" {
						c.Schema = openapi3.NewStringSchema().NewRef()
					}
				}
			}
		}
	}
}
