package check

import (
	"strings"
)

// order computes a topological order and reports every cycle once,
// listing each of its cells with its position.
//
// The order keeps reading order wherever the dependencies allow: a
// depth-first walk from each cell in reading order places the cells it
// uses, in their order of first use, before it. On a sheet written top
// down it is reading order itself. Checking, compiling and evaluating all
// go in this order, so the cells of one chain of a large sheet are handled
// (and their compiled formulas lie in memory) side by side; a level-by-
// level order took one cell of each of a hundred chains in turn, and an
// incremental recompute of one chain ran at a third of the speed
// (BenchmarkRecompute1000 in engine).
//
// The cells on a cycle are placed where the walk meets them; every other
// cell still comes after all it uses, since a cell it uses that is still
// being walked would put it on the cycle. Cells on a cycle and those after
// one are never typed (cycles), so their place does not matter.
func (c *checker) order() {
	p := c.prog
	n := len(p.Cells)
	order := make([]int, 0, n)
	const (
		unseen = iota
		walking
		placed
	)
	state := make([]uint8, n)
	type visit struct{ i, next int } // next: the dependency to look at next
	var stack []visit
	cyclic := false
	for root := range p.Cells {
		if state[root] != unseen {
			continue
		}
		state[root] = walking
		stack = append(stack, visit{i: root})
		for len(stack) > 0 {
			top := &stack[len(stack)-1]
			if deps := p.Deps(top.i); top.next < len(deps) {
				j := int(deps[top.next])
				top.next++
				switch state[j] {
				case unseen:
					state[j] = walking
					stack = append(stack, visit{i: j})
				case walking:
					cyclic = true
				}
				continue
			}
			state[top.i] = placed
			order = append(order, top.i)
			stack = stack[:len(stack)-1]
		}
	}
	p.Order = order
	if cyclic {
		c.cycles(c.unplaced())
	}
}

// unplaced returns, for each cell, how many of the cells it uses Kahn's
// algorithm could not place before it: nonzero for the cells on a cycle
// and those after one.
func (c *checker) unplaced() []int {
	p := c.prog
	indeg := make([]int, len(p.Cells))
	var ready []int
	for i := range p.Cells {
		indeg[i] = len(p.Deps(i))
		if indeg[i] == 0 {
			ready = append(ready, i)
		}
	}
	for k := 0; k < len(ready); k++ {
		for _, u := range p.Users(ready[k]) {
			indeg[u]--
			if indeg[u] == 0 {
				ready = append(ready, int(u))
			}
		}
	}
	return indeg
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
		for _, dep := range p.Deps(i) {
			j := int(dep)
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
	c.errs.Errorf(head.NameRange(), "cells of the cycle: "+strings.Join(where, "; "),
		"a cell cannot depend on itself, directly or through other cells; break the loop with an input", "%s", summary)
}
