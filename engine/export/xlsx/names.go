package xlsxout

import (
	"strconv"
	"strings"
	"unicode"
)

// maxNameLen is the longest defined name a spreadsheet accepts (characters).
const maxNameLen = 255

// DefinedName returns the workbook name for the sheet name n, before
// collisions are resolved. Spreadsheet names must start with a letter or an
// underscore, hold only letters, digits, underscores and periods, and must
// not read as a cell reference or a constant. A sheet name that would read
// as one gets a leading underscore:
//
//	A1 -> _A1   d1 -> _d1   L2 -> _L2   XFD1048576 -> _XFD1048576
//	R -> _R   C -> _C   r -> _r   RC -> _RC   R1C1 -> _R1C1   C3 -> _C3
//	TRUE -> _TRUE   false -> _false
//
// Other names, Greek letters included, are kept as written. Record fields
// and table columns are named path-wise with periods (steel.E, threads.d),
// which no sheet name contains, so they never collide with a cell's name.
func DefinedName(n string) string {
	var b strings.Builder
	for i, r := range n {
		if r == '_' || unicode.IsLetter(r) || unicode.IsDigit(r) || (i > 0 && r == '.') {
			b.WriteRune(r)
		} else {
			b.WriteByte('_')
		}
	}
	s := b.String()
	if s == "" || misread(s) || !startsWell(s) {
		s = "_" + s
	}
	return s
}

func startsWell(s string) bool {
	for _, r := range s {
		return r == '_' || r == '\\' || unicode.IsLetter(r)
	}
	return false
}

// misread reports whether a spreadsheet would take s for something other
// than a name: an A1 reference (one to three letters then digits; any such
// name is refused, not only those inside the grid, as a grid may grow), an
// R1C1 reference (R, C, RC, R12, C3, R1C1 in any case), or TRUE/FALSE.
func misread(s string) bool {
	u := strings.ToUpper(s)
	if u == "TRUE" || u == "FALSE" {
		return true
	}
	// A1 style.
	i := 0
	for i < len(u) && u[i] >= 'A' && u[i] <= 'Z' {
		i++
	}
	if i >= 1 && i <= 3 && i < len(u) && allDigits(u[i:]) {
		return true
	}
	// R1C1 style: R<digits>?(C<digits>?)? or C<digits>?
	j := 0
	if j < len(u) && u[j] == 'R' {
		j++
		for j < len(u) && u[j] >= '0' && u[j] <= '9' {
			j++
		}
	}
	if j < len(u) && u[j] == 'C' {
		j++
		for j < len(u) && u[j] >= '0' && u[j] <= '9' {
			j++
		}
	}
	return j > 0 && j == len(u)
}

func allDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return s != ""
}

// namer hands out unique defined names. Spreadsheet names ignore case
// while sheet names do not (N and n are two cells): the later of two names
// that differ only by case gets a suffix _2, _3, ... in reading order.
type namer struct {
	used map[string]bool // upper-cased
}

// newNamer returns a namer with room for about size names.
func newNamer(size int) *namer { return &namer{used: make(map[string]bool, size)} }

// take returns a unique defined name for base (already mangled).
func (n *namer) take(base string) string {
	// A name of no more bytes than the limit has no more runes either.
	if len(base) > maxNameLen-8 {
		if r := []rune(base); len(r) > maxNameLen-8 {
			base = string(r[:maxNameLen-8])
		}
	}
	name := base
	upper := strings.ToUpper(name)
	for k := 2; n.used[upper] || misread(name); k++ {
		name = base + "_" + strconv.Itoa(k)
		upper = strings.ToUpper(name)
	}
	n.used[upper] = true
	return name
}
