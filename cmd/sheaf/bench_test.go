package main

import (
	"math"
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

// BenchmarkCanopyCombinations evaluates the combinations of the bundled
// sheet with actions (4 combinations; the bar solver runs in each).
func BenchmarkCanopyCombinations(b *testing.B) {
	s, err := engine.Load("../../sheets/canopy-hanger.sheaf")
	if err != nil {
		b.Fatal(err)
	}
	st := s.NewState()
	n := len(s.Combos().All)
	b.ReportAllocs()
	for b.Loop() {
		_ = st.Set("q_k", 1200.0)
		st.Recompute()
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n)/1e3, "µs/combination")
	// Source: σ = (1.35 G + 1.5 S + 1.35 γ A L)/A at the truss, with G =
	// 1.1 kPa × 6.75 m², S = 1.2 kPa × 6.75 m², γ = 77 kN/m³, A = π·16²/4
	// mm², L = 11.5 m (REFERENCES D7 for the factors; the sheet's hand check).
	A := math.Pi * 0.016 * 0.016 / 4
	sigma := (1.35*1100*6.75 + 1.5*1200*6.75 + 1.35*77e3*A*11.5) / A
	u, ok := st.Number(s.Lookup("stress"))
	if want := sigma / 355e6; !ok || math.Abs(u-want) > 1e-9*want {
		b.Fatalf("stress utilisation %g, want %g", u, want)
	}
}
