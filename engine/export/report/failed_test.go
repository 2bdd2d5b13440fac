package report

import (
	"strings"
	"testing"
	"time"
)

// TestFailedCells: a cell that fails at run time, and the check that uses
// it, must read as not computed and not assessed, never as a value.
func TestFailedCells(t *testing.T) {
	s, r := compile(t, "fail.sheaf", `
a [m] = 1 m
b [m] = 0 m
c [m] = a * a / b  -- divides by zero
check x: c <= 2 m
`)
	if len(r.Problems) == 0 {
		t.Fatal("the sheet was meant to fail at run time")
	}
	html := Render(s, r, testOptions)
	for _, want := range []string{"Not computed", "not computed", "not assessed", "FAIL or could not be assessed"} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	if strings.Contains(html, "All 1 design checks are ok") {
		t.Error("a check that could not be assessed is reported as ok")
	}
}

func TestStamp(t *testing.T) {
	s, r := compile(t, "s.sheaf", "a [m] = 1 m\n")
	at := time.Date(2026, 5, 1, 9, 30, 0, 0, time.UTC)
	o := testOptions
	o.Stamp = at
	if html := Render(s, r, o); !strings.Contains(html, "Run at</th><td>2026-05-01T09:30:00Z") {
		t.Error("--stamp time missing")
	}
	if html := Render(s, r, testOptions); strings.Contains(html, "Run at") {
		t.Error("time printed without --stamp")
	}
}
