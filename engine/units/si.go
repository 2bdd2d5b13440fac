package units

// SISymbol returns the symbol of the coherent SI unit of d (factor 1): a
// named unit where the SI brochure or the trade names one (N, Pa, N/m,
// N*m, J, W), else the product of base units that Coherent writes, and "1"
// for a plain number. JSON output gives SI values in this unit.
func SISymbol(d Dim) string {
	if s, ok := siNamed[d]; ok {
		return s
	}
	return Coherent(d).Symbol
}

var siNamed = func() map[Dim]string {
	m := map[Dim]string{None: "1"}
	for _, sym := range []string{"m", "m^2", "m^3", "m^4", "kg", "s", "K", "N", "Pa", "N/m", "N*m", "N/m^3", "kg/m^3", "1/K", "J", "W"} {
		if u, err := Parse(sym); err == nil && u.Factor == 1 {
			if _, dup := m[u.Dim]; !dup {
				m[u.Dim] = sym
			}
		}
	}
	return m
}()
