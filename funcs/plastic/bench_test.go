package plastic

import (
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

func BenchmarkSectionForce(b *testing.B) {
	c := filledTube(b)
	d, _ := funcs.Lookup("section_force")
	args := []funcs.Value{c, -0.0012, nil}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := d.Call(args); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkStrainForForce(b *testing.B) {
	c := filledTube(b)
	d, _ := funcs.Lookup("strain_for_force")
	args := []funcs.Value{c, -2500e3, nil}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := d.Call(args); err != nil {
			b.Fatal(err)
		}
	}
}
