package sheet

import (
	"os"
	"path/filepath"
	"testing"
)

// FuzzParse feeds arbitrary bytes to Parse. It must never panic, every
// diagnostic must point inside the source, and a source without errors must
// print, re-parse without errors to the same content, and print the same
// again.
func FuzzParse(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("testdata", "*.sheaf"))
	for _, name := range files {
		if src, err := os.ReadFile(name); err == nil {
			f.Add(src)
		}
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		file, errs := Parse("fuzz.sheaf", src)
		if file == nil {
			t.Fatal("Parse returned no file")
		}
		for _, d := range errs {
			if d.Range.Start().Offset < 0 || d.Range.End().Offset > len(src) || d.Range.End().Offset < d.Range.Start().Offset {
				t.Fatalf("%s: range %d..%d outside the source of %d bytes", d.Error(), d.Range.Start().Offset, d.Range.End().Offset, len(src))
			}
		}
		checkRoundTrip(t, "fuzz.sheaf", src)
	})
}

// TestRoundTripSeeds runs the round-trip property over the fuzz seeds
// (the golden inputs are covered by TestFormatGolden).
func TestRoundTripSeeds(t *testing.T) {
	seeds, _ := filepath.Glob(filepath.Join("testdata", "fuzz", "FuzzParse", "*"))
	if len(seeds) == 0 {
		t.Fatal("no fuzz seeds")
	}
	for _, s := range seeds {
		t.Run(filepath.Base(s), func(t *testing.T) {
			src := readSeed(t, s)
			Parse("seed.sheaf", src) // must not panic, errors or not
			checkRoundTrip(t, "seed.sheaf", src)
		})
	}
}

// TestRoundTripSheets runs the round-trip property over the example sheets
// and templates under sheets/ (issue 6: fmt must never change a sheet's
// content).
func TestRoundTripSheets(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("..", "..", "sheets", "*.sheaf"))
	for _, s := range files {
		t.Run(filepath.Base(s), func(t *testing.T) {
			src, err := os.ReadFile(s)
			if err != nil {
				t.Fatal(err)
			}
			if _, errs := Parse(s, src); errs.HasErrors() {
				t.Fatalf("example sheet has syntax errors: %v", errs)
			}
			checkRoundTrip(t, s, src)
		})
	}
}
