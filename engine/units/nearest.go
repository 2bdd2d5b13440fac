package units

import "github.com/sheafcalc/sheaf/engine/diag"

// Nearest is diag.Nearest, the one did-you-mean rule of Sheaf, offered here
// for the function families: they may import the unit system but no other
// engine package (DEVELOPERS.md, Import direction).
func Nearest(name string, candidates []string) string { return diag.Nearest(name, candidates) }
