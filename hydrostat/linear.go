package hydrostat

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// linLoop is the flow balance of a loop whose units' leakage is affine in
// the magnitude of their setting, leak = a + b·|x| (the Wilson model, and
// the lossless unit with a = b = 0), at given speeds and pressure. With the
// motors at one common setting s the balance on line A is then piecewise
// linear in the pump setting x and linear in s:
//
//	r(x, s) = x·Dp·ωp − σ·(ap + bp·|x|) − s·Σ Dm·ωm − σ·(Σ am + |s|·Σ bm)
//
// σ = sgn(Δp), so the schedules can place the settings in closed form
// instead of searching for them. The result is the zero of the same
// residual that Loop.Balance evaluates, to rounding.
type linLoop struct {
	sigma  float64 // sgn(Δp)
	pumpQ  float64 // Dp·ωp
	ap, bp float64
	motorQ float64 // Σ Dm·ωm
	am, bm float64 // Σ am, Σ bm
}

// wilsonLeak returns the leakage of m as a + b·|x| at speed w and pressure
// difference dp with fluid f, and false where Wilson.Losses would fail (the
// caller then takes the general path, which reports the error).
func wilsonLeak(m *Wilson, dmax, w, dp float64, f *fluid) (a, b float64, ok bool) {
	w, dp = math.Abs(w), math.Abs(dp)
	mu, beta, rho := f.mu, f.beta, f.rho
	if !(dmax > 0) || !(mu > 0) || !finite(dmax) || !finite(mu) || !finite(dp) || !finite(w) {
		return 0, 0, false
	}
	if m.Compressibility && (!(beta > 0) || !finite(beta)) {
		return 0, 0, false
	}
	if m.Hydrodynamic > 0 && (!(rho > 0) || !finite(rho)) {
		return 0, 0, false
	}
	s := m.Slip * dmax * dp / mu
	a, b = s*(1-m.LeakageSetting), s*m.LeakageSetting
	if m.Compressibility {
		c := dmax * w * dp / beta
		a += m.DeadVolume * c
		b += c
	}
	if !finite(a) || !finite(b) {
		return 0, 0, false
	}
	return a, b, true
}

// leakLinear returns the affine leakage of unit u, and false when its loss
// model is not known to be affine in |x|.
func (u *Unit) leakLinear(w, dp float64, f *fluid) (a, b float64, ok bool) {
	if u.wil != nil {
		return wilsonLeak(u.wil, u.dmax, w, dp, f)
	}
	switch m := u.spec.Loss.(type) {
	case nil:
		return 0, 0, u.dmax > 0
	case Wilson:
		return wilsonLeak(&m, u.dmax, w, dp, f)
	case *Wilson:
		if m == nil {
			return 0, 0, false
		}
		return wilsonLeak(m, u.dmax, w, dp, f)
	}
	return 0, 0, false
}

// linear returns the linear flow balance of the loop at the given speeds
// and pressure, and false when some unit's leakage is not affine (or the
// input is not finite).
func (l *Loop) linear(wp float64, wms []units.AngularVelocity, dp float64) (linLoop, bool) {
	if !finite(wp) || !finite(dp) || len(wms) != len(l.spec.Motors) {
		return linLoop{}, false
	}
	var lin linLoop
	lin.sigma = sgn(dp)
	p := &l.spec.Pump
	a, b, ok := p.leakLinear(wp, dp, &l.fl)
	if !ok {
		return linLoop{}, false
	}
	lin.pumpQ, lin.ap, lin.bp = p.dmax*wp, a, b
	for i := range l.spec.Motors {
		m := &l.spec.Motors[i]
		w := float64(wms[i])
		if !finite(w) {
			return linLoop{}, false
		}
		a, b, ok := m.leakLinear(w, dp, &l.fl)
		if !ok {
			return linLoop{}, false
		}
		lin.motorQ += m.dmax * w
		lin.am += a
		lin.bm += b
	}
	return lin, true
}

// residual returns r(x, s) as above.
func (lin *linLoop) residual(x, s float64) float64 {
	return x*lin.pumpQ - lin.sigma*(lin.ap+lin.bp*math.Abs(x)) - s*lin.motorQ - lin.sigma*(lin.am+math.Abs(s)*lin.bm)
}

// pumpFor is pumpFor in closed form: the pump setting in [-1, 1] that
// balances the motors at the common setting sm, with the same outcomes as
// the bracketed search (a zero at an end of the bracket is that end; no
// sign change over [-1, 1] gives the nearer end and ok false).
func (lin *linLoop) pumpFor(sm float64) (xp float64, ok bool) {
	ga, gb := lin.residual(-1, sm), lin.residual(1, sm)
	if ga == 0 && gb == 0 {
		return 0, true
	}
	if (ga > 0) == (gb > 0) && ga != 0 && gb != 0 {
		if math.Abs(gb) < math.Abs(ga) {
			return 1, false
		}
		return -1, false
	}
	if ga == 0 {
		return -1, true
	}
	if gb == 0 {
		return 1, true
	}
	// One sign change: on [0, 1] when r(0) lies on the other side of r(1)
	// (or is zero), else on [-1, 0]; r is linear on each half.
	k := lin.residual(0, sm)
	if k == 0 {
		return 0, true
	}
	if (k > 0) != (gb > 0) {
		xp = -k / (lin.pumpQ - lin.sigma*lin.bp)
	} else {
		xp = -k / (lin.pumpQ + lin.sigma*lin.bp)
	}
	if !finite(xp) {
		return 0, false
	}
	return math.Max(-1, math.Min(1, xp)), true
}

// motorFor returns the common motor setting s in [smin, 1] that balances
// the pump at xp: r is linear in s on each side of zero,
// r(s) = k − s·Σ Dm·ωm − σ·Σ bm·|s| with k = r(xp, 0), so with r(smin) = ha
// and r(1) = hb of opposite signs (or one zero) the zero is where the line
// of the side that holds it crosses (smin < 0 only over centre).
func (lin *linLoop) motorFor(xp, smin, ha, hb float64) float64 {
	if ha == 0 {
		return smin
	}
	if hb == 0 {
		return 1
	}
	k := xp*lin.pumpQ - lin.sigma*(lin.ap+lin.bp*math.Abs(xp)) - lin.sigma*lin.am
	s := k / (lin.motorQ + lin.sigma*lin.bm) // the zero on s ≥ 0
	if smin < 0 && !(s >= 0 && s <= 1) {
		s = k / (lin.motorQ - lin.sigma*lin.bm) // the zero on s ≤ 0
		if !(s <= 0) {
			s = math.NaN()
		}
	}
	if !finite(s) {
		// Fall back to the secant through the two ends (exact for a line).
		s = smin - ha*(1-smin)/(hb-ha)
	}
	return math.Max(smin, math.Min(1, s))
}
