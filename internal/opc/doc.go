// Package opc writes Office Open XML packages (zip files of parts) in one
// canonical form, so that a workbook's bytes follow from its content alone.
package opc
