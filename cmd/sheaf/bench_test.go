package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// BenchmarkLoadLargestSheet loads and checks the largest sheet in sheets/
// (by lines), templates included.
func BenchmarkLoadLargestSheet(b *testing.B) {
	files, _ := filepath.Glob("../../sheets/*.sheaf")
	largest, lines := "", 0
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		if n := strings.Count(string(src), "\n"); n > lines {
			largest, lines = f, n
		}
	}
	b.Logf("%s: %d lines", filepath.Base(largest), lines)
	b.ReportAllocs()
	var s *engine.Sheet
	for b.Loop() {
		var err error
		if s, err = engine.Load(largest); err != nil {
			b.Fatal(err)
		}
	}
	if len(s.Cells()) < 20 {
		b.Fatalf("%d cells", len(s.Cells()))
	}
}
