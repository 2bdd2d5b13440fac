package engine_test

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// BenchmarkLoad2000With20Templates loads and checks a generated project:
// 20 template files of 50 cells each (a rod: loads, area, stress, stretch,
// a check), used once each by a sheet of 1,000 cells of its own that reads
// their results, 2,000 cells in all.
func BenchmarkLoad2000With20Templates(b *testing.B) {
	dir := b.TempDir()
	var main strings.Builder
	main.WriteString("title: generated project\n")
	for k := 0; k < 20; k++ {
		var t strings.Builder
		t.WriteString("title: rod template\nP [kN] = 10 kN\nd [mm] = 16 mm\nE [GPa] = 210 GPa\nL [m] = 2.4 m\nA [mm^2] = pi * d^2 / 4\n")
		for i := 0; i < 43; i++ {
			fmt.Fprintf(&t, "s%d [MPa] = P * %d / A + %d MPa  -- stress step %d\n", i, i+1, i, i)
		}
		t.WriteString("delta [mm] = P * L / (E * A)\ncheck yield: s42 <= 3000 MPa\n")
		name := fmt.Sprintf("rod%02d.sheaf", k)
		if err := os.WriteFile(filepath.Join(dir, name), []byte(t.String()), 0o644); err != nil {
			b.Fatal(err)
		}
		fmt.Fprintf(&main, "use r%d from %q\n    P = %d kN\n", k, name, k+1)
	}
	for i := 0; i < 1000; i++ {
		fmt.Fprintf(&main, "x%d [mm] = r%d.delta * %d + %d mm\n", i, i%20, i%7+1, i%3)
	}
	path := filepath.Join(dir, "project.sheaf")
	if err := os.WriteFile(path, []byte(main.String()), 0o644); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	var s *engine.Sheet
	for b.Loop() {
		var err error
		if s, err = engine.Load(path); err != nil {
			b.Fatal(err)
		}
	}
	if n := len(s.Cells()); n != 2000 {
		b.Fatalf("%d cells, want 2000", n)
	}
	// Source: prismatic bar δ = PL/(EA) (common practice), r0 with P = 1 kN.
	A := 3.141592653589793 * 0.016 * 0.016 / 4
	want := 1000 * 2.4 / (210e9 * A)
	checkCell(b, s.NewState().Eval(), "r0.delta", want)
}
