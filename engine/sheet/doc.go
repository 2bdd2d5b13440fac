// Package sheet reads the Sheaf cell-file format (.sheaf) into a syntax tree
// with positions, and prints a tree back in canonical layout. It knows lines,
// names, brackets and annotations; expressions are kept as written text and
// are parsed by the checker. The grammar is in SPEC.md at the repository root.
package sheet
