package batch_test

import (
	"context"
	"fmt"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/batch"
)

// sheet50 is a 50-cell sheet: 8 inputs, 40 derived cells in chains that
// mix the inputs, and 2 checks. It stands for a member sheet of ordinary
// size.
func sheet50() string {
	var b strings.Builder
	b.WriteString("title: fifty cells\n")
	b.WriteString("P [kN] = 30 kN\nd [mm] = 20 mm\nL [m] = 3 m\nf_y [MPa] = 355 MPa\nE [GPa] = 210 GPa\n")
	b.WriteString("gamma = 1.1\nk = 0.9\nu_lim [mm] = 10 mm\n")
	b.WriteString("A [mm^2] = pi * d^2 / 4\nN_Rd [kN] = k * A * f_y / gamma\nu [mm] = P * L / (E * A)\n")
	for i := 0; i < 37; i++ {
		prev := "N_Rd"
		if i > 0 {
			prev = fmt.Sprintf("x%d", i-1)
		}
		fmt.Fprintf(&b, "x%d [kN] = %s * 0.99 + P / %d\n", i, prev, i+2)
	}
	b.WriteString("check strength: P <= N_Rd\ncheck stiffness: u <= u_lim\n")
	return b.String()
}

// cases writes n cases varying P every row, d every 10 rows, L every 100.
func cases(n int) []byte {
	var b strings.Builder
	b.WriteString("P [kN], d [mm], L [m]\n")
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "%d, %d, %g\n", 10+i%90, 12+2*(i/10%8), 2+float64(i/100%10)*0.5)
	}
	return []byte(b.String())
}

func bench(b *testing.B, n int, read bool) {
	s, err := engine.Compile("fifty.sheaf", []byte(sheet50()))
	if err != nil {
		b.Fatal(err)
	}
	if got := len(s.Cells()); got != 50 {
		b.Fatalf("%d cells, want 50", got)
	}
	src := cases(n)
	cs, err := batch.Read("cases.csv", src, s)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if read {
			if cs, err = batch.Read("cases.csv", src, s); err != nil {
				b.Fatal(err)
			}
		}
		out, err := batch.Run(context.Background(), s, cs, batch.Options{})
		if err != nil {
			b.Fatal(err)
		}
		if len(out.Rows) != n {
			b.Fatal("rows lost")
		}
	}
	b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "cases/s")
}

// BenchmarkRun100k evaluates 100,000 cases of a 50-cell sheet (the target
// is under 2 s on two cores).
func BenchmarkRun100k(b *testing.B) { bench(b, 100_000, false) }

// BenchmarkReadRun100k adds reading the CSV table, as the command does.
func BenchmarkReadRun100k(b *testing.B) { bench(b, 100_000, true) }
