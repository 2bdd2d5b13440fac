package report

import (
	"io/fs"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheafcalc/sheaf/engine"
)

// TestEverySheetOfTheRepository renders every sheet under the repository
// that loads (fixtures of other packages included, with their odd
// corners: failed cells, templates, lists, US units), so that no sheet can
// make the report panic or leave out its caution.
func TestEverySheetOfTheRepository(t *testing.T) {
	n := 0
	err := filepath.WalkDir("../../..", func(path string, e fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if e.IsDir() && strings.HasPrefix(e.Name(), ".") && path != "../../.." {
			return filepath.SkipDir
		}
		if e.IsDir() || filepath.Ext(path) != ".sheaf" {
			return nil
		}
		s, err := engine.Load(path)
		if err != nil {
			return nil // a sheet with errors has no report; sheaf report shows its diagnostics
		}
		n++
		html := Render(s, s.Run(nil), testOptions)
		if !strings.Contains(html, engine.Caution) || !strings.HasSuffix(html, "</html>\n") {
			t.Errorf("%s: incomplete report", path)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if n < 10 {
		t.Errorf("only %d sheets loaded", n)
	}
	t.Logf("%d sheets rendered", n)
}
