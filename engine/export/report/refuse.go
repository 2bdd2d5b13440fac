package report

import "github.com/sheafcalc/sheaf/engine"

// Refusal says why the report of sheet s would not be honest, or returns
// "" when it can be written.
//
// A sheet with actions is refused. The report writes each formula with
// the values of its inputs put in and works out each value beside it, but
// the cells of such a sheet hold the values of several combinations (each
// check its governing one, the actions their characteristic values), and
// the report has no place yet to say which: a line `N_Ed = 1.35 G + 1.5 Q
// = ...` would put characteristic values into a design formula, and a check
// would be shown without the combination that governs it.
func Refusal(s *engine.Sheet) string {
	if cs := s.Combos(); cs != nil {
		return s.Name() + " has actions (combinations: " + cs.Rules.Name + "); the report does not yet show the combinations " +
			"and the governing one of each check, so it is not written: `sheaf run` lists each check's governing combination " +
			"and `sheaf run --combinations` the whole table"
	}
	return ""
}

// refused is the page written in place of the report of a sheet that
// Refusal refuses (a caller that renders without asking first, such as
// the live preview, shows the reason rather than a misleading report).
func (d *doc) refused(why string) {
	d.w("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n",
		"<meta name=\"generator\" content=\"Sheaf ", esc(d.opt.Version), "\">\n",
		"<title>No report</title>\n</head>\n<body>\n<main id=\"report\">\n<p><strong>No report:</strong> ", esc(why), ".</p>\n<p>", esc(engine.Caution), "</p>\n</main>\n")
	if d.opt.Live != "" {
		d.live()
	}
	d.w("</body>\n</html>\n")
}
