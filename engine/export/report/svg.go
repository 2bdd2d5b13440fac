package report

import (
	"strconv"
	"strings"
)

// svg is a small writer of inline SVG: the report's pictures are a few
// paths, lines, circles and labels, and writing them directly keeps the
// output deterministic and small (see the package comment).
type svg struct {
	b strings.Builder
}

func newSVG(w, h float64, class string) *svg {
	s := &svg{}
	s.b.WriteString("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"" + esc(class) + "\" width=\"" + f1(w) + "\" height=\"" + f1(h) +
		"\" viewBox=\"0 0 " + f1(w) + " " + f1(h) + "\" role=\"img\">")
	return s
}

// f1 writes a coordinate with at most two decimals, trailing zeros dropped.
func f1(x float64) string {
	s := strconv.FormatFloat(x, 'f', 2, 64)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	if s == "-0" || s == "" {
		return "0"
	}
	return s
}

// g writes a coordinate of a section drawing exactly (shortest form that
// reads back to the same float64), so that the drawn outline has the
// section's area to the last digit.
func g(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

func (s *svg) raw(x string) { s.b.WriteString(x) }

func (s *svg) rect(x, y, w, h float64, class string) {
	s.b.WriteString("<rect class=\"" + class + "\" x=\"" + f1(x) + "\" y=\"" + f1(y) + "\" width=\"" + f1(w) + "\" height=\"" + f1(h) + "\"/>")
}

func (s *svg) line(x1, y1, x2, y2 float64, class string) {
	s.b.WriteString("<line class=\"" + class + "\" x1=\"" + f1(x1) + "\" y1=\"" + f1(y1) + "\" x2=\"" + f1(x2) + "\" y2=\"" + f1(y2) + "\"/>")
}

func (s *svg) path(d, class string) {
	s.b.WriteString("<path class=\"" + class + "\" d=\"" + d + "\"/>")
}

func (s *svg) circle(cx, cy, r float64, class string) {
	s.b.WriteString("<circle class=\"" + class + "\" cx=\"" + f1(cx) + "\" cy=\"" + f1(cy) + "\" r=\"" + f1(r) + "\"/>")
}

// text writes a label; anchor is start, middle or end.
func (s *svg) text(x, y float64, anchor, class, t string) {
	s.b.WriteString("<text class=\"" + class + "\" x=\"" + f1(x) + "\" y=\"" + f1(y) + "\" text-anchor=\"" + anchor + "\">" + esc(t) + "</text>")
}

func (s *svg) String() string { return s.b.String() + "</svg>" }
