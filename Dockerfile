# syntax=docker/dockerfile:1
# check=error=true
#
# stagewright: static, non-root image of the stage-sizing service.
#
#   docker build -t stagewright:dev \
#     --build-arg VERSION="$(git describe --tags --always --dirty)" \
#     --build-arg COMMIT="$(git rev-parse HEAD)" .
#   docker run --rm -p 8080:8080 --read-only stagewright:dev
#
# The build stage's Go matches go.mod's go line (the golang images set
# GOTOOLCHAIN=local, so an older Go would refuse to build). The deploy
# module lints this file with BuildKit's checks and this project's rules
# (cd deploy && go test ./...); see deploy/README.md. check=error=true makes
# a real BuildKit build fail on a lint warning too.

FROM golang:1.26.8 AS build
# Stamped into the binary (GET /version) and the image labels.
ARG VERSION=dev
ARG COMMIT=unknown
WORKDIR /src
# Module download in its own layer (and a BuildKit cache) so that a code
# change does not download the modules again.
COPY go.mod go.sum ./
RUN --mount=type=cache,target=/go/pkg/mod \
    go mod download
COPY . .
RUN --mount=type=cache,target=/go/pkg/mod \
    --mount=type=cache,target=/root/.cache/go-build \
    CGO_ENABLED=0 go build -trimpath \
      -ldflags="-s -w -X main.version=${VERSION} -X main.commit=${COMMIT}" \
      -o /out/stagewright ./cmd/stagewright

# distroless static: no shell, no package manager; CA certificates, tzdata
# and /etc/passwd with the nonroot user (65532) included. The program
# writes no files, so the container runs with a read-only root filesystem
# (the Deployment mounts an emptyDir at /tmp all the same).
FROM gcr.io/distroless/static-debian12:nonroot
ARG VERSION=dev
ARG COMMIT=unknown
LABEL org.opencontainers.image.title="stagewright" \
      org.opencontainers.image.description="HTTP/JSON service for centrifugal-compressor stage sizing calculations" \
      org.opencontainers.image.version="${VERSION}" \
      org.opencontainers.image.revision="${COMMIT}"
COPY --from=build /out/stagewright /usr/local/bin/stagewright
ENV STAGEWRIGHT_ADDR=0.0.0.0:8080
EXPOSE 8080
USER 65532:65532
ENTRYPOINT ["/usr/local/bin/stagewright"]
