package plural

import (
	"strconv"
	"strings"
)

// Count returns n and the noun, the noun in the plural unless n is 1:
// Count(1, "case") is "1 case", Count(0, "bad row") "0 bad rows". The
// plural is the regular one, enough for the nouns of our messages: a
// consonant and y take "ies" (entry, entries); s, x, z, ch and sh take
// "es"; every other noun takes "s".
func Count(n int, noun string) string {
	return strconv.Itoa(n) + " " + Noun(n, noun)
}

// Noun returns noun in the plural unless n is 1, without the number.
func Noun(n int, noun string) string {
	if n == 1 || noun == "" {
		return noun
	}
	if k := len(noun) - 1; noun[k] == 'y' && k > 0 && !strings.ContainsRune("aeiou", rune(noun[k-1])) {
		return noun[:k] + "ies"
	}
	for _, end := range []string{"s", "x", "z", "ch", "sh"} {
		if strings.HasSuffix(noun, end) {
			return noun + "es"
		}
	}
	return noun + "s"
}

// Grouped writes n with its thousands grouped by commas, as messages show
// counts and limits: Grouped(65535) is "65,535", Grouped(-1200) "-1,200".
func Grouped(n int) string {
	s := strconv.Itoa(n)
	first := 0
	if n < 0 {
		first = 1
	}
	for i := len(s) - 3; i > first; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
