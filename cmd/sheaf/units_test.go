package main

import (
	"flag"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/internal/golden"
)

var updateUnitsGolden = flag.Bool("update-units", false, "rewrite the golden files of `sheaf units`")

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
			stdout, stderr, code := sheaf(t, tc.args...)
			if code != tc.code {
				t.Errorf("exit code %d, want %d (stderr %q)", code, tc.code, stderr)
			}
			got := "$ sheaf " + strings.Join(tc.args, " ") + "\n" + stdout
			if stderr != "" {
				got += "--- stderr\n" + stderr
			}
			golden.Check(t, filepath.Join("testdata", "units", tc.name+".golden"), []byte(got), *updateUnitsGolden)
		})
	}
}
