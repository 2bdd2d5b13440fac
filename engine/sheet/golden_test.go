package sheet

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite golden files")

// TestFormatGolden parses every testdata/*.sheaf and compares the canonical
// print with its .golden file. The golden text is the source of truth for
// the parser too: parser tests compare printed text, not trees.
func TestFormatGolden(t *testing.T) {
	files, err := filepath.Glob(filepath.Join("testdata", "*.sheaf"))
	if err != nil || len(files) == 0 {
		t.Fatalf("no golden inputs: %v", err)
	}
	for _, in := range files {
		t.Run(filepath.Base(in), func(t *testing.T) {
			src, err := os.ReadFile(in)
			if err != nil {
				t.Fatal(err)
			}
			f, errs := Parse(in, src)
			if len(errs) > 0 {
				var b bytes.Buffer
				_ = diag.Render(&b, errs, diag.Sources{in: src})
				t.Fatalf("unexpected syntax errors:\n%s", b.String())
			}
			got, err := Format(f)
			if err != nil {
				t.Fatal(err)
			}
			golden.Check(t, strings.TrimSuffix(in, ".sheaf")+".golden", got, *update)
			checkRoundTrip(t, in, src)
		})
	}
}

// checkRoundTrip asserts the printer's promises on a source without syntax
// errors: the print parses without errors, it holds the same items with the
// same names, units, expressions (up to indentation of continuation lines),
// annotations, comments and table entries, and printing it again changes
// nothing.
func checkRoundTrip(t *testing.T, name string, src []byte) {
	t.Helper()
	f, errs := Parse(name, src)
	if errs.HasErrors() {
		return
	}
	out, err := Format(f)
	if err != nil {
		t.Fatalf("Format: %v", err)
	}
	g, errs := Parse(name, out)
	if errs.HasErrors() {
		t.Fatalf("the canonical print does not parse: %v\n%s", errs, out)
	}
	if a, b := summary(f), summary(g); a != b {
		t.Fatalf("the canonical print changed the sheet:\n--- before\n%s--- after\n%s", a, b)
	}
	again, err := Format(g)
	if err != nil {
		t.Fatalf("Format of the print: %v", err)
	}
	if !bytes.Equal(out, again) {
		t.Fatalf("Format is not idempotent:\n--- once\n%q\n--- twice\n%q", out, again)
	}
}

// summary describes the content of a file in a layout-free form: blank
// lines are left out (the printer collapses them) and each line of an
// expression is trimmed (the printer re-indents continuation lines).
func summary(f *File) string {
	var b strings.Builder
	expr := func(s string) string {
		lines := strings.Split(s, "\n")
		for i, l := range lines {
			lines[i] = strings.Trim(l, " \t\r")
		}
		return strings.Join(lines, "⏎")
	}
	unit := func(u *UnitSpec) string {
		if u == nil {
			return "-"
		}
		return u.Text
	}
	annot := func(a *Annot) string {
		if a == nil {
			return " @@ "
		}
		return a.Description + " @@ " + a.Reference
	}
	cell := func(prefix string, c *Cell) {
		b.WriteString(prefix + "cell " + c.Name.Name + " [" + unit(c.Unit) + "] = " + expr(c.Expr.Text) + " -- " + annot(c.Annot) + "\n")
	}
	for _, it := range f.Items {
		switch x := it.(type) {
		case *Blank:
		case *Meta:
			b.WriteString("meta " + x.Key.Name + ": " + x.Value + "\n")
		case *Heading:
			b.WriteString("heading " + x.Text + "\n")
		case *Comment:
			b.WriteString("comment #" + x.Text + "\n")
		case *Cell:
			cell("", x)
		case *FuncDef:
			b.WriteString("func " + x.Name.Name + "(")
			for _, p := range x.Params {
				b.WriteString(p.Name.Name + " [" + unit(p.Unit) + "],")
			}
			b.WriteString(") [" + unit(x.Unit) + "] = " + expr(x.Body.Text) + " -- " + annot(x.Annot) + "\n")
		case *Check:
			b.WriteString("check " + x.Name.Name + " in " + x.State.Name + ": " + expr(x.Body.Text) + " -- " + annot(x.Annot) + "\n")
		case *Action:
			cell("action "+x.Kind.Text()+" ", &x.Cell)
		case *Factor:
			b.WriteString("factor " + x.Key + " = " + x.Value.Text + " -- " + annot(x.Annot) + "\n")
		case *Table:
			b.WriteString("table " + x.Name.Name + " -- " + annot(x.Annot) + "\n")
			for _, c := range x.Columns {
				b.WriteString("  column " + c.Name.Name + " [" + unit(c.Unit) + "]\n")
			}
			for _, r := range x.Rows {
				b.WriteString("  row")
				for _, l := range r {
					b.WriteString(" " + l.Text)
				}
				b.WriteString("\n")
			}
		case *Use:
			b.WriteString("use " + x.Name.Name + " from " + x.Path + " -- " + annot(x.Annot) + "\n")
			for _, c := range x.Overrides {
				cell("  ", c)
			}
		}
	}
	return b.String()
}
