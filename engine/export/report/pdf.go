package report

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"time"
)

// The PDF is printed by a headless Chromium through its command line
// (--headless --print-to-pdf) rather than driven over the DevTools protocol
// (chromedp): the running header and footer come from the report's own
// print style (@page margin boxes), so nothing needs the protocol's
// header templates, and the command line adds no dependency to Sheaf.

// ErrNoBrowser is returned by PrintPDF when no Chromium can be found.
var ErrNoBrowser = errors.New("no Chromium browser found to print the PDF: install one (Debian or Ubuntu: apt-get install chromium; others: Chromium or Google Chrome from the vendor), or set SHEAF_CHROMIUM to its path; or open the HTML report in any browser and print it to PDF from there (A4 or Letter, margins as the page sets them, no browser headers)")

// browserNames are the commands tried, in order, after SHEAF_CHROMIUM.
var browserNames = []string{"chromium", "chromium-browser", "google-chrome", "google-chrome-stable", "chrome"}

// FindBrowser returns the path of a Chromium to print with: SHEAF_CHROMIUM
// when set, else the first of the usual names on the PATH.
func FindBrowser() (string, error) {
	if p := os.Getenv("SHEAF_CHROMIUM"); p != "" {
		if _, err := exec.LookPath(p); err != nil {
			return "", fmt.Errorf("SHEAF_CHROMIUM=%s: %v; %w", p, err, ErrNoBrowser)
		}
		return p, nil
	}
	for _, n := range browserNames {
		if p, err := exec.LookPath(n); err == nil {
			return p, nil
		}
	}
	return "", ErrNoBrowser
}

// PrintTimeout bounds one run of the browser.
const PrintTimeout = 90 * time.Second

// PrintPDF prints the HTML file at htmlPath to a PDF at pdfPath with the
// browser at browser. The PDF is written beside pdfPath first and renamed
// into place, so an existing PDF is replaced only by a complete one.
func PrintPDF(ctx context.Context, browser, htmlPath, pdfPath string) error {
	abs, err := filepath.Abs(htmlPath)
	if err != nil {
		return err
	}
	profile, err := os.MkdirTemp("", "sheaf-chromium-")
	if err != nil {
		return err
	}
	defer os.RemoveAll(profile)
	tmp := filepath.Join(filepath.Dir(pdfPath), "."+filepath.Base(pdfPath)+".tmp")
	defer os.Remove(tmp)
	ctx, cancel := context.WithTimeout(ctx, PrintTimeout)
	defer cancel()
	// --no-sandbox: Chromium refuses to start its sandbox as root (CI
	// containers); the page printed is the report alone, which loads
	// nothing from the network and runs no script.
	cmd := exec.CommandContext(ctx, browser,
		"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--disable-extensions", "--user-data-dir="+profile, "--no-pdf-header-footer",
		"--print-to-pdf="+tmp, "file://"+filepath.ToSlash(abs))
	var out bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &out
	cmd.WaitDelay = 5 * time.Second
	if err := cmd.Run(); err != nil {
		if ctx.Err() != nil {
			return fmt.Errorf("the browser did not finish printing within %s", PrintTimeout)
		}
		return fmt.Errorf("the browser failed to print the PDF: %v\n%s", err, lastLines(out.String(), 8))
	}
	fi, err := os.Stat(tmp)
	if err != nil || fi.Size() == 0 {
		return fmt.Errorf("the browser ran but wrote no PDF\n%s", lastLines(out.String(), 8))
	}
	return os.Rename(tmp, pdfPath)
}

func lastLines(s string, n int) string {
	lines := strings.Split(strings.TrimSpace(s), "\n")
	if len(lines) > n {
		lines = lines[len(lines)-n:]
	}
	return strings.Join(lines, "\n")
}
