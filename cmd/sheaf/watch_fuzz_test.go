package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// FuzzInputEdits feeds edited versions of a sheet to inputEdits, which
// decides whether a save changed only input values. Whatever it accepts
// must give, through the kept State, the results a full compile of the
// edited text gives; an edit it accepts but the compiler refuses would be a
// wrong answer shown as a right one. Seeds: edits of tie.sheaf.
func FuzzInputEdits(f *testing.F) {
	base, err := os.ReadFile(filepath.Join("testdata", "batch", "tie.sheaf"))
	if err != nil {
		f.Fatal(err)
	}
	s, err := engine.Compile("tie.sheaf", base)
	if err != nil {
		f.Fatal(err)
	}
	src := string(base)
	for _, e := range [][2]string{
		{"P [kN] = 30 kN", "P [kN] = 45 kN"}, {"d [mm] = 20 mm", "d [mm] = 0.024 m"},
		{"L [m] = 4.2 m", "L [m] = 4.2 kN"}, {"L [m] = 4.2 m", "L [m] = d * 2"},
		{"gamma_M0 = 1.0", "gamma_M0 = 1.05 -- x"}, {"P [kN] = 30 kN", "P [kN] = 30 kN  # note"},
		{"u_lim [mm] = 2 mm", "u_lim [mm] = 2 mm\nextra = 1"}, {"E [GPa] = 210 GPa", "E [GPa] = (210 GPa"},
	} {
		f.Add(strings.Replace(src, e[0], e[1], 1))
	}
	f.Fuzz(func(t *testing.T, text string) {
		var byLine map[int]*engine.Cell
		edits, ok := inputEdits(s, &byLine, base, []byte(text))
		if !ok {
			return
		}
		st := s.NewState()
		for name, v := range edits {
			if c := s.Lookup(name); c == nil || c.Kind != engine.Input {
				t.Fatalf("edit of %s, which is not an input", name)
			}
			if err := st.SetText(name, v); err != nil {
				return // the watcher compiles the sheet whole then
			}
		}
		inc := st.Eval()
		full, err := engine.Compile("tie.sheaf", []byte(text))
		if err != nil {
			t.Fatalf("accepted as input edits %v, but the sheet does not compile: %v", edits, err)
		}
		want := full.Run(nil)
		if len(want.Cells) != len(inc.Cells) {
			t.Fatalf("%d cells, full compile %d", len(inc.Cells), len(want.Cells))
		}
		for i := range want.Cells {
			a, b := inc.Cells[i], want.Cells[i]
			if a.Cell.Name != b.Cell.Name || a.Text != b.Text {
				t.Errorf("%s: incremental %q, full %q (edits %v)", b.Cell.Name, a.Text, b.Text, edits)
			}
		}
	})
}
