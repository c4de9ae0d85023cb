package hydrostat

import (
	"errors"
	"fmt"
	"math"
	"reflect"
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
		m := drawWilsonBase(t)
		m.ConstantTorque = units.NewtonMetres(rapid.SampledFrom([]float64{0, 0, 2.5}).Draw(t, "constant N·m"))
		m.Compressibility = rapid.Bool().Draw(t, "compressibility")
		m.DeadVolume = rapid.Float64Range(0, 1).Draw(t, "dead volume")
		m.LeakageSetting = rapid.Float64Range(0, 1).Draw(t, "leakage share")
		m.TorqueSetting = rapid.SampledFrom([]float64{0, 0, 0.5, 1}).Draw(t, "torque share")
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
		matchUnits(t, set, tq, &st, 1e-13, 1e-12)
		// Fill is At at the same pressure, a setting limit included. The
		// loss to the rounding of the loss itself or of the input, whichever
		// is larger (at a setting limit, on a pump near standstill, the loss
		// can be thousands of times the input).
		var fs LoopState
		ef := c.Fill(dp, set, &fs)
		if (ef == nil) != (errAt == nil) || math.Abs(float64(fs.Loss-st.Loss)) > 1e-12*(math.Abs(float64(st.Input))+float64(st.Loss)+1) {
			t.Fatalf("Fill: %v, loss %.17g; At: %v, loss %.17g (input %.17g)", ef, float64(fs.Loss), errAt, float64(st.Loss), float64(st.Input))
		}
		matchLimit(t, &fs, &st)
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
		matchSlopes(t, qs, sl, &lo, &hi, h, l.spec.Pump.dmax)

	})
}

// drawWilsonBase draws the Wilson coefficients every Curve property draws
// alike (slip, viscous, friction, churning, constant pressure), in that
// order; each property draws the rest after them.
func drawWilsonBase(t *rapid.T) Wilson {
	return Wilson{
		Slip: rapid.Float64Range(0, 3e-9).Draw(t, "slip"), Viscous: rapid.Float64Range(0, 2e5).Draw(t, "viscous"),
		Friction: rapid.Float64Range(0, 0.03).Draw(t, "friction"), Hydrodynamic: rapid.Float64Range(0, 5).Draw(t, "churning"),
		ConstantPressure: units.Bar(rapid.Float64Range(0, 3).Draw(t, "constant bar")),
	}
}

// unitPoint returns unit k of st: the pump (0) or a motor.
func unitPoint(st *LoopState, k int) *Point {
	if k == 0 {
		return &st.Pump
	}
	return &st.Motors[k-1]
}

// matchUnits fails t unless the settings and torques a Curve gave equal
// At's in st: the settings to setTol, the torques to tqTol of the largest
// unit torque (plus 1 N·m).
func matchUnits(t *rapid.T, set []float64, tq []units.Torque, st *LoopState, setTol, tqTol float64) {
	tscale := 0.0
	for k := range tq {
		tscale = math.Max(tscale, math.Abs(float64(unitPoint(st, k).Torque)))
	}
	for k := range set {
		p := unitPoint(st, k)
		if math.Abs(set[k]-st.Settings[k]) > setTol {
			t.Fatalf("unit %d: setting %.17g, At %.17g", k, set[k], st.Settings[k])
		}
		if d := math.Abs(float64(tq[k] - p.Torque)); d > tqTol*(tscale+1) {
			t.Fatalf("unit %d: torque %.17g, At %.17g", k, float64(tq[k]), float64(p.Torque))
		}
	}
}

// matchLimit fails t unless Fill's limit in fs is At's in st.
func matchLimit(t *rapid.T, fs, st *LoopState) {
	if fs.Limit.Err != st.Limit.Err || fs.Limit.Quantity != st.Limit.Quantity ||
		math.Abs(fs.Limit.Value.SI-st.Limit.Value.SI) > 1e-7*(1+math.Abs(st.Limit.Value.SI)) {
		t.Fatalf("Fill's limit %+v, At's %+v", fs.Limit, st.Limit)
	}
}

// matchSlopes fails t unless the leakage slope qs and the unit torques'
// slopes sl equal central differences of At's states lo and hi, h either
// side of the pressure (dmax the pump's displacement, the scale of a
// slope near zero).
func matchSlopes(t *rapid.T, qs float64, sl []units.Displacement, lo, hi *LoopState, h, dmax float64) {
	if fd := float64(hi.ChargeFlow-lo.ChargeFlow) / (2 * h); math.Abs(qs-fd) > 1e-5*(math.Abs(fd)+1e-12) {
		t.Fatalf("leakage slope %.10g, central difference %.10g", qs, fd)
	}
	for k := range sl {
		fd := float64(unitPoint(hi, k).Torque-unitPoint(lo, k).Torque) / (2 * h)
		if math.Abs(float64(sl[k])-fd) > 1e-5*(math.Abs(fd)+dmax) {
			t.Fatalf("unit %d: slope %.10g, central difference %.10g", k, float64(sl[k]), fd)
		}
	}
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

// fillGeneral is Curve.Fill by the unit-by-unit arithmetic alone (Curve.fill
// or Loop.fill, then Loop.crossed), without the one-pass fillFast: the
// reference TestCurveFillFast holds Fill to.
func fillGeneral(c *Curve, dp units.Pressure, settings []float64, st *LoopState) error {
	st.size(len(c.l.spec.Motors))
	st.Limit = LimitError{}
	copy(st.Settings, settings)
	if c.limit.hit {
		st.Limit = c.limit.value()
	}
	return c.fillUnits(dp, st)
}

// sameBits reports where two values of the same type differ in any bit of
// a float (so −0 and 0 differ), naming the field; "" when they agree.
func sameBits(path string, a, b reflect.Value) string {
	switch a.Kind() {
	case reflect.Float64:
		if math.Float64bits(a.Float()) != math.Float64bits(b.Float()) {
			return fmt.Sprintf("%s: %v, want %v", path, a.Float(), b.Float())
		}
	case reflect.Struct:
		for i := range a.NumField() {
			if d := sameBits(path+"."+a.Type().Field(i).Name, a.Field(i), b.Field(i)); d != "" {
				return d
			}
		}
	case reflect.Slice:
		if a.Len() != b.Len() {
			return fmt.Sprintf("%s: length %d, want %d", path, a.Len(), b.Len())
		}
		for i := range a.Len() {
			if d := sameBits(fmt.Sprintf("%s[%d]", path, i), a.Index(i), b.Index(i)); d != "" {
				return d
			}
		}
	case reflect.Interface:
		if a.Interface() != b.Interface() {
			return fmt.Sprintf("%s: %v, want %v", path, a.Interface(), b.Interface())
		}
	default:
		if !a.Equal(b) {
			return fmt.Sprintf("%s: %v, want %v", path, a, b)
		}
	}
	return ""
}

// TestCurveFillFast: over random loops of lossless units and Wilson units
// (their torque at full displacement, or following the setting: Fill then
// takes the losses the last Torques kept), with random ratings and swings,
// Fill writes the state of the unit-by-unit arithmetic bit for bit and reports the same error and limit
// (relief, unit speed, setting): at the settings Torques gives and at
// settings drawn anywhere (beyond full displacement, below a unit's swing,
// not finite), at pressures up to beyond the relief. (A peak pressure is
// never crossed first: NewLoop refuses a relief above one.)
func TestCurveFillFast(t *testing.T) {
	t.Parallel()
	compared, errs := 0, 0
	limits := map[string]int{}
	defer func() {
		t.Logf("%d states compared, %d errors; limits %v", compared, errs, limits)
		// (Every kind of limit is checked by name in TestCurveFillLimits.)
		if compared == 0 || !testing.Short() && (errs == 0 || len(limits) == 0) {
			t.Error("too few states, errors or limits compared")
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		m := drawWilsonBase(t)
		m.ConstantTorque = units.NewtonMetres(rapid.SampledFrom([]float64{0, 2.5}).Draw(t, "constant N·m"))
		m.Compressibility = rapid.Bool().Draw(t, "compressibility")
		m.DeadVolume = rapid.Float64Range(0, 1).Draw(t, "dead volume")
		m.LeakageSetting = rapid.Float64Range(0, 1).Draw(t, "leakage share")
		m.TorqueSetting = rapid.SampledFrom([]float64{0, 0, 0.5, 1}).Draw(t, "torque share")
		swingToZero := rapid.Bool().Draw(t, "motors swing to zero")
		nm := rapid.IntRange(1, 3).Draw(t, "motors")
		wp := units.RPM(rapid.Float64Range(-4000, 4000).Draw(t, "pump rpm"))
		wms := make([]units.AngularVelocity, nm)
		for i := range wms {
			wms[i] = units.RPM(rapid.Float64Range(-4500, 4500).Draw(t, "motor rpm"))
		}
		// A rated speed around the unit's, so some are crossed.
		unit := func(label string, motor bool, w units.AngularVelocity) Unit {
			s := UnitSpec{MaxDisplacement: units.CCPerRev(rapid.Float64Range(40, 160).Draw(t, label+" cc"))}
			if rapid.Bool().Draw(t, label+" lossy") {
				s.Loss = m
			}
			if rapid.Bool().Draw(t, label+" speed rated") {
				s.MaxSpeed = units.RPM(100) + units.AngularVelocity(math.Abs(float64(w))*rapid.Float64Range(0.5, 2).Draw(t, label+" max speed share"))
			}
			if rapid.Bool().Draw(t, label+" pressure rated") {
				s.RatedPressure = units.Bar(rapid.Float64Range(150, 420).Draw(t, label+" rated bar"))
				s.PeakPressure = s.RatedPressure + units.Bar(rapid.Float64Range(0, 100).Draw(t, label+" peak over rated bar"))
			}
			if motor && swingToZero {
				s.Swing = SwingToZero
			}
			u, err := NewUnit(s)
			if err != nil {
				t.Fatal(err)
			}
			return u
		}
		motors := make([]Unit, nm)
		for i := range motors {
			motors[i] = unit("motor", true, wms[i])
		}
		ls := LoopSpec{Pump: unit("pump", false, wp), Motors: motors, Oil: VG46,
			Temperature: units.Celsius(rapid.Float64Range(30, 90).Draw(t, "oil °C")), Charge: units.Bar(20),
			Relief: units.Bar(rapid.Float64Range(100, 150).Draw(t, "relief bar"))}
		if swingToZero {
			ls.Schedule = Sequential{MinMotorSetting: rapid.Float64Range(0.05, 0.5).Draw(t, "motor floor")}
		}
		l, err := NewLoop(ls)
		if err != nil {
			t.Fatal(err)
		}
		var c Curve
		if !l.Curve(wp, wms, &c) {
			t.Fatal("a Sequential loop of lossless and Wilson units is no Curve")
		}
		// Up to beyond the relief.
		dp := units.Pressure(rapid.Float64Range(-1.5, 1.5).Draw(t, "Δp share of the relief")) * ls.Relief
		set := make([]float64, nm+1)
		tq := make([]units.Torque, nm+1)
		sl := make([]units.Displacement, nm+1)
		if !c.Torques(dp, set, tq, sl) || rapid.Bool().Draw(t, "settings drawn") {
			c.limit.hit = false
			for i := range set {
				set[i] = rapid.SampledFrom([]float64{0, 1, -1, 0.5, -0.5, 0.2, -0.2}).Draw(t, "setting")
			}
			if rapid.IntRange(0, 3).Draw(t, "a setting out of range") == 0 {
				set[rapid.IntRange(0, nm).Draw(t, "which")] = rapid.SampledFrom([]float64{1.5, -1.5, math.NaN(), math.Inf(1)}).Draw(t, "bad setting")
			}
		}
		if rapid.IntRange(0, 20).Draw(t, "pressure not finite") == 0 {
			dp = units.Pressure(math.NaN())
		} else if rapid.IntRange(0, 4).Draw(t, "Fill at another pressure than Torques") == 0 {
			dp *= 1.25
		}
		var got, want, uncached LoopState
		eg := c.Fill(dp, set, &got)
		ew := fillGeneral(&c, dp, set, &want)
		if (eg == nil) != (ew == nil) || (eg != nil && eg.Error() != ew.Error()) {
			t.Fatalf("Fill: %v, the unit-by-unit arithmetic: %v", eg, ew)
		}
		// Without the losses Torques kept: the loss model's own numbers.
		c.cached = false
		if eu := c.Fill(dp, set, &uncached); (eu == nil) != (ew == nil) || (eu != nil && eu.Error() != ew.Error()) {
			t.Fatalf("Fill without the losses Torques kept: %v, the unit-by-unit arithmetic: %v", eu, ew)
		} else if eu == nil || isBareLimit(eu) {
			if d := sameBits("LoopState", reflect.ValueOf(uncached), reflect.ValueOf(want)); d != "" {
				t.Fatalf("Fill without the losses Torques kept: %s", d)
			}
		}
		if ew != nil && !isBareLimit(ew) {
			// ErrModel, ErrInvalid or a setting beyond full displacement
			// (a *LimitError): the state is unspecified.
			errs++
			return
		}
		if d := sameBits("LoopState", reflect.ValueOf(got), reflect.ValueOf(want)); d != "" {
			t.Fatalf("Fill's %s", d)
		}
		compared++
		if want.Limit.Err != nil {
			limits[want.Limit.Err.Error()]++
		}
	})
}

// TestCurveFillLimits: Fill reports each limit a loop of fixed-torque units
// can cross, as the unit-by-unit arithmetic and Loop.At do, with the state
// the same bit for bit. Hand-made cases: a classic loop (pump 100 cm³/rev
// rated 3000 rpm, two motors 80 cm³/rev rated 3500 rpm swinging to zero
// above a floor of 0.2, relief 420 bar).
func TestCurveFillLimits(t *testing.T) {
	t.Parallel()
	m := Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	pump := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(100), MaxSpeed: units.RPM(3000), RatedPressure: units.Bar(380),
		PeakPressure: units.Bar(450), Loss: m})
	motor := mustUnit(t, UnitSpec{MaxDisplacement: units.CCPerRev(80), MaxSpeed: units.RPM(3500), RatedPressure: units.Bar(380),
		PeakPressure: units.Bar(450), Loss: m, Swing: SwingToZero})
	l, err := NewLoop(LoopSpec{Pump: pump, Motors: []Unit{motor, motor}, Oil: VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(20), Relief: units.Bar(420), Schedule: Sequential{MinMotorSetting: 0.2}})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name     string
		wp, w1   float64 // rpm
		bar      float64
		settings []float64 // nil: Torques'
		want     error     // Fill's error
		quantity string    // of st.Limit
	}{
		{"none", 2000, 1500, 250, nil, nil, ""},
		{"relief", 2000, 1500, 410, nil, ErrPressureLimit, "high-line pressure"},
		{"relief, Δp negative", 2000, 1500, -410, nil, ErrPressureLimit, "high-line pressure"},
		{"pump speed", 3100, 1500, 250, nil, ErrSpeedLimit, "pump speed"},
		{"second motor speed", 2000, 1500, 250, []float64{0.5, 1, 1}, ErrSpeedLimit, "motor 2 speed"},
		{"setting limit", 500, 2000, 250, nil, ErrSettingLimit, "motor setting"},
		{"below the swing", 2000, 1500, 250, []float64{0.5, 1, -0.3}, ErrSettingLimit, "motor setting"},
		{"beyond full displacement", 2000, 1500, 250, []float64{1.2, 1, 1}, ErrSettingLimit, ""},
		{"setting not finite", 2000, 1500, 250, []float64{0.5, math.NaN(), 1}, ErrModel, ""},
	} {
		w2 := tc.w1
		if tc.name == "second motor speed" {
			w2 = 3600
		}
		wms := []units.AngularVelocity{units.RPM(tc.w1), units.RPM(w2)}
		var c Curve
		if !l.Curve(units.RPM(tc.wp), wms, &c) || !c.fixed {
			t.Fatalf("%s: no Curve of fixed torques", tc.name)
		}
		dp := units.Bar(tc.bar)
		set := make([]float64, 3)
		if tc.settings != nil {
			copy(set, tc.settings)
		} else if !c.Torques(dp, set, make([]units.Torque, 3), make([]units.Displacement, 3)) {
			t.Fatalf("%s: Torques gave up", tc.name)
		}
		var got, want LoopState
		eg := c.Fill(dp, set, &got)
		ew := fillGeneral(&c, dp, set, &want)
		if !errors.Is(eg, tc.want) || (eg == nil) != (ew == nil) || (eg != nil && eg.Error() != ew.Error()) {
			t.Fatalf("%s: Fill = %v, want %v (the unit-by-unit arithmetic: %v)", tc.name, eg, tc.want, ew)
		}
		if eg != nil && !isBareLimit(eg) {
			continue // the state is unspecified
		}
		if got.Limit.Quantity != tc.quantity {
			t.Errorf("%s: Fill's limit %q, want %q", tc.name, got.Limit.Quantity, tc.quantity)
		}
		if d := sameBits("LoopState", reflect.ValueOf(got), reflect.ValueOf(want)); d != "" {
			t.Errorf("%s: Fill's %s", tc.name, d)
		}
		if tc.settings == nil {
			// With the schedule's settings, Fill is At.
			var at LoopState
			ea := l.At(units.RPM(tc.wp), wms, dp, &at)
			if le, ok := errors.AsType[*LimitError](ea); (ea == nil) != (eg == nil) || ok && (le.Err != eg || le.Quantity != got.Limit.Quantity) {
				t.Errorf("%s: Fill %v (%s), At %v", tc.name, eg, got.Limit.Quantity, ea)
			}
		}
	}
}

// TestCurveQuick: over random loops of lossless and Wilson units (every
// coefficient drawn), speeds and pressures, Torques and Leakage give the
// same numbers bit for bit whether they take the short way for a pump that
// swings (pumpSwings, the torques written in place) or sequential and
// settingSlopes.
func TestCurveQuick(t *testing.T) {
	t.Parallel()
	quick := 0
	defer func() {
		t.Logf("%d points took the short way", quick)
		if quick == 0 && !testing.Short() {
			t.Error("no point took the short way")
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		m := drawWilsonBase(t)
		m.ConstantTorque = units.NewtonMetres(rapid.SampledFrom([]float64{0, 2.5}).Draw(t, "constant N·m"))
		m.Compressibility = rapid.Bool().Draw(t, "compressibility")
		m.DeadVolume = rapid.Float64Range(0, 1).Draw(t, "dead volume")
		m.LeakageSetting = rapid.SampledFrom([]float64{0, 0, 0, 0.5}).Draw(t, "leakage share")
		m.TorqueSetting = rapid.SampledFrom([]float64{0, 0, 0, 0.5}).Draw(t, "torque share")
		unit := func(label string) Unit {
			s := UnitSpec{MaxDisplacement: units.CCPerRev(rapid.Float64Range(40, 160).Draw(t, label+" cc"))}
			if rapid.Bool().Draw(t, label+" lossy") {
				s.Loss = m
			}
			u, err := NewUnit(s)
			if err != nil {
				t.Fatal(err)
			}
			return u
		}
		nm := rapid.IntRange(1, 3).Draw(t, "motors")
		motors := make([]Unit, nm)
		for i := range motors {
			motors[i] = unit("motor")
		}
		l, err := NewLoop(LoopSpec{Pump: unit("pump"), Motors: motors, Oil: VG46,
			Temperature: units.Celsius(rapid.Float64Range(30, 90).Draw(t, "oil °C")), Charge: units.Bar(20), Relief: units.Bar(450)})
		if err != nil {
			t.Fatal(err)
		}
		wp := units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "pump rpm"))
		wms := make([]units.AngularVelocity, nm)
		for i := range wms {
			wms[i] = units.RPM(rapid.Float64Range(-1500, 1500).Draw(t, "motor rpm"))
		}
		var c Curve
		if !l.Curve(wp, wms, &c) {
			t.Fatal("no Curve")
		}
		slow := c
		slow.quick, slow.swing = false, false
		dp := units.Bar(rapid.Float64Range(-450, 450).Draw(t, "Δp bar"))
		if rapid.IntRange(0, 20).Draw(t, "pressure not finite") == 0 {
			dp = units.Pressure(rapid.SampledFrom([]float64{math.NaN(), math.Inf(1), math.Inf(-1)}).Draw(t, "pressure"))
		}
		n := nm + 1
		set, tq, sl := make([]float64, n), make([]units.Torque, n), make([]units.Displacement, n)
		set2, tq2, sl2 := make([]float64, n), make([]units.Torque, n), make([]units.Displacement, n)
		ok := c.Torques(dp, set, tq, sl)
		ok2 := slow.Torques(dp, set2, tq2, sl2)
		if ok != ok2 || c.limit != slow.limit {
			t.Fatalf("Torques %v (limit %+v), by sequential %v (%+v)", ok, c.limit, ok2, slow.limit)
		}
		if ok {
			for _, d := range []string{
				sameBits("settings", reflect.ValueOf(set), reflect.ValueOf(set2)),
				sameBits("torques", reflect.ValueOf(tq), reflect.ValueOf(tq2)),
				sameBits("slopes", reflect.ValueOf(sl), reflect.ValueOf(sl2)),
			} {
				if d != "" {
					t.Fatalf("Torques' %s", d)
				}
			}
			if c.quick && c.limit == (setLimit{}) && set[1] == 1 && math.Abs(set[0]) <= 1 {
				quick++
			}
		}
		q, qs, okq := c.Leakage(dp)
		q2, qs2, okq2 := slow.Leakage(dp)
		if okq != okq2 || math.Float64bits(float64(q)) != math.Float64bits(float64(q2)) || math.Float64bits(qs) != math.Float64bits(qs2) {
			t.Fatalf("Leakage %v, %v, %v; by sequential %v, %v, %v", q, qs, okq, q2, qs2, okq2)
		}
	})
}
