// Package catalogue is the family of lookups into the tables the trade
// already has: standard steel sections (EN 10365 I and H profiles, EN 10210-2
// hot-finished hollow sections, ASTM A500 HSS and a range of W shapes), ISO
// metric threads, bolt classes, steel and aluminium grades by thickness band,
// concrete classes and reinforcing steel.
//
// The values live in data files (data/*.cat, embedded in the binary), one
// table per block, each with its source and a mark of whether its values
// were typed from memory rather than from the published text. A firm adds
// its own tables in files of the same format in a folder named by the
// environment variable SHEAF_CATALOGUES; they are read through the same
// parser and the same checks, and may add keys but never replace a shipped
// one, so a sheet's numbers cannot change because a file was added.
//
// Every lookup goes through one function (Catalogue.Find) that refuses an
// unknown key and names the nearest keys of the same series. Section
// properties are not copied from the tables: they are computed from the
// dimensions with the root and corner radii as exact circular arcs
// (funcs/section), and the tables' own A and I are kept only to test that
// computation. The file format is described in SPEC.md ("Catalogue files").
package catalogue
