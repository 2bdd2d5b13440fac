package xlsxout

import (
	"strings"

	"github.com/xuri/excelize/v2"
)

// paperA4 is the spreadsheet paper size code of A4 (ECMA-376 Part 1,
// 18.3.1.63 pageSetup, paperSize 9).
const paperA4 = 9

// finishTab sets up printing (A4, fit to the page width, title and page
// numbers in the header and footer) and protects the tab without a
// password, so that only the unlocked input cells can be typed in.
func (x *exporter) finishTab(tab string, landscape bool) error {
	size, orient, one, zero := paperA4, "portrait", 1, 0
	if landscape {
		orient = "landscape"
	}
	if err := x.f.SetPageLayout(tab, &excelize.PageLayoutOptions{Size: &size, Orientation: &orient, FitToWidth: &one, FitToHeight: &zero}); err != nil {
		return err
	}
	fit := true
	if err := x.f.SetSheetProps(tab, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	m := x.s.Meta()
	title := m.Title
	if title == "" {
		title = x.s.Name()
	}
	right := m.Project
	if m.Revision != "" {
		right = strings.TrimSpace(right + "  rev. " + m.Revision)
	}
	// The left and right parts share the width of the page: each gets
	// under half of what fits at 9 points (portrait about 100 characters,
	// landscape about 150), so they never print over each other.
	half := 46
	if landscape {
		half = 70
	}
	hf := &excelize.HeaderFooterOptions{
		OddHeader: "&L&9" + hfText(title, half) + "&R&9" + hfText(right, half),
		OddFooter: "&L&9" + hfText(x.gen, 40) + "&C&9" + hfText(tab, 20) + "&R&9page &P of &N",
	}
	if err := x.f.SetHeaderFooter(tab, hf); err != nil {
		return err
	}
	return x.f.ProtectSheet(tab, &excelize.SheetProtectionOptions{
		SelectLockedCells: true, SelectUnlockedCells: true, FormatColumns: true, FormatRows: true,
	})
}

// hfText escapes text for a header or footer (& starts a code there) and
// shortens it: a header holds at most 255 characters.
func hfText(s string, n int) string {
	r := []rune(s)
	if len(r) > n {
		s = string(r[:n-1]) + "…"
	}
	return strings.ReplaceAll(s, "&", "&&")
}
