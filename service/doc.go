// Package service holds the use cases of stagewright: it turns a checked
// duty into physics calls in the right order, applies and records the
// defaults, checks the result against the design limits, and returns the
// result with its warnings and provenance. It knows nothing of HTTP, JSON
// or status codes: input problems come back as *InputError naming the
// field, physics problems keep their *physics.DomainError.
package service
