package check

import "testing"

// TestIsReserved: the item keywords of the sheet grammar (SPEC.md, the
// reserved words), `action` and `factor` of sheets with actions among them,
// the word operators, constants and built-ins cannot name a cell; other
// names can.
func TestIsReserved(t *testing.T) {
	tests := []struct {
		name string
		want bool
	}{
		{"check", true}, {"table", true}, {"use", true}, {"from", true},
		{"action", true}, {"factor", true},
		{"in", true}, {"and", true}, {"true", true}, {"pi", true}, {"sqrt", true},
		{"actions", false}, {"factor_G", false}, {"N_Ed", false}, {"G", false},
	}
	for _, tt := range tests {
		if got := IsReserved(tt.name); got != tt.want {
			t.Errorf("IsReserved(%q) = %v, want %v", tt.name, got, tt.want)
		}
	}
}
