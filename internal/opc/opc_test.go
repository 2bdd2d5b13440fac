package opc

import (
	"archive/zip"
	"bytes"
	"testing"
)

// TestCanonical: two packages with the same parts in another order, with
// other times and content types in another order, become the same bytes.
func TestCanonical(t *testing.T) {
	make := func(order []string, types string) []byte {
		var b bytes.Buffer
		zw := zip.NewWriter(&b)
		for _, n := range order {
			w, _ := zw.Create(n)
			if n == contentTypes {
				w.Write([]byte(types))
			} else {
				w.Write([]byte("<x>" + n + "</x>"))
			}
		}
		zw.Close()
		return b.Bytes()
	}
	const ns = `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">`
	a := make([]string{"b.xml", contentTypes, "a.xml"}, ns+`<Default Extension="xml" ContentType="application/xml"/><Override PartName="/b.xml" ContentType="t"/><Override PartName="/a.xml" ContentType="t"/></Types>`)
	b := make([]string{"a.xml", "b.xml", contentTypes}, ns+`<Override PartName="/a.xml" ContentType="t"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/b.xml" ContentType="t"/></Types>`)
	ca, err := Canonical(a)
	if err != nil {
		t.Fatal(err)
	}
	cb, err := Canonical(b)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(ca, cb) {
		t.Fatal("the same parts give different bytes")
	}
	zr, err := zip.NewReader(bytes.NewReader(ca), int64(len(ca)))
	if err != nil {
		t.Fatal(err)
	}
	if zr.File[0].Name != contentTypes || zr.File[1].Name != "a.xml" {
		t.Errorf("member order %s, %s", zr.File[0].Name, zr.File[1].Name)
	}
}
