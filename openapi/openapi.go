// Package openapi holds the OpenAPI description of the service that swag
// generates from the api package's annotations (swagger.json, Swagger 2.0,
// and swagger.yaml). Regenerate with the command in DEVELOPERS.md; CI fails
// when the committed files are out of date. The api package converts the
// 2.0 document to OpenAPI 3.0 with kin-openapi at start-up.
package openapi

import _ "embed"

// Swagger2 returns the generated Swagger 2.0 document (a fresh copy).
func Swagger2() []byte { return append([]byte(nil), swagger2...) }

//go:embed swagger.json
var swagger2 []byte
