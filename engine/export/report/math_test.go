package report

import (
	"strings"
	"testing"
)

// TestSymbol checks the typesetting of names: Greek letters from their
// names and subscripts from "_" (common practice, ISO 80000-2 for upright
// descriptive subscripts).
func TestSymbol(t *testing.T) {
	tests := []struct{ name, want string }{
		{"sigma_Ed", `<msub><mi>σ</mi><mrow><mi mathvariant="normal">Ed</mi></mrow></msub>`},
		{"gamma_M0", `<msub><mi>γ</mi><mrow><mi mathvariant="normal">M0</mi></mrow></msub>`},
		{"x_sigma_max", `<msub><mi>x</mi><mrow><mi mathvariant="normal">σ,max</mi></mrow></msub>`},
		{"lambda_bar", `<mover accent="true"><mi>λ</mi><mo>¯</mo></mover>`},
		{"d", `<mi>d</mi>`},
		{"EI_eff", `<msub><mi mathvariant="normal">EI</mi><mrow><mi mathvariant="normal">eff</mi></mrow></msub>`},
		{"share_a", `<mi mathvariant="normal">share_a</mi>`},
		{"access.N_Ed", `<mrow><mtext>access.</mtext><msub><mi>N</mi><mrow><mi mathvariant="normal">Ed</mi></mrow></msub></mrow>`},
		{"a<b", `<mi mathvariant="normal">a&lt;b</mi>`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var b strings.Builder
			symbol(&b, tt.name)
			if b.String() != tt.want {
				t.Errorf("symbol(%q) =\n%s\nwant\n%s", tt.name, b.String(), tt.want)
			}
		})
	}
}

// TestFormulas typesets formulas of a small sheet and looks for the
// structure a reader expects: fractions, powers, roots, brackets only
// where the order of operations needs them, and values substituted.
func TestFormulas(t *testing.T) {
	s, r := compile(t, "f.sheaf", `
d     [mm]   = 16 mm
N_Ed  [kN]   = 17.2 kN
A     [mm^2] = pi * d^2 / 4
sigma [MPa]  = N_Ed / A
r     [mm]   = sqrt(A / pi)
k            = (1 + 2) * 3 - (4 - 5)
check yield: sigma <= 240 MPa
`)
	html := Render(s, r, testOptions)
	for _, want := range []string{
		`<mfrac><mrow><mrow><mi>π</mi><mo>·</mo><msup><mi>d</mi><mrow><mn>2</mn></mrow></msup></mrow></mrow><mrow><mn>4</mn></mrow></mfrac>`,
		`<msqrt><mfrac>`,
		`<mrow><mrow><mo>(</mo><mrow><mn>1</mn><mo>+</mo><mn>2</mn></mrow><mo>)</mo></mrow><mo>·</mo><mn>3</mn></mrow><mo>−</mo><mrow><mo>(</mo>`,
		`<mn>17.2</mn><mspace width="0.2em"/><mi mathvariant="normal" class="u">kN</mi>`, // N_Ed substituted in σ
		`<mn>201.1</mn><mspace width="0.2em"/><mi mathvariant="normal" class="u">mm²</mi>`,
		`<mo>≤</mo>`,
		// a substituted value raised to a power keeps its brackets: (16 mm)², not 16 mm²
		`<msup><mrow><mo>(</mo><mrow><mn>16</mn><mspace width="0.2em"/><mi mathvariant="normal" class="u">mm</mi></mrow><mo>)</mo></mrow>`,
	} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks\n%s", want)
		}
	}
}
