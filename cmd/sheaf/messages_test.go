package main

import (
	"flag"
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var updateMessages = flag.Bool("update-messages", false, "rewrite the golden files of TestMessagesGolden")

// TestMessagesGolden pins the messages that were rewritten to say what
// was found and what was expected: a table whose columns do not fit (their
// names and units, not "must be a table, got a table"), a list index past
// the end (the index and the length, numbered from 0 as in the sheet),
// parts of a list named by their index in it (parts[0], not "part 1"),
// "an elastic law", a length in a message in mm at the display precision
// with a hint when the arguments of chs look swapped, a counted noun in a
// case table's message, and function docs that give each unit once, in
// the unit of the signature.
func TestMessagesGolden(t *testing.T) {
	const dir = "testdata/messages/"
	cases := []struct {
		name string
		args []string
	}{
		{"table-columns", []string{"run", dir + "table-columns.sheaf"}},
		{"index", []string{"run", dir + "index.sheaf"}},
		{"parts-overlap", []string{"run", dir + "parts-overlap.sheaf"}},
		{"law-article", []string{"run", dir + "law-article.sheaf"}},
		{"chs-swapped", []string{"run", dir + "chs-swapped.sheaf"}},
		{"cases-count", []string{"batch", dir + "tie.sheaf", dir + "cases-count.csv"}},
		{"funcs-solve_bar", []string{"funcs", "solve_bar"}},
		{"funcs-polygon", []string{"funcs", "polygon"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			out, errs, code := sheaf(t, c.args...)
			got := fmt.Sprintf("$ sheaf %s\n$ exit %d\n", strings.Join(c.args, " "), code)
			if c.args[0] == "funcs" {
				got += out
			} else {
				got += errs
			}
			golden.Check(t, filepath.Join(dir, c.name+".golden"), []byte(got), *updateMessages)
			for _, noise := range []string{"99999", "00000", "got a table\n", "a elastic", "1 values"} {
				if strings.Contains(got, noise) {
					t.Errorf("the message still has %q", noise)
				}
			}
		})
	}
}
