package sheet_test

import (
	"fmt"
	"os"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

func ExampleParse() {
	src := []byte(`title: Hanger rod
P [kN] = 38 kN -- factored load @ drawing S-101
A [mm^2] = pi * (20 mm)^2 / 4
sigma [MPa] = P / A -- axial stress
check stress: sigma <= 355 MPa
`)
	f, errs := sheet.Parse("hanger.sheaf", src)
	if len(errs) > 0 {
		fmt.Println(errs)
		return
	}
	for _, it := range f.Items {
		switch x := it.(type) {
		case *sheet.Cell:
			fmt.Printf("cell %s [%s] = %s at %s\n", x.Name.Name, x.Unit.Text, x.Expr.Text, x.Expr.Range.Start())
		case *sheet.Check:
			fmt.Printf("check %s: %s\n", x.Name.Name, x.Body.Text)
		}
	}
	// Output:
	// cell P [kN] = 38 kN at hanger.sheaf:2:10
	// cell A [mm^2] = pi * (20 mm)^2 / 4 at hanger.sheaf:3:12
	// cell sigma [MPa] = P / A at hanger.sheaf:4:15
	// check stress: sigma <= 355 MPa
}

func ExampleParse_errors() {
	src := []byte("P [kN] := 38 kN\n")
	_, errs := sheet.Parse("slip.sheaf", src)
	_ = diag.Render(os.Stdout, errs, diag.Sources{"slip.sheaf": src})
	// Output:
	// slip.sheaf:1:8: `:=` is not a definition
	//     a cell is defined with `=`
	//    1 | P [kN] := 38 kN
	//      |        ^^
	//     hint: write `=` instead of `:=`
}

func ExampleFormat() {
	src := []byte(`title: Hanger rod
project: Mezzanine walkway
P [kN]=38 kN -- load @ S-101
gamma_M0 = 1.0 -- partial factor
sigma [MPa] = P / A
`)
	f, _ := sheet.Parse("hanger.sheaf", src)
	out, err := sheet.Format(f)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Print(string(out))
	// Output:
	// title:   Hanger rod
	// project: Mezzanine walkway
	// P        [kN]  = 38 kN  -- load @ S-101
	// gamma_M0       = 1.0    -- partial factor
	// sigma    [MPa] = P / A
}
