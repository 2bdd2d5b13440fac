package batch_test

import (
	"context"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheafcalc/sheaf/engine/batch"
)

// FuzzRead feeds arbitrary case tables to Read and Run: they must not
// panic, and every row must either be good or carry a positioned problem.
// Seeds are under testdata/fuzz/FuzzRead, plus the tables in testdata.
func FuzzRead(f *testing.F) {
	s := load(f, "tie.sheaf")
	for _, name := range []string{"cases.csv", "bad.csv", "header.csv"} {
		src, err := os.ReadFile(filepath.Join("testdata", name))
		if err != nil {
			f.Fatal(err)
		}
		f.Add(src)
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		cs, err := batch.Read("fuzz.csv", src, s)
		if err != nil {
			return
		}
		for _, c := range cs.Cases {
			if c.Err == nil && len(c.Values) != len(cs.Columns) {
				t.Fatalf("case %d is good but has %d values for %d columns", c.N, len(c.Values), len(cs.Columns))
			}
			if c.Err != nil && !c.Err.Range.Start().IsValid() {
				t.Fatalf("case %d: problem without a position: %v", c.N, c.Err)
			}
		}
		if _, err := batch.Run(context.Background(), s, cs, batch.Options{Workers: 2}); err != nil {
			t.Fatal(err)
		}
	})
}
