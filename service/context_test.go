package service_test

import (
	"context"
	"sync/atomic"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// expiringCtx is a context whose deadline passes after its Err method has
// been asked n times: a deterministic stand-in for a deadline that falls
// while a sizing runs.
type expiringCtx struct {
	context.Context
	n     int32
	calls atomic.Int32
}

func (c *expiringCtx) Err() error {
	if c.calls.Add(1) > c.n {
		return context.DeadlineExceeded
	}
	return nil
}

// TestSizeStageStopsOnDeadline: SizeStage looks at its context at the
// start and at every step of its joint iteration (speed, slip,
// efficiency); a
// deadline that passes after the k-th look stops it with the context's
// error, not a result. The duty is the Saravanamuttoo example of
// TestSaravanamuttooThroughService with the slip factor left to the
// Wiesner model and the efficiency to the correlation, so that the
// iteration takes several steps.
func TestSizeStageStopsOnDeadline(t *testing.T) {
	d := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1.1e5, SuctionTemperature: 295,
		PressureRatio: f(4.241), MassFlow: f(9), Speed: f(17400),
		Impeller: service.ImpellerInput{BladeExitAngle: f(0), SlipModel: "wiesner", BladeCount: 19, PowerInputFactor: f(1.04), ExitMeridionalVelocity: f(142.6),
			Inlet: service.InletInput{Type: "axial-eye", HubRatio: f(0.5), MeridionalVelocity: f(142.6)}}}
	ctx := &expiringCtx{Context: context.Background(), n: 1 << 30}
	_, err := service.New().SizeStage(ctx, d)
	require.NoError(t, err, "the duty sizes without a deadline")
	looks := ctx.calls.Load()
	require.GreaterOrEqual(t, looks, int32(3), "the context is checked at least three times")
	for k := range looks {
		ctx := &expiringCtx{Context: context.Background(), n: k}
		_, err := service.New().SizeStage(ctx, d)
		assert.ErrorIs(t, err, context.DeadlineExceeded, "deadline after look %d", k)
	}
}
