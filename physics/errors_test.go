package physics_test

import (
	"errors"
	"fmt"
	"math"
	"os/exec"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
)

func TestDomainErrorUnwraps(t *testing.T) {
	err := fmt.Errorf("wrapped: %w", &physics.DomainError{Name: "t01", Value: -1, Want: "> 0 K"})
	require.ErrorIs(t, err, physics.ErrDomain)
	var de *physics.DomainError
	require.True(t, errors.As(err, &de))
	assert.Equal(t, "t01", de.Name)
	assert.Contains(t, err.Error(), "t01 = -1 is out of range")
	reason := &physics.DomainError{Name: "x", Reason: "discharge pressure must exceed suction pressure"}
	assert.Equal(t, "physics: discharge pressure must exceed suction pressure", reason.Error())
}

func TestFinite(t *testing.T) {
	assert.True(t, physics.Finite(1, 0, -3e300))
	assert.False(t, physics.Finite(1, math.NaN()))
	assert.False(t, physics.Finite(math.Inf(-1)))
}

// TestImportsStandardLibraryOnly asserts the design rule that physics and its
// sub-packages import nothing of the project outside physics and nothing
// outside the standard library.
func TestImportsStandardLibraryOnly(t *testing.T) {
	out, err := exec.Command("go", "list", "-deps", "-f", "{{if not .Standard}}{{.ImportPath}}{{end}}", "stagewright/physics/...").Output()
	require.NoError(t, err)
	for _, dep := range strings.Fields(string(out)) {
		ok := dep == "stagewright/physics" || strings.HasPrefix(dep, "stagewright/physics/")
		assert.True(t, ok, "physics depends on %s", dep)
	}
}
