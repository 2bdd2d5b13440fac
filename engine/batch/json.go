package batch

import (
	"encoding/json"
	"io"
	"math"

	"github.com/sheafcalc/sheaf/engine/units"
)

// Schema is the version of the JSON of a batch (its "schema" key; see
// schema/sheaf.schema.json).
const Schema = "sheaf.batch/1"

// jsonDoc is the JSON shape of an outcome. Every number comes with its
// unit: the value in the column's unit and in SI.
type jsonDoc struct {
	Schema       string       `json:"schema"`
	ExitCode     int          `json:"exit_code"`
	Sheet        string       `json:"sheet"`
	Table        string       `json:"table"`
	Separator    string       `json:"separator"`
	DecimalComma bool         `json:"decimal_comma"`
	Rows         []jsonRow    `json:"rows"`
	Summary      jsonSummary  `json:"summary"`
	Problems     []jsonIssue  `json:"problems"`
	Columns      []jsonColumn `json:"columns"`
}

type jsonColumn struct {
	Name   string `json:"name"`
	Role   string `json:"role"` // "input", "pick" or "check"
	Unit   string `json:"unit"`
	SIUnit string `json:"si_unit"`
}

type jsonQuantity struct {
	Name   string   `json:"name"`
	Value  *float64 `json:"value"`
	Unit   string   `json:"unit"`
	SI     *float64 `json:"si"`
	SIUnit string   `json:"si_unit"`
}

type jsonCheck struct {
	Name        string   `json:"name"`
	Utilisation *float64 `json:"utilisation"`
	Verdict     string   `json:"verdict"`
	// Governing is the combination that governs the check in this case,
	// for a check of a sheet with actions.
	Governing string `json:"governing_combination,omitempty"`
}

type jsonRow struct {
	Case       int            `json:"case"`
	Line       int            `json:"line"`
	Bad        bool           `json:"bad"`
	Uncomputed bool           `json:"uncomputed"`
	Problem    string         `json:"problem,omitempty"`
	Inputs     []jsonQuantity `json:"inputs"`
	Picks      []jsonQuantity `json:"picks"`
	Checks     []jsonCheck    `json:"checks"`
	// ShownIn is, for a sheet with actions, the combination whose values
	// the picked cells that depend on actions show (each cell's, as
	// "N: ULS 2; delta: SLS-c 2", when they differ).
	ShownIn string `json:"shown_in,omitempty"`
}

type jsonSummary struct {
	Cases      int                `json:"cases"`
	Bad        int                `json:"bad"`
	Uncomputed int                `json:"uncomputed"`
	Checks     []jsonCheckSummary `json:"checks"`
}

type jsonCheckSummary struct {
	Name      string   `json:"name"`
	Failed    int      `json:"failed"`
	Unknown   int      `json:"not_assessed"`
	Worst     *float64 `json:"worst_utilisation"`
	WorstCase int      `json:"worst_case,omitempty"`
}

type jsonIssue struct {
	Kind    string `json:"kind"`
	File    string `json:"file"`
	Line    int    `json:"line"`
	Column  int    `json:"column"`
	Message string `json:"message"`
	Detail  string `json:"detail,omitempty"`
	Hint    string `json:"hint,omitempty"`
}

func jnum(x float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	if x == 0 {
		x = 0
	}
	return &x
}

func unitSym(u units.Unit) string {
	if u.Symbol == "" {
		return "1"
	}
	return u.Symbol
}

func quantity(name string, si float64, u units.Unit) jsonQuantity {
	f := u.Factor
	if f == 0 {
		f = 1
	}
	return jsonQuantity{Name: name, Value: jnum(si / f), Unit: unitSym(u), SI: jnum(si), SIUnit: units.SISymbol(u.Dim)}
}

// WriteJSON writes the outcome as one JSON document with the exit status
// exit of the command.
func (o *Outcome) WriteJSON(w io.Writer, sheet string, exit int) error {
	sep := ","
	if o.Cases.Sep == ';' {
		sep = ";"
	}
	d := jsonDoc{Schema: Schema, ExitCode: exit, Sheet: sheet, Table: o.Cases.File, Separator: sep, DecimalComma: o.Cases.DecimalComma,
		Rows: []jsonRow{}, Problems: []jsonIssue{}, Columns: []jsonColumn{}}
	for _, c := range o.Cases.Columns {
		d.Columns = append(d.Columns, jsonColumn{Name: c.Name, Role: "input", Unit: unitSym(c.Unit), SIUnit: units.SISymbol(c.Unit.Dim)})
	}
	for k, c := range o.Picks {
		u := o.PickUnit(k)
		d.Columns = append(d.Columns, jsonColumn{Name: c.Name, Role: "pick", Unit: unitSym(u), SIUnit: units.SISymbol(u.Dim)})
	}
	for _, c := range o.Checks {
		d.Columns = append(d.Columns, jsonColumn{Name: c.Name, Role: "check", Unit: "1", SIUnit: "1"})
	}
	for i := range o.Rows {
		r := &o.Rows[i]
		jr := jsonRow{Case: r.Case.N, Line: r.Case.Line, Bad: r.Case.Err != nil, Uncomputed: r.Uncomputed, Problem: r.Problem,
			Inputs: []jsonQuantity{}, Picks: []jsonQuantity{}, Checks: []jsonCheck{}, ShownIn: r.Shown}
		if e := r.Case.Err; e != nil {
			jr.Problem = e.Summary
			p := e.Range.Start()
			d.Problems = append(d.Problems, jsonIssue{Kind: "input", File: p.File, Line: p.Line, Column: p.Col, Message: e.Summary, Detail: e.Detail, Hint: e.Hint})
		}
		for j, c := range o.Cases.Columns {
			x := math.NaN()
			if r.Case.Values != nil {
				if v, ok := r.Case.Values[j].(float64); ok {
					x = v
				}
			}
			jr.Inputs = append(jr.Inputs, quantity(c.Name, x, c.Unit))
		}
		for k, c := range o.Picks {
			jr.Picks = append(jr.Picks, quantity(c.Name, r.Picks[k], o.PickUnit(k)))
		}
		for k, c := range o.Checks {
			jc := jsonCheck{Name: c.Name, Utilisation: jnum(r.Utils[k]), Verdict: r.Verdict(k)}
			if k < len(r.Governing) {
				jc.Governing = r.Governing[k]
			}
			jr.Checks = append(jr.Checks, jc)
		}
		d.Rows = append(d.Rows, jr)
	}
	s := o.Summarize()
	d.Summary = jsonSummary{Cases: s.Cases, Bad: s.Bad, Uncomputed: s.Uncomputed, Checks: []jsonCheckSummary{}}
	for _, c := range s.Checks {
		d.Summary.Checks = append(d.Summary.Checks, jsonCheckSummary{Name: c.Name, Failed: c.Failed, Unknown: c.Unknown, Worst: jnum(c.Worst), WorstCase: c.WorstCase})
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(d)
}
