package main

import (
	"strings"
	"testing"
	"time"
)

// The progress line waits a second, then writes over itself, and erases
// itself at the end; a run that ends sooner writes nothing. Standard error
// that is not a terminal gets no progress (the test's buffer is not).
func TestProgressLine(t *testing.T) {
	var b strings.Builder
	p := progressLine(&b, time.Now())
	p(10, 100)
	p(100, 100)
	if b.String() != "" {
		t.Errorf("a short run wrote %q", b.String())
	}
	p = progressLine(&b, time.Now().Add(-2*time.Second))
	p(10, 100)
	p(100, 100)
	if got := b.String(); !strings.HasPrefix(got, "\rtolerance analysis: 10 of 100 samples") || !strings.HasSuffix(got, "\r") {
		t.Errorf("progress %q", got)
	}
	e := &env{stderr: &b}
	if e.progress() != nil {
		t.Error("progress on a writer that is not a terminal")
	}
}
