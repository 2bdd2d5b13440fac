// Package eval compiles a checked program into Go closures over a slot
// array of float64 values and evaluates it in dependency order, keeping
// values between runs so that a changed input recomputes only what lies
// downstream of it.
//
// Why closures and not a general-purpose expression VM: dimensions were
// proved by the checker, so every number is a plain float64 at run time. A
// VM over boxed values (measured with expr-lang's, before Sheaf had its own
// parser: 250-450 ns and 5-7 allocations for a five-operator formula on the
// 2-core reference machine) loses to a tree of closures over []float64,
// which runs the same formula in tens of nanoseconds without allocating. Records,
// lists, tables and plugin calls take a general path over funcs.Value.
package eval
