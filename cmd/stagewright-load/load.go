package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"net"
	"net/http"
	"net/url"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
	"time"
)

// Bounds on the flags: the tool is for a quick loopback measurement, not a
// soak test.
const (
	maxRequests    = 1_000_000
	maxConcurrency = 256
	maxDuration    = 10 * time.Minute
)

// options are the checked flags.
type options struct {
	Target      *url.URL
	Requests    int
	Concurrency int
	Duration    time.Duration
	Timeout     time.Duration
	Duties      []string
	JSON        bool
}

func parseOptions(args []string, stderr io.Writer) (options, error) {
	var o options
	fs := flag.NewFlagSet("stagewright-load", flag.ContinueOnError)
	fs.SetOutput(stderr)
	target := fs.String("url", "http://127.0.0.1:8080", "server base URL; loopback addresses only (127.0.0.0/8, [::1])")
	fs.IntVar(&o.Requests, "n", 2000, fmt.Sprintf("number of requests (1..%d)", maxRequests))
	fs.IntVar(&o.Concurrency, "c", 4, fmt.Sprintf("requests in flight at once (1..%d)", maxConcurrency))
	fs.DurationVar(&o.Duration, "duration", 60*time.Second, fmt.Sprintf("stop after this long even if requests remain (at most %s)", maxDuration))
	fs.DurationVar(&o.Timeout, "timeout", 10*time.Second, "timeout of one request")
	duty := fs.String("duty", "testdata/stages/kestrel-instrument-air.in.json",
		"request body: a JSON file, or a folder whose *.in.json files are sent in turn")
	fs.BoolVar(&o.JSON, "json", false, "print the report as JSON")
	if err := fs.Parse(args); err != nil {
		return o, err
	}
	if fs.NArg() > 0 {
		return o, fmt.Errorf("unexpected arguments: %s", strings.Join(fs.Args(), " "))
	}
	u, err := loopbackURL(*target)
	if err != nil {
		return o, err
	}
	o.Target = u
	switch {
	case o.Requests < 1 || o.Requests > maxRequests:
		return o, fmt.Errorf("-n %d: want 1..%d", o.Requests, maxRequests)
	case o.Concurrency < 1 || o.Concurrency > maxConcurrency:
		return o, fmt.Errorf("-c %d: want 1..%d", o.Concurrency, maxConcurrency)
	case o.Duration <= 0 || o.Duration > maxDuration:
		return o, fmt.Errorf("-duration %s: want > 0 and at most %s", o.Duration, maxDuration)
	case o.Timeout <= 0:
		return o, fmt.Errorf("-timeout %s: want > 0", o.Timeout)
	}
	o.Duties, err = dutyFiles(*duty)
	return o, err
}

// loopbackURL accepts http://IP[:port][/] where IP is a loopback address
// written as such; host names (localhost included) are refused, since what
// they resolve to is not this tool's to check.
func loopbackURL(raw string) (*url.URL, error) {
	u, err := url.Parse(raw)
	if err != nil {
		return nil, fmt.Errorf("-url %q: %w", raw, err)
	}
	if u.Scheme != "http" {
		return nil, fmt.Errorf("-url %q: want http://", raw)
	}
	if u.User != nil || u.RawQuery != "" || u.Fragment != "" || (u.Path != "" && u.Path != "/") {
		return nil, fmt.Errorf("-url %q: want only scheme, host and port", raw)
	}
	ip := net.ParseIP(u.Hostname())
	if ip == nil || !ip.IsLoopback() {
		return nil, fmt.Errorf("-url %q: refused: the target must be a loopback address such as 127.0.0.1", raw)
	}
	u.Path = ""
	return u, nil
}

// dutyFiles returns the request bodies to send: one file, or the *.in.json
// files of a folder.
func dutyFiles(p string) ([]string, error) {
	st, err := os.Stat(p)
	if err != nil {
		return nil, fmt.Errorf("-duty: %w", err)
	}
	if !st.IsDir() {
		return []string{p}, nil
	}
	files, err := filepath.Glob(filepath.Join(p, "*.in.json"))
	if err != nil || len(files) == 0 {
		return nil, fmt.Errorf("-duty %s: no *.in.json files", p)
	}
	sort.Strings(files)
	return files, nil
}

// loopbackDialer dials only loopback addresses: a last guard behind
// loopbackURL.
func loopbackDialer() func(ctx context.Context, network, addr string) (net.Conn, error) {
	d := &net.Dialer{Timeout: 5 * time.Second}
	return func(ctx context.Context, network, addr string) (net.Conn, error) {
		host, _, err := net.SplitHostPort(addr)
		if err != nil {
			return nil, err
		}
		if ip := net.ParseIP(host); ip == nil || !ip.IsLoopback() {
			return nil, fmt.Errorf("refused to dial %s: not a loopback address", addr)
		}
		return d.DialContext(ctx, network, addr)
	}
}

// sample is the outcome of one request.
type sample struct {
	Latency time.Duration
	Status  int // 0 when the request failed before a response
	Err     error
}

// Report is the result of a run.
type Report struct {
	Target         string         `json:"target"`
	Requests       int            `json:"requests_planned"`
	Completed      int            `json:"requests_completed"`
	OK             int            `json:"ok"`
	Errors         int            `json:"errors"`
	StatusCounts   map[string]int `json:"status_counts"`
	TransportError string         `json:"first_transport_error,omitempty"`
	Concurrency    int            `json:"concurrency"`
	Elapsed        float64        `json:"elapsed_s"`
	Throughput     float64        `json:"throughput_rps"`
	LatencyMs      Latencies      `json:"latency_ms"`
	StoppedByCap   bool           `json:"stopped_by_duration_cap"`
}

// Latencies are latency statistics in milliseconds.
type Latencies struct {
	Min  float64 `json:"min"`
	Mean float64 `json:"mean"`
	P50  float64 `json:"p50"`
	P95  float64 `json:"p95"`
	P99  float64 `json:"p99"`
	Max  float64 `json:"max"`
}

// percentile returns the nearest-rank p-th percentile (0 < p <= 100) of
// sorted values: the smallest value with at least p % of values at or
// below it.
func percentile(sorted []time.Duration, p float64) time.Duration {
	if len(sorted) == 0 {
		return 0
	}
	rank := int(math.Ceil(p / 100 * float64(len(sorted))))
	rank = min(max(rank, 1), len(sorted))
	return sorted[rank-1]
}

func run(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	o, err := parseOptions(args, stderr)
	if err != nil {
		return err
	}
	bodies := make([][]byte, len(o.Duties))
	for i, f := range o.Duties {
		if bodies[i], err = os.ReadFile(f); err != nil {
			return err
		}
		if !json.Valid(bodies[i]) {
			return fmt.Errorf("%s: not valid JSON", f)
		}
	}
	rep := load(ctx, o, bodies)
	if o.JSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		err = enc.Encode(rep)
	} else {
		err = printReport(stdout, rep)
	}
	if err != nil {
		return err
	}
	if rep.Errors > 0 || rep.Completed < rep.Requests {
		return fmt.Errorf("%d of %d requests failed or did not run", rep.Requests-rep.OK, rep.Requests)
	}
	return nil
}

// load sends the requests and collects the report.
func load(ctx context.Context, o options, bodies [][]byte) Report {
	client := &http.Client{
		Timeout: o.Timeout,
		Transport: &http.Transport{
			DialContext:         loopbackDialer(),
			MaxIdleConns:        o.Concurrency,
			MaxIdleConnsPerHost: o.Concurrency,
			IdleConnTimeout:     30 * time.Second,
		},
		CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse },
	}
	defer client.CloseIdleConnections()
	endpoint := o.Target.String() + "/v1/stage/size"
	ctx, cancel := context.WithTimeout(ctx, o.Duration)
	defer cancel()

	var next atomic.Int64
	results := make([][]sample, o.Concurrency)
	var wg sync.WaitGroup
	start := time.Now()
	for w := range o.Concurrency {
		wg.Go(func() {
			for ctx.Err() == nil {
				i := int(next.Add(1)) - 1
				if i >= o.Requests {
					return
				}
				s := post(ctx, client, endpoint, bodies[i%len(bodies)])
				if ctx.Err() != nil && s.Err != nil { // cut off by the cap
					return
				}
				results[w] = append(results[w], s)
			}
		})
	}
	wg.Wait()
	elapsed := time.Since(start)

	rep := Report{Target: endpoint, Requests: o.Requests, Concurrency: o.Concurrency, Elapsed: elapsed.Seconds(),
		StatusCounts: map[string]int{}, StoppedByCap: ctx.Err() != nil && errors.Is(ctx.Err(), context.DeadlineExceeded)}
	var lat []time.Duration
	var sum time.Duration
	for _, rs := range results {
		for _, s := range rs {
			rep.Completed++
			switch {
			case s.Err != nil:
				rep.Errors++
				rep.StatusCounts["transport error"]++
				if rep.TransportError == "" {
					rep.TransportError = s.Err.Error()
				}
				continue
			case s.Status == http.StatusOK:
				rep.OK++
			default:
				rep.Errors++
			}
			rep.StatusCounts[fmt.Sprint(s.Status)]++
			lat = append(lat, s.Latency)
			sum += s.Latency
		}
	}
	if elapsed > 0 {
		rep.Throughput = float64(rep.Completed) / elapsed.Seconds()
	}
	if len(lat) > 0 {
		sort.Slice(lat, func(i, j int) bool { return lat[i] < lat[j] })
		ms := func(d time.Duration) float64 { return float64(d) / float64(time.Millisecond) }
		rep.LatencyMs = Latencies{Min: ms(lat[0]), Mean: ms(sum / time.Duration(len(lat))), P50: ms(percentile(lat, 50)),
			P95: ms(percentile(lat, 95)), P99: ms(percentile(lat, 99)), Max: ms(lat[len(lat)-1])}
	}
	return rep
}

// post sends one request and reads the whole response.
func post(ctx context.Context, client *http.Client, endpoint string, body []byte) sample {
	req, err := http.NewRequestWithContext(ctx, http.MethodPost, endpoint, bytes.NewReader(body))
	if err != nil {
		return sample{Err: err}
	}
	req.Header.Set("Content-Type", "application/json")
	t0 := time.Now()
	resp, err := client.Do(req)
	if err != nil {
		return sample{Latency: time.Since(t0), Err: err}
	}
	_, err = io.Copy(io.Discard, resp.Body)
	resp.Body.Close()
	return sample{Latency: time.Since(t0), Status: resp.StatusCode, Err: err}
}

func printReport(w io.Writer, r Report) error {
	codes := make([]string, 0, len(r.StatusCounts))
	for k := range r.StatusCounts {
		codes = append(codes, k)
	}
	sort.Strings(codes)
	var st []string
	for _, k := range codes {
		st = append(st, fmt.Sprintf("%s: %d", k, r.StatusCounts[k]))
	}
	capNote := ""
	if r.StoppedByCap {
		capNote = " (stopped by the -duration cap)"
	}
	_, err := fmt.Fprintf(w, `target        %s
requests      %d planned, %d completed%s, concurrency %d
responses     %s
ok / errors   %d / %d
elapsed       %.3f s
throughput    %.1f requests/s
latency ms    min %.2f  mean %.2f  p50 %.2f  p95 %.2f  p99 %.2f  max %.2f
`, r.Target, r.Requests, r.Completed, capNote, r.Concurrency, strings.Join(st, ", "), r.OK, r.Errors, r.Elapsed, r.Throughput,
		r.LatencyMs.Min, r.LatencyMs.Mean, r.LatencyMs.P50, r.LatencyMs.P95, r.LatencyMs.P99, r.LatencyMs.Max)
	if err == nil && r.TransportError != "" {
		_, err = fmt.Fprintf(w, "first error   %s\n", r.TransportError)
	}
	return err
}
