package main

import (
	"regexp"
	"testing"

	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// angleWords marks a parameter or field whose name or documentation speaks of
// an angle or a rotation.
var angleWords = regexp.MustCompile(`(?i)\b(angle|rotat\w*|degrees?|radians?|rot|theta|phi|slope angle|inclination)\b|_deg\b|_rad\b`)

// TestAngleParametersTakeAngles holds the audit of issue 9 for every family
// linked into the binary: a number parameter or record field that is an
// angle has the angle dimension, so that a plain number (90, meant as
// degrees or as radians) cannot reach it. The words are a net, not a proof:
// a new angle parameter must also be named or documented as one.
func TestAngleParametersTakeAngles(t *testing.T) {
	angle := units.Base(units.Angle)
	check := func(where, name, doc string, ty *funcs.Type) {
		if ty == nil || ty.Kind != funcs.Number {
			return
		}
		if (angleWords.MatchString(name) || angleWords.MatchString(doc)) && ty.Dim != angle {
			t.Errorf("%s (%q) speaks of an angle but takes %s, not an angle", where, doc, ty)
		}
	}
	var fields func(where string, ty *funcs.Type)
	fields = func(where string, ty *funcs.Type) {
		if ty == nil {
			return
		}
		for _, f := range ty.Fields {
			check(where+"."+f.Name, f.Name, f.Doc, f.Type)
			fields(where+"."+f.Name, f.Type)
		}
	}
	n := 0
	for _, d := range funcs.All() {
		for _, p := range d.Params {
			check(d.Name+"("+p.Name+")", p.Name, p.Doc, p.Type)
			fields(d.Name+"("+p.Name+")", p.Type)
			n++
		}
		fields(d.Name+" result", d.Result)
	}
	if n < 20 {
		t.Fatalf("only %d parameters registered; are the families linked?", n)
	}
	place, ok := funcs.Lookup("place")
	if !ok || len(place.Params) < 4 || place.Params[3].Type.Dim != angle {
		t.Errorf("place's rotation must be an angle")
	}
}
