package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// entries lists the names in dir, to show what a write left behind.
func entries(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range es {
		out = append(out, e.Name())
	}
	return out
}

func TestWriteFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "hanger.sheaf")
	for _, c := range []struct {
		data string
		perm os.FileMode
	}{{"first\n", 0o644}, {"second, longer\n", 0o600}, {"", 0o644}} {
		if err := WriteFile(path, []byte(c.data), c.perm); err != nil {
			t.Fatal(err)
		}
		b, err := os.ReadFile(path)
		if err != nil || string(b) != c.data {
			t.Errorf("read back %q, %v; want %q", b, err, c.data)
		}
		fi, err := os.Stat(path)
		if err != nil {
			t.Fatal(err)
		}
		if runtime.GOOS != "windows" && fi.Mode().Perm() != c.perm {
			t.Errorf("mode %v, want %v", fi.Mode().Perm(), c.perm)
		}
		if got := entries(t, dir); len(got) != 1 {
			t.Errorf("left behind: %v", got)
		}
	}
}

// TestWriteFails: a failing writer leaves the old file and no temporary
// file, and its error comes back unchanged.
func TestWriteFails(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "calc.csv")
	if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("disk full")
	err := Write(path, 0o644, func(w io.Writer) error {
		_, _ = io.WriteString(w, "half a fi")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("err = %v, want %v", err, boom)
	}
	if b, _ := os.ReadFile(path); string(b) != "old" {
		t.Errorf("the old file changed to %q", b)
	}
	if got := entries(t, dir); len(got) != 1 {
		t.Errorf("left behind: %v", got)
	}
}

// TestWriteNoFolder: a folder that does not exist is named in the error.
func TestWriteNoFolder(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "no", "such")
	err := WriteFile(filepath.Join(dir, "out.xlsx"), []byte("x"), 0o644)
	if err == nil || !strings.Contains(err.Error(), "cannot write in "+dir) || !errors.Is(err, os.ErrNotExist) {
		t.Errorf("err = %v", err)
	}
}

// TestWriteRelative: a bare file name is written in the working folder.
func TestWriteRelative(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	if err := WriteFile("bare.txt", []byte("ok"), 0o644); err != nil {
		t.Fatal(err)
	}
	if b, err := os.ReadFile(filepath.Join(dir, "bare.txt")); err != nil || string(b) != "ok" {
		t.Errorf("read back %q, %v", b, err)
	}
}
