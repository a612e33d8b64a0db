package main

import (
	"bytes"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"beamledger/safety"
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

// interruptAfter delivers one interrupt d after the first listener asks.
func interruptAfter(d time.Duration) func() (<-chan os.Signal, func()) {
	return func() (<-chan os.Signal, func()) {
		c := make(chan os.Signal, 1)
		go func() { time.Sleep(d); c <- os.Interrupt }()
		return c, func() {}
	}
}

// A long tolerance analysis is announced with the samples that fit in
// longRun; an interrupt stops check's analysis, whose figures then say
// they are of the samples done; report writes no document of part of its
// analysis.
func TestToleranceRunAnnouncedAndInterrupted(t *testing.T) {
	var errOut bytes.Buffer
	e := &env{stdout: io.Discard, stderr: &errOut, now: time.Now, getenv: func(string) string { return "" }, interrupts: noInterrupts}
	opts := safety.Options{Samples: 1000}
	done, _ := e.tolerancesRun(&opts)
	opts.Estimate(30 * time.Second)
	done()
	if got := errOut.String(); !strings.Contains(got, "1000 samples will take about 30s in all; --samples 300 takes about 10s") {
		t.Errorf("announcement %q", got)
	}
	var out bytes.Buffer
	e = &env{stdout: &out, stderr: io.Discard, now: time.Now, getenv: func(string) string { return "" }, interrupts: interruptAfter(200 * time.Millisecond)}
	if code := e.execute([]string{"check", "../../testdata/examples/weak-probe.toml", "--samples", "1000000"}); code == exitBadInput || !strings.Contains(out.String(), "tolerance analysis interrupted after") {
		t.Errorf("check: exit %d, %.400s", code, out.String())
	}
	pdf := filepath.Join(t.TempDir(), "w.pdf")
	e = &env{stdout: io.Discard, stderr: io.Discard, now: time.Now, getenv: func(string) string { return "" }, interrupts: interruptAfter(200 * time.Millisecond)}
	if code := e.execute([]string{"report", "../../testdata/examples/weak-probe.toml", "--samples", "1000000", "-o", pdf}); code != exitBadInput {
		t.Errorf("report interrupted: exit %d", code)
	}
	if _, err := os.Stat(pdf); err == nil {
		t.Error("report wrote a document of part of its analysis")
	}
}
