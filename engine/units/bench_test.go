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
		})
	}
}

func BenchmarkDimMul(b *testing.B) {
	b.ReportAllocs()
	d := dStress
	for b.Loop() {
		d = d.Mul(dLength)
	}
	sinkDim = d
}

func BenchmarkDimDiv(b *testing.B) {
	b.ReportAllocs()
	d := dStress
	for b.Loop() {
		d = d.Div(dLength)
	}
	sinkDim = d
}

func BenchmarkFormat(b *testing.B) {
	mpa, _ := Lookup("MPa")
	b.ReportAllocs()
	for b.Loop() {
		sinkStr = Format(353.677651e6, mpa, 4)
	}
}

// TestDimOpsDoNotAllocate guards the inner loop of the checker.
func TestDimOpsDoNotAllocate(t *testing.T) {
	d := dStress
	if n := testing.AllocsPerRun(100, func() {
		d = d.Mul(dLength).Div(dTime).Inv()
		d, _ = d.Pow(2, 1)
		d, _ = d.Sqrt()
	}); n != 0 {
		t.Errorf("Dim operations allocate %v times per run", n)
	}
	sinkDim = d
}
