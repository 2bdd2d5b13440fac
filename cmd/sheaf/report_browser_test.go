package main

import (
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"github.com/sheafcalc/sheaf/engine/export/report"
)

// TestLivePreviewInBrowser opens the live preview in a headless Chromium
// (driven over the DevTools protocol with chromedp, which only this test
// uses: it must see the page change without reloading it), saves the sheet
// with a new load, and waits for the open page to show it. The target is
// 200 ms from save to page with the default quiet interval of 100 ms; the
// test fails only beyond 2 s, since a shared CI machine may be slow, and
// logs the time it measured.
func TestLivePreviewInBrowser(t *testing.T) {
	browser, err := report.FindBrowser()
	if err != nil {
		t.Skipf("skipped: %v", err)
	}
	if testing.Short() {
		t.Skip("skipped in -short mode: starts a browser")
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "tie.sheaf")
	src, err := os.ReadFile(filepath.Join("testdata", "batch", "tie.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, src, 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb syncBuffer
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	ready := make(chan struct{})
	done := make(chan error, 1)
	go func() {
		done <- runWatch(ctx, a, &watchOptions{interval: 100 * time.Millisecond, rtol: 1e-6, serve: "127.0.0.1:0"}, path, func() { close(ready) })
	}()
	select {
	case <-ready:
	case err := <-done:
		t.Fatalf("watch ended: %v\n%s", err, errb.String())
	case <-time.After(10 * time.Second):
		t.Fatal("the watcher did not start")
	}
	m := urlRE.FindStringSubmatch(out.String())
	if m == nil {
		t.Fatalf("no URL printed:\n%s", out.String())
	}
	opts := append(chromedp.DefaultExecAllocatorOptions[:], chromedp.ExecPath(browser), chromedp.NoSandbox,
		chromedp.DisableGPU, chromedp.UserDataDir(t.TempDir()), chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-component-update", true))
	actx, acancel := chromedp.NewExecAllocator(ctx, opts...)
	defer acancel()
	bctx, bcancel := chromedp.NewContext(actx)
	defer bcancel()
	if err := chromedp.Do(bctx, chromedp.Navigate(m[1])); err != nil {
		t.Fatalf("loading the preview: %v", err)
	}
	if _, err := chromedp.Run(bctx, chromedp.Poll[bool](`document.documentElement.getAttribute("data-live") === "open"`, chromedp.WithPollingTimeout(10*time.Second))); err != nil {
		t.Fatalf("the page did not open its event stream: %v", err)
	}
	title, err := chromedp.Run(bctx, chromedp.Title())
	if err != nil {
		t.Fatal(err)
	}
	if title != "Bracing tie of a loading-bay canopy" {
		t.Errorf("page title %q", title)
	}
	changed := strings.Replace(string(src), "P [kN] = 30 kN", "P [kN] = 60 kN", 1)
	tmp := filepath.Join(dir, ".tie.swp")
	if err := os.WriteFile(tmp, []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	saved := time.Now()
	if err := os.Rename(tmp, path); err != nil {
		t.Fatal(err)
	}
	if _, err := chromedp.Run(bctx, chromedp.Poll[bool](`document.querySelector("table.checks").textContent.includes("60 kN")`,
		chromedp.WithPollingInterval(2*time.Millisecond), chromedp.WithPollingTimeout(2*time.Second))); err != nil {
		t.Fatalf("the open page did not show the new load within 2 s of the save: %v", err)
	}
	took := time.Since(saved)
	t.Logf("save to page: %v (target 200 ms, quiet interval 100 ms)", took.Round(time.Millisecond))
	// a save with an error shows it on the page, the report stays below it
	if err := os.WriteFile(tmp, []byte(changed+"\nbroken [kN] = 3 m\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Rename(tmp, path); err != nil {
		t.Fatal(err)
	}
	if _, err := chromedp.Run(bctx, chromedp.Poll[bool](`document.querySelector(".liveerr") !== null`, chromedp.WithPollingTimeout(2*time.Second))); err != nil {
		t.Fatalf("the error did not show on the page: %v", err)
	}
	errText, err := chromedp.Run(bctx, chromedp.Text(".liveerr pre"))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(errText, "tie.sheaf:") || !strings.Contains(errText, "broken") {
		t.Errorf("the error on the page does not show its line:\n%s", errText)
	}
}
