package formula

import (
	"errors"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// A token found by the pre-scan: a quantity literal to replace, or a place
// where the text uses something the language does not offer.
type literal struct {
	off, end   int // byte span in the formula text (number and unit)
	numEnd     int // end of the number part
	unitOff    int // start of the unit run; == end when there is none
	value      float64
	numberText string
	unitText   string
	hasUnit    bool
	outOfRange bool // the number overflows, or underflows to zero
}

// scanIssue is a problem found before parsing, as offsets into the text.
type scanIssue struct {
	off, end int
	msg      string
	detail   string
	hint     string
}

// keywords after a number are operators, never units: `2 and x`.
var keywords = map[string]bool{
	"and": true, "or": true, "not": true, "in": true, "matches": true,
	"contains": true, "startsWith": true, "endsWith": true, "if": true,
	"else": true, "let": true, "nil": true, "true": true, "false": true,
}

// SyntheticPrefix starts every identifier that stands for a quantity
// literal in Tree. Names written in a sheet may not start with it.
const SyntheticPrefix = "__q"

// scan finds the quantity literals of text, skipping strings, and reports
// characters the language rejects before expr-lang sees them (a single `|`
// pipe, `#`, names starting with the synthetic prefix). It also measures the
// bracket nesting depth.
func scan(text string) (lits []literal, issues []scanIssue, depth int) {
	nest := 0
	i := 0
	for i < len(text) {
		c := text[i]
		switch {
		case c == '"' || c == '\'' || c == '`':
			j := i + 1
			for j < len(text) && text[j] != c {
				if text[j] == '\\' && c != '`' {
					j++
				}
				j++
			}
			i = min(j+1, len(text))
			continue
		case c == '(' || c == '[' || c == '{':
			nest++
			depth = max(depth, nest)
		case c == ')' || c == ']' || c == '}':
			nest--
		case c == '|':
			if i+1 < len(text) && text[i+1] == '|' {
				i += 2
				continue
			}
			issues = append(issues, scanIssue{i, i + 1, "pipes are not part of the sheet language",
				"a formula is one expression; `|` passes nothing here", "call the function directly: `f(x)` instead of `x | f()`"})
		case c == '#':
			issues = append(issues, scanIssue{i, i + 1, "`#` is not part of a formula",
				"closures and list predicates (`#`) are not offered; a `#` comment must start a line of its own",
				"use sum(xs), min(xs), max(xs), mean(xs) or a table column"})
		case isDigit(c) || (c == '.' && i+1 < len(text) && isDigit(text[i+1]) && (i == 0 || text[i-1] != '.')):
			lit, next := scanNumber(text, i)
			if lit.outOfRange {
				issues = append(issues, scanIssue{lit.off, lit.numEnd, "the number `" + lit.numberText + "` is out of range",
					"numbers are 64-bit floating point: their magnitude must lie between about 2.2e-308 and 1.8e308",
					"check the exponent"})
			}
			if lit.hasUnit {
				lits = append(lits, lit)
			}
			i = next
			continue
		case c == '_' || c >= utf8.RuneSelf || isLetter(rune(c)):
			r, _ := utf8.DecodeRuneInString(text[i:])
			if c == '_' || isLetter(r) {
				j := i
				for j < len(text) {
					r, n := utf8.DecodeRuneInString(text[j:])
					if r != '_' && !isLetter(r) && !unicode.IsDigit(r) {
						break
					}
					j += n
				}
				if strings.HasPrefix(text[i:j], SyntheticPrefix) {
					issues = append(issues, scanIssue{i, j, "names starting with `" + SyntheticPrefix + "` are reserved",
						"Sheaf uses them internally for quantity literals", "rename the cell"})
				}
				i = j
				continue
			}
			_, n := utf8.DecodeRuneInString(text[i:])
			i += n
			continue
		}
		i++
	}
	return lits, issues, depth
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

func isLetter(r rune) bool { return unicode.IsLetter(r) }

// scanNumber reads a number at text[i:] and the unit run after it, if any.
// The unit rule: after optional spaces, a maximal run of non-space
// characters that starts with a letter, µ, °, %, ‰ or `1/`, and stops at
// whitespace or one of `) , ] } :`.
func scanNumber(text string, i int) (literal, int) {
	j := i
	for j < len(text) && (isDigit(text[j]) || text[j] == '_') {
		j++
	}
	if j < len(text) && text[j] == '.' && !(j+1 < len(text) && text[j+1] == '.') {
		j++
		for j < len(text) && isDigit(text[j]) {
			j++
		}
	}
	if j < len(text) && (text[j] == 'e' || text[j] == 'E') {
		k := j + 1
		if k < len(text) && (text[k] == '+' || text[k] == '-') {
			k++
		}
		if k < len(text) && isDigit(text[k]) {
			for k < len(text) && isDigit(text[k]) {
				k++
			}
			j = k
		}
	}
	numText := text[i:j]
	digits := strings.ReplaceAll(numText, "_", "")
	v, err := strconv.ParseFloat(digits, 64)
	outOfRange := errors.Is(err, strconv.ErrRange) || (err == nil && v == 0 && strings.ContainsAny(mantissa(digits), "123456789"))
	if err != nil {
		v = 0 // expr-lang reports a malformed number when it parses
	}
	lit := literal{off: i, end: j, numEnd: j, unitOff: j, value: v, numberText: numText, outOfRange: outOfRange}
	k := j
	for k < len(text) && (text[k] == ' ' || text[k] == '\t') {
		k++
	}
	if k >= len(text) || !unitStart(text[k:]) {
		return lit, j
	}
	e := k
	for e < len(text) {
		r, n := utf8.DecodeRuneInString(text[e:])
		if unicode.IsSpace(r) || strings.ContainsRune("),]}:", r) {
			break
		}
		e += n
	}
	if keywords[text[k:e]] {
		return lit, j
	}
	lit.unitOff, lit.end, lit.unitText, lit.hasUnit = k, e, text[k:e], true
	return lit, e
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
