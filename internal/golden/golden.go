package golden

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// Check compares got with the file at path. With update set it first
// writes got there (creating the folder), so that a run with the flag
// leaves the files to review as a diff. A missing file or a difference
// fails the test with both texts.
func Check(t testing.TB, path string, got []byte, update bool) {
	t.Helper()
	if update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run the test with its update flag, e.g. -update, to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("output differs from %s (rerun with the update flag and review the diff):\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}
