package xlsxout

import (
	"math"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// Row heights. Spreadsheet programs do not agree on growing a row to fit
// wrapped text when they open a file (some keep the default height and the
// lines spill over the rows below), so each row gets an explicit height
// from an estimate of its wrapped lines.
const (
	lineHeight = 15.0 // points per line of the default 11-point font
	// charsPerWidth is how many characters of proportional text fit in one
	// unit of column width (the width of a "0"); a little under what fits,
	// so the estimate errs towards a row too tall rather than text cut off.
	charsPerWidth = 1.05
	// monoPerWidth is the same for the monospaced font of expressions,
	// whose characters are wider than a "0" of the body font.
	monoPerWidth = 0.8
)

// rowHeight returns the height in points that shows every text cell of a
// row whole, given the column widths and which columns are monospaced.
func rowHeight(cells []excelize.Cell, widths []float64, mono []bool) float64 {
	lines := 1
	for i, c := range cells {
		text, ok := c.Value.(string)
		if !ok || text == "" || i >= len(widths) {
			continue
		}
		per := charsPerWidth
		if i < len(mono) && mono[i] {
			per = monoPerWidth
		}
		lines = max(lines, wrappedLines(text, widths[i]*per))
	}
	// A row may be at most excelize.MaxRowHeight (409 points, the limit of
	// the format) tall: a longer text is cut off on screen and on paper,
	// but it stays whole in its cell, and the export never fails over it.
	return min(float64(lines)*lineHeight, excelize.MaxRowHeight)
}

// wrappedLines estimates the lines text takes in a column that holds chars
// characters a line: each line break starts a line, and a long line wraps.
func wrappedLines(text string, chars float64) int {
	fit := max(1, int(math.Floor(chars)))
	n := 0
	for line := range strings.SplitSeq(text, "\n") {
		n += max(1, (utf8.RuneCountInString(line)+fit-1)/fit)
	}
	return n
}
