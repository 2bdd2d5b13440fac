package engine_test

import (
	"reflect"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestFileParsedAgain: a loaded sheet does not keep the syntax tree it was
// checked from; File gives the tree Parse gives for the same source, and
// the same one on every call.
func TestFileParsedAgain(t *testing.T) {
	src := "title: file\n## Loads\nP [kN] = 38 kN -- load @ schedule\nA [mm^2] = 245 mm^2\n# note\n\nsigma [MPa] = P / A\ncheck s: sigma <= 355 MPa\n"
	s := compile(t, src)
	want, _ := sheet.Parse("t.sheaf", []byte(src))
	got := s.File()
	if !reflect.DeepEqual(got, want) {
		t.Fatalf("File() = %+v, want %+v", got, want)
	}
	if len(got.Items) != 8 {
		t.Fatalf("%d items, want 8", len(got.Items))
	}
	if s.File() != got {
		t.Fatal("File parses again on every call")
	}
	if string(s.Source()) != src {
		t.Errorf("Source() = %q, want the compiled text", s.Source())
	}
}
