package main

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// syncBuffer is a bytes.Buffer safe for the watcher and the test to share.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// waitFor polls until buf holds want or the time is up.
func waitFor(t *testing.T, buf *syncBuffer, want string) {
	t.Helper()
	deadline := time.Now().Add(10 * time.Second)
	for time.Now().Before(deadline) {
		if strings.Contains(buf.String(), want) {
			return
		}
		time.Sleep(20 * time.Millisecond)
	}
	t.Fatalf("timed out waiting for %q; got:\n%s", want, buf.String())
}

func TestWatch(t *testing.T) {
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
	ready := make(chan struct{})
	done := make(chan error, 1)
	go func() {
		done <- runWatch(ctx, a, &watchOptions{interval: 50 * time.Millisecond, rtol: 1e-6}, path, func() { close(ready) })
	}()
	select {
	case <-ready:
	case <-time.After(10 * time.Second):
		t.Fatal("the watcher did not start")
	}
	if !strings.Contains(out.String(), "Design checks") || !strings.Contains(out.String(), "watching "+path) {
		t.Fatalf("first run:\n%s", out.String())
	}

	// Save a new load the way editors do: write a temporary file and
	// rename it over the sheet.
	tmp := filepath.Join(dir, ".tie.sheaf.swp")
	changed := strings.Replace(string(src), "P [kN] = 30 kN", "P [kN] = 60 kN", 1)
	if err := os.WriteFile(tmp, []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Rename(tmp, path); err != nil {
		t.Fatal(err)
	}
	waitFor(t, &out, "checks changed")
	report := strings.ReplaceAll(out.String()[strings.Index(out.String(), "== run 2"):], dir, "TMP")
	golden.Check(t, filepath.Join("testdata", "watch", "rerun.golden"), []byte(report), *update)

	// A broken save shows the diagnostics and the watch goes on.
	if err := os.WriteFile(path, []byte(changed+"x [kN] = P +\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	waitFor(t, &errb, "fix and save to re-run")
	// Fixing it compares with the last good run.
	fixed := strings.Replace(changed, "P [kN] = 60 kN", "P [kN] = 30 kN", 1)
	if err := os.WriteFile(path, []byte(fixed), 0o644); err != nil {
		t.Fatal(err)
	}
	waitFor(t, &out, "== run 4")
	waitFor(t, &out, "60 kN → 30 kN")
	cancel()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("watch ended with %v, want nil on cancel", err)
		}
	case <-time.After(5 * time.Second):
		t.Fatal("the watcher did not stop")
	}
}

func TestWatchErrors(t *testing.T) {
	if _, errs, code := sheaf(t, "watch", filepath.Join(t.TempDir(), "none.sheaf")); code != exitInput || !strings.Contains(errs, "no such file") {
		t.Errorf("missing file: exit %d, %s", code, errs)
	}
	if _, errs, code := sheaf(t, "watch", "--interval", "0s", "x.sheaf"); code != exitInput || !strings.Contains(errs, "positive") {
		t.Errorf("zero interval: exit %d, %s", code, errs)
	}
	for _, rtol := range []string{"-1", "1", "NaN"} {
		if _, errs, code := sheaf(t, "watch", "--rtol", rtol, "x.sheaf"); code != exitInput || !strings.Contains(errs, "relative tolerance") {
			t.Errorf("--rtol %s: exit %d, %s", rtol, code, errs)
		}
	}
}

// TestWatchTemplate: saving a template the sheet uses re-runs the sheet.
func TestWatchTemplate(t *testing.T) {
	dir := t.TempDir()
	rod := "title: rod\nP [kN] = 10 kN  -- load\nA [mm^2] = 100 mm^2\nsigma [MPa] = P / A\n"
	main := "title: user\nuse r from \"rod.sheaf\"  -- the rod\n    P = 20 kN\nf_y [MPa] = 235 MPa\ncheck stress: r.sigma <= f_y\n"
	for name, text := range map[string]string{"rod.sheaf": rod, "main.sheaf": main} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	var out, errb syncBuffer
	a := &app{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	ready := make(chan struct{})
	done := make(chan error, 1)
	go func() {
		done <- runWatch(ctx, a, &watchOptions{interval: 50 * time.Millisecond, rtol: 1e-6}, filepath.Join(dir, "main.sheaf"), func() { close(ready) })
	}()
	select {
	case <-ready:
	case <-time.After(10 * time.Second):
		t.Fatalf("the watcher did not start: %s", errb.String())
	}
	if !strings.Contains(out.String(), "Design checks") {
		t.Fatalf("first run:\n%s\n%s", out.String(), errb.String())
	}
	// Only the template changes: the area halves, the stress doubles.
	if err := os.WriteFile(filepath.Join(dir, "rod.sheaf"), []byte(strings.Replace(rod, "100 mm^2", "50 mm^2", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	waitFor(t, &out, "== run 2")
	waitFor(t, &out, "85.1 % ok → 170 % FAILS")
	cancel()
	if err := <-done; err != nil {
		t.Error(err)
	}
}
