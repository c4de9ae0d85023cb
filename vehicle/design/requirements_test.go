package design

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// TestCheckReport checks the demo file's report: a missing standstill and
// speed gaps are reported, and the pull check's margin is the
// tractive-effort diagram's greatest pull at that speed.
func TestCheckReport(t *testing.T) {
	t.Parallel()
	f, err := Load("testdata/tractor.json")
	if err != nil {
		t.Fatal(err)
	}
	rep, err := f.Check(f.Transmission, f.Requirements)
	if err != nil {
		t.Fatal(err)
	}
	if rep.Standstill || rep.Feasible() {
		t.Errorf("input-coupled demo: standstill %v, feasible %v; want false, false (no range reaches 0 km/h)", rep.Standstill, rep.Feasible())
	}
	if got := rep.Failed(); len(got) == 0 || !strings.Contains(got[0], "standstill") {
		t.Errorf("Failed() = %q, want the standstill check first", got)
	}
	if len(rep.Gaps) != 0 {
		t.Errorf("input-coupled demo: gaps %v, want none (its ranges overlap)", rep.Gaps)
	}
	alt, err := f.Check(f.Alternatives[0], f.Requirements)
	if err != nil {
		t.Fatal(err)
	}
	if len(alt.Gaps) == 0 {
		t.Error("output-coupled demo: no gaps reported, want two (its ranges do not overlap)")
	}
	// The pull check against the diagram, computed here on its own.
	req := f.Requirements.Pulls[0]
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	g, err := f.Ground(f.firstSurface("field"))
	if err != nil {
		t.Fatal(err)
	}
	pts, err := TractiveEffort(v, EffortSpec{Speeds: []units.Speed{req.Speed}, Ground: g})
	if err != nil {
		t.Fatal(err)
	}
	best := 0.0
	for _, p := range pts {
		best = math.Max(best, float64(p.Pull))
	}
	var pull *Check
	for i := range rep.Checks {
		if strings.HasPrefix(rep.Checks[i].Name, "pull ") {
			pull = &rep.Checks[i]
		}
	}
	if pull == nil {
		t.Fatal("no pull check in the report")
	}
	if want := best/float64(req.Pull) - 1; math.Abs(pull.Margin-want) > 1e-12 {
		t.Errorf("pull margin %g, want %g from the diagram", pull.Margin, want)
	}
	var buf bytes.Buffer
	if err := rep.WriteText(&buf); err != nil || !strings.Contains(buf.String(), "FAILED") {
		t.Errorf("WriteText: %v, %q", err, buf.String())
	}
}

// reversingSplit is an output-coupled split whose field and road ranges
// reach a little reverse speed at rated engine speed (invented data).
const reversingSplit = `{"name": "three-range output-coupled split, synchronous shifts", "kind": "output-coupled", "set": {"fixedCarrierRatio": -2.5, "basicEfficiency": 0.98}, "pumpRatio": 0.38, "motorRatio": 0.84, "pump": {"displacement": "110 cm³/rev", "maxSpeed": "3000 rpm", "ratedPressure": "420 bar", "peakPressure": "480 bar"}, "motor": {"displacement": "110 cm³/rev", "maxSpeed": "3200 rpm", "ratedPressure": "420 bar", "peakPressure": "480 bar"}, "losses": {"slip": 1e-09, "viscous": 200000.0, "friction": 0.01, "constantPressure": "1 bar"}, "oil": "VG46", "oilTemperature": "60 °C", "charge": "20 bar", "relief": "450 bar", "ranges": [{"name": "field", "ratio": 0.328}, {"name": "work", "ratio": 0.104, "fromVariator": true}, {"name": "road", "ratio": 1.0}], "gearEfficiency": 0.985, "noLoad": {"note": "Invented but typical values for a transmission of this size, not taken from any machine: bearing sizes and Palmgren factors of oil-bath roller bearings, dip factors of splash-lubricated wheels, plate packs of wet range clutches, a gear charge pump with a flushing flow; the PTO clutch plates and bearings of \"pto.idle\" likewise.", "oil": "VG46", "temperature": "70 °C", "bearings": [{"name": "input shaft bearings", "shaft": "engine", "meanDiameter": "85 mm", "f0": 2, "f1": 0.0003, "load": "4 kN", "count": 2}, {"name": "sun shaft bearings", "shaft": "planetary sun", "meanDiameter": "70 mm", "f0": 2, "f1": 0.0003, "load": "3 kN", "count": 2}, {"name": "pump drive bearings", "shaft": "pump", "meanDiameter": "60 mm", "f0": 2, "f1": 0.0003, "load": "3 kN", "count": 2}, {"name": "motor drive bearings", "shaft": "motor", "meanDiameter": "60 mm", "f0": 2, "f1": 0.0003, "load": "3 kN", "count": 2}, {"name": "summing shaft bearings", "shaft": "sum", "meanDiameter": "110 mm", "f0": 3, "f1": 0.0004, "load": "10 kN", "count": 2}, {"name": "output shaft bearings", "shaft": "output", "meanDiameter": "130 mm", "f0": 3, "f1": 0.0004, "load": "20 kN", "count": 2}, {"name": "field gear bearings", "shaft": "field gear shaft", "meanDiameter": "90 mm", "f0": 2, "f1": 0.0003, "load": "5 kN", "count": 2}, {"name": "work gear bearings", "shaft": "work gear shaft", "meanDiameter": "90 mm", "f0": 2, "f1": 0.0003, "load": "5 kN", "count": 2}, {"name": "road gear bearings", "shaft": "road gear shaft", "meanDiameter": "90 mm", "f0": 2, "f1": 0.0003, "load": "5 kN", "count": 2}], "churning": [{"name": "summing shaft wheel", "shaft": "sum", "diameter": "260 mm", "faceWidth": "40 mm", "module": "4 mm", "helixAngle": "20°", "dip": 0.05}, {"name": "planet carrier", "shaft": "engine", "diameter": "240 mm", "sides": true, "dip": 0.05}, {"name": "output wheel", "shaft": "output", "diameter": "330 mm", "faceWidth": "45 mm", "module": "5 mm", "helixAngle": "20°", "dip": 0.15}], "plates": [{"name": "field clutch plates", "clutch": "field clutch", "films": 8, "inner": "75 mm", "outer": "100 mm", "clearance": "0.3 mm"}, {"name": "work clutch plates", "clutch": "work clutch", "films": 8, "inner": "75 mm", "outer": "100 mm", "clearance": "0.3 mm"}, {"name": "road clutch plates", "clutch": "road clutch", "films": 8, "inner": "75 mm", "outer": "100 mm", "clearance": "0.3 mm"}], "chargePump": {"shaft": "engine", "flushing": "10 L/min", "efficiency": 0.8}}}`

// TestReverseSpeed: a reverse speed requirement is met up to the reverse
// speed the ranges reach, and missed beyond it.
func TestReverseSpeed(t *testing.T) {
	t.Parallel()
	f, err := Load("testdata/tractor.json")
	if err != nil {
		t.Fatal(err)
	}
	var tr Transmission
	if err := json.Unmarshal([]byte(reversingSplit), &tr); err != nil {
		t.Fatal(err)
	}
	rep, err := f.Check(tr, nil)
	if err != nil {
		t.Fatal(err)
	}
	reach := 0.0
	for _, iv := range rep.Intervals {
		if iv.Feasible {
			reach = math.Max(reach, -iv.Lo.KMH())
		}
	}
	if reach <= 0.5 {
		t.Fatalf("the test split reaches %.3g km/h in reverse; it should reach some", reach)
	}
	for _, c := range []struct {
		want units.Speed
		met  bool
	}{{units.KMH(reach * 0.9), true}, {units.KMH(reach * 1.1), false}} {
		rep, err := f.Check(tr, &Requirements{ReverseSpeed: c.want})
		if err != nil {
			t.Fatal(err)
		}
		got := rep.Checks[0]
		// Hand check: margin = reached / wanted − 1.
		if got.Met != c.met || math.Abs(got.Margin-(reach/c.want.KMH()-1)) > 1e-9 {
			t.Errorf("reverse %.3g km/h (reach %.3g): met %v margin %.4g; want %v, %.4g", c.want.KMH(), reach, got.Met, got.Margin, c.met, reach/c.want.KMH()-1)
		}
	}
}

// TestUnitSpeedsTypedAsMargins (property): what the checks read from a
// Brief State's loops (unitLimits.speeds: each unit's speed against the
// rated speed of the loop's spec, the variator's ratio) and what Score
// reads (the high-line pressure) is what the solver's margins of the same
// point say, found here by their names: "pump speed" and "motor 1 speed"
// against their "maximum speed", and the greatest pressure. A margin
// renamed, or a limit read from somewhere else, fails here instead of
// silently changing a check.
func TestUnitSpeedsTypedAsMargins(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	s := demoSpace()
	draws, compared := 0, 0
	defer func() {
		if 2*compared < draws {
			t.Errorf("compared %d points in %d draws, want at least half", compared, draws)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		draws++
		tr := f.Transmission
		switch k := rapid.IntRange(0, 3).Draw(t, "design"); k {
		case 0:
			g, err := f.Apply(s, Candidate(s, 1, rapid.IntRange(0, 5000).Draw(t, "candidate")))
			if err != nil {
				t.Fatal(err)
			}
			tr = g.Transmission
		case 2, 3:
			tr = f.Alternatives[k-2]
		}
		l, loop, err := tr.built()
		if err != nil {
			t.Skip("does not build:", err)
		}
		lim := limitsOf(loop)
		sv := powersplit.NewSolver(l)
		rg := rapid.IntRange(0, l.Ranges()-1).Draw(t, "range")
		w := units.RPM(rapid.Float64Range(900, 2300).Draw(t, "engine rpm"))
		ivs, err := sv.Interval(powersplit.Point{Range: rg, Input: w, Outputs: []powersplit.OutputDemand{{}}})
		if err != nil {
			t.Skip("range reaches no speed:", err)
		}
		iv := ivs[rapid.IntRange(0, len(ivs)-1).Draw(t, "interval")]
		at := rapid.Float64Range(0, 1).Draw(t, "place in the interval")
		p := powersplit.Point{Range: rg, Input: w, Outputs: []powersplit.OutputDemand{{
			Speed:  iv.Lo + units.AngularVelocity(at)*(iv.Hi-iv.Lo),
			Torque: units.Torque(rapid.Float64Range(0, 3000).Draw(t, "output torque N·m")),
		}}}
		var full powersplit.State
		brief := powersplit.State{Brief: true}
		errFull, errBrief := sv.Solve(p, &full), sv.Solve(p, &brief)
		if (errFull == nil) != (errBrief == nil) {
			t.Fatalf("full state: %v; brief state: %v", errFull, errBrief)
		}
		if errFull != nil {
			t.Skip("point not feasible:", errFull)
		}
		worst, unit, ratio := lim.speeds(&brief)
		if w2, u2, r2 := lim.speeds(&full); w2 != worst || u2 != unit || r2 != ratio {
			t.Fatalf("speeds: brief state %g, unit %d, ratio %g; full state %g, %d, %g", worst, unit, ratio, w2, u2, r2)
		}
		// The margins, by name.
		byName := map[string]powersplit.Margin{}
		mWorst, mPeak := 0.0, 0.0
		for _, m := range full.Margins {
			switch m.Value.Kind {
			case units.AngularVelocityKind:
				if m.Bound == "maximum speed" {
					byName[m.Quantity] = m
				}
				if !m.Unchecked && m.Limit.SI > 0 {
					mWorst = math.Max(mWorst, m.Value.SI/m.Limit.SI)
				}
			case units.PressureKind:
				mPeak = math.Max(mPeak, m.Value.SI)
			}
		}
		lp := brief.Loops[0]
		for k, c := range []struct {
			name string
			w    units.AngularVelocity
		}{{"pump speed", lp.Pump.Speed}, {"motor 1 speed", lp.Motors[0].Speed}} {
			m, ok := byName[c.name]
			if !ok {
				t.Fatalf("no margin %q against the maximum speed among %v", c.name, full.Margins)
			}
			if m.Value.SI != math.Abs(float64(c.w)) || m.Limit.SI != lim[k] || m.Unchecked != (lim[k] == 0) {
				t.Fatalf("%s: margin %v (limit %g, unchecked %v); the loop's state says %g against %g", c.name, m, m.Limit.SI, m.Unchecked, math.Abs(float64(c.w)), lim[k])
			}
		}
		if len(byName) != len(lim) {
			t.Fatalf("%d unit-speed margins, %d units in the loop's spec", len(byName), len(lim))
		}
		if mWorst != worst {
			t.Fatalf("worst unit speed %.17g of its limit from the loop's state, %.17g from the margins", worst, mWorst)
		}
		if pump := byName["pump speed"].Value.SI; pump > 0 {
			if want := byName["motor 1 speed"].Value.SI / pump; ratio != want {
				t.Fatalf("variator ratio %.17g from the loop's state, %.17g from the margins", ratio, want)
			}
		}
		if float64(lp.High) != mPeak {
			t.Fatalf("high-line pressure %v from the loop's state, greatest pressure margin %g Pa", lp.High, mPeak)
		}
		compared++
	})
}

// TestUnitSpeedCheckAllRanges (property): the unit-speed check, which
// stops solving the ranges at a speed once one is at or below the worst
// share so far, gives the check that solving every range at every speed
// gives (the plain sweep, written out here).
func TestUnitSpeedCheckAllRanges(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	s := demoSpace()
	draws, bound := 0, 0
	defer func() {
		if 2*bound < draws {
			t.Errorf("%d of %d draws had a binding point, want at least half", bound, draws)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		draws++
		g, err := f.Apply(s, Candidate(s, 4, rapid.IntRange(0, 5000).Draw(t, "candidate")))
		if err != nil {
			t.Fatal(err)
		}
		l, loop, err := g.Transmission.built()
		if err != nil {
			t.Skip("does not build:", err)
		}
		lim := limitsOf(loop)
		sv := powersplit.NewSolver(l)
		w := units.RPM(rapid.Float64Range(1500, 2300).Draw(t, "engine rpm"))
		ivs, _ := g.intervals(sv, l, g.Transmission.RangeNames(), w)
		req := *g.Requirements
		req.UnitSpeedMargin = 0.02
		st := powersplit.State{Brief: true}
		got := g.unitSpeedCheck(sv, l, lim, &st, ivs, w, &req)

		// The plain sweep: every range at every speed, the first range of
		// the least share at each speed, the first speed of the greatest.
		worst, at := 0.0, (*Binding)(nil)
		out := make([]powersplit.OutputDemand, 1)
		for k := range 61 {
			v := req.LowestSpeed + (req.TopSpeed-req.LowestSpeed)*units.Speed(k)/60
			best, bestRange := math.Inf(1), 0
			for rg := range l.Ranges() {
				if r, _, _, ok := g.unitState(sv, &st, out, lim, rg, w, v); ok && r < best {
					best, bestRange = r, rg
				}
			}
			if !math.IsInf(best, 1) && best > worst {
				worst, at = best, &Binding{Range: bestRange, Speed: v, Engine: w}
			}
		}
		if want := 1 - worst - req.UnitSpeedMargin; got.Margin != want {
			t.Fatalf("margin %.17g, the plain sweep's %.17g", got.Margin, want)
		}
		if (got.Binding == nil) != (at == nil) || at != nil && *got.Binding != *at {
			t.Fatalf("binding %+v, the plain sweep's %+v", got.Binding, at)
		}
		if at != nil {
			bound++
		}
	})
}

// TestFrontMotorChecks: the front motor turns with the front wheels up to
// its declutch speed whatever the range, so the unit-speed check holds its
// speed there against its own greatest speed, and the relief check its
// peak pressure against the relief. Hand calculation: the test motor
// (front final drive 60, ratio 1, declutched above 14 km/h) on the demo
// tractor's front tyres turns at 60·(14/3.6 m/s)/r_front rad/s at 14 km/h.
func TestFrontMotorChecks(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	l, loop, err := f.Transmission.built()
	if err != nil {
		t.Fatal(err)
	}
	sv := powersplit.NewSolver(l)
	w := units.RPM(2000)
	ivs, _ := f.intervals(sv, l, f.Transmission.RangeNames(), w)
	req := *f.Requirements
	req.UnitSpeedMargin = 0.02
	st := powersplit.State{Brief: true}
	plain := f.unitSpeedCheck(sv, l, limitsOf(loop), &st, ivs, w, &req)

	fm := frontMotor()
	r := float64(f.Tractor.Front.Tyre.RollingRadius)
	wm := 60 * float64(units.KMH(14)) / r // rad/s at the declutch speed
	if req.TopSpeed > 0 && req.TopSpeed < units.KMH(14) {
		t.Fatalf("the demo's top speed %v is below the test motor's declutch speed", req.TopSpeed)
	}
	// Rated 10 % below that speed: the check fails on the front motor.
	fm.Motor.MaxSpeed = units.AngularVelocity(wm / 1.1)
	f.Tractor.FrontMotor = fm
	got := f.unitSpeedCheck(sv, l, limitsOf(loop), &st, ivs, w, &req)
	if got.Met || math.Abs(got.Margin-(1-1.1-0.02)) > 1e-12 || !strings.Contains(got.At, "front motor at 14.00 km/h") || got.Binding != nil {
		t.Errorf("front motor rated below its speed: %+v", got)
	}
	// Rated far above: the check is the rear-only check.
	fm.Motor.MaxSpeed = units.AngularVelocity(10 * wm)
	got = f.unitSpeedCheck(sv, l, limitsOf(loop), &st, ivs, w, &req)
	if got.Margin != plain.Margin || got.At != plain.At || got.Met != plain.Met {
		t.Errorf("front motor rated far above its speed: %+v, without it %+v", got, plain)
	}

	// The relief against the front motor's peak pressure: a front motor
	// rated 2 % above the relief (its loop builds) misses a 5 % margin.
	fm.Motor.RatedPressure, fm.Motor.PeakPressure = f.Transmission.Relief, f.Transmission.Relief*1.02
	req = *f.Requirements
	req.PressureMargin = 0.05
	rep, err := f.Check(f.Transmission, &req)
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, c := range rep.Checks {
		if strings.HasPrefix(c.Name, "relief") {
			found = true
			if want := 1 - 1/1.02 - 0.05; c.Met || math.Abs(c.Margin-want) > 1e-12 {
				t.Errorf("relief check with a front motor rated 2 %% above the relief: %+v, margin want %v", c, want)
			}
		}
	}
	if !found {
		t.Error("no relief check in the report")
	}
}
