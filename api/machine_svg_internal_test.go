package api

import (
	"encoding/json"
	"os"
	"testing"
)

// BenchmarkMapSVG renders the demo machine's map (its golden JSON answer)
// as the SVG chart.
func BenchmarkMapSVG(b *testing.B) {
	raw, err := os.ReadFile("../testdata/machines/kestrel-regen-blower.map.golden.json")
	if err != nil {
		b.Fatal(err)
	}
	var m MapResponse
	if err := json.Unmarshal(raw, &m); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := mapSVG(m); err != nil {
			b.Fatal(err)
		}
	}
}
