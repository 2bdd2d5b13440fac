package lsp

import (
	"encoding/json"
	"regexp"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// fixData is the one edit a problem's hint names, carried in the
// diagnostic's data field.
type fixData struct {
	Title   string   `json:"title"`
	Range   lspRange `json:"range"`
	NewText string   `json:"newText"`
}

var (
	didYouMean     = regexp.MustCompile("^did you mean `([^`]+)`\\?$")
	didYouMeanPath = regexp.MustCompile(`^did you mean ("(?:[^"\\]|\\.)*")\?$`)
	plainNumber    = regexp.MustCompile(`^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$`)
	noSpace        = regexp.MustCompile(`^\S+$`)
)

// fixFor returns the edit that problem p's hint names, when there is
// exactly one and it replaces what the problem marks; nil otherwise.
// Three kinds: a did-you-mean of a name or unit (`kNm` -> `kN*m`), of a
// template path, and a plain number given for a cell whose display unit
// has a dimension (`P [kN] = 38` -> `38 kN`).
func (d *document) fixFor(p *diag.Diagnostic) *fixData {
	r := d.lines.rangeOf(p.Range)
	if r.Start.Line != r.End.Line {
		return nil
	}
	from, to := d.lines.offset(r.Start), d.lines.offset(r.End)
	if from >= to {
		return nil
	}
	marked := d.lines.src[from:to]
	if m := didYouMean.FindStringSubmatch(p.Hint); m != nil && noSpace.MatchString(marked) {
		want := m[1]
		if !strings.Contains(marked, ".") && strings.Contains(want, ".") {
			// The mark covers the last part of `rod.sigm`: the template
			// name before it must be the one the hint writes.
			dot := strings.LastIndexByte(want, '.')
			if !strings.HasSuffix(d.lines.src[:from], want[:dot+1]) {
				return nil
			}
			want = want[dot+1:]
		} else if strings.Count(marked, ".") != strings.Count(want, ".") {
			return nil
		}
		return &fixData{Title: "Change `" + marked + "` to `" + want + "`", Range: r, NewText: want}
	}
	if m := didYouMeanPath.FindStringSubmatch(p.Hint); m != nil {
		want, err := strconv.Unquote(m[1])
		if err != nil || strings.ContainsAny(want, "\"\n") {
			return nil
		}
		return &fixData{Title: "Use \"" + want + "\"", Range: r, NewText: want}
	}
	if strings.Contains(p.Summary, "but the expression is a plain number") && plainNumber.MatchString(marked) {
		if c, ok := d.itemAt(p.Range.Start().Line).(*sheet.Cell); ok && c.Unit != nil && strings.TrimSpace(c.Expr.Text) == marked {
			return &fixData{Title: "Write `" + marked + " " + c.Unit.Text + "`", Range: r, NewText: marked + " " + c.Unit.Text}
		}
	}
	return nil
}

// codeActions offers the fix of each problem in the range that has one.
func (s *Server) codeActions(params json.RawMessage) (any, *rpcError) {
	var p codeActionParams
	if err := decode(params, &p); err != nil {
		return nil, err
	}
	d, err := s.doc(p.TextDocument.URI)
	if err != nil {
		return nil, err
	}
	d.ensure()
	out := []codeAction{}
	for _, ld := range p.Context.Diagnostics {
		fix := ld.Data
		if fix == nil {
			continue
		}
		// The fix was computed for the text the diagnostic was published
		// on; offer it only while that text is still there.
		from, to := d.lines.offset(ld.Range.Start), d.lines.offset(ld.Range.End)
		if from > to || ld.Range != fix.Range {
			continue
		}
		if !d.stillProblem(ld) {
			continue
		}
		out = append(out, codeAction{Title: fix.Title, Kind: "quickfix", Diagnostics: []lspDiagnostic{ld}, IsPreferred: true,
			Edit: &workspaceEdit{Changes: map[string][]textEdit{d.uri: {{Range: fix.Range, NewText: fix.NewText}}}}})
	}
	return out, nil
}

// stillProblem reports whether the current analysis still has the
// problem ld at its place.
func (d *document) stillProblem(ld lspDiagnostic) bool {
	for _, p := range d.errs {
		if d.own(p.Range.Start()) && d.lines.rangeOf(p.Range) == ld.Range && strings.HasPrefix(ld.Message, p.Summary) {
			return true
		}
	}
	return false
}
