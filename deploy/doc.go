// Package deploy holds what a platform team needs to run stagewright: the
// Kubernetes manifests (kustomization.yaml and the files it lists) and the
// tests that check them, the repository's Dockerfile and its .dockerignore
// without a Docker engine or a cluster. See README.md.
//
// The package has no code; its tests are the checks:
//
//	go test ./deploy
package deploy
