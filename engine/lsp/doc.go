// Package lsp is Sheaf's language server: it speaks the Language Server
// Protocol (3.17) over a byte stream, as `sheaf lsp` does over stdin and
// stdout, so that an editor shows a sheet's problems as they are typed,
// every cell's value beside its line, and the unit, formula and source of
// what lies under the cursor.
//
// The server is built on the engine's front door: each version of an open
// document is parsed once (sheet.Parse) and checked and compiled from that
// tree (engine.CompileFile); values come from an engine.State. When an
// edit changes only the values of input cells, the new values are set on
// the State and only the cells downstream recompute, so the values beside
// the lines follow the typing at once; any other edit checks the sheet
// again. A sheet that does not check shows its problems and no values at
// all: a value from an older version beside a changed line would be a
// wrong answer that looks right.
//
// Files by concern: jsonrpc.go (framing and messages), protocol.go (the
// LSP types used), text.go (byte offsets and UTF-16 positions), server.go
// (lifecycle and dispatch), document.go (analysis of one document and the
// fast path for input values), resolve.go (what lies under the cursor),
// diagnostics.go, inlay.go, hover.go, complete.go, navigate.go
// (definition, references, rename, symbols), format.go, actions.go
// (quick fixes).
//
// Templates are read from disk, as the engine reads them: an edit of a
// template open in the editor reaches the sheets that use it when it is
// saved (didSave and didChangeWatchedFiles check them again).
//
// The JSON-RPC framing is written here with the standard library: the Go
// LSP modules on offer (go.lsp.dev/protocol, github.com/tliron/glsp) stop
// at protocol 3.16, without the inlay hints this server is for, and bring
// dependencies of their own; the framing is a header and a JSON body.
//
// The server never writes a file: formatting and rename answer with edits
// that the editor applies to its buffers, which the user then saves.
package lsp
