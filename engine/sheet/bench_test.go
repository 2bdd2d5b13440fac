package sheet

import (
	"fmt"
	"strings"
	"testing"
)

// generatedSheet writes a sheet of n cells in the shapes a long calculation
// has: inputs with units and annotations, chains (each cell uses the one
// before), fan-in (a cell summing several earlier ones), a heading every
// 1000 cells and a continued expression now and then.
func generatedSheet(n int) []byte {
	var b strings.Builder
	b.WriteString("title: Generated sheet\nunits: metric\n")
	for i := 0; i < n; i++ {
		switch {
		case i%1000 == 0:
			fmt.Fprintf(&b, "\n## Block %d\nc%d [kN] = %d.5 kN -- input load %d @ schedule row %d\n", i/1000, i, i%97, i, i)
		case i%10 == 5:
			fmt.Fprintf(&b, "c%d [kN] = c%d + c%d +\n    c%d -- fan-in\n", i, i-1, i-2, i-3)
		default:
			fmt.Fprintf(&b, "c%d [kN] = 1.05 * c%d + 0.2 kN\n", i, i-1)
		}
	}
	return []byte(b.String())
}

// BenchmarkParse100k parses a generated 100,000-cell sheet.
func BenchmarkParse100k(b *testing.B) {
	src := generatedSheet(100_000)
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	for b.Loop() {
		f, errs := Parse("gen.sheaf", src)
		if len(errs) > 0 || len(f.Items) < 100_000 {
			b.Fatalf("%d items, errors: %v", len(f.Items), errs)
		}
	}
}

// BenchmarkFormat100k prints the same sheet in canonical layout.
func BenchmarkFormat100k(b *testing.B) {
	f, errs := Parse("gen.sheaf", generatedSheet(100_000))
	if len(errs) > 0 {
		b.Fatal(errs)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Format(f); err != nil {
			b.Fatal(err)
		}
	}
}
