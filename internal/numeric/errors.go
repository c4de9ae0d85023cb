package numeric

import "errors"

// Sentinel errors of the numeric routines.
var (
	// ErrNoBracket means f(a) and f(b) have the same sign, so [a, b] does
	// not bracket a root.
	ErrNoBracket = errors.New("numeric: interval does not bracket a root")
	// ErrNoConvergence means the iteration limit was reached first.
	ErrNoConvergence = errors.New("numeric: no convergence within the iteration limit")
	// ErrNaN means an argument or a function value was NaN or infinite.
	ErrNaN = errors.New("numeric: NaN or infinite value")
	// ErrOutOfRange means a point lies outside the axes of a grid.
	ErrOutOfRange = errors.New("numeric: point outside the grid")
	// ErrGrid means the axes or the table of a grid are malformed.
	ErrGrid = errors.New("numeric: invalid grid")
)
