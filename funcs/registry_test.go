package funcs

import (
	"fmt"
	"slices"
	"strings"
	"testing"
)

// testDef returns a complete definition named name in family.
func testDef(family, name string) *Def {
	return &Def{
		Name: name, Family: family,
		Params: []Param{{Name: "x", Type: plain}, {Name: "y", Type: plain, Optional: true}},
		Result: plain,
		Call:   func(args []Value) (Value, error) { return args[0], nil },
		Doc:    "returns x", Source: "common practice",
	}
}

// register adds d and removes it when the test ends, so that tests do not
// leak into one another through the global registry.
func register(t *testing.T, d *Def) {
	t.Helper()
	Register(d)
	t.Cleanup(func() {
		mu.Lock()
		delete(defs, d.Name)
		mu.Unlock()
	})
}

// panics runs f and returns the panic message, or "" if it did not panic.
func panics(f func()) (msg string) {
	defer func() {
		if r := recover(); r != nil {
			msg = fmt.Sprint(r)
		}
	}()
	f()
	return ""
}

func TestRegisterLookup(t *testing.T) {
	d := testDef("test", "test_identity")
	register(t, d)
	got, ok := Lookup("test_identity")
	if !ok || got != d {
		t.Fatalf("Lookup = %v, %v; want the registered definition", got, ok)
	}
	if _, ok := Lookup("test_missing"); ok {
		t.Error("Lookup found a function never registered")
	}
	if d.MinArgs() != 1 {
		t.Errorf("MinArgs = %d, want 1 (y is optional)", d.MinArgs())
	}
}

func TestRegisterPanics(t *testing.T) {
	validate := func(args []*Type) (*Type, error) { return args[0], nil }
	cases := []struct {
		name  string
		edit  func(d *Def)
		panic string // part of the message; "" for no panic
	}{
		{"complete", func(d *Def) {}, ""},
		{"a validator instead of a result", func(d *Def) { d.Result, d.Validate = nil, validate }, ""},
		{"no name", func(d *Def) { d.Name = "" }, "incomplete definition"},
		{"no body", func(d *Def) { d.Call = nil }, "incomplete definition"},
		{"neither result nor validator", func(d *Def) { d.Result = nil }, "incomplete definition"},
		{"no doc", func(d *Def) { d.Doc = "" }, "needs a Doc and a Source"},
		{"no source", func(d *Def) { d.Source = "" }, "needs a Doc and a Source"},
	}
	for i, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			d := testDef("test", fmt.Sprintf("test_def_%d", i))
			c.edit(d)
			msg := panics(func() { register(t, d) })
			switch {
			case c.panic == "" && msg != "":
				t.Errorf("panicked: %s", msg)
			case c.panic != "" && !strings.Contains(msg, c.panic):
				t.Errorf("panic %q, want one containing %q", msg, c.panic)
			}
		})
	}
}

func TestRegisterDuplicate(t *testing.T) {
	first := testDef("test", "test_twice")
	register(t, first)
	msg := panics(func() { Register(testDef("other", "test_twice")) })
	if !strings.Contains(msg, "duplicate function test_twice") {
		t.Errorf("second Register: panic %q, want a duplicate-function panic", msg)
	}
	if got, _ := Lookup("test_twice"); got != first {
		t.Error("the duplicate replaced the first definition")
	}
}

func TestAllOrder(t *testing.T) {
	// Registered out of order on purpose.
	for _, fn := range [][2]string{{"zeta_fam", "test_a"}, {"alpha_fam", "test_z"}, {"alpha_fam", "test_b"}, {"mid_fam", "test_m"}} {
		register(t, testDef(fn[0], fn[1]))
	}
	var got []string
	for _, d := range All() {
		if strings.HasPrefix(d.Name, "test_") {
			got = append(got, d.Family+"/"+d.Name)
		}
	}
	want := []string{"alpha_fam/test_b", "alpha_fam/test_z", "mid_fam/test_m", "zeta_fam/test_a"}
	if !slices.Equal(got, want) {
		t.Errorf("All() = %q, want %q (by family, then name)", got, want)
	}
	// All returns a fresh slice: reordering it leaves the registry alone.
	all := All()
	slices.Reverse(all)
	if again := All(); len(again) > 1 && again[0] == all[0] {
		t.Error("All shares its slice between calls")
	}
}
