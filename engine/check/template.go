package check

import (
	"fmt"
	"os"
	"path"
	"path/filepath"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// RootMarker is the file that marks the root of a project of sheets when
// the project is not a git repository (a `.git` entry marks it too).
const RootMarker = "sheaf.root"

// maxUseDepth limits how deeply templates may use templates. A chain this
// long is a mistake; refusing it also bounds the work a crafted project can
// cause.
const maxUseDepth = 32

// loader finds, reads and parses the template files of one check. It reads
// each file once (by its resolved absolute path) however often it is used,
// and keeps the chain of files being inlined to find loops.
//
// The project root is the nearest folder above the checked sheet that
// holds `.git` or a `sheaf.root` file, else the sheet's own folder. Template
// paths are relative to the sheet that writes them and must stay inside
// the root, both as written (no `..` past it) and after symbolic links are
// followed; absolute paths are refused. So a project of sheets can be
// moved, cloned or reviewed as a whole, and checking a sheet never reads a
// file outside it.
type loader struct {
	root     string                 // absolute, symbolic links resolved
	abs      map[*sheet.File]string // resolved absolute path of each file read
	byPath   map[string]*sheet.File // parsed files by resolved absolute path
	stack    []frame                // the chain of files being inlined; the sheet first
	maxBytes int
}

// frame is one file of the chain and the use that led to it (nil for the
// checked sheet).
type frame struct {
	path string
	file *sheet.File
	via  *sheet.Use
}

func newLoader(top *sheet.File, maxBytes int) *loader {
	p, err := filepath.Abs(top.Name)
	if err != nil {
		p = filepath.Clean(top.Name)
	}
	dir := filepath.Dir(p)
	if r, err := filepath.EvalSymlinks(dir); err == nil {
		dir = r
	}
	p = filepath.Join(dir, filepath.Base(p))
	if maxBytes <= 0 {
		maxBytes = sheet.DefaultMaxBytes
	}
	return &loader{
		root:     projectRoot(dir),
		abs:      map[*sheet.File]string{top: p},
		byPath:   map[string]*sheet.File{p: top},
		stack:    []frame{{path: p, file: top}},
		maxBytes: maxBytes,
	}
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

// open resolves the template of use u written in file from, reads and
// parses it (once per file), and pushes it on the chain; the caller pops it
// with done. Problems go to errs; the file is nil when it cannot be used.
func (l *loader) open(from *sheet.File, u *sheet.Use, errs *diag.List) *sheet.File {
	at := u.PathRange
	if at.Start.Line == 0 {
		at = u.Range
	}
	written := u.Path
	if filepath.IsAbs(written) || strings.HasPrefix(written, "/") || strings.HasPrefix(written, `\`) || filepath.VolumeName(written) != "" {
		errs.Errorf(at, "template paths are relative to the sheet that uses them, so that a project of sheets can be moved or cloned as a whole",
			"write the path from this sheet's folder, e.g. \"templates/"+filepath.Base(filepath.FromSlash(written))+"\"",
			"template path %q is absolute", written)
		return nil
	}
	if len(l.stack) > maxUseDepth {
		errs.Errorf(at, fmt.Sprintf("templates may use templates at most %d levels deep", maxUseDepth),
			"use the inner templates directly from this sheet", "templates nest too deeply")
		return nil
	}
	fromPath := l.abs[from]
	joined := filepath.Join(filepath.Dir(fromPath), filepath.FromSlash(written))
	show := filepath.Join(filepath.Dir(from.Name), filepath.FromSlash(written))
	if !within(l.root, joined) {
		errs.Errorf(at, "a template must lie inside the project: the nearest folder above the sheet that holds `.git` or a `"+RootMarker+"` file",
			"copy the template into the project, or put a `"+RootMarker+"` file in a folder that holds both sheets",
			"template path %q leaves the project root", written)
		return nil
	}
	fi, err := os.Stat(joined)
	if err != nil {
		if os.IsNotExist(err) {
			l.missing(u, at, show, joined, errs)
		} else {
			errs.Errorf(at, "looked for "+filepath.ToSlash(show), "check the file's permissions", "cannot read template %q", written)
		}
		return nil
	}
	resolved, err := filepath.EvalSymlinks(joined)
	if err != nil {
		errs.Errorf(at, "looked for "+filepath.ToSlash(show), "check the file's links and permissions", "cannot read template %q", written)
		return nil
	}
	if !within(l.root, resolved) {
		errs.Errorf(at, "the path is inside the project, but a symbolic link on it leads outside the project root",
			"copy the template into the project instead of linking to it",
			"template path %q leads outside the project root", written)
		return nil
	}
	if fi.IsDir() {
		errs.Errorf(at, filepath.ToSlash(show)+" is a folder", "name a .sheaf file in it", "template path %q is a folder, not a sheet", written)
		return nil
	}
	if loop := l.loop(resolved, u); loop != nil {
		errs.Add(loop)
		return nil
	}
	f := l.byPath[resolved]
	if f == nil {
		if fi.Size() > int64(l.maxBytes) {
			errs.Errorf(at, fmt.Sprintf("%s has %d bytes, the limit is %d", filepath.ToSlash(show), fi.Size(), l.maxBytes),
				"split the template, or raise the limit", "template %q is too large", written)
			return nil
		}
		src, err := os.ReadFile(resolved)
		if err != nil {
			errs.Errorf(at, "looked for "+filepath.ToSlash(show), "check the file's permissions", "cannot read template %q", written)
			return nil
		}
		var perrs diag.List
		f, perrs = sheet.Parse(show, src, sheet.MaxBytes(l.maxBytes))
		*errs = append(*errs, perrs...)
		if f == nil {
			return nil
		}
		l.byPath[resolved] = f
		l.abs[f] = resolved
	}
	l.stack = append(l.stack, frame{path: resolved, file: f, via: u})
	return f
}

// done pops the file open pushed.
func (l *loader) done() { l.stack = l.stack[:len(l.stack)-1] }

// loop reports a use of a file that is already being inlined: the chain
// from that file back to itself, every use with its position. The message
// sits at the first use of the loop, the one nearest to the checked sheet.
func (l *loader) loop(target string, u *sheet.Use) *diag.Diagnostic {
	m := slices.IndexFunc(l.stack, func(f frame) bool { return f.path == target })
	if m < 0 {
		return nil
	}
	// Edges of the loop: frame m uses frame m+1 ... uses frame k, which
	// uses frame m through u.
	type edge struct {
		in  *sheet.File
		use *sheet.Use
	}
	var edges []edge
	for i := m + 1; i < len(l.stack); i++ {
		edges = append(edges, edge{l.stack[i-1].file, l.stack[i].via})
	}
	edges = append(edges, edge{l.stack[len(l.stack)-1].file, u})
	names := []string{filepath.ToSlash(l.stack[m].file.Name)}
	var where []string
	for i, e := range edges {
		next := l.stack[m].file
		if i+1 < len(edges) {
			next = l.stack[m+i+1].file
		}
		names = append(names, filepath.ToSlash(next.Name))
		where = append(where, e.use.PathRange.Start.String()+" uses "+filepath.ToSlash(next.Name))
	}
	first := edges[0].use
	summary := "templates use one another in a loop: " + strings.Join(names, " uses ")
	if len(edges) == 1 {
		summary = filepath.ToSlash(names[0]) + " uses itself as a template"
	}
	return &diag.Diagnostic{Range: first.PathRange, Summary: summary,
		Detail: "the uses of the loop: " + strings.Join(where, "; "),
		Hint:   "a template cannot use, directly or through others, a sheet that uses it; move the cells both need into a template of their own"}
}

// missing reports a template file that does not exist, suggesting the
// nearest .sheaf file in the same folder.
func (l *loader) missing(u *sheet.Use, at diag.Range, show, joined string, errs *diag.List) {
	dir := filepath.Dir(joined)
	entries, err := os.ReadDir(dir)
	detail := "looked for " + filepath.ToSlash(show) + "; template paths are relative to the sheet that uses them"
	if err != nil {
		errs.Errorf(at, detail, "the folder "+filepath.ToSlash(filepath.Dir(show))+" does not exist", "template file %q not found", u.Path)
		return
	}
	var names []string
	for _, e := range entries {
		if !e.IsDir() && strings.HasSuffix(e.Name(), ".sheaf") {
			names = append(names, e.Name())
		}
	}
	hint := "no .sheaf file is in " + filepath.ToSlash(filepath.Dir(show))
	if s := diag.Nearest(filepath.Base(joined), names); s != "" {
		hint = fmt.Sprintf("did you mean %q?", path.Join(path.Dir(u.Path), s))
	} else if len(names) > 0 {
		if len(names) > 6 {
			names = append(names[:6], "...")
		}
		hint = "the .sheaf files there are: " + strings.Join(names, ", ")
	}
	errs.Errorf(at, detail, hint, "template file %q not found", u.Path)
}
