package section

import (
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
)

// rule is a Gauss–Legendre rule on [0, 1].
type rule struct {
	x, w []float64
}

var (
	rulesMu sync.Mutex
	rules   = map[int]*rule{}
)

// gaussRule returns the n-point Gauss–Legendre rule on [0, 1], computed once
// with gonum's quad.Legendre and cached: the section integrals call it in
// their inner loops.
func gaussRule(n int) *rule {
	rulesMu.Lock()
	defer rulesMu.Unlock()
	if r, ok := rules[n]; ok {
		return r
	}
	r := &rule{x: make([]float64, n), w: make([]float64, n)}
	quad.Legendre{}.FixedLocations(r.x, r.w, 0, 1)
	rules[n] = r
	return r
}
