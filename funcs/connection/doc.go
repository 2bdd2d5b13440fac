// Package connection is the family of resistance formulas of fasteners in
// tension: bolts and threaded rods (EN 1993-1-8 Table 3.4). The stress area
// of a thread comes from the catalogue family (thread("M16").A_s), the
// strengths from bolt_class("8.8").
package connection
