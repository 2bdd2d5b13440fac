package jsonout

import (
	"encoding/json"
	"io"
	"math"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/funcs"
)

// Document is the JSON shape of a run.
type Document struct {
	Meta     Meta      `json:"meta"`
	Cells    []Cell    `json:"cells"`
	Checks   []Check   `json:"checks"`
	Failed   int       `json:"failed"`
	Problems []Problem `json:"problems"`
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

// Cell is one cell. SI and Value are null when the cell is unknown or not
// a number.
type Cell struct {
	Name        string    `json:"name"`
	Kind        string    `json:"kind"`
	Section     string    `json:"section,omitempty"`
	Known       bool      `json:"known"`
	SI          *float64  `json:"si"`
	Unit        string    `json:"unit"`
	Value       *float64  `json:"value"`
	Text        string    `json:"text"`
	List        []float64 `json:"list,omitempty"`   // lists of numbers, SI
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

// Field is a numeric or text field of a record value.
type Field struct {
	Name string   `json:"name"`
	SI   *float64 `json:"si,omitempty"`
	Text string   `json:"text,omitempty"`
}

// Column is a column of a table, in SI.
type Column struct {
	Name string    `json:"name"`
	SI   []float64 `json:"si"`
}

// Check is one design check.
type Check struct {
	Name        string   `json:"name"`
	Known       bool     `json:"known"`
	Unit        string   `json:"unit"`
	DemandSI    *float64 `json:"demand_si"`
	CapacitySI  *float64 `json:"capacity_si"`
	Demand      *float64 `json:"demand"`
	Capacity    *float64 `json:"capacity"`
	Utilisation *float64 `json:"utilisation"`
	Pass        bool     `json:"pass"`
	Description string   `json:"description,omitempty"`
	Reference   string   `json:"reference,omitempty"`
	// Combination is the outcome over the combinations of its limit state,
	// for a check that depends on actions.
	Combination *CheckCombination `json:"combination,omitempty"`
}

// Problem is a run-time problem at a cell.
type Problem struct {
	Pos     string `json:"pos"`
	Summary string `json:"summary"`
	Detail  string `json:"detail,omitempty"`
	Hint    string `json:"hint,omitempty"`
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

// Build converts results to the JSON document.
func Build(r *engine.Results) *Document {
	d := &Document{
		Meta: Meta{Title: r.Meta.Title, Project: r.Meta.Project, Basis: r.Meta.Basis, Author: r.Meta.Author,
			Checker: r.Meta.Checker, Date: r.Meta.Date, Revision: r.Meta.Revision, Units: r.Meta.System.String()},
		Cells: []Cell{}, Checks: []Check{}, Problems: []Problem{}, Failed: r.Failed(), Caution: Caution,
	}
	for _, c := range r.Cells {
		jc := Cell{Name: c.Cell.Name, Kind: c.Cell.Kind.String(), Section: c.Cell.Section, Known: c.Known,
			Unit: c.Unit.Symbol, Text: c.Text, Description: c.Cell.Description, Reference: c.Cell.Reference,
			Expr: c.Cell.Expr, Deps: c.Cell.Deps}
		if c.Cell.Action != nil {
			jc.Action = c.Cell.Action.Kind.Text()
		}
		if r.Combos != nil && r.Combos.CellIn[c.Cell.Index] >= 0 {
			jc.InCombination = r.Combos.All[r.Combos.CellIn[c.Cell.Index]].Name
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
						fd.SI = num(x)
					case string:
						fd.Text = x
					}
					jc.Fields = append(jc.Fields, fd)
				}
			case *funcs.TableValue:
				for i, f := range v.Type.Fields {
					jc.Columns = append(jc.Columns, Column{Name: f.Name, SI: v.Cols[i]})
				}
			}
		}
		d.Cells = append(d.Cells, jc)
	}
	for _, c := range r.Checks {
		jc := Check{Name: c.Cell.Name, Known: c.Known, Unit: c.Unit.Symbol, Pass: c.Pass,
			Description: c.Cell.Description, Reference: c.Cell.Reference}
		if c.Known {
			jc.DemandSI, jc.CapacitySI = num(c.Demand), num(c.Capacity)
			jc.Demand, jc.Capacity = num(c.Demand/c.Unit.Factor), num(c.Capacity/c.Unit.Factor)
			jc.Utilisation = num(c.Util)
		}
		jc.Combination = checkCombo(r, c)
		d.Checks = append(d.Checks, jc)
	}
	d.Combinations = buildCombos(r)
	for _, p := range r.Problems {
		d.Problems = append(d.Problems, Problem{Pos: p.Range.Start.String(), Summary: p.Summary, Detail: p.Detail, Hint: p.Hint})
	}
	return d
}

// Write writes r as indented JSON followed by a newline.
func Write(w io.Writer, r *engine.Results) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(Build(r))
}
