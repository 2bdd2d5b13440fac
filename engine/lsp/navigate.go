package lsp

import (
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// positioned decodes a request about a position in an open document and
// brings the document's analysis up to date.
func (s *Server) positioned(params json.RawMessage, p *textDocumentPositionParams) (*document, *rpcError) {
	if err := decode(params, p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	return d, nil
}

// textOf returns the text index of a file: the open document's buffer
// when it is open, else the text the sheet was built from, else the file
// on disk.
func (s *Server) textOf(d *document, file string) *text {
	if file == d.path {
		return d.lines
	}
	if o := s.docs[pathToURI(file)]; o != nil {
		return o.lines
	}
	if d.sheet != nil {
		if src, ok := d.sheet.Sources()[file]; ok {
			return newText(string(src))
		}
	}
	if b, err := os.ReadFile(file); err == nil && len(b) <= engine.DefaultMaxBytes {
		return newText(string(b))
	}
	return newText("")
}

func (s *Server) locationOf(d *document, r diag.Range) location {
	file := r.Start().File
	uri := d.uri
	if file != d.path {
		uri = pathToURI(file)
	}
	return location{URI: uri, Range: s.textOf(d, file).rangeOf(r)}
}

func (s *Server) definition(params json.RawMessage) (any, *rpcError) {
	var p textDocumentPositionParams
	d, err := s.positioned(params, &p)
	if err != nil {
		return nil, err
	}
	t := d.resolve(p.Position)
	if t == nil {
		return nil, nil
	}
	switch t.kind {
	case tCell, tField:
		return []location{s.locationOf(d, t.cell.NameRange())}, nil
	case tItem:
		return []location{s.locationOf(d, itemNameRange(t.item))}, nil
	case tParam:
		if x := d.cellAt(p.Position.Line+1, d.lines.runeCol(p.Position)); x != nil {
			if fd, ok := d.parsedItem(x.Name).(*sheet.FuncDef); ok {
				for _, q := range fd.Params {
					if q.Name.Name == t.name {
						return []location{s.locationOf(d, q.Name.Range)}, nil
					}
				}
			}
		}
	}
	return nil, nil
}

// occurrence is one place a cell's name is written: its definition, a
// template override of it, or a use in a formula.
type occurrence struct {
	r    diag.Range // of the last segment of the name as written
	decl bool
}

// occurrences returns where the cell named name of program s is written,
// in every file s is built from. Uses in formulas are found in the typed
// trees, so a parameter or a record field of the same spelling is never
// taken for the cell. Each range covers the last segment of the written
// name (`sigma` of `rod.sigma`): what a rename replaces.
func occurrences(s *engine.Sheet, x *engine.Cell, sources func(string) *text) []occurrence {
	local := x.Name[strings.LastIndexByte(x.Name, '.')+1:]
	var out []occurrence
	if x.NameRange().Start().IsValid() {
		out = append(out, occurrence{r: x.NameRange(), decl: true})
	}
	var walk func(n check.Node)
	walk = func(n check.Node) {
		if n.IsZero() {
			return
		}
		if (n.Op() == check.OpCell || n.Op() == check.OpUser || n.Op() == check.OpFuncRef) && int(n.Index()) == x.Index {
			r := n.Range()
			if n.Op() != check.OpCell {
				// A call's range covers its arguments: the name is at its start.
				r.To = min(r.From+int32(len(n.Str())), r.To)
			}
			if seg, ok := lastSegment(r, local, sources(r.Start().File)); ok {
				out = append(out, occurrence{r: seg})
			}
		}
		for _, a := range n.Args() {
			walk(a)
		}
	}
	for _, c := range s.Cells() {
		if slices.Contains(s.Program().Deps(c.Index), int32(x.Index)) {
			for _, t := range trees(c) {
				walk(t)
			}
		}
	}
	slices.SortFunc(out, func(a, b occurrence) int { return a.r.Compare(b.r) })
	return slices.CompactFunc(out, func(a, b occurrence) bool { return a.r.Compare(b.r) == 0 })
}

// lastSegment narrows r, which covers a written name, to its last
// segment, local; it reports false when the text there is not local (a
// rename must never replace what it did not find).
func lastSegment(r diag.Range, local string, t *text) (diag.Range, bool) {
	if t == nil || r.Start().Line != r.End().Line {
		return r, false
	}
	ln := t.line(r.Start().Line - 1)
	a := t.fromDiag(r.Start())
	b := t.fromDiag(r.End())
	from := t.offset(a) - t.starts[a.Line]
	to := t.offset(b) - t.starts[b.Line]
	if from < 0 || to > len(ln) || from > to {
		return r, false
	}
	w := ln[from:to]
	if w != local && !strings.HasSuffix(w, "."+local) {
		return r, false
	}
	out := r
	out.From = r.To - int32(len(local))
	return out, true
}

func (s *Server) references(params json.RawMessage) (any, *rpcError) {
	var p referenceParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	t := d.resolve(p.Position)
	if t == nil || t.kind != tCell || d.sheet == nil {
		return []location{}, nil
	}
	out := []location{}
	for _, o := range occurrences(d.sheet, t.cell, func(f string) *text { return s.textOf(d, f) }) {
		if o.decl && !p.Context.IncludeDeclaration {
			continue
		}
		out = append(out, s.locationOf(d, o.r))
	}
	return out, nil
}

func (s *Server) prepareRename(params json.RawMessage) (any, *rpcError) {
	var p textDocumentPositionParams
	d, err := s.positioned(params, &p)
	if err != nil {
		return nil, err
	}
	t := d.resolve(p.Position)
	if t == nil || t.kind != tCell {
		return nil, nil
	}
	local := t.cell.Name[strings.LastIndexByte(t.cell.Name, '.')+1:]
	r := t.rng
	if !t.node.IsZero() {
		if seg, ok := lastSegment(t.node.Range(), local, d.lines); ok {
			r = d.lines.rangeOf(seg)
		}
	} else if seg, ok := lastSegment(t.cell.NameRange(), local, d.lines); ok && d.own(t.cell.NameRange().Start()) {
		r = d.lines.rangeOf(seg)
	}
	return map[string]any{"range": r, "placeholder": local}, nil
}

// rename renames a cell everywhere it is written: in the sheet, in the
// template that defines it, and in every sheet of the project that uses
// that template. It refuses, changing nothing, when a sheet involved does
// not check (its uses could not all be found) or when the new name is
// not a free, valid name.
func (s *Server) rename(params json.RawMessage) (any, *rpcError) {
	var p renameParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	if d.sheet == nil {
		return nil, &rpcError{Code: codeRequestFailed, Message: "the sheet has problems; fix them before renaming, so that every use of the name is found"}
	}
	t := d.resolve(p.Position)
	if t == nil || t.kind != tCell {
		return nil, &rpcError{Code: codeRequestFailed, Message: "there is no cell name here to rename"}
	}
	if msg := badName(p.NewName); msg != "" {
		return nil, &rpcError{Code: codeRequestFailed, Message: msg}
	}
	defFile := t.cell.NameRange().Start().File
	local := t.cell.Name[strings.LastIndexByte(t.cell.Name, '.')+1:]
	// The definition: where the name's own file writes it. An instance
	// of a template in this sheet (`rod.sigma`) is defined in the template.
	defAt := t.cell.NameRange().Start()
	if strings.Contains(t.cell.Name, ".") && defFile == d.path {
		// An override in a `use` block: the name is the template's.
		f, at, ok := s.templateDef(d, t.cell.Name)
		if !ok {
			return nil, &rpcError{Code: codeRequestFailed, Message: "cannot find where template input `" + t.cell.Name + "` is defined"}
		}
		defFile, defAt = f, at
	}

	edits := map[string]map[diag.Pos]diag.Range{} // file -> start -> range
	add := func(r diag.Range) {
		f := r.Start().File
		if edits[f] == nil {
			edits[f] = map[diag.Pos]diag.Range{}
		}
		k := r.Start()
		k.File = ""
		edits[f][k] = r
	}
	sheets, rerr := s.projectSheets(d, defFile)
	if rerr != nil {
		return nil, rerr
	}
	for _, sh := range sheets {
		for _, x := range sh.Cells() {
			// Every instance of the renamed cell: the cell defined at the
			// same place, under whatever prefix this sheet uses it.
			if x.NameRange().Start().File != defFile || x.NameRange().Start().Offset != defAt.Offset || x.NameRange().Start().Line != defAt.Line {
				if !overrides(sh, x, defFile, defAt) {
					continue
				}
			}
			prefix := x.Name[:len(x.Name)-len(local)]
			if !strings.HasSuffix(x.Name, local) {
				continue
			}
			if clash := sh.Lookup(prefix + p.NewName); clash != nil {
				return nil, &rpcError{Code: codeRequestFailed, Message: "`" + prefix + p.NewName + "` is already a cell of " + sh.Name()}
			}
			src := func(f string) *text { return s.textOf(d, f) }
			built := sh.Sources()
			for _, o := range occurrences(sh, x, src) {
				// An edit is only as good as the text it was found in: a
				// file open with changes not saved differs from what the
				// other sheets were checked against.
				if b, ok := built[o.r.Start().File]; !ok || string(b) != src(o.r.Start().File).src {
					return nil, &rpcError{Code: codeRequestFailed, Message: o.r.Start().File + " differs from what " + sh.Name() + " was checked against (unsaved changes?); save it, then rename"}
				}
				seg, ok := lastSegment(o.r, local, src(o.r.Start().File))
				if !ok {
					return nil, &rpcError{Code: codeRequestFailed, Message: "cannot find `" + local + "` written at " + o.r.Start().String() + "; nothing renamed"}
				}
				add(seg)
			}
		}
	}
	out := workspaceEdit{Changes: map[string][]textEdit{}}
	for f, m := range edits {
		t := s.textOf(d, f)
		uri := pathToURI(f)
		if f == d.path {
			uri = d.uri
		}
		for _, r := range m {
			out.Changes[uri] = append(out.Changes[uri], textEdit{Range: t.rangeOf(r), NewText: p.NewName})
		}
		slices.SortFunc(out.Changes[uri], func(a, b textEdit) int {
			if a.Range.Start.Line != b.Range.Start.Line {
				return a.Range.Start.Line - b.Range.Start.Line
			}
			return a.Range.Start.Character - b.Range.Start.Character
		})
	}
	return out, nil
}

// overrides reports whether cell x of sh is an override (in a `use` block)
// of the template input defined at defAt in defFile.
func overrides(sh *engine.Sheet, x *engine.Cell, defFile string, defAt diag.Pos) bool {
	if x.NameRange().Start().File == defFile {
		return false
	}
	f := sh.File()
	if f == nil {
		return false
	}
	for _, it := range f.Items {
		u, ok := it.(*sheet.Use)
		if !ok {
			continue
		}
		for _, o := range u.Overrides {
			if o.Name.Range.Start().Offset == x.NameRange().Start().Offset && u.Name.Name+"."+o.Name.Name == x.Name {
				return templatePath(sh.Name(), u.Path) == filepath.Clean(defFile)
			}
		}
	}
	return false
}

// templatePath resolves a `use` path as the engine does: relative to the
// folder of the sheet that writes it.
func templatePath(from, p string) string {
	return filepath.Clean(filepath.Join(filepath.Dir(from), filepath.FromSlash(p)))
}

// badName says why name cannot name a cell ("" when it can).
func badName(name string) string {
	if name == "" {
		return "a cell needs a name"
	}
	for i, r := range name {
		if !isNameRune(r) || (i == 0 && r >= '0' && r <= '9') {
			return "`" + name + "` is not a name: names are letters, digits and `_`, and do not start with a digit"
		}
	}
	if check.IsReserved(name) {
		return "`" + name + "` is reserved in the sheet language"
	}
	return ""
}

// maxProjectSheets bounds the sheets a rename reads.
const maxProjectSheets = 500

// projectSheets returns the compiled sheets a rename of a cell defined in
// defFile must edit: the sheet of d, the file defFile itself when it is a
// sheet on its own, and every sheet of the project that is built from
// defFile. Open documents are read from their buffers.
func (s *Server) projectSheets(d *document, defFile string) ([]*engine.Sheet, *rpcError) {
	out := []*engine.Sheet{d.sheet}
	seen := map[string]bool{filepath.Clean(d.path): true}
	root := projectRoot(filepath.Dir(d.path))
	paths := sheafFiles(root, maxProjectSheets)
	for _, path := range paths {
		if seen[filepath.Clean(path)] {
			continue
		}
		seen[filepath.Clean(path)] = true
		var src []byte
		if o := s.docs[pathToURI(path)]; o != nil {
			src = []byte(o.lines.src)
		} else {
			b, err := os.ReadFile(path)
			if err != nil || len(b) > engine.DefaultMaxBytes {
				continue
			}
			if !strings.Contains(string(b), "use ") && filepath.Clean(path) != filepath.Clean(defFile) {
				continue // uses no template: cannot refer to the cell
			}
			src = b
		}
		f, _ := sheet.Parse(path, src)
		sh, err := engine.CompileFile(f)
		builtFrom := filepath.Clean(path) == filepath.Clean(defFile)
		if err != nil {
			if builtFrom || usesFile(f, path, defFile) {
				return nil, &rpcError{Code: codeRequestFailed, Message: path + " has problems; fix them before renaming, so that every use of the name is found"}
			}
			continue
		}
		for _, name := range sh.Files() {
			if filepath.Clean(name) == filepath.Clean(defFile) {
				builtFrom = true
			}
		}
		if builtFrom {
			// The sheet was checked against the files on disk; one of them
			// open with changes not saved would make its uses unfindable.
			for name, b := range sh.Sources() {
				if o := s.docs[pathToURI(name)]; o != nil && o.lines.src != string(b) {
					return nil, &rpcError{Code: codeRequestFailed, Message: name + " has changes not saved, and " + path + " uses it; save it, then rename"}
				}
			}
			out = append(out, sh)
		}
	}
	return out, nil
}

// usesFile reports whether the parse f writes a `use` of defFile directly.
func usesFile(f *sheet.File, path, defFile string) bool {
	for _, it := range f.Items {
		if u, ok := it.(*sheet.Use); ok && templatePath(path, u.Path) == filepath.Clean(defFile) {
			return true
		}
	}
	return false
}

// maxWalk bounds the folders and files a walk of a project visits: a
// sheet outside any project (no .git, no sheaf.root) has its own folder
// as root, which may be a home folder of any size.
const maxWalk = 20_000

// sheafFiles lists up to max .sheaf files under root, skipping hidden
// folders and node_modules, visiting at most maxWalk entries.
func sheafFiles(root string, max int) []string {
	var out []string
	seen := 0
	_ = filepath.WalkDir(root, func(path string, e os.DirEntry, err error) error {
		seen++
		if seen > maxWalk || len(out) >= max {
			return filepath.SkipAll
		}
		if err != nil {
			return nil
		}
		if e.IsDir() {
			if n := e.Name(); path != root && (strings.HasPrefix(n, ".") || n == "node_modules") {
				return filepath.SkipDir
			}
			return nil
		}
		if strings.HasSuffix(path, ".sheaf") {
			out = append(out, path)
		}
		return nil
	})
	return out
}

// projectRoot finds the project root as SPEC.md says: the nearest folder
// holding .git or sheaf.root, else dir itself.
func projectRoot(dir string) string {
	dir, _ = filepath.Abs(dir)
	for d := dir; ; d = filepath.Dir(d) {
		if _, err := os.Lstat(filepath.Join(d, ".git")); err == nil {
			return d
		}
		if fi, err := os.Stat(filepath.Join(d, check.RootMarker)); err == nil && !fi.IsDir() {
			return d
		}
		if filepath.Dir(d) == d {
			return dir
		}
	}
}

func (s *Server) documentSymbols(params json.RawMessage) (any, *rpcError) {
	var p documentParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	out := []documentSymbol{}
	var section *documentSymbol
	flush := func() {
		if section != nil {
			out = append(out, *section)
			section = nil
		}
	}
	for _, it := range d.file.Items {
		if h, ok := it.(*sheet.Heading); ok {
			flush()
			r := d.lines.rangeOf(h.Range)
			section = &documentSymbol{Name: strings.TrimSpace(h.Text), Kind: symbolNamespace, Range: r, SelectionRange: r}
			continue
		}
		name := itemName(it)
		if name == "" {
			continue
		}
		sym := documentSymbol{Name: name, Kind: symbolVariable, Range: d.lines.rangeOf(it.Span()), SelectionRange: d.lines.rangeOf(itemNameRange(it))}
		switch it := it.(type) {
		case *sheet.Cell:
			if it.Unit != nil {
				sym.Detail = "[" + it.Unit.Text + "]"
			}
		case *sheet.FuncDef:
			sym.Kind = symbolFunction
		case *sheet.Check:
			sym.Kind = symbolBoolean
			sym.Detail = "check"
		case *sheet.Table:
			sym.Kind = symbolStruct
			sym.Detail = "table"
		case *sheet.Use:
			sym.Kind = symbolModule
			sym.Detail = "use " + it.Path
			for _, o := range it.Overrides {
				sym.Children = append(sym.Children, documentSymbol{Name: o.Name.Name, Kind: symbolVariable,
					Range: d.lines.rangeOf(o.Range), SelectionRange: d.lines.rangeOf(o.Name.Range)})
			}
		}
		if section != nil {
			section.Children = append(section.Children, sym)
			section.Range.End = sym.Range.End
		} else {
			out = append(out, sym)
		}
	}
	flush()
	return out, nil
}

// templateDef finds where the template input that override name (`rod.d`)
// replaces is defined: the file of the `use` and the position of the name
// there.
func (s *Server) templateDef(d *document, name string) (string, diag.Pos, bool) {
	dot := strings.LastIndexByte(name, '.')
	prefix, local := name[:dot], name[dot+1:]
	for _, it := range d.file.Items {
		u, ok := it.(*sheet.Use)
		if !ok || u.Name.Name != prefix {
			continue
		}
		path := templatePath(d.path, u.Path)
		t := s.textOf(d, path)
		f, _ := sheet.Parse(path, []byte(t.src))
		for _, x := range f.Items {
			if itemName(x) == local {
				return path, itemNameRange(x).Start(), true
			}
		}
	}
	return "", diag.Pos{}, false
}
