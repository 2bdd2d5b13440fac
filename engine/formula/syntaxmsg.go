package formula

import (
	"errors"
	"strings"

	"github.com/expr-lang/expr/file"
	"github.com/expr-lang/expr/parser/lexer"
)

// syntaxWords finds, for a syntax error of expr-lang, the written text of
// the offending token (got, "" at the end of the formula) and of the token
// before it (last, "" at the start), by lexing the rewritten formula and
// mapping both back to what the author wrote: a quantity such as `38 kN`
// stays one token.
func (f *Formula) syntaxWords(fe *file.Error) (got, last string) {
	toks, _ := lexer.Lex(file.NewSource(f.Rewritten)) // tokens up to a lexer error are enough
	written := func(t lexer.Token) string {
		from, to := f.orig(f.byteAt(t.From), false), f.orig(f.byteAt(t.To), true)
		to = min(to, len(f.Source.Text))
		if from >= to {
			return ""
		}
		return f.Source.Text[from:to]
	}
	if atEnd(fe.Message) {
		// expr places the end one rune before it, on the last token.
		for i := len(toks) - 1; i >= 0; i-- {
			if toks[i].Kind != lexer.EOF {
				return "", written(toks[i])
			}
		}
		return "", ""
	}
	for i, t := range toks {
		if t.Kind == lexer.EOF || t.From >= fe.From {
			if t.Kind != lexer.EOF && t.From == fe.From {
				got = written(t)
			}
			if i > 0 {
				last = written(toks[i-1])
			}
			return got, last
		}
	}
	if n := len(toks); n > 0 {
		last = written(toks[n-1])
	}
	return "", last
}

// reword turns one of expr-lang's syntax messages into the sheet's words
// and adds a hint. expr names its tokens by kind (`unexpected token
// Operator("=")`, `unexpected token EOF`); an author wants to see the text
// they wrote and what to do about it. got is the written token at the error
// ("" at the end of the formula), last the one before it. A message it does
// not know comes back cleaned, without a hint.
func reword(msg, got, last string) (summary, hint string) {
	switch {
	case atEnd(msg):
		switch {
		case last == ".":
			return "expected a field name after `.`", "write the field, as in `steel.f_y`"
		case last == ",":
			return "the formula ends after `,`", "write a value after `,`, or remove the comma"
		case isOperator(last):
			return "the formula ends after `" + last + "`", "write a value after `" + last + "`, or remove the operator"
		}
		return "the formula ends too early", "finish the expression"
	case msg == "expected name":
		return "expected a field name after `.`", "write the field, as in `steel.f_y`"
	case strings.HasPrefix(msg, "a map key must be"):
		return "a record field is written `name: value`", "write the fields as in `{E: 210 GPa, f_y: 355 MPa}`"
	case strings.HasPrefix(msg, "unrecognized character: "):
		// The message reads `unrecognized character: U+0040 '@'`.
		if i, j := strings.IndexByte(msg, '\''), strings.LastIndexByte(msg, '\''); i >= 0 && j > i {
			got = msg[i+1 : j]
		}
		return "unexpected character `" + got + "`", "names are letters, digits and `_`; operators are + - * / ^ and comparisons"
	case !strings.HasPrefix(msg, "unexpected token "):
		return cleanMessage(msg), ""
	}
	if got == "" {
		got = tokenValue(strings.TrimPrefix(msg, "unexpected token "))
	}
	summary = "unexpected `" + got + "`"
	switch {
	case got == "=":
		hint = "a cell has one `=`; to compare two values write `==`, or `<=` in a check"
	case (got == ")" || got == "]" || got == "}") && (isOperator(last) || last == "."):
		hint = "write a value after `" + last + "`"
	case got == ")" || got == "]" || got == "}":
		hint = "remove it, or open the matching bracket before it"
	case got == "," && (last == "," || last == "(" || last == "[" || last == "{"):
		hint = "write a value before `,`, or remove the comma"
	case got == ",":
		hint = "a comma separates the arguments of a call or the items of a list or record"
	case isOperator(got) && isOperator(last):
		hint = "write a value between `" + last + "` and `" + got + "`"
	case isOperator(got):
		hint = "write a value before `" + got + "`"
	case last != "" && !isOperator(last) && !strings.Contains("([{,.", last):
		// Two values side by side: `1 2`, `foo bar`, `2 m 3 m`.
		hint = "write an operator between `" + last + "` and `" + got + "`, as in `" + last + " * " + got + "`"
	}
	return summary, hint
}

// atEnd reports whether msg says that the formula ended too early.
func atEnd(msg string) bool {
	return msg == "unexpected token EOF" || msg == "unexpected end of expression"
}

// isOperator reports whether s is an operator that needs a value after it.
func isOperator(s string) bool {
	switch s {
	case "+", "-", "*", "/", "^", "**", "?", ":", "==", "!=", "<", "<=", ">", ">=", "=",
		"and", "or", "not", "!", "&&", "||":
		return true
	}
	return false
}

// tokenValue reads the value out of expr-lang's token text `Kind("value")`.
func tokenValue(tok string) string {
	if i := strings.Index(tok, `("`); i >= 0 && strings.HasSuffix(tok, `")`) {
		return tok[i+2 : len(tok)-2]
	}
	return tok
}

// asFileError unwraps expr-lang's positioned error.
func asFileError(err error) (*file.Error, bool) {
	var fe *file.Error
	ok := errors.As(err, &fe)
	return fe, ok
}
