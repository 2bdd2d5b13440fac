package funcs

// Value is a run-time value. Its Go type follows its static Type:
//
//	Number              float64, in SI base units
//	Bool                bool
//	String              string
//	Record              *RecordValue
//	List of Number      []float64
//	List of other       []Value
//	Table               *TableValue
//	Func                *FuncValue
//
// Dimensions are not carried at run time: the checker proved them.
type Value = any

// RecordValue is a record: Fields line up with Type.Fields. Payload lets a
// family keep a Go value behind a record (a solved bar, a polygon), so that a
// later function gets it without rebuilding it from the fields.
type RecordValue struct {
	Type    *Type
	Fields  []Value
	Payload any
}

// Get returns the named field, or nil.
func (r *RecordValue) Get(name string) Value {
	if i := r.Type.Field(name); i >= 0 {
		return r.Fields[i]
	}
	return nil
}

// Num returns the named field as a number, or def when it is absent or not a number.
func (r *RecordValue) Num(name string, def float64) float64 {
	if v, ok := r.Get(name).(float64); ok {
		return v
	}
	return def
}

// TableValue is a table: one SI column per field of Type.Fields, all of the
// same length.
type TableValue struct {
	Type *Type
	Cols [][]float64
}

// Rows returns the number of rows.
func (t *TableValue) Rows() int {
	if len(t.Cols) == 0 {
		return 0
	}
	return len(t.Cols[0])
}

// Col returns the named column, or nil.
func (t *TableValue) Col(name string) []float64 {
	if i := t.Type.Field(name); i >= 0 {
		return t.Cols[i]
	}
	return nil
}

// FuncValue is a function value: a user function of the sheet handed to a
// plugin (a modulus field E(y, z), a load b(x)). Call returns NaN when the
// function fails for those arguments; the caller must treat NaN as an error.
// Call is safe for concurrent use.
type FuncValue struct {
	Type *Type
	Name string
	Call func(args ...float64) float64
}
