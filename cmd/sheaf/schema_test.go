package main

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"
)

// TestJSONSchema validates the JSON of run, check, diff, batch and funcs,
// written by the built binary, against the schema in the repository
// (schema/sheaf.schema.json, JSON Schema 2020-12), the outcomes with
// results and those without (a sheet that does not load, a bad --set).
// Every object of the schema is closed, so a key added to the output but
// not to the schema fails here.
//
// The validator is github.com/santhosh-tekuri/jsonschema/v6: it implements
// the whole of draft 2020-12 and passes the official JSON-Schema-Test-Suite,
// which a validator of our own for the subset used would not prove; it is
// a test dependency only and pulls in nothing else the binary links.
func TestJSONSchema(t *testing.T) {
	c := jsonschema.NewCompiler()
	sch, err := c.Compile(filepath.Join("..", "..", "schema", "sheaf.schema.json"))
	if err != nil {
		t.Fatalf("the schema does not compile: %v", err)
	}
	const fx = "cmd/sheaf/testdata/exit/"
	cases := [][]string{
		{"run", "--json", fx + "ok.sheaf"},
		{"run", "--json", fx + "uplift.sheaf"},
		{"run", "--json", fx + "uncomputed.sheaf"},
		{"run", "--json", fx + "broken.sheaf"},
		{"run", "--json", fx + "nosuch.sheaf"},
		{"run", "--json", fx + "ok.sheaf", "--set", "P=3 m"},
		{"run", "--json", "--frob", fx + "ok.sheaf"},
		{"diff", "--json", fx + "ok.sheaf"},
		{"check", "--json", fx + "ok.sheaf"},
		{"check", "--json", fx + "broken.sheaf"},
		{"diff", "--json", fx + "ok.sheaf", fx + "fails.sheaf"},
		{"diff", "--json", fx + "ok.sheaf", fx + "nochecks.sheaf"},
		{"diff", "--json", fx + "ok.sheaf", fx + "broken.sheaf"},
		{"diff", "--json", "cmd/sheaf/testdata/diff/old.sheaf", "cmd/sheaf/testdata/diff/new.sheaf"},
		{"batch", "--json", fx + "ok.sheaf", fx + "cases-fail.csv"},
		{"batch", "--json", fx + "nochecks.sheaf", fx + "cases.csv"},
		{"batch", "--json", fx + "ok.sheaf", fx + "allbad.csv"},
		{"batch", "--json", fx + "ok.sheaf", fx + "cases-semicolon.csv"},
		{"batch", "--json", "sheets/mezzanine-hanger.sheaf", "sheets/mezzanine-hanger-cases.csv"},
		{"run", "--json", "cmd/sheaf/testdata/combos/uplift.sheaf"},
		{"check", "--json", "cmd/sheaf/testdata/combos/uplift.sheaf"},
		{"check", "--json", "sheets/canopy-hanger.sheaf"},
		{"batch", "--json", "cmd/sheaf/testdata/combos/uplift.sheaf", "cmd/sheaf/testdata/combos/uplift-cases.csv", "--pick", "N_Ed"},
		{"funcs", "--json"},
		{"funcs", "--json", "chs"},
		{"funcs", "--json", "nosuch"},
	}
	sheets, _ := filepath.Glob("../../sheets/*.sheaf")
	for _, s := range sheets {
		cases = append(cases, []string{"run", "--json", "sheets/" + filepath.Base(s)})
	}
	for _, args := range cases {
		t.Run(strings.Join(args, " "), func(t *testing.T) {
			out, errs, code := runBinary(t, "../..", "", args...)
			if code == exitInternal {
				t.Fatalf("exit 3: %s", errs)
			}
			inst, err := jsonschema.UnmarshalJSON(bytes.NewReader([]byte(out)))
			if err != nil {
				t.Fatalf("stdout is not JSON: %v\n%s", err, out)
			}
			if err := sch.Validate(inst); err != nil {
				t.Errorf("does not fit the schema: %v\n%s", err, out)
			}
		})
	}
}
