package lsp

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"sync"
	"time"
)

// Options adjust a Server.
type Options struct {
	// Debounce is how long the server waits after the last change of a
	// document before it checks it and publishes its problems (default
	// 200 ms). Values of inputs follow each change at once (see
	// document.setText).
	Debounce time.Duration
	// Log receives one line per message the server could not handle
	// (nil: discarded). `sheaf lsp` sends it to stderr, which editors keep
	// in the server's output panel.
	Log io.Writer
}

// Server is a language server for one client.
type Server struct {
	opt Options
	out *writer

	mu          sync.Mutex
	docs        map[string]*document // by URI
	timers      map[string]*time.Timer
	published   map[string]map[string][]lspDiagnostic // target URI -> source document URI -> diagnostics
	initialized bool
	shutdown    bool
	refresh     bool // the client takes workspace/inlayHint/refresh
	nextID      int
}

// Serve runs a server reading requests from in and writing to out until
// the client sends exit or closes in. It returns nil after an orderly
// shutdown and exit, and an error otherwise (as the protocol says, a
// server that exits without a shutdown request exits with code 1).
func Serve(in io.Reader, out io.Writer, opt Options) error {
	s := NewServer(out, opt)
	return s.Run(in)
}

// NewServer returns a server writing to out.
func NewServer(out io.Writer, opt Options) *Server {
	if opt.Debounce <= 0 {
		opt.Debounce = 200 * time.Millisecond
	}
	return &Server{opt: opt, out: newWriter(out), docs: map[string]*document{},
		timers: map[string]*time.Timer{}, published: map[string]map[string][]lspDiagnostic{}}
}

// errExitWithoutShutdown is Run's error for an exit before shutdown.
var errExitWithoutShutdown = errors.New("lsp: exit before shutdown")

// Run reads and handles messages until exit or the end of in.
func (s *Server) Run(in io.Reader) error {
	r := newReader(in)
	defer s.out.close()
	defer s.stopTimers()
	for {
		body, err := r.read()
		if errors.Is(err, io.EOF) {
			if s.isShutdown() {
				return nil
			}
			return io.ErrUnexpectedEOF
		}
		if err != nil {
			return err
		}
		var m message
		if err := json.Unmarshal(body, &m); err != nil {
			s.logf("unreadable message: %v", err)
			s.reply(nil, nil, &rpcError{Code: codeParseError, Message: "the message is not JSON: " + err.Error()})
			continue
		}
		if m.Method == "exit" {
			if s.isShutdown() {
				return nil
			}
			return errExitWithoutShutdown
		}
		if m.Method == "" {
			continue // a response to one of our requests (inlay refresh)
		}
		result, rerr := s.handle(&m)
		if m.isRequest() {
			s.reply(m.ID, result, rerr)
		} else if rerr != nil {
			s.logf("%s: %s", m.Method, rerr.Message)
		}
	}
}

func (s *Server) isShutdown() bool {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.shutdown
}

func (s *Server) logf(format string, args ...any) {
	if s.opt.Log != nil {
		fmt.Fprintf(s.opt.Log, "sheaf lsp: "+format+"\n", args...)
	}
}

func (s *Server) reply(id json.RawMessage, result any, rerr *rpcError) {
	if id == nil {
		id = json.RawMessage("null")
	}
	if rerr == nil {
		var b []byte
		var err error
		if raw, ok := result.(rawResult); ok {
			b = raw
		} else {
			b, err = json.Marshal(result)
		}
		if err == nil {
			// The result is encoded once, straight into the frame: a
			// message with a RawMessage result would be validated and
			// compacted a second time, which on the 5,000 values of a
			// large sheet costs as much as encoding them.
			body := make([]byte, 0, len(b)+len(id)+40)
			body = append(body, `{"jsonrpc":"2.0","id":`...)
			body = append(body, id...)
			body = append(body, `,"result":`...)
			body = append(body, b...)
			body = append(body, '}')
			if err := s.out.writeBody(body); err != nil {
				s.logf("writing a response: %v", err)
			}
			return
		}
		rerr = &rpcError{Code: codeInternalError, Message: err.Error()}
	}
	if err := s.out.write(&message{ID: id, Error: rerr}); err != nil {
		s.logf("writing a response: %v", err)
	}
}

func (s *Server) notify(method string, params any) {
	b, err := json.Marshal(params)
	if err != nil {
		s.logf("%s: %v", method, err)
		return
	}
	if err := s.out.write(&message{Method: method, Params: b}); err != nil {
		s.logf("writing %s: %v", method, err)
	}
}

// request sends a request to the client; its answer is read and dropped.
// Called with s.mu held.
func (s *Server) request(method string) {
	s.nextID++
	id := json.RawMessage(fmt.Sprintf(`"sheaf-%d"`, s.nextID))
	if err := s.out.write(&message{ID: id, Method: method}); err != nil {
		s.logf("writing %s: %v", method, err)
	}
}

// rawResult is a result encoded by its handler (the values of a large
// sheet, written straight into bytes).
type rawResult []byte

// handler answers one method. It runs with s.mu held.
type handler func(s *Server, params json.RawMessage) (any, *rpcError)

var handlers map[string]handler

func init() {
	handlers = map[string]handler{
		"initialize":                      (*Server).initialize,
		"initialized":                     func(*Server, json.RawMessage) (any, *rpcError) { return nil, nil },
		"shutdown":                        (*Server).shutdownRequest,
		"textDocument/didOpen":            (*Server).didOpen,
		"textDocument/didChange":          (*Server).didChange,
		"textDocument/didClose":           (*Server).didClose,
		"textDocument/didSave":            (*Server).didSave,
		"textDocument/inlayHint":          (*Server).inlayHints,
		"textDocument/hover":              (*Server).hover,
		"textDocument/completion":         (*Server).completion,
		"textDocument/definition":         (*Server).definition,
		"textDocument/references":         (*Server).references,
		"textDocument/rename":             (*Server).rename,
		"textDocument/prepareRename":      (*Server).prepareRename,
		"textDocument/documentSymbol":     (*Server).documentSymbols,
		"textDocument/formatting":         (*Server).formatting,
		"textDocument/codeAction":         (*Server).codeActions,
		"$/cancelRequest":                 func(*Server, json.RawMessage) (any, *rpcError) { return nil, nil },
		"$/setTrace":                      func(*Server, json.RawMessage) (any, *rpcError) { return nil, nil },
		"workspace/didChangeWatchedFiles": (*Server).filesChanged,
	}
}

func (s *Server) handle(m *message) (result any, rerr *rpcError) {
	s.mu.Lock()
	defer s.mu.Unlock()
	defer func() {
		// A bug in a handler must not take the editor's session down with
		// it: answer the one request with an error and go on.
		if p := recover(); p != nil {
			s.logf("%s: internal error: %v", m.Method, p)
			result, rerr = nil, &rpcError{Code: codeInternalError, Message: fmt.Sprintf("internal error in %s: %v", m.Method, p)}
		}
	}()
	h, ok := handlers[m.Method]
	if !ok {
		if !m.isRequest() {
			return nil, nil // unknown notifications are ignored, as the protocol says
		}
		return nil, &rpcError{Code: codeMethodNotFound, Message: "method not supported: " + m.Method}
	}
	if !s.initialized && m.Method != "initialize" {
		return nil, &rpcError{Code: codeNotInitialized, Message: "the server has not been initialized"}
	}
	if s.shutdown && m.isRequest() {
		return nil, &rpcError{Code: codeInvalidRequest, Message: "the server is shutting down"}
	}
	return h(s, m.Params)
}

func decode(params json.RawMessage, v any) *rpcError {
	if len(params) == 0 {
		return &rpcError{Code: codeInvalidParams, Message: "missing params"}
	}
	if err := json.Unmarshal(params, v); err != nil {
		return &rpcError{Code: codeInvalidParams, Message: "invalid params: " + err.Error()}
	}
	return nil
}

func (s *Server) initialize(params json.RawMessage) (any, *rpcError) {
	var p initializeParams
	if len(params) > 0 {
		if err := decode(params, &p); err != nil {
			return nil, err
		}
	}
	s.initialized = true
	s.refresh = p.Capabilities.Workspace.InlayHint.RefreshSupport
	return map[string]any{
		"capabilities": map[string]any{
			"positionEncoding": "utf-16",
			"textDocumentSync": map[string]any{"openClose": true, "change": 1}, // full text on each change
			"hoverProvider":    true,
			"completionProvider": map[string]any{
				// Not space: a list of every cell on each space of a large
				// sheet is noise; editors complete as letters are typed.
				"triggerCharacters": []string{".", "\"", "["},
			},
			"definitionProvider":         true,
			"referencesProvider":         true,
			"renameProvider":             map[string]any{"prepareProvider": true},
			"documentSymbolProvider":     true,
			"documentFormattingProvider": true,
			"codeActionProvider":         map[string]any{"codeActionKinds": []string{"quickfix"}},
			"inlayHintProvider":          true,
		},
		"serverInfo": map[string]any{"name": "sheaf"},
	}, nil
}

func (s *Server) shutdownRequest(json.RawMessage) (any, *rpcError) {
	s.shutdown = true
	s.stopTimersLocked()
	return nil, nil
}

func (s *Server) didOpen(params json.RawMessage) (any, *rpcError) {
	var p didOpenParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d := newDocument(p.TextDocument.URI, p.TextDocument.Version, p.TextDocument.Text)
	s.docs[d.uri] = d
	s.publish(d)
	return nil, nil
}

func (s *Server) didChange(params json.RawMessage) (any, *rpcError) {
	var p didChangeParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d := s.docs[p.TextDocument.URI]
	if d == nil {
		return nil, &rpcError{Code: codeInvalidParams, Message: "change to a document that is not open: " + p.TextDocument.URI}
	}
	if len(p.ContentChanges) == 0 {
		return nil, nil
	}
	src := d.lines.src
	for _, c := range p.ContentChanges {
		if c.Range == nil {
			src = c.Text
			continue
		}
		// Incremental changes are not announced, but a client may send
		// them anyway: apply them rather than lose the text.
		t := newText(src)
		from, to := t.offset(c.Range.Start), t.offset(c.Range.End)
		if from > to {
			from, to = to, from
		}
		src = src[:from] + c.Text + src[to:]
	}
	fast := d.setText(p.TextDocument.Version, src)
	if fast && s.refresh {
		s.request("workspace/inlayHint/refresh")
	}
	s.schedule(d.uri)
	return nil, nil
}

func (s *Server) didClose(params json.RawMessage) (any, *rpcError) {
	var p didCloseParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	uri := p.TextDocument.URI
	if t := s.timers[uri]; t != nil {
		t.Stop()
		delete(s.timers, uri)
	}
	delete(s.docs, uri)
	s.setPublished(uri, nil)
	return nil, nil
}

// didSave checks again the other open sheets built from the saved file:
// templates are read from disk, so a saved template changes them.
func (s *Server) didSave(params json.RawMessage) (any, *rpcError) {
	var p didCloseParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	saved := filepath.Clean(uriToPath(p.TextDocument.URI))
	for uri, d := range s.docs {
		if uri == p.TextDocument.URI {
			continue
		}
		uses := d.failed // a broken sheet may be broken by the template
		if d.sheet != nil {
			for _, f := range d.sheet.Files() {
				if filepath.Clean(f) == saved {
					uses = true
				}
			}
		}
		if uses {
			d.ensure()
			d.check()
			s.publish(d)
		}
	}
	return nil, nil
}

// filesChanged checks every open document again: a template on disk may
// have changed.
func (s *Server) filesChanged(json.RawMessage) (any, *rpcError) {
	for _, d := range s.docs {
		d.check()
		s.publish(d)
	}
	if s.refresh {
		s.request("workspace/inlayHint/refresh")
	}
	return nil, nil
}

// schedule publishes the problems of uri once no change has come for the
// debounce delay.
func (s *Server) schedule(uri string) {
	if t := s.timers[uri]; t != nil {
		t.Stop()
	}
	s.timers[uri] = time.AfterFunc(s.opt.Debounce, func() {
		s.mu.Lock()
		defer s.mu.Unlock()
		d := s.docs[uri]
		if d == nil || s.shutdown {
			return
		}
		delete(s.timers, uri)
		wasStale := d.stale
		d.ensure()
		s.publish(d)
		if wasStale && s.refresh {
			s.request("workspace/inlayHint/refresh")
		}
	})
}

func (s *Server) stopTimers() {
	s.mu.Lock()
	defer s.mu.Unlock()
	s.stopTimersLocked()
}

func (s *Server) stopTimersLocked() {
	for uri, t := range s.timers {
		t.Stop()
		delete(s.timers, uri)
	}
}

// doc returns the open document uri or an error for the request.
func (s *Server) doc(uri string) (*document, *rpcError) {
	d := s.docs[uri]
	if d == nil {
		return nil, &rpcError{Code: codeInvalidParams, Message: "the document is not open: " + uri}
	}
	return d, nil
}
