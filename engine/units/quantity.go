package units

import (
	"fmt"
	"sort"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// Quantities returns the quantity names DimOf accepts, sorted.
func Quantities() []string {
	names := make([]string, 0, len(quantities))
	for _, q := range quantities {
		names = append(names, q.name)
	}
	sort.Strings(names)
	return names
}

// QuantityDim returns the dimension of a named quantity ("stress",
// "weight density"). Case, underscores and hyphens do not matter.
func QuantityDim(name string) (Dim, bool) {
	d, ok := tab().quantityIndex[normQuantity(name)]
	return d, ok
}

func normQuantity(s string) string {
	s = strings.ToLower(strings.TrimSpace(s))
	s = strings.NewReplacer("_", " ", "-", " ").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}

// DimOf reads a dimension the way `sheaf units --dim` takes it: a quantity
// name ("stress", "force per length") or a unit ("kN", "N/mm^2"). A name
// that is neither gives an *Error whose hint offers the nearest quantity or
// unit.
func DimOf(quantityOrUnit string) (Dim, error) {
	if d, ok := QuantityDim(quantityOrUnit); ok {
		return d, nil
	}
	u, err := Parse(quantityOrUnit)
	if err == nil {
		return u.Dim, nil
	}
	// A word that is not a unit is more likely a misspelt quantity.
	n := normQuantity(quantityOrUnit)
	if best := diag.Nearest(n, tab().quantityNames); best != "" {
		return None, &Error{Offset: 0, End: len(quantityOrUnit),
			Msg:  fmt.Sprintf("unknown quantity or unit `%s`", quantityOrUnit),
			Hint: fmt.Sprintf("did you mean `%s`?", best)}
	}
	if strings.Contains(n, " ") || len(n) > 8 {
		return None, &Error{Offset: 0, End: len(quantityOrUnit),
			Msg:  fmt.Sprintf("unknown quantity or unit `%s`", quantityOrUnit),
			Hint: "quantities are named like `stress` or `force per length`; units like `kN` or `N/mm^2`"}
	}
	return None, err
}
