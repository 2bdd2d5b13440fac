package main

// The function families linked into the sheaf binary. Each registers its
// functions in init.
import (
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)
