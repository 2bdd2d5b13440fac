package lsp

import (
	"fmt"
	"slices"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
)

// problems returns every problem of d, the sheet's own and its
// templates': the check's when the text does not check; otherwise the
// run-time problems of the evaluation (a division by zero, a value outside
// a table) and, as warnings, the design checks that fail, so that the
// problems panel lists what `sheaf run` would exit non-zero for.
func (d *document) problems() diag.List {
	if d.failed {
		return d.errs
	}
	if d.sheet == nil {
		return nil
	}
	r := d.state.Results()
	out := append(diag.List(nil), r.Problems...)
	for _, c := range r.Checks {
		if c.Pass || !c.Known {
			continue // an unknown check has its problem reported at its cause
		}
		out = append(out, &diag.Diagnostic{Severity: diag.Warning, Range: c.Cell.NameRange(),
			Summary: fmt.Sprintf("design check `%s` FAILS: utilisation %s %%", c.Cell.Name, units.FormatNumber(c.Util*100, 4)),
			Detail:  fmt.Sprintf("demand %s against capacity %s", units.Format(c.Demand, c.Unit, 4), units.Format(c.Capacity, c.Unit, 4))})
	}
	return out
}

// sources returns the text of each file named in l, for converting its
// positions: the open document itself, else what the engine read.
func (d *document) sources(l diag.List) map[string]*text {
	out := map[string]*text{d.path: d.lines}
	var src map[string][]byte
	if d.sheet != nil {
		src = d.sheet.Sources()
	} else {
		src = engine.ReadSources(l)
	}
	for name, b := range src {
		if _, ok := out[name]; !ok {
			out[name] = newText(string(b))
		}
	}
	return out
}

// toLSP converts the problems of d, grouped by the URI of the file each
// lies in.
func (d *document) toLSP(l diag.List) map[string][]lspDiagnostic {
	texts := d.sources(l)
	out := map[string][]lspDiagnostic{}
	for _, p := range l {
		file := p.Range.Start().File
		if file == "" {
			file = d.path
		}
		t := texts[file]
		if t == nil {
			t = newText("")
		}
		uri := d.uri
		if file != d.path {
			uri = pathToURI(file)
		}
		r := t.rangeOf(p.Range)
		ld := lspDiagnostic{Range: r, Severity: 1, Source: "sheaf", Message: p.Summary}
		if p.Severity == diag.Warning {
			ld.Severity = 2
		}
		if p.Detail != "" {
			ld.Message += "\n" + p.Detail
		}
		if p.Hint != "" {
			ld.RelatedInformation = []diagnosticRelatedInformation{{Location: location{URI: uri, Range: r}, Message: "hint: " + p.Hint}}
			if file == d.path {
				ld.Data = d.fixFor(p)
			}
		}
		out[uri] = append(out[uri], ld)
	}
	return out
}

// publish sends the problems of d (to d's URI and to those of its
// templates).
func (s *Server) publish(d *document) {
	by := d.toLSP(d.problems())
	if by[d.uri] == nil {
		by[d.uri] = []lspDiagnostic{} // an empty list clears the document's problems
	}
	s.setPublished(d.uri, by)
}

// setPublished records what source document src has to say about each
// target URI and publishes every target whose list changed. A template
// used by two open sheets gets the problems both found; a target that
// src no longer reports on is cleared.
func (s *Server) setPublished(src string, byTarget map[string][]lspDiagnostic) {
	targets := map[string]bool{}
	for t, m := range s.published {
		if _, ok := m[src]; ok {
			targets[t] = true
		}
	}
	for t := range byTarget {
		targets[t] = true
	}
	keys := make([]string, 0, len(targets))
	for t := range targets {
		keys = append(keys, t)
	}
	slices.Sort(keys)
	for _, t := range keys {
		m := s.published[t]
		if m == nil {
			m = map[string][]lspDiagnostic{}
			s.published[t] = m
		}
		if l, ok := byTarget[t]; ok {
			m[src] = l
		} else {
			delete(m, src)
		}
		all := []lspDiagnostic{}
		srcs := make([]string, 0, len(m))
		for k := range m {
			srcs = append(srcs, k)
		}
		slices.Sort(srcs)
		for _, k := range srcs {
			all = append(all, m[k]...)
		}
		if len(m) == 0 {
			delete(s.published, t)
		}
		p := publishDiagnosticsParams{URI: t, Diagnostics: dedupe(all)}
		if d := s.docs[t]; d != nil && t == src {
			v := d.version
			p.Version = &v
		}
		s.notify("textDocument/publishDiagnostics", p)
	}
}

// dedupe drops repeats: a template used twice reports its problem twice.
func dedupe(l []lspDiagnostic) []lspDiagnostic {
	out := l[:0]
	seen := map[string]bool{}
	for _, d := range l {
		k := fmt.Sprintf("%v|%s", d.Range, d.Message)
		if seen[k] {
			continue
		}
		seen[k] = true
		out = append(out, d)
	}
	return out
}
