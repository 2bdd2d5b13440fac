package units

import (
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// Error is a problem in a unit text. Offset and End are byte offsets into the
// text given to Parse (End exclusive), so a caller that knows where the unit
// text sits in a sheet can point a caret at the exact spot.
type Error struct {
	Offset, End int
	Msg         string // what is wrong, e.g. "unknown unit `kn`"
	Hint        string // how to fix it, e.g. "did you mean `kN`?"; may be empty
}

// Error joins the message and the hint: "unknown unit `kn`; did you mean `kN`?".
func (e *Error) Error() string {
	if e.Hint == "" {
		return e.Msg
	}
	return e.Msg + "; " + e.Hint
}

// suggest returns the known spelling nearest to name, or "" when nothing is
// close or t is nil (while the tables are being built): diag.Nearest over every spelling in listing order, except that a
// listed product whose operator was left out ("kNm" -> "kN*m") comes before
// any match but a case-only one ("kn" -> "kN"). diag.Nearest alone would miss
// the product, since a three-letter name gets one edit and `*` plus a case
// change may be two.
func suggest(name string, t *tables) string {
	if name == "" || t == nil {
		return ""
	}
	suggestions := t.suggestions
	near := diag.Nearest(name, suggestions)
	if strings.EqualFold(near, name) {
		return near
	}
	// A product written without its operator: kNm, Nmm, kipft.
	lower := strings.ToLower(name)
	for _, s := range suggestions {
		if strings.Contains(s, "*") && strings.ToLower(strings.ReplaceAll(s, "*", "")) == lower {
			return s
		}
	}
	return near
}
