package lsp

import (
	"bufio"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net/textproto"
	"strconv"
	"strings"
	"sync"
)

// maxMessage bounds one incoming message. A sheet is at most a few MiB
// (engine.DefaultMaxBytes); a message far larger is a broken client.
const maxMessage = 64 << 20

// JSON-RPC error codes (JSON-RPC 2.0 and LSP).
const (
	codeParseError     = -32700
	codeInvalidRequest = -32600
	codeMethodNotFound = -32601
	codeInvalidParams  = -32602
	codeInternalError  = -32603
	codeNotInitialized = -32002
	codeRequestFailed  = -32803
)

// message is any JSON-RPC 2.0 message: a request (ID and Method), a
// notification (Method only) or a response (ID and Result or Error).
type message struct {
	JSONRPC string          `json:"jsonrpc"`
	ID      json.RawMessage `json:"id,omitempty"`
	Method  string          `json:"method,omitempty"`
	Params  json.RawMessage `json:"params,omitempty"`
	Result  json.RawMessage `json:"result,omitempty"`
	Error   *rpcError       `json:"error,omitempty"`
}

// rpcError is the error object of a response.
type rpcError struct {
	Code    int    `json:"code"`
	Message string `json:"message"`
}

func (e *rpcError) Error() string { return e.Message }

// isRequest reports whether m expects a response.
func (m *message) isRequest() bool { return m.Method != "" && len(m.ID) > 0 && string(m.ID) != "null" }

// reader reads framed messages: header lines "Content-Length: n" (and an
// optional Content-Type), a blank line, then n bytes of JSON.
type reader struct {
	r *bufio.Reader
}

func newReader(r io.Reader) *reader { return &reader{r: bufio.NewReaderSize(r, 64<<10)} }

// errFraming marks a stream that cannot be read further: the next
// message's start is unknown.
var errFraming = errors.New("lsp: broken message framing")

// read returns the next message body, io.EOF at the end of the stream.
func (r *reader) read() ([]byte, error) {
	tp := textproto.NewReader(r.r)
	h, err := tp.ReadMIMEHeader()
	if err != nil {
		if errors.Is(err, io.EOF) && len(h) == 0 {
			return nil, io.EOF
		}
		return nil, fmt.Errorf("%w: reading the header: %v", errFraming, err)
	}
	cl := h.Get("Content-Length")
	if cl == "" {
		return nil, fmt.Errorf("%w: no Content-Length header", errFraming)
	}
	n, err := strconv.Atoi(strings.TrimSpace(cl))
	if err != nil || n < 0 {
		return nil, fmt.Errorf("%w: Content-Length %q is not a length", errFraming, cl)
	}
	if n > maxMessage {
		return nil, fmt.Errorf("%w: a message of %d bytes is over the limit of %d", errFraming, n, maxMessage)
	}
	// Read what comes rather than allocate the announced length first: a
	// broken header must not cost the memory it names.
	body, err := io.ReadAll(io.LimitReader(r.r, int64(n)))
	if err != nil || len(body) < n {
		return nil, fmt.Errorf("%w: the body ended after %d of %d bytes", errFraming, len(body), n)
	}
	return body, nil
}

// writer writes framed messages in the order given, from a goroutine of
// its own: a server that blocked on writing while its client blocked on
// writing a request would hang both. Safe for concurrent use (responses
// and the debounced diagnostics share it).
type writer struct {
	w      io.Writer
	mu     sync.Mutex
	cond   *sync.Cond
	queue  [][]byte
	closed bool
	err    error
	done   chan struct{}
	start  sync.Once
}

func newWriter(w io.Writer) *writer {
	wr := &writer{w: w, done: make(chan struct{})}
	wr.cond = sync.NewCond(&wr.mu)
	return wr
}

func (w *writer) loop() {
	defer close(w.done)
	for {
		w.mu.Lock()
		for len(w.queue) == 0 && !w.closed {
			w.cond.Wait()
		}
		if len(w.queue) == 0 {
			w.mu.Unlock()
			return
		}
		b := w.queue[0]
		w.queue = w.queue[1:]
		w.mu.Unlock()
		if _, err := w.w.Write(b); err != nil {
			w.mu.Lock()
			w.err, w.closed, w.queue = err, true, nil
			w.mu.Unlock()
			return
		}
	}
}

// write queues m; it fails only once the stream has failed.
func (w *writer) write(m *message) error {
	m.JSONRPC = "2.0"
	body, err := json.Marshal(m)
	if err != nil {
		return err
	}
	return w.writeBody(body)
}

// writeBody queues one message body, already encoded.
func (w *writer) writeBody(body []byte) error {
	frame := append([]byte(fmt.Sprintf("Content-Length: %d\r\n\r\n", len(body))), body...)
	w.start.Do(func() { go w.loop() })
	w.mu.Lock()
	defer w.mu.Unlock()
	if w.closed {
		if w.err != nil {
			return w.err
		}
		return errors.New("lsp: the output is closed")
	}
	w.queue = append(w.queue, frame)
	w.cond.Signal()
	return nil
}

// close writes what is queued and stops.
func (w *writer) close() {
	w.start.Do(func() { go w.loop() })
	w.mu.Lock()
	w.closed = true
	w.cond.Signal()
	w.mu.Unlock()
	<-w.done
}
