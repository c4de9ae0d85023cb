package hydrostat

import (
	"errors"
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

func finitePoint(t *testing.T, p Point) {
	t.Helper()
	for _, v := range []float64{p.Setting, float64(p.Speed), float64(p.Pressure), float64(p.IdealFlow), float64(p.Flow),
		float64(p.Leakage), float64(p.IdealTorque), float64(p.Torque), float64(p.LossTorque), p.Volumetric,
		p.HydroMechanical, p.Overall, float64(p.Mechanical), float64(p.Hydraulic), float64(p.Loss)} {
		if !finite(v) {
			t.Fatalf("non-finite value in %+v", p)
		}
	}
}

func FuzzNewUnit(f *testing.F) {
	f.Add(100.0, 3000.0, 420.0, 480.0, 0, 0.0, 0.0, 0.0, 1e-8, 0.02, 0)
	f.Add(0.0, 0.0, 0.0, 0.0, 9, 12.7, 127.0, 10.0, 0.0, 0.0, 2)
	f.Add(-1.0, math.NaN(), math.Inf(1), 0.0, -3, -1.0, 0.0, 95.0, -1.0, 2.0, -1)
	f.Add(100.0, 3000.0, 420.0, 480.0, 0, 0.0, 0.0, 0.0, 1e-8, 0.02, 8)  // kind 2: no such kind
	f.Add(100.0, 3000.0, 420.0, 480.0, 0, 0.0, 0.0, 0.0, 1e-8, 0.02, -4) // kind −1
	f.Add(100.0, 3000.0, 420.0, 480.0, 0, 0.0, 0.0, 0.0, 1e-8, 0.02, 3)  // swing 3: no such swing
	// mode packs the unit's kind (mode/4) and swing (mode%4).
	f.Fuzz(func(t *testing.T, cc, rpm, rated, peak float64, pistons int, dmm, pmm, deg, cs, cf float64, mode int) {
		kind, swing := Kind(mode/4), Swing(mode%4)
		u, err := NewUnit(UnitSpec{Kind: kind, MaxDisplacement: units.CCPerRev(cc), MaxSpeed: units.RPM(rpm), Swing: swing,
			RatedPressure: units.Bar(rated), PeakPressure: units.Bar(peak), Pistons: pistons,
			PistonDiameter: units.Millimetres(dmm), PitchDiameter: units.Millimetres(pmm), MaxAngle: units.Degrees(deg),
			Loss: Wilson{Slip: cs, Friction: cf}})
		enumOK := (kind == Swashplate || kind == BentAxis) && swing >= SwingUnstated && swing <= SwingOverCentre
		if !enumOK && err == nil {
			t.Fatalf("NewUnit accepted kind %d, swing %d", int(kind), int(swing))
		}
		if err != nil {
			if !errors.Is(err, ErrInvalid) {
				t.Fatalf("error of no documented kind: %v", err)
			}
			return
		}
		if d := float64(u.Spec().MaxDisplacement); !(d > 0) || !finite(d) {
			t.Fatalf("built unit with displacement %v", d)
		}
		if k := u.Spec().Kind; k != Swashplate && k != BentAxis {
			t.Fatalf("built a unit of kind %v (not swashplate or bent axis)", k)
		}
	})
}

func FuzzUnitAt(f *testing.F) {
	f.Add(0.7, 2000.0, 250.0, 60.0, 1e-8, 5e4, 0.02, 10.0, true, 0.5)
	f.Add(-1.0, -3000.0, -480.0, 0.0, 0.0, 0.0, 0.0, 0.0, false, 0.0)
	f.Add(0.0, 0.0, 0.0, -300.0, 1.0, 1.0, 1.0, 1.0, true, 1.0)
	f.Add(1e-300, 1e300, 1e-300, 1e4, 1e300, 1e300, 1e300, 1e300, true, 1e300)
	f.Fuzz(func(t *testing.T, x, rpm, bar, degC, cs, cv, cf, ch float64, comp bool, cr float64) {
		u, err := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(100), MaxSpeed: units.RPM(3000), PeakPressure: units.Bar(480),
			Loss: Wilson{Slip: cs, Viscous: cv, Friction: cf, Hydrodynamic: ch, Compressibility: comp, DeadVolume: cr}})
		if err != nil {
			return
		}
		p, err := u.At(x, units.RPM(rpm), units.Bar(bar), VG46, units.Celsius(degC))
		if err == nil || isLimit(err) {
			finitePoint(t, p)
		}
		if err == nil {
			checkPoint(t, p)
		}
		q, err := u.PressureFor(x, units.RPM(rpm), units.NewtonMetres(bar), VG46, units.Celsius(degC))
		if err == nil || isLimit(err) {
			finitePoint(t, q)
		}
		if err == nil {
			checkPoint(t, q)
			// Round trip: the point's torque is the one asked for.
			if math.Abs(float64(q.Torque)-bar) > 1e-6*math.Abs(bar)+1e-9 {
				t.Fatalf("PressureFor(%v N·m) gives a point of %v", bar, q.Torque)
			}
		}
	})
}

func FuzzNewGradeOil(f *testing.F) {
	f.Add(46.0, 100.0, 60.0)
	f.Add(2.0, 400.0, -40.0)
	f.Add(3200.0, -100.0, 300.0)
	f.Add(math.NaN(), math.Inf(1), 0.0)
	f.Fuzz(func(t *testing.T, grade, vi, at float64) {
		o, err := NewGradeOil(grade, vi)
		if err != nil {
			return
		}
		if got, err := o.ViscosityIndex(); err != nil || math.Abs(got-vi) > 1e-6*math.Max(1, math.Abs(vi)) {
			t.Fatalf("NewGradeOil(%v, %v) has VI %v, %v", grade, vi, got, err)
		}
		if nu := o.Viscosity(units.Celsius(at)); math.IsNaN(float64(nu)) || nu < 0 {
			t.Fatalf("viscosity %v at %v °C", nu, at)
		}
	})
}

func FuzzViscosityIndex(f *testing.F) {
	f.Add(73.3, 8.86)
	f.Add(2.0, 2.0)
	f.Add(1e300, 1e299)
	f.Fuzz(func(t *testing.T, u, y float64) {
		vi, err := ViscosityIndex(units.Centistokes(u), units.Centistokes(y))
		if err == nil && !finite(vi) {
			t.Fatalf("ViscosityIndex(%v, %v) = %v", u, y, vi)
		}
	})
}

func FuzzNewOil(f *testing.F) {
	f.Add(40.0, 46.0, 100.0, 6.8, 60.0, 0.0)
	f.Add(40.0, 46.0, 40.0, 46.0, 60.0, 0.0)
	f.Add(-300.0, 1e300, 1e300, 2.0, -1.0, 0.0)
	f.Add(-273.15, 0.0, -273.15, 0.0, 60.0, 25.0)
	f.Fuzz(func(t *testing.T, t1, n1, t2, n2, at, cp float64) {
		o, err := NewOil(OilSpec{T1: units.Celsius(t1), Nu1: units.Centistokes(n1), T2: units.Celsius(t2), Nu2: units.Centistokes(n2),
			Viscosity: units.Centipoise(cp)})
		if err != nil {
			return
		}
		nu := o.Viscosity(units.Celsius(at))
		if math.IsNaN(float64(nu)) || nu < 0 {
			t.Fatalf("viscosity %v at %v °C", nu, at)
		}
		if rho := o.Density(units.Celsius(at)); math.IsNaN(float64(rho)) {
			t.Fatalf("density NaN")
		}
		if o.Spec().Viscosity != 0 {
			return // a constant dynamic viscosity: no Walther line to check
		}
		// The Walther line passes through the two points that define it,
		// and the viscosity falls as the temperature rises.
		for _, pt := range [][2]float64{{t1, n1}, {t2, n2}} {
			if got := o.Viscosity(units.Celsius(pt[0])).Centistokes(); math.Abs(got-pt[1]) > 1e-6*pt[1] {
				t.Fatalf("viscosity at %v °C = %v cSt, defined as %v", pt[0], got, pt[1])
			}
		}
		if a, b := o.Viscosity(units.Celsius(at)), o.Viscosity(units.Celsius(at+10)); b > a && a > 0 {
			t.Fatalf("viscosity rises from %v to %v between %v and %v °C", a, b, at, at+10)
		}
	})
}

func FuzzLoop(f *testing.F) {
	f.Add(2000.0, 1200.0, -800.0, 250.0, -300.0, 0.2, false, 0, 0)
	f.Add(0.0, 0.0, 0.0, 0.0, 0.0, 0.0, true, 0, 2)
	f.Add(-2000.0, 3000.0, 0.0, -440.0, 500.0, 1.0, true, 1, 1)
	f.Add(-50.0, 1500.0, 1500.0, 300.0, -200.0, 0.0, false, 0, 2)
	f.Add(0.0, 1500.0, 1500.0, 300.0, -200.0, 0.0, true, 2, 1)
	f.Add(1e300, -1e300, math.NaN(), math.Inf(1), 1e300, -1.0, false, 5, -1)
	f.Fuzz(func(t *testing.T, wp, wm1, wm2, bar, torque, minMotor float64, minLoss bool, pumpSwing, motorSwing int) {
		var sched Schedule = Sequential{MinMotorSetting: minMotor}
		if minLoss {
			sched = MinLoss{MinMotorSetting: minMotor}
		}
		pump, _ := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3200), PeakPressure: units.Bar(480), Loss: demoWilson, Swing: Swing(pumpSwing)})
		motor, _ := NewUnit(UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000), PeakPressure: units.Bar(480), Loss: demoWilson, Swing: Swing(motorSwing)})
		l, err := NewLoop(LoopSpec{Pump: pump, Motors: []Unit{motor, motor}, Oil: VG46, Temperature: units.Celsius(60),
			Charge: units.Bar(25), Relief: units.Bar(450), Schedule: sched})
		if err != nil {
			return
		}
		speeds := []units.AngularVelocity{units.RPM(wm1), units.RPM(wm2)}
		var st LoopState
		err = l.At(units.RPM(wp), speeds, units.Bar(bar), &st)
		if err == nil || isLimit(err) {
			finitePoint(t, st.Pump)
			for _, m := range st.Motors {
				finitePoint(t, m)
			}
			if !finite(st.Efficiency) || !finite(float64(st.Loss)) {
				t.Fatalf("non-finite loop summary %+v", st)
			}
		}
		if err == nil {
			// Flow continuity and the loop's power balance.
			checkLoopState(t, &st)
			checkPoint(t, st.Pump)
			for _, m := range st.Motors {
				checkPoint(t, m)
			}
		}
		in := LoopInput{PumpSpeed: units.RPM(wp), MotorSpeeds: speeds, MotorTorques: []units.Torque{units.Torque(torque), units.Torque(torque / 2)}}
		if st, err := l.Solve(in); err == nil || isLimit(err) {
			finitePoint(t, st.Pump)
			for _, m := range st.Motors {
				finitePoint(t, m)
			}
			if err == nil {
				checkLoopState(t, &st)
			}
		}
	})
}

func FuzzFitWilson(f *testing.F) {
	f.Add(1500.0, 200.0, 1.0, 100.0, 90.0, 50.0, true, uint8(0))
	f.Add(0.0, 0.0, 0.0, 0.0, 0.0, 0.0, false, uint8(15))
	f.Add(1e300, 1e-300, 0.5, 1e300, 1e-300, 1e4, true, uint8(3))
	f.Fuzz(func(t *testing.T, rpm, bar, x, lpm, nm, degC float64, pump bool, opts uint8) {
		mode := Motoring
		if pump {
			mode = Pumping
		}
		var ms []Measurement
		for i := range 6 {
			k := 1 + 0.2*float64(i)
			ms = append(ms, Measurement{Speed: units.RPM(rpm * k), Pressure: units.Bar(bar * (2 - 0.1*float64(i))), Setting: x,
				Flow: units.LitresPerMinute(lpm * k), Torque: units.NewtonMetres(nm * (1 + 0.05*float64(i))),
				Temperature: units.Celsius(degC + float64(i)), Mode: mode})
		}
		spec := FitSpec{MaxDisplacement: units.CCPerRev(75), Oil: VG46, Compressibility: opts&1 != 0,
			Hydrodynamic: opts&2 != 0, ConstantTorque: opts&4 != 0, SettingShares: opts&8 != 0}
		fit, err := FitWilson(spec, ms)
		if err != nil {
			return
		}
		if err := fit.Model.Validate(); err != nil {
			t.Fatalf("fitted model invalid: %v", err)
		}
		if !finite(float64(fit.RMSLeakage)) || !finite(float64(fit.RMSTorque)) || !finite(fit.MaxOverallError) {
			t.Fatalf("non-finite fit summary %v %v %v", fit.RMSLeakage, fit.RMSTorque, fit.MaxOverallError)
		}
	})
}
