package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/sheafcalc/sheaf/internal/golden"
)

// transcript joins what a command printed and its exit status, for golden
// files.
func transcript(out, errs string, code int) string {
	return fmt.Sprintf("$ exit %d\n--- stdout\n%s--- stderr\n%s", code, out, errs)
}

func TestBatchCommand(t *testing.T) {
	dir := filepath.Join("testdata", "batch")
	for _, tc := range []struct {
		name string
		args []string
		code int
	}{
		{"cases", []string{"cases.csv"}, exitChecks},
		{"bad", []string{"bad.csv"}, exitInput},
		{"pick", []string{"cases.csv", "--pick", "A, u", "--sig", "4", "--workers", "1"}, exitChecks},
		{"pick-none", []string{"cases.csv", "--pick", ""}, exitChecks},
		{"pick-unknown", []string{"cases.csv", "--pick", "N_rd"}, exitInput},
		{"bad-out", []string{"cases.csv", "--out", "results.txt"}, exitInput},
		{"missing", []string{"nothing.csv"}, exitInput},
	} {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"batch", filepath.Join(dir, "tie.sheaf")}, tc.args...)
			if !strings.HasPrefix(tc.args[0], "-") {
				args[2] = filepath.Join(dir, tc.args[0])
			}
			out, errs, code := sheaf(t, args...)
			if code != tc.code {
				t.Errorf("exit %d, want %d\n%s", code, tc.code, errs)
			}
			got := transcript(out, errs, code)
			golden.Check(t, filepath.Join(dir, tc.name+".golden"), []byte(got), *update)
			if o2, e2, c2 := sheaf(t, args...); transcript(o2, e2, c2) != got {
				t.Error("a second run prints other bytes")
			}
		})
	}
}

// TestBatchOutFiles writes CSV and xlsx files and checks they hold what
// stdout would.
func TestBatchOutFiles(t *testing.T) {
	dir := filepath.Join("testdata", "batch")
	tmp := t.TempDir()
	stdout, _, _ := sheaf(t, "batch", filepath.Join(dir, "tie.sheaf"), filepath.Join(dir, "cases.csv"))
	csvPath := filepath.Join(tmp, "r.csv")
	out, _, code := sheaf(t, "batch", filepath.Join(dir, "tie.sheaf"), filepath.Join(dir, "cases.csv"), "--out", csvPath)
	if code != exitChecks || out != "" {
		t.Fatalf("exit %d, stdout %q", code, out)
	}
	got, err := os.ReadFile(csvPath)
	if err != nil || string(got) != stdout {
		t.Errorf("--out file differs from stdout: %v\n%s", err, got)
	}
	xPath := filepath.Join(tmp, "r.xlsx")
	if _, errs, code := sheaf(t, "batch", filepath.Join(dir, "tie.sheaf"), filepath.Join(dir, "cases.csv"), "-o", xPath); code != exitChecks {
		t.Fatalf("xlsx: exit %d: %s", code, errs)
	}
	f, err := excelize.OpenFile(xPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows("cases")
	if err != nil || len(rows) != 6 {
		t.Fatalf("%d rows (%v), want 6", len(rows), err)
	}
	entries, _ := os.ReadDir(tmp)
	if len(entries) != 2 {
		t.Errorf("temporary files left behind: %v", entries)
	}
}

func TestBatchStdin(t *testing.T) {
	dir := filepath.Join("testdata", "batch")
	var out, errb strings.Builder
	code := Main([]string{"batch", filepath.Join(dir, "tie.sheaf"), "-"}, strings.NewReader("P [kN]\n10\n20\n"), &out, &errb)
	if code != exitOK || strings.Count(out.String(), "\n") != 3 {
		t.Errorf("exit %d\n%s%s", code, out.String(), errb.String())
	}
}

// TestBatchHangerHandCalc runs the example case table of the mezzanine
// hanger: its first row is the sheet as written, so it must match the hand
// calculation in the sheet's closing comment (N = 17.195 kN in ULS 2,
// F_tRd = 45.12 kN, delta = 0.8562 mm with A_s = 156.67 mm² from the ISO
// 898-1 formula; relative 1e-3, the comment rounds).
func TestBatchHangerHandCalc(t *testing.T) {
	t.Chdir("../..")
	out, errs, code := sheaf(t, "batch", "sheets/mezzanine-hanger.sheaf", "sheets/mezzanine-hanger-cases.csv", "--sig", "10")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	lines := strings.Split(out, "\n")
	head, row := strings.Split(lines[0], ","), strings.Split(lines[1], ",")
	want := map[string]float64{"N [kN]": 17.195, "F_tRd [kN]": 45.121, "delta [mm]": 0.8562}
	for i, h := range head {
		w, ok := want[h]
		if !ok {
			continue
		}
		delete(want, h)
		got, err := strconv.ParseFloat(row[i], 64)
		if err != nil || math.Abs(got-w) > 1e-3*w {
			t.Errorf("%s = %s, want %g (hand calculation)", h, row[i], w)
		}
	}
	if len(want) > 0 {
		t.Errorf("columns missing from the output: %v", want)
	}
	// N is shown in the tension check's combination, delta in the
	// elongation check's characteristic one: the column says so for each.
	for i, h := range head {
		if h == "cells shown in" && row[i] != "N: ULS 2; delta: SLS-c 2" {
			t.Errorf("cells shown in %q", row[i])
		}
	}
}

// TestBatchTemplateAction: a case table column varies the characteristic
// value of a template's action (service.q_k of walkway-pair.sheaf).
// Source of the expected values: the arithmetic of TestUseRunSet (EN 1990
// (6.10), Table A1.2(B), ψ0 of Table A1.1, from memory): 29.50 kN with the
// sheet's 3 kN/m², 35.55 kN with 7 kN/m².
func TestBatchTemplateAction(t *testing.T) {
	t.Chdir("../..")
	var out, errb strings.Builder
	code := Main([]string{"batch", "--pick", "N_node", "--sig", "10", "sheets/walkway-pair.sheaf", "-"}, strings.NewReader("service.q_k [kN/m^2]\n3\n7\n"), &out, &errb)
	if code != exitChecks {
		t.Fatalf("exit %d, want %d (the node fails with 7 kN/m²): %s", code, exitChecks, errb.String())
	}
	lines := strings.Split(out.String(), "\n")
	for k, want := range []float64{29.50, 35.55} {
		row := strings.Split(lines[k+1], ",")
		got, err := strconv.ParseFloat(row[2], 64)
		if err != nil || math.Abs(got-want) > 5e-3 {
			t.Errorf("case %d: N_node %s kN, want %g kN (hand calculation)", k+1, row[2], want)
		}
	}
}

// TestBatchInches: a case table with a column in inches and values written
// with and without their unit, `0.75in` glued to its number included.
func TestBatchInches(t *testing.T) {
	csv := filepath.Join(t.TempDir(), "rods.csv")
	if err := os.WriteFile(csv, []byte("d [in]\n0.75\n0.625 in\n1in\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errs, code := sheaf(t, "batch", filepath.Join("..", "..", "sheets", "duct-hanger-us.sheaf"), csv, "--pick", "d, A_g")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	lines := strings.Split(strings.TrimSpace(out), "\n")
	if len(lines) != 4 {
		t.Fatalf("want a header and 3 cases:\n%s", out)
	}
	for i, d := range []float64{0.75, 0.625, 1} {
		// case, the input d, then the picked d and A_g
		fields := strings.Split(lines[i+1], ",")
		got, err := strconv.ParseFloat(fields[2], 64)
		if err != nil || got != d {
			t.Errorf("case %d: d = %q, want %g in", i+1, fields[2], d)
		}
		// Source: area of a circle πd²/4 (common practice), in in^2 as the column shows.
		a, err := strconv.ParseFloat(fields[3], 64)
		if want := math.Pi * d * d / 4; err != nil || math.Abs(a-want) > 1e-5*want {
			t.Errorf("case %d: A_g = %q, want %.6g in^2", i+1, fields[3], want)
		}
	}
}
