package sheet

import (
	"os"
	"strconv"
	"strings"
	"testing"
)

// readSeed reads a fuzz corpus file ("go test fuzz v1" then one []byte
// literal) and returns its bytes.
func readSeed(t *testing.T, path string) []byte {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.SplitN(string(data), "\n", 2)
	if len(lines) != 2 || lines[0] != "go test fuzz v1" {
		t.Fatalf("%s: not a fuzz corpus file", path)
	}
	lit := strings.TrimSpace(lines[1])
	inner, ok := strings.CutPrefix(lit, "[]byte(")
	if !ok || !strings.HasSuffix(inner, ")") {
		t.Fatalf("%s: want one []byte value", path)
	}
	s, err := strconv.Unquote(strings.TrimSuffix(inner, ")"))
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return []byte(s)
}
