package units

// System says which practice a unit belongs to. It drives the `--system`
// filter of `sheaf units` and the choice of preferred display units.
type System uint8

const (
	// Neutral units are shared by both practices (s, h, rad, %, 1/K's K is
	// metric but s is not) or mix them; they are listed under either system.
	Neutral System = iota
	// Metric units: SI and the metric engineering units around it (kN, MPa, t).
	Metric
	// US units: US customary (in, ft, lbf, kip, psi, ksi, pcf, ...).
	US
)

// String names the system as `sheaf units` prints it.
func (s System) String() string {
	switch s {
	case Metric:
		return "metric"
	case US:
		return "us"
	}
	return "both"
}

// ParseSystem reads a system name as written on the command line.
func ParseSystem(name string) (System, bool) {
	switch name {
	case "metric", "si", "SI":
		return Metric, true
	case "us", "US", "imperial":
		return US, true
	case "both", "any", "":
		return Neutral, true
	}
	return Neutral, false
}

// sysMask collects the systems of the atoms of a unit expression; a unit that
// mixes metric and US atoms is reported as Neutral.
type sysMask uint8

func (m sysMask) system() System {
	switch m {
	case 1 << Metric:
		return Metric
	case 1 << US:
		return US
	}
	return Neutral
}
