package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"sync/atomic"
	"time"

	"beamledger/safety"
)

// progressAfter is how long a tolerance analysis runs before its progress
// is shown.
const progressAfter = time.Second

// progress is the tolerance analysis's progress line on standard error,
// when standard error is a terminal (nil otherwise: nothing is written to
// a file or a pipe). It shows after progressAfter and is erased at the
// end.
func (e *env) progress() func(done, total int) {
	f, ok := e.stderr.(*os.File)
	if !ok {
		return nil
	}
	if fi, err := f.Stat(); err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		return nil
	}
	return progressLine(f, time.Now())
}

// progressLine writes "tolerance analysis: n of total samples" over itself
// on w, from progressAfter after start, and erases it when all are done.
func progressLine(w io.Writer, start time.Time) func(done, total int) {
	shown := 0
	return func(done, total int) {
		if done >= total {
			if shown > 0 {
				fmt.Fprintf(w, "\r%s\r", strings.Repeat(" ", shown))
			}
			return
		}
		if time.Since(start) < progressAfter {
			return
		}
		msg := fmt.Sprintf("\rtolerance analysis: %d of %d samples", done, total)
		shown = max(shown, len(msg))
		fmt.Fprint(w, msg)
	}
}

// longRun is how long a tolerance analysis may be expected to take before
// it is announced on standard error with a shorter --samples.
const longRun = 10 * time.Second

// tolerancesRun sets the tolerance analysis's progress line, its
// announcement when it will take longer than longRun, and its stop on an
// interrupt (SIGINT, SIGTERM): the samples done are then reported as such.
// The returned func ends the listening for the interrupt; interrupted says
// whether one came.
func (e *env) tolerancesRun(opts *safety.Options) (done func(), interrupted func() bool) {
	opts.Progress = e.progress()
	opts.Estimate = func(d time.Duration) {
		if d <= longRun || opts.Samples <= 0 {
			return
		}
		fit := max(100, int(float64(opts.Samples)*float64(longRun)/float64(d))/100*100)
		fmt.Fprintf(e.stderr, "\rbeamledger: the tolerance analysis of %d samples will take about %s in all; --samples %d takes about %s; Ctrl-C stops it and reports the samples done\n",
			opts.Samples, d.Round(time.Second), fit, longRun)
	}
	stop := make(chan struct{})
	opts.Stop = stop
	sig, unlisten := e.interrupts()
	var got atomic.Bool
	quit := make(chan struct{})
	go func() {
		select {
		case <-sig:
			got.Store(true)
			close(stop)
		case <-quit:
		}
	}()
	return func() { close(quit); unlisten() }, got.Load
}
