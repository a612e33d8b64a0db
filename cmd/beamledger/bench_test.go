package main

import (
	"io"
	"os"
	"testing"
	"time"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/view"
)

// benchCheck runs what `check` does, minus process start: load, evaluate,
// write the text.
func benchCheck(b *testing.B, file string) {
	data, err := os.ReadFile(file)
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		s, err := setup.Parse(file, data)
		if err != nil {
			b.Fatal(err)
		}
		a, err := safety.Evaluate(s)
		if err != nil {
			b.Fatal(err)
		}
		if err := view.Text(io.Discard, a); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkCheckDemo(b *testing.B)     { benchCheck(b, "../../testdata/examples/table-c.toml") }
func BenchmarkCheckLargeLab(b *testing.B) { benchCheck(b, "../../testdata/scale/lab-2000.toml") }

func BenchmarkReportDemo(b *testing.B) {
	dir := b.TempDir()
	e := &env{stdout: io.Discard, stderr: io.Discard, now: time.Now, getenv: func(string) string { return "" }, interrupts: noInterrupts}
	for i := 0; i < b.N; i++ {
		e.execute([]string{"report", "../../testdata/examples/table-c.toml", "-o", dir + "/r.pdf", "--force", "--date", "2026-01-01"})
	}
}
