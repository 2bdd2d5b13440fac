package sheet

import (
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
)

// TestPositions checks lines, rune columns and byte offsets of parsed
// items, with a byte order mark, CRLF breaks, tabs and multi-byte runes.
// Source of the convention: STYLE.md (columns in runes, 1-based; ranges with
// exclusive ends), as go/token and hcl count them (common practice).
func TestPositions(t *testing.T) {
	tests := []struct {
		name string
		src  string
		// what to look at in the first cell, and where it must be
		get        func(c *Cell) diag.Range
		start, end [3]int // line, col, offset
	}{
		{"name", "P = 1\n", func(c *Cell) diag.Range { return c.Name.Range }, [3]int{1, 1, 0}, [3]int{1, 2, 1}},
		{"expr", "P = 38 kN\n", func(c *Cell) diag.Range { return c.Expr.Range }, [3]int{1, 5, 4}, [3]int{1, 10, 9}},
		{"unit inside brackets", "P [ kN ] = 1\n", func(c *Cell) diag.Range { return c.Unit.Range }, [3]int{1, 5, 4}, [3]int{1, 7, 6}},
		{"bom is not a column", "\uFEFFP = 1\n", func(c *Cell) diag.Range { return c.Name.Range }, [3]int{1, 1, 3}, [3]int{1, 2, 4}},
		{"crlf second line", "# c\r\nP = 1\r\n", func(c *Cell) diag.Range { return c.Expr.Range }, [3]int{2, 5, 9}, [3]int{2, 6, 10}},
		{"runes not bytes", "σ_Ed = 1 -- ä\n", func(c *Cell) diag.Range { return c.Annot.Range }, [3]int{1, 10, 10}, [3]int{1, 14, 15}},
		{"tab is one column", "P\t=\t1\n", func(c *Cell) diag.Range { return c.Expr.Range }, [3]int{1, 5, 4}, [3]int{1, 6, 5}},
		{"multi-line expr", "N = (1 +\n  2)\n", func(c *Cell) diag.Range { return c.Expr.Range }, [3]int{1, 5, 4}, [3]int{2, 5, 13}},
		{"whole cell", "N = 1 +\n  2 -- d\n", func(c *Cell) diag.Range { return c.Range }, [3]int{1, 1, 0}, [3]int{2, 9, 16}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			f, errs := Parse("p.sheaf", []byte(tt.src))
			if len(errs) > 0 {
				t.Fatal(errs)
			}
			var c *Cell
			for _, it := range f.Items {
				if x, ok := it.(*Cell); ok {
					c = x
					break
				}
			}
			if c == nil {
				t.Fatal("no cell")
			}
			r := tt.get(c)
			got := [2][3]int{{r.Start().Line, r.Start().Col, r.Start().Offset}, {r.End().Line, r.End().Col, r.End().Offset}}
			if want := [2][3]int{tt.start, tt.end}; got != want {
				t.Errorf("range = %v, want %v", got, want)
			}
			if r.Start().File != "p.sheaf" {
				t.Errorf("file = %q", r.Start().File)
			}
			if tt.src[r.Start().Offset:r.End().Offset] == "" {
				t.Errorf("empty span")
			}
		})
	}
}

// TestExprPosAt checks that offsets inside a multi-line expression map back
// to the sheet, so the checker can point into a formula.
func TestExprPosAt(t *testing.T) {
	src := "title: x\nN_Ed [kN] = (g_k +\n      q_k) * s -- load\n"
	f, errs := Parse("p.sheaf", []byte(src))
	if len(errs) > 0 {
		t.Fatal(errs)
	}
	c := f.Items[1].(*Cell)
	for _, word := range []string{"g_k", "q_k", "s"} {
		off := strings.LastIndex(c.Expr.Text, word)
		p := c.Expr.RangeAt(off, off).Start()
		if got := src[p.Offset : p.Offset+len(word)]; got != word {
			t.Errorf("%s: offset %d holds %q", word, p.Offset, got)
		}
		line := strings.Split(src, "\n")[p.Line-1]
		if got := string([]rune(line)[p.Col-1:][:len(word)]); got != word {
			t.Errorf("%s: %d:%d holds %q", word, p.Line, p.Col, got)
		}
	}
}

// TestLimits checks that the size limits give a diagnostic, not a crash.
func TestLimits(t *testing.T) {
	tests := []struct {
		name string
		src  string
		opt  Option
		want string
	}{
		{"bytes", "a = 1\nb = 2\n", MaxBytes(8), "sheet too large"},
		{"lines", "a = 1\nb = 2\nc = 3\n", MaxLines(2), "too many lines"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			f, errs := Parse("l.sheaf", []byte(tt.src), tt.opt)
			if f == nil || len(errs) != 1 || errs[0].Summary != tt.want {
				t.Fatalf("got %v, want one %q", errs, tt.want)
			}
		})
	}
	// Within the limits nothing is reported.
	if _, errs := Parse("l.sheaf", []byte("a = 1\n"), MaxBytes(100), MaxLines(5), nil); len(errs) != 0 {
		t.Fatal(errs)
	}
}

// TestEmpty: an empty sheet is a valid sheet with no items.
func TestEmpty(t *testing.T) {
	for _, src := range []string{"", "\n\n", "\uFEFF"} {
		f, errs := Parse("e.sheaf", []byte(src))
		if len(errs) > 0 {
			t.Fatalf("%q: %v", src, errs)
		}
		out, err := Format(f)
		if err != nil || len(out) != 0 {
			t.Fatalf("%q: Format = %q, %v", src, out, err)
		}
	}
}
