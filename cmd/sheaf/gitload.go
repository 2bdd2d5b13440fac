package main

import (
	"bytes"
	"fmt"
	"path"
	"slices"
	"strconv"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// gitTree is the tree of one git revision, listed once (`git ls-tree -r -t
// -l`), so that a sheet and every template it uses are read as they were
// committed: paths, sizes and links come from the listing, contents from
// `git cat-file blob`. Nothing of the working copy is read.
type gitTree struct {
	rev     string // as the user wrote it
	commit  string // the commit it names
	top     string // the repository root on disk
	entries map[string]gitEntry
}

// gitEntry is one path of the tree.
type gitEntry struct {
	mode string // 100644, 100755 (files), 120000 (link), 040000 (folder), 160000 (submodule)
	oid  string
	size int64
}

func (e gitEntry) isDir() bool  { return e.mode == "040000" }
func (e gitEntry) isLink() bool { return e.mode == "120000" }
func (e gitEntry) isFile() bool { return e.mode == "100644" || e.mode == "100755" }

// readGitTree lists the tree of rev in the repository at top.
func readGitTree(top, rev string) (*gitTree, error) {
	id, err := git(top, "rev-parse", "--verify", "--end-of-options", rev+"^{commit}")
	if err != nil {
		return nil, err
	}
	commit := strings.TrimSpace(string(id))
	out, err := git(top, "ls-tree", "-r", "-t", "-l", "-z", "--full-tree", commit)
	if err != nil {
		return nil, err
	}
	t := &gitTree{rev: rev, commit: commit, top: top, entries: map[string]gitEntry{"": {mode: "040000"}}}
	for _, rec := range bytes.Split(out, []byte{0}) {
		// <mode> SP <type> SP <object> SP+ <size> TAB <path>
		meta, p, ok := bytes.Cut(rec, []byte{'\t'})
		if !ok {
			continue
		}
		f := strings.Fields(string(meta))
		if len(f) != 4 {
			continue
		}
		e := gitEntry{mode: f[0], oid: f[2]}
		if f[0] == "40000" {
			e.mode = "040000"
		}
		e.size, _ = strconv.ParseInt(f[3], 10, 64)
		t.entries[string(p)] = e
	}
	return t, nil
}

// blob returns the content of the object oid.
func (t *gitTree) blob(oid string) ([]byte, error) {
	return git(t.top, "cat-file", "blob", oid)
}

// maxLinks bounds the symbolic links followed to resolve one path, as an
// operating system does (Linux: 40).
const maxLinks = 40

// resolve follows the symbolic links on the slash path p (from the
// repository root, cleaned) and returns the path it leads to. out is true
// when a link leads outside the repository; e is the entry reached, and
// found false when a step is missing (then res is the path of the missing
// step, and noDir tells that a folder on the way is missing, not the last
// step).
func (t *gitTree) resolve(p string) (res string, e gitEntry, found, out, noDir bool, err error) {
	hops := 0
	parts := strings.Split(p, "/")
	cur := ""
	for i := 0; i < len(parts); i++ {
		if parts[i] == "" || parts[i] == "." {
			continue
		}
		next := path.Join(cur, parts[i])
		ent, ok := t.entries[next]
		if !ok {
			return next, gitEntry{}, false, false, i < len(parts)-1, nil
		}
		if ent.isLink() {
			hops++
			if hops > maxLinks {
				return next, ent, true, false, false, fmt.Errorf("more than %d symbolic links", maxLinks)
			}
			target, err := t.blob(ent.oid)
			if err != nil {
				return next, ent, true, false, false, err
			}
			tg := string(target)
			if strings.HasPrefix(tg, "/") {
				return next, ent, true, true, false, nil
			}
			joined := path.Join(cur, tg)
			if joined == ".." || strings.HasPrefix(joined, "../") {
				return next, ent, true, true, false, nil
			}
			rest := append(strings.Split(joined, "/"), parts[i+1:]...)
			parts, i, cur = rest, -1, ""
			continue
		}
		if i < len(parts)-1 && !ent.isDir() {
			return next, gitEntry{}, false, false, true, nil // a file where a folder should be
		}
		cur = next
	}
	return cur, t.entries[cur], true, false, false, nil
}

// inside reports whether the slash path p lies in or below dir ("" is the
// repository root).
func inside(dir, p string) bool {
	if dir == "" {
		return p != ".." && !strings.HasPrefix(p, "../")
	}
	return p == dir || strings.HasPrefix(p, dir+"/")
}

// gitLoader reads the templates of one sheet from a gitTree, under the
// rules of the working copy's loader (SPEC.md §2): the project root is the
// nearest folder above the sheet that holds a sheaf.root file at that
// revision, else the repository root; no `..` past it, no link out of it,
// only regular files within the size limit. Keys are paths from the
// repository root with links resolved; shown names are REV:path.
type gitLoader struct {
	t        *gitTree
	sheet    string // key of the checked sheet
	root     string
	maxBytes int64
	srcs     diag.Sources // every file read, by shown name, for messages
}

func newGitLoader(t *gitTree, sheetPath string, maxBytes int64) *gitLoader {
	l := &gitLoader{t: t, sheet: sheetPath, maxBytes: maxBytes, srcs: diag.Sources{}}
	for d := path.Dir(sheetPath); ; d = path.Dir(d) {
		if d == "." {
			d = ""
		}
		if e, ok := t.entries[path.Join(d, check.RootMarker)]; ok && !e.isDir() {
			l.root = d
			break
		}
		if d == "" {
			break
		}
	}
	return l
}

func (l *gitLoader) shown(key string) string { return l.t.rev + ":" + key }

// SheetKey implements check.Loader.
func (l *gitLoader) SheetKey() string { return l.sheet }

// Resolve implements check.Loader.
func (l *gitLoader) Resolve(from, written string) (string, string, error) {
	joined := path.Join(path.Dir(from), written)
	show := l.shown(joined)
	fail := func(k check.LoadErrorKind) *check.LoadError { return &check.LoadError{Kind: k, Shown: show} }
	if !inside(l.root, joined) {
		return "", "", fail(check.LeavesRoot)
	}
	res, e, found, out, noDir, err := l.t.resolve(joined)
	switch {
	case err != nil:
		le := fail(check.Unreadable)
		le.Err = err
		return "", "", le
	case out:
		return "", "", fail(check.LinkLeaves)
	case !found:
		le := fail(check.NotFound)
		dir := path.Dir(res)
		if dir == "." {
			dir = ""
		}
		if d, ok := l.t.entries[dir]; noDir || !ok || !d.isDir() {
			le.NoFolder = true
			return "", "", le
		}
		for p, ent := range l.t.entries {
			pd := path.Dir(p)
			if pd == "." {
				pd = ""
			}
			if pd == dir && ent.isFile() && strings.HasSuffix(p, ".sheaf") {
				le.Names = append(le.Names, path.Base(p))
			}
		}
		slices.Sort(le.Names)
		return "", "", le
	}
	if !inside(l.root, res) {
		return "", "", fail(check.LinkLeaves)
	}
	switch {
	case e.isDir():
		return "", "", fail(check.IsFolder)
	case !e.isFile():
		le := fail(check.NotRegular)
		le.What = "a submodule"
		return "", "", le
	}
	return res, l.shown(res), nil
}

// Read implements check.Loader: the size comes from the listing, so an
// oversize file is refused before it is read.
func (l *gitLoader) Read(key string) ([]byte, error) {
	e := l.t.entries[key]
	if e.size > l.maxBytes {
		return nil, &check.LoadError{Kind: check.TooLarge, Shown: l.shown(key), Size: e.size, Limit: l.maxBytes}
	}
	src, err := l.t.blob(e.oid)
	if err != nil {
		return nil, &check.LoadError{Kind: check.Unreadable, Shown: l.shown(key), Err: err}
	}
	l.srcs[l.shown(key)] = src
	return src, nil
}

var _ engine.Loader = (*gitLoader)(nil)
