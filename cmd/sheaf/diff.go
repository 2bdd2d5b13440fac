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
	"github.com/sheafcalc/sheaf/internal/plural"
)

// diffOptions are the flags of `sheaf diff`.
type diffOptions struct {
	revs  []string
	rtol  float64
	json  bool
	draft bool
	sheet sheetFlags
}

func newDiffCmd(a *app) *cobra.Command {
	o := &diffOptions{}
	cmd := &cobra.Command{
		Use:   "diff OLD NEW | diff --rev REV FILE | diff --rev A --rev B FILE",
		Short: "Compare the results of two versions of a sheet",
		Long: `Diff evaluates two versions of a sheet and shows what changed: header
lines, inputs (old → new value), formulas (old → new text), cells added and
removed, results that moved by more than the relative tolerance --rtol, and
design checks whose utilisation or verdict changed.

With one --rev it compares FILE as committed at a git revision (any name git
understands: HEAD~1, a tag, a commit) with the working copy; with two
(--rev A --rev B, or --rev A..B) it compares FILE at revision A with FILE at
revision B, and the working copy is not read. A revision's sheet uses the
templates of the same revision, under the same rules as on disk (inside the
project root, no link out of it), so a change to a template shows in the
diff. Git must be installed and the file must be inside a git repository.

Cells are matched by name; formulas are compared with their spacing
normalised, so a reformatted sheet shows no changes.

Exit status here: 0 when no check flipped to fail, 1 when a check that passed (or
is new) now fails or cannot be assessed, 2 when either sheet has errors or
a cell of the new version could not be computed (not with --draft).`,
		Example: `  sheaf diff old/hanger.sheaf hanger.sheaf
  sheaf diff --rev HEAD~1 calcs/hanger.sheaf
  sheaf diff --rev v1.0 --rev v1.1 calcs/hanger.sheaf
  sheaf diff --rev v1.0..v1.1 calcs/hanger.sheaf`,
		Args: func(cmd *cobra.Command, args []string) error {
			revs, err := splitRevs(o.revs)
			if err != nil {
				return err
			}
			o.revs = revs
			switch {
			case len(revs) > 0 && len(args) != 1:
				return userErrorf("diff --rev takes one file (the sheet as it is named in the working copy), got %d", len(args))
			case len(revs) == 0 && len(args) != 2:
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
	f.StringArrayVar(&o.revs, "rev", nil, "compare FILE at this git revision with the working copy; given twice (or as A..B), two revisions")
	f.Float64Var(&o.rtol, "rtol", diff.DefaultRelTol, "relative tolerance below which a result counts as unchanged")
	f.BoolVar(&o.json, "json", false, "print the differences as JSON")
	f.BoolVar(&o.draft, "draft", false, "accept a new version with cells that cannot be computed (exit 0 or 1 instead of 2)")
	o.sheet.add(cmd, true)
	return cmd
}

// splitRevs splits A..B into two revisions and refuses more than two, an
// empty one, a symmetric difference A...B (a merge base is not a version of
// the file) and a revision that starts with '-' (git would take it for an
// option).
func splitRevs(in []string) ([]string, error) {
	var out []string
	for _, r := range in {
		if strings.Contains(r, "...") {
			return nil, userErrorf("--rev %q: give two revisions as A..B or --rev A --rev B; A...B (from a merge base) is not a version of the file", r)
		}
		if a, b, ok := strings.Cut(r, ".."); ok {
			if a == "" || b == "" {
				return nil, userErrorf("--rev %q: write both revisions, e.g. --rev HEAD~1..HEAD", r)
			}
			out = append(out, a, b)
			continue
		}
		out = append(out, r)
	}
	for _, r := range out {
		if strings.TrimSpace(r) == "" {
			return nil, userErrorf("--rev: a revision is empty; give one git understands, e.g. HEAD~1")
		}
		if strings.HasPrefix(r, "-") {
			return nil, userErrorf("--rev %q: a revision does not start with '-'", r)
		}
	}
	if len(out) > 2 {
		return nil, userErrorf("--rev given %d revisions; diff compares two versions: --rev A (with the working copy) or --rev A --rev B", len(out))
	}
	return out, nil
}

// diffSide is one version of the sheet to compare.
type diffSide struct {
	name string
	src  []byte
	opts []engine.Option // the loader of its templates
	srcs diag.Sources    // the files it read, for messages (nil: on disk)
}

func runDiff(a *app, o *diffOptions, args []string) error {
	if !(o.rtol >= 0) || o.rtol >= 1 {
		return userErrorf("--rtol %g: give a relative tolerance from 0 to below 1, e.g. 1e-6", o.rtol)
	}
	opts, err := o.sheet.options()
	if err != nil {
		return err
	}
	var old, cur *diffSide
	switch len(o.revs) {
	case 0:
		if old, err = fileSide(args[0]); err != nil {
			return err
		}
		if cur, err = fileSide(args[1]); err != nil {
			return err
		}
	case 1:
		if old, err = revSide(o.revs[0], args[0]); err != nil {
			return err
		}
		if cur, err = fileSide(args[0]); err != nil {
			return err
		}
	default:
		if old, err = revSide(o.revs[0], args[0]); err != nil {
			return err
		}
		if cur, err = revSide(o.revs[1], args[0]); err != nil {
			return err
		}
	}
	olds, err1 := compileReported(a, old.name, old.src, append(opts[:len(opts):len(opts)], old.opts...), old.srcs)
	news, err2 := compileReported(a, cur.name, cur.src, append(opts[:len(opts):len(opts)], cur.opts...), cur.srcs)
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
	r := diff.Compare(old.name, olds.Run(nil), cur.name, newRes, diff.Options{RelTol: o.rtol})
	var status error
	if n := newRes.Uncomputed(); n > 0 && !o.draft {
		status = &reportedError{fmt.Errorf("%s of %s could not be computed (--draft accepts it)", plural.Count(n, "cell"), cur.name), exitInput}
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

// fileSide reads the sheet at path from disk; its templates come from the
// files beside it.
func fileSide(path string) (*diffSide, error) {
	src, err := readUserFile(path, engine.DefaultMaxBytes)
	if err != nil {
		return nil, err
	}
	return &diffSide{name: path, src: src}, nil
}

// compileReported compiles src; its diagnostics come back as a
// *sheetError, with the sources in srcs (the files a git revision gave)
// for their snippets.
func compileReported(_ *app, name string, src []byte, opts []engine.Option, srcs diag.Sources) (*engine.Sheet, error) {
	s, err := engine.Compile(name, src, opts...)
	if err == nil {
		return s, nil
	}
	var list diag.List
	if errors.As(err, &list) {
		return nil, &sheetError{list: list, name: name, src: src, srcs: srcs} // rendered on stderr, or as JSON with --json
	}
	return nil, &inputError{err}
}

// revSide reads file as committed at git revision rev, with the templates
// of that revision (gitLoader). It is shown as "REV:path/in/repo". It runs
// the git binary: the repository root comes from `git rev-parse
// --show-toplevel` in the file's directory.
func revSide(rev, file string) (*diffSide, error) {
	abs, err := filepath.Abs(file)
	if err != nil {
		return nil, &inputError{err}
	}
	if real, err := filepath.EvalSymlinks(abs); err == nil {
		abs = real
	} else if dir, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
		abs = filepath.Join(dir, filepath.Base(abs)) // deleted from the working copy: its folder still places it
	}
	top, err := git(filepath.Dir(abs), "rev-parse", "--show-toplevel")
	if err != nil {
		var nf *exec.Error
		if errors.As(err, &nf) {
			return nil, userErrorf("--rev needs git, which was not found: %v; install git or compare two files with `sheaf diff OLD NEW`", err)
		}
		return nil, userErrorf("%s is not inside a git repository (%v); commit it first, or compare two files with `sheaf diff OLD NEW`", file, err)
	}
	root := strings.TrimSpace(string(top))
	if real, err := filepath.EvalSymlinks(root); err == nil {
		root = real
	}
	rel, err := filepath.Rel(root, abs)
	if err != nil || rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return nil, userErrorf("%s is not inside the git repository at %s", file, root)
	}
	rel = filepath.ToSlash(rel)
	tree, err := readGitTree(root, rev)
	if err != nil {
		return nil, userErrorf("git cannot show %s at revision %q: %v; list the revisions of the file with `git log -- %s`", rel, rev, err, file)
	}
	key, e, found, out, _, err := tree.resolve(rel)
	switch {
	case err != nil:
		return nil, userErrorf("git cannot show %s at revision %q: %v", rel, rev, err)
	case out:
		return nil, userErrorf("git cannot show %s at revision %q: a symbolic link on the path leads outside the repository", rel, rev)
	case !found:
		return nil, userErrorf("git cannot show %s at revision %q: the file is not in that revision; list the revisions of the file with `git log -- %s`", rel, rev, file)
	case !e.isFile():
		return nil, userErrorf("git cannot show %s at revision %q: it is %s there, not a sheet", rel, rev, map[bool]string{true: "a folder", false: "a submodule or special entry"}[e.isDir()])
	case e.size > engine.DefaultMaxBytes:
		return nil, userErrorf("%s:%s is too large: %d bytes, the limit is %d", rev, rel, e.size, engine.DefaultMaxBytes)
	}
	src, err := tree.blob(e.oid)
	if err != nil {
		return nil, userErrorf("git cannot show %s at revision %q: %v", rel, rev, err)
	}
	ld := newGitLoader(tree, key, engine.DefaultMaxBytes)
	name := rev + ":" + rel
	ld.srcs[name] = src
	return &diffSide{name: name, src: src, opts: []engine.Option{engine.WithLoader(ld)}, srcs: ld.srcs}, nil
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
