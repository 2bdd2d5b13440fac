package main

import (
	"bytes"
	"fmt"
	"strings"
	"testing"
)

func frame(body string) string { return fmt.Sprintf("Content-Length: %d\r\n\r\n%s", len(body), body) }

// TestLspCommand runs `sheaf lsp` on a scripted session: the exit code is 0
// after shutdown and exit, 1 for an exit without shutdown, as the protocol
// says, and the answers come back framed on stdout.
func TestLspCommand(t *testing.T) {
	open := `{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///virtual/a.sheaf","languageId":"sheaf","version":1,"text":"P [kN] = 38\n"}}}`
	tests := []struct {
		name string
		in   []string
		code int
		want []string
	}{
		{"orderly", []string{`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`, open,
			`{"jsonrpc":"2.0","id":2,"method":"shutdown"}`, `{"jsonrpc":"2.0","method":"exit"}`}, 0,
			[]string{`"id":1`, `"inlayHintProvider":true`, "display unit kN is a force but the expression is a plain number", `"id":2`}},
		{"no shutdown", []string{`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`, `{"jsonrpc":"2.0","method":"exit"}`}, 1,
			[]string{`"id":1`}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var in strings.Builder
			for _, m := range tt.in {
				in.WriteString(frame(m))
			}
			var out, errOut bytes.Buffer
			if code := Main([]string{"lsp"}, strings.NewReader(in.String()), &out, &errOut); code != tt.code {
				t.Errorf("exit code %d, want %d; stderr:\n%s", code, tt.code, errOut.String())
			}
			for _, w := range tt.want {
				if !strings.Contains(out.String(), w) {
					t.Errorf("stdout lacks %s:\n%s", w, out.String())
				}
			}
		})
	}
}
