package main

import (
	"context"
	"errors"
	"fmt"
	"html"
	"io"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/export/report"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
)

// reportOptions are the flags of `sheaf report`.
type reportOptions struct {
	out   string
	pdf   string
	paper string
	stamp bool
	sets  []string
	sheet sheetFlags
}

func newReportCmd(a *app) *cobra.Command {
	o := &reportOptions{}
	cmd := &cobra.Command{
		Use:   "report FILE [-o calc.html] [--pdf calc.pdf]",
		Short: "Write the calculation as a printable document (HTML, PDF)",
		Long: `Report evaluates the sheet and writes it as a calculation document for the
checking engineer: a title block with the header, the Sheaf version and the
SHA-256 of the sheet and its templates; the summary of design checks; the
sections in reading order with the comments as prose, every formula typeset
with its values substituted and its result, references in a margin column;
diagrams of bar results and drawings of sections; a sign-off block.

The HTML is one file (styles and pictures inline, no network access) that
prints on A4 or US Letter from any browser. --pdf prints it through a
headless Chromium (Debian: apt-get install chromium; SHEAF_CHROMIUM names
another). Without -o the HTML goes beside the sheet with the extension
.html; with --pdf alone only the PDF is written.

The same sheet gives the same bytes; --stamp adds the time of the run.

Exit status: 0 when the report is written and every design check passes,
1 when it is written but a check fails or cannot be assessed, 2 when the
sheet, a flag or an output path is wrong, 3 when the browser fails.`,
		Example: `  sheaf report hanger.sheaf
  sheaf report hanger.sheaf -o calc.html --pdf calc.pdf --paper letter`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			ctx := cmd.Context()
			if ctx == nil {
				ctx = context.Background()
			}
			return runReport(ctx, a, o, args[0])
		},
	}
	f := cmd.Flags()
	f.StringVarP(&o.out, "output", "o", "", "HTML file to write (default: the sheet's name with .html)")
	f.StringVar(&o.pdf, "pdf", "", "also print the report to this PDF through a headless Chromium")
	f.StringVar(&o.paper, "paper", report.A4, "paper size: a4 or letter")
	f.BoolVar(&o.stamp, "stamp", false, "print the time of the run in the title block (the bytes then differ per run)")
	f.StringArrayVar(&o.sets, "set", nil, setUsage)
	o.sheet.add(cmd, true)
	return cmd
}

// reportVersion is the version the title block prints.
func reportVersion() string {
	if version != "" {
		return version
	}
	return report.BuildVersion()
}

func runReport(ctx context.Context, a *app, o *reportOptions, path string) error {
	paper := strings.ToLower(o.paper)
	if !report.ValidPaper(paper) {
		return userErrorf("--paper %s: use a4 or letter", o.paper)
	}
	out := o.out
	if out == "" && o.pdf == "" {
		out = strings.TrimSuffix(path, filepath.Ext(path)) + ".html"
	}
	for _, p := range []struct{ path, ext, flag string }{{out, ".html", "-o"}, {o.pdf, ".pdf", "--pdf"}} {
		if p.path == "" {
			continue
		}
		if e := strings.ToLower(filepath.Ext(p.path)); e != p.ext && !(p.ext == ".html" && e == ".htm") {
			return userErrorf("%s %s: the file needs the extension %s, e.g. %s %s%s", p.flag, p.path, p.ext, p.flag, strings.TrimSuffix(p.path, filepath.Ext(p.path)), p.ext)
		}
		if same(p.path, path) {
			return userErrorf("%s %s would overwrite the sheet itself; choose another name", p.flag, p.path)
		}
	}
	s, st, err := loadState(a, path, &o.sheet, o.sets)
	if err != nil {
		return err
	}
	res := st.Eval()
	opt := report.Options{Paper: paper, Version: reportVersion()}
	if o.stamp {
		opt.Stamp = time.Now()
	}
	html := report.Render(s, res, opt)
	if out != "" {
		if err := atomicfile.WriteFile(out, []byte(html), 0o644); err != nil {
			return userErrorf("cannot write %s: %v", out, err)
		}
		fmt.Fprintf(a.stdout, "wrote %s\n", out)
	}
	if o.pdf != "" {
		if err := printPDF(ctx, html, out, o.pdf); err != nil {
			return err
		}
		fmt.Fprintf(a.stdout, "wrote %s\n", o.pdf)
	}
	if n := res.Failed(); n > 0 {
		fmt.Fprintf(a.stderr, "%s; the report shows them\n", (&checksFailedError{n}).Error())
		return &reportedError{&checksFailedError{n}, exitChecks}
	}
	return nil
}

// printPDF prints the report through a headless browser: from the HTML
// file just written, or from a temporary copy when only a PDF is asked for.
func printPDF(ctx context.Context, html, htmlPath, pdfPath string) error {
	browser, err := report.FindBrowser()
	if err != nil {
		return userErrorf("--pdf %s: %v", pdfPath, err)
	}
	if htmlPath == "" {
		dir, err := os.MkdirTemp("", "sheaf-report-")
		if err != nil {
			return err
		}
		defer os.RemoveAll(dir)
		htmlPath = filepath.Join(dir, "report.html")
		if err := os.WriteFile(htmlPath, []byte(html), 0o600); err != nil {
			return err
		}
	}
	if err := report.PrintPDF(ctx, browser, htmlPath, pdfPath); err != nil {
		return fmt.Errorf("--pdf %s: %w", pdfPath, err)
	}
	return nil
}

func same(a, b string) bool {
	x, err1 := filepath.Abs(a)
	y, err2 := filepath.Abs(b)
	return err1 == nil && err2 == nil && x == y
}

// DefaultServe is the address of the live preview when --serve names none:
// the loopback interface only, so the calculation is not shown to the
// network unless an address says so.
const DefaultServe = "127.0.0.1:8470"

// preview serves the report of the sheet being watched and pushes each new
// version to the open pages as a server-sent event.
type preview struct {
	mu   sync.Mutex
	page string // the last page served at /
	good string // the body of the last good report
	body string // the body the pages show now
	subs map[chan string]bool
	url  string
	opt  report.Options
}

// serveAddr reads the --serve value: "" or a port alone binds the
// loopback address.
func serveAddr(s string) string {
	if s == "" {
		return DefaultServe
	}
	if _, err := strconv.Atoi(s); err == nil {
		return "127.0.0.1:" + s
	}
	return s
}

// startPreview listens on addr and serves until ctx ends.
func startPreview(ctx context.Context, addr string, paper string) (*preview, error) {
	ln, err := net.Listen("tcp", serveAddr(addr))
	if err != nil {
		return nil, userErrorf("--serve %s: %v", addr, err)
	}
	p := &preview{subs: map[chan string]bool{}, opt: report.Options{Paper: paper, Version: reportVersion(), Live: "/events"}}
	p.url = "http://" + ln.Addr().String() + "/"
	p.page = placeholder("waiting for the first run")
	mux := http.NewServeMux()
	mux.HandleFunc("GET /{$}", p.serveIndex)
	mux.HandleFunc("GET /events", p.serveEvents)
	srv := &http.Server{Handler: mux, ReadHeaderTimeout: 5 * time.Second}
	go func() { _ = srv.Serve(ln) }()
	go func() {
		<-ctx.Done()
		p.mu.Lock()
		for c := range p.subs {
			close(c)
			delete(p.subs, c)
		}
		p.mu.Unlock()
		_ = srv.Close()
	}()
	return p, nil
}

func placeholder(msg string) string {
	return "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Sheaf preview</title></head><body><main id=\"report\"><p>" + msg + "</p></main>" +
		"<script>new EventSource(\"/events\").addEventListener(\"report\",function(e){document.getElementById(\"report\").innerHTML=e.data;});</script></body></html>"
}

func (p *preview) serveIndex(w http.ResponseWriter, _ *http.Request) {
	p.mu.Lock()
	page := p.page
	p.mu.Unlock()
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.Header().Set("Cache-Control", "no-store")
	_, _ = io.WriteString(w, page)
}

func (p *preview) serveEvents(w http.ResponseWriter, r *http.Request) {
	fl, ok := w.(http.Flusher)
	if !ok {
		http.Error(w, "streaming is not supported", http.StatusInternalServerError)
		return
	}
	w.Header().Set("Content-Type", "text/event-stream")
	w.Header().Set("Cache-Control", "no-store")
	c := make(chan string, 4)
	p.mu.Lock()
	p.subs[c] = true
	p.mu.Unlock()
	defer func() {
		p.mu.Lock()
		if p.subs[c] {
			delete(p.subs, c)
			close(c)
		}
		p.mu.Unlock()
	}()
	_, _ = io.WriteString(w, ": connected\n\n")
	fl.Flush()
	for {
		select {
		case <-r.Context().Done():
			return
		case body, ok := <-c:
			if !ok {
				return
			}
			var b strings.Builder
			b.WriteString("event: report\n")
			for _, line := range strings.Split(body, "\n") {
				b.WriteString("data: " + line + "\n")
			}
			b.WriteString("\n")
			if _, err := io.WriteString(w, b.String()); err != nil {
				return
			}
			fl.Flush()
		}
	}
}

// update publishes the outcome of one run of the watcher: the new report,
// or the sheet's errors at their lines above the last good report.
func (p *preview) update(s *engine.Sheet, res *engine.Results, err error, src diag.Sources) {
	var page, body string
	if err == nil {
		page = report.Render(s, res, p.opt)
		body = report.Body(page)
	} else {
		var msg strings.Builder
		var list diag.List
		if errors.As(err, &list) {
			_ = diag.Render(&msg, list, src)
		} else {
			msg.WriteString(err.Error())
		}
		p.mu.Lock()
		good := p.good
		p.mu.Unlock()
		body = "<div class=\"liveerr\"><strong>The sheet has errors; the report below is from the last good run. Fix and save to update.</strong><pre>" +
			html.EscapeString(msg.String()) + "</pre></div>\n" + good
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if err == nil {
		p.good = body
		p.page = page
	} else if p.good == "" {
		p.page = placeholder("")
		p.page = strings.Replace(p.page, "<p></p>", body, 1)
	} else {
		p.page = strings.Replace(p.page, report.Body(p.page), body, 1)
	}
	p.body = body
	for c := range p.subs {
		select {
		case c <- body:
		default: // a slow page misses this version; the next save brings it up to date
		}
	}
}
