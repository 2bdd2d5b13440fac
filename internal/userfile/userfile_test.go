package userfile

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// within runs f and fails the test when it does not return in time: no
// read of a special file may block.
func within(t *testing.T, f func()) {
	t.Helper()
	done := make(chan struct{})
	go func() { defer close(done); f() }()
	select {
	case <-done:
	case <-time.After(10 * time.Second):
		t.Fatal("blocked: the read did not return within 10 s")
	}
}

func TestReadFile(t *testing.T) {
	dir := t.TempDir()
	small := filepath.Join(dir, "small.sheaf")
	if err := os.WriteFile(small, []byte("x = 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.sheaf")
	if err := os.Symlink(small, link); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name, path string
		limit      int64
		want       string // the file's text, or a part of the error
		isErr      bool
	}{
		{"regular file", small, 100, "x = 1\n", false},
		{"at the limit", small, 6, "x = 1\n", false},
		{"no limit", small, -1, "x = 1\n", false},
		{"a link to a regular file", link, 100, "x = 1\n", false},
		{"over the limit", small, 5, "is too large: 6 bytes, the limit is 5", true},
		{"a folder", dir, 100, "is a folder, not a regular file", true},
		{"a character device", "/dev/zero", 100, "is a character device, not a regular file", true},
		{"missing", filepath.Join(dir, "none.sheaf"), 100, "no such file", true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if c.path == "/dev/zero" {
				if _, err := os.Stat(c.path); err != nil {
					t.Skip("no /dev/zero here")
				}
			}
			var got []byte
			var err error
			within(t, func() { got, err = ReadFile(c.path, c.limit) })
			if c.isErr {
				if err == nil || !strings.Contains(err.Error(), c.want) {
					t.Errorf("error %v, want one containing %q", err, c.want)
				}
				return
			}
			if err != nil || string(got) != c.want {
				t.Errorf("got %q, %v; want %q", got, err, c.want)
			}
		})
	}
}

func TestReadFileTypedErrors(t *testing.T) {
	dir := t.TempDir()
	var nr *NotRegularError
	if _, err := ReadFile(dir, 10); !errors.As(err, &nr) || !nr.Mode.IsDir() {
		t.Errorf("folder: %v, want a NotRegularError", err)
	}
	p := filepath.Join(dir, "big")
	if err := os.WriteFile(p, make([]byte, 20), 0o644); err != nil {
		t.Fatal(err)
	}
	var tl *TooLargeError
	if _, err := ReadFile(p, 10); !errors.As(err, &tl) || tl.Size != 20 || tl.Limit != 10 {
		t.Errorf("large: %v, want a TooLargeError of 20 bytes over 10", err)
	}
}

func TestReadAll(t *testing.T) {
	for _, c := range []struct {
		in    string
		limit int64
		ok    bool
	}{
		{"abc", 3, true},
		{"abcd", 3, false},
		{"", 0, true},
		{strings.Repeat("x", 5000), 4999, false},
		{strings.Repeat("x", 5000), -1, true},
	} {
		got, err := ReadAll(strings.NewReader(c.in), "stdin", c.limit)
		if c.ok != (err == nil) || (c.ok && string(got) != c.in) {
			t.Errorf("ReadAll(%d bytes, limit %d) = %d bytes, %v", len(c.in), c.limit, len(got), err)
		}
		if !c.ok && (err == nil || !strings.Contains(err.Error(), "stdin is too large")) {
			t.Errorf("message: %v", err)
		}
	}
}

func TestSameAndUnchanged(t *testing.T) {
	dir := t.TempDir()
	a := filepath.Join(dir, "a.csv")
	b := filepath.Join(dir, "b.csv")
	for _, p := range []string{a, b} {
		if err := os.WriteFile(p, []byte("P [kN]\n1\n"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	link := filepath.Join(dir, "l.csv")
	if err := os.Symlink("a.csv", link); err != nil {
		t.Fatal(err)
	}
	hard := filepath.Join(dir, "h.csv")
	if err := os.Link(a, hard); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		x, y string
		want bool
	}{
		{a, a, true},
		{a, filepath.Join(dir, ".", "a.csv"), true},
		{a, link, true},
		{a, hard, true},
		{a, b, false},
		{a, filepath.Join(dir, "new.csv"), false},
	} {
		if got := Same(c.x, c.y); got != c.want {
			t.Errorf("Same(%s, %s) = %v, want %v", c.x, c.y, got, c.want)
		}
	}

	_, fi, err := ReadFileInfo(a, 100)
	if err != nil {
		t.Fatal(err)
	}
	if err := Unchanged(a, fi); err != nil {
		t.Errorf("untouched file: %v", err)
	}
	if err := os.WriteFile(a, []byte("P [kN]\n1\n2\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := Unchanged(a, fi); !errors.Is(err, ErrChanged) {
		t.Errorf("edited file: %v, want ErrChanged", err)
	}
}
