package sheet

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// specBlocks returns the ```sheaf blocks of SPEC.md.
func specBlocks(t *testing.T) []string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("..", "..", "SPEC.md"))
	if err != nil {
		t.Fatal(err)
	}
	var blocks []string
	rest := string(data)
	for {
		_, after, ok := strings.Cut(rest, "```sheaf\n")
		if !ok {
			break
		}
		block, tail, ok := strings.Cut(after, "```\n")
		if !ok {
			t.Fatal("unclosed ```sheaf block in SPEC.md")
		}
		blocks = append(blocks, block)
		rest = tail
	}
	return blocks
}

// TestSpecExamples parses every sheet example of SPEC.md: none may have a
// syntax error, each must survive the round trip, and the complete sheet at
// the end must already be in canonical layout (the spec shows what fmt
// writes).
func TestSpecExamples(t *testing.T) {
	blocks := specBlocks(t)
	if len(blocks) < 5 {
		t.Fatalf("found %d sheaf blocks in SPEC.md", len(blocks))
	}
	for i, b := range blocks {
		f, errs := Parse("SPEC.md", []byte(b))
		if len(errs) > 0 {
			t.Fatalf("block %d: %v", i+1, errs)
		}
		checkRoundTrip(t, "SPEC.md", []byte(b))
		if i == len(blocks)-1 {
			out, err := Format(f)
			if err != nil {
				t.Fatal(err)
			}
			if string(out) != b {
				t.Errorf("the complete sheet in SPEC.md is not in canonical layout; fmt writes:\n%s", out)
			}
		}
	}
}
