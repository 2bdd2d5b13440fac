package units

import "testing"

var (
	sinkUnit Unit
	sinkDim  Dim
	sinkStr  string
)

func BenchmarkParse(b *testing.B) {
	for _, text := range []string{"kN", "N/mm^2", "kip*ft", "kg*m^-1*s^-2"} {
		b.Run(text, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkUnit, _ = Parse(text)
			}
			if sinkUnit.Symbol != text {
				b.Fatalf("Parse(%q).Symbol = %q", text, sinkUnit.Symbol)
			}
		})
	}
}

// The Dim benchmarks alternate a length and its inverse, so the exponents
// stay in range (a run of products of one length would reach Overflow after
// 63 steps and then time only its early return), and check where they end:
// stress after an even number of steps, stress times (Mul) or over (Div) a
// length after an odd one.
var lengthAndInverse = [2]Dim{dLength, dLength.Inv()}

func BenchmarkDimMul(b *testing.B) {
	b.ReportAllocs()
	d, i := dStress, 0
	for b.Loop() {
		d = d.Mul(lengthAndInverse[i&1])
		i++
	}
	want := dStress
	if i%2 == 1 {
		want = dStress.Mul(dLength)
	}
	if d != want {
		b.Fatalf("after %d steps: %v, want %v", i, d, want)
	}
	sinkDim = d
}

func BenchmarkDimDiv(b *testing.B) {
	b.ReportAllocs()
	d, i := dStress, 0
	for b.Loop() {
		d = d.Div(lengthAndInverse[i&1])
		i++
	}
	want := dStress
	if i%2 == 1 {
		want = dStress.Div(dLength)
	}
	if d != want {
		b.Fatalf("after %d steps: %v, want %v", i, d, want)
	}
	sinkDim = d
}

func BenchmarkDimPow(b *testing.B) {
	b.ReportAllocs()
	var d Dim
	ok := true
	for b.Loop() {
		d, ok = dStress.Pow(3, 2)
	}
	if !ok || d != (Dim{-3, 3, -6, 0, 0, 0, 0, 0}) {
		b.Fatalf("stress^(3/2) = %v, %v", d, ok)
	}
	sinkDim = d
}

func BenchmarkFormat(b *testing.B) {
	mpa, _ := Lookup("MPa")
	b.ReportAllocs()
	for b.Loop() {
		sinkStr = Format(353.677651e6, mpa, 4)
	}
	if sinkStr != "353.7 MPa" {
		b.Fatalf("Format = %q", sinkStr)
	}
}

// TestDimOpsDoNotAllocate guards the inner loop of the checker.
func TestDimOpsDoNotAllocate(t *testing.T) {
	d := dStress
	if n := testing.AllocsPerRun(100, func() {
		d = d.Mul(dLength).Div(dTime).Inv()
		d, _ = d.Pow(2, 1)
		d, _ = d.Sqrt()
		_ = d.Valid()
	}); n != 0 {
		t.Errorf("Dim operations allocate %v times per run", n)
	}
	sinkDim = d
}
