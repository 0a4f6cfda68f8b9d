package api

import (
	"bytes"
	"context"
	"errors"
	"log/slog"
	"sync"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// lockedBuffer is a log sink safe for the abandoned goroutine's write.
type lockedBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (l *lockedBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.Write(p)
}

func (l *lockedBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.String()
}

// TestBoundedAnswersAtTheDeadline: a computation that does not poll its
// context (as a physics step does not) no longer holds the request past
// the compute deadline: bounded returns the deadline's error on time, and
// the computation's late end is logged.
func TestBoundedAnswersAtTheDeadline(t *testing.T) {
	var logs lockedBuffer
	log := slog.New(slog.NewJSONHandler(&logs, nil))
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
	require.Eventually(t, func() bool {
		return bytes.Contains([]byte(logs.String()), []byte("ran on after its request had ended"))
	},
		2*time.Second, 5*time.Millisecond)
	assert.Contains(t, logs.String(), `"what":"a stuck step"`)
}

// TestBoundedPassesResultsAndPanics: within the deadline the result and
// error come back as they are, and a panic is raised again on the caller
// (where the recovery middleware or the batch item turns it into a 500).
func TestBoundedPassesResultsAndPanics(t *testing.T) {
	log := slog.New(slog.NewJSONHandler(&lockedBuffer{}, nil))
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
