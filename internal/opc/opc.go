package opc

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"io"
	"slices"
	"strings"
	"time"
)

// Canonical rewrites a workbook package so that the same sheet gives the
// same bytes on every run: the members in name order ([Content_Types].xml
// first, as the Open Packaging Conventions expect it near the start), one
// fixed modification time, and the content types sorted. excelize writes
// members and content types in the order of its maps, which changes from
// run to run; the parts themselves are left exactly as written.
func Canonical(pkg []byte) ([]byte, error) {
	zr, err := zip.NewReader(bytes.NewReader(pkg), int64(len(pkg)))
	if err != nil {
		return nil, err
	}
	files := slices.Clone(zr.File)
	slices.SortFunc(files, func(a, b *zip.File) int {
		ka, kb := a.Name != contentTypes, b.Name != contentTypes
		if ka != kb {
			if !ka {
				return -1
			}
			return 1
		}
		return strings.Compare(a.Name, b.Name)
	})
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	stamp := time.Date(1980, 1, 1, 0, 0, 0, 0, time.UTC) // the earliest a zip can hold
	for _, f := range files {
		rc, err := f.Open()
		if err != nil {
			return nil, err
		}
		data, err := io.ReadAll(rc)
		rc.Close()
		if err != nil {
			return nil, err
		}
		if f.Name == contentTypes {
			if data, err = sortContentTypes(data); err != nil {
				return nil, err
			}
		}
		w, err := zw.CreateHeader(&zip.FileHeader{Name: f.Name, Method: zip.Deflate, Modified: stamp})
		if err != nil {
			return nil, err
		}
		if _, err := w.Write(data); err != nil {
			return nil, err
		}
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

const contentTypes = "[Content_Types].xml"

// types is [Content_Types].xml, read just far enough to sort it.
type types struct {
	XMLName   xml.Name   `xml:"http://schemas.openxmlformats.org/package/2006/content-types Types"`
	Defaults  []typeDef  `xml:"Default"`
	Overrides []typePart `xml:"Override"`
}

type typeDef struct {
	Extension   string `xml:"Extension,attr"`
	ContentType string `xml:"ContentType,attr"`
}

type typePart struct {
	PartName    string `xml:"PartName,attr"`
	ContentType string `xml:"ContentType,attr"`
}

func sortContentTypes(data []byte) ([]byte, error) {
	var t types
	if err := xml.Unmarshal(data, &t); err != nil {
		return nil, err
	}
	slices.SortFunc(t.Defaults, func(a, b typeDef) int { return strings.Compare(a.Extension, b.Extension) })
	slices.SortFunc(t.Overrides, func(a, b typePart) int { return strings.Compare(a.PartName, b.PartName) })
	out, err := xml.Marshal(t)
	if err != nil {
		return nil, err
	}
	return append([]byte(xml.Header), out...), nil
}
