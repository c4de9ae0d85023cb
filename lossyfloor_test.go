package powersplit

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// The lossy floor: the lossy benchmark layout written out by hand for this
// one topology, with the same models as the general solver (Wilson units in
// their classic form, the Sequential schedule, Müller's carrier-frame loss
// of the set, the mesh efficiency of every gear applied in the direction
// power flows). It is what a hand-specialised lossy evaluation costs, the
// fairest bound on what a general solver could reach, and, written
// independently of the solver's network assembly, a second check of its
// lossy results (TestLossyFloorMatchesSolver).
//
// With the directions fixed, the summing shaft balances when
//
//	F(Δp) = −kRing·kp·Tpump(Δp)/kP + kM·Tmotor(Δp)/km + g·Tout/kR = 0
//
// where kp and km are the pump and motor gear ratios, kP, kM and kR the
// pump, motor and range gear's efficiency or its inverse, by the direction
// of their power, and kRing the set's ring factor for its rolling-power
// direction (−i0·η0 or −i0/η0). With the motor at full
// setting, flow continuity gives the pump setting
// xp = (Dm·ωm + σ·(Qs,p + Qs,m))/(Dp·ωp), σ = sign Δp, and the Wilson
// torques Tpump = Δp·xp·Dp + sign(ωp)·τp, Tmotor = −Δp·Dm + sign(ωm)·τm,
// so F is a quadratic in Δp on each side of zero; Newton's method with its
// exact slope solves it from the lossless pressure. The directions are then
// read off the powers and the solve repeated until they hold.

// lossyParams are the benchmark layout's data as plain numbers.
type lossyParams struct {
	i0, eta0, etaG float64 // set ratio, its basic efficiency, gear efficiency
	dP, dM         float64 // maximum displacements, per radian
	cs, cv, cf, pc float64 // Wilson coefficients (pc in Pa)
	mu             float64 // dynamic viscosity, Pa·s
	smin           float64 // the schedule's smallest motor setting
	pumpK, motorK  float64 // pump and motor gear ratios
	ptoK           float64 // PTO gear ratio
}

func benchLossyParams() lossyParams {
	oil := hydrostat.VG46
	d := float64(units.CCPerRev(100))
	return lossyParams{i0: testI0, eta0: 0.98, etaG: DefaultGearEfficiency, dP: d, dM: d,
		cs: demoWilson.Slip, cv: demoWilson.Viscous, cf: demoWilson.Friction, pc: float64(demoWilson.ConstantPressure),
		mu: float64(oil.DynamicViscosity(units.Celsius(60))), smin: 0.2,
		pumpK: benchPumpRatio, motorK: benchMotorRatio, ptoK: benchPTORatio}
}

// lossyPoint is the result of the lossy floor.
type lossyPoint struct {
	ring, sun, pump, motor float64 // speeds, rad/s
	dp, xp, xm             float64 // loop pressure (Pa) and settings
	pumpT, motorT          float64 // torques the shafts apply to the units
	inputT                 float64 // engine torque
	ok                     bool
}

func sign(v float64) float64 {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// units returns the unit torques and their slopes over Δp, and the
// settings, at loop pressure dp; false when no setting gives continuity.
func (lp *lossyParams) units(dp, wp, wm float64) (tp, tm, dtp, dtm, xp, xm float64, ok bool) {
	s := sign(dp)
	ks := lp.cs * (lp.dP + lp.dM) / lp.mu // total leakage per |Δp|
	leak := ks * math.Abs(dp)
	xp, xm = (lp.dM*wm+s*leak)/(lp.dP*wp), 1
	dxp, dxm := ks/(lp.dP*wp), 0.0
	if math.Abs(xp) > 1 {
		// The pump is full: the motor swings back.
		xp = sign(xp)
		xm = (xp*lp.dP*wp - s*leak) / (lp.dM * wm)
		dxp, dxm = 0, -ks/(lp.dM*wm)
		if !(xm >= lp.smin && xm <= 1) {
			return 0, 0, 0, 0, 0, 0, false
		}
	}
	tauP := lp.dP * (lp.cv*lp.mu*math.Abs(wp) + lp.cf*math.Abs(dp) + lp.pc)
	tauM := lp.dM * (lp.cv*lp.mu*math.Abs(wm) + lp.cf*math.Abs(dp) + lp.pc)
	tp = dp*xp*lp.dP + sign(wp)*tauP
	tm = -dp*xm*lp.dM + sign(wm)*tauM
	dtp = xp*lp.dP + dp*lp.dP*dxp + sign(wp)*lp.cf*lp.dP*s
	dtm = -xm*lp.dM - dp*lp.dM*dxm + sign(wm)*lp.cf*lp.dM*s
	return tp, tm, dtp, dtm, xp, xm, true
}

// lossyFloor evaluates the lossy benchmark layout in range ratio g at
// engine speed win, output speed wout, output torque tout and PTO torque
// tpto.
func lossyFloor(lp *lossyParams, g, win, wout, tout, tpto float64, f *lossyPoint) {
	f.ok = false
	f.ring = wout / g
	f.sun = lp.i0*f.ring + (1-lp.i0)*win
	f.pump, f.motor = lp.pumpK*f.sun, f.ring/lp.motorK
	eta := lp.etaG
	// The lossless pressure (F is linear in Δp with ideal units), and the
	// directions read off its powers: efficiencies or their inverses, and
	// the set's ring factor.
	kRing := -lp.i0
	dp := -g * tout / (-kRing*lp.pumpK*lp.dM*f.motor/f.pump - lp.dM/lp.motorK)
	tp, tm := dp*lp.dM*f.motor/f.pump, -dp*lp.dM
	kP, kM, kR := 1.0, 1.0, eta
	if g*tout*f.ring < 0 { // power enters the range gear at the output
		kR = 1 / eta
	}
	for pass := 0; ; pass++ {
		nP, nM, nRing := eta, eta, -lp.i0*lp.eta0
		if lp.pumpK*tp/kP*f.sun < 0 { // power enters the pump gear at the pump
			nP = 1 / eta
		}
		if -tm*f.motor < 0 { // power enters the motor gear at the sum
			nM = 1 / eta
		}
		if ts := -lp.pumpK * tp / kP; ts*(f.sun-win) < 0 { // the ring drives
			nRing = -lp.i0 / lp.eta0
		}
		if pass > 0 && nP == kP && nM == kM && nRing == kRing {
			break
		}
		if pass == 4 {
			return
		}
		kP, kM, kRing = nP, nM, nRing
		// Newton's method on F with the directions fixed.
		converged := false
		for it := 0; it < 30; it++ {
			var dtp, dtm float64
			var ok bool
			tp, tm, dtp, dtm, f.xp, f.xm, ok = lp.units(dp, f.pump, f.motor)
			if !ok {
				return
			}
			F := -kRing*lp.pumpK*tp/kP + kM*tm/lp.motorK + g*tout/kR
			dF := -kRing*lp.pumpK*dtp/kP + kM*dtm/lp.motorK
			step := F / dF
			dp -= step
			// Newton's method converges quadratically here: after a step
			// below 1e-7 of the pressure the next would be below 1e-13.
			if math.Abs(step) <= 1e-7*math.Abs(dp)+1e-9 {
				converged = true
				break
			}
		}
		if !converged {
			return
		}
		tp, tm, _, _, f.xp, f.xm, _ = lp.units(dp, f.pump, f.motor)
	}
	kPTO := eta
	if tpto*win < 0 {
		kPTO = 1 / eta
	}
	ts := -lp.pumpK * tp / kP
	f.dp, f.pumpT, f.motorT = dp, tp, tm
	f.inputT = -(1+kRing)*ts + lp.ptoK*tpto/kPTO
	f.ok = true
}

// TestLossyFloorMatchesSolver checks the general solver's lossy results on
// every benchmark point against the hand-written lossy evaluation: loop
// pressure, settings, unit torques and engine torque to 1e-10 (they agree
// to 1e-12 on amd64). The points cover both pressure signs, braking and
// driving, and both branches of the schedule (pump swinging, pump full
// with the motor swinging back); a change of 0.1 % in the set's basic
// efficiency or of 1 K in the oil temperature fails the check.
func TestLossyFloorMatchesSolver(t *testing.T) {
	pts := benchPoints(t)
	s := NewSolver(benchLayout(t, true))
	lp := benchLossyParams()
	var st State
	var f lossyPoint
	for _, p := range pts {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		lossyFloor(&lp, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
			float64(p.Outputs[0].Torque), float64(p.PTO[0]), &f)
		if !f.ok {
			t.Errorf("%v rpm, %v N·m: the lossy floor did not converge", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque))
			continue
		}
		lr := &st.Loops[0]
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"pressure", float64(lr.Pressure), f.dp},
			{"pump setting", lr.Pump.Setting, f.xp},
			{"motor setting", lr.Motors[0].Setting, f.xm},
			{"pump torque", float64(lr.Pump.Torque), f.pumpT},
			{"motor torque", float64(lr.Motors[0].Torque), f.motorT},
			{"input torque", float64(st.InputTorque), f.inputT},
		} {
			if !testutil.Close(c.got, c.want, 1e-10, 1e-10) {
				t.Errorf("%v rpm, %v N·m: %s %.12g, lossy floor %.12g", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque), c.name, c.got, c.want)
			}
		}
	}
}

var sinkLossy float64

// BenchmarkLossyFloor is the hand-written lossy evaluation, per point of
// benchPoints.
func BenchmarkLossyFloor(b *testing.B) {
	pts := benchPoints(b)
	lp := benchLossyParams()
	var f lossyPoint
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		p := &pts[i]
		lossyFloor(&lp, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
			float64(p.Outputs[0].Torque), float64(p.PTO[0]), &f)
		sinkLossy += f.inputT
		if i++; i == len(pts) {
			i = 0
		}
	}
}
