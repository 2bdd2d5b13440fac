package diag

import (
	"errors"
	"slices"
	"strings"
	"testing"
)

func TestPosString(t *testing.T) {
	cases := []struct {
		name string
		p    Pos
		want string
	}{
		{"full", Pos{File: "a.sheaf", Line: 3, Col: 7, Offset: 40}, "a.sheaf:3:7"},
		{"no file", Pos{Line: 3, Col: 7}, "3:7"},
		{"file only", Pos{File: "a.sheaf"}, "a.sheaf"},
		{"nothing", Pos{}, "-"},
		{"a column alone is no position", Pos{Col: 4}, "-"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := c.p.String(); got != c.want {
				t.Errorf("String() = %q, want %q", got, c.want)
			}
			if got, want := c.p.IsValid(), c.p.Line > 0; got != want {
				t.Errorf("IsValid() = %v, want %v", got, want)
			}
		})
	}
}

func TestPosCompare(t *testing.T) {
	cases := []struct {
		name string
		a, b Pos
		want int
	}{
		{"same", Pos{File: "a", Line: 2, Col: 3}, Pos{File: "a", Line: 2, Col: 3}, 0},
		{"file first", Pos{File: "a", Line: 9, Col: 9}, Pos{File: "b", Line: 1, Col: 1}, -1},
		{"then line", Pos{File: "a", Line: 2, Col: 9}, Pos{File: "a", Line: 3, Col: 1}, -1},
		{"then column", Pos{File: "a", Line: 3, Col: 5}, Pos{File: "a", Line: 3, Col: 2}, 1},
		{"the offset is not consulted", Pos{File: "a", Line: 3, Col: 2, Offset: 99}, Pos{File: "a", Line: 3, Col: 2}, 0},
		{"no position sorts first", Pos{}, Pos{Line: 1, Col: 1}, -1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := c.a.Compare(c.b); got != c.want {
				t.Errorf("Compare = %d, want %d", got, c.want)
			}
			if got := c.b.Compare(c.a); got != -c.want {
				t.Errorf("reversed Compare = %d, want %d", got, -c.want)
			}
		})
	}
}

func TestSeverityString(t *testing.T) {
	if Error.String() != "error" || Warning.String() != "warning" {
		t.Errorf("got %q and %q", Error.String(), Warning.String())
	}
}

func TestDiagnosticError(t *testing.T) {
	d := &Diagnostic{Range: NewSource("a.sheaf", "\n\n\n    Q\n").At(4, 5, 1), Summary: "undefined name `Q`", Hint: "not in Error()"}
	if got, want := d.Error(), "a.sheaf:4:5: undefined name `Q`"; got != want {
		t.Errorf("error: %q, want %q", got, want)
	}
	d.Severity = Warning
	if got, want := d.Error(), "a.sheaf:4:5: warning: undefined name `Q`"; got != want {
		t.Errorf("warning: %q, want %q", got, want)
	}
}

// p is a position on a line of a.sheaf (or of file, when given).
func p(line, col int, file ...string) Range {
	f := "a.sheaf"
	if len(file) > 0 {
		f = file[0]
	}
	return NewSource(f, strings.Repeat(strings.Repeat(" ", 20)+"\n", 10)).At(line, col, 1)
}

func TestListSort(t *testing.T) {
	cases := []struct {
		name string
		in   List
		want []string // Error() of each kept diagnostic, in order
	}{
		{"empty", nil, nil},
		{"sorted by line and column",
			List{{Range: p(3, 1), Summary: "c"}, {Range: p(1, 9), Summary: "b"}, {Range: p(1, 2), Summary: "a"}},
			[]string{"a.sheaf:1:2: a", "a.sheaf:3:1: c"}},
		{"one per line: the leftmost is kept",
			List{{Range: p(2, 8), Summary: "later on the line"}, {Range: p(2, 3), Summary: "first on the line"}, {Range: p(4, 1), Summary: "other line"}},
			[]string{"a.sheaf:2:3: first on the line", "a.sheaf:4:1: other line"}},
		{"one per line: same place, the summary decides",
			List{{Range: p(2, 3), Summary: "zeta"}, {Range: p(2, 3), Summary: "alpha"}},
			[]string{"a.sheaf:2:3: alpha"}},
		{"the same line of two files is two lines",
			List{{Range: p(2, 3, "b.sheaf"), Summary: "in b"}, {Range: p(2, 3), Summary: "in a"}},
			[]string{"a.sheaf:2:3: in a", "b.sheaf:2:3: in b"}},
		{"problems without a line are all kept, first",
			List{{Range: p(1, 1), Summary: "on a line"}, {Summary: "run problem 2"}, {Summary: "run problem 1"}},
			[]string{"-: run problem 1", "-: run problem 2", "a.sheaf:1:1: on a line"}},
		{"file-level problems without a line are kept",
			List{{Range: FileOnly("a.sheaf").Whole(), Summary: "too large"}, {Range: FileOnly("a.sheaf").Whole(), Summary: "not utf-8"}},
			[]string{"a.sheaf: not utf-8", "a.sheaf: too large"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			l := slices.Clone(c.in)
			l.Sort()
			var got []string
			for _, d := range l {
				got = append(got, d.Error())
			}
			if !slices.Equal(got, c.want) {
				t.Errorf("got %q\nwant %q", got, c.want)
			}
		})
	}
}

func TestListErr(t *testing.T) {
	var empty List
	if empty.Err() != nil || empty.HasErrors() {
		t.Error("an empty list is no error")
	}
	warn := List{{Severity: Warning, Range: p(1, 1), Summary: "unused"}}
	if warn.Err() != nil || warn.HasErrors() {
		t.Error("warnings alone are no error")
	}
	var l List
	l.Errorf(p(2, 5), "the detail", "the hint", "cannot add %s and %s", "force", "length")
	l.Add(&Diagnostic{Severity: Warning, Range: p(3, 1), Summary: "unused"})
	if !l.HasErrors() {
		t.Fatal("HasErrors() = false with an error in the list")
	}
	err := l.Err()
	var got List
	if !errors.As(err, &got) || len(got) != 2 {
		t.Fatalf("Err() = %#v, want the list itself", err)
	}
	if d := got[0]; d.Summary != "cannot add force and length" || d.Detail != "the detail" || d.Hint != "the hint" || d.Severity != Error {
		t.Errorf("Errorf built %+v", d)
	}
	if want := "a.sheaf:2:5: cannot add force and length\na.sheaf:3:1: warning: unused"; err.Error() != want {
		t.Errorf("Error() = %q, want %q", err.Error(), want)
	}
}
