// Package eval compiles a checked program for a slot array of float64
// values and evaluates it in dependency order, keeping values between runs
// so that a changed input recomputes only what lies downstream of it.
//
// A Number cell compiles to a few instructions of a small stack machine
// (code.go); the parts of a formula it has no instruction for, function
// bodies, check sides, and every value that is not a number compile to Go
// closures. Dimensions were proved by the checker, so every number is a
// plain float64 at run time. A general-purpose VM over boxed values
// (measured with expr-lang's, before Sheaf had its own parser: 250-450 ns
// and 5-7 allocations for a five-operator formula on the 2-core reference
// machine) loses to either, which run the same formula in tens of
// nanoseconds without allocating. Records, lists, tables and plugin calls
// take a general path over funcs.Value.
package eval
