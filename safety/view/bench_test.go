package view

import (
	"io"
	"testing"

	"beamledger/safety/safetytest"
)

func benchView(b *testing.B, file string) {
	a, _ := safetytest.EvaluateFile(b, file)
	b.Run("build", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			Build(a)
		}
	})
	d := Build(a)
	b.Run("text", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			if err := WriteText(io.Discard, d); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("json", func(b *testing.B) {
		b.ReportAllocs()
		for i := 0; i < b.N; i++ {
			if err := WriteJSON(io.Discard, d.JSON); err != nil {
				b.Fatal(err)
			}
		}
	})
}

func BenchmarkViewDemo(b *testing.B)     { benchView(b, "../../testdata/examples/table-c.toml") }
func BenchmarkViewLargeLab(b *testing.B) { benchView(b, "../../testdata/scale/lab-2000.toml") }
