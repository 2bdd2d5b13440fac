package sheet

import (
	"unicode"
	"unicode/utf8"
)

// bracketScanner follows brackets and string literals through the lines of
// one item, so that a line break inside ( [ { continues the item and so that
// "--" inside brackets or strings does not start an annotation.
//
//	string = '"' { char | '\' char } '"' | "'" ... "'" | "`" ... "`" .
//
// A string ends at its closing quote or at the end of the line; expression
// checking reports an unterminated one.
type bracketScanner struct {
	open     []int // offsets of brackets not yet closed, innermost last
	unclosed int   // offset+1 of the first string left open at a line end; 0 if none
}

// scan reads text[from:to] and returns the offset of the first "--" outside
// strings and brackets, or -1. Scanning stops there: the rest of the line is
// the annotation.
func (s *bracketScanner) scan(text string, from, to int) int {
	for i := from; i < to; i++ {
		c := text[i]
		if !scanned[c] {
			continue // most bytes of a line: a look in a table, not a switch
		}
		switch c {
		case '"', '\'', '`':
			j := stringEnd(text, i, to)
			if j >= to && s.unclosed == 0 {
				s.unclosed = i + 1
			}
			i = j
		case '(', '[', '{':
			s.open = append(s.open, i)
		case ')', ']', '}':
			// A closer with nothing open is left for the expression
			// checker, which reports it with the formula's context.
			if len(s.open) > 0 {
				s.open = s.open[:len(s.open)-1]
			}
		case '-':
			if len(s.open) == 0 && i+1 < to && text[i+1] == '-' {
				return i
			}
		}
	}
	return -1
}

// scanned marks the bytes bracketScanner.scan and headSplit act on: quotes,
// brackets and the "-" of "--".
var scanned = [256]bool{'"': true, '\'': true, '`': true, '(': true, '[': true, '{': true, ')': true, ']': true, '}': true, '-': true}

// stringEnd returns the offset of the quote closing the string that opens at
// text[i], or a value >= to when the string runs past to. A backslash escapes
// the next byte except in backquoted strings.
func stringEnd(text string, i, to int) int {
	q := text[i]
	j := i + 1
	for j < to && text[j] != q {
		if text[j] == '\\' && q != '`' {
			j++
		}
		j++
	}
	return j
}

// headSplit returns the offset just past the first "=" or ":" of a line that
// lies outside strings and brackets and before any annotation, or -1. It is
// where an expression starts, and so where bracket tracking for continuation
// lines begins: brackets in a unit or parameter list never swallow the lines
// below.
func headSplit(text string, from, to int) int {
	depth := 0
	for i := from; i < to; i++ {
		c := text[i]
		if !scanned[c] && c != '=' && c != ':' {
			continue
		}
		switch c {
		case '"', '\'', '`':
			i = stringEnd(text, i, to)
		case '(', '[', '{':
			depth++
		case ')', ']', '}':
			if depth > 0 {
				depth--
			}
		case '=', ':':
			if depth == 0 {
				return i + 1
			}
		case '-':
			if depth == 0 && i+1 < to && text[i+1] == '-' {
				return -1
			}
		}
	}
	return -1
}

// isIdentStart and isIdentPart define names:
//
//	name = letter { letter | digit | "_" } .
//	letter = unicode letter | "_" .
func isIdentStart(r rune) bool { return r == '_' || unicode.IsLetter(r) }
func isIdentPart(r rune) bool  { return r == '_' || unicode.IsLetter(r) || unicode.IsDigit(r) }

// identEnd returns the end of the name starting at i (i itself if none).
func identEnd(text string, i, end int) int {
	j := i
	for j < end {
		c := text[j]
		if c < utf8.RuneSelf {
			if c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || (j > i && '0' <= c && c <= '9') {
				j++
				continue
			}
			break
		}
		r, size := utf8.DecodeRuneInString(text[j:end])
		if j == i && !isIdentStart(r) || j > i && !isIdentPart(r) {
			break
		}
		j += size
	}
	return j
}

// skipSpace returns the first offset at or after i that is not a space or tab.
func skipSpace(text string, i, end int) int {
	for i < end && (text[i] == ' ' || text[i] == '\t') {
		i++
	}
	return i
}

// trimSpan shrinks [from, to) past spaces, tabs and line breaks at both ends.
func trimSpan(text string, from, to int) (int, int) {
	for from < to && isSpaceByte(text[from]) {
		from++
	}
	for to > from && isSpaceByte(text[to-1]) {
		to--
	}
	return from, to
}

func isSpaceByte(c byte) bool { return c == ' ' || c == '\t' || c == '\r' || c == '\n' }

// trimText trims spaces and tabs (only) at both ends.
func trimText(s string) string {
	a, b := trimSpan(s, 0, len(s))
	return s[a:b]
}

// isNumber reports whether s is a plain number as written in table rows:
//
//	number = [ "+" | "-" ] ( digits [ "." [ digits ] ] | "." digits ) [ exponent ] .
//	exponent = ( "e" | "E" ) [ "+" | "-" ] digits .
func isNumber(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := func() int {
		n := 0
		for i < len(s) && '0' <= s[i] && s[i] <= '9' {
			i++
			n++
		}
		return n
	}
	n := digits()
	if i < len(s) && s[i] == '.' {
		i++
		n += digits()
	}
	if n == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		if digits() == 0 {
			return false
		}
	}
	return i == len(s)
}
