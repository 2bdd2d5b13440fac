package xlsxout

import (
	"math"
	"strings"

	"github.com/xuri/excelize/v2"
)

// class is the role of a cell, which sets its look and protection. The
// colours are ours: a warm pale fill says "you may type here", a grey
// italic says "Sheaf computed this; the workbook cannot".
type class uint8

const (
	clsText      class = iota // wrapped text, locked
	clsTitle                  // the title of the sheet
	clsHeading                // a section heading
	clsHeader                 // column headers
	clsKey                    // a label in the header block
	clsExpr                   // an expression as written
	clsInput                  // an input value: editable, unlocked
	clsDerived                // a live formula: locked
	clsValueOnly              // a value only Sheaf computes: locked, marked
	clsData                   // a number of a computed table
	clsPass                   // verdict: passes
	clsFail                   // verdict: fails or not assessed
	clsCaution                // the caution paragraph
	clsBanner                 // the out-of-date banner of the summary
	clsVerdict                // a live verdict: coloured by conditional formatting
	clsSign                   // a blank of the sign-off block: unlocked, underlined
	clsMono                   // a checksum: monospaced
	clsComment                // a comment of the sheet on the Calculation tab
	clsCount                  // the number of classes
)

// Fill colours by class (also read back by the tests).
const (
	fillInput     = "FFF2CC"
	fillValueOnly = "EDEDED"
	fillHeader    = "D9E2EC"
	fontMarked    = "595959"
	colPass       = "2E7D32"
	colFail       = "C00000"
	fillFail      = "FBE3E3"
	colStale      = "7A4A00"
	fillStale     = "FFD9A0"
)

// staleStyle marks a value that is out of date (conditional formatting).
var staleStyle = excelize.Style{Font: &excelize.Font{Bold: true, Color: colStale},
	Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillStale}}}

type styleKey struct {
	cls class
	fmt string
}

// styles creates each (class, number format) style once.
type styles struct {
	f     *excelize.File
	cache map[styleKey]int
	err   error
	// plain holds 1 + the style of each class without a number format,
	// so that the text cells of a row, most of the cells written, skip
	// the map.
	plain [clsCount]int
}

func (s *styles) id(c class, numFmt string) int {
	if numFmt == "" && c < clsCount {
		if id := s.plain[c]; id > 0 {
			return id - 1
		}
		id := s.make(c, numFmt)
		s.plain[c] = id + 1
		return id
	}
	return s.make(c, numFmt)
}

// make returns the style of class c with number format numFmt, creating
// it the first time.
func (s *styles) make(c class, numFmt string) int {
	k := styleKey{c, numFmt}
	if id, ok := s.cache[k]; ok {
		return id
	}
	st := &excelize.Style{Alignment: &excelize.Alignment{Vertical: "top"}}
	locked := true
	switch c {
	case clsText, clsCaution:
		st.Alignment.WrapText = true
	case clsTitle:
		st.Font = &excelize.Font{Bold: true, Size: 14}
	case clsHeading:
		st.Font = &excelize.Font{Bold: true, Size: 11}
		st.Border = []excelize.Border{{Type: "bottom", Color: "1F3864", Style: 1}}
	case clsHeader:
		st.Font = &excelize.Font{Bold: true}
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillHeader}}
		st.Alignment.WrapText = true
	case clsKey:
		st.Font = &excelize.Font{Bold: true}
	case clsExpr:
		st.Font = &excelize.Font{Family: "Consolas"}
		st.Alignment.WrapText = true
	case clsInput:
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillInput}}
		st.Font = &excelize.Font{Color: "1F3864"}
		st.Border = []excelize.Border{{Type: "bottom", Color: "BF9000", Style: 1}}
		locked = false
	case clsValueOnly:
		st.Fill = excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{fillValueOnly}}
		st.Font = &excelize.Font{Italic: true, Color: fontMarked}
	case clsPass:
		st.Font = &excelize.Font{Bold: true, Color: "2E7D32"}
	case clsFail:
		st.Font = &excelize.Font{Bold: true, Color: "C00000"}
	case clsSign:
		st.Border = []excelize.Border{{Type: "bottom", Color: "7F7F7F", Style: 1}}
		locked = false
	case clsMono:
		st.Font = &excelize.Font{Family: "Consolas", Size: 9}
	case clsComment:
		// Monospaced, as written: hand checks in comments are aligned.
		st.Font = &excelize.Font{Family: "Consolas", Size: 10, Color: "1F3864"}
		st.Alignment.WrapText = true
	case clsVerdict:
		st.Font = &excelize.Font{Bold: true}
	case clsBanner:
		st.Font = &excelize.Font{Bold: true, Color: "C00000"}
		st.Alignment.WrapText = true
	}
	if c == clsCaution {
		st.Font = &excelize.Font{Italic: true}
	}
	st.Protection = &excelize.Protection{Locked: locked}
	if numFmt != "" {
		nf := numFmt
		st.CustomNumFmt = &nf
	}
	id, err := s.f.NewStyle(st)
	if err != nil && s.err == nil {
		s.err = err
	}
	s.cache[k] = id
	return id
}

// numFormat is the number format that shows x with sig significant
// figures: fixed decimals for ordinary magnitudes, scientific outside
// [1e-4, 1e9) as Sheaf's listings do.
func numFormat(x float64, sig int) string {
	ax := math.Abs(x)
	if ax == 0 || math.IsNaN(ax) || math.IsInf(ax, 0) {
		return "0"
	}
	e := int(math.Floor(math.Log10(ax)))
	if e < -4 || e >= 9 {
		d := max(sig-1, 0)
		if d < len(sciFormats) {
			return sciFormats[d]
		}
		return "0." + strings.Repeat("0", d) + "E+00"
	}
	return fixedFormats[min(max(sig-1-e, 0), 10)]
}

// Number formats by count of decimals, made once: numFormat runs for
// every number written. Fixed: 0, 0.0, 0.00, ...; scientific: 0.E+00,
// 0.0E+00, ... (with sig 1 the point stays, as it always has).
var (
	fixedFormats = decimalFormats(10, "")
	sciFormats   = decimalFormats(15, "E+00")
)

func decimalFormats(n int, suffix string) []string {
	out := make([]string, n+1)
	for d := range out {
		out[d] = "0." + strings.Repeat("0", d) + suffix
	}
	if suffix == "" {
		out[0] = "0"
	}
	return out
}

// generalFormat shows a number as typed, at the precision it is written
// with ("1.2", "0.9775"), and never hides a digit a client types.
const generalFormat = "General"
