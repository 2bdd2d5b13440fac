package formula

import (
	"fmt"
	"testing"
)

// BenchmarkParse parses formulas of the kinds a sheet holds: arithmetic on
// names and quantities, calls, fields and a choice.
func BenchmarkParse(b *testing.B) {
	var exprs []string
	for i := range 1000 {
		switch i % 4 {
		case 0:
			exprs = append(exprs, fmt.Sprintf("(c%d + c%d) / 2 + P / 10", i, i+1))
		case 1:
			exprs = append(exprs, fmt.Sprintf("0.9 * A_s%d * f_ub / gamma_M2 + 38 kN", i))
		case 2:
			exprs = append(exprs, fmt.Sprintf("max(N_Ed%d / N_Rd, sqrt(M^2 + V^2) / (1 kN*m))", i))
		default:
			exprs = append(exprs, fmt.Sprintf("lambda%d <= 0.2 ? 1 : chi.y * mat.E / (L[%d] * 1 m)", i, i%3))
		}
	}
	src := make([]Formula, len(exprs))
	for i, s := range exprs {
		e := expr(s)
		src[i].Source = &e
	}
	var arena Arena
	nodes := 0
	b.ReportAllocs()
	for b.Loop() {
		nodes = 0
		for i := range src {
			if ok, errs := src[i].ParseSource(Options{Arena: &arena}); !ok || errs.HasErrors() {
				b.Fatalf("%s: %v", exprs[i], errs)
			}
			nodes += len(src[i].Nodes)
		}
	}
	// Nodes of the four kinds, counted by hand from the grammar (brackets
	// and callee names are nodes; `1 kN*m` is one quantity).
	if want := 250 * (10 + 9 + 17 + 19); nodes != want {
		b.Fatalf("%d nodes, want %d", nodes, want)
	}
}
