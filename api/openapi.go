package api

import (
	"context"
	"encoding/json"
	"fmt"

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
			doubleNumbers(s.Value, map[*openapi3.Schema]bool{})
		}
	}
	problemContent(doc3)
	textContent(doc3)
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
