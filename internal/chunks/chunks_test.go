package chunks

import (
	"os"
	"path/filepath"
	"testing"
)

func TestRead(t *testing.T) {
	path := filepath.Join(t.TempDir(), "c.chunks")
	data := "=== one\na = 1\nb = x  ⟵ want \"undefined name `x`\"\n=== two\nc = \\x01\n"
	if err := os.WriteFile(path, []byte(data), 0o644); err != nil {
		t.Fatal(err)
	}
	cs := Read(t, path)
	if len(cs) != 2 || cs[0].Name != "one" || cs[1].Name != "two" {
		t.Fatalf("cases %+v", cs)
	}
	if got := string(cs[0].Src); got != "a = 1\nb = x\n" {
		t.Errorf("src %q", got)
	}
	if re := cs[0].Wants[2]; re == nil || !re.MatchString("undefined name `x`") {
		t.Errorf("want on line 2: %v", cs[0].Wants)
	}
	if got := string(cs[1].Src); got != "c = \x01\n" || cs[1].Line != 4 {
		t.Errorf("case two: %q at line %d", got, cs[1].Line)
	}
}
