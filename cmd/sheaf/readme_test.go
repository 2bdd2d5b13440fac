package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine/sheet"
)

// TestReadmeSheet keeps the example sheet of README.md honest: it checks,
// runs with every design check ok, and is already in canonical layout.
func TestReadmeSheet(t *testing.T) {
	readme, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(readme)
	at := strings.Index(text, "## A sheet")
	if at < 0 {
		t.Fatal("README.md has no \"## A sheet\" section")
	}
	start := strings.Index(text[at:], "```\n")
	end := strings.Index(text[at+start+4:], "```")
	if start < 0 || end < 0 {
		t.Fatal("the \"A sheet\" section has no fenced example")
	}
	src := text[at+start+4 : at+start+4+end]
	path := filepath.Join(t.TempDir(), "readme.sheaf")
	if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := sheaf(t, "run", path)
	if code != exitOK {
		t.Fatalf("sheaf run on the README example exited %d:\n%s%s", code, out, errOut)
	}
	// Source: README.md's own numbers, by hand: A_g = π·16²/4 = 201.06 mm²,
	// σ = 17 200 N / 201.06 mm² = 85.55 MPa.
	if !strings.Contains(out, "85.55 MPa") {
		t.Errorf("expected σ = 85.55 MPa in the listing:\n%s", out)
	}
	formatted, err := sheet.FormatSource(path, []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if string(formatted) != src {
		t.Errorf("the README example is not in canonical layout; sheaf fmt gives:\n%s", formatted)
	}
}
