package api_test

import (
	"image/png"
	"os"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestChartScreenshotNonBlank checks the PNG that .ci/run has a real
// browser (Debian's chromium, headless) make of the demo map chart
// (STAGEWRIGHT_CHART_PNG names it; skipped without it): a blank or
// one-colour screenshot means the browser did not draw the SVG. The
// chart has white ground, grey grid, coloured lines and text: at least
// 0.5 % of its pixels must differ from the corner colour and at least
// eight colours must appear.
func TestChartScreenshotNonBlank(t *testing.T) {
	file := os.Getenv("STAGEWRIGHT_CHART_PNG")
	if file == "" {
		t.Skip("STAGEWRIGHT_CHART_PNG not set (.ci/run sets it after the chromium screenshot)")
	}
	f, err := os.Open(file)
	require.NoError(t, err)
	defer f.Close()
	img, err := png.Decode(f)
	require.NoError(t, err)
	b := img.Bounds()
	require.Greater(t, b.Dx(), 200)
	require.Greater(t, b.Dy(), 200)
	ground := img.At(b.Min.X, b.Min.Y)
	gr, gg, gb, _ := ground.RGBA()
	colours := map[[3]uint32]bool{}
	inked := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			colours[[3]uint32{r >> 8, g >> 8, bl >> 8}] = true
			if r != gr || g != gg || bl != gb {
				inked++
			}
		}
	}
	share := float64(inked) / float64(b.Dx()*b.Dy())
	t.Logf("%s: %dx%d, %.2f %% inked, %d colours", file, b.Dx(), b.Dy(), 100*share, len(colours))
	require.Greater(t, share, 0.005, "the screenshot is blank")
	require.GreaterOrEqual(t, len(colours), 8, "the screenshot has too few colours to be the chart")
}
