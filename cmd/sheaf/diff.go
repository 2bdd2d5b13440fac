package main

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/diff"
	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// diffOptions are the flags of `sheaf diff`.
type diffOptions struct {
	rev   string
	rtol  float64
	json  bool
	draft bool
	sheet sheetFlags
}

func newDiffCmd(a *app) *cobra.Command {
	o := &diffOptions{}
	cmd := &cobra.Command{
		Use:   "diff OLD NEW | diff --rev REV FILE",
		Short: "Compare the results of two versions of a sheet",
		Long: `Diff evaluates two versions of a sheet and shows what changed: header
lines, inputs (old → new value), formulas (old → new text), cells added and
removed, results that moved by more than the relative tolerance --rtol, and
design checks whose utilisation or verdict changed.

With --rev it compares the file as committed at a git revision (any name git
understands: HEAD~1, a tag, a commit) with the working copy. Git must be
installed and the file must be inside a git repository.

Cells are matched by name; formulas are compared with their spacing
normalised, so a reformatted sheet shows no changes.

Exit status here: 0 when no check flipped to fail, 1 when a check that passed (or
is new) now fails or cannot be assessed, 2 when either sheet has errors or
a cell of the new version could not be computed (not with --draft).`,
		Args: func(cmd *cobra.Command, args []string) error {
			if o.rev != "" {
				if len(args) != 1 {
					return userErrorf("diff --rev REV takes one file (the working copy), got %d", len(args))
				}
				return nil
			}
			if len(args) != 2 {
				return userErrorf("diff takes two sheets, OLD and NEW (or --rev REV FILE), got %d", len(args))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			err := runDiff(a, o, args)
			if o.json {
				return jsonFailure(a, diff.Schema, strings.Join(args, " "), err)
			}
			return err
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.rev, "rev", "", "compare FILE at this git revision with the working copy")
	f.Float64Var(&o.rtol, "rtol", diff.DefaultRelTol, "relative tolerance below which a result counts as unchanged")
	f.BoolVar(&o.json, "json", false, "print the differences as JSON")
	f.BoolVar(&o.draft, "draft", false, "accept a new version with cells that cannot be computed (exit 0 or 1 instead of 2)")
	o.sheet.add(cmd, true)
	return cmd
}

func runDiff(a *app, o *diffOptions, args []string) error {
	if !(o.rtol >= 0) || o.rtol >= 1 {
		return userErrorf("--rtol %g: give a relative tolerance from 0 to below 1, e.g. 1e-6", o.rtol)
	}
	opts, err := o.sheet.options()
	if err != nil {
		return err
	}
	var oldName, newName string
	var oldSrc, newSrc []byte
	if o.rev != "" {
		newName = args[0]
		if newSrc, err = os.ReadFile(newName); err != nil {
			return &inputError{err}
		}
		if oldName, oldSrc, err = gitShow(o.rev, newName); err != nil {
			return err
		}
	} else {
		oldName, newName = args[0], args[1]
		if oldSrc, err = os.ReadFile(oldName); err != nil {
			return &inputError{err}
		}
		if newSrc, err = os.ReadFile(newName); err != nil {
			return &inputError{err}
		}
	}
	oldCompileName := oldName
	if o.rev != "" && usesTemplates(oldName, oldSrc) {
		// Templates are found relative to the sheet's own file; the
		// revision has no file on disk, so they come from the working copy.
		oldCompileName = newName
		fmt.Fprintf(a.stderr, "note: the templates %s uses are read from the working copy, not from revision %s\n", oldName, o.rev)
	}
	olds, err1 := compileReported(a, oldCompileName, oldSrc, opts)
	news, err2 := compileReported(a, newName, newSrc, opts)
	var se1, se2 *sheetError
	if errors.As(err1, &se1) && errors.As(err2, &se2) {
		return se1.join(se2) // both versions' problems, in one report
	}
	if err1 != nil {
		return err1
	}
	if err2 != nil {
		return err2
	}
	newRes := news.Run(nil)
	r := diff.Compare(oldName, olds.Run(nil), newName, newRes, diff.Options{RelTol: o.rtol})
	var status error
	if n := newRes.Uncomputed(); n > 0 && !o.draft {
		status = &reportedError{fmt.Errorf("%s of %s could not be computed (--draft accepts it)", plural.Count(n, "cell"), newName), exitInput}
	} else if r.Flipped > 0 {
		status = &reportedError{fmt.Errorf("%d design checks flipped to fail", r.Flipped), exitChecks}
	}
	r.ExitCode = exitCode(status)
	if o.json {
		err = r.WriteJSON(a.stdout)
	} else {
		err = r.WriteText(a.stdout)
	}
	if err != nil {
		return err
	}
	if r.ExitCode == exitInput {
		fmt.Fprintf(a.stderr, "sheaf: %v\n", status)
	}
	return status
}

// usesTemplates reports whether the sheet src uses other sheets.
func usesTemplates(name string, src []byte) bool {
	f, _ := sheet.Parse(name, src)
	if f == nil {
		return false
	}
	for _, it := range f.Items {
		if _, ok := it.(*sheet.Use); ok {
			return true
		}
	}
	return false
}

// compileReported compiles src; its diagnostics come back as a
// *sheetError.
func compileReported(_ *app, name string, src []byte, opts []engine.Option) (*engine.Sheet, error) {
	s, err := engine.Compile(name, src, opts...)
	if err == nil {
		return s, nil
	}
	var list diag.List
	if errors.As(err, &list) {
		return nil, &sheetError{list: list, name: name, src: src} // rendered on stderr, or as JSON with --json
	}
	return nil, &inputError{err}
}

// gitShow returns the content of file at git revision rev, and the name to
// show for it ("REV:path/in/repo"). It runs the git binary: the repository
// root comes from `git rev-parse --show-toplevel` in the file's directory.
func gitShow(rev, file string) (string, []byte, error) {
	if strings.HasPrefix(rev, "-") {
		return "", nil, userErrorf("--rev %q: a revision does not start with '-'", rev)
	}
	abs, err := filepath.Abs(file)
	if err != nil {
		return "", nil, &inputError{err}
	}
	if real, err := filepath.EvalSymlinks(abs); err == nil {
		abs = real
	}
	top, err := git(filepath.Dir(abs), "rev-parse", "--show-toplevel")
	if err != nil {
		var nf *exec.Error
		if errors.As(err, &nf) {
			return "", nil, userErrorf("--rev needs git, which was not found: %v; install git or compare two files with `sheaf diff OLD NEW`", err)
		}
		return "", nil, userErrorf("%s is not inside a git repository (%v); commit it first, or compare two files with `sheaf diff OLD NEW`", file, err)
	}
	root := strings.TrimSpace(string(top))
	if real, err := filepath.EvalSymlinks(root); err == nil {
		root = real
	}
	rel, err := filepath.Rel(root, abs)
	if err != nil || strings.HasPrefix(rel, "..") {
		return "", nil, userErrorf("%s is not inside the git repository at %s", file, root)
	}
	rel = filepath.ToSlash(rel)
	src, err := git(root, "show", rev+":"+rel)
	if err != nil {
		return "", nil, userErrorf("git cannot show %s at revision %q: %v; list the revisions of the file with `git log -- %s`", rel, rev, err, file)
	}
	return rev + ":" + rel, src, nil
}

// git runs git with args in dir and returns its stdout; a failure carries
// the first line git wrote to stderr.
func git(dir string, args ...string) ([]byte, error) {
	cmd := exec.Command("git", append([]string{"-C", dir}, args...)...)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	cmd.Env = append(os.Environ(), "GIT_PAGER=cat", "LC_ALL=C")
	if err := cmd.Run(); err != nil {
		var ee *exec.ExitError
		if errors.As(err, &ee) {
			msg, _, _ := strings.Cut(strings.TrimSpace(errb.String()), "\n")
			msg = strings.TrimPrefix(strings.TrimPrefix(msg, "fatal: "), "error: ")
			if msg == "" {
				msg = err.Error()
			}
			return nil, errors.New(msg)
		}
		return nil, err
	}
	return out.Bytes(), nil
}
