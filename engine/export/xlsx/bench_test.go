package xlsxout

import (
	"fmt"
	"io"
	"strings"
	"testing"
)

// genSheet writes a sheet of n cells: inputs every tenth cell, the rest
// derived from the two cells before them, with units, sections and
// descriptions, as a long calculation would have.
func genSheet(n int) string {
	var b strings.Builder
	b.WriteString("title: generated\nproject: benchmark (own scenario)\n")
	for i := 0; i < n; i++ {
		if i%100 == 0 {
			fmt.Fprintf(&b, "## Part %d\n", i/100)
		}
		switch {
		case i%10 == 0:
			fmt.Fprintf(&b, "P%d [kN] = %d kN -- load %d\n", i, i%97+1, i)
		case i%10 == 1:
			fmt.Fprintf(&b, "c%d [kN] = P%d * 1.5 + 2 kN -- factored load @ own rule\n", i, i-1)
		default:
			prev := fmt.Sprintf("c%d", i-1)
			fmt.Fprintf(&b, "c%d [kN] = (%s + P%d) / 2 + sqrt(%s * 1 kN) -- step %d\n", i, prev, i-i%10, prev, i)
		}
	}
	return b.String()
}

// BenchmarkExport10k builds and serialises the workbook of a 10,000-cell
// sheet, far beyond the bundled sheets (the largest has 115 lines). Its
// time is dominated by excelize's SetDefinedName, which compares each new
// name with all before it: about 2.7 s here since the shortcut into
// excelize's internals was removed (0.3 s with it); at 2,000 cells the
// difference is about 15 ms (BenchmarkExport2k).
func BenchmarkExport10k(b *testing.B) {
	s := compile(b, "gen.sheaf", genSheet(10000))
	r := s.NewState().Eval()
	b.ReportAllocs()
	for b.Loop() {
		f, st, err := Build(s, r, Options{})
		if err != nil {
			b.Fatal(err)
		}
		if st.Live != 9000 {
			b.Fatalf("live %d", st.Live)
		}
		if _, err := f.WriteTo(io.Discard); err != nil {
			b.Fatal(err)
		}
		_ = f.Close()
	}
}

// BenchmarkExport2k is the same at a realistic size for a large
// calculation: 2,000 cells.
func BenchmarkExport2k(b *testing.B) {
	s := compile(b, "gen.sheaf", genSheet(2000))
	r := s.NewState().Eval()
	b.ReportAllocs()
	for b.Loop() {
		f, st, err := Build(s, r, Options{})
		if err != nil {
			b.Fatal(err)
		}
		if st.Live != 1800 {
			b.Fatalf("live %d", st.Live)
		}
		if _, err := f.WriteTo(io.Discard); err != nil {
			b.Fatal(err)
		}
		_ = f.Close()
	}
}

// TestGeneratedSheet keeps the benchmark honest: its formulas compute
// what Sheaf does.
func TestGeneratedSheet(t *testing.T) {
	s := compile(t, "gen.sheaf", genSheet(60))
	r := s.NewState().Eval()
	if n := compareFormulas(t, build(t, s, r), s, r, "generated"); n != 54 {
		t.Errorf("compared %d formulas, want 54", n)
	}
}
