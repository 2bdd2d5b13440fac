package report

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
)

// needPrinting skips the test where no browser or no poppler tools are
// installed (.ci/run installs Debian's chromium and poppler-utils).
func needPrinting(t *testing.T) string {
	t.Helper()
	browser, err := FindBrowser()
	if err != nil {
		t.Skipf("skipped: %v", err)
	}
	for _, tool := range []string{"pdftotext", "pdfinfo"} {
		if _, err := exec.LookPath(tool); err != nil {
			t.Skipf("skipped: %s not found (Debian: apt-get install poppler-utils)", tool)
		}
	}
	return browser
}

func run(t *testing.T, name string, args ...string) string {
	t.Helper()
	out, err := exec.Command(name, args...).Output()
	if err != nil {
		t.Fatalf("%s %v: %v", name, args, err)
	}
	return string(out)
}

var pagesRE = regexp.MustCompile(`(?m)^Pages:\s+(\d+)`)
var pageBoxRE = regexp.MustCompile(`<page width="([0-9.]+)" height="([0-9.]+)">`)
var wordRE = regexp.MustCompile(`<word xMin="([0-9.]+)" yMin="([0-9.]+)" xMax="([0-9.]+)" yMax="([0-9.]+)">([^<]*)</word>`)

// TestPrintPDF prints every bundled sheet's report through the browser and
// reads the PDF back with poppler: every page has the running header and
// the footer with its page number and the sheet's short hash, every cell's
// value and every check's verdict is in the text, and no word lies outside
// the page.
func TestPrintPDF(t *testing.T) {
	browser := needPrinting(t)
	if testing.Short() {
		t.Skip("skipped in -short mode: prints every bundled sheet")
	}
	dir := t.TempDir()
	for _, path := range bundled(t) {
		name := strings.TrimSuffix(filepath.Base(path), ".sheaf")
		t.Run(name, func(t *testing.T) {
			s, r := load(t, path)
			d := &doc{s: s, res: r, prog: s.Program(), src: s.Sources(), sig: engine.DefaultSigFigs}
			html := filepath.Join(dir, name+".html")
			pdf := filepath.Join(dir, name+".pdf")
			if err := os.WriteFile(html, []byte(Render(s, r, testOptions)), 0o600); err != nil {
				t.Fatal(err)
			}
			if err := PrintPDF(context.Background(), browser, html, pdf); err != nil {
				t.Fatal(err)
			}
			m := pagesRE.FindStringSubmatch(run(t, "pdfinfo", pdf))
			if m == nil {
				t.Fatal("pdfinfo gives no page count")
			}
			n, _ := strconv.Atoi(m[1])
			if n < 1 || n > 30 {
				t.Fatalf("%d pages", n)
			}
			text := run(t, "pdftotext", "-layout", pdf, "-")
			pages := strings.Split(strings.TrimRight(text, "\f\n"), "\f")
			if len(pages) != n {
				t.Fatalf("pdftotext gives %d pages, pdfinfo %d", len(pages), n)
			}
			short := Hash(s.Source())[:12]
			title := s.Meta().Title
			for i, p := range pages {
				flat := strings.Join(strings.Fields(p), " ")
				for _, want := range []string{title, "Page " + strconv.Itoa(i+1) + " of " + strconv.Itoa(n), short} {
					if !strings.Contains(flat, want) {
						t.Errorf("page %d lacks %q", i+1, want)
					}
				}
			}
			squeezed := strings.Join(strings.Fields(text), "")
			for _, c := range s.Cells() {
				cr := r.Cells[c.Index]
				x, ok := cr.Value.(float64)
				if !cr.Known || !ok || c.Kind == engine.Function || c.Kind == engine.Check {
					continue
				}
				want := printedValue(d, c, x, cr)
				if !strings.Contains(squeezed, want) {
					t.Errorf("value of %s (%s) not in the PDF text", c.Name, want)
				}
			}
			for _, ch := range r.Checks {
				word, _ := verdict(ch)
				want := strings.ReplaceAll(pct(ch.Util), " ", "") + word
				if !strings.Contains(squeezed, want) {
					t.Errorf("check %s: %q not in the PDF text", ch.Cell.Name, want)
				}
			}
			box := run(t, "pdftotext", "-bbox", pdf, "-")
			pb := pageBoxRE.FindStringSubmatch(box)
			if pb == nil {
				t.Fatal("no page box in pdftotext -bbox")
			}
			w, _ := strconv.ParseFloat(pb[1], 64)
			h, _ := strconv.ParseFloat(pb[2], 64)
			for _, wm := range wordRE.FindAllStringSubmatch(box, -1) {
				x0, _ := strconv.ParseFloat(wm[1], 64)
				y0, _ := strconv.ParseFloat(wm[2], 64)
				x1, _ := strconv.ParseFloat(wm[3], 64)
				y1, _ := strconv.ParseFloat(wm[4], 64)
				// 10 mm of the 16 mm right margin and of the others must stay clear
				const clear = 10 / 25.4 * 72
				if x0 < clear || y0 < clear*0.5 || x1 > w-clear || y1 > h-clear*0.5 {
					t.Errorf("word %q at x %.0f–%.0f, y %.0f–%.0f pt runs into the page edge (page %.0f × %.0f pt)", wm[5], x0, x1, y0, y1, w, h)
				}
			}
		})
	}
}

// printedValue is the text a cell's value is printed as: the number as written
// when the report shows the written literal, else the formatted result;
// the digits only (signs and exponents are set as MathML).
func printedValue(d *doc, c *engine.Cell, x float64, cr engine.CellResult) string {
	s := d.formatSI(x, cr.Unit)
	if !c.Body().IsZero() && c.Body().Op() == check.OpConst {
		if lit := strings.TrimSpace(d.text(c.Body())); lit != "" && (normalise(lit) == normalise(s) || d.sameUnit(c.Body(), &cr)) {
			s, _ = splitLiteral(lit)
		}
	}
	s = strings.TrimLeft(s, "−-+")
	if i := strings.IndexAny(s, "eE"); i > 0 {
		s = s[:i]
	}
	num, _, _ := strings.Cut(s, " ")
	return num
}
