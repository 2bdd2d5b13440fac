package xlsxout

import (
	"slices"

	"github.com/xuri/excelize/v2"
)

// addNames adds workbook-scoped defined names, in order, as SetDefinedName
// would one by one, but in linear time. On failure it returns the index of
// the name that failed with the error.
//
// SetDefinedName compares each new name with every name the workbook
// already holds, which is quadratic: for a sheet of 10,000 cells it cost
// more than the rest of the export. Here every name still goes through
// SetDefinedName, so excelize validates and stores it as it always does,
// but the names added before are set aside for the call (the list is cut
// to zero length over the same backing array, so the new entry lands in
// place), and the duplicate check is a set lookup instead. This reaches
// the list through the exported fields of File.WorkBook (pinned excelize
// v2.11.1; TestAddNames compares the result with plain SetDefinedName
// calls). A workbook whose part is not loaded takes the plain path.
func addNames(f *excelize.File, names []excelize.DefinedName) (int, error) {
	wb := f.WorkBook
	if wb == nil || len(names) == 0 {
		return setNamesOneByOne(f, names)
	}
	// Names of the workbook scope already there, as excelize sees scope:
	// a sheet index that names no sheet counts as the workbook.
	seen := make(map[string]bool, len(names))
	if wb.DefinedNames != nil {
		for _, d := range wb.DefinedNames.DefinedName {
			if d.LocalSheetID == nil || f.GetSheetName(*d.LocalSheetID) == "" {
				seen[d.Name] = true
			}
		}
	}
	for i := range names {
		d := &names[i]
		if d.Scope != "" {
			// Sheet-scoped names are not batched; excelize checks them.
			if err := f.SetDefinedName(d); err != nil {
				return i, err
			}
			continue
		}
		if seen[d.Name] && d.RefersTo != "" {
			// (Without a reference excelize reports that first.)
			return i, excelize.ErrDefinedNameDuplicate
		}
		if wb.DefinedNames == nil {
			// The first name creates the list.
			if err := f.SetDefinedName(d); err != nil {
				return i, err
			}
			seen[d.Name] = true
			continue
		}
		list := &wb.DefinedNames.DefinedName
		if cap(*list)-len(*list) == 0 {
			*list = slices.Grow(*list, len(names)-i)
		}
		kept := *list
		*list = kept[len(kept):]
		err := f.SetDefinedName(d)
		added := *list
		*list = kept
		if err != nil {
			return i, err
		}
		*list = append(kept, added...)
		seen[d.Name] = true
	}
	return 0, nil
}

// setNamesOneByOne is the plain path, quadratic in the number of names.
func setNamesOneByOne(f *excelize.File, names []excelize.DefinedName) (int, error) {
	for i := range names {
		if err := f.SetDefinedName(&names[i]); err != nil {
			return i, err
		}
	}
	return 0, nil
}
