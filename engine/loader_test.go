package engine_test

import (
	"errors"
	"math"
	"os"
	"path"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// mapLoader serves templates from memory: keys are slash paths, shown as
// "mem:" + key. It counts the reads of each key.
type mapLoader struct {
	sheet string
	files map[string]string
	fail  map[string]*check.LoadError // refusals by key
	reads map[string]int
}

func (m *mapLoader) SheetKey() string { return m.sheet }

func (m *mapLoader) Resolve(from, p string) (string, string, error) {
	key := path.Join(path.Dir(from), p)
	if e := m.fail[key]; e != nil {
		e.Shown = "mem:" + key
		return "", "", e
	}
	if _, ok := m.files[key]; !ok {
		return "", "", &check.LoadError{Kind: check.NotFound, Shown: "mem:" + key}
	}
	return key, "mem:" + key, nil
}

func (m *mapLoader) Read(key string) ([]byte, error) {
	m.reads[key]++
	return []byte(m.files[key]), nil
}

// TestLoaderIsAsked: the checker reads templates only through the loader
// it is given: none of these files exists on disk. A template used twice
// is read once; a loop is found by the loader's keys.
func TestLoaderIsAsked(t *testing.T) {
	const bar = "d [mm] = 20 mm\nA [mm^2] = pi * d^2 / 4\n"
	m := &mapLoader{sheet: "calcs/top.sheaf", reads: map[string]int{}, files: map[string]string{
		"lib/bar.sheaf": bar,
	}}
	src := "use a from \"../lib/bar.sheaf\"\nuse b from \"../lib/bar.sheaf\"\n    d = 10 mm\nA_sum [mm^2] = a.A + b.A\n"
	s, err := engine.Compile("no/such/folder/top.sheaf", []byte(src), engine.WithLoader(m))
	if err != nil {
		t.Fatal(err)
	}
	// Closed form: π(20² + 10²)/4 mm².
	want := math.Pi * (0.020*0.020 + 0.010*0.010) / 4
	if got := num(t, s.Run(nil), "A_sum"); !near(got, want, 1e-12) {
		t.Errorf("A_sum = %g, want %g", got, want)
	}
	if m.reads["lib/bar.sheaf"] != 1 {
		t.Errorf("the template was read %d times, want once", m.reads["lib/bar.sheaf"])
	}
	if files := s.Files(); len(files) != 2 || files[1] != "mem:lib/bar.sheaf" {
		t.Errorf("files %v", files)
	}

	m.files["lib/loop.sheaf"] = "use t from \"../calcs/top.sheaf\"\n"
	m.files["calcs/top.sheaf"] = "the checked sheet: never read"
	_, err = engine.Compile("top.sheaf", []byte("use l from \"../lib/loop.sheaf\"\n"), engine.WithLoader(m))
	var l diag.List
	if !errors.As(err, &l) || !strings.Contains(l[0].Summary, "templates use one another in a loop: top.sheaf uses mem:lib/loop.sheaf uses top.sheaf") {
		t.Errorf("loop: %v", err)
	}
	if m.reads["calcs/top.sheaf"] != 0 {
		t.Error("the checked sheet was read again through the loader")
	}
}

// TestLoadErrorMessages: every refusal of a loader is reported at the path
// of the use line in the words of SPEC.md §2, whichever loader made it.
func TestLoadErrorMessages(t *testing.T) {
	for _, c := range []struct {
		err  *check.LoadError
		want string // summary; detail and hint follow it, separated by " | "
	}{
		{&check.LoadError{Kind: check.NotFound, Names: []string{"strut.sheaf", "tie.sheaf"}},
			`template file "x/strutt.sheaf" not found | looked for mem:x/strutt.sheaf; template paths are relative to the sheet that uses them | did you mean "x/strut.sheaf"?`},
		{&check.LoadError{Kind: check.NotFound, NoFolder: true},
			`template file "x/strutt.sheaf" not found | looked for mem:x/strutt.sheaf; template paths are relative to the sheet that uses them | the folder mem:x does not exist`},
		{&check.LoadError{Kind: check.LeavesRoot},
			`template path "x/strutt.sheaf" leaves the project root | a template must lie inside the project: the nearest folder above the sheet that holds ` + "`.git` or a `sheaf.root` file | copy the template into the project, or put a `sheaf.root` file in a folder that holds both sheets"},
		{&check.LoadError{Kind: check.LinkLeaves},
			`template path "x/strutt.sheaf" leads outside the project root | the path is inside the project, but a symbolic link on it leads outside the project root | copy the template into the project instead of linking to it`},
		{&check.LoadError{Kind: check.IsFolder},
			`template path "x/strutt.sheaf" is a folder, not a sheet | mem:x/strutt.sheaf is a folder | name a .sheaf file in it`},
		{&check.LoadError{Kind: check.NotRegular, What: "a named pipe (FIFO)"},
			`template path "x/strutt.sheaf" is a named pipe (FIFO), not a sheet | mem:x/strutt.sheaf is a named pipe (FIFO); only a regular file is read, so that checking never waits on a pipe or reads a device without end | name the .sheaf file itself`},
		{&check.LoadError{Kind: check.Unreadable, Err: errors.New("permission denied")},
			`cannot read template "x/strutt.sheaf" | looked for mem:x/strutt.sheaf: permission denied | check the file's links and permissions`},
	} {
		m := &mapLoader{sheet: "top.sheaf", reads: map[string]int{}, files: map[string]string{}, fail: map[string]*check.LoadError{"x/strutt.sheaf": c.err}}
		_, err := engine.Compile("top.sheaf", []byte("use s from \"x/strutt.sheaf\"\n"), engine.WithLoader(m))
		var l diag.List
		if !errors.As(err, &l) || len(l) != 1 {
			t.Errorf("%v: got %v", c.err.Kind, err)
			continue
		}
		d := l[0]
		got := d.Summary + " | " + d.Detail + " | " + d.Hint
		if got != c.want || d.Range.Start().Line != 1 || d.Range.Start().Col != 13 {
			t.Errorf("%v at %s:\ngot  %s\nwant %s", c.err.Kind, d.Range.Start(), got, c.want)
		}
	}
}

// TestTemplateDevice: a device inside the project is refused as a
// template without being read (making one needs the right to mknod).
func TestTemplateDevice(t *testing.T) {
	dir := t.TempDir()
	write(t, filepath.Join(dir, "sheaf.root"), "")
	write(t, filepath.Join(dir, "top.sheaf"), "use z from \"zero.sheaf\"\n")
	if err := mknodZero(filepath.Join(dir, "zero.sheaf")); err != nil {
		t.Skipf("cannot make a device here: %v", err)
	}
	_, err := engine.Load(filepath.Join(dir, "top.sheaf"))
	var l diag.List
	if !errors.As(err, &l) || !strings.Contains(l[0].Summary, `template path "zero.sheaf" is a character device, not a sheet`) {
		t.Errorf("got %v", err)
	}
	_ = os.Remove(filepath.Join(dir, "zero.sheaf"))
}
