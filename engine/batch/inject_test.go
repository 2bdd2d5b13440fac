package batch_test

import (
	"bytes"
	"context"
	"encoding/csv"
	"errors"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/batch"
	"github.com/sheafcalc/sheaf/internal/golden"
)

// TestInert: a text field that a spreadsheet program would read as a
// formula gets a leading quote; numbers and other text stay as they are.
// Source: OWASP, "CSV Injection" (trigger characters = + - @ tab CR; the
// single-quote prefix).
func TestInert(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{`=cmd|' /C calc'!A0`, `'=cmd|' /C calc'!A0`},
		{`=HYPERLINK("http://example.invalid","x")`, `'=HYPERLINK("http://example.invalid","x")`},
		{"+1+cmd", "'+1+cmd"},
		{"-2+3", "'-2+3"},
		{"@SUM(A1)", "'@SUM(A1)"},
		{"\tx", "'\tx"},
		{"\rx", "'\rx"},
		{"-", "'-"},
		{"-e5", "'-e5"},
		{"1e", "1e"}, // not a trigger
		{"-12.5", "-12.5"},
		{"+3e4", "+3e4"},
		{"-.5E-3", "-.5E-3"},
		{"-1.", "-1."},
		{"-0x1p4", "'-0x1p4"},
		{"-Inf", "'-Inf"},
		{"-3 kN", "'-3 kN"},
		{"fails", "fails"},
		{"a=b", "a=b"},
		{"", ""},
	} {
		if got := batch.Inert(c.in); got != c.want {
			t.Errorf("Inert(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// TestCSVInjection: the raw fields of bad rows are written back inert; the
// numbers of good rows (a negative load included) stay numbers.
func TestCSVInjection(t *testing.T) {
	s := load(t, "tie.sheaf")
	cs := read(t, s, "inject.csv")
	out, err := batch.Run(context.Background(), s, cs, batch.Options{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := out.WriteCSV(&b, 6); err != nil {
		t.Fatal(err)
	}
	golden.Check(t, filepath.Join("testdata", "inject.golden"), b.Bytes(), *update)
	recs, err := csv.NewReader(bytes.NewReader(b.Bytes())).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for i, rec := range recs {
		for j, f := range rec {
			// A field that starts with a trigger is either a plain number or
			// already quoted (Inert leaves both as they are).
			if f != "" && strings.ContainsRune("=+-@\t\r", rune(f[0])) && batch.Inert(f) != f {
				t.Errorf("row %d field %d %q would be read as a formula", i, j, f)
			}
		}
	}
	if got := recs[3][1]; got != "-30" {
		t.Errorf("case 3 P = %q, want the number -30", got)
	}
}

// FuzzInert: whatever the text, the output does not start with a formula
// trigger unless it is a plain number that strconv reads as one, it ends
// with the input, and making it inert twice changes nothing.
func FuzzInert(f *testing.F) {
	for _, s := range []string{`=cmd|' /C calc'!A0`, `=HYPERLINK("x")`, "-12.5", "+3e4", "@a", "\tx", "\rx", "-", "", "fails"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got := batch.Inert(s)
		if !strings.HasSuffix(got, s) || len(got) > len(s)+1 {
			t.Fatalf("Inert(%q) = %q", s, got)
		}
		if batch.Inert(got) != got {
			t.Fatalf("Inert is not idempotent on %q", s)
		}
		if got != "" && strings.ContainsRune("=+-@\t\r", rune(got[0])) {
			if _, err := strconv.ParseFloat(got, 64); err != nil && !errors.Is(err, strconv.ErrRange) {
				t.Fatalf("Inert(%q) = %q starts with a trigger and is not a number", s, got)
			}
		}
	})
}
