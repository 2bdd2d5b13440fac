package check

import (
	"errors"
	"fmt"
	"path"
	"path/filepath"
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/sheet"
)

// maxUseDepth limits how deeply templates may use templates. A chain this
// long is a mistake; refusing it also bounds the work a crafted project can
// cause.
const maxUseDepth = 32

// Loader finds and reads the templates a sheet uses. The checker never
// opens a file itself: the caller gives it a loader for the checked sheet
// (Options.Loader), such as the files of the working copy (NewFileLoader,
// the default) or the files of a git revision. The loader decides which
// file a `use` path names and whether it may be read (SPEC.md §2: inside
// the project root, no link out of it); the checker refuses absolute paths,
// finds loops, bounds the depth and parses each file once.
type Loader interface {
	// SheetKey returns the key of the checked sheet: the key that a
	// template path leading back to the sheet resolves to.
	SheetKey() string
	// Resolve returns the key and the shown name of the file that the file
	// with key from writes as path (slash-separated, relative) in a use
	// line. Equal keys mean one file: it is read once, and a key met again
	// on the chain of uses is a loop. The shown name appears in positions.
	// A refusal is a *LoadError.
	Resolve(from, path string) (key, name string, err error)
	// Read returns the text of the file with the given key, which Resolve
	// returned. A refusal (too large, not a regular file) is a *LoadError.
	Read(key string) ([]byte, error)
}

// LoadErrorKind says why a loader refused a template path.
type LoadErrorKind int

// Kinds of LoadError.
const (
	Unreadable LoadErrorKind = iota // Err says why
	NotFound                        // Names: the .sheaf files of its folder; NoFolder: the folder is missing
	LeavesRoot                      // `..` steps lead out of the project root
	LinkLeaves                      // a symbolic link on the path leads out of the project root
	IsFolder                        // the path names a folder
	NotRegular                      // a named pipe, a device, ...: What names it
	TooLarge                        // Size bytes, above Limit
)

// LoadError is a loader's refusal of a template path; the checker reports
// it at the path of the use line, with the wording of SPEC.md §2, the same
// for every loader.
type LoadError struct {
	Kind        LoadErrorKind
	Shown       string   // the template's path as shown in messages
	Names       []string // NotFound: the .sheaf files in the template's folder
	NoFolder    bool     // NotFound: the folder itself does not exist
	What        string   // NotRegular: "a named pipe (FIFO)", "a device", ...
	Size, Limit int64    // TooLarge
	Err         error    // Unreadable: the cause
}

func (e *LoadError) Error() string {
	switch e.Kind {
	case NotFound:
		return e.Shown + " not found"
	case LeavesRoot, LinkLeaves:
		return e.Shown + " leaves the project root"
	case IsFolder:
		return e.Shown + " is a folder"
	case NotRegular:
		return e.Shown + " is " + e.What
	case TooLarge:
		return fmt.Sprintf("%s has %d bytes, the limit is %d", e.Shown, e.Size, e.Limit)
	}
	if e.Err != nil {
		return e.Shown + ": " + e.Err.Error()
	}
	return "cannot read " + e.Shown
}

func (e *LoadError) Unwrap() error { return e.Err }

// loader reads the template files of one check through the caller's
// Loader. It parses each file once (by its key) however often it is used,
// and keeps the chain of files being inlined to find loops.
type loader struct {
	src      Loader
	key      map[*sheet.File]string // key of each file read
	byKey    map[string]*sheet.File // parsed files by key
	stack    []frame                // the chain of files being inlined; the sheet first
	maxBytes int
}

// frame is one file of the chain and the use that led to it (nil for the
// checked sheet).
type frame struct {
	key  string
	file *sheet.File
	via  *sheet.Use
}

func newLoader(top *sheet.File, opt Options) *loader {
	maxBytes := opt.MaxBytes
	if maxBytes <= 0 {
		maxBytes = sheet.DefaultMaxBytes
	}
	src := opt.Loader
	if src == nil {
		src = NewFileLoader(top.Name, maxBytes)
	}
	k := src.SheetKey()
	return &loader{
		src:      src,
		key:      map[*sheet.File]string{top: k},
		byKey:    map[string]*sheet.File{k: top},
		stack:    []frame{{key: k, file: top}},
		maxBytes: maxBytes,
	}
}

// open resolves the template of use u written in file from, reads and
// parses it (once per file), and pushes it on the chain; the caller pops it
// with done. Problems go to errs; the file is nil when it cannot be used.
func (l *loader) open(from *sheet.File, u *sheet.Use, errs *diag.List) *sheet.File {
	at := u.PathRange
	if at.Start().Line == 0 {
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
	key, name, err := l.src.Resolve(l.key[from], written)
	if err != nil {
		l.refused(err, u, at, errs)
		return nil
	}
	if loop := l.loop(key, u); loop != nil {
		errs.Add(loop)
		return nil
	}
	f := l.byKey[key]
	if f == nil {
		src, err := l.src.Read(key)
		if err != nil {
			l.refused(err, u, at, errs)
			return nil
		}
		var perrs diag.List
		f, perrs = sheet.Parse(name, src, sheet.MaxBytes(l.maxBytes))
		*errs = append(*errs, perrs...)
		if f == nil {
			return nil
		}
		l.byKey[key] = f
		l.key[f] = key
	}
	l.stack = append(l.stack, frame{key: key, file: f, via: u})
	return f
}

// done pops the file open pushed.
func (l *loader) done() { l.stack = l.stack[:len(l.stack)-1] }

// refused reports a loader's refusal at the path of u.
func (l *loader) refused(err error, u *sheet.Use, at diag.Range, errs *diag.List) {
	written := u.Path
	var le *LoadError
	if !errors.As(err, &le) {
		errs.Errorf(at, err.Error(), "check the file's permissions", "cannot read template %q", written)
		return
	}
	show := filepath.ToSlash(le.Shown)
	switch le.Kind {
	case NotFound:
		detail := "looked for " + show + "; template paths are relative to the sheet that uses them"
		if le.NoFolder {
			errs.Errorf(at, detail, "the folder "+path.Dir(show)+" does not exist", "template file %q not found", written)
			return
		}
		hint := "no .sheaf file is in " + path.Dir(show)
		names := le.Names
		if s := diag.Nearest(path.Base(show), names); s != "" {
			hint = fmt.Sprintf("did you mean %q?", path.Join(path.Dir(written), s))
		} else if len(names) > 0 {
			if len(names) > 6 {
				names = append(names[:6:6], "...")
			}
			hint = "the .sheaf files there are: " + strings.Join(names, ", ")
		}
		errs.Errorf(at, detail, hint, "template file %q not found", written)
	case LeavesRoot:
		errs.Errorf(at, "a template must lie inside the project: the nearest folder above the sheet that holds `.git` or a `"+RootMarker+"` file",
			"copy the template into the project, or put a `"+RootMarker+"` file in a folder that holds both sheets",
			"template path %q leaves the project root", written)
	case LinkLeaves:
		errs.Errorf(at, "the path is inside the project, but a symbolic link on it leads outside the project root",
			"copy the template into the project instead of linking to it",
			"template path %q leads outside the project root", written)
	case IsFolder:
		errs.Errorf(at, show+" is a folder", "name a .sheaf file in it", "template path %q is a folder, not a sheet", written)
	case NotRegular:
		errs.Errorf(at, show+" is "+le.What+"; only a regular file is read, so that checking never waits on a pipe or reads a device without end",
			"name the .sheaf file itself", "template path %q is %s, not a sheet", written, le.What)
	case TooLarge:
		errs.Errorf(at, fmt.Sprintf("%s has %d bytes, the limit is %d", show, le.Size, le.Limit),
			"split the template, or raise the limit", "template %q is too large", written)
	default:
		detail := "looked for " + show
		if le.Err != nil {
			detail += ": " + le.Err.Error()
		}
		errs.Errorf(at, detail, "check the file's links and permissions", "cannot read template %q", written)
	}
}

// loop reports a use of a file that is already being inlined: the chain
// from that file back to itself, every use with its position. The message
// sits at the first use of the loop, the one nearest to the checked sheet.
func (l *loader) loop(target string, u *sheet.Use) *diag.Diagnostic {
	m := slices.IndexFunc(l.stack, func(f frame) bool { return f.key == target })
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
		where = append(where, e.use.PathRange.Start().String()+" uses "+filepath.ToSlash(next.Name))
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
