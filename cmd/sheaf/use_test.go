package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestUseRunSet runs the sheet that uses a template twice
// (sheets/walkway-pair.sheaf) with --set on both sides of the template
// boundary. Its plain results are golden in testdata/sheets.
func TestUseRunSet(t *testing.T) {
	t.Chdir("../..")
	cases := []runCase{
		// service.q_k is an action of the template: --set changes its
		// characteristic value. Source: EN 1990 (6.10), Table A1.2(B)
		// γG,sup 1.35, γQ 1.5; ψ0 = 0.7 for category C (Table A1.1) —
		// REFERENCES D6, D7, from memory. With q_k = 7 kN/m², Q_service =
		// 7·1.44 = 10.08 kN; access leading: 1.35 (3.277 + 3.216) + 1.5·10.8
		// + 1.05·10.08 = 35.55 kN > 35 kN (service leading: 35.23 kN).
		{"template action from the command line", []string{"--set", "service.q_k=7kN/m^2"}, exitChecks, "35.55 kN of    35 kN"},
		// s_truss = 3.0 m: A_trib 1.8 and 1.2 m²; G 2.737 and 2.688 kN, Q 9.0
		// and 3.6 kN: 1.35·5.425 + 1.5·9.0 + 1.05·3.6 = 24.6 kN.
		{"shared input", []string{"--set", "s_truss=3.0m"}, exitOK, "24.6 kN of    35 kN"},
		{"input replaced by a formula", []string{"--set", "access.s=3m"}, exitInput, "`access.s` is computed from s_truss"},
		{"near miss", []string{"--set", "access.dd=3mm"}, exitInput, "did you mean `access.d`?"},
	}
	runCases(t, "sheets/walkway-pair.sheaf", cases)
	out, errs, code := sheaf(t, "check", "sheets/walkway-pair.sheaf")
	// s_truss, 2 × 21 cells of the hanger, 4 node cells = 47 cells; the
	// hanger's 2 checks twice and the sheet's 2 = 6 checks; its 3 actions
	// twice, in 5 uls and 5 characteristic combinations.
	if code != exitOK || out != "ok: 47 cells, 6 checks, 6 actions in 10 combinations of EN 1990 6.10\n" {
		t.Errorf("check: exit %d, %q %s", code, out, errs)
	}
}

// TestNewFromTemplateThatUses starts a sheet from a template that uses
// another template, in another folder of the same project: the copy's use
// paths are rewritten for its folder, and it evaluates as the template.
func TestNewFromTemplateThatUses(t *testing.T) {
	proj := t.TempDir()
	if err := os.WriteFile(filepath.Join(proj, "sheaf.root"), nil, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"walkway-pair.sheaf", "mezzanine-hanger.sheaf"} {
		src, err := os.ReadFile(filepath.Join("..", "..", "sheets", name))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.MkdirAll(filepath.Join(proj, "lib"), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(proj, "lib", name), src, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.Mkdir(filepath.Join(proj, "jobs"), 0o755); err != nil {
		t.Fatal(err)
	}
	t.Chdir(proj)
	out, errs, code := sheaf(t, "new", "--library", "lib", "walkway-pair", "jobs/bay-7.sheaf")
	if code != exitOK {
		t.Fatalf("new: exit %d: %s", code, errs)
	}
	text, err := os.ReadFile("jobs/bay-7.sheaf")
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`use access from "../lib/mezzanine-hanger.sheaf"`, `use service from "../lib/mezzanine-hanger.sheaf"`} {
		if !strings.Contains(string(text), want) {
			t.Errorf("new sheet lacks %s:\n%s", want, text)
		}
	}
	got, _, code1 := sheaf(t, "run", "jobs/bay-7.sheaf")
	want, _, code2 := sheaf(t, "run", "lib/walkway-pair.sheaf")
	if code1 != exitOK || code2 != exitOK {
		t.Fatalf("run: exit %d and %d (%s)", code1, code2, out)
	}
	// The header and the sections of the inputs differ (the date
	// placeholder, "## Inputs"); the design checks must not.
	checks := func(s string) string { return s[strings.Index(s, "Design checks"):] }
	if checks(got) != checks(want) {
		t.Errorf("the new sheet evaluates differently from its template:\n%s\n%s", checks(got), checks(want))
	}
}
