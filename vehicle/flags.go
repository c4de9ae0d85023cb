package vehicle

import (
	"strconv"
	"strings"
	"time"

	"github.com/powersplit-dev/powersplit/units"
)

// A Flag is a rated limit crossed at an operating point without making it
// infeasible: a rated continuous pressure exceeded below the relief
// setting, a tyre carrying more than its rated load. Flags are warnings:
// they are reported, never hidden.
type Flag struct {
	// Name says what crossed its rating, for example
	// "hydrostat: pump pressure" or "tyre load".
	Name string
	// Value is the magnitude reached (the largest, in a segment's or a
	// day's flags) and Limit the rating, as typed measures that print in
	// the trade's units.
	Value, Limit units.Measure
	// Unchecked means the limit is not rated (zero in its spec): nothing
	// was checked against it. Name then names the limit (for example
	// "hydrostat: motor 1 speed: maximum speed not rated, not checked",
	// or "front tyre load") and Value and Limit are zero.
	Unchecked bool
	// Extrapolated means the traction model ran outside the range it was
	// fitted to (see traction.Pull.Outside): Name says how, and the pull
	// is an extrapolation. Value and Limit are zero.
	Extrapolated bool
	// Time is the time spent beyond the rating: zero at a single point,
	// summed over the steps of a segment or a day.
	Time time.Duration
}

// String returns "<name> <value> above rated <limit>[ for <time>]", with
// values in the trade's units: "hydrostat: pump pressure 290 bar above
// rated 150 bar for 42 min".
//
// An Extrapolated flag reads "<name> (the pull is extrapolated)[ for
// <time>]". An Unchecked flag reads "<name>: not rated, not checked[ for <time>]"
// (its name alone when it says so already).
func (f Flag) String() string {
	if f.Extrapolated {
		s := f.Name + " (the pull is extrapolated)"
		if f.Time > 0 {
			s += " for " + minutes(f.Time)
		}
		return s
	}
	if f.Unchecked {
		s := f.Name
		if !strings.HasSuffix(s, "not checked") {
			s += ": not rated, not checked"
		}
		if f.Time > 0 {
			s += " for " + minutes(f.Time)
		}
		return s
	}
	s := f.Name + " " + f.Value.String() + " above rated " + f.Limit.String()
	if f.Time > 0 {
		s += " for " + minutes(f.Time)
	}
	return s
}

// minutes formats a duration as "42 min", or in seconds below a minute.
func minutes(d time.Duration) string {
	if d < time.Minute {
		return strconv.FormatFloat(d.Seconds(), 'f', 0, 64) + " s"
	}
	return strconv.FormatFloat(d.Minutes(), 'f', 0, 64) + " min"
}

// addFlags merges the flags of one step of duration dt into acc: one entry
// per Name, with the largest value reached and the time summed.
func addFlags(acc []Flag, fs []Flag, dt time.Duration) []Flag {
	for _, f := range fs {
		found := false
		for i := range acc {
			if acc[i].Name == f.Name {
				if f.Value.SI > acc[i].Value.SI {
					acc[i].Value = f.Value
				}
				acc[i].Time += dt
				found = true
				break
			}
		}
		if !found {
			f.Time = dt
			acc = append(acc, f)
		}
	}
	return acc
}

// Flags returns the rated limits crossed during the day, one per name, with
// the largest value reached and the time spent beyond the rating summed
// over the segments that ran.
func (d Day) Flags() []Flag {
	var out []Flag
	for _, s := range d.Segments {
		for _, f := range s.Flags {
			t := f.Time
			f.Time = 0
			out = addFlags(out, []Flag{f}, t)
		}
	}
	return out
}
