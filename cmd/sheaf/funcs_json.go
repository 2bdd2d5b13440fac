package main

import (
	"slices"
	"strings"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// funcsSchema is the version of the JSON of `sheaf funcs --json`.
const funcsSchema = "sheaf.funcs/1"

type funcsDoc struct {
	Schema    string            `json:"schema"`
	ExitCode  int               `json:"exit_code"`
	Functions []funcJSON        `json:"functions"`
	Problems  []jsonout.Problem `json:"problems"`
}

type funcJSON struct {
	Name      string      `json:"name"`
	Family    string      `json:"family"`
	Signature string      `json:"signature"`
	Summary   string      `json:"summary,omitempty"`
	Rule      string      `json:"rule,omitempty"` // built-ins: the dimension rule
	Formula   string      `json:"formula,omitempty"`
	Source    string      `json:"source,omitempty"`
	Params    []paramJSON `json:"params"`
	Result    *typeJSON   `json:"result"` // null when the arguments decide it
}

type paramJSON struct {
	Name     string   `json:"name"`
	Optional bool     `json:"optional"`
	Doc      string   `json:"doc,omitempty"`
	Type     typeJSON `json:"type"`
}

// typeJSON is a type: a number has its unit (the preferred metric unit of
// its dimension, as the listing shows it) and its dimension.
type typeJSON struct {
	Kind      string      `json:"kind"`
	Unit      string      `json:"unit,omitempty"`
	Dimension string      `json:"dimension,omitempty"`
	Name      string      `json:"name,omitempty"`
	Elem      *typeJSON   `json:"elem,omitempty"`
	Fields    []paramJSON `json:"fields,omitempty"`
}

func typeOf(t *funcs.Type) *typeJSON {
	if t == nil {
		return nil
	}
	j := &typeJSON{Kind: t.Kind.String(), Name: t.Name}
	switch t.Kind {
	case funcs.Number:
		j.Unit = strings.Trim(unitText(t.Dim), "[]")
		j.Dimension = t.Dim.String()
		if t.Dim.IsNone() {
			j.Dimension = "1"
		}
		if _, ok := units.Preferred(t.Dim, units.Metric); !ok && !t.Dim.IsNone() {
			j.Unit = units.SISymbol(t.Dim)
		}
	case funcs.List:
		j.Elem = typeOf(t.Elem)
	case funcs.Record, funcs.Table:
		for _, f := range t.Fields {
			j.Fields = append(j.Fields, paramJSON{Name: f.Name, Optional: f.Optional, Doc: docText(f.Doc, f.Type), Type: *typeOf(f.Type)})
		}
	}
	return j
}

// runFuncsJSON writes every function (of --family, or the one named) as
// JSON.
func runFuncsJSON(a *app, o funcsOptions, name string) error {
	fams := familyNames()
	if o.family != "" && !slices.Contains(fams, o.family) {
		return userErrorf("--family: no family %q%s; families are %s", o.family, didYouMean(o.family, fams), strings.Join(fams, ", "))
	}
	doc := funcsDoc{Schema: funcsSchema, Functions: []funcJSON{}, Problems: []jsonout.Problem{}}
	var names []string
	for _, b := range check.Builtins {
		names = append(names, b.Name)
		if (name == "" || name == b.Name) && (o.family == "" || o.family == builtinFamily) {
			doc.Functions = append(doc.Functions, funcJSON{Name: b.Name, Family: builtinFamily, Signature: b.Sig, Rule: b.Rule, Params: []paramJSON{}})
		}
	}
	for _, d := range funcs.All() {
		names = append(names, d.Name)
		if (name != "" && name != d.Name) || (o.family != "" && o.family != d.Family) {
			continue
		}
		f := funcJSON{Name: d.Name, Family: d.Family, Signature: signature(d), Summary: d.Summary, Formula: d.Formula, Source: d.Source,
			Params: []paramJSON{}, Result: typeOf(d.Result)}
		for _, p := range d.Params {
			f.Params = append(f.Params, paramJSON{Name: p.Name, Optional: p.Optional, Doc: docText(p.Doc, p.Type), Type: *typeOf(p.Type)})
		}
		doc.Functions = append(doc.Functions, f)
	}
	if name != "" && len(doc.Functions) == 0 {
		return userErrorf("unknown function %q%s; `sheaf funcs` lists them all", name, didYouMean(name, names))
	}
	return jsonout.Encode(a.stdout, doc)
}
