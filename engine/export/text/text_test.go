package text_test

import (
	"bytes"
	"errors"
	"flag"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/export/text"
	"github.com/sheafcalc/sheaf/internal/golden"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// fixture is the sheet shared with the JSON writer's tests: every kind of
// cell (input, derived, list, bool, record, table, function, template
// use) and every check outcome (pass, fail, not assessed), with a cell
// that cannot be computed. It is read from the repository root so that
// positions in the output do not depend on the package's folder.
const fixture = "testdata/export/kinds.sheaf"

// listing runs the fixture and returns its listing. The caller must have
// changed to the repository root.
func listing(t *testing.T) []byte {
	t.Helper()
	s, err := engine.Load(fixture)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := text.Write(&b, s.Run(nil), engine.DefaultSigFigs); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// TestListingGolden pins the listing of the fixture, and checks that two
// runs of it, each from a fresh load, give the same bytes.
func TestListingGolden(t *testing.T) {
	path, err := filepath.Abs(filepath.Join("testdata", "kinds.golden"))
	if err != nil {
		t.Fatal(err)
	}
	t.Chdir("../../..")
	first := listing(t)
	golden.Check(t, path, first, *update)
	if second := listing(t); !bytes.Equal(first, second) {
		t.Errorf("two runs differ:\n--- first\n%s\n--- second\n%s", first, second)
	}
}

// TestListingParts checks the parts of a listing that depend on the
// results: the title block, the verdict of each check, the closing
// summary and the caution, on small sheets written here.
func TestListingParts(t *testing.T) {
	cases := []struct {
		name, src string
		want      []string // lines or parts of lines, in order
		not       []string
	}{
		{"untitled, no checks", "a [m] = 2 m\n",
			[]string{"Calculation sheet\n=================\n", "\n  a  2 m\n", "\nNo design checks in this sheet.\n", "\n" + text.Caution + "\n"},
			[]string{"Design checks", "Not computed"}},
		{"one check ok", "title: Strut\nN [kN] = 5 kN\ncheck c: N <= 10 kN -- limit @ own\n",
			[]string{"Strut\n=====\n", "Design checks\n-------------\n", "  c  5 kN of 10 kN  50 %  " + text.Pass + "  limit  [own]\n", "The design check is ok."},
			nil},
		{"all ok", "N [kN] = 5 kN\ncheck c: N <= 10 kN\ncheck d: 20 kN >= N\n",
			[]string{"All 2 design checks are ok."}, []string{text.Fail}},
		{"one fails", "N [kN] = 15 kN\ncheck c: N <= 10 kN\ncheck d: 20 kN >= N\n",
			[]string{"150 %  " + text.Fail, "75 %  " + text.Pass, "1 of 2 design checks FAIL or could not be assessed."}, nil},
		{"not assessed", "N [kN] = 5 kN\ncap [kN] = 0 kN\ncheck c: N <= cap\n",
			[]string{"  c  5 kN of 0 kN  -  " + text.Unknown + "  the capacity must be a positive finite number", "The design check FAILS or could not be assessed."},
			[]string{"Not computed", "could not be computed"}},
		// A tension check under uplift: the demand is compression, which
		// would give a negative utilisation that passes (DESIGN.md, Trust).
		{"demand of the other sense", "N [kN] = -8.798 kN\ncheck tension: N <= 28 kN\n",
			[]string{"  tension  -8.798 kN of 28 kN  -  " + text.Unknown + "  demand is compression; this check is written for tension"},
			[]string{"-31.4 %", text.Pass + "\n"}},
		{"compression check in tension", "N [kN] = 8 kN\ncheck buckling: -N <= 28 kN\n",
			[]string{"  buckling  -8 kN of 28 kN  -  " + text.Unknown + "  demand is tension; this check is written for compression"}, nil},
		{"both sides negative", "N [kN] = -5 kN\nR [kN] = -20 kN\ncheck c: N <= R\n",
			[]string{"  c  -5 kN of -20 kN  -  " + text.Unknown + "  the capacity is negative"}, []string{"25 %"}},
		{"negative length", "d [mm] = -2 mm\ncheck sag: d <= 10 mm\n",
			[]string{text.Unknown + "  demand is negative; this check is written for a positive demand"}, nil},
		{"governing term of min", "N_pl [kN] = 50 kN\nN_b [kN] = 32 kN\nN_Rd [kN] = min(N_pl, 0.9 * N_b, 60 kN)\nN [kN] = 20 kN\ncheck c: N <= N_Rd\ncheck d: N <= max(N_b, N_pl)\n",
			[]string{"  c  20 kN of 28.8 kN  69.4 %  " + text.Pass + "  governed by 0.9 * N_b\n", "  d  20 kN of   50 kN    40 %  " + text.Pass + "  governed by N_pl\n"}, nil},
		{"uncomputed cell", "a [m] = 2 m\nb [m] = 0 m\nr = a / b\n",
			[]string{"Not computed\n------------\n  t.sheaf:3:9: `r` cannot be computed", "1 cell could not be computed (see above): the calculation is not complete.\nNo design checks in this sheet."}, nil},
		{"sections", "a = 1\n## Loads\nb = 2\n## Rod\nc = 3\n",
			[]string{"\n  a  1\n\nLoads\n-----\n  b  2\n\nRod\n---\n  c  3\n"}, nil},
		{"header", "title: T\nproject: P\nbasis: B\nauthor: A\nchecker: C\ndate: D\nrevision: R\nx = 1\n",
			[]string{"T\n=\nproject:  P\nbasis:    B\nauthor:   A\nchecker:  C\ndate:     D\nrevision: R\n"}, nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s, err := engine.Compile("t.sheaf", []byte(c.src))
			if err != nil {
				t.Fatal(err)
			}
			var b strings.Builder
			if err := text.Write(&b, s.Run(nil), engine.DefaultSigFigs); err != nil {
				t.Fatal(err)
			}
			out, at := b.String(), 0
			for _, w := range c.want {
				k := strings.Index(out[at:], w)
				if k < 0 {
					t.Fatalf("missing, or out of order: %q\nin:\n%s", w, out)
				}
				at += k + len(w)
			}
			for _, n := range c.not {
				if strings.Contains(out, n) {
					t.Errorf("unexpected %q in:\n%s", n, out)
				}
			}
			if !strings.HasSuffix(out, "\n\n"+text.Caution+"\n") {
				t.Errorf("the listing does not end with the caution:\n%s", out)
			}
		})
	}
}

type failWriter struct{}

var errFull = errors.New("disk full")

func (failWriter) Write([]byte) (int, error) { return 0, errFull }

// TestWriteError: a failing writer's error comes back to the caller.
func TestWriteError(t *testing.T) {
	s, err := engine.Compile("t.sheaf", []byte("a = 1\n"))
	if err != nil {
		t.Fatal(err)
	}
	if err := text.Write(failWriter{}, s.Run(nil), 4); !errors.Is(err, errFull) {
		t.Errorf("Write returned %v, want %v", err, errFull)
	}
}
