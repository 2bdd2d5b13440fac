package formula

import (
	"errors"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// tokKind is the kind of a token of the expression grammar (SPEC.md §4).
type tokKind uint8

const (
	tEOF    tokKind = iota
	tNumber         // a number, with a unit when unitFrom < to (a quantity literal)
	tName           // a name; the words and, or, not, true and false are tOp
	tString         // "text"
	tOp             // an operator, a bracket, `,`, `:`, `?` or one of the words
)

// token is one token: its kind, its byte span and, for operators, its text.
type token struct {
	kind     tokKind
	from, to int32  // byte span in the formula text
	text     string // the token as written
	// numbers: the end of the number part, and the start of the unit run
	// (unitFrom == to when there is none)
	numEnd, unitFrom int32
}

// isWord reports whether s is one of the operator words of the grammar,
// which are never units nor names.
func isWord(s string) bool {
	switch s {
	case "and", "or", "not", "true", "false":
		return true
	}
	return false
}

// lexer reads tokens from the formula text.
type lexer struct {
	src string
	pos int
}

// next reads the token at l.pos. A character the grammar does not have is
// a syntax error with its own message (see slips).
func (l *lexer) next(out *token) {
	s := l.src
	for l.pos < len(s) {
		c := s[l.pos]
		if c == ' ' || c == '\t' || c == '\n' || c == '\r' {
			l.pos++
			continue
		}
		if c >= utf8.RuneSelf {
			r, n := utf8.DecodeRuneInString(s[l.pos:])
			if unicode.IsSpace(r) {
				l.pos += n
				continue
			}
		}
		break
	}
	start := l.pos
	if start >= len(s) {
		*out = token{kind: tEOF, from: int32(start), to: int32(start)}
		return
	}
	c := s[start]
	switch {
	case isDigit(c) || (c == '.' && start+1 < len(s) && isDigit(s[start+1])):
		l.number(out)
		return
	case c == '"':
		j := start + 1
		for j < len(s) && s[j] != '"' && s[j] != '\n' {
			j++
		}
		if j >= len(s) || s[j] != '"' {
			panic(l.slip(start, j, "unclosed text", "text is written between double quotes on one line, as in \"fixed\"", "close it with `\"`"))
		}
		l.pos = j + 1
		*out = token{kind: tString, from: int32(start), to: int32(l.pos), text: s[start:l.pos]}
		return
	case c == '_' || c >= utf8.RuneSelf || isLetter(rune(c)):
		r, _ := utf8.DecodeRuneInString(s[start:])
		if c != '_' && !isLetter(r) {
			l.unexpectedRune(start)
		}
		j := start
		for j < len(s) {
			if b := s[j]; b < utf8.RuneSelf {
				// ASCII, the usual case, without decoding a rune.
				if b != '_' && !isDigit(b) && (b|0x20 < 'a' || b|0x20 > 'z') {
					break
				}
				j++
				continue
			}
			r, n := utf8.DecodeRuneInString(s[j:])
			if r != '_' && !isLetter(r) && !unicode.IsDigit(r) {
				break
			}
			j += n
		}
		l.pos = j
		*out = token{kind: tName, from: int32(start), to: int32(j), text: s[start:j]}
		if isWord(out.text) {
			out.kind = tOp
		}
		return
	}
	switch c {
	case '+', '-', '^', '(', ')', '[', ']', '{', '}', ',':
		// No two-byte operator nor slip starts with these.
		l.op(out, start, 1)
		return
	}
	two := ""
	if start+1 < len(s) {
		two = s[start : start+2]
	}
	switch two {
	case "<=", ">=", "==", "!=":
		l.op(out, start, 2)
		return
	case "//", "/*":
		panic(l.slip(start, start+2, "`"+two+"` does not start a comment in a formula",
			"comments start with # on a line of their own; after `--` a cell takes a description", "move the remark to a `#` line above, or after `--`"))
	case "**":
		panic(l.slip(start, start+2, "`**` is not an operator in a sheet", "a power is written with `^`", "write `x^2`"))
	case "&&":
		panic(l.slip(start, start+2, "`&&` is not an operator in a sheet", "comparisons are joined with the words and, or, not", "write `and`"))
	case "||":
		panic(l.slip(start, start+2, "`||` is not an operator in a sheet", "comparisons are joined with the words and, or, not", "write `or`"))
	case "??":
		panic(l.slip(start, start+2, "`??` is not part of the sheet language", "every cell has a value", "use `cond ? a : b` to choose"))
	case "?.":
		panic(l.slip(start, start+2, "`?.` is not part of the sheet language", "every cell has a value, so optional access is not needed", "write `r.x`"))
	case "..":
		panic(l.slip(start, start+2, "ranges `..` are not part of the sheet language", "a list is written [1, 2, 3]", "write the values as a list `[1, 2, 3]` or use a table"))
	case ":=":
		panic(l.slip(start, start+2, "`:=` is not part of the sheet language", "a cell is written `name = expression`", "write `=` once, after the name"))
	}
	switch c {
	case '+', '-', '*', '/', '^', '<', '>', '?', ':', ',', '.', '(', ')', '[', ']', '{', '}', '=':
		l.op(out, start, 1)
		return
	case '!':
		panic(l.slip(start, start+1, "`!` is not an operator in a sheet", "a condition is negated with the word not", "write `not (a > b)`; `!=` compares"))
	case '|':
		panic(l.slip(start, start+1, "pipes are not part of the sheet language", "a formula is one expression; `|` passes nothing here", "call the function directly: `f(x)` instead of `x | f()`"))
	case '%':
		panic(l.slip(start, start+1, "`%` is not an operator in a sheet", "after a number `%` is the percent unit: `5 %`", "there is no remainder operator; write the percentage after a number"))
	case '#':
		panic(l.slip(start, start+1, "`#` is not part of a formula", "a `#` comment must start a line of its own", "move the remark to a `#` line above the cell"))
	case ';':
		panic(l.slip(start, start+1, "a formula is one expression", "`;` separates nothing in a sheet", "put each value in its own cell"))
	case '\'', '`':
		panic(l.slip(start, start+1, "text is written between double quotes", "the sheet language has one kind of text: \"fixed\"", "write \"...\""))
	}
	l.unexpectedRune(start)
}

// op reads the operator of n bytes at start into out.
func (l *lexer) op(out *token, start, n int) {
	l.pos = start + n
	*out = token{kind: tOp, from: int32(start), to: int32(l.pos), text: l.src[start:l.pos]}
}

func (l *lexer) unexpectedRune(start int) {
	r, n := utf8.DecodeRuneInString(l.src[start:])
	shown := string(r)
	if r == utf8.RuneError || !unicode.IsPrint(r) {
		shown = "U+" + strings.ToUpper(strconv.FormatInt(int64(r), 16))
		if r == utf8.RuneError {
			shown = "a byte that is not UTF-8"
		}
	}
	panic(l.slip(start, start+n, "unexpected character `"+shown+"`", "names are letters, digits and `_`; operators are + - * / ^ and comparisons", "remove it, or write a name or an operator"))
}

// number reads a number and the unit run after it (SPEC.md §3):
//
//	number = digits [ "." [ digits ] ] [ exponent ] | "." digits [ exponent ] .
//	exponent = ( "e" | "E" ) [ "+" | "-" ] digits .
//
// The unit is the longest run of non-space characters after the number that
// starts with a letter, µ, °, %, ‰ or `1/`, and it stops at a space or at
// `)`, `,`, `]`, `}` or `:`.
func (l *lexer) number(t *token) {
	s := l.src
	start := l.pos
	j := start
	if s[j] == '0' && j+1 < len(s) && strings.IndexByte("xXbBoO", s[j+1]) >= 0 && j+2 < len(s) && isHex(s[j+2]) {
		panic(l.slip(start, j+2, "numbers are written in decimal", "hexadecimal, octal and binary numbers are not part of the sheet language", "write the value in decimal"))
	}
	for j < len(s) && isDigit(s[j]) {
		j++
	}
	if j < len(s) && s[j] == '.' && !(j+1 < len(s) && s[j+1] == '.') {
		j++
		for j < len(s) && isDigit(s[j]) {
			j++
		}
	}
	if j < len(s) && (s[j] == 'e' || s[j] == 'E') {
		k := j + 1
		if k < len(s) && (s[k] == '+' || s[k] == '-') {
			k++
		}
		if k < len(s) && isDigit(s[k]) {
			for k < len(s) && isDigit(s[k]) {
				k++
			}
			j = k
		}
	}
	if j < len(s) && s[j] == '_' {
		panic(l.slip(j, j+1, "`_` cannot group the digits of a number", "a number is written with its digits together, as in 1000 or 1e3", "write `"+strings.ReplaceAll(s[start:wordEnd(s, j)], "_", "")+"`"))
	}
	*t = token{kind: tNumber, from: int32(start), to: int32(j), text: s[start:j], numEnd: int32(j), unitFrom: int32(j)}
	k := j
	for k < len(s) && (s[k] == ' ' || s[k] == '\t') {
		k++
	}
	if k >= len(s) || !unitStart(s[k:]) {
		l.pos = j
		return
	}
	e := k
	for e < len(s) {
		r, n := utf8.DecodeRuneInString(s[e:])
		if unicode.IsSpace(r) || strings.ContainsRune("),]}:", r) {
			break
		}
		e += n
	}
	if isWord(s[k:e]) {
		l.pos = j
		return
	}
	t.unitFrom, t.to, t.text = int32(k), int32(e), s[start:e]
	l.pos = e
}

// wordEnd returns the end of the run of digits, letters and `_` at s[i:].
func wordEnd(s string, i int) int {
	for i < len(s) && (isDigit(s[i]) || s[i] == '_' || s[i] == '.' || isLetter(rune(s[i]))) {
		i++
	}
	return i
}

// parseNumber returns the value of a number's text; out of range is an
// overflow or an underflow to zero of a number with a non-zero digit.
func parseNumber(text string) (v float64, outOfRange bool) {
	v, err := strconv.ParseFloat(text, 64)
	if errors.Is(err, strconv.ErrRange) {
		return v, true
	}
	if err != nil {
		return 0, false // the lexer only hands on decimal numbers
	}
	return v, v == 0 && strings.ContainsAny(mantissa(text), "123456789")
}

// mantissa returns the digits of a number before its exponent.
func mantissa(num string) string {
	if k := strings.IndexAny(num, "eE"); k >= 0 {
		return num[:k]
	}
	return num
}

// unitStart reports whether s begins a unit run.
func unitStart(s string) bool {
	if strings.HasPrefix(s, "1/") {
		return true
	}
	r, _ := utf8.DecodeRuneInString(s)
	switch r {
	case 'µ', 'μ', '°', '%', '‰':
		return true
	}
	return r != '_' && isLetter(r)
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

func isHex(c byte) bool { return isDigit(c) || (c|0x20 >= 'a' && c|0x20 <= 'f') }

func isLetter(r rune) bool { return unicode.IsLetter(r) }

// slip is a syntax error found while reading a token.
func (l *lexer) slip(from, to int, summary, detail, hint string) *syntaxError {
	return &syntaxError{from: int32(from), to: int32(to), summary: summary, detail: detail, hint: hint}
}

// syntaxError is the first problem of a formula; the parser stops there.
type syntaxError struct {
	from, to              int32
	summary, detail, hint string
}
