package hydrostat

import (
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/units"
)

// TestCurveMatchesAt: over random Wilson loops (every coefficient drawn,
// compressibility and the setting shares included), speeds and pressures,
// a Curve's settings and torques are Loop.At's to rounding, its slopes are
// the central difference quotients of At's torques, and Fill is At. Where
// it gives up (a setting limit, a pump near standstill), the caller's
// general path takes over; it may not give up often.
func TestCurveMatchesAt(t *testing.T) {
	checked, slopes, gaveUp, limited := 0, 0, 0, 0
	defer func() {
		t.Logf("%d points checked (%d at a setting limit), %d slopes; gave up on %d points At solves", checked, limited, slopes, gaveUp)
		if checked == 0 || slopes == 0 || gaveUp > checked/4 {
			t.Error("too few points or slopes checked")
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		m := Wilson{
			Slip: rapid.Float64Range(0, 3e-9).Draw(t, "slip"), Viscous: rapid.Float64Range(0, 2e5).Draw(t, "viscous"),
			Friction: rapid.Float64Range(0, 0.03).Draw(t, "friction"), Hydrodynamic: rapid.Float64Range(0, 5).Draw(t, "churning"),
			ConstantPressure: units.Bar(rapid.Float64Range(0, 3).Draw(t, "constant bar")),
			ConstantTorque:   units.NewtonMetres(rapid.SampledFrom([]float64{0, 0, 2.5}).Draw(t, "constant N·m")),
			Compressibility:  rapid.Bool().Draw(t, "compressibility"), DeadVolume: rapid.Float64Range(0, 1).Draw(t, "dead volume"),
			LeakageSetting: rapid.Float64Range(0, 1).Draw(t, "leakage share"), TorqueSetting: rapid.SampledFrom([]float64{0, 0, 0.5, 1}).Draw(t, "torque share"),
		}
		unit := func(cc float64) Unit {
			u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(cc), Loss: m})
			if err != nil {
				t.Fatal(err)
			}
			return u
		}
		nm := rapid.IntRange(1, 2).Draw(t, "motors")
		motors := make([]Unit, nm)
		for i := range motors {
			motors[i] = unit(rapid.Float64Range(40, 160).Draw(t, "motor cc"))
		}
		l, err := NewLoop(LoopSpec{Pump: unit(rapid.Float64Range(40, 160).Draw(t, "pump cc")), Motors: motors, Oil: VG46,
			Temperature: units.Celsius(rapid.Float64Range(30, 90).Draw(t, "oil °C")), Charge: units.Bar(20), Relief: units.Bar(450)})
		if err != nil {
			t.Fatal(err)
		}
		wp := units.RPM(rapid.Float64Range(-2500, 2500).Draw(t, "pump rpm"))
		wms := make([]units.AngularVelocity, nm)
		for i := range wms {
			wms[i] = units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "motor rpm"))
		}
		dp := units.Bar(rapid.Float64Range(-400, 400).Draw(t, "Δp bar"))
		var c Curve
		if !l.Curve(wp, wms, &c) {
			t.Fatal("a Sequential Wilson loop is no Curve")
		}
		set := make([]float64, nm+1)
		tq := make([]units.Torque, nm+1)
		sl := make([]units.Displacement, nm+1)
		var st LoopState
		errAt := l.At(wp, wms, dp, &st)
		ok := c.Torques(dp, set, tq, sl)
		if !ok {
			// A setting limit, a pump near standstill or a balance not
			// monotone in the pump setting are left to the general path.
			if errAt == nil {
				gaveUp++
			}
			return
		}
		checked++
		tscale := 0.0
		for k := range tq {
			p := &st.Pump
			if k > 0 {
				p = &st.Motors[k-1]
			}
			tscale = math.Max(tscale, math.Abs(float64(p.Torque)))
		}
		for k := range set {
			p := &st.Pump
			if k > 0 {
				p = &st.Motors[k-1]
			}
			if math.Abs(set[k]-st.Settings[k]) > 1e-13 {
				t.Fatalf("unit %d: setting %.17g, At %.17g", k, set[k], st.Settings[k])
			}
			if d := math.Abs(float64(tq[k] - p.Torque)); d > 1e-12*(tscale+1) {
				t.Fatalf("unit %d: torque %.17g, At %.17g", k, float64(tq[k]), float64(p.Torque))
			}
		}
		// Fill is At at the same pressure, a setting limit included. The
		// loss to the rounding of the loss itself or of the input, whichever
		// is larger (at a setting limit, on a pump near standstill, the loss
		// can be thousands of times the input).
		var fs LoopState
		ef := c.Fill(dp, set, &fs)
		if (ef == nil) != (errAt == nil) || math.Abs(float64(fs.Loss-st.Loss)) > 1e-12*(math.Abs(float64(st.Input))+float64(st.Loss)+1) {
			t.Fatalf("Fill: %v, loss %.17g; At: %v, loss %.17g (input %.17g)", ef, float64(fs.Loss), errAt, float64(st.Loss), float64(st.Input))
		}
		if fs.Limit.Err != st.Limit.Err || fs.Limit.Quantity != st.Limit.Quantity ||
			math.Abs(fs.Limit.Value.SI-st.Limit.Value.SI) > 1e-7*(1+math.Abs(st.Limit.Value.SI)) {
			t.Fatalf("Fill's limit %+v, At's %+v", fs.Limit, st.Limit)
		}
		if st.Limit.Err == ErrSettingLimit {
			limited++
		}
		// Leakage is the flow the charge circuit makes up, as At gives it.
		q, qs, okq := c.Leakage(dp)
		// (1e-300 m³/s is nothing: below it the flows are subnormal and
		// keep fewer digits than 1e-12 asks.)
		if !okq || math.Abs(float64(q-st.ChargeFlow)) > 1e-12*(float64(st.ChargeFlow)+math.Abs(float64(st.Pump.IdealFlow)))+1e-300 {
			t.Fatalf("Leakage %.17g (%v), At's charge flow %.17g, ideal %.17g", float64(q), okq, float64(st.ChargeFlow), float64(st.Pump.IdealFlow))
		}
		// The slope against central differences of At, away from the kinks
		// at Δp = 0 and at the switch of the schedule's branch.
		h := 1e-6 * math.Abs(float64(dp))
		var lo, hi LoopState
		if l.At(wp, wms, dp-units.Pressure(h), &lo) != nil || l.At(wp, wms, dp+units.Pressure(h), &hi) != nil ||
			math.Abs(float64(dp)) < 1e3 || (lo.Settings[1] == 1) != (hi.Settings[1] == 1) {
			return
		}
		slopes++
		if fd := float64(hi.ChargeFlow-lo.ChargeFlow) / (2 * h); math.Abs(qs-fd) > 1e-5*(math.Abs(fd)+1e-12) {
			t.Fatalf("leakage slope %.10g, central difference %.10g", qs, fd)
		}
		for k := range sl {
			tl, th := float64(lo.Pump.Torque), float64(hi.Pump.Torque)
			if k > 0 {
				tl, th = float64(lo.Motors[k-1].Torque), float64(hi.Motors[k-1].Torque)
			}
			fd := (th - tl) / (2 * h)
			if math.Abs(float64(sl[k])-fd) > 1e-5*(math.Abs(fd)+float64(l.spec.Pump.dmax)) {
				t.Fatalf("unit %d: slope %.10g, central difference %.10g", k, float64(sl[k]), fd)
			}
		}

	})
}

// TestCurveRefuses: a loop the Curve cannot differentiate is no Curve.
func TestCurveRefuses(t *testing.T) {
	u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(100), Loss: Wilson{Slip: 1e-9}})
	if err != nil {
		t.Fatal(err)
	}
	for _, sched := range []Schedule{MinLoss{}} {
		l, err := NewLoop(LoopSpec{Pump: u, Motors: []Unit{u}, Oil: VG46, Temperature: units.Celsius(50), Charge: units.Bar(20),
			Relief: units.Bar(450), Schedule: sched})
		if err != nil {
			t.Fatal(err)
		}
		var c Curve
		if l.Curve(units.RPM(1000), []units.AngularVelocity{units.RPM(500)}, &c) {
			t.Errorf("%T: a Curve", sched)
		}
	}
}
