package xlsxout

import (
	"testing"

	"github.com/xuri/excelize/v2"
)

func TestWrappedLines(t *testing.T) {
	// The rule is ours (common practice: a row must be tall enough to show
	// its wrapped text); the cases pin its arithmetic.
	tests := []struct {
		name  string
		text  string
		chars float64
		want  int
	}{
		{"fits", "1.2 m", 10, 1},
		{"exactly full", "0123456789", 10, 1},
		{"one over", "0123456789a", 10, 2},
		{"line breaks", "a\nb\nc", 10, 3},
		{"long and broken", "0123456789012\nab", 10, 3},
		{"multi-byte counts runes", "σσσσσσσσσσ", 10, 1},
		{"narrow column", "abc", 0.5, 3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := wrappedLines(tt.text, tt.chars); got != tt.want {
				t.Errorf("wrappedLines(%q, %g) = %d, want %d", tt.text, tt.chars, got, tt.want)
			}
		})
	}
}

func TestRowHeight(t *testing.T) {
	long := "gamma_G * (g_k * A_trib + G_rod) + gamma_Q * q_k * A_trib"
	cells := []excelize.Cell{{Value: "N_Ed"}, {Value: 17.2}, {Value: long}}
	widths := []float64{10, 10, 20}
	// The long text has 58 characters: 21 fit a line at 1.05 per unit of
	// width, 16 at 0.8 in the monospaced font.
	if got, want := rowHeight(cells, widths, nil), 3*lineHeight; got != want {
		t.Errorf("proportional: height %g, want %g", got, want)
	}
	if got, want := rowHeight(cells, widths, []bool{2: true}), 4*lineHeight; got != want {
		t.Errorf("monospaced: height %g, want %g", got, want)
	}
	if got := rowHeight([]excelize.Cell{{Value: 3.0}}, widths, nil); got != lineHeight {
		t.Errorf("numbers only: height %g, want one line", got)
	}
}
