package main

import (
	"bufio"
	"context"
	"net/http"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

func TestReportCommand(t *testing.T) {
	dir := t.TempDir()
	src, err := os.ReadFile(filepath.Join("..", "..", "sheets", "mezzanine-hanger.sheaf"))
	if err != nil {
		t.Fatal(err)
	}
	sheet := filepath.Join(dir, "hanger.sheaf")
	if err := os.WriteFile(sheet, src, 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name     string
		args     []string
		code     int
		file     string // written
		stderr   string
		contains string
	}{
		{"default name", []string{"report", sheet}, exitOK, filepath.Join(dir, "hanger.html"), "", "Sign-off"},
		{"letter", []string{"report", sheet, "-o", filepath.Join(dir, "l.html"), "--paper", "letter"}, exitOK, filepath.Join(dir, "l.html"), "", "size: letter"},
		{"failing check", []string{"report", sheet, "-o", filepath.Join(dir, "f.html"), "--set", "q_k=90kN/m^2"}, exitChecks, filepath.Join(dir, "f.html"), "failed", "FAILS"},
		{"bad paper", []string{"report", sheet, "--paper", "a3"}, exitInput, "", "use a4 or letter", ""},
		{"bad extension", []string{"report", sheet, "-o", filepath.Join(dir, "x.pdf")}, exitInput, "", "extension .html", ""},
		{"over the sheet", []string{"report", sheet, "--pdf", sheet}, exitInput, "", "extension .pdf", ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out, errb strings.Builder
			code := Main(tt.args, strings.NewReader(""), &out, &errb)
			if code != tt.code {
				t.Fatalf("exit %d, want %d; stderr:\n%s", code, tt.code, errb.String())
			}
			if tt.stderr != "" && !strings.Contains(errb.String(), tt.stderr) {
				t.Errorf("stderr %q lacks %q", errb.String(), tt.stderr)
			}
			if tt.file != "" {
				b, err := os.ReadFile(tt.file)
				if err != nil {
					t.Fatal(err)
				}
				if !strings.Contains(string(b), tt.contains) {
					t.Errorf("%s lacks %q", tt.file, tt.contains)
				}
			}
		})
	}
}

func TestReportNoBrowser(t *testing.T) {
	t.Setenv("SHEAF_CHROMIUM", filepath.Join(t.TempDir(), "no-such-browser"))
	var out, errb strings.Builder
	code := Main([]string{"report", filepath.Join("..", "..", "sheets", "mezzanine-hanger.sheaf"), "--pdf", filepath.Join(t.TempDir(), "x.pdf")}, strings.NewReader(""), &out, &errb)
	if code != exitInput {
		t.Fatalf("exit %d, want %d", code, exitInput)
	}
	for _, want := range []string{"apt-get install chromium", "print it to PDF"} {
		if !strings.Contains(errb.String(), want) {
			t.Errorf("message lacks %q:\n%s", want, errb.String())
		}
	}
}

func TestServeAddr(t *testing.T) {
	for in, want := range map[string]string{"": DefaultServe, "9000": "127.0.0.1:9000", "0.0.0.0:80": "0.0.0.0:80", "[::1]:1": "[::1]:1"} {
		if got := serveAddr(in); got != want {
			t.Errorf("serveAddr(%q) = %q, want %q", in, got, want)
		}
	}
}

var urlRE = regexp.MustCompile(`serving the report at (http://\S+)`)

// TestWatchServe runs the live preview: the page is served on the loopback
// address, a save sends the new report to the open event stream, and a
// save with an error sends the error at its line.
func TestWatchServe(t *testing.T) {
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
		done <- runWatch(ctx, a, &watchOptions{interval: 30 * time.Millisecond, rtol: 1e-6, serve: "127.0.0.1:0"}, path, func() { close(ready) })
	}()
	select {
	case <-ready:
	case err := <-done:
		t.Fatalf("watch ended: %v\n%s", err, errb.String())
	case <-time.After(10 * time.Second):
		t.Fatal("the watcher did not start")
	}
	m := urlRE.FindStringSubmatch(out.String())
	if m == nil || !strings.HasPrefix(m[1], "http://127.0.0.1:") {
		t.Fatalf("no loopback URL printed:\n%s", out.String())
	}
	resp, err := http.Get(m[1])
	if err != nil {
		t.Fatal(err)
	}
	page := new(strings.Builder)
	_, _ = bufio.NewReader(resp.Body).WriteTo(page)
	resp.Body.Close()
	if !strings.Contains(page.String(), "EventSource") || !strings.Contains(page.String(), "Sign-off") {
		t.Fatalf("page is not the live report:\n%.400s", page.String())
	}
	ev, err := http.Get(m[1] + "events")
	if err != nil {
		t.Fatal(err)
	}
	defer ev.Body.Close()
	events := make(chan string, 8)
	go func() {
		sc := bufio.NewScanner(ev.Body)
		sc.Buffer(make([]byte, 1<<20), 1<<24)
		var b strings.Builder
		for sc.Scan() {
			line := sc.Text()
			if line == "" {
				if b.Len() > 0 {
					events <- b.String()
				}
				b.Reset()
				continue
			}
			b.WriteString(line + "\n")
		}
	}()
	save := func(text string) time.Time {
		tmp := filepath.Join(dir, ".tie.swp")
		if err := os.WriteFile(tmp, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		at := time.Now()
		if err := os.Rename(tmp, path); err != nil {
			t.Fatal(err)
		}
		return at
	}
	wait := func(want string) time.Duration {
		t.Helper()
		start := time.Now()
		for {
			select {
			case e := <-events:
				if strings.Contains(e, want) {
					return time.Since(start)
				}
			case <-time.After(2 * time.Second):
				t.Fatalf("no event with %q within 2 s of the save", want)
			}
		}
	}
	changed := strings.Replace(string(src), "P [kN] = 30 kN", "P [kN] = 60 kN", 1)
	if changed == string(src) {
		t.Fatal("test sheet has no P [kN] = 30 kN line")
	}
	save(changed)
	took := wait("60")
	t.Logf("save to event: %v (includes the %v quiet interval)", took, 30*time.Millisecond)
	save(changed + "\nbroken [kN] = 3 m\n")
	wait("liveerr")
	cancel()
	select {
	case <-done:
	case <-time.After(5 * time.Second):
		t.Fatal("watch did not stop")
	}
}

// TestReportWithActions: sheaf report of a sheet with actions writes the
// report with the combinations table and each check's governing
// combination.
func TestReportWithActions(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "canopy.html")
	var stdout, stderr strings.Builder
	code := Main([]string{"report", filepath.Join("..", "..", "sheets", "canopy-hanger.sheaf"), "-o", out}, strings.NewReader(""), &stdout, &stderr)
	if code != exitOK {
		t.Fatalf("exit %d; stderr:\n%s", code, stderr.String())
	}
	html, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Actions and combinations", "EN 1990 6.10", "governs ULS 2: 1.35 G + 1.5 S + 1.35 w_rod", "governs SLS-c 2"} {
		if !strings.Contains(string(html), want) {
			t.Errorf("the report lacks %q", want)
		}
	}
}
