package engine_test

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestProblemsOnePerFailedCell: every failed cell has its message, even
// when two fail on the same line, as the cells of a template used twice
// do; the users of a failed cell stay silent.
func TestProblemsOnePerFailedCell(t *testing.T) {
	proj := t.TempDir()
	write(t, filepath.Join(proj, "sheaf.root"), "")
	write(t, filepath.Join(proj, "rod.sheaf"), "d = 1\nr = 1 / d\n")
	write(t, filepath.Join(proj, "top.sheaf"), "use a from \"rod.sheaf\"\n    d = 0\nuse b from \"rod.sheaf\"\n    d = 0\nsum_r = a.r + b.r\n")
	s, err := engine.Load(filepath.Join(proj, "top.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	r := s.Run(nil)
	var got []string
	for _, p := range r.Problems {
		got = append(got, p.Summary)
	}
	want := []string{"`a.r` cannot be computed: division by zero", "`b.r` cannot be computed: division by zero"}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("problems:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
	if r.Cell("sum_r").Known {
		t.Error("sum_r uses failed cells but has a value")
	}
}
