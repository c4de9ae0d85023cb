package vehicle

import (
	"errors"
	"fmt"
	"time"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// Sentinel errors of the package. Every error this package returns wraps
// exactly one of them, so errors.Is finds the kind of failure.
var (
	// ErrInvalid means an input is out of its valid range, NaN or infinite.
	ErrInvalid = errors.New("vehicle: invalid input")
	// ErrEngineLimit means a demand lies beyond the engine: above its
	// full-load torque curve or outside its speed range.
	ErrEngineLimit = errors.New("vehicle: beyond the engine's limits")
	// ErrTraction means the tyres cannot deliver the pull the demand needs
	// (for example a grade beyond traction).
	ErrTraction = errors.New("vehicle: beyond traction")
	// ErrStability means the front axle would be unloaded: the demand
	// would tip the vehicle backwards or leave it unsteerable.
	ErrStability = errors.New("vehicle: front axle unloaded")
	// ErrTransmission means the transmission cannot run the operating point
	// (ratio out of range, a limit of its own crossed, or its power balance
	// does not close).
	ErrTransmission = errors.New("vehicle: transmission cannot run the point")
	// ErrPTOLimit means a PTO demand exceeds the PTO driveline's rating.
	ErrPTOLimit = errors.New("vehicle: beyond the PTO rating")
	// ErrInfeasible means no engine speed and range meets a demand within
	// every limit.
	ErrInfeasible = errors.New("vehicle: no feasible operating point")
	// ErrEmptyCycle means a duty cycle has no segments.
	ErrEmptyCycle = errors.New("vehicle: empty duty cycle")
)

// A LimitError records a quantity that crossed a limit, as typed measures
// that print in the trade's units (rpm, N·m, kW, kN). It wraps one of the
// sentinel errors.
type LimitError struct {
	Quantity string        // what was limited, e.g. "engine torque"
	Value    units.Measure // the value demanded
	Bound    string        // what the limit is, e.g. "full-load torque"; "" reads "limit"
	Limit    units.Measure // the limit it crossed
	// EngineSpeed is the engine speed at which an engine limit (full-load
	// torque, fuel map) was crossed; zero when none applies.
	EngineSpeed units.AngularVelocity
	Err         error // the sentinel: ErrEngineLimit, ErrTraction, ...
}

// Error returns the message, naming the quantity, the value and the limit,
// for example "vehicle: beyond the engine's limits: engine torque 1250 N·m
// above full-load torque 1100 N·m at 1900 rpm".
func (e *LimitError) Error() string {
	b := make([]byte, 0, 128)
	if e.Err != nil {
		b = append(b, e.Err.Error()...)
	} else {
		b = append(b, "vehicle"...)
	}
	b = append(b, ": "...)
	b = units.AppendLimit(b, e.Quantity, e.Value, e.Bound, e.Limit)
	if e.EngineSpeed != 0 {
		b = append(b, " at "...)
		b = units.Of(e.EngineSpeed).Append(b)
	}
	return string(b)
}

// Unwrap returns the sentinel error so that errors.Is finds it.
func (e *LimitError) Unwrap() error { return e.Err }

// A driveError is a layout solver's error as a transmission adapter
// returns it: ErrInvalid when the solver's error is powersplit.ErrInput,
// ErrTransmission otherwise, then the solver's error; its text is theirs
// joined by ": " (as fmt.Errorf("%w: %w") would give). The kind and the
// text are found only when asked: a strategy's search discards most of
// the errors of the points it tries unread.
type driveError struct{ err error }

func (e *driveError) kind() error {
	if errors.Is(e.err, powersplit.ErrInput) {
		return ErrInvalid
	}
	return ErrTransmission
}

// Error returns the kind's text and the solver's error's.
func (e *driveError) Error() string { return e.kind().Error() + ": " + e.err.Error() }

// Unwrap returns the kind and the solver's error.
func (e *driveError) Unwrap() []error { return []error{e.kind(), e.err} }

// An InputError records an invalid input field.
type InputError struct {
	Field  string        // the field or argument, e.g. "Spec.Mass"
	Value  units.Measure // the offending value in its unit; NaN when the field is missing or not a number
	Reason string        // what a valid value is, e.g. "must be positive"
}

// Error returns the message. A missing field (Value NaN) is named without a value.
func (e *InputError) Error() string {
	if e.Value.SI != e.Value.SI {
		return fmt.Sprintf("%v: %s %s", ErrInvalid, e.Field, e.Reason)
	}
	return fmt.Sprintf("%v: %s = %v %s", ErrInvalid, e.Field, e.Value, e.Reason)
}

// Unwrap returns ErrInvalid.
func (e *InputError) Unwrap() error { return ErrInvalid }

// A SegmentError reports why a duty-cycle segment could not be run.
type SegmentError struct {
	Index int           // position of the segment in the cycle
	Name  string        // the segment's name
	At    time.Duration // time into the segment when the failure occurred
	Err   error         // the cause
}

// Error returns the message.
func (e *SegmentError) Error() string {
	return fmt.Sprintf("vehicle: segment %d %q at %v: %v", e.Index, e.Name, e.At, e.Err)
}

// Unwrap returns the cause.
func (e *SegmentError) Unwrap() error { return e.Err }

// invalid returns an *InputError for field; a NaN v means the field is
// missing or not a number.
func invalid[Q units.Quantity | float64](field string, v Q, reason string) error {
	return &InputError{Field: field, Value: units.Of(v), Reason: reason}
}
