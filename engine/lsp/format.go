package lsp

import (
	"encoding/json"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// formatting answers with the canonical layout of `sheaf fmt`, as one
// edit over the whole document (none when it is canonical already). A
// document with syntax errors is refused, as `sheaf fmt` refuses it: it
// is never rewritten.
func (s *Server) formatting(params json.RawMessage) (any, *rpcError) {
	var p documentParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	out, ferr := sheet.Format(d.file)
	if ferr != nil {
		return nil, &rpcError{Code: codeRequestFailed, Message: "not formatted: " + ferr.Error()}
	}
	if string(out) == d.lines.src {
		return []textEdit{}, nil
	}
	end := d.lines.position(len(d.lines.src))
	return []textEdit{{Range: lspRange{End: end}, NewText: string(out)}}, nil
}
