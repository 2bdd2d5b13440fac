package report

import (
	"flag"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden reports under testdata/")

// hashRE matches a SHA-256 in hex: the golden form leaves them out, so
// that a change of a sheet's comment shows in the diff once, not in every
// header line.
var hashRE = regexp.MustCompile(`[0-9a-f]{64}|SHA-256 [0-9a-f]{12}`)

// normaliseHTML puts each block element on a line of its own, so that a
// golden diff shows the cell that changed.
// styleRE is the report's style sheet: its @page rule (the running header
// and footer of the sheet) stays in each page's golden; the rest is the
// same in every report, and its golden is testdata/golden/style.css.
var styleRE = regexp.MustCompile(`(?s)<style>(.*?\n\}\n)(.*?)</style>`)

func normaliseHTML(html string) string {
	html = hashRE.ReplaceAllString(html, "<hash>")
	html = styleRE.ReplaceAllString(html, "<style>$1(the rest: testdata/golden/style.css)</style>")
	r := strings.NewReplacer("<div", "\n<div", "<tr", "\n<tr", "<p ", "\n<p ", "<p>", "\n<p>", "<section", "\n<section",
		"<h2", "\n<h2", "<h3", "\n<h3", "<h4", "\n<h4", "<table", "\n<table", "<figure", "\n<figure", "<svg", "\n<svg", "<path", "\n<path")
	return r.Replace(html)
}

// TestGolden writes the report of every bundled sheet and compares its
// normalised form with the golden file; it also checks that a second
// rendering gives the same bytes.
func TestGolden(t *testing.T) {
	for _, path := range bundled(t) {
		name := strings.TrimSuffix(filepath.Base(path), ".sheaf")
		t.Run(name, func(t *testing.T) {
			s, r := load(t, path)
			got := Render(s, r, testOptions)
			if again := Render(s, s.Run(nil), testOptions); again != got {
				t.Fatal("two reports of the same sheet differ")
			}
			m := styleRE.FindStringSubmatch(got)
			if m == nil {
				t.Fatal("the report has no style sheet")
			}
			golden.Check(t, filepath.Join("testdata", "golden", "style.css"), []byte(m[2]), *update)
			golden.Check(t, filepath.Join("testdata", "golden", name+".html"), []byte(normaliseHTML(got)), *update)
		})
	}
}

// TestContent checks what every report must carry, whatever the sheet.
func TestContent(t *testing.T) {
	for _, path := range bundled(t) {
		t.Run(filepath.Base(path), func(t *testing.T) {
			s, r := load(t, path)
			html := Render(s, r, testOptions)
			for _, want := range []string{
				"Results must be checked by a qualified engineer",
				"Sign-off", "Prepared", "Checked", "Approved",
				"SHA-256 " + Hash(s.Source()),
				"size: A4",
				"counter(page)", "counter(pages)",
			} {
				if !strings.Contains(html, want) {
					t.Errorf("report lacks %q", want)
				}
			}
			for _, f := range s.Files()[1:] {
				if !strings.Contains(html, Hash(s.Sources()[f])) {
					t.Errorf("report lacks the hash of template %s", f)
				}
			}
			for _, bad := range []string{"http://", "https://", "<link", "<img", "@import", "src="} {
				if strings.Contains(strings.ReplaceAll(html, "http://www.w3.org/2000/svg", ""), bad) {
					t.Errorf("report is not self-contained: it has %q", bad)
				}
			}
			if m := s.Meta(); m.Title != "" && !strings.Contains(html, esc(m.Title)) {
				t.Errorf("title %q missing", m.Title)
			}
			if letter := Render(s, r, Options{Version: "x", Paper: Letter}); !strings.Contains(letter, "size: letter") {
				t.Error("--paper letter does not set the page size")
			}
			if strings.Contains(html, "Run at") {
				t.Error("a report without Stamp prints a time")
			}
		})
	}
}
