package main

import (
	"fmt"
	"io"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/check"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// funcsOptions are the flags of `sheaf funcs`.
type funcsOptions struct {
	family string // keep one family; empty lists all
	json   bool
}

// newFuncsCmd builds `sheaf funcs`, the listing of the plugin functions.
func newFuncsCmd(a *app) *cobra.Command {
	var o funcsOptions
	cmd := &cobra.Command{
		Use:   "funcs [NAME]",
		Short: "List the functions a sheet may call, or describe one",
		Long: `Without a name, list the built-in math functions with their dimension
rules, then every structural function by family with its signature in
units: name(parameter [unit], ...) -> result [unit], and a one-line summary.
A parameter marked ? may be left out. Units shown are the preferred metric
display units; a sheet may pass any unit of the same dimension.

With a name, print what the function computes, its formula, each parameter
with its meaning and valid range, the result (with the fields of a record
result, which a sheet reads as r.field) and the published source.

With --json, the same as one JSON document on stdout (schema in
schema/sheaf.schema.json): each function with its family, summary, formula,
source, and each parameter and result with its kind, its unit (the
preferred metric unit) and its dimension.

Exit status here: 0 when listed, 2 for an unknown function or family.`,
		Example: `  sheaf funcs
  sheaf funcs --family section
  sheaf funcs chs`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) > 1 {
				return userErrorf("funcs takes at most one function name, got %d arguments", len(args))
			}
			return nil
		},
		ValidArgsFunction: completeFuncs,
		RunE: func(_ *cobra.Command, args []string) error {
			name := ""
			if len(args) == 1 {
				name = args[0]
			}
			if o.json {
				return jsonFailure(a, funcsSchema, name, runFuncsJSON(a, o, name))
			}
			if name != "" {
				return runFuncsDescribe(a, name)
			}
			return runFuncsList(a, o)
		},
	}
	cmd.Flags().StringVar(&o.family, "family", "", "list only the functions of this family")
	cmd.Flags().BoolVar(&o.json, "json", false, "print the functions as JSON")
	_ = cmd.RegisterFlagCompletionFunc("family", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return familyNames(), cobra.ShellCompDirectiveNoFileComp
	})
	return cmd
}

// completeFuncs completes the name of a function (built-in or plugin),
// each with its summary.
func completeFuncs(_ *cobra.Command, args []string, prefix string) ([]string, cobra.ShellCompDirective) {
	if len(args) > 0 {
		return nil, cobra.ShellCompDirectiveNoFileComp
	}
	var out []string
	for _, b := range check.Builtins {
		if strings.HasPrefix(b.Name, prefix) {
			out = append(out, b.Name+"\t"+b.Sig)
		}
	}
	for _, d := range funcs.All() {
		if strings.HasPrefix(d.Name, prefix) {
			out = append(out, d.Name+"\t"+d.Summary)
		}
	}
	return out, cobra.ShellCompDirectiveNoFileComp
}

// familyNames lists the families, the built-in math first.
func familyNames() []string {
	families := []string{builtinFamily}
	for _, d := range funcs.All() {
		if !slices.Contains(families, d.Family) {
			families = append(families, d.Family)
		}
	}
	return families
}

// builtinFamily is the family name under which the language's own math
// functions are listed; they live in the checker, not in the registry.
const builtinFamily = "math"

// runFuncsList prints the built-in math functions, then the plugin
// functions grouped by family.
func runFuncsList(a *app, o funcsOptions) error {
	all := funcs.All()
	families := []string{builtinFamily}
	for _, d := range all {
		if !slices.Contains(families, d.Family) {
			families = append(families, d.Family)
		}
	}
	if o.family != "" && !slices.Contains(families, o.family) {
		return userErrorf("--family: no family %q%s; families are %s", o.family, didYouMean(o.family, families), strings.Join(families, ", "))
	}
	w := a.stdout
	first := true
	for _, fam := range families {
		if o.family != "" && fam != o.family {
			continue
		}
		if !first {
			fmt.Fprintln(w)
		}
		first = false
		fmt.Fprintf(w, "%s\n", fam)
		if fam == builtinFamily {
			for _, b := range check.Builtins {
				fmt.Fprintf(w, "  %s\n      %s\n", b.Sig, b.Rule)
			}
			continue
		}
		for _, d := range all {
			if d.Family != fam {
				continue
			}
			fmt.Fprintf(w, "  %s\n", signature(d))
			fmt.Fprintf(w, "      %s\n", d.Summary)
		}
	}
	return nil
}

// runFuncsDescribe prints the full description of one function.
func runFuncsDescribe(a *app, name string) error {
	for _, b := range check.Builtins {
		if b.Name == name {
			fmt.Fprintf(a.stdout, "%s (built into the language)\n  %s\n\nDimension rule:\n", b.Name, b.Sig)
			wrap(a.stdout, b.Rule, "  ", 78)
			return nil
		}
	}
	d, ok := funcs.Lookup(name)
	if !ok {
		var names []string
		for _, b := range check.Builtins {
			names = append(names, b.Name)
		}
		for _, f := range funcs.All() {
			names = append(names, f.Name)
		}
		return userErrorf("unknown function %q%s; `sheaf funcs` lists them all", name, didYouMean(name, names))
	}
	w := a.stdout
	fmt.Fprintf(w, "%s (family %s)\n", d.Name, d.Family)
	fmt.Fprintf(w, "  %s\n\n", signature(d))
	fmt.Fprintf(w, "%s\n\n", d.Summary)
	wrap(w, docText(d.Doc, nil), "", 78)
	if d.Formula != "" {
		fmt.Fprintf(w, "\nFormula:\n  %s\n", d.Formula)
	}
	if len(d.Params) > 0 {
		fmt.Fprintf(w, "\nParameters:\n")
		for _, p := range d.Params {
			opt := ""
			if p.Optional {
				opt = " (optional)"
			}
			fmt.Fprintf(w, "  %s %s%s\n", p.Name, typeText(p.Type), opt)
			if p.Doc != "" {
				wrap(w, docText(p.Doc, p.Type), "      ", 78)
			}
		}
	}
	fmt.Fprintf(w, "\nResult:\n  %s\n", resultText(d))
	if r := d.Result; r != nil && (r.Kind == funcs.Record || r.Kind == funcs.Table) && len(r.Fields) > 0 {
		what := "fields"
		if r.Kind == funcs.Table {
			what = "columns"
		}
		fmt.Fprintf(w, "  %s:\n", what)
		for _, f := range r.Fields {
			fmt.Fprintf(w, "    %s %s\n", f.Name, typeText(f.Type))
			if f.Doc != "" {
				wrap(w, docText(f.Doc, f.Type), "        ", 78)
			}
		}
	}
	fmt.Fprintf(w, "\nSource:\n")
	wrap(w, d.Source, "  ", 78)
	return nil
}

// signature renders name(p [unit], q? [unit]) -> result.
func signature(d *funcs.Def) string {
	var b strings.Builder
	b.WriteString(d.Name + "(")
	for i, p := range d.Params {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(p.Name)
		if p.Optional {
			b.WriteString("?")
		}
		b.WriteString(" " + typeText(p.Type))
	}
	b.WriteString(") -> " + resultText(d))
	return b.String()
}

func resultText(d *funcs.Def) string {
	if d.Result == nil {
		return "number [unit from the arguments]"
	}
	return typeText(d.Result)
}

// unitText renders a dimension as its preferred metric display unit, or in
// base dimensions when no unit is listed for it.
func unitText(dim units.Dim) string {
	if dim.IsNone() {
		return "[1]"
	}
	if u, ok := units.Preferred(dim, units.Metric); ok {
		return "[" + u.Symbol + "]"
	}
	return "[" + dim.String() + "]"
}

// typeText renders a type for the listing: units for numbers, names for
// records and tables, the fields a structural parameter needs.
func typeText(t *funcs.Type) string {
	if t == nil {
		return "nothing"
	}
	switch t.Kind {
	case funcs.Number:
		return unitText(t.Dim)
	case funcs.List:
		return "list of " + typeText(t.Elem)
	case funcs.Record, funcs.Table:
		if t.Name != "" {
			if t.Kind == funcs.Table {
				return "table " + t.Name
			}
			return t.Name
		}
		parts := make([]string, len(t.Fields))
		for i, f := range t.Fields {
			opt := ""
			if f.Optional {
				opt = "?"
			}
			parts[i] = f.Name + opt + " " + typeText(f.Type)
		}
		return "{" + strings.Join(parts, ", ") + "}"
	case funcs.Func:
		ps := make([]string, len(t.Params))
		for i, p := range t.Params {
			ps[i] = typeText(p)
		}
		res := typeText(t.Result)
		if t.Result != nil && t.Result.Kind == funcs.Any {
			res = "number"
		}
		return "fn(" + strings.Join(ps, ", ") + ") -> " + res
	}
	return t.Kind.String()
}

// wrap writes text in lines of at most width runes, each led by indent.
func wrap(w io.Writer, text, indent string, width int) {
	line := indent
	n := len([]rune(indent))
	empty := true
	for _, word := range strings.Fields(text) {
		l := len([]rune(word))
		if !empty && n+1+l > width {
			fmt.Fprintln(w, line)
			line, n, empty = indent, len([]rune(indent)), true
		}
		if !empty {
			line += " "
			n++
		}
		line += word
		n += l
		empty = false
	}
	if !empty {
		fmt.Fprintln(w, line)
	}
}

// didYouMean formats diag.Nearest's suggestion for a one-line error, or
// gives "" when nothing is close.
func didYouMean(name string, names []string) string {
	best := diag.Nearest(name, names)
	if best == "" {
		return ""
	}
	return fmt.Sprintf(" (did you mean %q?)", best)
}
