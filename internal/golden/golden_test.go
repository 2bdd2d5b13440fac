package golden

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// recorder is a testing.TB that records failures instead of stopping the
// test, so that Check's own failures can be tested.
type recorder struct {
	testing.TB
	failed bool
	msg    string
}

func (r *recorder) Helper() {}

func (r *recorder) Errorf(format string, args ...any) { r.failed = true; r.msg = format }

// Fatalf records the failure and ends the goroutine, as testing.T does.
func (r *recorder) Fatalf(format string, args ...any) {
	r.failed = true
	r.msg = format
	panic(r)
}

func (r *recorder) Fatal(args ...any) { r.Fatalf("fatal") }

// check runs Check on a recorder and reports whether it failed.
func check(t *testing.T, path string, got []byte, update bool) (failed bool, msg string) {
	r := &recorder{TB: t}
	defer func() {
		if p := recover(); p != nil && p != r {
			panic(p)
		}
		failed, msg = r.failed, r.msg
	}()
	Check(r, path, got, update)
	return r.failed, r.msg
}

func TestCheck(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "sub", "out.golden")
	if failed, msg := check(t, path, []byte("a\n"), false); !failed || !strings.Contains(msg, "update flag") {
		t.Errorf("a missing file: failed=%v %q, want a failure that names the update flag", failed, msg)
	}
	if failed, _ := check(t, path, []byte("a\n"), true); failed {
		t.Error("update failed")
	}
	if b, err := os.ReadFile(path); err != nil || string(b) != "a\n" {
		t.Errorf("update wrote %q, %v", b, err)
	}
	if failed, _ := check(t, path, []byte("a\n"), false); failed {
		t.Error("equal output failed")
	}
	if failed, msg := check(t, path, []byte("b\n"), false); !failed || !strings.Contains(msg, "differs") {
		t.Errorf("different output: failed=%v %q", failed, msg)
	}
}
