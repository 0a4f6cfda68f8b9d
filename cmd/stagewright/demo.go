package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"text/tabwriter"
	"time"
)

// runDemo posts every demo duty in dir to the running server and prints a
// summary table: what a newcomer sees first. token, when not empty, is
// sent as the bearer token. The table goes to out in one write once every
// duty is sized, so that in a terminal the server's JSON log lines (on
// stderr) come before or after it, never between its rows; the warnings
// column names each code once.
func runDemo(ctx context.Context, base, dir, token string, out io.Writer) error {
	files, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
	if err != nil || len(files) == 0 {
		return fmt.Errorf("no demo duties (*.in.json) in %s", dir)
	}
	sort.Strings(files)
	client := &http.Client{Timeout: 10 * time.Second}
	var table bytes.Buffer
	tw := tabwriter.NewWriter(&table, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "demo duty\tstatus\tD2 m\tU2 m/s\tT2 K\tshaft kW\tverdict\twarnings")
	for _, f := range files {
		body, err := os.ReadFile(f)
		if err != nil {
			return err
		}
		req, err := http.NewRequestWithContext(ctx, http.MethodPost, base+"/v1/stage/size", bytes.NewReader(body))
		if err != nil {
			return err
		}
		req.Header.Set("Content-Type", "application/json")
		if token != "" {
			req.Header.Set("Authorization", "Bearer "+token)
		}
		resp, err := client.Do(req)
		if err != nil {
			return err
		}
		var r struct {
			Geometry struct {
				TipDiameter float64 `json:"tip_diameter"`
			} `json:"geometry"`
			Velocities struct {
				TipSpeed float64 `json:"tip_speed"`
			} `json:"velocities"`
			Discharge struct {
				Temperature float64 `json:"temperature"`
			} `json:"discharge"`
			Power struct {
				Shaft float64 `json:"shaft"`
			} `json:"power"`
			Verdict  string `json:"verdict"`
			Warnings []struct {
				Code string `json:"code"`
			} `json:"warnings"`
			Title  string `json:"title"`
			Detail string `json:"detail"`
		}
		err = json.NewDecoder(resp.Body).Decode(&r)
		resp.Body.Close()
		if err != nil {
			return fmt.Errorf("%s: %w", f, err)
		}
		name := strings.TrimSuffix(filepath.Base(f), ".in.json")
		if resp.StatusCode != http.StatusOK {
			fmt.Fprintf(tw, "%s\t%d\t\t\t\t\t%s\t%s\n", name, resp.StatusCode, r.Title, r.Detail)
			continue
		}
		var codes []string
		seen := map[string]bool{}
		for _, w := range r.Warnings {
			if !seen[w.Code] { // a code may come once per station (water-dew-point)
				seen[w.Code] = true
				codes = append(codes, w.Code)
			}
		}
		fmt.Fprintf(tw, "%s\t%d\t%.3f\t%.0f\t%.1f\t%.0f\t%s\t%s\n", name, resp.StatusCode, r.Geometry.TipDiameter,
			r.Velocities.TipSpeed, r.Discharge.Temperature, r.Power.Shaft/1e3, r.Verdict, strings.Join(codes, ","))
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	_, err = out.Write(append([]byte("\n"), table.Bytes()...))
	return err
}
