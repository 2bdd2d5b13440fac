package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/atomicfile"
	"github.com/sheafcalc/sheaf/internal/plural"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// newOptions are the flags of `sheaf new`.
type newOptions struct {
	force   bool
	library string
	date    string
	now     func() time.Time // the clock (tests fix it); nil is time.Now
}

// libraryDir is the folder of templates looked for in the current
// directory and its parents.
const libraryDir = "sheets"

// dateLayout is the form of the date a new sheet gets (ISO 8601).
const dateLayout = "2006-01-02"

func newNewCmd(a *app) *cobra.Command {
	o := &newOptions{}
	cmd := &cobra.Command{
		Use:   "new TEMPLATE OUT.sheaf",
		Short: "Start a sheet from a template, with its inputs listed first",
		Long: `New starts a calculation from a template: a sheet in the template library
(the sheets/ folder of the project, found from the current directory up, or
--library DIR) named with or without .sheaf, or any sheet given by path.

The new sheet is a standalone copy: the header is kept with the date set to
today's date (or --date YYYY-MM-DD: the output is then the same on every
day, for scripts and tests), a comment names the template, and every
input cell is gathered at the top under "## Inputs", so the values to edit
are in one place; the rest follows unchanged, in canonical layout. The copy
evaluates exactly as the template does until you edit it.

OUT must not exist unless --force is given; it is written whole or not at
all.

Exit status here: 0 when written, 2 when the template is not found or has
errors, or OUT exists.`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runNew(a, o, args[0], args[1])
		},
	}
	cmd.Flags().BoolVarP(&o.force, "force", "f", false, "overwrite OUT if it exists")
	cmd.Flags().StringVar(&o.library, "library", "", "folder of templates (default: the nearest sheets/ folder)")
	cmd.Flags().StringVar(&o.date, "date", "", "the date of the new sheet, YYYY-MM-DD (default: today)")
	return cmd
}

func runNew(a *app, o *newOptions, template, out string) error {
	date := o.date
	if date == "" {
		now := o.now
		if now == nil {
			now = time.Now
		}
		date = now().Format(dateLayout)
	} else if _, err := time.Parse(dateLayout, date); err != nil {
		return userErrorf("--date %s: write the date as YYYY-MM-DD, e.g. --date 2026-03-14", date)
	}
	path, err := findTemplate(template, o.library)
	if err != nil {
		return err
	}
	if !o.force {
		if _, err := os.Lstat(out); err == nil {
			return userErrorf("%s already exists; choose another name, or give --force to overwrite it", out)
		}
	}
	if userfile.Same(out, path) {
		return userErrorf("%s is the template itself; choose another name for the new sheet", out)
	}
	src, err := readUserFile(path, engine.DefaultMaxBytes)
	if err != nil {
		return err
	}
	text, n, err := fromTemplate(path, src, out, date)
	if err != nil {
		var list diag.List
		if errors.As(err, &list) {
			_ = diag.Render(a.stderr, list, sourcesFor(list, path, src))
			fmt.Fprintf(a.stderr, "the template %s has errors; fix it first\n", path)
			return &reportedError{err, exitInput}
		}
		return err
	}
	if err := atomicfile.WriteFile(out, text, 0o644); err != nil {
		return &inputError{fmt.Errorf("cannot write %s: %w", out, err)}
	}
	fmt.Fprintf(a.stdout, "wrote %s from %s: %s listed first under \"## Inputs\"\n", out, path, plural.Count(n, "input"))
	return nil
}

// fromTemplate builds the text of the new sheet out from the template at
// path, dated date, and returns it with the number of inputs gathered.
func fromTemplate(path string, src []byte, out, date string) ([]byte, int, error) {
	s, err := engine.Compile(path, src)
	if err != nil {
		return nil, 0, err
	}
	for _, in := range s.Files()[1:] {
		if userfile.Same(out, in) {
			return nil, 0, userErrorf("%s is a template that %s uses; choose another name for the new sheet", out, path)
		}
	}
	inputs := map[string]bool{}
	for _, c := range s.Cells() {
		if c.Kind == engine.Input {
			inputs[c.Name] = true
		}
	}
	f := s.File()
	// The preamble (header lines and the comments around them, up to the
	// first heading or cell) stays on top; the inputs follow it.
	var head, moved, rest []sheet.Item
	inHeader := true
	for _, it := range f.Items {
		switch it := it.(type) {
		case *sheet.Meta:
			if inHeader {
				if it.Key.Name == "date" {
					m := *it
					m.Value = date
					head = append(head, &m)
				} else {
					head = append(head, it)
				}
				continue
			}
		case *sheet.Comment, *sheet.Blank:
			if inHeader {
				head = append(head, it)
				continue
			}
		case *sheet.Cell:
			inHeader = false
			if inputs[it.Name.Name] {
				moved = append(moved, it)
				continue
			}
		default:
			inHeader = false
		}
		rest = append(rest, it)
	}
	items := append([]sheet.Item{}, head...)
	items = append(items, &sheet.Blank{}, &sheet.Comment{Text: " Started from the template " + filepath.Base(path) + "."})
	if len(moved) > 0 {
		items = append(items, &sheet.Heading{Text: "Inputs"})
		items = append(items, moved...)
	}
	items = append(items, &sheet.Blank{})
	items = append(items, dropEmptyHeadings(rest)...)
	uses, err := rebaseUses(items, path, out)
	if err != nil {
		return nil, 0, err
	}
	text, err := sheet.Format(&sheet.File{Name: path, Items: items})
	if err != nil {
		return nil, 0, err
	}
	// The copy must read back and evaluate as the template does; anything
	// else is a fault of this command, not of the template, except that a
	// copy placed outside the project cannot reach the templates it uses.
	ns, err := engine.Compile(out, text)
	if err != nil {
		var list diag.List
		if uses > 0 && errors.As(err, &list) && len(list) > 0 {
			return nil, 0, userErrorf("%s uses other templates, and the new sheet cannot reach them from %s: %s; write the new sheet inside the same project", path, filepath.Dir(out), list[0].Summary)
		}
		return nil, 0, fmt.Errorf("internal error: the new sheet does not check: %v", err)
	}
	a, b := s.Run(nil), ns.Run(nil)
	for i, c := range a.Cells {
		if d := b.Cell(c.Cell.Name); d == nil || d.Text != c.Text {
			return nil, 0, fmt.Errorf("internal error: `%s` evaluates differently in the new sheet", a.Cells[i].Cell.Name)
		}
	}
	return text, len(moved), nil
}

// rebaseUses rewrites the path of each template use among items, written
// relative to the template at path, to be relative to the new sheet out,
// and returns how many there are.
func rebaseUses(items []sheet.Item, path, out string) (int, error) {
	from, err := filepath.Abs(filepath.Dir(path))
	if err != nil {
		return 0, &inputError{err}
	}
	to, err := filepath.Abs(filepath.Dir(out))
	if err != nil {
		return 0, &inputError{err}
	}
	n := 0
	for i, it := range items {
		u, ok := it.(*sheet.Use)
		if !ok {
			continue
		}
		n++
		rel, err := filepath.Rel(to, filepath.Join(from, filepath.FromSlash(u.Path)))
		if err != nil {
			return 0, userErrorf("cannot write the path of template %q relative to %s: %v", u.Path, out, err)
		}
		moved := *u
		moved.Path = filepath.ToSlash(rel)
		items[i] = &moved
	}
	return n, nil
}

// dropEmptyHeadings removes the headings left with nothing under them once
// their inputs moved up.
func dropEmptyHeadings(items []sheet.Item) []sheet.Item {
	var out []sheet.Item
	for i, it := range items {
		if _, ok := it.(*sheet.Heading); ok {
			empty := true
			for _, next := range items[i+1:] {
				if _, ok := next.(*sheet.Heading); ok {
					break
				}
				if _, ok := next.(*sheet.Blank); !ok {
					empty = false
					break
				}
			}
			if empty {
				continue
			}
		}
		out = append(out, it)
	}
	return out
}

// findTemplate resolves a template name: a path to a file, or a name in
// the library (with or without .sheaf).
func findTemplate(name, library string) (string, error) {
	if fi, err := os.Stat(name); err == nil {
		if fi.Mode().IsRegular() {
			return name, nil
		}
		if !fi.IsDir() {
			return "", &inputError{&userfile.NotRegularError{Path: name, Mode: fi.Mode()}}
		}
	}
	lib := library
	if lib == "" {
		lib = nearestLibrary()
	}
	if lib == "" {
		return "", userErrorf("template %q not found: it is not a file, and no %s/ folder was found here or above; give a path or --library DIR", name, libraryDir)
	}
	for _, cand := range []string{name, name + ".sheaf"} {
		p := filepath.Join(lib, cand)
		if fi, err := os.Stat(p); err == nil && fi.Mode().IsRegular() {
			return p, nil
		}
	}
	names := templateNames(lib)
	msg := fmt.Sprintf("template %q not found in %s", name, lib)
	if n := diag.Nearest(strings.TrimSuffix(name, ".sheaf"), names); n != "" {
		msg += fmt.Sprintf("; did you mean %q?", n)
	} else if len(names) > 0 {
		msg += "; the templates are: " + strings.Join(names, ", ")
	}
	return "", userErrorf("%s", msg)
}

// nearestLibrary returns the sheets/ folder in the current directory or
// the nearest parent, or "".
func nearestLibrary() string {
	dir, err := os.Getwd()
	if err != nil {
		return ""
	}
	for {
		p := filepath.Join(dir, libraryDir)
		if fi, err := os.Stat(p); err == nil && fi.IsDir() {
			if rel, err := filepath.Rel(workingDir(), p); err == nil {
				return rel
			}
			return p
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			return ""
		}
		dir = parent
	}
}

// workingDir returns the working directory, or "" when it cannot be read
// (the caller then keeps the path as it is).
func workingDir() string {
	wd, _ := os.Getwd()
	return wd
}

// templateNames lists the templates of a library, sorted, without .sheaf.
func templateNames(lib string) []string {
	entries, err := os.ReadDir(lib)
	if err != nil {
		return nil
	}
	var names []string
	for _, e := range entries {
		if n := e.Name(); !e.IsDir() && strings.HasSuffix(n, ".sheaf") {
			names = append(names, strings.TrimSuffix(n, ".sheaf"))
		}
	}
	sort.Strings(names)
	return names
}
