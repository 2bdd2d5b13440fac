// Package chunks reads the data-driven test files of the parser and the
// checker: several small sheets in one file, each starting with a line
// "=== name", with the error expected on a line written at its end as
// `  ⟵ want "regexp"`.
package chunks
