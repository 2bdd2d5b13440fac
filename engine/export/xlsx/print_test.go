package xlsxout

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
)

// A printed page as pdftotext -bbox gives it: its size and its words.
type printedPage struct {
	w, h  float64
	words []printedWord
}

type printedWord struct {
	x0, y0, x1, y1 float64
	text           string
}

var (
	pageRE = regexp.MustCompile(`<page width="([0-9.]+)" height="([0-9.]+)">`)
	wordRE = regexp.MustCompile(`<word xMin="([0-9.]+)" yMin="([0-9.]+)" xMax="([0-9.]+)" yMax="([0-9.]+)">([^<]*)</word>`)
)

// readPages runs pdftotext -bbox on a PDF and returns its pages.
func readPages(t *testing.T, pdf string) []printedPage {
	t.Helper()
	out, err := exec.Command("pdftotext", "-bbox", pdf, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext %s: %v", pdf, err)
	}
	var pages []printedPage
	for _, line := range strings.Split(string(out), "\n") {
		if m := pageRE.FindStringSubmatch(line); m != nil {
			w, _ := strconv.ParseFloat(m[1], 64)
			h, _ := strconv.ParseFloat(m[2], 64)
			pages = append(pages, printedPage{w: w, h: h})
			continue
		}
		if m := wordRE.FindStringSubmatch(line); m != nil && len(pages) > 0 {
			var v [4]float64
			for i := range v {
				v[i], _ = strconv.ParseFloat(m[i+1], 64)
			}
			p := &pages[len(pages)-1]
			p.words = append(p.words, printedWord{v[0], v[1], v[2], v[3], m[5]})
		}
	}
	return pages
}

// band returns the words of a page between the heights y0 and y1.
func (p printedPage) band(y0, y1 float64) []printedWord {
	var out []printedWord
	for _, w := range p.words {
		if w.y0 >= y0 && w.y1 <= y1 {
			out = append(out, w)
		}
	}
	return out
}

func texts(ws []printedWord) string {
	s := make([]string, len(ws))
	for i, w := range ws {
		s[i] = w.text
	}
	return strings.Join(s, " ")
}

// headerBand and footerBand are the heights (points from the top and the
// bottom edge) within which the page header and footer print.
const headerBand, footerBand = 55.0, 55.0

// TestPrintedWorkbook renders the workbook of every bundled sheet to PDF
// with the other spreadsheet engine (one soffice run) and reads the pages
// back with poppler's pdftotext:
//   - the footer's "page i of N" counts the pages of the file;
//   - no page is blank (each has words between its header and footer);
//   - every page of the Calculation tab repeats the column headers;
//   - no text prints below 8 points. The header is set in 9 points and
//     never scaled, so the height of its words calibrates the others.
//
// Source: the rendering of the other spreadsheet engine and poppler's
// text boxes are the reference; 8 points is the smallest size commonly
// accepted for printed technical documents (common practice).
func TestPrintedWorkbook(t *testing.T) {
	if _, err := exec.LookPath("pdftotext"); err != nil {
		t.Skip("pdftotext (poppler-utils) is not installed")
	}
	cmd, profile := office(t)
	dir := t.TempDir()
	var books []string
	for _, path := range everySheet(t) {
		s := load(t, path)
		f := build(t, s, s.NewState().Eval())
		book := filepath.Join(dir, strings.TrimSuffix(filepath.Base(path), ".sheaf")+".xlsx")
		if err := f.SaveAs(book); err != nil {
			t.Fatal(err)
		}
		books = append(books, book)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 8*time.Minute)
	defer cancel()
	out := filepath.Join(dir, "pdf")
	args := append([]string{"-env:UserInstallation=file://" + profile, "--headless", "--convert-to", "pdf", "--outdir", out}, books...)
	if msg, err := exec.CommandContext(ctx, cmd, args...).CombinedOutput(); err != nil {
		t.Skipf("soffice could not print the workbooks here: %v\n%s", err, msg)
	}
	footerRE := regexp.MustCompile(`page ([0-9]+) of ([0-9]+)`)
	for _, book := range books {
		name := strings.TrimSuffix(filepath.Base(book), ".xlsx")
		t.Run(name, func(t *testing.T) {
			pdf := filepath.Join(out, name+".pdf")
			if _, err := os.Stat(pdf); err != nil {
				t.Fatalf("no PDF: %v", err)
			}
			pages := readPages(t, pdf)
			if len(pages) == 0 {
				t.Fatal("no pages")
			}
			smallest, calc := 100.0, 0
			for i, p := range pages {
				head := p.band(0, headerBand)
				foot := p.band(p.h-footerBand, p.h)
				body := p.band(headerBand, p.h-footerBand)
				m := footerRE.FindStringSubmatch(texts(foot))
				if m == nil || m[1] != strconv.Itoa(i+1) || m[2] != strconv.Itoa(len(pages)) {
					t.Errorf("page %d: footer %q, want page %d of %d", i+1, texts(foot), i+1, len(pages))
				}
				if len(body) == 0 {
					t.Errorf("page %d is blank", i+1)
				}
				if strings.Contains(texts(foot), TabCalc) {
					calc++
					if !strings.Contains(texts(body), "Expression as written") {
						t.Errorf("Calculation page %d has no column headers", i+1)
					}
				}
				if len(head) == 0 {
					t.Errorf("page %d has no header", i+1)
					continue
				}
				ref := head[0].y1 - head[0].y0 // 9 points
				for _, w := range body {
					smallest = min(smallest, 9*(w.y1-w.y0)/ref)
				}
			}
			if calc == 0 {
				t.Error("no Calculation page")
			}
			if smallest < 8 {
				t.Errorf("text prints at %.1f points; at least 8 wanted", smallest)
			}
			t.Logf("%d pages (%d of the Calculation tab), smallest text %.1f points", len(pages), calc, smallest)
		})
	}
}
