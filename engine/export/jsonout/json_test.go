package jsonout_test

import (
	"bytes"
	"encoding/json"
	"flag"
	"math"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// fixture is the sheet shared with the text listing's tests (every kind of
// cell and check outcome), read from the repository root so that the
// positions in the output do not depend on the package's folder.
const fixture = "testdata/export/kinds.sheaf"

// run loads and runs the fixture and writes its JSON. The caller must have
// changed to the repository root.
func run(t *testing.T) (*engine.Results, []byte) {
	t.Helper()
	s, err := engine.Load(fixture)
	if err != nil {
		t.Fatal(err)
	}
	r := s.Run(nil)
	var b bytes.Buffer
	if err := jsonout.Write(&b, r); err != nil {
		t.Fatal(err)
	}
	return r, b.Bytes()
}

// TestJSONGolden pins the JSON of the fixture, and checks that two runs,
// each from a fresh load, give the same bytes.
func TestJSONGolden(t *testing.T) {
	path, err := filepath.Abs(filepath.Join("testdata", "kinds.golden"))
	if err != nil {
		t.Fatal(err)
	}
	t.Chdir("../../..")
	_, first := run(t)
	golden.Check(t, path, first, *update)
	if _, second := run(t); !bytes.Equal(first, second) {
		t.Errorf("two runs differ:\n--- first\n%s\n--- second\n%s", first, second)
	}
}

// same reports whether a JSON number read back is the engine's float64 to
// the bit; a nil pointer stands for a value that is not finite.
func same(p *float64, x float64) bool {
	if p == nil {
		return math.IsNaN(x) || math.IsInf(x, 0)
	}
	return math.Float64bits(*p) == math.Float64bits(x) || (*p == 0 && x == 0)
}

// TestJSONRoundTrip reads the JSON back and compares every number with
// the engine's results to the bit: numbers, lists, record fields, table
// columns, demands, capacities and utilisations.
func TestJSONRoundTrip(t *testing.T) {
	t.Chdir("../../..")
	r, out := run(t)
	var d jsonout.Document
	if err := json.Unmarshal(out, &d); err != nil {
		t.Fatalf("the JSON does not read back: %v", err)
	}
	if len(d.Cells) != len(r.Cells) || len(d.Checks) != len(r.Checks) || d.Failed != r.Failed() {
		t.Fatalf("%d cells, %d checks, %d failed; want %d, %d, %d", len(d.Cells), len(d.Checks), d.Failed, len(r.Cells), len(r.Checks), r.Failed())
	}
	for i, c := range r.Cells {
		j := d.Cells[i]
		if j.Name != c.Cell.Name || j.Kind != c.Cell.Kind.String() || j.Known != c.Known || j.Unit != c.Unit.Symbol || j.Text != c.Text {
			t.Errorf("cell %d: %+v, want %s (%s)", i, j, c.Cell.Name, c.Cell.Kind)
			continue
		}
		switch v := c.Value.(type) {
		case float64:
			if !same(j.SI, c.SI) || !same(j.Value, c.Display) {
				t.Errorf("%s: si %v value %v, want %.17g and %.17g", j.Name, j.SI, j.Value, c.SI, c.Display)
			}
		case []float64:
			if !slices.Equal(j.List, v) {
				t.Errorf("%s: list %v, want %v", j.Name, j.List, v)
			}
		case *funcs.RecordValue:
			for k, f := range j.Fields {
				if x, ok := v.Fields[k].(float64); f.Name != v.Type.Fields[k].Name || !ok || !same(f.SI, x) {
					t.Errorf("%s.%s: %v, want %v", j.Name, f.Name, f.SI, v.Fields[k])
				}
			}
			if len(j.Fields) != len(v.Fields) {
				t.Errorf("%s: %d fields, want %d", j.Name, len(j.Fields), len(v.Fields))
			}
		case *funcs.TableValue:
			for k, col := range j.Columns {
				if col.Name != v.Type.Fields[k].Name || !slices.Equal(col.SI, v.Cols[k]) {
					t.Errorf("%s.%s: %v, want %v", j.Name, col.Name, col.SI, v.Cols[k])
				}
			}
			if len(j.Columns) != len(v.Cols) {
				t.Errorf("%s: %d columns, want %d", j.Name, len(j.Columns), len(v.Cols))
			}
		case nil:
			if j.SI != nil || j.Value != nil {
				t.Errorf("%s is unknown but has si %v, value %v", j.Name, j.SI, j.Value)
			}
		}
	}
	for i, c := range r.Checks {
		j := d.Checks[i]
		if j.Name != c.Cell.Name || j.Known != c.Known || j.Pass != c.Pass {
			t.Errorf("check %d: %+v, want %s known=%v pass=%v", i, j, c.Cell.Name, c.Known, c.Pass)
			continue
		}
		if !c.Known {
			// A check not assessed with both sides computed shows them
			// (and why it is not assessed); one whose sides failed has none.
			if j.Utilisation != nil || (c.Problem == nil && (j.DemandSI != nil || j.CapacitySI != nil)) {
				t.Errorf("%s is not assessed but has numbers: %+v", j.Name, j)
			}
			if c.Problem != nil && (!same(j.DemandSI, c.Demand) || !same(j.CapacitySI, c.Capacity) || j.NotAssessed != c.Problem.Summary || j.Verdict != "not assessed") {
				t.Errorf("%s: %+v, want demand %g capacity %g and the reason", j.Name, j, c.Demand, c.Capacity)
			}
			continue
		}
		if !same(j.DemandSI, c.Demand) || !same(j.CapacitySI, c.Capacity) || !same(j.Utilisation, c.Util) ||
			!same(j.Demand, c.Demand/c.Unit.Factor) || !same(j.Capacity, c.Capacity/c.Unit.Factor) {
			t.Errorf("%s: %+v, want demand %.17g capacity %.17g utilisation %.17g (SI)", j.Name, j, c.Demand, c.Capacity, c.Util)
		}
	}
	if len(d.Problems) != len(r.Problems) {
		t.Errorf("%d problems, want %d", len(d.Problems), len(r.Problems))
	}
	for i, p := range d.Problems {
		if want := r.Problems[i]; p.Pos != want.Range.Start().String() || p.Message != want.Summary {
			t.Errorf("problem %d: %+v, want %v", i, p, want)
		}
	}
}

// TestJSONValues checks a few results of the fixture, read back from the
// JSON, against closed forms computed here, so that the round trip is
// anchored outside the engine too.
func TestJSONValues(t *testing.T) {
	t.Chdir("../../..")
	_, out := run(t)
	var d jsonout.Document
	if err := json.Unmarshal(out, &d); err != nil {
		t.Fatal(err)
	}
	const gn = 9.80665 // Source: NIST SP 811 (2008) App. B, standard acceleration of gravity (exact)
	P := 1.35 * 180 * gn / 2
	A := 84.3e-6                   // the table row for d = 12 mm, in m²
	delta := P * 2.4 / (210e9 * A) // δ = N·L/(E·A) (common practice)
	want := map[string]float64{
		"P":          P,
		"N_Rd":       A * 235e6,
		"sigma":      P / A,
		"delta":      delta,
		"wind":       350,
		"bolt.F_tRd": 0.9 * 800e6 * 157e-6 / 1.25, // Source: EN 1993-1-8 Table 3.4, F_t,Rd = k2·f_ub·A_s/γ_M2 (from memory)
	}
	for _, c := range d.Cells {
		w, ok := want[c.Name]
		if !ok {
			continue
		}
		delete(want, c.Name)
		if c.SI == nil || math.Abs(*c.SI-w) > 1e-12*math.Abs(w) {
			t.Errorf("%s: si %v, want %.17g", c.Name, c.SI, w)
		}
	}
	for name := range want {
		t.Errorf("no cell %s in the JSON", name)
	}
	for _, c := range d.Checks {
		if c.Name == "sag" && (c.Utilisation == nil || math.Abs(*c.Utilisation-delta/(2.4/20000)) > 1e-12) {
			t.Errorf("sag: utilisation %v, want %.17g", c.Utilisation, delta/(2.4/20000))
		}
	}
}

// TestJSONNumbers: minus zero is written as 0, values that are not finite
// as null, so the document is valid JSON whatever the inputs.
func TestJSONNumbers(t *testing.T) {
	s, err := engine.Compile("t.sheaf", []byte("z [m] = -0 m\nbig = 1e300 * 1e300\ncap [kN] = 0 kN\ncheck c: 1 kN <= cap\n"))
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := jsonout.Write(&b, s.Run(nil)); err != nil {
		t.Fatal(err)
	}
	var d jsonout.Document
	if err := json.Unmarshal(b.Bytes(), &d); err != nil {
		t.Fatalf("invalid JSON: %v\n%s", err, b.String())
	}
	if regexp.MustCompile(`[:\[,]\s*-0[,\s\]]`).MatchString(b.String()) {
		t.Errorf("minus zero written:\n%s", b.String())
	}
	if v, _ := s.NewState().Eval().Cell("z").Value.(float64); !math.Signbit(v) {
		t.Fatalf("the engine gives z = %g, not minus zero: the test no longer tests anything", v)
	}
	if z := d.Cells[0]; z.SI == nil || *z.SI != 0 || math.Signbit(*z.SI) {
		t.Errorf("z: %+v", z)
	}
	if big := d.Cells[1]; big.Known || big.SI != nil || big.Value != nil {
		t.Errorf("big: %+v, want unknown with null numbers", big)
	}
	if c := d.Checks[0]; c.Known || c.Utilisation != nil || c.Pass {
		t.Errorf("check: %+v, want not assessed", c)
	}
	if d.Failed != 1 || len(d.Problems) != 2 || d.Caution != jsonout.Caution {
		t.Errorf("failed %d, problems %v, caution %q", d.Failed, d.Problems, d.Caution)
	}
}

// TestJSONChecksCannotPassByAccident: a tension check under a compressive
// demand is not assessed, with its reason and both sides, never a negative
// utilisation that passes; a min() capacity names the term that governs.
func TestJSONChecksCannotPassByAccident(t *testing.T) {
	src := "N [kN] = -8.798 kN\nN_pl [kN] = 50 kN\nN_b [kN] = 32 kN\nN_Rd [kN] = min(N_pl, N_b)\n" +
		"check tension: N <= 28 kN\ncheck strut: -N <= N_Rd\n"
	s, err := engine.Compile("t.sheaf", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := jsonout.Write(&b, s.Run(nil)); err != nil {
		t.Fatal(err)
	}
	var d jsonout.Document
	if err := json.Unmarshal(b.Bytes(), &d); err != nil {
		t.Fatal(err)
	}
	ten, strut := d.Checks[0], d.Checks[1]
	if ten.Pass || ten.Utilisation != nil || ten.Verdict != "not assessed" || ten.Demand == nil || *ten.Demand != -8.798 ||
		!strings.Contains(ten.NotAssessed, "demand is compression; this check is written for tension") {
		t.Errorf("tension: %+v", ten)
	}
	// Source: by hand, 8.798 / min(50, 32) = 0.2749375.
	if !strut.Pass || strut.Governing != "N_b" || strut.Utilisation == nil || math.Abs(*strut.Utilisation-8.798/32) > 1e-12 {
		t.Errorf("strut: %+v", strut)
	}
	if d.ExitCode != 1 || d.Failed != 1 || d.Uncomputed != 0 || len(d.Problems) != 1 || d.Problems[0].Kind != jsonout.KindCheck {
		t.Errorf("exit %d, failed %d, uncomputed %d, problems %+v", d.ExitCode, d.Failed, d.Uncomputed, d.Problems)
	}
}
