package xlsxout

import (
	"errors"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestRefusesActions: a workbook of a sheet with actions would combine the
// characteristic values in its live formulas as written, not in each
// combination, so Build and WriteFile refuse it with ErrActions and write
// no file; the same loads without actions (combined by hand) export.
func TestRefusesActions(t *testing.T) {
	tests := []struct {
		name, src string
		refused   bool
	}{
		{"actions", `combinations: EN 1990 6.10
action permanent G [kN] = 10 kN
action imposed B Q [kN] = 5 kN
N_Ed [kN] = G + Q
check tension: N_Ed <= 100 kN
`, true},
		{"by hand", `G_k [kN] = 10 kN
Q_k [kN] = 5 kN
N_Ed [kN] = 1.35 * G_k + 1.5 * Q_k
check tension: N_Ed <= 100 kN
`, false},
	}
	dir := t.TempDir()
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := engine.Compile(tt.name+".sheaf", []byte(tt.src))
			if err != nil {
				t.Fatal(err)
			}
			r := s.Run(nil)
			_, _, berr := Build(s, r, Options{Generator: "Sheaf test"})
			out := filepath.Join(dir, tt.name+".xlsx")
			_, werr := WriteFile(out, s, r, Options{Generator: "Sheaf test"})
			_, statErr := os.Stat(out)
			if tt.refused {
				if !errors.Is(berr, ErrActions) || !errors.Is(werr, ErrActions) || statErr == nil {
					t.Errorf("a sheet with actions: Build %v, WriteFile %v, file written %v", berr, werr, statErr == nil)
				}
				return
			}
			if berr != nil || werr != nil || statErr != nil {
				t.Errorf("a sheet without actions: Build %v, WriteFile %v, %v", berr, werr, statErr)
			}
		})
	}
}
