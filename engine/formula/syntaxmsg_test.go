package formula

import "testing"

// TestSyntaxMessages: expr-lang's syntax errors come out in the sheet's
// words, naming the text as written (a quantity stays `38 kN`), each with a
// hint (STYLE.md: every error says what to do).
func TestSyntaxMessages(t *testing.T) {
	cases := []struct {
		text, summary, hint string
	}{
		{"38 kN +", "the formula ends after `+`", "write a value after `+`, or remove the operator"},
		{"1 ** ", "the formula ends after `**`", "write a value after `**`, or remove the operator"},
		{"max(1,", "the formula ends after `,`", "write a value after `,`, or remove the comma"},
		{"steel.", "expected a field name after `.`", "write the field, as in `steel.f_y`"},
		{"a ? 1", "the formula ends too early", "a choice is written `condition ? value_if_true : value_if_false`"},
		{"(1 + 2))", "unexpected `)`", "remove it, or open the matching bracket before it"},
		{"2 m ]", "unexpected `]`", "remove it, or open the matching bracket before it"},
		{"{a: }", "unexpected `}`", "write a value after `:`"},
		{"max(1 + )", "unexpected `)`", "write a value after `+`"},
		{"2 @ 3", "unexpected character `@`", "names are letters, digits and `_`; operators are + - * / ^ and comparisons"},
		{"2 * * 3", "unexpected `*`", "write a value between `*` and `*`"},
		{"1 +* 2", "unexpected `*`", "write a value between `+` and `*`"},
		{"3 = 4", "unexpected `=`", "a cell has one `=`; to compare two values write `==`, or `<=` in a check"},
		{"{a: 1,, b: 2}", "unexpected `,`", "write a value before `,`, or remove the comma"},
		{"max(1,, 2)", "unexpected `,`", "write a value before `,`, or remove the comma"},
		{"foo bar", "unexpected `bar`", "write an operator between `foo` and `bar`, as in `foo * bar`"},
		{"1 2", "unexpected `2`", "write an operator between `1` and `2`, as in `1 * 2`"},
		{"2 m 3 m", "unexpected `3 m`", "write an operator between `2 m` and `3 m`, as in `2 m * 3 m`"},
		{"38 kN 2", "unexpected `2`", "write an operator between `38 kN` and `2`, as in `38 kN * 2`"},
		{"σ_Ed τ", "unexpected `τ`", "write an operator between `σ_Ed` and `τ`, as in `σ_Ed * τ`"},
		{"{+: 1}", "a record field is written `name: value`", "write the fields as in `{E: 210 GPa, f_y: 355 MPa}`"},
	}
	for _, c := range cases {
		t.Run(c.text, func(t *testing.T) {
			_, errs := Parse(expr(c.text), Options{})
			if len(errs) == 0 {
				t.Fatal("no error")
			}
			if d := errs[0]; d.Summary != c.summary || d.Hint != c.hint {
				t.Errorf("got  %q, hint %q\nwant %q, hint %q", d.Summary, d.Hint, c.summary, c.hint)
			}
		})
	}
}

func TestRewordUnknown(t *testing.T) {
	// A message reword does not know is cleaned and keeps no hint.
	if s, h := reword("Something odd at EOF", "", ""); s != "something odd at end of formula" || h != "" {
		t.Errorf("got %q, %q", s, h)
	}
	if got := tokenValue(`Operator("=")`); got != "=" {
		t.Errorf("tokenValue = %q", got)
	}
}
