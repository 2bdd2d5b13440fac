package eval

import (
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/funcs"
)

// Frame is what a compiled expression reads: the numeric slots and general
// values of every cell, the arguments of the user function being run, and
// the first failure met.
type Frame struct {
	Num   []float64
	Val   []funcs.Value
	Args  []float64
	Stack []float64 // argument stack for calls of user functions
	// Pins holds the value of each in_combination call (Machine.Pins):
	// the cell in its named combination, set by the engine.
	Pins []float64
	Fail *Failure
	// stack is the stack of the code of a cell (see exec). Only a cell
	// runs code, and nothing a cell calls runs a cell, so one stack serves.
	stack [maxDepth]float64
}

// Failure is a run-time problem at a node: division by zero, a square root
// of a negative number, a plugin error.
type Failure struct {
	Node check.Node
	Msg  string
	Hint string
	// Func names the user function in whose body Node lies, "" when it
	// lies in the failing cell's own formula.
	Func string
}

func (f *Frame) fail(n check.Node, msg, hint string) {
	if f.Fail == nil {
		f.Fail = &Failure{Node: n, Msg: msg, Hint: hint}
	}
}

type numFn func(f *Frame) float64
type valFn func(f *Frame) funcs.Value
