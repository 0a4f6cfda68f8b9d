package api_test

import (
	"context"
	"net/http"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/service"
)

// stuckRater is a machine service whose rating never looks at its context
// until released, as a physics step that runs long does not.
type stuckRater struct {
	fakeService
	release chan struct{}
}

func (s stuckRater) RateMachine(context.Context, service.RateDuty) (service.Rating, error) {
	<-s.release
	return service.Rating{}, nil
}

// TestComputeDeadlineWithAStuckStep: the machine routes answer 504 at the
// compute deadline even when the computation does not poll its context.
// Before, the handler waited for the computation (a design suction of
// 1e9 Pa held a rating for minutes past the 20 s deadline); the late end
// is logged as a warning.
func TestComputeDeadlineWithAStuckStep(t *testing.T) {
	svc := stuckRater{fakeService: fakeService{Service: service.New()}, release: make(chan struct{})}
	h, logs := newRouterOpts(t, svc, api.Options{ComputeTimeout: 50 * time.Millisecond})
	body, err := os.ReadFile(filepath.Join("..", "testdata", "machines", "kestrel-instrument-air-design.rate.in.json"))
	require.NoError(t, err)
	start := time.Now()
	w := send(h, request(http.MethodPost, "/v1/machine/rate", string(body)))
	requireProblem(t, w, http.StatusGatewayTimeout, "compute-timeout")
	assert.Less(t, time.Since(start), 5*time.Second, "the 504 must come at the deadline")
	time.Sleep(1200 * time.Millisecond) // past lateEnd (1 s): a step that ends this late is logged
	svc.release <- struct{}{}           // let the stuck step end
	require.Eventually(t, func() bool {
		return len(logs.lines(t, "computation ran on after its request had ended (compute deadline or client gone)")) == 1
	},
		2*time.Second, 5*time.Millisecond)
	assert.Equal(t, "machine rating", logs.lines(t, "computation ran on after its request had ended (compute deadline or client gone)")[0]["what"])
}
