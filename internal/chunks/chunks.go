package chunks

import (
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// Case is one chunk: a sheet and the errors expected on its lines.
type Case struct {
	Name  string
	Line  int // line of the "===" separator in the chunk file
	Src   []byte
	Wants map[int]*regexp.Regexp // sheet line -> expected summary
}

// WantMark ends a source line with the error expected on it. "⟵" cannot be
// mistaken for sheet text in a case because Read strips it first.
const WantMark = "  ⟵ want "

var hexEscape = regexp.MustCompile(`\\x[0-9a-fA-F]{2}`)

// Read splits a chunk file: each case starts with a line "=== name"; the
// expected error is written on the offending line as `  ⟵ want "regexp"`
// (the pattern is taken literally between the quotes); `\xNN` stands for
// the byte NN (to write invalid UTF-8 and control characters).
func Read(t testing.TB, path string) []Case {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var cases []Case
	var cur *Case
	var body []string
	flush := func() {
		if cur != nil {
			cur.Src = []byte(strings.Join(body, "\n") + "\n")
			cases = append(cases, *cur)
		}
	}
	for n, l := range strings.Split(strings.TrimSuffix(string(data), "\n"), "\n") {
		if name, ok := strings.CutPrefix(l, "=== "); ok {
			flush()
			cur = &Case{Name: name, Line: n + 1, Wants: map[int]*regexp.Regexp{}}
			body = nil
			continue
		}
		if cur == nil {
			t.Fatalf("%s:%d: text before the first === line", path, n+1)
		}
		if i := strings.Index(l, WantMark); i >= 0 {
			q := l[i+len(WantMark):]
			if len(q) < 2 || q[0] != '"' || q[len(q)-1] != '"' {
				t.Fatalf("%s:%d: want needs a pattern in double quotes", path, n+1)
			}
			cur.Wants[len(body)+1] = regexp.MustCompile(q[1 : len(q)-1])
			l = l[:i]
		}
		l = hexEscape.ReplaceAllStringFunc(l, func(s string) string {
			b, _ := strconv.ParseUint(s[2:], 16, 8)
			return string([]byte{byte(b)})
		})
		body = append(body, l)
	}
	flush()
	return cases
}
