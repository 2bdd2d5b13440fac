package check

import (
	"os"
	"strings"
	"testing"
)

// TestSpecListsBuiltins keeps SPEC.md's table of built-in functions whole:
// every built-in appears with its signature and its dimension rule.
func TestSpecListsBuiltins(t *testing.T) {
	spec, err := os.ReadFile("../../SPEC.md")
	if err != nil {
		t.Fatal(err)
	}
	for _, b := range Builtins {
		row := "| `" + b.Sig + "` | " + strings.ReplaceAll(b.Rule, "|", `\|`) + " |"
		if !strings.Contains(string(spec), row) {
			t.Errorf("SPEC.md lacks the row\n%s", row)
		}
	}
}
