// Package formula is Sheaf's expression parser: it reads the text of one
// expression as written in a sheet (with quantity literals such as `38 kN`,
// `0.75 in` or `7850 kg/m^3` as tokens of their own) by exactly the grammar
// of SPEC.md §4 and builds a syntax tree of its own.
//
// The tree is flat: nodes live in one slice and refer to each other by
// int32 index, names and literal texts are slices of the source text, and
// positions are byte offsets turned into line:col only when a message is
// printed. A formula is then a handful of allocations however long it is.
//
// What the grammar does not have is a syntax error at its position, with a
// hint where one helps: `//` and `/* */` are not comments, `1_000` does not
// group digits, `**`, `&&`, `||` and `!` are not operators (write ^, and,
// or, not), and so on. The first syntax error of a formula stops its parse;
// unit errors of its quantity literals are all reported.
package formula
