package planetary

import (
	"errors"
	"strconv"
)

// Sentinel errors. Every error the package returns wraps one of them, so
// errors.Is tells the kinds apart; a *DesignError or *InputError carries the
// numbers as well.
var (
	// ErrTeeth means a tooth or planet count is zero or negative, or the ring
	// is not larger than the sun.
	ErrTeeth = errors.New("planetary: invalid tooth count")
	// ErrRatio means a fixed-carrier ratio is zero, one, NaN or infinite, or
	// lies in the self-locking band around one (see FromRatio).
	ErrRatio = errors.New("planetary: invalid fixed-carrier ratio")
	// ErrEfficiency means a basic efficiency outside (0, 1] or NaN.
	ErrEfficiency = errors.New("planetary: basic efficiency outside (0, 1]")
	// ErrModule means a negative, NaN or infinite module.
	ErrModule = errors.New("planetary: invalid module")
	// ErrArrangement means an Arrangement other than SinglePlanet or DoublePlanet.
	ErrArrangement = errors.New("planetary: unknown arrangement")
	// ErrMember means a Member other than Sun, Ring or Carrier, or the same
	// member given twice where two different ones are needed.
	ErrMember = errors.New("planetary: invalid member")
	// ErrNotFinite means a NaN or infinite speed or torque was given, or a
	// result would overflow float64.
	ErrNotFinite = errors.New("planetary: value not finite")
	// ErrWillis means the three speeds given do not satisfy the Willis
	// equation (relative residual above 1e-9).
	ErrWillis = errors.New("planetary: speeds violate the Willis equation")
	// ErrNoTeeth means the operation needs tooth counts but the set was built
	// from a ratio.
	ErrNoTeeth = errors.New("planetary: set has no tooth counts")

	// ErrShift means a profile-shift coefficient is NaN, infinite or
	// beyond ±MaxShift.
	ErrShift = errors.New("planetary: invalid profile shift")

	// ErrCoaxial means the planets do not fit between sun and ring on a
	// common centre distance (with their profile shifts).
	ErrCoaxial = errors.New("planetary: coaxial condition violated")
	// ErrAssembly means the planets cannot be assembled equally spaced.
	ErrAssembly = errors.New("planetary: assembly condition violated")
	// ErrNeighbour means neighbouring planets would touch.
	ErrNeighbour = errors.New("planetary: neighbour condition violated")
	// ErrUndercut means an external gear has fewer teeth than the minimum
	// against undercut at 20° pressure angle for its profile shift, or a
	// shift so large that its teeth come to a point.
	ErrUndercut = errors.New("planetary: too few teeth, undercut")
)

// DesignError reports one violated design condition with its numbers. New
// and Check join all violations with errors.Join; errors.As finds each.
type DesignError struct {
	Condition string  // "coaxial", "assembly", "neighbour", "undercut", "teeth"
	Quantity  string  // what was compared, e.g. "ring teeth"
	Value     float64 // the value found
	Limit     float64 // the limit or required value
	Unit      string  // unit of Value and Limit: "teeth", "mm", "module" (multiples of the module) or ""
	Detail    string  // the relation checked, in words
	Err       error   // the sentinel: ErrCoaxial, ErrAssembly, ErrNeighbour, ErrUndercut or ErrTeeth
}

// Error returns the message with the numbers.
func (e *DesignError) Error() string {
	s := "planetary: " + e.Condition + " condition: " + e.Quantity + " " + fmtNum(e.Value)
	if e.Unit != "" {
		s += " " + e.Unit
	}
	s += ", limit " + fmtNum(e.Limit)
	if e.Unit != "" {
		s += " " + e.Unit
	}
	if e.Detail != "" {
		s += " (" + e.Detail + ")"
	}
	return s
}

// Unwrap returns the sentinel so that errors.Is finds it.
func (e *DesignError) Unwrap() error { return e.Err }

// InputError reports a bad input value: which quantity, its value and the
// limit it crossed (NaN where there is no single limit).
type InputError struct {
	Quantity string  // e.g. "sun speed", "basic efficiency"
	Value    float64 // the value given
	Limit    float64 // the limit crossed, if any
	Err      error   // the sentinel
}

// Error returns the message with the numbers.
func (e *InputError) Error() string {
	kind := "planetary: invalid input"
	if e.Err != nil {
		kind = e.Err.Error()
	}
	return kind + ": " + e.Quantity + " = " + fmtNum(e.Value)
}

// Unwrap returns the sentinel so that errors.Is finds it.
func (e *InputError) Unwrap() error { return e.Err }

func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
