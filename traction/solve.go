package traction

import "github.com/powersplit-dev/powersplit/internal/numeric"

// Scalar numerics come from internal/numeric (Brent's root finder and
// minimiser). Both keep the func on the stack, so the callers stay
// allocation-free.

const (
	slipTol  = 1e-12 // absolute tolerance on slip in root finding
	slipOpt  = 1e-7  // absolute tolerance on slip in maximising
	maxIters = 200
	bigNeg   = -1e300 // stands for "not valid here" in functions being solved
)

// brent finds x in [a, b] with f(x) = 0. fa and fb are f(a) and f(b),
// already known to bracket a root; ok is false when numeric.Brent fails.
func brent(f func(float64) float64, a, b, fa, fb, tol float64) (x float64, ok bool) {
	if fa == 0 {
		return a, true
	}
	if fb == 0 {
		return b, true
	}
	x, err := numeric.Brent(f, a, b, tol, maxIters)
	return x, err == nil
}

// goldenMax returns the x in [a, b] that maximises f, to within about tol,
// and f there. f is unimodal or monotone on [a, b]; the ends are compared
// too, so a monotone f returns its end.
func goldenMax(f func(float64) float64, a, b, tol float64) (x, fx float64) {
	x, nfx := numeric.Minimize(func(x float64) float64 { return -f(x) }, a, b, tol)
	fx = -nfx
	if fa := f(a); fa > fx {
		x, fx = a, fa
	}
	if fb := f(b); fb > fx {
		x, fx = b, fb
	}
	return x, fx
}
