package deploy

import (
	"fmt"
	"strings"
	"testing"
)

// findings collects what a check found wrong, one sentence each, so that
// the checks run on the real files and, in the tests of the checks, on
// broken examples.
type findings []string

func (f *findings) addf(format string, a ...any) { *f = append(*f, fmt.Sprintf(format, a...)) }

// check records a finding when ok is false.
func (f *findings) check(ok bool, format string, a ...any) {
	if !ok {
		f.addf(format, a...)
	}
}

// reportNone fails t with every finding.
func reportNone(t *testing.T, what string, f findings) {
	t.Helper()
	if len(f) > 0 {
		t.Errorf("%s:\n  %s", what, strings.Join(f, "\n  "))
	}
}

// requireFinding fails t unless some finding contains want.
func requireFinding(t *testing.T, f findings, want string) {
	t.Helper()
	for _, s := range f {
		if strings.Contains(s, want) {
			return
		}
	}
	t.Errorf("no finding contains %q; got:\n  %s", want, strings.Join(f, "\n  "))
}
