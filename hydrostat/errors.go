package hydrostat

import (
	"errors"

	"github.com/powersplit-dev/powersplit/units"
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
	// ErrUndetermined means measurements cannot determine a coefficient of
	// a fitted loss model (too few points, or points that do not vary what
	// the coefficient multiplies).
	ErrUndetermined = errors.New("hydrostat: measurements cannot determine a coefficient")
	// ErrOutsideMap means an operating point lies outside a measured map's
	// axes; a map is never extrapolated.
	ErrOutsideMap = errors.New("hydrostat: operating point outside the measured map")
)

// A LimitError reports a crossed rated limit: which quantity, its value and
// the limit, as typed measures that print in the trade's units (bar, rpm,
// a plain number for a relative setting). Err is ErrPressureLimit,
// ErrSpeedLimit or ErrSettingLimit.
type LimitError struct {
	Quantity string        // e.g. "pump speed", "high-line pressure", "motor setting"
	Value    units.Measure // the value reached or needed
	Bound    string        // what the limit is: "relief setting", "peak pressure", "maximum speed", "full displacement", ...; "" reads "limit"
	Limit    units.Measure
	Err      error
}

// Error returns "hydrostat: <quantity> <value> above <bound> <limit>"
// ("below" when the value lies under the limit), for example "hydrostat:
// pump speed 3100 rpm above maximum speed 2800 rpm".
func (e *LimitError) Error() string {
	b := make([]byte, 0, 96)
	b = append(b, "hydrostat: "...)
	return string(units.AppendLimit(b, e.Quantity, e.Value, e.Bound, e.Limit))
}

// Unwrap returns the finer sentinel (ErrPressureLimit, ErrSpeedLimit or ErrSettingLimit).
func (e *LimitError) Unwrap() error { return e.Err }

// Is reports whether target is ErrLimit, so errors.Is(err, ErrLimit) finds every limit error.
func (e *LimitError) Is(target error) bool { return target == ErrLimit }
