package powersplit

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit/units"
)

// Sentinel errors. Every error the package returns wraps one of them, so
// errors.Is tells the kinds apart; the typed errors below carry the numbers.
var (
	// ErrLayout means a layout failed validation when it was built: a bad
	// shaft, a duplicate name, a member on two shafts, a missing input or
	// output. A *LayoutError says which element.
	ErrLayout = errors.New("powersplit: invalid layout")
	// ErrUnconnected means a shaft carries no element at all.
	ErrUnconnected = errors.New("powersplit: unconnected shaft")
	// ErrKinematics means the kinematic constraints of a range are over- or
	// under-determined: some shaft speeds are not fixed by the input speed,
	// the output speeds and the hydrostats' free ratios, or the constraints
	// contradict each other. A *KinematicsError carries the details.
	ErrKinematics = errors.New("powersplit: over- or under-determined kinematics")
	// ErrTorques means the torque balance of a range has a different number
	// of equations than unknowns (the number of outputs with a given torque
	// must equal the number of hydrostatic loops).
	ErrTorques = errors.New("powersplit: over- or under-determined torques")
	// ErrInput means an operating point or spec value is NaN, infinite, out of
	// its domain, or of the wrong length.
	ErrInput = errors.New("powersplit: invalid input")
	// ErrInfeasible means the point crosses a limit: loop pressure above the
	// relief setting, a unit above its maximum speed, a displacement setting
	// outside [-1, 1], or a range's output speed limit. A *LimitError carries
	// the quantity, value and limit.
	ErrInfeasible = errors.New("powersplit: operating point infeasible")
	// ErrUnreachable means no displacement setting of the hydrostat gives the
	// speed ratio the point asks for (the ratio lies outside the range). It
	// comes wrapped in a *LimitError and also matches ErrInfeasible.
	ErrUnreachable = errors.New("powersplit: speed ratio unreachable")
	// ErrNoConvergence means the iteration on loss directions and loop
	// pressure did not close the power balance. A *ConvergenceError carries
	// the residual.
	ErrNoConvergence = errors.New("powersplit: solver did not converge")
	// ErrSelfLocking means no direction of the gear and planetary losses is
	// consistent at the point: with its mesh losses the mechanism cannot
	// carry power the way the point asks (typically strongly circulating
	// power), so it locks. It comes in a *ConvergenceError.
	ErrSelfLocking = errors.New("powersplit: mechanism self-locks")
	// ErrSingular means the assembled torque system was singular at a point
	// (for example a loop whose units all stand still at zero setting).
	ErrSingular = errors.New("powersplit: singular torque system")
)

// LayoutError reports what is wrong with one element or shaft of a layout.
type LayoutError struct {
	Element string // element or shaft name ("" if none applies)
	Reason  string
	Err     error // the sentinel: ErrLayout, ErrUnconnected, ...
}

func (e *LayoutError) Error() string {
	kind := ErrLayout.Error()
	if e.Err != nil {
		kind = e.Err.Error()
	}
	if e.Element == "" {
		return kind + ": " + e.Reason
	}
	return kind + ": " + strconv.Quote(e.Element) + ": " + e.Reason
}

// Unwrap returns the sentinel.
func (e *LayoutError) Unwrap() error { return e.Err }

// KinematicsError reports an over- or under-determined range.
type KinematicsError struct {
	Range       string
	Shafts      int      // number of shafts (unknown speeds)
	Constraints int      // number of kinematic constraint rows
	Rank        int      // rank of the constraint matrix
	Free        []string // shafts whose speed is not fixed (under-determined)
}

func (e *KinematicsError) Error() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%v: range %q: %d shafts, %d constraints, rank %d", ErrKinematics,
		e.Range, e.Shafts, e.Constraints, e.Rank)
	if len(e.Free) > 0 {
		b.WriteString("; speed not fixed: " + strings.Join(e.Free, ", "))
	}
	if e.Constraints > e.Rank {
		b.WriteString("; redundant or contradictory constraints")
	}
	return b.String()
}

// Unwrap returns ErrKinematics.
func (e *KinematicsError) Unwrap() error { return ErrKinematics }

// LimitError reports a limit crossed at an operating point: the quantity,
// its value and the limit, as typed measures that print in the trade's
// units (bar, rpm, a plain number for a setting).
type LimitError struct {
	Element  string        // element (or range) where the limit was crossed
	Quantity string        // "high-line pressure", "pump speed", "motor setting", "output speed", ...
	Value    units.Measure // always finite: a setting no schedule could find carries the last setting tried (see Quantity)
	Bound    string        // what the limit is: "relief setting", "maximum speed", "full displacement", ...; "" reads "limit"
	Limit    units.Measure
	Err      error // ErrInfeasible or ErrUnreachable
	Cause    error // the error from the hydrostat package, if any
}

// Error returns "<sentinel>: <element>: <quantity> <value> above <bound>
// <limit>" ("below" when the value lies under the limit), for example
// "powersplit: operating point infeasible: hydrostat: high-line pressure
// 2560 bar above relief setting 450 bar". The cause's numbers are the
// error's own, so its text is not repeated; an error with no quantity
// (a loop that failed for another reason) gives the cause's text instead.
// It appends into one buffer: maps format the reason of every infeasible
// cell.
func (e *LimitError) Error() string {
	b := make([]byte, 0, 160)
	if e.Err != nil {
		b = append(b, e.Err.Error()...)
	} else {
		b = append(b, "<nil>"...)
	}
	if e.Element != "" {
		b = append(b, ": "...)
		b = append(b, e.Element...)
	}
	b = append(b, ": "...)
	if e.Quantity == "" {
		if e.Cause != nil {
			b = append(b, e.Cause.Error()...)
		} else {
			b = append(b, "limit crossed"...)
		}
		return string(b)
	}
	return string(units.AppendLimit(b, e.Quantity, e.Value, e.Bound, e.Limit))
}

// Is reports whether target is the error's sentinel or ErrInfeasible
// (ErrUnreachable is a kind of infeasible point), so that errors.Is finds
// them without Unwrap.
func (e *LimitError) Is(target error) bool {
	return target != nil && (target == e.Err || target == ErrInfeasible)
}

// Unwrap returns the hydrostat package's error if there is one (nil
// otherwise); the sentinels are matched by Is. Neither allocates: a search
// asks errors.Is of every point it refuses.
func (e *LimitError) Unwrap() error { return e.Cause }

// ConvergenceError reports a solve that did not close its power balance.
type ConvergenceError struct {
	Iterations int
	Residual   float64 // relative power-balance residual at the last iterate (NaN if none)
	// SelfLocking is set when no combination of loss directions gives a
	// consistent steady state: with the losses of its gears and sets the
	// mechanism cannot carry power the way the point asks (strongly
	// circulating power), or a unit near zero displacement cannot give the
	// torque needed at any pressure within the relief setting.
	SelfLocking bool
}

func (e *ConvergenceError) Error() string {
	if e.SelfLocking {
		return fmt.Sprintf("%v: no steady state after %d iterations: no direction of the gear and planetary losses is consistent "+
			"(the mechanism self-locks, or the hydrostat cannot give the torque the point needs)", ErrSelfLocking, e.Iterations)
	}
	return fmt.Sprintf("%v after %d iterations (relative residual %.3g)", ErrNoConvergence,
		e.Iterations, e.Residual)
}

// Unwrap returns ErrNoConvergence, and ErrSelfLocking when SelfLocking.
func (e *ConvergenceError) Unwrap() []error {
	if e.SelfLocking {
		return []error{ErrNoConvergence, ErrSelfLocking}
	}
	return []error{ErrNoConvergence}
}

// InputError reports an invalid value in an operating point or a spec: the
// field, its value in the user's units and what a valid value is. A plain
// NaN Value means the field has no value to show (a nil pointer).
type InputError struct {
	Field  string
	Value  units.Measure
	Reason string
}

func (e *InputError) Error() string {
	b := make([]byte, 0, 96)
	b = append(b, ErrInput.Error()...)
	b = append(b, ": "...)
	b = append(b, e.Field...)
	if e.Value.SI == e.Value.SI || e.Value.Kind != units.Number {
		b = append(b, " = "...)
		b = e.Value.Append(b)
	}
	b = append(b, ": "...)
	b = append(b, e.Reason...)
	return string(b)
}

// Unwrap returns ErrInput.
func (e *InputError) Unwrap() error { return ErrInput }
