package lsp

import (
	"encoding/json"
	"path/filepath"
	"regexp"
	"sort"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// headerKeys are the keys a sheet's header may hold (SPEC.md, Header).
var headerKeys = []string{"title", "project", "basis", "author", "checker", "date", "revision", "units"}

var (
	afterNumber = regexp.MustCompile(`(^|[\s(\[{,=*/+\-<>])[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)? ?([^\s()\[\]{},]*)$`)
	inBrackets  = regexp.MustCompile(`\[([^\]]*)$`)
	afterDot    = regexp.MustCompile(`([\p{L}_][\p{L}\p{N}_.]*)\.([\p{L}\p{N}_]*)$`)
	inUsePath   = regexp.MustCompile(`^use\s+\S+\s+from\s+"([^"]*)$`)
	headerWord  = regexp.MustCompile(`^[a-z]*$`)
)

func (s *Server) completion(params json.RawMessage) (any, *rpcError) {
	var p textDocumentPositionParams
	d, err := s.positioned(params, &p)
	if err != nil {
		return nil, err
	}
	ln := d.lines.line(p.Position.Line)
	off := d.lines.offset(p.Position) - d.lines.starts[min(p.Position.Line, d.lines.lineCount()-1)]
	before := ln[:max(0, min(off, len(ln)))]
	items := []completionItem{}
	switch {
	case inUsePath.MatchString(before):
		items = templatePaths(d)
	case d.inHeader(p.Position.Line) && headerWord.MatchString(before):
		for _, k := range headerKeys {
			items = append(items, completionItem{Label: k, Kind: kindKeyword, InsertText: k + ": ", Detail: "header key"})
		}
	case inBrackets.MatchString(before) || afterNumber.MatchString(before):
		items = unitItems()
	case afterDot.MatchString(before):
		m := afterDot.FindStringSubmatch(before)
		items = d.memberItems(m[1])
	default:
		items = d.nameItems()
	}
	return completionList{Items: items}, nil
}

// inHeader reports whether 0-based line li comes before the first item
// that is not a header line, comment or blank.
func (d *document) inHeader(li int) bool {
	for _, it := range d.file.Items {
		switch it.(type) {
		case *sheet.Meta, *sheet.Comment, *sheet.Blank:
			continue
		}
		return it.Span().Start().Line-1 >= li
	}
	return true
}

// unitItems lists the unit catalogue.
func unitItems() []completionItem {
	var out []completionItem
	for i, u := range units.Catalogue() {
		out = append(out, completionItem{Label: u.Symbol, Kind: kindUnit, Detail: u.Quantity, SortText: sortKey(i)})
	}
	return out
}

func sortKey(i int) string {
	return string(rune('a'+i/676%26)) + string(rune('a'+i/26%26)) + string(rune('a'+i%26))
}

// nameItems lists the cells (with their units), user and plugin functions
// (with signatures), built-ins and constants.
func (d *document) nameItems() []completionItem {
	var out []completionItem
	if d.sheet != nil {
		for _, c := range d.sheet.Cells() {
			if strings.Contains(c.Name, ".") {
				continue // reached through their template's name
			}
			it := completionItem{Label: c.Name, Kind: kindVariable, Detail: c.Kind.String()}
			switch {
			case c.Kind == engine.Function:
				it.Kind = kindFunction
				it.Detail = signature(c)
			case c.Kind == engine.Check:
				it.Kind = kindConstant
			case c.HasUnit:
				it.Detail = "[" + c.Unit().Symbol + "] " + c.Kind.String()
			case c.Type != nil && c.Type.Kind == funcs.Number:
				if u := d.sheet.DisplayUnit(c); u.Symbol != "" && u.Symbol != "1" {
					it.Detail = "[" + u.Symbol + "] " + c.Kind.String()
				}
			}
			if c.Description() != "" {
				it.Documentation = &markupContent{Kind: "markdown", Value: c.Description()}
			}
			out = append(out, it)
		}
		seen := map[string]bool{}
		for _, c := range d.sheet.Cells() {
			if i := strings.IndexByte(c.Name, '.'); i > 0 && !seen[c.Name[:i]] {
				seen[c.Name[:i]] = true
				out = append(out, completionItem{Label: c.Name[:i], Kind: kindModule, Detail: "template"})
			}
		}
	} else {
		for _, it := range d.file.Items {
			if name := itemName(it); name != "" {
				out = append(out, completionItem{Label: name, Kind: kindVariable})
			}
		}
	}
	for _, b := range check.Builtins {
		out = append(out, completionItem{Label: b.Name, Kind: kindFunction, Detail: b.Sig, Documentation: &markupContent{Kind: "markdown", Value: b.Rule}})
	}
	sys := d.system()
	for _, def := range funcs.All() {
		out = append(out, completionItem{Label: def.Name, Kind: kindFunction, Detail: pluginSignature(def, sys),
			Documentation: &markupContent{Kind: "markdown", Value: def.Summary}})
	}
	names := make([]string, 0, len(check.Constants))
	for n := range check.Constants {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		out = append(out, completionItem{Label: n, Kind: kindConstant, Detail: "constant"})
	}
	return out
}

// memberItems lists what may follow `base.`: a record's fields, a table's
// columns, or the cells of a template used under that name.
func (d *document) memberItems(base string) []completionItem {
	out := []completionItem{}
	sh := d.sheet
	if sh == nil {
		sh = d.last
	}
	if sh == nil {
		return out
	}
	sys := sh.System()
	if c := sh.Lookup(base); c != nil && c.Type != nil && (c.Type.Kind == funcs.Record || c.Type.Kind == funcs.Table) {
		for _, f := range c.Type.Fields {
			it := completionItem{Label: f.Name, Kind: kindField, Detail: typeText(f.Type, sys)}
			if f.Doc != "" {
				it.Documentation = &markupContent{Kind: "markdown", Value: f.Doc}
			}
			out = append(out, it)
		}
		return out
	}
	prefix := base + "."
	seen := map[string]bool{}
	for _, c := range sh.Cells() {
		if !strings.HasPrefix(c.Name, prefix) || c.Kind == engine.Function {
			continue
		}
		rest := c.Name[len(prefix):]
		if i := strings.IndexByte(rest, '.'); i >= 0 {
			rest = rest[:i] // a template of the template
		}
		if seen[rest] {
			continue
		}
		seen[rest] = true
		it := completionItem{Label: rest, Kind: kindVariable, Detail: c.Kind.String()}
		if c.HasUnit {
			it.Detail = "[" + c.Unit().Symbol + "] " + c.Kind.String()
		}
		out = append(out, it)
	}
	return out
}

// maxPathItems bounds the template paths offered.
const maxPathItems = 200

// templatePaths lists the .sheaf files of the project, relative to the
// document's folder, with `/` between folders as `use` paths are written.
func templatePaths(d *document) []completionItem {
	out := []completionItem{}
	dir := filepath.Dir(d.path)
	root := projectRoot(dir)
	for _, path := range sheafFiles(root, maxPathItems+1) {
		if filepath.Clean(path) == filepath.Clean(d.path) {
			continue
		}
		rel, err := filepath.Rel(dir, path)
		if err != nil {
			continue
		}
		out = append(out, completionItem{Label: filepath.ToSlash(rel), Kind: kindFile, Detail: "template"})
	}
	return out
}
