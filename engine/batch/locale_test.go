package batch_test

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/batch"
)

// TestSeparatorAndDecimalComma: a table written by a spreadsheet in a
// locale with a decimal comma (`;` between fields, `12,5` for 12.5) is
// detected and read; a field with both marks is refused, not guessed; a
// comma-separated table is read as RFC 4180 says.
func TestSeparatorAndDecimalComma(t *testing.T) {
	s, err := engine.Compile("t.sheaf", []byte("P [kN] = 1 kN\nL [m] = 1 m\nN = P * L\n"))
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, src    string
		sep          rune
		decimalComma bool
		want         []float64 // SI value of P per row; NaN-free rows only
		bad          int
	}{
		{"commas", "P [kN], L [m]\n12.5, 2\n", ',', false, []float64{12500}, 0},
		{"semicolons", "P [kN]; L [m]\n12,5; 2\n3;4,25\n", ';', true, []float64{12500, 3000}, 0},
		{"semicolons, comment first", "# from a spreadsheet\nP [kN];L [m]\n0,5;1\n", ';', true, []float64{500}, 0},
		{"one column, semicolons in rows", "P [kN]\n12,5;\n", ';', true, nil, 1}, // two fields for one column: a bad row
		{"one column, plain", "P [kN]\n12.5\n", ',', false, []float64{12500}, 0},
		{"both marks refused", "P [kN];L [m]\n1.250,5;1\n", ';', true, nil, 1},
		{"quoted comma in a comma table", "P [kN],L [m]\n\"12\",1\n", ',', false, []float64{12000}, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			cs, err := batch.Read("t.csv", []byte(c.src), s)
			if err != nil {
				t.Fatal(err)
			}
			if cs.Sep != c.sep || cs.DecimalComma != c.decimalComma {
				t.Errorf("separator %q, decimal comma %v; want %q, %v", cs.Sep, cs.DecimalComma, c.sep, c.decimalComma)
			}
			if n := len(cs.Bad()); n != c.bad {
				t.Errorf("%d bad rows, want %d: %v", n, c.bad, cs.Bad())
			}
			var got []float64
			for _, r := range cs.Cases {
				if r.Values != nil {
					got = append(got, r.Values[0].(float64))
				}
			}
			if len(got) != len(c.want) {
				t.Fatalf("P = %v, want %v", got, c.want)
			}
			for i := range got {
				if got[i] != c.want[i] {
					t.Errorf("row %d: P = %g N, want %g N", i+1, got[i], c.want[i])
				}
			}
		})
	}
}
