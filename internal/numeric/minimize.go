package numeric

import "math"

// Minimize returns a local minimiser x of f on [a, b] (in either order) and
// fx = f(x), by Brent's golden-section and parabolic search. On a unimodal f
// x is within about tol of the minimum; tol ≤ 0 means √eps·|x|, the best
// float64 allows. At most 200 evaluations are made.
//
// A NaN value of f is treated as +Inf (never chosen unless f is NaN
// everywhere it is sampled); NaN or Inf a or b returns (NaN, NaN). Minimize
// does not allocate and does not retain f.
func Minimize(f func(float64) float64, a, b, tol float64) (x, fx float64) {
	if bad(a) || bad(b) {
		return math.NaN(), math.NaN()
	}
	if a > b {
		a, b = b, a
	}
	if math.IsNaN(tol) || tol < 0 {
		tol = 0
	}
	eval := func(x float64) float64 {
		v := f(x)
		if math.IsNaN(v) {
			return math.Inf(1)
		}
		return v
	}
	const cgold = 0.3819660112501051 // (3 − √5)/2
	sqrtEps := math.Sqrt(eps)
	x = a + cgold*(b-a)
	w, v := x, x
	fx = eval(x)
	fw, fv := fx, fx
	var d, e float64
	for range 200 {
		xm := 0.5 * (a + b)
		tol1 := sqrtEps*math.Abs(x) + tol/3
		tol2 := 2 * tol1
		if math.Abs(x-xm) <= tol2-0.5*(b-a) {
			break
		}
		golden := true
		if math.Abs(e) > tol1 {
			// Try a parabola through x, w, v.
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			p := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			if math.Abs(p) < math.Abs(0.5*q*e) && p > q*(a-x) && p < q*(b-x) {
				e = d
				d = p / q
				u := x + d
				if u-a < tol2 || b-u < tol2 {
					d = math.Copysign(tol1, xm-x)
				}
				golden = false
			}
		}
		if golden {
			if x < xm {
				e = b - x
			} else {
				e = a - x
			}
			d = cgold * e
		}
		u := x + d
		if math.Abs(d) < tol1 {
			u = x + math.Copysign(tol1, d)
		}
		fu := eval(u)
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv = w, fw
			w, fw = x, fx
			x, fx = u, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, fv = w, fw
				w, fw = u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x, fx
}
