package lsp

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/funcs"
)

// TestHoverKinds hovers on what the bundled sheets write besides cell
// names: a plugin function, a record field, a unit in brackets, and
// completes after a template's name and in a `use` path.
func TestHoverKinds(t *testing.T) {
	abs, _ := filepath.Abs("../../sheets/canopy-hanger.sheaf")
	b, err := os.ReadFile(abs)
	if err != nil {
		t.Fatal(err)
	}
	src, uri := string(b), pathToURI(abs)
	c := newClient(t, Options{})
	c.initialize()
	c.open(uri, src)
	def, ok := funcs.Lookup("bar_uniform")
	if !ok {
		t.Fatal("bar_uniform is not registered")
	}
	tests := []struct {
		name, line, at string
		want           []string
	}{
		{"plugin", "rod            = bar_uniform(", "bar_uniform", []string{"bar_uniform(", def.Source, "family " + def.Family}},
		{"field", "f_yd      [MPa] = rod_steel.f_y", "f_y /", []string{"**rod_steel.f_y** = **355 MPa**", "field of rod_steel"}},
		// k = 1000 (SI prefix); N/m^2 = kg*m^-1*s^-2 (SI Brochure, 9th ed., Table 4).
		{"unit in brackets", "g_k    [kN/m^2]", "kN/m^2", []string{"1 kN/m^2 = 1000 kg*m^-1*s^-2 (SI)", "area load"}},
		{"unit after a number", "g_k    [kN/m^2] = 1.1 kN/m^2", "1.1 kN", []string{"1 kN/m^2 = 1000"}},
		{"builtin", "A         [mm^2] = pi * d^2 / 4", "pi", []string{"3.14159"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			li := lineOf(t, src, tt.line)
			ch := charOf(t, src, li, tt.at)
			if tt.name == "unit after a number" {
				ch += len("1.1 ")
			}
			var hv hover
			c.call("textDocument/hover", at(uri, li, ch), &hv)
			for _, w := range tt.want {
				if !strings.Contains(hv.Contents.Value, w) {
					t.Errorf("hover lacks %q:\n%s", w, hv.Contents.Value)
				}
			}
		})
	}
	c.shutdown()

	// A template's cells after its name, and template paths.
	pair, _ := filepath.Abs("../../sheets/walkway-pair.sheaf")
	pb, _ := os.ReadFile(pair)
	psrc := string(pb) + "x [kN] = access.\n"
	c = newClient(t, Options{})
	c.initialize()
	puri := pathToURI(pair)
	c.open(puri, string(pb))
	c.change(puri, 2, psrc)
	var cl completionList
	li := lineOf(t, psrc, "x [kN] = access.")
	c.call("textDocument/completion", at(puri, li, len("x [kN] = access.")), &cl)
	found := map[string]string{}
	for _, it := range cl.Items {
		found[it.Label] = it.Detail
	}
	if !strings.Contains(found["N"], "[kN]") || found["tension"] == "" {
		t.Errorf("completion after `access.`: %v", found)
	}
	useLine := lineOf(t, psrc, "use access from")
	c.call("textDocument/completion", at(puri, useLine, len(`use access from "`)), &cl)
	found = map[string]string{}
	for _, it := range cl.Items {
		found[it.Label] = it.Detail
	}
	if found["mezzanine-hanger.sheaf"] == "" || found["walkway-pair.sheaf"] != "" {
		t.Errorf("template paths: %v", found)
	}
	c.shutdown()
}

// TestRenameOverride renames a template input from a `use` block that
// overrides it: the template's definition and every use change too.
func TestRenameOverride(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "sheaf.root"), nil, 0o644)
	tmpl := "d [mm] = 16 mm\nA [mm^2] = pi * d^2 / 4\n"
	main := "use rod from \"rod.sheaf\"\n    d [mm] = 20 mm\nx [mm] = rod.d * 2\n"
	os.WriteFile(filepath.Join(dir, "rod.sheaf"), []byte(tmpl), 0o644)
	os.WriteFile(filepath.Join(dir, "main.sheaf"), []byte(main), 0o644)
	c := newClient(t, Options{})
	c.initialize()
	uri := pathToURI(filepath.Join(dir, "main.sheaf"))
	c.open(uri, main)
	var we workspaceEdit
	c.call("textDocument/rename", renameParams{textDocumentPositionParams: at(uri, 1, 4), NewName: "d_rod"}, &we)
	c.shutdown()
	if got, want := applyEdits(t, main, we.Changes[uri]), strings.ReplaceAll(main, "d [mm]", "d_rod [mm]"); got != strings.ReplaceAll(want, "rod.d ", "rod.d_rod ") {
		t.Errorf("main after the rename:\n%s", got)
	}
	turi := pathToURI(filepath.Join(dir, "rod.sheaf"))
	if got := applyEdits(t, tmpl, we.Changes[turi]); got != "d_rod [mm] = 16 mm\nA [mm^2] = pi * d_rod^2 / 4\n" {
		t.Errorf("template after the rename:\n%s", got)
	}
}

// TestFailingCheck: a check that fails shows FAILS beside its line and
// as a warning among the problems.
func TestFailingCheck(t *testing.T) {
	src := strings.Replace(rodSheet, "355 MPa", "300 MPa", 1)
	c := newClient(t, Options{})
	c.initialize()
	ds := c.open(rodURI, src)
	sigma, _ := rodValues(250e3)
	li := lineOf(t, src, "check stress")
	h := hintOn(t, c.hints(rodURI), li)
	if !strings.HasSuffix(h.Label, " % FAILS") || !strings.Contains(h.Label, strings.TrimSuffix(strings.Fields(h.Label)[1], "%")) {
		t.Errorf("failing check shows %q", h.Label)
	}
	if util := sigma / 300e6; util <= 1 {
		t.Fatalf("the test's check passes: %g", util)
	}
	if len(ds) != 1 || ds[0].Severity != 2 || !strings.Contains(ds[0].Message, "FAILS") || ds[0].Range.Start.Line != li {
		t.Errorf("problems: %+v", ds)
	}
	c.shutdown()
}

// TestTemplatePathFix: the did-you-mean of a template path is a fix.
func TestTemplatePathFix(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "sheaf.root"), nil, 0o644)
	os.WriteFile(filepath.Join(dir, "hanger.sheaf"), []byte("d [mm] = 16 mm\n"), 0o644)
	main := "use r from \"hangr.sheaf\"\nx [mm] = 2 mm\n"
	c := newClient(t, Options{})
	c.initialize()
	uri := pathToURI(filepath.Join(dir, "main.sheaf"))
	ds := c.open(uri, main)
	if len(ds) != 1 || ds[0].Data == nil {
		t.Fatalf("problems: %+v", ds)
	}
	var acts []codeAction
	c.call("textDocument/codeAction", codeActionParams{TextDocument: textDocumentIdentifier{URI: uri}, Range: ds[0].Range,
		Context: struct {
			Diagnostics []lspDiagnostic `json:"diagnostics"`
		}{ds}}, &acts)
	if len(acts) != 1 || applyEdits(t, main, acts[0].Edit.Changes[uri]) != strings.Replace(main, "hangr", "hanger", 1) {
		t.Errorf("actions: %+v", acts)
	}
	c.shutdown()
}

// FuzzServe feeds arbitrary bytes to the server: it must answer or stop
// with an error, never panic or hang.
func FuzzServe(f *testing.F) {
	f.Add([]byte(frame(`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`)))
	f.Add([]byte(frame(`{"jsonrpc":"2.0","id":1,"method":"initialize","params":{}}`) +
		frame(`{"jsonrpc":"2.0","method":"textDocument/didOpen","params":{"textDocument":{"uri":"file:///a.sheaf","version":1,"text":"a = 1 kN\nb [kN] = a * 2\n"}}}`) +
		frame(`{"jsonrpc":"2.0","id":2,"method":"textDocument/hover","params":{"textDocument":{"uri":"file:///a.sheaf"},"position":{"line":1,"character":10}}}`) +
		frame(`{"jsonrpc":"2.0","id":3,"method":"textDocument/completion","params":{"textDocument":{"uri":"file:///a.sheaf"},"position":{"line":9,"character":-4}}}`)))
	f.Add([]byte("Content-Length: 2\r\n\r\n{}"))
	f.Add([]byte("Content-Length: 5\r\n\r\n[1,2]"))
	f.Fuzz(func(t *testing.T, in []byte) {
		var out strings.Builder
		_ = Serve(strings.NewReader(string(in)), &out, Options{})
	})
}

func frame(body string) string {
	return "Content-Length: " + itoa(len(body)) + "\r\n\r\n" + body
}

// TestTemplateSaved: fixing a template and saving it checks the open
// sheets that use it again.
func TestTemplateSaved(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "sheaf.root"), nil, 0o644)
	tpath := filepath.Join(dir, "t.sheaf")
	os.WriteFile(tpath, []byte("a [kN] = 3 kN\nb [kN] = a + 2 m\n"), 0o644)
	main := "use t from \"t.sheaf\"\nx [kN] = t.b * 2\n"
	c := newClient(t, Options{})
	c.initialize()
	uri := pathToURI(filepath.Join(dir, "main.sheaf"))
	c.open(uri, main)
	turi := pathToURI(tpath)
	if ds := c.waitDiags(turi); len(ds) != 1 {
		t.Fatalf("template problems: %+v", ds)
	}
	if hs := c.hints(uri); len(hs) != 0 {
		t.Errorf("values shown for a sheet whose template is broken: %+v", hs)
	}
	os.WriteFile(tpath, []byte("a [kN] = 3 kN\nb [kN] = a + 2 kN\n"), 0o644) // the editor saved the fix
	c.notify("textDocument/didSave", didCloseParams{TextDocument: textDocumentIdentifier{URI: turi}})
	if ds := c.waitDiags(turi); len(ds) != 0 {
		t.Errorf("template problems after the fix: %+v", ds)
	}
	// x = (3 kN + 2 kN) * 2 = 10 kN.
	if h := hintOn(t, c.hints(uri), 1); h.Label != "= 10 kN" {
		t.Errorf("x shows %q after the fix", h.Label)
	}
	c.shutdown()
}

// TestParamHover: a parameter in a function body is the parameter, not a
// cell of the same name.
func TestParamHover(t *testing.T) {
	src := "N [kN] = 5 kN\nf(N [kN], L [m]) [kN*m] = N * L\ny [kN*m] = f(2 kN, 3 m)\n"
	c := newClient(t, Options{})
	c.initialize()
	c.open(rodURI, src)
	var hv hover
	c.call("textDocument/hover", at(rodURI, 1, strings.Index("f(N [kN], L [m]) [kN*m] = N * L", "= N")+2), &hv)
	if !strings.Contains(hv.Contents.Value, "**N** [kN]: a parameter of `f(N [kN], L [m]) [kN*m]`") {
		t.Errorf("hover on the parameter N:\n%s", hv.Contents.Value)
	}
	var locs []location
	c.call("textDocument/definition", at(rodURI, 1, strings.Index("f(N [kN], L [m]) [kN*m] = N * L", "* L")+2), &locs)
	if len(locs) != 1 || locs[0].Range.Start != (position{1, 10}) {
		t.Errorf("definition of the parameter L: %+v", locs)
	}
	c.shutdown()
}

// TestEncodeHints: the hand-written encoding of inlay hints is the one
// encoding/json gives.
func TestEncodeHints(t *testing.T) {
	tests := [][]inlayHint{
		{},
		{{Position: position{3, 17}, Label: "= 109.5 MPa", PaddingLeft: true}},
		{{Position: position{0, 0}, Label: `= "a<b>&c" σ 𝜎 ‰`}, {Position: position{1 << 20, 2}, Label: "= 38.03 % ok", PaddingLeft: true}},
	}
	for _, hs := range tests {
		want, _ := json.Marshal(hs)
		if got := encodeHints(hs); string(got) != string(want) {
			t.Errorf("encodeHints:\n%s\nencoding/json:\n%s", got, want)
		}
	}
}
