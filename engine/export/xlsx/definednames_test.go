package xlsxout

import (
	"errors"
	"reflect"
	"strconv"
	"testing"

	"github.com/xuri/excelize/v2"
)

// TestAddNames: the linear path stores exactly what SetDefinedName called
// name by name stores (the reference behaviour, excelize v2.11.1), in the
// same order, and fails on the same name with the same error.
func TestAddNames(t *testing.T) {
	many := make([]excelize.DefinedName, 300)
	for i := range many {
		many[i] = excelize.DefinedName{Name: "v" + strconv.Itoa(i), RefersTo: calcValueRef(3 + i), Comment: "v" + strconv.Itoa(i)}
	}
	dataCol := excelize.DefinedName{Name: "threads.d", RefersTo: dataColumnRef("A", 3, 9)}
	cases := []struct {
		name    string
		before  []excelize.DefinedName // set with SetDefinedName first
		names   []excelize.DefinedName
		wantErr int // index of the failing name, -1 for none
	}{
		{name: "empty workbook", names: many, wantErr: -1},
		{name: "none", names: nil, wantErr: -1},
		{name: "one", names: many[:1], wantErr: -1},
		{name: "after existing names", before: many[:2], names: append([]excelize.DefinedName{dataCol}, many[2:40]...), wantErr: -1},
		{name: "same name in a sheet scope is not a duplicate", before: []excelize.DefinedName{{Name: "v0", RefersTo: "Sheet1!$A$1", Scope: "Sheet1"}},
			names: many[:5], wantErr: -1},
		{name: "sheet-scoped among them", names: []excelize.DefinedName{many[0], {Name: "loc", RefersTo: "Sheet1!$B$2", Scope: "Sheet1"}, many[1]}, wantErr: -1},
		{name: "duplicate of an existing name", before: many[3:4], names: many[:5], wantErr: 3},
		{name: "duplicate within the list", names: []excelize.DefinedName{many[0], many[1], many[0]}, wantErr: 2},
		{name: "name excelize refuses", names: []excelize.DefinedName{many[0], {Name: "1st", RefersTo: "Sheet1!$A$1"}}, wantErr: 1},
		{name: "first name refused", names: []excelize.DefinedName{{Name: "a b", RefersTo: "Sheet1!$A$1"}, many[0]}, wantErr: 0},
		{name: "no reference", names: []excelize.DefinedName{many[0], many[1], {Name: "x"}}, wantErr: 2},
		{name: "duplicate without a reference", names: []excelize.DefinedName{many[0], {Name: "v0"}}, wantErr: 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			ref, fast := excelize.NewFile(), excelize.NewFile()
			defer ref.Close()
			defer fast.Close()
			for _, f := range []*excelize.File{ref, fast} {
				for i := range c.before {
					d := c.before[i]
					if err := f.SetDefinedName(&d); err != nil {
						t.Fatal(err)
					}
				}
			}
			wantI, wantErr := setNamesOneByOne(ref, clone(c.names))
			gotI, gotErr := addNames(fast, clone(c.names))
			if (wantErr != nil) != (c.wantErr >= 0) || wantErr != nil && wantI != c.wantErr {
				t.Fatalf("reference: failed at %d with %v, the case expects index %d", wantI, wantErr, c.wantErr)
			}
			if (gotErr == nil) != (wantErr == nil) || gotErr != nil && (gotI != wantI || gotErr.Error() != wantErr.Error() ||
				errors.Is(wantErr, excelize.ErrDefinedNameDuplicate) != errors.Is(gotErr, excelize.ErrDefinedNameDuplicate)) {
				t.Fatalf("addNames failed at %d with %v; SetDefinedName one by one failed at %d with %v", gotI, gotErr, wantI, wantErr)
			}
			want, got := ref.GetDefinedName(), fast.GetDefinedName()
			if !reflect.DeepEqual(got, want) {
				t.Fatalf("names differ:\n got %v\nwant %v", got, want)
			}
			if n := len(c.before) + len(c.names); c.wantErr < 0 && len(got) != n {
				t.Fatalf("%d names stored, want %d", len(got), n)
			}
		})
	}
}

func clone(ns []excelize.DefinedName) []excelize.DefinedName {
	return append([]excelize.DefinedName(nil), ns...)
}
