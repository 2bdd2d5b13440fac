package check

import (
	"unicode/utf8"

	"github.com/mtibben/confusables"
)

// confusableNames reports a name that looks like another name of the sheet
// but is not the same (Latin `a` and Cyrillic `а`, Latin `P` and Greek
// `Ρ`): two such cells would show as one in every listing and workbook.
// Names are compared by their skeletons (Unicode Technical Standard #39,
// section 4); a pair is refused only when one of the two holds a character
// outside ASCII, so that `d_1` and `d_l`, which a font tells apart, stay
// allowed. The error is at the second name in reading order.
func (c *checker) confusableNames() {
	cells := c.prog.Cells
	any := false
	for _, cell := range cells {
		if !isASCII(cell.Name) {
			any = true
			break
		}
	}
	if !any {
		return // the common sheet pays one scan of its names
	}
	first := make(map[string]*Cell, len(cells))
	for _, cell := range cells {
		sk := confusables.Skeleton(cell.Name)
		prev, seen := first[sk]
		if !seen {
			first[sk] = cell
			continue
		}
		if isASCII(prev.Name) && isASCII(cell.Name) {
			continue
		}
		c.errs.Errorf(cell.NameRange(), "`"+cell.Name+"` looks the same as `"+prev.Name+"`, defined at "+prev.Pos().String()+", but is written with other characters; a reader cannot tell the two cells apart",
			"rename one of them, in the letters of one script", "`%s` can be mistaken for `%s`", cell.Name, prev.Name)
	}
}

func isASCII(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return false
		}
	}
	return true
}
