package lsp

import (
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
	"time"
	"unicode/utf16"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/engine/units"
)

func utf16Of(s string) []uint16 { return utf16.Encode([]rune(s)) }

// rodSheet is our own scenario around check values C1 of the shared
// reference list: a prismatic bar, P = 250 kN, L = 4.2 m, solid d = 30 mm,
// E = 210 GPa. Its names are Greek, a unit is `°`, and a description
// holds `𝜎` (outside the Basic Multilingual Plane: two UTF-16 units), so
// that every position the server sends is checked in UTF-16 code units.
const rodSheet = `title: Tie rod of the loading dock canopy
units: metric

## Rod
P    [kN]   = 250 kN               -- pull in the rod
L    [m]    = 4.2 m                -- length between pins
d    [mm]   = 30 mm                -- diameter of the plain rod
E_s  [GPa]  = 210 GPa              -- modulus of steel
A_σ  [mm^2] = pi * d^2 / 4         -- area of the shank
σ_Ed [MPa]  = P / A_σ              -- stress 𝜎 in the rod
δ    [mm]   = P * L / (E_s * A_σ)  -- elongation
θ           = 30 °                 -- slope of the rod
f_y  [MPa]  = 355 MPa              -- yield strength
mat         = {E: 210 GPa, f_y: 355 MPa}

check stress: σ_Ed <= f_y  -- rod in tension
`

const rodURI = "file:///virtual/rod.sheaf"

// Source: REFERENCES.md C1 (mechanics of materials, δ = PL/(EA)):
// σ = 353.677651 MPa, δ = 7.07355303 mm.
const (
	refSigma = 353.677651e6 // Pa
	refDelta = 7.07355303e-3
)

func rodValues(P float64) (sigma, delta float64) {
	A := math.Pi * 0.030 * 0.030 / 4
	return P / A, P * 4.2 / (210e9 * A)
}

func unitOf(t *testing.T, sym string) units.Unit {
	t.Helper()
	u, err := units.Parse(sym)
	if err != nil {
		t.Fatal(err)
	}
	return u
}

func hintOn(t *testing.T, hs []inlayHint, line int) inlayHint {
	t.Helper()
	for _, h := range hs {
		if h.Position.Line == line {
			return h
		}
	}
	t.Fatalf("no inlay hint on line %d in %v", line, hs)
	return inlayHint{}
}

func TestSession(t *testing.T) {
	sigma, delta := rodValues(250e3)
	if math.Abs(sigma/refSigma-1) > 1e-8 || math.Abs(delta/refDelta-1) > 1e-8 {
		t.Fatalf("the test's own formula is off: σ %g, δ %g", sigma, delta)
	}
	c := newClient(t, Options{Debounce: 10 * time.Millisecond, Log: os.Stderr})
	c.initialize()
	if ds := c.open(rodURI, rodSheet); len(ds) != 0 {
		t.Fatalf("problems in the rod sheet: %v", ds)
	}
	sigLine := lineOf(t, rodSheet, "σ_Ed [MPa]")

	// Inlay hints: values in display units, at the end of the line in
	// UTF-16 units.
	hs := c.hints(rodURI)
	h := hintOn(t, hs, sigLine)
	if want := "= " + units.Format(sigma, unitOf(t, "MPa"), 4); h.Label != want {
		t.Errorf("σ_Ed hint %q, want %q", h.Label, want)
	}
	if want := len(utf16Of(strings.Split(rodSheet, "\n")[sigLine])); h.Position.Character != want {
		t.Errorf("σ_Ed hint at character %d, want %d (UTF-16 end of line)", h.Position.Character, want)
	}
	if got, want := hintOn(t, hs, lineOf(t, rodSheet, "δ    [mm]")).Label, "= "+units.Format(delta, unitOf(t, "mm"), 4); got != want {
		t.Errorf("δ hint %q, want %q", got, want)
	}
	util := sigma / 355e6
	if got, want := hintOn(t, hs, lineOf(t, rodSheet, "check stress")).Label, "= "+units.FormatNumber(util*100, 4)+" % ok"; got != want {
		t.Errorf("check hint %q, want %q", got, want)
	}

	// Hover on a use of A_σ, found by its UTF-16 column.
	var hv hover
	c.call("textDocument/hover", at(rodURI, sigLine, charOf(t, rodSheet, sigLine, "A_σ ")+1), &hv)
	A := math.Pi * 0.030 * 0.030 / 4
	if v := hv.Contents.Value; !strings.Contains(v, "**A_σ** [mm^2]") || !strings.Contains(v, units.Format(A, unitOf(t, "mm^2"), 4)) {
		t.Errorf("hover on A_σ:\n%s", v)
	}
	if hv.Range == nil || hv.Range.Start.Character != charOf(t, rodSheet, sigLine, "A_σ ") || hv.Range.End.Character != hv.Range.Start.Character+3 {
		t.Errorf("hover range %+v, want A_σ at %d, 3 units long", hv.Range, charOf(t, rodSheet, sigLine, "A_σ "))
	}
	// Hover on σ_Ed's name: value, dimension, formula with values.
	c.call("textDocument/hover", at(rodURI, sigLine, 1), &hv)
	for _, want := range []string{"**σ_Ed** [MPa]", units.Format(sigma, unitOf(t, "MPa"), 4), "stress, dimension", "P / A_σ",
		"= (250 kN) / (" + units.Format(A, unitOf(t, "mm^2"), 4) + ")", "stress 𝜎 in the rod"} {
		if !strings.Contains(hv.Contents.Value, want) {
			t.Errorf("hover on σ_Ed lacks %q:\n%s", want, hv.Contents.Value)
		}
	}
	// Hover on the unit `°`: its factor to SI is π/180.
	thLine := lineOf(t, rodSheet, "θ ")
	c.call("textDocument/hover", at(rodURI, thLine, charOf(t, rodSheet, thLine, "°")), &hv)
	if !strings.Contains(hv.Contents.Value, "0.017453292519943") {
		t.Errorf("hover on °:\n%s", hv.Contents.Value)
	}
	// Hover on a built-in constant and on a record field.
	aLine := lineOf(t, rodSheet, "A_σ  [mm^2]")
	c.call("textDocument/hover", at(rodURI, aLine, charOf(t, rodSheet, aLine, "pi")), &hv)
	if !strings.Contains(hv.Contents.Value, "3.14159265358979") {
		t.Errorf("hover on pi:\n%s", hv.Contents.Value)
	}

	// Definition of A_σ from its use.
	var locs []location
	c.call("textDocument/definition", at(rodURI, sigLine, charOf(t, rodSheet, sigLine, "A_σ ")+2), &locs)
	if len(locs) != 1 || locs[0].URI != rodURI || locs[0].Range.Start != (position{aLine, 0}) || locs[0].Range.End != (position{aLine, 3}) {
		t.Errorf("definition of A_σ: %+v", locs)
	}
	// References to A_σ: its definition and two uses.
	var refs []location
	c.call("textDocument/references", referenceParams{textDocumentPositionParams: at(rodURI, aLine, 1),
		Context: struct {
			IncludeDeclaration bool `json:"includeDeclaration"`
		}{true}}, &refs)
	if len(refs) != 3 {
		t.Errorf("references to A_σ: %+v", refs)
	}

	// Completion: names with units, functions, units after a number,
	// fields after a dot, header keys.
	labels := func(l completionList) map[string]string {
		m := map[string]string{}
		for _, it := range l.Items {
			m[it.Label] = it.Detail
		}
		return m
	}
	var cl completionList
	c.call("textDocument/completion", at(rodURI, sigLine, charOf(t, rodSheet, sigLine, "P /")), &cl)
	if m := labels(cl); !strings.Contains(m["σ_Ed"], "[MPa]") || m["sqrt"] == "" || !strings.Contains(m["axial_elongation"], "axial_elongation(") {
		t.Errorf("completion of names: σ_Ed %q, sqrt %q, axial_elongation %q", m["σ_Ed"], m["sqrt"], m["axial_elongation"])
	}

	// didChange of an input value: the values follow at once.
	changed := strings.Replace(rodSheet, "250 kN ", "125 kN ", 1)
	c.change(rodURI, 2, changed)
	sigma2, _ := rodValues(125e3)
	if got, want := hintOn(t, c.hints(rodURI), sigLine).Label, "= "+units.Format(sigma2, unitOf(t, "MPa"), 4); got != want {
		t.Errorf("after the change of P: σ_Ed hint %q, want %q", got, want)
	}
	// Completion in the changed text: a unit after a number, a field.
	edited := changed + "x = 12 k\ny = mat.\n"
	c.change(rodURI, 3, edited)
	xLine := lineOf(t, edited, "x = 12 k")
	c.call("textDocument/completion", at(rodURI, xLine, len("x = 12 k")), &cl)
	if m := labels(cl); m["kN"] == "" || m["MPa"] == "" {
		t.Errorf("completion after a number lacks kN or MPa: %d items", len(cl.Items))
	}
	ds := c.waitDiags(rodURI)
	if len(ds) == 0 {
		t.Error("no problem reported for the unfinished lines")
	}
	c.call("textDocument/completion", at(rodURI, xLine+1, len("y = mat.")), &cl)
	if m := labels(cl); m["E"] == "" || m["f_y"] == "" || len(m) != 2 {
		t.Errorf("completion after `mat.`: %v", m)
	}
	c.call("textDocument/completion", at(rodURI, 1, 1), &cl)
	if m := labels(cl); m["revision"] == "" {
		t.Errorf("completion in the header lacks revision: %v", m)
	}
	// While the sheet does not check, no values are shown.
	if hs := c.hints(rodURI); len(hs) != 0 {
		t.Errorf("a sheet with problems shows %d values", len(hs))
	}
	c.change(rodURI, 4, rodSheet)

	// Rename A_σ: every place it is written, in UTF-16 units.
	var we workspaceEdit
	c.call("textDocument/rename", renameParams{textDocumentPositionParams: at(rodURI, aLine, 1), NewName: "A_rod"}, &we)
	if got, want := applyEdits(t, rodSheet, we.Changes[rodURI]), strings.ReplaceAll(rodSheet, "A_σ", "A_rod"); got != want {
		t.Errorf("rename gave\n%s\nwant\n%s", got, want)
	}
	if err := c.try("textDocument/rename", renameParams{textDocumentPositionParams: at(rodURI, aLine, 1), NewName: "P"}, &we); err == nil {
		t.Error("rename onto an existing cell was accepted")
	}
	if err := c.try("textDocument/rename", renameParams{textDocumentPositionParams: at(rodURI, aLine, 1), NewName: "sqrt"}, &we); err == nil {
		t.Error("rename onto a built-in was accepted")
	}

	// Formatting through the canonical printer.
	messy := strings.ReplaceAll(rodSheet, "P    [kN]   = 250 kN ", "P [kN]=250 kN")
	c.change(rodURI, 5, messy)
	var edits []textEdit
	c.call("textDocument/formatting", documentParams{TextDocument: textDocumentIdentifier{URI: rodURI}}, &edits)
	want, err := sheet.FormatSource("rod", []byte(messy))
	if err != nil {
		t.Fatal(err)
	}
	if got := applyEdits(t, messy, edits); got != string(want) {
		t.Errorf("formatting gave\n%s\nwant\n%s", got, want)
	}
	c.change(rodURI, 6, rodSheet+"broken [kN = 1\n")
	if err := c.try("textDocument/formatting", documentParams{TextDocument: textDocumentIdentifier{URI: rodURI}}, &edits); err == nil {
		t.Error("a sheet with syntax errors was formatted")
	}

	// Document symbols: the section with its cells.
	c.change(rodURI, 7, rodSheet)
	var syms []documentSymbol
	c.call("textDocument/documentSymbol", documentParams{TextDocument: textDocumentIdentifier{URI: rodURI}}, &syms)
	if len(syms) != 1 || syms[0].Name != "Rod" || len(syms[0].Children) != 11 {
		t.Errorf("symbols: %+v", syms)
	}
	c.shutdown()
}

// applyEdits applies LSP edits (UTF-16 positions) to s, as an editor does.
func applyEdits(t *testing.T, s string, edits []textEdit) string {
	t.Helper()
	sort.Slice(edits, func(i, j int) bool {
		a, b := edits[i].Range.Start, edits[j].Range.Start
		return a.Line > b.Line || (a.Line == b.Line && a.Character > b.Character)
	})
	lines := strings.Split(s, "\n")
	off := func(p position) int {
		n := 0
		for i := 0; i < p.Line && i < len(lines); i++ {
			n += len(lines[i]) + 1
		}
		if p.Line >= len(lines) {
			return len(s)
		}
		u := utf16Of(lines[p.Line])
		if p.Character > len(u) {
			t.Fatalf("edit at %+v beyond the line %q", p, lines[p.Line])
		}
		return n + len(string(utf16.Decode(u[:p.Character])))
	}
	for _, e := range edits {
		a, b := off(e.Range.Start), off(e.Range.End)
		s = s[:a] + e.NewText + s[b:]
	}
	return s
}

func TestQuickFixes(t *testing.T) {
	src := "P [kN] = 38\nM [kN*m] = 3 kNm\nA [mm^2] = 100 mm^2\ns [MPa] = 5 kN / AA\n"
	tests := []struct {
		name, line, want string
	}{
		{"missing unit", "P [kN] = 38", "P [kN] = 38 kN"},
		{"unit product", "M [kN*m] = 3 kNm", "M [kN*m] = 3 kN*m"},
		{"did you mean", "s [MPa] = 5 kN / AA", "s [MPa] = 5 kN / A"},
	}
	c := newClient(t, Options{})
	c.initialize()
	uri := "file:///virtual/fix.sheaf"
	ds := c.open(uri, src)
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			li := lineOf(t, src, tt.line)
			var d *lspDiagnostic
			for i := range ds {
				if ds[i].Range.Start.Line == li {
					d = &ds[i]
				}
			}
			if d == nil {
				t.Fatalf("no problem on line %d: %+v", li, ds)
			}
			if len(d.RelatedInformation) != 1 || !strings.HasPrefix(d.RelatedInformation[0].Message, "hint: ") {
				t.Errorf("hint not given as related information: %+v", d.RelatedInformation)
			}
			var acts []codeAction
			c.call("textDocument/codeAction", codeActionParams{TextDocument: textDocumentIdentifier{URI: uri}, Range: d.Range,
				Context: struct {
					Diagnostics []lspDiagnostic `json:"diagnostics"`
				}{[]lspDiagnostic{*d}}}, &acts)
			if len(acts) != 1 {
				t.Fatalf("%d actions for %q", len(acts), d.Message)
			}
			got := applyEdits(t, src, acts[0].Edit.Changes[uri])
			if gl := strings.Split(got, "\n")[li]; gl != tt.want {
				t.Errorf("fixed line %q, want %q", gl, tt.want)
			}
		})
	}
	c.shutdown()
}

// TestBundledSheets opens every sheet under sheets/ and checks that the
// server reports no error, shows a value for every cell that the engine's
// own run shows, and hovers and goes to definitions in templates.
func TestBundledSheets(t *testing.T) {
	paths, _ := filepath.Glob("../../sheets/*.sheaf")
	if len(paths) < 5 {
		t.Fatalf("found %d sheets", len(paths))
	}
	before := snapshot(t, "../../sheets")
	defer func() {
		if !equalMaps(before, snapshot(t, "../../sheets")) {
			t.Error("the server changed files under sheets/")
		}
	}()
	c := newClient(t, Options{})
	c.initialize()
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		abs, _ := filepath.Abs(p)
		uri := pathToURI(abs)
		for _, d := range c.open(uri, string(src)) {
			if d.Severity == 1 {
				t.Errorf("%s: %s", p, d.Message)
			}
		}
		s, err := engine.Load(abs)
		if err != nil {
			t.Fatal(err)
		}
		res := s.Run(nil)
		hs := c.hints(uri)
		byLine := map[int]string{}
		for _, h := range hs {
			byLine[h.Position.Line] = h.Label
		}
		n := 0
		for _, cr := range res.Cells {
			x := cr.Cell
			if x.Kind == engine.Function || x.Range().Start().File != abs {
				continue
			}
			n++
			got := byLine[x.Range().End().Line-1]
			if x.Kind != engine.Check && x.Type != nil && cr.Known && strings.HasSuffix(cr.Text, "") {
				want := "= " + cr.Text
				if res.Combos != nil && res.Combos.CellIn[x.Index] >= 0 {
					// A value that depends on actions names its
					// combination, as the listing does.
					want += " (" + res.Combos.All[res.Combos.CellIn[x.Index]].Name + ")"
				}
				if _, num := cr.Value.(float64); num && got != want {
					t.Errorf("%s: %s shows %q, the engine's run %q", p, x.Name, got, want)
				}
			}
			// Hover on each cell's name names it.
			var hv hover
			li := x.NameRange().Start().Line - 1
			c.call("textDocument/hover", at(uri, li, x.NameRange().Start().Col-1), &hv)
			if !strings.Contains(hv.Contents.Value, "**"+x.Name+"**") {
				t.Errorf("%s: hover on %s:\n%s", p, x.Name, hv.Contents.Value)
			}
		}
		if n == 0 {
			t.Errorf("%s: no cells of its own", p)
		}
		// The bundled sheets are in canonical layout: formatting changes
		// nothing.
		var edits []textEdit
		c.call("textDocument/formatting", documentParams{TextDocument: textDocumentIdentifier{URI: uri}}, &edits)
		if len(edits) != 0 {
			t.Errorf("%s: formatting a canonical sheet gave %d edits", p, len(edits))
		}
		// Completion at the end of the last line offers every cell of the
		// sheet's own.
		var cl completionList
		last := strings.Count(string(src), "\n")
		c.call("textDocument/completion", at(uri, last, 0), &cl)
		offered := map[string]bool{}
		for _, it := range cl.Items {
			offered[it.Label] = true
		}
		for _, x := range s.Cells() {
			if !strings.Contains(x.Name, ".") && !offered[x.Name] {
				t.Errorf("%s: completion lacks %s", p, x.Name)
			}
		}
	}

	// didChange of an input of a bundled sheet: the values beside the
	// lines are those of the engine's run with the same input set.
	abs0, _ := filepath.Abs("../../sheets/mezzanine-hanger.sheaf")
	src0, _ := os.ReadFile(abs0)
	uri0 := pathToURI(abs0)
	changed := strings.Replace(string(src0), "= 16 mm ", "= 20 mm ", 1)
	c.change(uri0, 2, changed)
	s0, err := engine.Load(abs0)
	if err != nil {
		t.Fatal(err)
	}
	v, err := s0.ParseInput("d", "20 mm")
	if err != nil {
		t.Fatal(err)
	}
	st0 := s0.NewState()
	if err := st0.Set("d", v); err != nil {
		t.Fatal(err)
	}
	res := st0.Eval()
	byLine := map[int]string{}
	for _, h := range c.hints(uri0) {
		byLine[h.Position.Line] = h.Label
	}
	for _, name := range []string{"A_s", "sigma", "delta", "F_tRd"} {
		cr := res.Cell(name)
		want := "= " + cr.Text
		if m := st0.CellCombination(cr.Cell); m != "" {
			want += " (" + m + ")" // a cell that depends on actions names its combination
		}
		if got := byLine[cr.Cell.Range().End().Line-1]; got != want {
			t.Errorf("after d = 20 mm: %s shows %q, the engine's run %q", name, got, want)
		}
	}
	// Definition of a template's cell opens the template.
	abs, _ := filepath.Abs("../../sheets/walkway-pair.sheaf")
	src, _ := os.ReadFile(abs)
	li := lineOf(t, string(src), "N_node [kN] =")
	var locs []location
	c.call("textDocument/definition", at(pathToURI(abs), li, charOf(t, string(src), li, "access.N")+8), &locs)
	tmpl, _ := filepath.Abs("../../sheets/mezzanine-hanger.sheaf")
	tsrc, _ := os.ReadFile(tmpl)
	if len(locs) != 1 || locs[0].URI != pathToURI(tmpl) || locs[0].Range.Start.Line != lineOf(t, string(tsrc), "N [kN] =") {
		t.Errorf("definition of access.N: %+v", locs)
	}
	c.shutdown()
}

// TestRenameAcrossProject renames a template's cell from the template:
// the sheet that uses it changes too, and the server writes no file.
func TestRenameAcrossProject(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"mezzanine-hanger.sheaf", "walkway-pair.sheaf"} {
		b, err := os.ReadFile("../../sheets/" + name)
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "sheaf.root"), nil, 0o644); err != nil {
		t.Fatal(err)
	}
	before := snapshot(t, dir)
	pair := filepath.Join(dir, "walkway-pair.sheaf")
	s0, err := engine.Load(pair)
	if err != nil {
		t.Fatal(err)
	}
	node0 := s0.Run(nil).Cell("N_node").SI

	tmpl := filepath.Join(dir, "mezzanine-hanger.sheaf")
	src := before["mezzanine-hanger.sheaf"]
	c := newClient(t, Options{})
	c.initialize()
	uri := pathToURI(tmpl)
	c.open(uri, src)
	li := lineOf(t, src, "N [kN] =")
	var we workspaceEdit
	// With changes not saved, the sheets that use the template were
	// checked against another text: the rename is refused.
	c.change(uri, 2, "# a new first line\n"+src)
	if err := c.try("textDocument/rename", renameParams{textDocumentPositionParams: at(uri, li+1, 1), NewName: "N_design"}, &we); err == nil {
		t.Error("rename accepted while the template has unsaved changes")
	}
	c.change(uri, 3, src)
	c.call("textDocument/rename", renameParams{textDocumentPositionParams: at(uri, li, 1), NewName: "N_design"}, &we)
	c.shutdown()
	if after := snapshot(t, dir); !equalMaps(before, after) {
		t.Fatal("the server changed files on disk")
	}
	if len(we.Changes) != 2 {
		t.Fatalf("rename changes %d files, want 2: %+v", len(we.Changes), we.Changes)
	}
	for name, text := range before {
		if name == "sheaf.root" {
			continue
		}
		u := pathToURI(filepath.Join(dir, name))
		got := applyEdits(t, text, we.Changes[u])
		code := ""
		for _, ln := range strings.Split(got, "\n") {
			if !strings.HasPrefix(ln, "#") {
				code += ln + "\n"
			}
		}
		// The cell N is renamed everywhere; the parameter N of elong is
		// another name and stays.
		want := map[string][]string{
			"mezzanine-hanger.sheaf": {"N_design [kN] = (g_k", "= N_design / A_s", "elong(N_design, L", "check tension: N_design <=", "elong(N [kN]", "= N * len"},
			"walkway-pair.sheaf":     {"= access.N_design + service.N_design"},
		}[name]
		for _, w := range want {
			if !strings.Contains(code, w) {
				t.Errorf("%s after the rename lacks %q:\n%s", name, w, got)
			}
		}
		if err := os.WriteFile(filepath.Join(dir, name), []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	s1, err := engine.Load(pair)
	if err != nil {
		t.Fatalf("the renamed project does not check: %v", err)
	}
	if node1 := s1.Run(nil).Cell("N_node").SI; node1 != node0 {
		t.Errorf("N_node %g after the rename, %g before", node1, node0)
	}
}

func snapshot(t *testing.T, dir string) map[string]string {
	t.Helper()
	out := map[string]string{}
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range es {
		b, err := os.ReadFile(filepath.Join(dir, e.Name()))
		if err != nil {
			t.Fatal(err)
		}
		out[e.Name()] = string(b)
	}
	return out
}

func equalMaps(a, b map[string]string) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if b[k] != v {
			return false
		}
	}
	return true
}

// TestTemplateProblems: a problem inside a template is published to the
// template's URI, and cleared when the sheet is closed.
func TestTemplateProblems(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "sheaf.root"), nil, 0o644)
	os.WriteFile(filepath.Join(dir, "t.sheaf"), []byte("a [kN] = 3 kN\nb [kN] = a + 2 m\n"), 0o644)
	main := "use t from \"t.sheaf\"\nx [kN] = t.a\n"
	c := newClient(t, Options{})
	c.initialize()
	uri := pathToURI(filepath.Join(dir, "main.sheaf"))
	c.open(uri, main)
	turi := pathToURI(filepath.Join(dir, "t.sheaf"))
	td := c.waitDiags(turi)
	if len(td) != 1 || td[0].Range.Start.Line != 1 || !strings.Contains(td[0].Message, "cannot add") {
		t.Errorf("template problems: %+v", td)
	}
	c.notify("textDocument/didClose", didCloseParams{TextDocument: textDocumentIdentifier{URI: uri}})
	if ds := c.waitDiags(turi); len(ds) != 0 {
		t.Errorf("template problems not cleared on close: %+v", ds)
	}
	c.shutdown()
}

// TestLifecycle: requests before initialize fail; exit without shutdown
// is an error; a broken frame ends the session with an error.
func TestLifecycle(t *testing.T) {
	c := newClient(t, Options{})
	if err := c.try("textDocument/hover", at(rodURI, 0, 0), nil); err == nil || err.Code != codeNotInitialized {
		t.Errorf("hover before initialize: %v", err)
	}
	c.initialize()
	if err := c.try("no/such/method", nil, nil); err == nil || err.Code != codeMethodNotFound {
		t.Errorf("unknown method: %v", err)
	}
	c.notify("exit", nil)
	if err := <-c.done; err == nil {
		t.Error("exit without shutdown ended cleanly")
	}

	tests := []struct{ name, in string }{
		{"no length", "Content-Type: x\r\n\r\n{}"},
		{"bad length", "Content-Length: x\r\n\r\n{}"},
		{"huge", "Content-Length: 999999999999\r\n\r\n{}"},
		{"short body", "Content-Length: 10\r\n\r\n{}"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out strings.Builder
			if err := Serve(strings.NewReader(tt.in), &out, Options{}); err == nil {
				t.Error("broken input served without error")
			}
		})
	}
}
