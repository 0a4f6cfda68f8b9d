# syntax=docker/dockerfile:1
#
# stagewright: static, non-root image of the stage-sizing service.
#
#   docker build -t stagewright:dev .
#   docker run --rm -p 8080:8080 stagewright:dev
#
# The build stage's Go matches go.mod's go line (the golang images set
# GOTOOLCHAIN=local, so an older Go would refuse to build). deploy/ checks
# this file (go test ./deploy); see deploy/README.md.

FROM golang:1.26.8 AS build
WORKDIR /src
# Module download in its own layer (and a BuildKit cache) so that a code
# change does not download the modules again.
COPY go.mod go.sum ./
RUN --mount=type=cache,target=/go/pkg/mod \
    go mod download
COPY . .
RUN --mount=type=cache,target=/go/pkg/mod \
    --mount=type=cache,target=/root/.cache/go-build \
    CGO_ENABLED=0 go build -trimpath -ldflags="-s -w" -o /out/stagewright ./cmd/stagewright

# distroless static: no shell, no package manager; CA certificates, tzdata
# and /etc/passwd with the nonroot user (65532) included.
FROM gcr.io/distroless/static-debian12:nonroot
COPY --from=build /out/stagewright /usr/local/bin/stagewright
ENV STAGEWRIGHT_ADDR=0.0.0.0:8080
EXPOSE 8080
USER 65532:65532
ENTRYPOINT ["/usr/local/bin/stagewright"]
