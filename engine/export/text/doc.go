// Package text writes the results of a sheet as a plain-text listing for a
// terminal or a printed appendix: a title block, the cells section by
// section (name, value in its display unit, description, reference), the
// design checks with demand, capacity, utilisation and verdict, any cell
// that could not be computed, and the caution line.
package text
