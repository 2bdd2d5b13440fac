package engine_test

import (
	"bytes"
	"fmt"
	"runtime"
	"strings"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/engine"
)

// genSheet writes a sheet of chains*length derived cells plus inputs: each
// chain k starts from its own input P_k; cell i of a chain uses the two
// cells before it (fan-in) and the input, with units throughout. Changing
// P_k recomputes exactly the `length` cells of chain k.
func genSheet(chains, length int) string {
	var b strings.Builder
	b.WriteString("title: generated\nA [mm^2] = 314 mm^2\n")
	for k := 0; k < chains; k++ {
		fmt.Fprintf(&b, "P%d [kN] = %d kN\n", k, k+1)
		fmt.Fprintf(&b, "c%d_0 [kN] = P%d * 2 + 1 kN\n", k, k)
		fmt.Fprintf(&b, "c%d_1 [kN] = c%d_0 * 0.5 + P%d / 4\n", k, k, k)
		for i := 2; i < length; i++ {
			if i%10 == 0 {
				fmt.Fprintf(&b, "c%d_%d [kN] = (c%d_%d / A) * 100 mm^2 + P%d / 10\n", k, i, k, i-1, k)
			} else {
				fmt.Fprintf(&b, "c%d_%d [kN] = (c%d_%d + c%d_%d) / 2 + P%d / 10\n", k, i, k, i-1, k, i-2, k)
			}
		}
	}
	return b.String()
}

// plain is the same computation written in Go, the baseline for ns/cell.
func plain(chains, length int, p []float64, out []float64) {
	const A = 314e-6
	for k := 0; k < chains; k++ {
		base := k * length
		P := p[k]
		out[base] = P*2 + 1000
		out[base+1] = out[base]*0.5 + P/4
		for i := 2; i < length; i++ {
			if i%10 == 0 {
				out[base+i] = (out[base+i-1]/A)*100e-6 + P/10
			} else {
				out[base+i] = (out[base+i-1]+out[base+i-2])/2 + P/10
			}
		}
	}
}

const benchChains, benchLen = 100, 1000 // 100,000 derived cells

func BenchmarkLoadCheckEval100k(b *testing.B) {
	src := []byte(genSheet(benchChains, benchLen))
	b.ReportAllocs()
	var st *engine.State
	cost := startCost()
	for b.Loop() {
		// The bytes go to Compile as a caller's file would, without the
		// two copies of the test helper's string argument.
		s, err := engine.Compile("t.sheaf", src, engine.WithMaxBytes(32<<20))
		if err != nil {
			b.Fatal(err)
		}
		st = s.NewState()
		st.Recompute()
	}
	perCell(b, benchChains*benchLen)
	cost.report(b, benchChains*benchLen)
	// The last cell of the first chain against the same formulas in Go.
	p := make([]float64, benchChains)
	for k := range p {
		p[k] = float64(k+1) * 1000
	}
	out := make([]float64, benchChains*benchLen)
	plain(benchChains, benchLen, p, out)
	checkCell(b, st.Eval(), fmt.Sprintf("c0_%d", benchLen-1), out[benchLen-1])
}

// BenchmarkFloorTokenize100k is the floor the load is measured against: a
// plain tokenizer that splits the same file into lines, names and numbers
// and puts every cell name in a map, with no units, no tree and no checks.
func BenchmarkFloorTokenize100k(b *testing.B) {
	src := []byte(genSheet(benchChains, benchLen))
	b.ReportAllocs()
	var names map[string]int
	var tokens int
	cost := startCost()
	for b.Loop() {
		names, tokens = floorTokenize(src)
	}
	perCell(b, benchChains*benchLen)
	cost.report(b, benchChains*benchLen)
	if want := benchChains*(benchLen+1) + 1; len(names) != want || tokens < 10*benchChains*benchLen {
		b.Fatalf("%d names and %d tokens, want %d names", len(names), tokens, want)
	}
}

// floorTokenize returns the line number of every cell name of src and the
// number of tokens (names, numbers, operators) on the right of the `=`.
func floorTokenize(src []byte) (map[string]int, int) {
	names := make(map[string]int, bytes.Count(src, []byte("\n")))
	line, tokens := 0, 0
	word := func(c byte) bool {
		return c == '_' || c == '.' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9'
	}
	for len(src) > 0 {
		end := bytes.IndexByte(src, '\n')
		if end < 0 {
			end = len(src)
		}
		l := src[:end]
		src = src[min(end+1, len(src)):]
		line++
		i := 0
		for i < len(l) && word(l[i]) {
			i++
		}
		eq := bytes.IndexByte(l, '=')
		if i == 0 || eq < 0 {
			continue
		}
		names[string(l[:i])] = line
		for j := eq + 1; j < len(l); {
			switch c := l[j]; {
			case c == ' ':
				j++
			case word(c):
				for j < len(l) && word(l[j]) {
					j++
				}
				tokens++
			default:
				j++
				tokens++
			}
		}
	}
	return names, tokens
}

// perCell reports ns/cell and B/cell of the benchmark.
func perCell(b *testing.B, cells int) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(cells), "ns/cell")
}

// cost is where a benchmark's CPU time and allocation stood before its
// loop. The targets are CPU per op, which on two cores is more
// than the wall time ns/op gives (the collector runs beside the loop), and
// bytes per cell.
type cost struct {
	cpu   time.Duration
	bytes uint64
}

func startCost() cost {
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	return cost{cpu: processCPU(), bytes: m.TotalAlloc}
}

// report adds cpu-ns/op (0 where the platform does not measure it) and
// B/cell for the loop since c.
func (c cost) report(b *testing.B, cells int) {
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	if cpu := processCPU(); cpu > 0 {
		b.ReportMetric(float64((cpu-c.cpu).Nanoseconds())/float64(b.N), "cpu-ns/op")
	}
	b.ReportMetric(float64(m.TotalAlloc-c.bytes)/float64(b.N)/float64(cells), "B/cell")
}

func checkCell(b *testing.B, r *engine.Results, name string, want float64) {
	b.Helper()
	got := r.Cell(name).SI
	if d := got - want; d > 1e-9*want || d < -1e-9*want {
		b.Fatalf("%s = %g, want %g", name, got, want)
	}
}

func BenchmarkEval100k(b *testing.B) {
	s := compile(b, genSheet(benchChains, benchLen))
	st := s.NewState()
	st.Recompute()
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		fresh := s.NewState()
		fresh.Recompute()
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(benchChains*benchLen), "ns/cell")
}

func BenchmarkEvalResults100k(b *testing.B) {
	s := compile(b, genSheet(benchChains, benchLen))
	b.ReportAllocs()
	for b.Loop() {
		s.NewState().Eval()
	}
}

func BenchmarkRecompute1000(b *testing.B) {
	s := compile(b, genSheet(benchChains, benchLen))
	st := s.NewState()
	st.Recompute()
	b.ReportAllocs()
	v := 1000.0
	for b.Loop() {
		v++
		if err := st.Set("P42", v); err != nil {
			b.Fatal(err)
		}
		st.Recompute()
	}
	if n := len(st.LastEvaluated()); n != benchLen+1 {
		b.Fatalf("recomputed %d cells, want %d", n, benchLen+1)
	}
}

// BenchmarkRecomputeWide99k sets A, which every chain reads from its
// tenth cell on, so that a recompute runs most of the sheet (99,001
// cells): the incremental path over a change that reaches everything.
func BenchmarkRecomputeWide99k(b *testing.B) {
	s := compile(b, genSheet(benchChains, benchLen))
	st := s.NewState()
	st.Recompute()
	b.ReportAllocs()
	for b.Loop() {
		if err := st.Set("A", 314e-6); err != nil { // its written value, in SI
			b.Fatal(err)
		}
		st.Recompute()
	}
	const ran = 1 + benchChains*(benchLen-10)
	perCell(b, ran)
	if n := len(st.LastEvaluated()); n != ran {
		b.Fatalf("recomputed %d cells, want %d", n, ran)
	}
	p := make([]float64, benchChains)
	for k := range p {
		p[k] = float64(k+1) * 1000
	}
	out := make([]float64, benchChains*benchLen)
	plain(benchChains, benchLen, p, out)
	checkCell(b, st.Eval(), fmt.Sprintf("c0_%d", benchLen-1), out[benchLen-1])
}

func BenchmarkPlainGo100k(b *testing.B) {
	p := make([]float64, benchChains)
	for k := range p {
		p[k] = float64(k+1) * 1000
	}
	out := make([]float64, benchChains*benchLen)
	for b.Loop() {
		plain(benchChains, benchLen, p, out)
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(benchChains*benchLen), "ns/cell")
}

// TestGeneratedMatchesPlain checks the generated sheet against the Go
// baseline, so the benchmarks compare equal work.
func TestGeneratedMatchesPlain(t *testing.T) {
	const chains, length = 3, 50
	s := compile(t, genSheet(chains, length))
	r := s.Run(nil)
	p := []float64{1000, 2000, 3000}
	out := make([]float64, chains*length)
	plain(chains, length, p, out)
	for k := 0; k < chains; k++ {
		for i := 0; i < length; i++ {
			got := r.Cell(fmt.Sprintf("c%d_%d", k, i)).SI
			want := out[k*length+i]
			if d := got - want; d > 1e-9*want || d < -1e-9*want {
				t.Fatalf("c%d_%d = %g, want %g", k, i, got, want)
			}
		}
	}
}
