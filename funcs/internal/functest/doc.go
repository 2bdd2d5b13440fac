// Package functest calls registered functions the way the evaluator does,
// for the tests of the function families (funcs/bar, funcs/section, ...).
// Each family tests its functions through the registry, not only through
// their Go API, so that the checks cover the argument handling a sheet
// meets; the helpers live here once instead of in every family's tests.
package functest
