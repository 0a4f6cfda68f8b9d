package gerg_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Target (issue 12): one (T, p) state of a 5-component natural gas in at
// most 10 µs with no allocation once the mixture is built.
func BenchmarkStateTPNaturalGas(b *testing.B) {
	m := mixtureOf(b, ng5)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.StateTP(300, 5e6); err != nil {
			b.Fatal(err)
		}
	}
}

// The full 21-component mixture at the published test state.
func BenchmarkStateTP21(b *testing.B) {
	m := mixtureOf(b, all21)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.StateTP(400, 50e6); err != nil {
			b.Fatal(err)
		}
	}
}

// Building a mixture (what the model caches per composition).
func BenchmarkNewMixture(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		mixtureOf(b, ng5)
	}
}

// TestStateTPDoesNotAllocate: a state allocates nothing (issue 12 target;
// counted, not timed).
func TestStateTPDoesNotAllocate(t *testing.T) {
	m := mixtureOf(t, ng5)
	allocs := testing.AllocsPerRun(100, func() {
		_, err := m.StateTP(300, 5e6)
		require.NoError(t, err)
	})
	assert.Zero(t, allocs)
}
