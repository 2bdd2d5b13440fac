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

// TestWriteChecked: an error from ready, called just before the rename,
// leaves the target as it was and no temporary file.
func TestWriteChecked(t *testing.T) {
	for _, c := range []struct {
		name  string
		ready func() error
		want  string
	}{
		{"ready", func() error { return nil }, "new"},
		{"nil ready", nil, "new"},
		{"refused", func() error { return errors.New("changed meanwhile") }, "old"},
	} {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, "calc.sheaf")
			if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
				t.Fatal(err)
			}
			err := WriteChecked(path, 0o644, func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err }, c.ready)
			if (err != nil) != (c.want == "old") {
				t.Errorf("error %v", err)
			}
			if b, _ := os.ReadFile(path); string(b) != c.want {
				t.Errorf("file holds %q, want %q", b, c.want)
			}
			if got := entries(t, dir); len(got) != 1 {
				t.Errorf("left behind: %v", got)
			}
		})
	}
}

// TestAbort: an interrupt during a write removes the temporary file, the
// write fails with ErrAborted, the target is untouched, and later writes
// are refused.
func TestAbort(t *testing.T) {
	defer func() { mu.Lock(); aborted = false; stopped.Store(false); mu.Unlock() }()
	dir := t.TempDir()
	path := filepath.Join(dir, "cases.csv")
	if err := os.WriteFile(path, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	removed := -1
	err := Write(path, 0o644, func(w io.Writer) error {
		if _, err := io.WriteString(w, "half"); err != nil {
			return err
		}
		removed = Abort() // the signal arrives while the file is written
		_, err := io.WriteString(w, " and the rest")
		return err
	})
	if !errors.Is(err, ErrAborted) {
		t.Errorf("error %v, want ErrAborted", err)
	}
	if removed != 1 {
		t.Errorf("Abort removed %d files, want 1", removed)
	}
	if b, _ := os.ReadFile(path); string(b) != "old" {
		t.Errorf("target holds %q", b)
	}
	if got := entries(t, dir); len(got) != 1 {
		t.Errorf("left behind: %v", got)
	}
	if err := WriteFile(path, []byte("later"), 0o644); !errors.Is(err, ErrAborted) {
		t.Errorf("a write after Abort: %v", err)
	}
}

// TestWriteKeepsLinkAndRefusesSpecial: a link is kept and its target
// replaced; a folder is not replaced.
func TestWriteKeepsLinkAndRefusesSpecial(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "real.sheaf")
	link := filepath.Join(dir, "link.sheaf")
	if err := os.WriteFile(target, []byte("old"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("real.sheaf", link); err != nil {
		t.Skipf("no symbolic links here: %v", err)
	}
	if err := WriteFile(link, []byte("new"), 0o644); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Lstat(link); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Errorf("the link was replaced: %v %v", fi, err)
	}
	if b, _ := os.ReadFile(target); string(b) != "new" {
		t.Errorf("target holds %q", b)
	}
	sub := filepath.Join(dir, "sub")
	if err := os.Mkdir(sub, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := WriteFile(sub, []byte("x"), 0o644); err == nil || !strings.Contains(err.Error(), "is a folder") {
		t.Errorf("a folder: %v", err)
	}
}
