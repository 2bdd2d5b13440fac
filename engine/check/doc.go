// Package check turns a parsed sheet into a checked program: it resolves
// every name, builds the dependency graph and its topological order, finds
// cycles, and types every formula with Sheaf's own rules (numbers carry a
// physical dimension; records, lists, tables and functions have shapes).
// Problems of the whole file are collected at once, each with a range, a
// detail sentence and a hint.
//
// The output is a typed tree of Nodes per cell that the evaluator compiles;
// nothing here runs a formula, except folding the constant exponent of a
// power, which the dimension rule needs.
package check
