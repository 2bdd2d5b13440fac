// Package diff compares the results of two versions of a sheet: the inputs
// whose values changed, the formulas whose text changed, the cells added
// and removed, the derived values that moved beyond a relative tolerance,
// and the design checks whose verdict or utilisation changed.
//
// Cells are matched by name, so moving a cell or reformatting a sheet
// changes nothing; formulas are compared with their spacing normalised for
// the same reason. The report lists cells in reading order (the new
// sheet's, then removed cells in the old one's), so its text and JSON are
// byte-for-byte the same on every run. A design check that passed (or did
// not exist) and now fails or cannot be assessed "flipped to fail": that is
// what a reviewer or a CI gate must see first.
package diff
