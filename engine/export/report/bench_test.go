package report

import (
	"math"
	"os"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
)

// largest returns the bundled sheet with the most bytes.
func largest(b *testing.B) string {
	best, size := "", int64(-1)
	for _, p := range bundled(b) {
		if fi, err := os.Stat(p); err == nil && fi.Size() > size {
			best, size = p, fi.Size()
		}
	}
	return best
}

// BenchmarkReport renders the report of the largest bundled sheet from its
// results (target: 50 ms). After the loop it checks one known value: the
// steel area of the CHS 273×10 of cft-column.sheaf, π(273² − 253²)/4 mm²
// (common practice: the area of an annulus).
func BenchmarkReport(b *testing.B) {
	path := largest(b)
	s, r := load(b, path)
	var html string
	b.ReportAllocs()
	for b.Loop() {
		html = Render(s, r, testOptions)
	}
	if strings.HasSuffix(path, "cft-column.sheaf") {
		want := units.FormatNumber(math.Pi*(273*273-253*253)/4, 4) + " mm²"
		if !strings.Contains(html, want) {
			b.Fatalf("report of %s lacks the steel area %s", path, want)
		}
	} else if !strings.Contains(html, "Sign-off") {
		b.Fatalf("report of %s is incomplete", path)
	}
}

// BenchmarkRunAndReport includes the evaluation, as sheaf report does.
func BenchmarkRunAndReport(b *testing.B) {
	path := largest(b)
	s, _ := load(b, path)
	var html string
	b.ReportAllocs()
	for b.Loop() {
		html = Render(s, s.Run(nil), testOptions)
	}
	if !strings.Contains(html, "Results must be checked by a qualified engineer") {
		b.Fatal("report lacks the caution")
	}
}
