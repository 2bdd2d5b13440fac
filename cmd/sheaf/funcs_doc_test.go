package main

import (
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// TestDocText: a doc gives each unit once, in the unit the signature
// shows (the preferred metric unit of the dimension).
func TestDocText(t *testing.T) {
	length := &funcs.Type{Kind: funcs.Number, Dim: units.Base(units.Length)}
	force, _ := units.QuantityDim("force")
	forceT := &funcs.Type{Kind: funcs.Number, Dim: force}
	cases := []struct {
		doc  string
		t    *funcs.Type
		want string
	}{
		{"outside diameter, m; > 0", length, "outside diameter; > 0"},
		{"wall thickness, m; 0 < t ≤ d/2", length, "wall thickness; 0 < t ≤ d/2"},
		{"reaction of the start support on the bar, +x positive [N]", forceT, "reaction of the start support on the bar, +x positive"},
		{"vertical coordinates, m (same count as ys)", &funcs.Type{Kind: funcs.List, Elem: length}, "vertical coordinates (same count as ys)"},
		{"segment table: L [m], E [Pa]", nil, "segment table: L [mm], E [MPa]"},
		{"axial force, N; tension positive", forceT, "axial force; tension positive"},
		{"a length, not a force: N", length, "a length, not a force: N"},
		{"mean stress, Pa", forceT, "mean stress, Pa"}, // another dimension: kept
	}
	for _, c := range cases {
		if got := docText(c.doc, c.t); got != c.want {
			t.Errorf("docText(%q) = %q, want %q", c.doc, got, c.want)
		}
	}
}
