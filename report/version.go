package report

import "runtime/debug"

// BuildVersion is the version recorded in the build: the main module's
// version (a release tag, or the pseudo-version go build derives from the
// commit), else the commit it was built from ("+dirty" when the working
// tree had changes), else "devel" (go test, go run, no VCS). The same
// binary always gives the same version, so outputs that print it stay
// byte-identical from run to run.
func BuildVersion() string {
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return "devel"
	}
	return VersionOf(info)
}

// VersionOf reads the version from build information (see BuildVersion).
func VersionOf(info *debug.BuildInfo) string {
	if v := info.Main.Version; v != "" && v != "(devel)" {
		return v
	}
	var rev string
	dirty := false
	for _, s := range info.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			dirty = s.Value == "true"
		}
	}
	if rev == "" {
		return "devel"
	}
	if len(rev) > 12 {
		rev = rev[:12]
	}
	if dirty {
		rev += "+dirty"
	}
	return rev
}
