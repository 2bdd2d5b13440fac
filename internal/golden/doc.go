// Package golden compares the output of a test with a golden file and
// rewrites the file on request, for the tests of every package that pins
// an output (listings, JSON, rendered diagnostics, workbook summaries).
//
// Each test package keeps its own flag (most call it -update) and passes
// its value in: a flag registered here would clash with the flags the
// packages already define, and one package may keep several sets of golden
// files under separate flags so that one set is rewritten at a time.
package golden
