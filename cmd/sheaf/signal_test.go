//go:build unix

package main

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestMain lets a test run this test binary as the sheaf command (with
// SHEAF_TEST_AS_MAIN=1), to send it real signals.
// asMain runs the test binary as sheaf when SHEAF_TEST_AS_MAIN is set (see
// TestMain in exit_test.go), so that a signal reaches Main itself.
func asMain() {
	if os.Getenv("SHEAF_TEST_AS_MAIN") == "1" {
		os.Exit(Main(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
	}
}

// TestInterrupt: SIGINT or SIGTERM during `batch --out` (while the cases
// run or while the workbook is written) ends sheaf with 128 + the signal
// number and a message; no temporary file is left and no output file
// appears.
func TestInterrupt(t *testing.T) {
	if testing.Short() {
		t.Skip("runs a large batch")
	}
	for _, tc := range []struct {
		sig     syscall.Signal
		name    string
		writing bool // signal once the workbook is being written, else while the cases run
	}{
		{syscall.SIGINT, "SIGINT", false},
		{syscall.SIGINT, "SIGINT", true},
		{syscall.SIGTERM, "SIGTERM", true},
	} {
		t.Run(fmt.Sprintf("%s/writing=%v", tc.name, tc.writing), func(t *testing.T) {
			dir := t.TempDir()
			var table strings.Builder
			table.WriteString("P [kN]\n")
			// 200,000 cases take about 300 ms to run on a fast machine, so a
			// signal meant for the running cases gets 1,000,000: it must not
			// land while the workbook is already being written.
			rows := 200_000
			if !tc.writing {
				rows = 1_000_000
			}
			for i := range rows {
				fmt.Fprintf(&table, "%d\n", 10+i%50)
			}
			writeFiles(t, dir, map[string]string{"ok.sheaf": hostileSheet, "cases.csv": table.String()})
			cmd := exec.Command(os.Args[0], "batch", "ok.sheaf", "cases.csv", "--workers", "1", "--out", "out.xlsx")
			cmd.Dir = dir
			cmd.Env = append(os.Environ(), "SHEAF_TEST_AS_MAIN=1")
			var errb bytes.Buffer
			cmd.Stderr = &errb
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			exited := make(chan error, 1)
			go func() { exited <- cmd.Wait() }()
			if tc.writing {
				// Signal once the workbook's temporary file exists.
				for deadline := time.Now().Add(20 * time.Second); ; time.Sleep(time.Millisecond) {
					if tmps, _ := filepath.Glob(filepath.Join(dir, ".out.xlsx.*.tmp")); len(tmps) > 0 {
						break
					}
					if time.Now().After(deadline) {
						t.Fatal("no temporary file appeared within 20 s")
					}
				}
			} else {
				time.Sleep(300 * time.Millisecond) // the process is past its start; reading and running 1,000,000 rows takes longer
			}
			if err := cmd.Process.Signal(tc.sig); err != nil {
				t.Skipf("the batch ended before the signal: %v", err)
			}
			var err error
			select {
			case err = <-exited:
			case <-time.After(30 * time.Second):
				_ = cmd.Process.Kill()
				t.Fatal("sheaf did not stop within 30 s of the signal")
			}
			var ee *exec.ExitError
			if !errors.As(err, &ee) {
				t.Skipf("the batch ended before the signal: %v", err)
			}
			if st, ok := ee.Sys().(syscall.WaitStatus); ok && st.Signaled() {
				t.Skipf("the signal came before sheaf set up its handler (a slow start): %v", err)
			}
			if got, want := ee.ExitCode(), 128+int(tc.sig); got != want {
				t.Errorf("exit %d, want %d; stderr:\n%s", got, want, errb.String())
			}
			want := "sheaf: stopped by " + tc.name + ": no file was left half-written (0 temporary files removed)"
			if tc.writing {
				want = "sheaf: stopped by " + tc.name + ": no file was left half-written (1 temporary file removed)"
			}
			if !strings.Contains(errb.String(), want) {
				t.Errorf("stderr:\n%s", errb.String())
			}
			es, _ := os.ReadDir(dir)
			var names []string
			for _, e := range es {
				names = append(names, e.Name())
			}
			if len(names) != 2 {
				t.Errorf("left behind: %v", names)
			}
		})
	}
}
