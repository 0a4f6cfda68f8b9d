// Package api is the HTTP face of stagewright: the gin router, the JSON
// request and response types (validator tags for shape, swag annotations
// for the OpenAPI description), strict decoding, and the mapping of every
// error to an RFC 9457 problem+json with a JSON pointer to each offending
// field. Physics is reached only through the service package.
//
//	@title			stagewright
//	@version		1.0
//	@description	Centrifugal-compressor stage sizing from a gas duty: speed, impeller diameters and widths, head, discharge temperature, gas and shaft power, driver rating and limit warnings. Results are preliminary engineering estimates: defer to the machine's manufacturer, the applicable standards (API 617 / ISO 10439 style), local codes and licensed engineering practice.
//	@license.name	Proprietary
//	@license.url	https://stagewright.invalid/license
//	@tag.name			stage
//	@tag.description	Size a centrifugal stage for a gas duty, one duty or a batch
//	@tag.name			section
//	@tag.description	Size a multi-stage section with intercoolers and condensate removal
//	@tag.name			machine
//	@tag.description	Evaluate an installed machine: rating, estimated map with surge and choke, duty-change check
//	@tag.name			gas
//	@tag.description	Gas properties and the component catalogue
//	@tag.name			operations
//	@tag.description	Liveness, readiness, version, metrics and this reference (no token needed)
//	@BasePath		/
package api
