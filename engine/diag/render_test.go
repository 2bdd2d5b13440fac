package diag

import (
	"flag"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite golden files")

// renderSrc is the sheet most render cases point into. Line 3 holds a tab,
// line 4 Greek letters and a superscript (two bytes each in UTF-8), line 5
// ends in CRLF, line 6 is empty, and the file ends without a line break.
const renderSrc = "title: render cases\n" +
	"P [kN] = 38 kN\n" +
	"A\t= 245 mm^2\n" +
	"σ_Ed [N/mm²] = P / A   -- stress\n" +
	"L = 2 m\r\n" +
	"\n" +
	"check c: σ_Ed <= f_y"

var caseSrc = NewSource("case.sheaf", renderSrc)

// at builds a range of case.sheaf from 1-based lines and rune columns.
func at(line, col, endLine, endCol int) Range {
	return caseSrc.Span(caseSrc.Offset(line, col), caseSrc.Offset(endLine, endCol))
}

// TestRender renders one diagnostic per case and compares the whole text
// with testdata/render.golden: the snippet, the caret under the span and
// the lines around them are what a user reads, so their exact form is
// golden-tested (STYLE.md, "Errors a user sees").
func TestRender(t *testing.T) {
	src := Sources{"case.sheaf": []byte(renderSrc)}
	cases := []struct {
		name string
		d    Diagnostic
	}{
		{"summary, detail, snippet and hint", Diagnostic{Range: at(7, 18, 7, 21), Summary: "undefined name `f_y`",
			Detail: "no cell, function or constant of that name is defined in this sheet", Hint: "did you mean `f_yd`?"}},
		{"no detail and no hint", Diagnostic{Range: at(2, 13, 2, 15), Summary: "unknown unit `kN`"}},
		{"a tab before the span is shown as one space", Diagnostic{Range: at(3, 4, 3, 7), Summary: "span after a tab"}},
		{"the tab itself", Diagnostic{Range: at(3, 2, 3, 3), Summary: "span on the tab"}},
		{"multi-byte runes before and in the span", Diagnostic{Range: at(4, 7, 4, 12), Summary: "span over `N/mm²`"}},
		{"a span on a Greek name", Diagnostic{Range: at(4, 1, 4, 5), Summary: "span over `σ_Ed`"}},
		{"a span past the end of the line is clipped", Diagnostic{Range: at(2, 10, 2, 40), Summary: "clipped span"}},
		{"a position just past the line end gets one caret", Diagnostic{Range: at(2, 15, 2, 15), Summary: "expected an expression at the end of the line"}},
		{"an empty range gets one caret", Diagnostic{Range: at(2, 10, 2, 10), Summary: "empty range"}},
		{"a range over several lines is underlined to the end of its first line", Diagnostic{Range: at(2, 10, 4, 3), Summary: "multi-line range"}},
		{"a CRLF line is shown without its CR", Diagnostic{Range: at(5, 5, 5, 8), Summary: "span on a CRLF line"}},
		{"the last line without a line break", Diagnostic{Range: at(7, 1, 7, 6), Summary: "span on the last line"}},
		{"an empty line at column 1 gets no snippet", Diagnostic{Range: at(6, 1, 6, 1), Summary: "problem on an empty line"}},
		{"a file without source text gets no snippet", Diagnostic{Range: NewSource("other.sheaf", "x = 1").Span(0, 1), Summary: "no source",
			Hint: "the hint still shows"}},
		{"no position", Diagnostic{Summary: "no position", Detail: "a problem of the whole run"}},
		{"a file but no line", Diagnostic{Range: caseSrc.Whole(), Summary: "sheet is too large"}},
		{"a warning", Diagnostic{Severity: Warning, Range: at(5, 1, 5, 2), Summary: "unused cell `L`"}},
	}
	var b strings.Builder
	for _, c := range cases {
		b.WriteString("=== " + c.name + "\n")
		d := c.d
		if err := Render(&b, List{&d}, src); err != nil {
			t.Fatal(err)
		}
	}
	golden.Check(t, filepath.Join("testdata", "render.golden"), []byte(b.String()), *update)
}

// TestRenderList renders several diagnostics in one call: each ends with a
// blank line, in list order.
func TestRenderList(t *testing.T) {
	src := Sources{"case.sheaf": []byte(renderSrc)}
	l := List{
		{Range: at(2, 1, 2, 2), Summary: "first"},
		{Range: at(5, 1, 5, 2), Summary: "second", Hint: "a hint"},
	}
	var b strings.Builder
	if err := Render(&b, l, src); err != nil {
		t.Fatal(err)
	}
	want := "case.sheaf:2:1: first\n" +
		"   2 | P [kN] = 38 kN\n" +
		"     | ^\n" +
		"\n" +
		"case.sheaf:5:1: second\n" +
		"   5 | L = 2 m\n" +
		"     | ^\n" +
		"    hint: a hint\n" +
		"\n"
	if got := b.String(); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
}

// TestRenderLimits: a long line is shown as a window around the caret, and
// a flood of problems is cut after MaxShown with a count of the rest.
func TestRenderLimits(t *testing.T) {
	line := "x = " + strings.Repeat("a + ", 2000) + "bad"
	src := []byte(line + "\n")
	col := len(line) - 2
	var b strings.Builder
	d := &Diagnostic{Range: NewSource("f", string(src)).Span(col-1, col+2), Summary: "undefined name `bad`"}
	if err := Render(&b, List{d}, Sources{"f": src}); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	lines := strings.Split(out, "\n")
	if len(lines) < 3 || utf8.RuneCountInString(lines[1]) > maxSnippet+10 || !strings.Contains(lines[1], "| …") || !strings.HasSuffix(lines[1], "bad") {
		t.Fatalf("snippet not cut around the caret:\n%s", out)
	}
	// The caret sits under `bad`.
	if i, j := strings.Index(lines[2], "^"), utf8.RuneCountInString(lines[1])-3; utf8.RuneCountInString(lines[2][:i]) != j {
		t.Errorf("caret at %d, want %d:\n%s", i, j, out)
	}
	var many List
	text := strings.Repeat("y = nope\n", 250)
	manySrc := NewSource("f", text)
	for i := 1; i <= 250; i++ {
		many = append(many, &Diagnostic{Range: manySrc.At(i, 5, 4), Summary: "undefined name `nope`"})
	}
	b.Reset()
	if err := Render(&b, many, Sources{"f": []byte(text)}); err != nil {
		t.Fatal(err)
	}
	if got := strings.Count(b.String(), "undefined name"); got != MaxShown {
		t.Errorf("%d problems shown, want %d", got, MaxShown)
	}
	if !strings.Contains(b.String(), "and 150 more problems") {
		t.Errorf("no count of the rest:\n%s", b.String()[len(b.String())-200:])
	}
}
