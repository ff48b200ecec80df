// Package openapi holds the OpenAPI (Swagger 2.0) description of thzdrive's
// HTTP/JSON API, thzdrive.swagger.json, generated from proto/ and
// proto/thzdrive/v1/http.yaml by tools/generate (`go generate ./api/...`);
// thzdrived serves it at /openapi.json. Everything but this file is
// generated.
package openapi

import _ "embed"

// JSON is the OpenAPI description.
//
//go:embed thzdrive.swagger.json
var JSON []byte
