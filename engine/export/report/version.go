package report

import "runtime/debug"

// BuildVersion names the Sheaf that writes the report, from the build
// information of the running binary: the module version of a released
// build, or, for a development build, that it is one, with the commit it
// was built from where the build recorded it.
func BuildVersion() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "development build (no build information)"
	}
	return versionFrom(bi)
}

func versionFrom(bi *debug.BuildInfo) string {
	if v := bi.Main.Version; v != "" && v != "(devel)" {
		return v
	}
	rev, modified := "", false
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			modified = s.Value == "true"
		}
	}
	out := "development build"
	if rev != "" {
		if len(rev) > 12 {
			rev = rev[:12]
		}
		out += ", commit " + rev
		if modified {
			out += " with local changes"
		}
	}
	return out + " (not a release)"
}
