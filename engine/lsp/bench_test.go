package lsp

import (
	"encoding/json"
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/sheafcalc/sheaf/engine/units"
)

// A generated sheet of 5,000 derived cells in 50 chains of 100: chain k
// starts from its own input P_k, and cell i uses the two before it and
// the input. Changing P_k recomputes the 100 cells of chain k.
const benchChains, benchLen = 50, 100

func genSheet(p0 string) string {
	var b strings.Builder
	b.WriteString("title: generated\nunits: metric\n\n## Chains\n")
	for k := 0; k < benchChains; k++ {
		if k == 0 {
			fmt.Fprintf(&b, "P0 [kN] = %s  -- the input the benchmarks change\n", p0)
		} else {
			fmt.Fprintf(&b, "P%d [kN] = %d kN\n", k, k+1)
		}
		fmt.Fprintf(&b, "c%d_0 [kN] = P%d * 2 + 1 kN\n", k, k)
		fmt.Fprintf(&b, "c%d_1 [kN] = c%d_0 * 0.5 + P%d / 4\n", k, k, k)
		for i := 2; i < benchLen; i++ {
			fmt.Fprintf(&b, "c%d_%d [kN] = (c%d_%d + c%d_%d) / 2 + P%d / 10  -- step %d\n", k, i, k, i-1, k, i-2, k, i)
		}
	}
	return b.String()
}

// chainEnd computes the last cell of a chain from its input P (SI), the
// same recurrence written in Go.
func chainEnd(P float64) float64 {
	c := make([]float64, benchLen)
	c[0] = P*2 + 1000
	c[1] = c[0]*0.5 + P/4
	for i := 2; i < benchLen; i++ {
		c[i] = (c[i-1]+c[i-2])/2 + P/10
	}
	return c[benchLen-1]
}

func benchClient(b *testing.B) (*client, string) {
	b.Helper()
	c := newClient(b, Options{Debounce: time.Hour}) // no debounced check in the loop
	c.initialize()
	src := genSheet("1 kN")
	if ds := c.open(rodURI, src); len(ds) != 0 {
		b.Fatal(ds[0].Message)
	}
	return c, src
}

func kN(x float64) string {
	u, _ := units.Parse("kN")
	return units.Format(x, u, sigFigs)
}

func BenchmarkHover5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	var hv hover
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/hover", at(rodURI, li, 1), nil)
	}
	c.decode(&hv)
	if want := kN(chainEnd(1000)); !strings.Contains(hv.Contents.Value, want) {
		b.Fatalf("hover lacks %s:\n%s", want, hv.Contents.Value)
	}
}

func BenchmarkCompletion5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, "c0_5 [kN]")
	var cl completionList
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/completion", at(rodURI, li, len("c0_5 [kN] = (")), nil)
	}
	c.decode(&cl)
	n := 0
	for _, it := range cl.Items {
		if strings.HasPrefix(it.Detail, "[kN]") {
			n++
		}
	}
	if n != benchChains*(benchLen+1) {
		b.Fatalf("%d cells in kN offered, want %d", n, benchChains*(benchLen+1))
	}
}

func BenchmarkDefinition5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c%d_50 [kN]", benchChains-1))
	var locs []location
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/definition", at(rodURI, li, len("c49_50 [kN] = (c4")), nil)
	}
	c.decode(&locs)
	if want := lineOf(b, src, "c49_49 [kN]"); len(locs) != 1 || locs[0].Range.Start.Line != want {
		b.Fatalf("definition %+v, want line %d", locs, want)
	}
}

func BenchmarkReferences5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, "P0 [kN]")
	var refs []location
	p := referenceParams{textDocumentPositionParams: at(rodURI, li, 0)}
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/references", p, nil)
	}
	c.decode(&refs)
	if len(refs) != benchLen { // c0_0, c0_1 and c0_2 ... c0_99 each use P0 once
		b.Fatalf("%d references, want %d", len(refs), benchLen)
	}
}

func BenchmarkInlayHints5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	var hs []inlayHint
	b.ReportAllocs()
	for b.Loop() {
		c.rawHints(rodURI, 0, 1<<20)
	}
	c.decode(&hs)
	if len(hs) != benchChains*(benchLen+1) || hintOn(&testing.T{}, hs, li).Label != "= "+kN(chainEnd(1000)) {
		b.Fatalf("%d hints", len(hs))
	}
}

// screen is the number of lines an editor shows at once, and asks the
// values of.
const screen = 80

func BenchmarkInlayHintsScreen5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	var hs []inlayHint
	b.ReportAllocs()
	for b.Loop() {
		c.rawHints(rodURI, li-screen/2, li+screen/2)
	}
	c.decode(&hs)
	if len(hs) != screen+1 || hintOn(&testing.T{}, hs, li).Label != "= "+kN(chainEnd(1000)) {
		b.Fatalf("%d hints", len(hs))
	}
}

// BenchmarkInputChange5k: the editor sends the new text after a value was
// typed, then asks for the values of the whole document.
func BenchmarkInputChange5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	texts := []string{genSheet("2 kN"), genSheet("3 kN")}
	var hs []inlayHint
	v := 1
	b.ReportAllocs()
	for b.Loop() {
		v++
		c.change(rodURI, v, texts[v%2])
		c.rawHints(rodURI, 0, 1<<20)
	}
	c.decode(&hs)
	P := []float64{2000, 3000}[v%2]
	var got string
	for _, h := range hs {
		if h.Position.Line == li {
			got = h.Label
		}
	}
	if want := "= " + kN(chainEnd(P)); got != want {
		b.Fatalf("after the change: %q, want %q", got, want)
	}
}

// BenchmarkInputChangeScreen5k: as BenchmarkInputChange5k, with the
// values asked for the lines on screen, as editors ask them.
func BenchmarkInputChangeScreen5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	texts := []string{genSheet("2 kN"), genSheet("3 kN")}
	var hs []inlayHint
	v := 1
	b.ReportAllocs()
	for b.Loop() {
		v++
		c.change(rodURI, v, texts[v%2])
		c.rawHints(rodURI, li-screen/2, li+screen/2)
	}
	c.decode(&hs)
	P := []float64{2000, 3000}[v%2]
	if got, want := hintOn(&testing.T{}, hs, li).Label, "= "+kN(chainEnd(P)); got != want {
		b.Fatalf("after the change: %q, want %q", got, want)
	}
}

// BenchmarkEdit5k: an edit of a formula checks the whole sheet again,
// then the editor asks for the values on screen.
func BenchmarkEdit5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, fmt.Sprintf("c0_%d [kN]", benchLen-1))
	texts := []string{src, strings.Replace(src, "c0_0 [kN] = P0 * 2 + 1 kN", "c0_0 [kN] = P0 * 2 + 2 kN", 1)}
	var hs []inlayHint
	v := 1
	b.ReportAllocs()
	for b.Loop() {
		v++
		c.change(rodURI, v, texts[v%2])
		c.rawHints(rodURI, li-screen/2, li+screen/2)
	}
	c.decode(&hs)
	// c0_0 changes by 1 kN when the constant does; the end of the chain
	// by the same recurrence with c0_0 shifted.
	want := chainEnd(1000)
	if v%2 == 1 {
		want = chainEndShift(1000, 1000)
	}
	if got := hintOn(&testing.T{}, hs, li).Label; got != "= "+kN(want) {
		b.Fatalf("after the edit: %q, want %q", got, "= "+kN(want))
	}
}

func chainEndShift(P, shift float64) float64 {
	c := make([]float64, benchLen)
	c[0] = P*2 + 1000 + shift
	c[1] = c[0]*0.5 + P/4
	for i := 2; i < benchLen; i++ {
		c[i] = (c[i-1]+c[i-2])/2 + P/10
	}
	return c[benchLen-1]
}

func BenchmarkFormatting5k(b *testing.B) {
	c, _ := benchClient(b)
	var edits []textEdit
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/formatting", documentParams{TextDocument: textDocumentIdentifier{URI: rodURI}}, nil)
	}
	c.decode(&edits)
	if len(edits) != 1 || !strings.Contains(edits[0].NewText, "c49_99 [kN] = (c49_98 + c49_97) / 2 + P49 / 10  -- step 99") {
		b.Fatalf("%d edits", len(edits))
	}
}

func BenchmarkSymbols5k(b *testing.B) {
	c, _ := benchClient(b)
	var syms []documentSymbol
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/documentSymbol", documentParams{TextDocument: textDocumentIdentifier{URI: rodURI}}, nil)
	}
	c.decode(&syms)
	if len(syms) != 1 || len(syms[0].Children) != benchChains*(benchLen+1) {
		b.Fatalf("%d symbols", len(syms))
	}
}

func BenchmarkRename5k(b *testing.B) {
	c, src := benchClient(b)
	li := lineOf(b, src, "P0 [kN]")
	var we workspaceEdit
	b.ReportAllocs()
	for b.Loop() {
		c.call("textDocument/rename", renameParams{textDocumentPositionParams: at(rodURI, li, 0), NewName: "P_first"}, nil)
	}
	c.decode(&we)
	if n := len(we.Changes[rodURI]); n != benchLen+1 {
		b.Fatalf("%d edits, want %d", n, benchLen+1)
	}
}

// rawHints asks for the values of lines from..to and leaves the answer
// undecoded in c.last.
func (c *client) rawHints(uri string, from, to int) {
	c.call("textDocument/inlayHint", documentParams{TextDocument: textDocumentIdentifier{URI: uri},
		Range: &lspRange{Start: position{Line: from}, End: position{Line: to}}}, nil)
}

// decode decodes the last result into v.
func (c *client) decode(v any) {
	if err := json.Unmarshal(c.last, v); err != nil {
		c.t.Fatal(err)
	}
}
