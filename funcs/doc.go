// Package funcs is the registry of Sheaf's domain functions. It holds types
// only: the static type model the checker uses (numbers with a dimension,
// records, lists, tables, functions), the runtime value model the evaluator
// passes, and the description of each function (signature, documentation,
// formula, published source). The families live in sub-packages under funcs/
// and register themselves in init; cmd/sheaf links them in with one
// blank-import file. The engine imports this package but never a family.
package funcs
