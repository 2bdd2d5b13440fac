package jsonout

import (
	"encoding/json"
	"io"
	"math"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// Schema is the version of the document, the value of its "schema" key.
// It changes whenever a key is removed or changes meaning (adding a key
// does not change it); the JSON Schema is schema/sheaf.schema.json.
const Schema = "sheaf.run/1"

// Document is the JSON shape of a run.
type Document struct {
	Schema     string    `json:"schema"`
	ExitCode   int       `json:"exit_code"` // the exit status of the command that wrote it
	Meta       Meta      `json:"meta"`
	Cells      []Cell    `json:"cells"`
	Checks     []Check   `json:"checks"`
	Failed     int       `json:"failed"`     // checks that fail or are not assessed
	Uncomputed int       `json:"uncomputed"` // cells that could not be computed
	Problems   []Problem `json:"problems"`
	// Combinations is present for a sheet with actions.
	Combinations *Combinations `json:"combinations,omitempty"`
	Caution      string        `json:"caution"`
}

// Meta is the header of the sheet.
type Meta struct {
	Title    string `json:"title"`
	Project  string `json:"project,omitempty"`
	Basis    string `json:"basis,omitempty"`
	Author   string `json:"author,omitempty"`
	Checker  string `json:"checker,omitempty"`
	Date     string `json:"date,omitempty"`
	Revision string `json:"revision,omitempty"`
	Units    string `json:"units"`
}

// Cell is one cell. Every number comes with its unit: SI in the coherent
// SI unit SIUnit, Value in the display unit Unit. SI and Value are null
// when the cell is unknown or not a number.
type Cell struct {
	Name        string    `json:"name"`
	Kind        string    `json:"kind"`
	Section     string    `json:"section,omitempty"`
	Known       bool      `json:"known"`
	SI          *float64  `json:"si"`
	SIUnit      string    `json:"si_unit"`
	Unit        string    `json:"unit"`
	Value       *float64  `json:"value"`
	Text        string    `json:"text"`
	List        []float64 `json:"list,omitempty"`   // lists of numbers, in SIUnit
	Fields      []Field   `json:"fields,omitempty"` // records
	Description string    `json:"description,omitempty"`
	Reference   string    `json:"reference,omitempty"`
	Expr        string    `json:"expr,omitempty"`
	Deps        []string  `json:"deps,omitempty"`
	Columns     []Column  `json:"columns,omitempty"` // tables
	// InCombination names the combination whose value a cell that depends
	// on actions shows (an action itself shows its characteristic value).
	InCombination string `json:"in_combination,omitempty"`
	// Action is the kind of an action cell ("permanent", "imposed B", ...),
	// whose value is its characteristic value.
	Action string `json:"action,omitempty"`
}

// Field is a numeric or text field of a record value; a number carries
// its SI unit and its value in the preferred unit of the sheet's system.
type Field struct {
	Name   string   `json:"name"`
	SI     *float64 `json:"si,omitempty"`
	SIUnit string   `json:"si_unit,omitempty"`
	Value  *float64 `json:"value,omitempty"`
	Unit   string   `json:"unit,omitempty"`
	Text   string   `json:"text,omitempty"`
}

// Column is a column of a table: SI values in SIUnit, and the same in Unit.
type Column struct {
	Name   string    `json:"name"`
	SIUnit string    `json:"si_unit"`
	SI     []float64 `json:"si"`
	Unit   string    `json:"unit"`
	Values []float64 `json:"values"`
}

// Check is one design check. Demand and capacity are in Unit (and in
// SIUnit for the _si keys); they are given when both sides were computed,
// even when the check is not assessed (NotAssessed says why).
type Check struct {
	Name        string   `json:"name"`
	Known       bool     `json:"known"`
	SIUnit      string   `json:"si_unit"`
	Unit        string   `json:"unit"`
	DemandSI    *float64 `json:"demand_si"`
	CapacitySI  *float64 `json:"capacity_si"`
	Demand      *float64 `json:"demand"`
	Capacity    *float64 `json:"capacity"`
	Utilisation *float64 `json:"utilisation"`
	Pass        bool     `json:"pass"`
	Verdict     string   `json:"verdict"` // "pass", "fail" or "not assessed"
	NotAssessed string   `json:"not_assessed,omitempty"`
	Governing   string   `json:"governing,omitempty"` // the term of a min/max capacity that governs, as written
	Description string   `json:"description,omitempty"`
	Reference   string   `json:"reference,omitempty"`
	// Combination is the outcome over the combinations of its limit state,
	// for a check that depends on actions.
	Combination *CheckCombination `json:"combination,omitempty"`
}

// Problem kinds.
const (
	KindSheet   = "sheet"   // the sheet does not load: syntax, names, dimensions
	KindRuntime = "runtime" // a cell could not be computed
	KindCheck   = "check"   // a design check is not assessed
	KindInput   = "input"   // a flag, argument, file or --set is wrong
)

// Problem is one problem, with its place. Line and Column are 1-based
// (columns count characters) and 0 when the problem has no place in a file.
type Problem struct {
	Kind     string `json:"kind"`
	Severity string `json:"severity"`
	File     string `json:"file"`
	Line     int    `json:"line"`
	Column   int    `json:"column"`
	Pos      string `json:"pos"` // file:line:col
	Message  string `json:"message"`
	Detail   string `json:"detail,omitempty"`
	Hint     string `json:"hint,omitempty"`
}

// Caution is the line every output carries.
const Caution = engine.Caution

func num(x float64) *float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	// Round-trip exactly; JSON numbers cannot be -0 meaningfully.
	if x == 0 {
		x = 0
	}
	return &x
}

// siUnit is the unit of the SI values of the document.
func siUnit(d units.Dim) string { return units.SISymbol(d) }

// NewProblem converts a diagnostic.
func NewProblem(kind string, d *diag.Diagnostic) Problem {
	p := d.Range.Start()
	return Problem{Kind: kind, Severity: d.Severity.String(), File: p.File, Line: p.Line, Column: p.Col, Pos: p.String(),
		Message: d.Summary, Detail: d.Detail, Hint: d.Hint}
}

// ExitCode is the exit status results give without --draft: 2 when a cell
// could not be computed, 1 when a check fails or is not assessed, else 0.
func ExitCode(r *engine.Results) int {
	switch {
	case r.Uncomputed() > 0:
		return 2
	case r.Failed() > 0:
		return 1
	}
	return 0
}

// Build converts results to the JSON document, with the exit status the
// command gives.
func Build(r *engine.Results, exit int) *Document {
	d := &Document{
		Schema: Schema, ExitCode: exit,
		Meta: Meta{Title: r.Meta.Title, Project: r.Meta.Project, Basis: r.Meta.Basis, Author: r.Meta.Author,
			Checker: r.Meta.Checker, Date: r.Meta.Date, Revision: r.Meta.Revision, Units: r.Meta.System.String()},
		Cells: []Cell{}, Checks: []Check{}, Problems: []Problem{}, Failed: r.Failed(), Uncomputed: r.Uncomputed(), Caution: Caution,
	}
	sys := r.Meta.System
	for _, c := range r.Cells {
		jc := Cell{Name: c.Cell.Name, Kind: c.Cell.Kind.String(), Section: c.Cell.Section(), Known: c.Known,
			Unit: c.Unit.Symbol, Text: c.Text, Description: c.Cell.Description(), Reference: c.Cell.Reference(),
			Expr: c.Cell.Expr(), Deps: depNames(r, c.Cell)}
		if c.Cell.Extra().Action != nil {
			jc.Action = c.Cell.Extra().Action.Kind.Text()
		}
		if r.Combos != nil && r.Combos.CellIn[c.Cell.Index] >= 0 {
			jc.InCombination = r.Combos.All[r.Combos.CellIn[c.Cell.Index]].Name
		}
		if t := c.Cell.Type; t != nil {
			switch {
			case t.Kind == funcs.Number:
				jc.SIUnit = siUnit(t.Dim)
			case t.Kind == funcs.List && t.Elem != nil && t.Elem.Kind == funcs.Number:
				jc.SIUnit = siUnit(t.Elem.Dim)
			}
		}
		if c.Cell.Kind == engine.Check {
			jc.SIUnit = "1"
		}
		if c.Known {
			switch v := c.Value.(type) {
			case float64:
				jc.SI, jc.Value = num(c.SI), num(c.Display)
			case []float64:
				jc.List = v
			case *funcs.RecordValue:
				for i, f := range v.Type.Fields {
					fd := Field{Name: f.Name}
					switch x := v.Fields[i].(type) {
					case float64:
						u := display(f.Type, sys)
						fd.SI, fd.SIUnit = num(x), siUnit(u.Dim)
						fd.Value, fd.Unit = num(x/u.Factor), u.Symbol
					case string:
						fd.Text = x
					}
					jc.Fields = append(jc.Fields, fd)
				}
			case *funcs.TableValue:
				for i, f := range v.Type.Fields {
					u := display(f.Type, sys)
					vals := make([]float64, len(v.Cols[i]))
					for k, x := range v.Cols[i] {
						vals[k] = x / u.Factor
					}
					jc.Columns = append(jc.Columns, Column{Name: f.Name, SIUnit: siUnit(u.Dim), SI: v.Cols[i], Unit: u.Symbol, Values: vals})
				}
			}
		}
		d.Cells = append(d.Cells, jc)
	}
	for _, c := range r.Checks {
		jc := Check{Name: c.Cell.Name, Known: c.Known, Unit: c.Unit.Symbol, Pass: c.Pass, Verdict: "not assessed",
			Governing: c.Governing, Description: c.Cell.Description(), Reference: c.Cell.Reference()}
		if !c.Cell.Extra().Demand.IsZero() && c.Cell.Extra().Demand.Type() != nil {
			jc.SIUnit = siUnit(c.Cell.Extra().Demand.Type().Dim)
		}
		if c.Known || c.Problem != nil {
			jc.DemandSI, jc.CapacitySI = num(c.Demand), num(c.Capacity)
			jc.Demand, jc.Capacity = num(c.Demand/c.Unit.Factor), num(c.Capacity/c.Unit.Factor)
		}
		if c.Known {
			jc.Utilisation = num(c.Util)
			jc.Verdict = "fail"
			if c.Pass {
				jc.Verdict = "pass"
			}
		}
		if c.Problem != nil {
			jc.NotAssessed = c.Problem.Summary
		}
		jc.Combination = checkCombo(r, c)
		d.Checks = append(d.Checks, jc)
	}
	d.Combinations = buildCombos(r)
	for _, p := range r.Problems {
		kind := KindRuntime
		for _, c := range r.Checks {
			if c.Problem == p {
				kind = KindCheck
			}
		}
		d.Problems = append(d.Problems, NewProblem(kind, p))
	}
	return d
}

// display is the unit a number of type t is shown in: the preferred unit
// of its dimension in system s.
func display(t *funcs.Type, s units.System) units.Unit {
	if t == nil {
		return units.Unit{Factor: 1, Symbol: "1"}
	}
	u, _ := units.Preferred(t.Dim, s)
	if u.Factor == 0 {
		u.Factor = 1
	}
	if u.Symbol == "" {
		u.Symbol = "1"
	}
	return u
}

// Write writes r as indented JSON followed by a newline, with the exit
// status the results give (ExitCode).
func Write(w io.Writer, r *engine.Results) error { return WriteExit(w, r, ExitCode(r)) }

// WriteExit writes r with the exit status exit (a command with --draft
// exits 0 where ExitCode says 2).
func WriteExit(w io.Writer, r *engine.Results, exit int) error { return Encode(w, Build(r, exit)) }

// FailureDoc is the document of a command that could not produce results:
// the sheet did not load, or a flag, argument, file or --set was wrong.
// It has the schema of the command, and the problems say why.
type FailureDoc struct {
	Schema        string    `json:"schema"`
	ExitCode      int       `json:"exit_code"`
	BeforeResults bool      `json:"failed_before_results"` // always true: tells it from a document with results
	Problems      []Problem `json:"problems"`
	Caution       string    `json:"caution"`
}

// Failure builds the document of a command that could not produce results.
func Failure(schema string, exit int, problems []Problem) *FailureDoc {
	if problems == nil {
		problems = []Problem{}
	}
	return &FailureDoc{Schema: schema, ExitCode: exit, BeforeResults: true, Problems: problems, Caution: Caution}
}

// Encode writes v as indented JSON, HTML characters unescaped.
func Encode(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(v)
}

// depNames are the names of the cells c uses, in order of first use (every
// cell of the sheet is in r.Cells, in the program's order).
func depNames(r *engine.Results, c *engine.Cell) []string {
	deps := r.Deps(c)
	names := make([]string, len(deps))
	for k, j := range deps {
		names[k] = r.Cells[j].Cell.Name
	}
	return names
}
