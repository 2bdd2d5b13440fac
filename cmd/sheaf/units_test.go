package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var updateUnitsGolden = flag.Bool("update-units", false, "rewrite the golden files of `sheaf units`")

// runUnitsCLI runs the command line with captured streams.
func runUnitsCLI(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = Main(args, strings.NewReader(""), &out, &errb)
	return code, out.String(), errb.String()
}

// TestUnitsCommandGolden pins the listing: the catalogue is part of the
// language, and a change to it should show up in review as a diff.
// The factors themselves are checked against NIST SP 811 (2008), App. B in
// engine/units.
func TestUnitsCommandGolden(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
	}{
		{"all", []string{"units"}, exitOK},
		{"stress", []string{"units", "--dim", "stress"}, exitOK},
		{"line-load-us", []string{"units", "--dim", "kN/m", "--system", "us"}, exitOK},
		{"metric-length", []string{"units", "--dim", "mm", "--system", "metric"}, exitOK},
		{"no-unit", []string{"units", "--dim", "kg*m"}, exitOK},
		{"no-us-unit", []string{"units", "--dim", "power", "--system", "us"}, exitOK},
		{"bad-unit", []string{"units", "--dim", "kn"}, exitInput},
		{"bad-quantity", []string{"units", "--dim", "stres"}, exitInput},
		{"bad-system", []string{"units", "--system", "cgs"}, exitInput},
		{"bad-arg", []string{"units", "extra"}, exitInput},
		{"bad-flag", []string{"units", "--dimension", "stress"}, exitInput},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := runUnitsCLI(tc.args...)
			if code != tc.code {
				t.Errorf("exit code %d, want %d (stderr %q)", code, tc.code, stderr)
			}
			got := "$ sheaf " + strings.Join(tc.args, " ") + "\n" + stdout
			if stderr != "" {
				got += "--- stderr\n" + stderr
			}
			path := filepath.Join("testdata", "units", tc.name+".golden")
			if *updateUnitsGolden {
				if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./cmd/sheaf -update-units)", err)
			}
			if string(want) != got {
				t.Errorf("output differs from %s:\n%s", path, got)
			}
		})
	}
}
