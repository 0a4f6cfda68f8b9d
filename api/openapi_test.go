package api_test

import (
	"context"
	"net/http"
	"reflect"
	"sort"
	"strings"
	"testing"

	"github.com/getkin/kin-openapi/openapi3"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
)

// servedOpenAPI3 loads the document GET /openapi.json serves.
func servedOpenAPI3(t *testing.T) *openapi3.T {
	t.Helper()
	w := do(newRouter(t), http.MethodGet, "/openapi.json", "")
	require.Equal(t, http.StatusOK, w.Code)
	doc, err := openapi3.NewLoader().LoadFromData(w.Body.Bytes())
	require.NoError(t, err)
	return doc
}

// TestOpenAPI3Valid: the served document is a valid OpenAPI 3.0 document
// (OpenAPI Specification 3.0.3, as kin-openapi validates it) and describes
// the sizing endpoint with its answers.
func TestOpenAPI3Valid(t *testing.T) {
	doc := servedOpenAPI3(t)
	require.NoError(t, doc.Validate(context.Background()))
	assert.True(t, strings.HasPrefix(doc.OpenAPI, "3.0."), "openapi %q", doc.OpenAPI)

	item := doc.Paths.Find("/v1/stage/size")
	require.NotNil(t, item, "POST /v1/stage/size is not documented")
	op := item.Post
	require.NotNil(t, op, "POST /v1/stage/size is not documented")
	require.NotNil(t, op.RequestBody, "the duty body is not documented")
	assert.True(t, op.RequestBody.Value.Required)
	assert.Equal(t, "#/components/schemas/api.StageRequest", op.RequestBody.Value.Content.Get("application/json").Schema.Ref)

	for code, schema := range map[string]string{"200": "api.StageResponse", "400": "api.Problem", "422": "api.Problem"} {
		resp := op.Responses.Value(code)
		require.NotNil(t, resp, "response %s is not documented", code)
		require.NotEmpty(t, resp.Value.Content, "response %s has no content", code)
		for media, mt := range resp.Value.Content {
			assert.Equal(t, "#/components/schemas/"+schema, mt.Schema.Ref, "response %s %s", code, media)
			want := "application/json"
			if code != "200" {
				want = "application/problem+json" // RFC 9457 §3
			}
			assert.Equal(t, want, media, "response %s", code)
		}
	}
	require.NotNil(t, doc.Paths.Find("/healthz"))
	assert.NotNil(t, doc.Paths.Find("/healthz").Get)
}

// TestOpenAPI3NumbersAreDouble: every float64 of the request and response
// types is documented as type number, format double (OpenAPI 3.0.3 §4.4:
// double is the format of a 64-bit float), a physical quantity as oneOf
// [number double, string with a unit]; and no number anywhere in the
// components carries another format.
func TestOpenAPI3NumbersAreDouble(t *testing.T) {
	doc := servedOpenAPI3(t)
	schemas := doc.Components.Schemas
	for _, root := range []any{api.StageRequest{}, api.StageResponse{}, api.Problem{}, api.Health{}} {
		typ := reflect.TypeOf(root)
		ref, ok := schemas["api."+typ.Name()]
		require.True(t, ok, "no schema api.%s", typ.Name())
		checkSchema(t, typ, ref, typ.Name())
	}

	names := make([]string, 0, len(schemas))
	for n := range schemas {
		names = append(names, n)
	}
	sort.Strings(names)
	seen := map[*openapi3.Schema]bool{} // report each schema once
	for _, n := range names {
		walkNumbers(t, schemas[n], n, seen)
	}
}

var quantityType = reflect.TypeFor[api.Quantity]()

// checkSchema checks that the schema of Go type typ documents its fields,
// every float64 as number/double.
func checkSchema(t *testing.T, typ reflect.Type, ref *openapi3.SchemaRef, path string) {
	t.Helper()
	require.NotNil(t, ref, "%s: no schema", path)
	require.NotNil(t, ref.Value, "%s: unresolved schema", path)
	s := ref.Value
	if len(s.AllOf) == 1 && len(s.Properties) == 0 {
		s = s.AllOf[0].Value // swag wraps a described struct field in allOf
	}
	for typ.Kind() == reflect.Pointer {
		typ = typ.Elem()
	}
	if typ == quantityType {
		require.Len(t, s.OneOf, 2, "%s: a quantity is oneOf [number, string]", path)
		num, str := s.OneOf[0].Value, s.OneOf[1].Value
		assert.True(t, num.Type.Is("number"), "%s: first branch is a number", path)
		assert.Equal(t, "double", num.Format, "%s: number branch format", path)
		assert.True(t, str.Type.Is("string"), "%s: second branch is a string with a unit", path)
		return
	}
	switch typ.Kind() {
	case reflect.Float64:
		assert.True(t, s.Type.Is("number"), "%s: type %v, want number", path, s.Type)
		assert.Equal(t, "double", s.Format, "%s: float64 must be format double", path)
	case reflect.Int, reflect.Int64:
		assert.True(t, s.Type.Is("integer"), "%s: type %v, want integer", path, s.Type)
	case reflect.String:
		assert.True(t, s.Type.Is("string"), "%s: type %v, want string", path, s.Type)
	case reflect.Slice:
		assert.True(t, s.Type.Is("array"), "%s: type %v, want array", path, s.Type)
		checkSchema(t, typ.Elem(), s.Items, path+"[]")
	case reflect.Map:
		require.NotNil(t, s.AdditionalProperties.Schema, "%s: map without additionalProperties", path)
		checkSchema(t, typ.Elem(), s.AdditionalProperties.Schema, path+"{}")
	case reflect.Struct:
		for i := range typ.NumField() {
			f := typ.Field(i)
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if !f.IsExported() || name == "-" {
				continue
			}
			prop, ok := s.Properties[name]
			if assert.True(t, ok, "%s.%s is not documented", path, name) {
				checkSchema(t, f.Type, prop, path+"."+name)
			}
		}
	}
}

// walkNumbers fails on any number schema whose format is not double or float.
func walkNumbers(t *testing.T, ref *openapi3.SchemaRef, path string, seen map[*openapi3.Schema]bool) {
	t.Helper()
	if ref == nil || ref.Value == nil || seen[ref.Value] {
		return
	}
	s := ref.Value
	seen[s] = true
	if s.Type.Is("number") {
		assert.Contains(t, []string{"double", "float"}, s.Format, "%s: number with format %q", path, s.Format)
	}
	for name, p := range s.Properties {
		walkNumbers(t, p, path+"."+name, seen)
	}
	walkNumbers(t, s.Items, path+"[]", seen)
	walkNumbers(t, s.AdditionalProperties.Schema, path+"{}", seen)
	for _, o := range append(append(openapi3.SchemaRefs{}, s.OneOf...), s.AllOf...) {
		walkNumbers(t, o, path, seen)
	}
}

// TestOpenAPIOperationsComplete is the rule every route follows, checked
// on the served document so that a route added later (its swag
// annotations) fails here before the linters of .ci/run (Spectral
// spectral:oas, Redocly recommended) do: a unique operationId, a summary
// and a description, tags declared at the top (@tag.name in api/doc.go),
// at least one documented 4xx answer, and its security: the HTTP bearer
// scheme on /v1 routes, none elsewhere. The license names a URL.
func TestOpenAPIOperationsComplete(t *testing.T) {
	doc := servedOpenAPI3(t)
	require.NotNil(t, doc.Info.License)
	assert.NotEmpty(t, doc.Info.License.URL, "license needs a url (Redocly info-license-strict)")
	require.NotNil(t, doc.Components.SecuritySchemes["bearerAuth"], "components.securitySchemes.bearerAuth")
	scheme := doc.Components.SecuritySchemes["bearerAuth"].Value
	assert.Equal(t, "http", scheme.Type)
	assert.Equal(t, "bearer", scheme.Scheme)
	tags := map[string]bool{}
	for _, tag := range doc.Tags {
		tags[tag.Name] = true
		assert.NotEmpty(t, tag.Description, "tag %s", tag.Name)
	}
	ids := map[string]string{}
	for path, item := range doc.Paths.Map() {
		for method, op := range item.Operations() {
			name := method + " " + path
			if assert.NotEmpty(t, op.OperationID, "%s: @ID", name) {
				assert.NotContains(t, ids, op.OperationID, "%s: operationId used by %s", name, ids[op.OperationID])
				ids[op.OperationID] = name
			}
			assert.NotEmpty(t, op.Summary, "%s: @Summary", name)
			assert.NotEmpty(t, op.Description, "%s: @Description", name)
			assert.NotEmpty(t, op.Tags, "%s: @Tags", name)
			for _, tag := range op.Tags {
				assert.True(t, tags[tag], "%s: tag %q is not declared with @tag.name in api/doc.go", name, tag)
			}
			has4xx := false
			for code := range op.Responses.Map() {
				has4xx = has4xx || strings.HasPrefix(code, "4")
			}
			assert.True(t, has4xx, "%s: no 4xx answer documented", name)
			require.NotNil(t, op.Security, "%s: security", name)
			if strings.HasPrefix(path, "/v1/") {
				assert.Equal(t, openapi3.SecurityRequirements{{"bearerAuth": []string{}}}, *op.Security, name)
			} else {
				assert.Empty(t, *op.Security, "%s is open", name)
			}
		}
	}
}
