package main

// The function families linked into the sheaf binary. Each registers its
// functions in init.
import (
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/catalogue"
	_ "github.com/sheafcalc/sheaf/funcs/composite"
	_ "github.com/sheafcalc/sheaf/funcs/connection"
	_ "github.com/sheafcalc/sheaf/funcs/plastic"
	_ "github.com/sheafcalc/sheaf/funcs/section"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)
