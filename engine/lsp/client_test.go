package lsp

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"sync"
	"testing"
	"time"

	// The bundled sheets call plugin functions; a test may link them (the
	// server sees them through the registry only, as the engine does).
	_ "github.com/sheafcalc/sheaf/funcs/bar"
	_ "github.com/sheafcalc/sheaf/funcs/catalogue"
	_ "github.com/sheafcalc/sheaf/funcs/composite"
	_ "github.com/sheafcalc/sheaf/funcs/connection"
	_ "github.com/sheafcalc/sheaf/funcs/plastic"
	_ "github.com/sheafcalc/sheaf/funcs/section"
	_ "github.com/sheafcalc/sheaf/funcs/stability"
)

// client drives a server over pipes as an editor does: framed JSON-RPC
// requests out, responses and notifications back.
type client struct {
	t    testing.TB
	w    *writer
	r    *reader
	id   int
	done chan error

	mu    sync.Mutex
	diags map[string][]lspDiagnostic // last published, by URI
	nDiag int                        // publishDiagnostics received
	inbox []*message
	last  json.RawMessage // the last result
}

func newClient(t testing.TB, opt Options) *client {
	t.Helper()
	cr, sw := io.Pipe()
	sr, cw := io.Pipe()
	c := &client{t: t, w: newWriter(cw), r: newReader(cr), done: make(chan error, 1), diags: map[string][]lspDiagnostic{}}
	go func() {
		err := Serve(sr, sw, opt)
		sw.Close()
		c.done <- err
	}()
	t.Cleanup(func() { cw.Close() })
	return c
}

// next reads one message from the server.
func (c *client) next() *message {
	c.t.Helper()
	body, err := c.r.read()
	if err != nil {
		c.t.Fatalf("reading from the server: %v", err)
	}
	var m message
	if err := json.Unmarshal(body, &m); err != nil {
		c.t.Fatalf("server sent bad JSON %q: %v", body, err)
	}
	if m.Method == "textDocument/publishDiagnostics" {
		var p publishDiagnosticsParams
		if err := json.Unmarshal(m.Params, &p); err != nil {
			c.t.Fatal(err)
		}
		c.mu.Lock()
		c.diags[p.URI] = p.Diagnostics
		c.nDiag++
		c.mu.Unlock()
	}
	return &m
}

// call sends a request and returns its result, failing on an error.
func (c *client) call(method string, params any, result any) {
	c.t.Helper()
	if err := c.try(method, params, result); err != nil {
		c.t.Fatalf("%s: %v", method, err)
	}
}

// try sends a request and returns the error response, if any.
func (c *client) try(method string, params any, result any) *rpcError {
	c.t.Helper()
	c.id++
	id := json.RawMessage(fmt.Sprint(c.id))
	b, _ := json.Marshal(params)
	if err := c.w.write(&message{ID: id, Method: method, Params: b}); err != nil {
		c.t.Fatal(err)
	}
	for {
		m := c.next()
		if m.Method != "" {
			c.inbox = append(c.inbox, m)
			continue
		}
		if string(m.ID) != string(id) {
			c.t.Fatalf("%s: response to %s, want %s", method, m.ID, id)
		}
		if m.Error != nil {
			return m.Error
		}
		c.last = m.Result
		if result != nil {
			if err := json.Unmarshal(m.Result, result); err != nil {
				c.t.Fatalf("%s: result %s: %v", method, m.Result, err)
			}
		}
		return nil
	}
}

// notify sends a notification.
func (c *client) notify(method string, params any) {
	c.t.Helper()
	b, _ := json.Marshal(params)
	if err := c.w.write(&message{Method: method, Params: b}); err != nil {
		c.t.Fatal(err)
	}
}

// waitDiags reads until diagnostics for uri arrive and returns them.
func (c *client) waitDiags(uri string) []lspDiagnostic {
	c.t.Helper()
	for {
		m := c.next()
		if m.Method == "textDocument/publishDiagnostics" {
			var p publishDiagnosticsParams
			_ = json.Unmarshal(m.Params, &p)
			if p.URI == uri {
				return p.Diagnostics
			}
		}
	}
}

func (c *client) initialize() {
	c.t.Helper()
	var res struct {
		Capabilities map[string]any `json:"capabilities"`
	}
	c.call("initialize", map[string]any{"processId": nil, "rootUri": nil,
		"capabilities": map[string]any{"workspace": map[string]any{"inlayHint": map[string]any{"refreshSupport": true}}}}, &res)
	for _, k := range []string{"hoverProvider", "completionProvider", "definitionProvider", "referencesProvider", "renameProvider",
		"documentSymbolProvider", "documentFormattingProvider", "codeActionProvider", "inlayHintProvider"} {
		if res.Capabilities[k] == nil {
			c.t.Errorf("initialize: capability %s missing", k)
		}
	}
	if res.Capabilities["positionEncoding"] != "utf-16" {
		c.t.Errorf("positionEncoding = %v, want utf-16", res.Capabilities["positionEncoding"])
	}
	c.notify("initialized", map[string]any{})
}

// open sends didOpen and returns the diagnostics published for it.
func (c *client) open(uri, text string) []lspDiagnostic {
	c.t.Helper()
	c.notify("textDocument/didOpen", didOpenParams{TextDocument: textDocumentItem{URI: uri, LanguageID: "sheaf", Version: 1, Text: text}})
	return c.waitDiags(uri)
}

func (c *client) change(uri string, version int, text string) {
	c.t.Helper()
	c.notify("textDocument/didChange", didChangeParams{TextDocument: versionedTextDocumentIdentifier{URI: uri, Version: version},
		ContentChanges: []contentChange{{Text: text}}})
}

func (c *client) hints(uri string) []inlayHint {
	c.t.Helper()
	var out []inlayHint
	c.call("textDocument/inlayHint", documentParams{TextDocument: textDocumentIdentifier{URI: uri},
		Range: &lspRange{End: position{Line: 1 << 20}}}, &out)
	return out
}

func at(uri string, line, char int) textDocumentPositionParams {
	return textDocumentPositionParams{TextDocument: textDocumentIdentifier{URI: uri}, Position: position{Line: line, Character: char}}
}

// shutdown ends the session and checks that the server exits cleanly.
func (c *client) shutdown() {
	c.t.Helper()
	c.call("shutdown", nil, nil)
	c.notify("exit", nil)
	select {
	case err := <-c.done:
		if err != nil {
			c.t.Errorf("server ended with %v after shutdown and exit", err)
		}
	case <-time.After(5 * time.Second):
		c.t.Error("server did not exit")
	}
}

// lineOf returns the 0-based line of the first line of text holding s.
func lineOf(t testing.TB, text, s string) int {
	t.Helper()
	for i, ln := range strings.Split(text, "\n") {
		if strings.Contains(ln, s) {
			return i
		}
	}
	t.Fatalf("no line holds %q", s)
	return -1
}

// charOf returns the UTF-16 column of s on line li of text, as a client
// computes it (independently of text.go).
func charOf(t testing.TB, text string, li int, s string) int {
	t.Helper()
	ln := strings.Split(text, "\n")[li]
	i := strings.Index(ln, s)
	if i < 0 {
		t.Fatalf("line %d has no %q", li, s)
	}
	return len(utf16Of(ln[:i]))
}
