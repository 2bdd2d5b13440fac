package units_test

import (
	"fmt"

	"github.com/sheafcalc/sheaf/engine/units"
)

func ExampleParse() {
	u, err := units.Parse("N/mm²")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(u.Symbol, u.Quantity, u.Factor, u.Dim)

	_, err = units.Parse("kn")
	fmt.Println(err)
	// Output:
	// N/mm^2 stress 1e+06 L^-1·M·T^-2
	// unknown unit `kn`; did you mean `kN`?
}

func ExampleFormat() {
	// Axial stress in a 30 mm rod under 250 kN, held in SI (Pa).
	sigma := 250e3 / (3.141592653589793 * 0.015 * 0.015)
	mpa, _ := units.Lookup("MPa")
	fmt.Println(units.Format(sigma, mpa, 3))

	ksi, _ := units.Preferred(mpa.Dim, units.US)
	fmt.Println(units.Format(sigma, ksi, 3))
	// Source: REFERENCES C1 (σ = 353.677651 MPa) and A8 (1 ksi = 6.894757293168361 MPa).

	// Output:
	// 354 MPa
	// 51.3 ksi
}

func ExamplePreferred() {
	d, _ := units.DimOf("flexural rigidity")
	u, ok := units.Preferred(d, units.Metric)
	fmt.Println(u.Symbol, ok)
	// Output:
	// kN*m^2 true
}
