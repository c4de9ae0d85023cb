package hydrostat

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Curve is a loop at fixed shaft speeds seen as a function of its pressure
// difference Δp alone: the settings the loop's schedule gives, the torque
// each unit's shaft applies to it and that torque's exact slope ∂T/∂Δp. A
// layout solver with one loop reduces a point to one scalar equation in Δp
// and solves it by Newton's method with these slopes.
//
// A Curve serves loops whose schedule is Sequential, or Pinned (some
// motors held at settings of their own, read when the Curve is prepared),
// and whose units are lossless or follow the Wilson model (leakage affine
// in |x|, loss torque affine in |Δp|); Loop.Curve reports false for any
// other loop, and
// Curve.Torques reports false wherever the schedule leaves its range
// (a setting limit) or cannot decide: the caller then takes its general
// path. The settings and torques are those of Loop.At to rounding: the
// schedule's own closed form on the loop's linear flow balance, with the
// leakage, proportional to |Δp|, scaled from |Δp| = 1 once per Curve, and
// the Wilson loss torque, affine in |Δp| at a fixed torque displacement,
// kept as its two coefficients (TestCurveMatchesAt).
//
// With the free motors at the common setting s and the pump at x, the
// flow balance r(x, s) = 0 of the linear balance (see the schedules) has
// every leakage term proportional to |Δp|, σ·a = α·Δp, σ·b = β·Δp, so the
// pump branch (s = 1) and the motor branch (x = ±1) give
//
//	∂x/∂Δp = (αp + βp·|x| + αm + βm + αh) / (Dp·ωp − βp·Δp·sgn x)
//	∂s/∂Δp = −(αp + βp·|x| + αm + αh + βm·|s|) / (Σ Dm·ωm + βm·Δp·sgn s)
//
// with αm, βm and Σ Dm·ωm over the free motors, and αh = Σ (a + b·|x_h|)
// over the held ones, whose flow Σ Dm·ωm·x_h is a constant of the balance;
// with every motor held the pump alone meets the flow.
//
// and each unit's torque T = q·x·D + sgn(ω)·τ(|x|, |Δp|), q = Δp for the
// pump and −Δp for a motor, has the slope
//
//	∂T/∂Δp = (∂q/∂Δp)·x·D + q·D·∂x/∂Δp + sgn(ω)·(∂τ/∂|Δp|·sgn Δp + ∂τ/∂D_t·D·s_t·sgn x·∂x/∂Δp)
//
// with D_t = D·(1 − s_t + s_t·|x|) the Wilson torque displacement.
type Curve struct {
	l      *Loop
	ok     bool
	wp     float64
	wms    []units.AngularVelocity
	smin   float64
	pumpQ  float64
	motorQ float64
	// invQ and invM are 1/pumpQ and 1/motorQ: with no leakage that grows
	// with the setting (bp, bm zero, the classic models) every division
	// of a Newton step's settings and slopes is by one of them, and a
	// product with the inverse is off the step's chain of divisions.
	invQ, invM float64
	ap, bp     float64 // pump leakage a + b·|x| per |Δp|
	am, bm     float64 // Σ over the free motors
	ah         float64 // Σ over the held motors of a + b·|x_h| per |Δp|
	heldQ      float64 // Σ over the held motors of Dm·ωm·x_h
	// amh = am + ah, mqk = motorQ + heldQ and qs = |motorQ| + |heldQ| are
	// the terms of the balance with the held motors folded in (am, motorQ
	// and |motorQ| themselves where none is held, so the same numbers).
	amh, mqk, qs float64
	held         []float64     // per motor: its held setting, NaN where the schedule sets it (read only while nheld > 0)
	nheld        int           // the motors held
	tau          []curveTorque // per unit, pump first
	fixed        bool          // every unit's torque is fixed (curveTorque.fixed): Fill from the terms
	swing        bool          // no leakage grows with the pump's setting (bp zero): pumpSwings serves
	quick        bool          // swing and fixed: Torques takes the short way
	limit        setLimit      // the setting limit of the last Torques, if hit
	cached       bool          // the last Torques kept its units' losses (curveTorque.cx) at cdp
	cdp          float64
}

// curveTorque is what a Curve knows of a unit's loss torque at its speed.
type curveTorque struct {
	w      float64 // shaft speed
	sw     float64 // sgn ω
	dmax   float64 // the unit's maximum displacement
	fixed  bool    // τ = t0 + t1·|Δp| (lossless, or Wilson with its torque at full displacement)
	t0, t1 float64
	la, lb float64 // the unit's leakage a + b·|x| per |Δp| at its speed
	// A unit whose torque is not fixed: the loss model's leakage and loss
	// torque at setting cx and the pressure of the last Torques (Curve.cdp),
	// for Fill.
	cx, cleak, ctau float64
}

// curvePlan is what a Curve needs of a loop that does not change with the
// speeds, worked out once when the loop is built: whether the loop can be
// seen as a Curve at all, and per unit the constant parts of its leakage
// and loss torque.
type curvePlan struct {
	ok     bool
	pinned bool    // the schedule is Pinned: its held settings are read per Curve
	smin   float64 // the schedule's motor floor
	peak   float64 // the lowest peak pressure of the units, +Inf where none is rated
	units  []unitPlan
}

// unitPlan is the constant part of a unit's leakage (per unit |Δp|) and
// loss torque, in the arithmetic of wilsonLeak and curveTorque.
type unitPlan struct {
	dmax    float64
	a, b    float64 // leakage a + b·|x| per |Δp| (slip; compressibility is added per speed)
	comp    bool    // compressibility: a += dead·c, b += c with c = D·|ω|/β
	dead    float64
	beta    float64
	fixed   bool    // τ = t0 + t1·|Δp|
	va, cb  float64 // t0 = va·|ω| + cb (+ hr·ω²·d53)
	hr, d53 float64 // hydrodynamic term, when hr > 0
	t1      float64
	f53     float64 // a torque following the setting, with a hydrodynamic term: D_t^(5/3) at full setting
	wmax    float64 // the rated maximum speed, +Inf where not rated
	rated   float64 // the continuous rated pressure, +Inf where not rated
	low     float64 // the lowest setting of the swing
}

// planCurve works out l's curvePlan (see Loop.Curve for the loops a Curve
// serves).
func (l *Loop) planCurve() curvePlan {
	var min float64
	pinned := false
	switch sq := l.sched.(type) {
	case Sequential:
		min = sq.MinMotorSetting
	case Pinned:
		min, pinned = sq.MinMotorSetting, true
	default:
		return curvePlan{}
	}
	n := len(l.spec.Motors)
	if n == 0 || validMin(min) != nil || !l.curveUnits() {
		return curvePlan{}
	}
	smin := l.motorFloor(min)
	if smin <= 0 || l.pumpLow > -1 {
		// Motors that swing to zero or over centre, a pump that does not:
		// the schedule's special cases at a standing shaft are left to the
		// general path.
		return curvePlan{}
	}
	f := &l.fl
	pl := curvePlan{ok: true, pinned: pinned, smin: smin, peak: math.Inf(1), units: make([]unitPlan, n+1)}
	for i := range pl.units {
		u := &l.spec.Pump
		if i > 0 {
			u = &l.spec.Motors[i-1]
		}
		up := unitPlan{dmax: u.dmax, wmax: math.Inf(1), rated: math.Inf(1), low: u.spec.Swing.lowest()}
		// The rated limits as Unit.crossed and Unit.point read them: a
		// zero limit is not rated.
		if ms := float64(u.spec.MaxSpeed); ms > 0 {
			up.wmax = ms
		}
		if r := float64(u.spec.RatedPressure); r > 0 {
			up.rated = r
		}
		if pk := float64(u.spec.PeakPressure); pk > 0 {
			pl.peak = math.Min(pl.peak, pk)
		}
		m := u.wil
		if m == nil {
			// Lossless: no leakage, no loss torque.
			if !(u.dmax > 0) {
				return curvePlan{}
			}
			up.fixed = true
			pl.units[i] = up
			continue
		}
		// The checks of wilsonLeak that do not depend on the speed.
		if !(u.dmax > 0) || !(f.mu > 0) || !finite(u.dmax) || !finite(f.mu) ||
			(m.Compressibility && (!(f.beta > 0) || !finite(f.beta))) || (m.Hydrodynamic > 0 && (!(f.rho > 0) || !finite(f.rho))) {
			return curvePlan{}
		}
		sl := m.Slip * u.dmax * 1 / f.mu
		up.a, up.b = sl*(1-m.LeakageSetting), sl*m.LeakageSetting
		up.comp, up.dead, up.beta = m.Compressibility, m.DeadVolume, f.beta
		if m.TorqueSetting == 0 {
			// The torque terms of Wilson.losses at D_t = D_max.
			dt := u.dmax
			up.fixed = true
			up.va, up.cb = m.Viscous*dt*f.mu, float64(m.ConstantPressure)*dt+float64(m.ConstantTorque)
			if m.Hydrodynamic > 0 {
				up.hr, up.d53 = m.Hydrodynamic*f.rho, u.d53
			}
			up.t1 = m.Friction * dt
		} else if m.Hydrodynamic > 0 {
			// Wilson.losses' D_t^(5/3) at |x| = 1, for torqueSlope.
			dt := u.dmax * (1 - m.TorqueSetting + m.TorqueSetting*1)
			c := math.Cbrt(dt)
			up.f53 = dt * c * c
		}
		pl.units[i] = up
	}
	return pl
}

// leak returns the unit's leakage a + b·|x| per unit |Δp| at speed w, and
// false where it is not finite.
func (up *unitPlan) leak(w float64) (a, b float64, ok bool) {
	a, b = up.a, up.b
	if up.comp {
		c := up.dmax * math.Abs(w) / up.beta
		a += up.dead * c
		b += c
	}
	return a, b, finite(a) && finite(b)
}

// torque sets ct to what a Curve keeps of the unit's loss torque at speed
// w (in place: a returned struct costs a copy through memory).
func (up *unitPlan) torque(ct *curveTorque, w float64) {
	ct.w, ct.sw, ct.dmax, ct.fixed = w, sgn(w), up.dmax, up.fixed
	// A lossless unit's terms, and those of a unit whose torque is not
	// fixed, are zero in its plan: t0 = 0·|ω| + 0 = 0 at a finite speed.
	t0 := up.va*math.Abs(w) + up.cb
	if up.hr > 0 {
		t0 += up.hr * w * w * up.d53
	}
	ct.t0, ct.t1 = t0, up.t1
}

// Curve prepares c for the loop at the given shaft speeds and reports
// whether the loop can be seen as a Curve (see the type). c's storage is
// reused; it does not allocate once c has held a loop with as many motors.
func (l *Loop) Curve(pumpSpeed units.AngularVelocity, motorSpeeds []units.AngularVelocity, c *Curve) bool {
	c.ok, c.cached = false, false
	pl := &l.plan
	n := len(l.spec.Motors)
	if !pl.ok || len(motorSpeeds) != n {
		return false
	}
	wp := float64(pumpSpeed)
	if !finite(wp) {
		return false
	}
	if cap(c.wms) < n {
		c.wms = make([]units.AngularVelocity, n)
		c.tau = make([]curveTorque, n+1)
		c.held = make([]float64, n)
	}
	c.wms, c.tau, c.held = c.wms[:n], c.tau[:n+1], c.held[:n]
	c.nheld = 0
	if pl.pinned {
		// The held settings as the schedule reads them at this call;
		// settings it would refuse are the general path's to report.
		h := l.sched.(Pinned).Held
		if len(h) != n {
			return false
		}
		for i, x := range h {
			c.held[i] = x
			if math.IsNaN(x) {
				continue
			}
			if !(x >= -1 && x <= 1) {
				return false
			}
			c.nheld++
		}
	}
	c.l, c.wp, c.smin = l, wp, pl.smin
	// The leakage per unit |Δp| (every term is proportional to it), as
	// Loop.linear sums it.
	u0 := &pl.units[0]
	ap, bp, ok := u0.leak(wp)
	if !ok {
		return false
	}
	var mq, am, bm, ah, hq float64
	fixed := u0.fixed
	for i, ws := range motorSpeeds {
		w := float64(ws)
		if !finite(w) {
			return false
		}
		up := &pl.units[i+1]
		a, b, ok := up.leak(w)
		if !ok {
			return false
		}
		if x := c.held[i]; c.nheld > 0 && x == x {
			hq += up.dmax * w * x
			ah += a + b*math.Abs(x)
		} else {
			mq += up.dmax * w
			am += a
			bm += b
		}
		c.wms[i] = ws
		up.torque(&c.tau[i+1], w)
		c.tau[i+1].la, c.tau[i+1].lb = a, b
		fixed = fixed && up.fixed
	}
	c.pumpQ, c.motorQ = u0.dmax*wp, mq
	c.invQ, c.invM = 1/c.pumpQ, 1/mq
	c.ap, c.bp, c.am, c.bm = ap, bp, am, bm
	c.ah, c.heldQ = ah, hq
	c.amh, c.mqk, c.qs = am+ah, mq+hq, math.Abs(mq)+math.Abs(hq)
	if !finite(ah) || !finite(hq) {
		return false
	}
	u0.torque(&c.tau[0], wp)
	c.tau[0].la, c.tau[0].lb = ap, bp
	c.fixed = fixed
	c.swing = bp == 0
	c.quick = c.swing && fixed && c.nheld == 0
	c.ok = true
	return true
}

// curveUnits reports whether every unit's torque is one a Curve can
// differentiate: lossless or Wilson.
func (l *Loop) curveUnits() bool {
	if !l.spec.Pump.curveUnit() {
		return false
	}
	for i := range l.spec.Motors {
		if !l.spec.Motors[i].curveUnit() {
			return false
		}
	}
	return true
}

func (u *Unit) curveUnit() bool { return u.wil != nil || u.spec.Loss == nil }

// Torques writes the settings the schedule gives at pressure difference dp
// (settings[0] the pump), the torque each unit's shaft applies to it
// (torques[0] the pump) and its slope ∂T/∂Δp, and reports false where it
// cannot decide (see the type) or a unit's model fails. Where no motor
// setting in range gives continuity it gives, as Loop.At does, the
// schedule's nearest settings (held: their slopes are zero); Fill then
// reports the setting limit.
func (c *Curve) Torques(dp units.Pressure, settings []float64, torques []units.Torque, slopes []units.Displacement) bool {
	if !c.ok {
		return false
	}
	d := float64(dp)
	c.limit.hit = false
	if c.quick {
		if xp, ok := c.pumpSwings(d); ok {
			// The pump swings with the motors full and every unit's torque
			// is fixed: the arithmetic below, the motors' setting held at 1.
			settings[0] = xp
			for i := 1; i < len(settings); i++ {
				settings[i] = 1
			}
			tau := c.tau
			torques, slopes = torques[:len(tau)], slopes[:len(tau)]
			// The pump: x = xp, q = Δp.
			tc := &tau[0]
			dm := tc.dmax
			dxp := (c.ap + c.amh + c.bm) * c.invQ // settingSlopes' with bp zero
			torques[0] = units.Torque(d*xp*dm + tc.sw*(tc.t0+tc.t1*math.Abs(d)))
			slopes[0] = units.Displacement(1*xp*dm + d*dm*dxp + tc.sw*tc.t1*sgn(d)*1)
			// The motors: x = 1 held, q = −Δp.
			q := -d
			for i := 1; i < len(tau); i++ {
				tc := &tau[i]
				dm := tc.dmax
				torques[i] = units.Torque(q*1*dm + tc.sw*(tc.t0+tc.t1*math.Abs(q)))
				slopes[i] = units.Displacement(-1*1*dm + q*dm*0 + tc.sw*tc.t1*sgn(q)*-1)
			}
			return true
		}
	}
	c.cached = false
	xp, sm, ok := c.sequential(d)
	if !ok {
		return false
	}
	settings[0] = xp
	for i := 1; i < len(settings); i++ {
		settings[i] = sm
		if h := c.held[i-1]; c.nheld > 0 && h == h {
			settings[i] = h
		}
	}
	dxp, dsm := c.settingSlopes(d, xp, sm)
	for i := range c.tau {
		tc := &c.tau[i]
		x, dx, q, dq := xp, dxp, d, 1.0
		if i > 0 {
			x, dx, q, dq = sm, dsm, -d, -1
			if h := c.held[i-1]; c.nheld > 0 && h == h {
				x, dx = h, 0 // a held motor keeps its setting
			}
		}
		var t, sl float64
		if tc.fixed {
			// τ = τ0 + τ1·|Δp| at the full torque displacement.
			dm := tc.dmax
			t = q*x*dm + tc.sw*(tc.t0+tc.t1*math.Abs(q))
			sl = dq*x*dm + q*dm*dx + tc.sw*tc.t1*sgn(q)*dq
		} else {
			u := &c.l.spec.Pump
			if i > 0 {
				u = &c.l.spec.Motors[i-1]
			}
			var ok bool
			t, sl, tc.cleak, tc.ctau, ok = u.torqueSlope(x, dx, tc.w, q, dq, &c.l.fl, c.l.plan.units[i].f53)
			if !ok {
				return false
			}
			tc.cx = x
		}
		torques[i], slopes[i] = units.Torque(t), units.Displacement(sl)
	}
	c.cached, c.cdp = true, d
	return true
}

// pumpSwings is sequential where the pump swings in range (the motors
// full) for a Curve whose leakage does not grow with the pump's setting
// (c.bp zero): the pump's setting and true there, false where sequential
// has to decide. The same arithmetic as sequential's.
func (c *Curve) pumpSwings(dp float64) (xp float64, ok bool) {
	a, sig := math.Abs(dp), sgn(dp)
	ap, bp, am, bm := c.ap*a, c.bp*a, c.amh*a, c.bm*a // am with the held motors' leakage
	q := c.pumpQ
	if !(bp < 0.5*math.Abs(q)) || math.Abs(q) < 1e-9*(c.qs+ap+am+bm) {
		return 0, false
	}
	k := -sig*ap - c.mqk - sig*(am+bm)
	xp = -k * c.invQ
	return xp, math.Abs(xp) <= 1
}

// settingSlopes returns the slopes over Δp of the settings sequential gave
// at d: the pump swings while the motors are full, else the motors; both
// are held (no slope) at a setting limit.
func (c *Curve) settingSlopes(d, xp, sm float64) (dxp, dsm float64) {
	switch {
	case c.limit.hit:
		// Both settings held at the ends of their ranges.
	case sm == 1 && c.bp == 0:
		dxp = (c.ap + c.amh + c.bm) * c.invQ
	case sm == 1:
		den := c.pumpQ - c.bp*d*sgn(xp)
		dxp = (c.ap + c.bp*math.Abs(xp) + c.amh + c.bm) / den
	case c.bm == 0:
		dsm = -(c.ap + c.bp*math.Abs(xp) + c.amh) * c.invM
	default:
		den := c.motorQ + c.bm*d*sgn(sm)
		dsm = -(c.ap + c.bp*math.Abs(xp) + c.amh + c.bm*math.Abs(sm)) / den
	}
	return dxp, dsm
}

// Leakage returns the loop's total leakage at pressure difference dp, the
// flow its charge circuit makes up (LoopState.ChargeFlow, to rounding), and
// its slope over Δp, with the settings the schedule gives there; ok is
// false where Torques would report false.
func (c *Curve) Leakage(dp units.Pressure) (q units.VolumeFlow, slope float64, ok bool) {
	if !c.ok {
		return 0, 0, false
	}
	d := float64(dp)
	c.limit.hit = false
	if c.swing {
		if xp, ok := c.pumpSwings(d); ok {
			// settingSlopes' pump branch (the motors full, held), as below.
			sm, dxp, dsm := 1.0, (c.ap+c.amh+c.bm)*c.invQ, 0.0
			a := math.Abs(d)
			k := c.ap + c.bp*math.Abs(xp) + c.amh + c.bm*math.Abs(sm)
			return units.VolumeFlow(k * a), sgn(d)*k + a*(c.bp*sgn(xp)*dxp+c.bm*sgn(sm)*dsm), true
		}
	}
	xp, sm, ok := c.sequential(d)
	if !ok {
		return 0, 0, false
	}
	// Every unit's leakage is (a + b·|x|)·|Δp|, the free motors' at their
	// common setting, the held ones' at theirs.
	dxp, dsm := c.settingSlopes(d, xp, sm)
	a := math.Abs(d)
	k := c.ap + c.bp*math.Abs(xp) + c.amh + c.bm*math.Abs(sm)
	q = units.VolumeFlow(k * a)
	slope = sgn(d)*k + a*(c.bp*sgn(xp)*dxp+c.bm*sgn(sm)*dsm)
	return q, slope, true
}

// sequential places the Sequential schedule's settings at dp from the
// loop's linear flow balance, the leakage scaled from |Δp| = 1: the
// schedule's own steps (sequentialBoth, linLoop.pumpFor and motorFor) for
// the case a Curve serves (motor floor above zero, a pump that swings over
// centre, a balance clearly monotone in the pump setting, so with a single
// zero), in closed form, with false where the schedule would report a
// setting limit and where it is not that case.
func (c *Curve) sequential(dp float64) (xp, sm float64, ok bool) {
	a, sig := math.Abs(dp), sgn(dp)
	ap, bp, am, bm := c.ap*a, c.bp*a, c.amh*a, c.bm*a // am with the held motors' leakage
	q := c.pumpQ
	if !(bp < 0.5*math.Abs(q)) || math.Abs(q) < 1e-9*(c.qs+ap+am+bm) {
		// A balance that is not monotone in the pump setting, or a pump
		// too near standstill for the schedule's choice of its end to be
		// more than rounding: the general path's.
		return 0, 0, false
	}
	// Free motors full: r(x) = x·Dp·ωp − σ·(ap + bp·|x|) − Σ Dm·ωm − σ·(am + bm)
	// (the held motors' flow and leakage added to the motors'), monotone
	// in x, its zero on the side where −r(0) has the sign of Dp·ωp.
	k := -sig*ap - c.mqk - sig*(am+bm) // r(0)
	switch {
	case bp == 0:
		xp = -k * c.invQ
	case (-k > 0) == (q > 0):
		xp = -k / (q - sig*bp)
	default:
		xp = -k / (q + sig*bp)
	}
	if math.Abs(xp) <= 1 {
		return xp, 1, true
	}
	if !finite(xp) || c.nheld == len(c.held) {
		// With every motor held, a pump that cannot meet the flow is a
		// limit the general path names.
		return 0, 0, false
	}
	// The pump full on the side of its zero: the free motors swing back,
	// the zero of the balance (linear in s > 0) between the floor and full.
	xp = math.Copysign(1, xp)
	if bm == 0 {
		sm = (xp*q - sig*(ap+bp) - sig*am - c.heldQ) * c.invM
	} else {
		sm = (xp*q - sig*(ap+bp) - sig*am - c.heldQ) / (c.motorQ + sig*bm)
	}
	if sm >= c.smin && sm <= 1 {
		return xp, sm, true
	}
	// No motor setting in range: the schedule's nearest end and the setting
	// it would need (sequentialBoth), a setting limit.
	lin := linLoop{sigma: sig, pumpQ: q, ap: ap, bp: bp, motorQ: c.motorQ, am: am, bm: bm}
	ha, hb := lin.residual(xp, c.smin), lin.residual(xp, 1)
	if c.nheld > 0 {
		// The held motors' flow, a constant of the balance (their
		// leakage is in am).
		ha, hb = ha-c.heldQ, hb-c.heldQ
	}
	if (ha > 0) != (hb > 0) || ha == 0 || hb == 0 || !(math.Abs(hb-ha) > 1e-6*math.Max(math.Abs(ha), math.Abs(hb))) {
		// Rounding at an end of the range, or motors so near standstill
		// that the setting needed is lost in rounding: the schedule's to
		// decide.
		return 0, 0, false
	}
	sm = c.smin
	if math.Abs(hb) < math.Abs(ha) {
		sm = 1
	}
	need := c.smin - ha*(1-c.smin)/(hb-ha)
	lim := c.smin
	if need > 1 {
		lim = 1
	}
	if !finite(need) {
		return 0, 0, false
	}
	c.limit = setLimit{hit: true, need: need, lim: lim}
	return xp, sm, true
}

// Fill fills st as Loop.Trial does at pressure difference dp, from the
// settings the last call of Torques gave at the same dp (settings). It
// returns what Trial returns: nil, or the bare sentinel of a crossed limit
// (the limit itself in st.Limit).
func (c *Curve) Fill(dp units.Pressure, settings []float64, st *LoopState) error {
	l := c.l
	if n := len(c.tau) - 1; len(st.Motors) != n || len(st.Settings) != n+1 {
		st.size(n)
	}
	st.Limit = LimitError{}
	if c.limit.hit {
		st.Limit = c.limit.value()
	}
	src := settings
	if len(src) < len(st.Settings) {
		// copy's semantics: the rest of st.Settings is kept.
		copy(st.Settings, src)
		src = st.Settings
	}
	if check, ok := c.fillFast(float64(dp), src, st); ok {
		// Loop.crossed finds a limit only where one of these holds (a
		// peak pressure: the lowest of the units').
		if st.Limit.Err == nil && (check || st.High > l.spec.Relief || math.Abs(float64(dp)) > l.plan.peak) {
			l.crossed(st)
		}
		return st.Limit.Err
	}
	copy(st.Settings, settings)
	return c.fillUnits(dp, st)
}

// fillUnits is Fill unit by unit from the settings in st.Settings:
// Curve.fill (a Curve of fixed torques) or Loop.fill, then Loop.crossed;
// it gives every error Fill reports.
func (c *Curve) fillUnits(dp units.Pressure, st *LoopState) error {
	l := c.l
	var err error
	if c.fixed {
		err = c.fill(float64(dp), st)
	} else {
		err = l.fill(units.AngularVelocity(c.wp), c.wms, dp, st)
	}
	if err != nil {
		return err
	}
	if st.Limit.Err == nil {
		l.crossed(st)
	}
	return st.Limit.Err
}

// fillFast is fill (a Curve of fixed torques) or Loop.fill (any other),
// after copying settings into st.Settings, where every setting is within
// full displacement and every result is finite, in one pass and the same
// arithmetic (Unit.ideal, Unit.point, LoopState.sum): it reports false, st
// half written, where that is not so, and fill or Loop.fill then gives the
// error. The loss model's leakage and torque of a unit whose torque is not
// fixed are those the last Torques kept where it was called at the same
// pressure and setting (the same numbers: the same arithmetic). check is
// true where a setting lies below its unit's swing or a unit turns faster
// than rated, limits Loop.crossed reports.
func (c *Curve) fillFast(dp float64, settings []float64, st *LoopState) (check, ok bool) {
	tau := c.tau
	plan := c.l.plan.units[:len(tau)]
	src := settings[:len(tau)]
	set := st.Settings[:len(tau)]
	motors := st.Motors[:len(tau)-1]
	a := math.Abs(dp)
	st.Pressure = units.Pressure(dp)
	st.Low = c.l.spec.Charge
	st.High = c.l.spec.Charge + units.Pressure(a)
	// in, out, loss and leak as LoopState.sum adds them, pump first; fin
	// sums every value point would refuse if it were not finite (a NaN or
	// an infinity makes it one).
	var in, out, loss, leak, fin float64
	for i := range tau {
		tc := &tau[i]
		x := src[i]
		set[i] = x // copy(st.Settings, settings)
		if !(math.Abs(x) <= 1) {
			return false, false
		}
		p, q := &st.Pump, dp
		if i > 0 {
			p, q = &motors[i-1], -dp
		}
		up := &plan[i]
		w := tc.w
		check = check || x < up.low || math.Abs(w) > up.wmax
		// Unit.ideal: the sign of Δp·x·ω is that of Δp·qi when neither
		// qi nor ti is zero.
		qi := x * tc.dmax * w
		ti := q * x * tc.dmax
		mode := Idle
		if qi != 0 && ti != 0 {
			mode = Motoring
			if (qi > 0) == (q > 0) {
				mode = Pumping
			}
		}
		var lk, tq float64
		switch {
		case c.fixed:
			// Curve.fill: from the terms the Curve keeps.
			lk, tq = (tc.la+tc.lb*math.Abs(x))*a, tc.t0+tc.t1*a
		case !tc.fixed && c.cached && tc.cx == x && c.cdp == dp:
			// What the loss model gave the last Torques at this point.
			lk, tq = tc.cleak, tc.ctau
		default:
			// Loop.fill: the loss model (Unit.eval's).
			u := &c.l.spec.Pump
			if i > 0 {
				u = &c.l.spec.Motors[i-1]
			}
			if m := u.wil; m != nil {
				f := &c.l.fl
				ls, err := m.losses(x, u.dmax, w, a, f.mu, f.rho, f.beta, u.d53)
				if err != nil {
					return false, false
				}
				lk, tq = float64(ls.Leakage), float64(ls.Torque)
			}
		}
		// Unit.point.
		qf := qi - sgn(q)*lk
		t := ti + tc.sw*tq
		mech, hyd := t*w, q*qf
		ls := math.Abs(w)*tq + a*lk
		p.Setting, p.Speed, p.Pressure = x, units.AngularVelocity(w), units.Pressure(q)
		p.IdealFlow, p.Flow, p.Leakage = units.VolumeFlow(qi), units.VolumeFlow(qf), units.VolumeFlow(lk)
		p.IdealTorque, p.Torque, p.LossTorque = units.Torque(ti), units.Torque(t), units.Torque(tq)
		p.Mode = mode
		p.Mechanical, p.Hydraulic, p.Loss = units.Power(mech), units.Power(hyd), units.Power(ls)
		ev, eh := 1.0, 1.0
		switch mode {
		case Pumping:
			ev, eh = clamp01(qf/qi), clamp01(ti/t)
		case Motoring:
			ev, eh = clamp01(qi/qf), clamp01(t/ti)
		}
		p.Volumetric, p.HydroMechanical, p.Overall = ev, eh, ev*eh
		p.AboveRated = a > up.rated
		if !(lk >= 0) || !(tq >= 0) {
			return false, false
		}
		fin += lk + tq + mech + hyd + ls
		// LoopState.sum.
		if mech > 0 {
			in += mech
		} else {
			out -= mech
		}
		loss += ls
		leak += lk
	}
	if !finite(fin) {
		return false, false
	}
	st.Input, st.Output, st.Loss = units.Power(in), units.Power(out), units.Power(loss)
	st.Leakage, st.ChargeFlow = units.VolumeFlow(leak), units.VolumeFlow(leak)
	st.Efficiency = 1
	if in > 0 {
		st.Efficiency = clamp01(out / in)
	}
	return check, true
}

// fill is Loop.fill for a Curve whose units' torques are fixed: each unit's
// leakage and loss torque from the terms the Curve keeps at its speed, as
// the loss model gives them to rounding, not from the model again.
func (c *Curve) fill(dp float64, st *LoopState) error {
	l := c.l
	for _, x := range st.Settings {
		if !finite(x) {
			return fmt.Errorf("%w: schedule gave setting %v", ErrModel, x)
		}
	}
	st.Pressure = units.Pressure(dp)
	st.Low = l.spec.Charge
	st.High = l.spec.Charge + units.Pressure(math.Abs(dp))
	a := math.Abs(dp)
	for i := range c.tau {
		tc := &c.tau[i]
		u, p, q := &l.spec.Pump, &st.Pump, dp
		if i > 0 {
			u, p, q = &l.spec.Motors[i-1], &st.Motors[i-1], -dp
		}
		x := st.Settings[i]
		if math.Abs(x) > 1 {
			return &LimitError{Quantity: "setting", Value: units.Plain(x), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, x)), Err: ErrSettingLimit}
		}
		qi, ti, mode := u.ideal(x, tc.w, q)
		leak := (tc.la + tc.lb*math.Abs(x)) * a
		tau := tc.t0 + tc.t1*a
		if err := u.point(p, x, tc.w, q, qi, ti, mode, leak, tau); err != nil {
			return err
		}
	}
	st.sum()
	return nil
}

// torqueSlope returns the torque of u at setting x, speed w and pressure
// q = dq·Δp in its own frame (as eval computes it) and its slope over Δp,
// given the setting's slope dx, and the leakage and loss torque the loss
// model gives there: Wilson.losses' arithmetic, so its numbers, with
// D_t^(5/3) at full setting taken from f53 (the unit's unitPlan.f53, the
// same expression worked out once) and ∛D_t shared with the slope's term.
func (u *Unit) torqueSlope(x, dx, w, q, dq float64, f *fluid, f53 float64) (t, slope, leak, tau float64, ok bool) {
	ti := q * x * u.dmax
	slope = dq*x*u.dmax + q*u.dmax*dx
	m := u.wil
	if m == nil {
		return ti, slope, 0, 0, u.spec.Loss == nil
	}
	// Wilson.losses; the checks a Curve's plan and speeds have not made.
	ax, ap, aw := math.Abs(x), math.Abs(q), math.Abs(w)
	if !finite(ap) || !(ax <= 1) {
		return 0, 0, 0, 0, false
	}
	dqs := u.dmax * (1 - m.LeakageSetting + m.LeakageSetting*ax)
	dt := u.dmax * (1 - m.TorqueSetting + m.TorqueSetting*ax)
	leak = m.Slip * dqs * ap / f.mu
	if m.Compressibility {
		leak += (m.DeadVolume + ax) * u.dmax * aw * ap / f.beta
	}
	tau = m.Viscous*dt*f.mu*aw + m.Friction*dt*ap + float64(m.ConstantPressure)*dt + float64(m.ConstantTorque)
	var c float64 // ∛D_t, where worked out
	if m.Hydrodynamic > 0 {
		d53 := u.d53
		if m.TorqueSetting != 0 || !(d53 > 0) {
			if ax == 1 && f53 > 0 {
				d53 = f53
			} else {
				c = math.Cbrt(dt)
				d53 = dt * c * c
			}
		}
		tau += m.Hydrodynamic * f.rho * aw * aw * d53
	}
	sw := sgn(w)
	t = ti + sw*tau
	if sw == 0 {
		return t, slope, leak, tau, true
	}
	// τ = D_t·(Cv·μ·|ω| + Cf·|Δp| + p_c) + Ch·ρ·ω²·D_t^(5/3).
	slope += sw * dt * m.Friction * sgn(q) * dq
	if m.TorqueSetting != 0 && dx != 0 {
		dtau := m.Viscous*f.mu*aw + m.Friction*ap + float64(m.ConstantPressure)
		if m.Hydrodynamic > 0 {
			if c == 0 {
				c = math.Cbrt(dt)
			}
			dtau += m.Hydrodynamic * f.rho * w * w * 5.0 / 3 * (c * c) // ∛D_t²
		}
		slope += sw * dtau * u.dmax * m.TorqueSetting * sgn(x) * dx
	}
	return t, slope, leak, tau, true
}
