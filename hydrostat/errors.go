package hydrostat

import (
	"errors"
	"strconv"
)

// Sentinel errors. A *LimitError unwraps to one of ErrPressureLimit,
// ErrSpeedLimit or ErrSettingLimit, and errors.Is also matches it with
// ErrLimit.
var (
	// ErrInvalid means an argument or a specification is not valid:
	// negative or zero where a positive value is needed, NaN or infinite,
	// wrong slice lengths, a missing part.
	ErrInvalid = errors.New("hydrostat: invalid input")
	// ErrLimit is the kind of every *LimitError: a rated limit was crossed.
	ErrLimit = errors.New("hydrostat: rated limit crossed")
	// ErrPressureLimit means a unit's peak pressure or the loop's relief
	// setting was reached.
	ErrPressureLimit = errors.New("hydrostat: pressure limit reached")
	// ErrSpeedLimit means a unit turns faster than its maximum speed.
	ErrSpeedLimit = errors.New("hydrostat: speed limit reached")
	// ErrSettingLimit means a displacement setting beyond its range
	// ([-1, 1], or a schedule's minimum motor setting) was asked for or
	// would be needed.
	ErrSettingLimit = errors.New("hydrostat: setting limit reached")
	// ErrNoSolution means no operating point satisfies the equations, for
	// example flow continuity with every shaft standing still under pressure.
	ErrNoSolution = errors.New("hydrostat: no solution")
	// ErrModel means a loss model failed or returned a negative, NaN or
	// infinite loss.
	ErrModel = errors.New("hydrostat: loss model failed")
	// ErrOutsideMap means an operating point lies outside a measured map's
	// axes; a map is never extrapolated.
	ErrOutsideMap = errors.New("hydrostat: operating point outside the measured map")
)

// A LimitError reports a crossed rated limit: which quantity, its value and
// the limit, in the unit named by Unit ("bar", "rpm" or "" for a relative
// setting). Err is ErrPressureLimit, ErrSpeedLimit or ErrSettingLimit.
type LimitError struct {
	Quantity     string // e.g. "pump speed", "relief pressure", "motor setting"
	Value, Limit float64
	Unit         string
	Err          error
}

// Error returns a message naming the quantity, its value and the limit.
func (e *LimitError) Error() string {
	u := ""
	if e.Unit != "" {
		u = " " + e.Unit
	}
	return "hydrostat: " + e.Quantity + " " + strconv.FormatFloat(e.Value, 'g', 6, 64) + u +
		" beyond limit " + strconv.FormatFloat(e.Limit, 'g', 6, 64) + u
}

// Unwrap returns the finer sentinel (ErrPressureLimit, ErrSpeedLimit or ErrSettingLimit).
func (e *LimitError) Unwrap() error { return e.Err }

// Is reports whether target is ErrLimit, so errors.Is(err, ErrLimit) finds every limit error.
func (e *LimitError) Is(target error) bool { return target == ErrLimit }
