package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"time"
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
