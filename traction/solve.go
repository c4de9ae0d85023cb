package traction

import (
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
)

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

// newtonBracket finds x in [a, b] where f changes sign by Newton's method
// on fd (f and its slope) kept inside the bracket: fa = f(a) and fb = f(b)
// differ in sign (or one is zero). It starts from x0 when x0 lies inside
// (a, b), else from the secant point of the ends. Every value narrows the
// bracket; a step that would leave it, or that did not halve the step
// before last (the slope misleads), bisects it instead (the safeguard of
// Numerical Recipes, so it is never much slower than bisection). A step
// shorter than tol1 = 2·ε·|x| + tol/2 (Brent's) is lengthened to tol1, so
// that once Newton has converged the next value lies across the root and
// the bracket closes. It returns, once the bracket is at most 2·tol1 wide (as
// Brent's method does), the end of smaller |f|; ok is false on a NaN value
// or after maxIter values.
//
// Source: Numerical Recipes (3rd ed., 2007), section 9.4 (rtsafe: Newton
// with bisection); the stopping rule and tol1 are those of Brent's method
// (Algorithms for Minimization without Derivatives, 1973, chapter 4), as
// internal/numeric.Brent has them.
func newtonBracket(fd func(float64) (float64, float64), a, b, fa, fb, x0, tol float64, maxIter int) (x float64, ok bool) {
	if fa == 0 {
		return a, true
	}
	if fb == 0 {
		return b, true
	}
	// neg and pos are the ends where f < 0 and f > 0.
	neg, pos, fNeg, fPos := a, b, fa, fb
	if fa > 0 {
		neg, pos, fNeg, fPos = b, a, fb, fa
	}
	inside := func(x float64) bool { return (x-neg)*(x-pos) < 0 }
	x = x0
	if !inside(x) {
		x = a - fa*(b-a)/(fb-fa)
		if !inside(x) {
			x = 0.5 * (a + b)
		}
	}
	dxOld, dx := math.Abs(b-a), math.Abs(b-a)
	for range maxIter {
		f, df := fd(x)
		if math.IsNaN(f) {
			return x, false
		}
		if f == 0 {
			return x, true
		}
		if f < 0 {
			neg, fNeg = x, f
		} else {
			pos, fPos = x, f
		}
		tol1 := 2*epsilon*math.Abs(x) + 0.5*tol
		if math.Abs(pos-neg) <= 2*tol1 {
			if math.Abs(fNeg) < math.Abs(fPos) {
				return neg, true
			}
			return pos, true
		}
		xn := x - f/df
		if !inside(xn) || math.Abs(2*f) > math.Abs(dxOld*df) {
			xn = 0.5 * (neg + pos)
		} else if math.Abs(xn-x) < tol1 {
			// Towards the root by tol1: the bracket is wider than 2·tol1
			// and x one of its ends, so the step stays inside.
			toward := pos
			if f > 0 {
				toward = neg
			}
			xn = x + math.Copysign(tol1, toward-x)
		}
		dxOld, dx = dx, math.Abs(xn-x)
		x = xn
	}
	return x, false
}

const epsilon = 2.220446049250313e-16 // float64 machine epsilon, 2⁻⁵²
