package check

import (
	"strings"
)

// order computes a topological order and reports every cycle once,
// listing each of its cells with its position. The order is Kahn's, level
// by level: first every cell that uses no other, in reading order, then
// each cell as soon as the last cell it uses is placed. It is not reading
// order: a sheet of independent chains interleaves them (eval schedules its
// own run order for locality, eval/order.go).
func (c *checker) order() {
	p := c.prog
	n := len(p.Cells)
	indeg := make([]int, n)
	for _, cell := range p.Cells {
		indeg[cell.Index] = len(cell.DepIdx)
	}
	order := make([]int, 0, n)
	for i := 0; i < n; i++ {
		if indeg[i] == 0 {
			order = append(order, i)
		}
	}
	for k := 0; k < len(order); k++ {
		for _, u := range p.Users[order[k]] {
			indeg[u]--
			if indeg[u] == 0 {
				order = append(order, u)
			}
		}
	}
	if len(order) < n {
		c.cycles(indeg)
		for i := 0; i < n; i++ {
			if indeg[i] > 0 {
				order = append(order, i) // typed as failed below
			}
		}
	}
	p.Order = order
}

// cycles finds the cycles among the cells left with dependencies.
func (c *checker) cycles(indeg []int) {
	p := c.prog
	state := make([]uint8, len(p.Cells)) // 0 new, 1 on stack, 2 done
	var stack []int
	var visit func(i int)
	visit = func(i int) {
		state[i] = 1
		stack = append(stack, i)
		for _, j := range p.Cells[i].DepIdx {
			if indeg[j] == 0 {
				continue
			}
			switch state[j] {
			case 0:
				visit(j)
			case 1:
				k := len(stack) - 1
				for stack[k] != j {
					k--
				}
				c.reportCycle(stack[k:])
			}
		}
		stack = stack[:len(stack)-1]
		state[i] = 2
	}
	for i := range p.Cells {
		if indeg[i] > 0 && state[i] == 0 {
			visit(i)
		}
	}
	c.looped = make([]bool, len(p.Cells))
	for i, cell := range p.Cells {
		if indeg[i] > 0 {
			cell.Formula = nil // never typed: its users stay silent
			cell.Type = nil
			c.looped[i] = true
		}
	}
}

func (c *checker) reportCycle(cyc []int) {
	p := c.prog
	// Start the message at the cell that comes first in the file.
	first := 0
	for k, i := range cyc {
		if i < cyc[first] {
			first = k
		}
	}
	cyc = append(append([]int{}, cyc[first:]...), cyc[:first]...)
	var names, where []string
	for _, i := range cyc {
		cell := p.Cells[i]
		names = append(names, "`"+cell.Name+"`")
		where = append(where, cell.Name+" at "+cell.Pos().String())
	}
	// cyc lists each cell followed by one it depends on... in dependency
	// direction; say it that way.
	head := p.Cells[cyc[0]]
	summary := "cycle: " + strings.Join(names, " uses ") + " uses `" + head.Name + "`"
	if len(cyc) == 1 {
		summary = "`" + head.Name + "` uses itself"
	}
	c.errs.Errorf(head.NameRange, "cells of the cycle: "+strings.Join(where, "; "),
		"a cell cannot depend on itself, directly or through other cells; break the loop with an input", "%s", summary)
}
