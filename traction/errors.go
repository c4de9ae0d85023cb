package traction

import (
	"errors"
	"fmt"

	"github.com/powersplit-dev/powersplit/units"
)

// Sentinel errors of the package. Typed errors wrap exactly one of them, so
// errors.Is finds the kind and errors.As the details.
var (
	// ErrTyre means a tyre dimension or rating is missing, negative, NaN or
	// infinite, or the dimensions contradict each other.
	ErrTyre = errors.New("traction: invalid tyre")
	// ErrSurface means a surface has no usable cone index or rolling
	// coefficient for the model asked, or a value is NaN or infinite.
	ErrSurface = errors.New("traction: invalid surface")
	// ErrLoad means a wheel or axle load is zero, negative, NaN or
	// infinite, or too large for a model on the given soil (the mobility
	// number it leaves is below the model's range).
	ErrLoad = errors.New("traction: invalid load")
	// ErrSlip means a slip outside the range an entry accepts: [0, 1) for a
	// driving wheel, [MinSlip, 1) for the traction models themselves.
	ErrSlip = errors.New("traction: slip out of range")
	// ErrInput means some other argument is NaN, infinite or out of range
	// (a speed, a length, a ratio, a count).
	ErrInput = errors.New("traction: invalid input")
	// ErrPull means a required pull is beyond what the wheels can give on
	// this surface at any slip, or below what they give at the least slip.
	ErrPull = errors.New("traction: pull beyond what the surface can give")
	// ErrUnstable means the front axle would carry no load: the drawbar
	// pull or the mounted implement would lift the front wheels. A vehicle
	// in that state cannot be steered and may overturn backwards.
	ErrUnstable = errors.New("traction: front axle unloaded (steering lost, risk of rearward overturn)")
	// ErrNoConvergence means an internal solver did not converge; it is a
	// sign of a model without the usual shape, and should not occur with the
	// models of this package.
	ErrNoConvergence = errors.New("traction: solver did not converge")
)

// A RangeError records an argument outside its valid range.
type RangeError struct {
	Quantity string        // what was checked, e.g. "tyre section width"
	Value    units.Measure // the value given, printed in its unit
	Limit    string        // the rule it broke, e.g. "> 0"
	Err      error         // the sentinel: ErrTyre, ErrSurface, ErrLoad, ErrSlip or ErrInput
}

// Error returns the message, naming the quantity, the value and the rule.
func (e *RangeError) Error() string {
	return fmt.Sprintf("%v: %s = %v, want %s", e.Err, e.Quantity, e.Value, e.Limit)
}

// Unwrap returns the sentinel error.
func (e *RangeError) Unwrap() error { return e.Err }

// A PullError records a required net pull that the wheels cannot give.
type PullError struct {
	Required units.Force // the net pull asked for
	Limit    units.Force // the most (or, when Required is below it, the least) the wheels give
	Slip     float64     // the slip at which Limit is reached
}

// Error returns the message with the required pull and the limit.
func (e *PullError) Error() string {
	return fmt.Sprintf("%v: required %v, limit %v at slip %.4g", ErrPull, e.Required, e.Limit, e.Slip)
}

// Unwrap returns ErrPull.
func (e *PullError) Unwrap() error { return ErrPull }

func rangeErr[Q units.Quantity | float64](sentinel error, quantity string, value Q, limit string) error {
	return &RangeError{Quantity: quantity, Value: units.Of(value), Limit: limit, Err: sentinel}
}

func finite(x float64) bool { return x-x == 0 }
