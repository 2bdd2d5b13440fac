package catalogue

import (
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync"

	"github.com/sheafcalc/sheaf/engine/units"
)

// EnvDirs names the environment variable that lists the folders of a
// firm's own catalogue files (separated as in PATH).
const EnvDirs = "SHEAF_CATALOGUES"

// FileExt is the extension of catalogue files.
const FileExt = ".cat"

//go:embed data/*.cat
var shipped embed.FS

// Catalogue is a set of tables with one index per lookup.
type Catalogue struct {
	Tables []*Table
	index  map[string]map[string][]*Entry // namespace -> normalised key -> rows (bands)
	keys   map[string][]string            // namespace -> keys as written, in table order
}

// New indexes tables. A key may appear in one table only (bands of a
// banded kind are rows of one table).
func New(tables []*Table) (*Catalogue, error) {
	c := &Catalogue{index: map[string]map[string][]*Entry{}, keys: map[string][]string{}}
	if err := c.add(tables); err != nil {
		return nil, err
	}
	return c, nil
}

func (c *Catalogue) add(tables []*Table) error {
	var errs ErrorList
	for _, t := range tables {
		ns := t.Kind.NS
		if c.index[ns] == nil {
			c.index[ns] = map[string][]*Entry{}
		}
		local := map[string]bool{}
		for _, e := range t.Rows {
			n := Normalize(e.Key)
			if prev, ok := c.index[ns][n]; ok && !local[n] {
				p := prev[0]
				errs = append(errs, &Error{File: t.File, Line: e.Line, Col: 1,
					Msg:  fmt.Sprintf("%s %q is already in the catalogue (%s:%d)", ns, e.Key, p.Table.File, p.Line),
					Hint: "a catalogue file may add keys but not replace one; give the row a name of its own"})
				continue
			}
			if !local[n] {
				c.keys[ns] = append(c.keys[ns], e.Key)
			}
			local[n] = true
			c.index[ns][n] = append(c.index[ns][n], e)
		}
		c.Tables = append(c.Tables, t)
	}
	if len(errs) > 0 {
		return errs
	}
	return nil
}

// Keys returns the keys of a lookup, in table order.
func (c *Catalogue) Keys(ns string) []string { return c.keys[ns] }

// Find returns the rows of key in the lookup ns (one row, or the thickness
// bands of a grade). An unknown key is an error that names the nearest keys.
func (c *Catalogue) Find(ns, key string) ([]*Entry, error) {
	if rows, ok := c.index[ns][Normalize(key)]; ok {
		return rows, nil
	}
	msg := fmt.Sprintf("%s %q is not in the catalogue", ns, key)
	if near := c.nearest(ns, key); near != "" {
		return nil, errors.New(msg + "; " + near)
	}
	return nil, fmt.Errorf("%s; `sheaf funcs %s` lists the tables, and a firm may add its own (%s)", msg, ns, EnvDirs)
}

// nearest suggests keys for a miss: in the same series (the letters before
// the first digit, "HEB", "M", "CHS"), the sizes just below and above,
// comparing the numbers of the key in order (CHS 219.1x11 lies between
// CHS 219.1x10 and CHS 219.1x12.5); otherwise the nearest spelling.
func (c *Catalogue) nearest(ns, key string) string {
	series, size := splitKey(Normalize(key))
	if len(size) > 0 {
		below, above := "", ""
		var lo, hi []float64
		var prefixed []string // keys that begin with all the numbers given (C35 -> C35/45)
		for _, k := range c.keys[ns] {
			s, v := splitKey(Normalize(k))
			if s != series || len(v) == 0 {
				continue
			}
			if len(v) > len(size) && cmpSizes(v[:len(size)], size) == 0 {
				prefixed = append(prefixed, k)
			}
			if cmpSizes(v, size) <= 0 && (lo == nil || cmpSizes(v, lo) > 0) {
				lo, below = v, k
			}
			if cmpSizes(v, size) >= 0 && (hi == nil || cmpSizes(v, hi) < 0) {
				hi, above = v, k
			}
		}
		switch {
		case len(prefixed) == 1:
			return fmt.Sprintf("did you mean %q?", prefixed[0])
		case below != "" && above != "" && below != above:
			return fmt.Sprintf("the nearest sizes are %q and %q", below, above)
		case below != "":
			return fmt.Sprintf("did you mean %q?", below)
		case above != "":
			return fmt.Sprintf("did you mean %q?", above)
		}
	}
	if n := nearestSpelling(key, c.keys[ns]); n != "" {
		return fmt.Sprintf("did you mean %q?", n)
	}
	return ""
}

// splitKey returns the letters before the first digit of a normalised key
// and every number in it, in order.
func splitKey(n string) (string, []float64) {
	i := strings.IndexAny(n, "0123456789")
	if i < 0 {
		return n, nil
	}
	var nums []float64
	for j := i; j < len(n); {
		if n[j] < '0' || n[j] > '9' {
			j++
			continue
		}
		k := j
		for k < len(n) && (n[k] == '.' || (n[k] >= '0' && n[k] <= '9')) {
			k++
		}
		v, err := strconv.ParseFloat(strings.TrimRight(n[j:k], "."), 64)
		// After an X, a/b is a fraction of an inch (HSS6X6X5/16); elsewhere
		// the slash separates two numbers (C30/37).
		if j > 0 && n[j-1] == 'X' && k+1 < len(n) && n[k] == '/' && n[k+1] >= '0' && n[k+1] <= '9' {
			m := k + 1
			for m < len(n) && n[m] >= '0' && n[m] <= '9' {
				m++
			}
			if den, e2 := strconv.ParseFloat(n[k+1:m], 64); e2 == nil && den > 0 {
				v /= den
				k = m
			}
		}
		if err == nil {
			nums = append(nums, v)
		}
		j = k
	}
	return n[:i], nums
}

// cmpSizes compares the numbers of two keys in order; a key with fewer
// numbers sorts first when the common ones are equal.
func cmpSizes(a, b []float64) int {
	for i := range min(len(a), len(b)) {
		if a[i] != b[i] {
			if a[i] < b[i] {
				return -1
			}
			return 1
		}
	}
	return len(a) - len(b)
}

// Shipped is the catalogue embedded in the binary.
func Shipped() *Catalogue { return shippedOnce() }

var shippedOnce = sync.OnceValue(func() *Catalogue {
	tables, err := readFS(shipped, "data", "funcs/catalogue/data")
	if err == nil {
		var c *Catalogue
		if c, err = New(tables); err == nil {
			return c
		}
	}
	panic("catalogue: the shipped data files are broken (a test catches this): " + err.Error())
})

// readFS parses every catalogue file in dir of fsys, in name order; display
// is the folder shown before file names in messages.
func readFS(fsys fs.FS, dir, display string) ([]*Table, error) {
	names, err := fs.Glob(fsys, dir+"/*"+FileExt)
	if err != nil {
		return nil, err
	}
	slices.Sort(names)
	var all []*Table
	for _, n := range names {
		src, err := fs.ReadFile(fsys, n)
		if err != nil {
			return nil, err
		}
		t, err := Parse(filepath.Join(display, filepath.Base(n)), src)
		if err != nil {
			return nil, err
		}
		all = append(all, t...)
	}
	return all, nil
}

// Active is the catalogue lookups use: the shipped tables and, when
// SHEAF_CATALOGUES names folders, every *.cat file in them. It is read once
// per process; a broken firm file makes every lookup fail with its message.
func Active() (*Catalogue, error) { return activeOnce() }

var activeOnce = sync.OnceValues(func() (*Catalogue, error) {
	return WithDirs(filepath.SplitList(os.Getenv(EnvDirs)))
})

// WithDirs is the shipped catalogue plus the files of the given folders.
func WithDirs(dirs []string) (*Catalogue, error) {
	base := Shipped()
	var extra []*Table
	for _, d := range dirs {
		if d == "" {
			continue
		}
		if st, err := os.Stat(d); err != nil || !st.IsDir() {
			return nil, fmt.Errorf("catalogue folder %s (from %s) is not a folder that can be read", d, EnvDirs)
		}
		tables, err := readFS(os.DirFS(d), ".", d)
		if err != nil {
			var pe *fs.PathError
			if errors.As(err, &pe) {
				return nil, fmt.Errorf("catalogue folder %s (from %s): %v", d, EnvDirs, err)
			}
			return nil, err
		}
		extra = append(extra, tables...)
	}
	if len(extra) == 0 {
		return base, nil
	}
	c, err := New(base.Tables)
	if err != nil {
		return nil, err
	}
	if err := c.add(extra); err != nil {
		return nil, err
	}
	return c, nil
}

func nearestSpelling(key string, keys []string) string { return units.Nearest(key, keys) }
