// Package deploy holds what a platform team needs to run stagewright: the
// Kubernetes manifests (kustomization.yaml and the files it lists, and the
// Secret template secret.example.yaml) and the tests that check them, the
// repository's Dockerfile and its .dockerignore without a Docker engine or
// a cluster. See README.md.
//
// It is its own Go module (stagewright/deploy), so that the Kubernetes API
// types and BuildKit, which the checks use, stay out of the service's
// module and binary. The package has no code; its tests are the checks,
// run from this folder:
//
//	cd deploy && go test ./...
package deploy
