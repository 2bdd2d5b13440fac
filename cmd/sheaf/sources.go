package main

import (
	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// sourcesFor gives the text of every file the diagnostics name, so that a
// problem inside a template gets its snippet too. The sheet compiled from
// memory (name, src) wins over its copy on disk, which may have changed since.
func sourcesFor(list diag.List, name string, src []byte) diag.Sources {
	srcs := engine.ReadSources(list)
	srcs[name] = src
	return srcs
}
