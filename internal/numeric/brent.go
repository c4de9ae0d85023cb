package numeric

import "math"

const eps = 2.220446049250313e-16 // float64 machine epsilon, 2⁻⁵²

func bad(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }

// Brent returns a zero of f in the bracket [a, b] by Brent's method. The
// bracket must satisfy f(a)·f(b) ≤ 0 (ErrNoBracket otherwise); a or b is
// returned at once if f vanishes there. The result is within
// 2·eps·|x| + tol/2 of a sign change of f. tol ≤ 0 means the tightest
// tolerance float64 allows; maxIter ≤ 0 means 100.
//
// NaN or Inf in a, b, tol or a function value gives ErrNaN; reaching maxIter
// gives ErrNoConvergence together with the best estimate so far. Brent does
// not allocate and does not retain f.
func Brent(f func(float64) float64, a, b, tol float64, maxIter int) (float64, error) {
	if bad(a) || bad(b) || math.IsNaN(tol) {
		return 0, ErrNaN
	}
	if tol < 0 {
		tol = 0
	}
	if maxIter <= 0 {
		maxIter = 100
	}
	fa, fb := f(a), f(b)
	if bad(fa) || bad(fb) {
		return 0, ErrNaN
	}
	if fa == 0 {
		return a, nil
	}
	if fb == 0 {
		return b, nil
	}
	if (fa > 0) == (fb > 0) {
		return 0, ErrNoBracket
	}
	// Algorithms for Minimization without Derivatives (1973), procedure
	// zero: b is the best estimate, a the previous one, c the point with f
	// of opposite sign to f(b).
	c, fc := a, fa
	d := b - a
	e := d
	for range maxIter {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*eps*math.Abs(b) + 0.5*tol
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol1 || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			// Interpolate: secant if a == c, else inverse quadratic.
			var p, q float64
			s := fb / fa
			if a == c {
				p = 2 * m * s
				q = 1 - s
			} else {
				qq := fa / fc
				r := fb / fc
				p = s * (2*m*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = m
				e = m
			}
		} else {
			d = m
			e = m
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = f(b)
		if bad(fb) {
			return b, ErrNaN
		}
	}
	return b, ErrNoConvergence
}
