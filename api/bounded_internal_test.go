package api

import (
	"bytes"
	"context"
	"errors"
	"log/slog"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestBoundedAnswersAtTheDeadline: a computation that does not poll its
// context (as a physics step does not) no longer holds the request past
// the compute deadline: bounded returns the deadline's error on time, and
// the computation runs on to its end (its log line is checked through the
// router in TestComputeDeadlineWithAStuckStep).
func TestBoundedAnswersAtTheDeadline(t *testing.T) {
	log := slog.New(slog.DiscardHandler)
	ctx, cancel := context.WithTimeout(context.Background(), 50*time.Millisecond)
	defer cancel()
	release := make(chan struct{})
	start := time.Now()
	_, err := bounded(ctx, log, "a stuck step", func(context.Context) (int, error) {
		<-release // never looks at its context
		return 1, nil
	})
	assert.ErrorIs(t, err, context.DeadlineExceeded)
	assert.Less(t, time.Since(start), 2*time.Second, "the answer must come at the deadline, not when the step ends")
	close(release)
}

// TestBoundedPassesResultsAndPanics: within the deadline the result and
// error come back as they are, and a panic is raised again on the caller
// (where the recovery middleware or the batch item turns it into a 500).
func TestBoundedPassesResultsAndPanics(t *testing.T) {
	log := slog.New(slog.DiscardHandler)
	ctx, cancel := context.WithTimeout(context.Background(), time.Minute)
	defer cancel()
	v, err := bounded(ctx, log, "quick", func(context.Context) (int, error) { return 42, nil })
	require.NoError(t, err)
	assert.Equal(t, 42, v)
	boom := errors.New("boom")
	_, err = bounded(ctx, log, "failing", func(context.Context) (int, error) { return 0, boom })
	assert.ErrorIs(t, err, boom)
	assert.PanicsWithValue(t, true, func() {
		defer func() {
			r := recover()
			s, _ := r.(string)
			panic(bytes.HasPrefix([]byte(s), []byte("kaboom")))
		}()
		_, _ = bounded(ctx, log, "panicking", func(context.Context) (int, error) { panic("kaboom") })
	})
	// Without a deadline the call runs on the caller's goroutine.
	v, err = bounded(context.Background(), log, "plain", func(context.Context) (int, error) { return 7, nil })
	require.NoError(t, err)
	assert.Equal(t, 7, v)
}
