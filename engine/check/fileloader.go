package check

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/sheafcalc/sheaf/engine/sheet"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// RootMarker is the file that marks the root of a project of sheets when
// the project is not a git repository (a `.git` entry marks it too).
const RootMarker = "sheaf.root"

// FileLoader is the Loader of the files on disk (the working copy). Keys
// are absolute paths with every symbolic link resolved; shown names are
// the template paths joined to the folder of the sheet as it was named.
//
// The project root is the nearest folder above the checked sheet that
// holds `.git` or a `sheaf.root` file, else the sheet's own folder. Template
// paths must stay inside the root, both as written (no `..` past it) and
// after symbolic links are followed. Only regular files are read, each
// with its size checked first (internal/userfile). So a project of sheets
// can be moved, cloned or reviewed as a whole, and checking a sheet never
// reads a file outside it, waits on a pipe or reads a device.
type FileLoader struct {
	root     string            // absolute, symbolic links resolved
	sheet    string            // key of the checked sheet
	shown    map[string]string // shown name of each key resolved
	maxBytes int64
}

// NewFileLoader returns the loader of the templates of the sheet named
// name on disk, reading files of at most maxBytes bytes (0 or less: the
// default limit of a sheet).
func NewFileLoader(name string, maxBytes int) *FileLoader {
	p, err := filepath.Abs(name)
	if err != nil {
		p = filepath.Clean(name)
	}
	dir := filepath.Dir(p)
	if r, err := filepath.EvalSymlinks(dir); err == nil {
		dir = r
	}
	p = filepath.Join(dir, filepath.Base(p))
	if maxBytes <= 0 {
		maxBytes = sheet.DefaultMaxBytes
	}
	return &FileLoader{root: projectRoot(dir), sheet: p, shown: map[string]string{p: name}, maxBytes: int64(maxBytes)}
}

// Root returns the project root (absolute, links resolved).
func (l *FileLoader) Root() string { return l.root }

// SheetKey implements Loader.
func (l *FileLoader) SheetKey() string { return l.sheet }

// Resolve implements Loader.
func (l *FileLoader) Resolve(from, written string) (string, string, error) {
	joined := filepath.Join(filepath.Dir(from), filepath.FromSlash(written))
	show := filepath.Join(filepath.Dir(l.shown[from]), filepath.FromSlash(written))
	fail := func(k LoadErrorKind) *LoadError { return &LoadError{Kind: k, Shown: show} }
	if !within(l.root, joined) {
		return "", "", fail(LeavesRoot)
	}
	fi, err := os.Stat(joined)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return "", "", l.missing(show, joined)
		}
		e := fail(Unreadable)
		e.Err = err
		return "", "", e
	}
	resolved, err := filepath.EvalSymlinks(joined)
	if err != nil {
		e := fail(Unreadable)
		e.Err = err
		return "", "", e
	}
	if !within(l.root, resolved) {
		return "", "", fail(LinkLeaves)
	}
	if fi.IsDir() {
		return "", "", fail(IsFolder)
	}
	if !fi.Mode().IsRegular() {
		e := fail(NotRegular)
		e.What = userfile.Describe(fi.Mode())
		return "", "", e
	}
	if _, ok := l.shown[resolved]; !ok {
		l.shown[resolved] = show
	}
	return resolved, l.shown[resolved], nil
}

// Read implements Loader: the file is read only when it is a regular file
// within the size limit.
func (l *FileLoader) Read(key string) ([]byte, error) {
	src, err := userfile.ReadFile(key, l.maxBytes)
	if err == nil {
		return src, nil
	}
	e := &LoadError{Shown: l.shown[key], Err: err}
	var tl *userfile.TooLargeError
	var nr *userfile.NotRegularError
	switch {
	case errors.As(err, &tl):
		e.Kind, e.Size, e.Limit = TooLarge, tl.Size, tl.Limit
	case errors.As(err, &nr):
		e.Kind, e.What = NotRegular, userfile.Describe(nr.Mode)
		if nr.Mode.IsDir() {
			e.Kind = IsFolder
		}
	}
	return nil, e
}

// missing describes a template file that does not exist, with the .sheaf
// files of its folder for a did-you-mean hint.
func (l *FileLoader) missing(show, joined string) *LoadError {
	e := &LoadError{Kind: NotFound, Shown: show}
	entries, err := os.ReadDir(filepath.Dir(joined))
	if err != nil {
		e.NoFolder = true
		return e
	}
	for _, d := range entries {
		if !d.IsDir() && strings.HasSuffix(d.Name(), ".sheaf") {
			e.Names = append(e.Names, d.Name())
		}
	}
	return e
}

// projectRoot returns the nearest folder from dir upwards that holds `.git`
// (a folder, or a file in a linked work tree) or a sheaf.root file; dir
// itself when there is none.
func projectRoot(dir string) string {
	for d := dir; ; {
		if _, err := os.Lstat(filepath.Join(d, ".git")); err == nil {
			return d
		}
		if fi, err := os.Stat(filepath.Join(d, RootMarker)); err == nil && !fi.IsDir() {
			return d
		}
		up := filepath.Dir(d)
		if up == d {
			return dir
		}
		d = up
	}
}

// within reports whether p lies in or below dir (both cleaned, absolute).
func within(dir, p string) bool {
	rel, err := filepath.Rel(dir, p)
	if err != nil {
		return false
	}
	return rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator)) && !filepath.IsAbs(rel)
}
