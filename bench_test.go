package powersplit

import (
	"cmp"
	"math"
	"slices"
	"testing"
	"time"

	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// The benchmark layout: a two-range output-coupled split (carrier on the
// engine, sun to the pump, ring to the summing shaft), i0 = −2.5, pump gear
// 1.2, motor gear 0.8, range gears 0.2 and 0.4, one PTO at 0.27, 100 cc/rev
// units. Invented demo data.
const (
	benchPumpRatio  = 1.2
	benchMotorRatio = 0.8
	benchPTORatio   = 0.27
)

var benchRanges = []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}

// benchLayout returns the benchmark layout, lossy (Wilson units, 98 % set,
// default gear efficiency) or lossless (ideal units, set and gears).
func benchLayout(tb testing.TB, lossy bool) Layout {
	tb.Helper()
	lp := makeLoop(tb, loopSpec{pumpCC: 100, motorCC: 100, lossy: lossy, wilson: demoWilson, maxRPM: 4500})
	eta0, geta := 0.98, 0.0
	if !lossy {
		eta0, geta = 1, 1
	}
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(tb, testI0, eta0), Loop: lp, PumpRatio: benchPumpRatio,
		MotorRatio: benchMotorRatio, Ranges: benchRanges, GearEfficiency: geta, PTOs: []PTOSpec{{Ratio: benchPTORatio}}})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

// floorPoint is the closed-form state of the lossless benchmark layout.
type floorPoint struct {
	sun, ring, pump, motor, out, pto float64 // shaft speeds, rad/s
	pumpT, motorT                    float64 // torques the shafts apply to the units, N·m
	inputT                           float64 // torque the engine delivers, N·m
	hydraulic, share                 float64 // pump's hydraulic power (W) and its share of the input
	dp, xp, xm                       float64 // loop pressure (Pa) and settings (Sequential, ideal units)
}

// floor evaluates the lossless output-coupled layout in closed form, the
// floor the general solver is measured against. With the carrier on the
// engine (ωc), the sun driving the pump and the ring on the summing shaft:
//
//	ωs = i0·ωr + (1 − i0)·ωc                      (Willis)
//	ωr = ωout/g, ωpump = kp·ωs, ωmotor = ωr/km
//	Tpump = g·Tout·ωr / (kp·(1 − i0)·ωc)          (lossless factors, Tr = −i0·Ts, Ts = −kp·Tpump)
//	Tmotor = −Tpump·ωpump/ωmotor,  Phyd = Tpump·ωpump
//	Tin = (Tout·ωout + Tpto·ωpto)/ωc
//
// and the ideal Sequential settings: the pump swings out first, then the
// motor swings back.
func floor(i0, dPump, dMotor, g, win, wout, tout, tpto float64, f *floorPoint) {
	const kp, km = benchPumpRatio, benchMotorRatio
	f.out = wout
	f.ring = wout / g
	f.sun = i0*f.ring + (1-i0)*win
	f.pump, f.motor, f.pto = kp*f.sun, f.ring/km, benchPTORatio*win
	f.pumpT = g * tout * f.ring / (kp * (1 - i0) * win)
	f.motorT = -f.pumpT * f.pump / f.motor
	f.hydraulic = f.pumpT * f.pump
	pin := tout*wout + tpto*f.pto
	f.inputT = pin / win
	f.share = f.hydraulic / pin
	qm := dMotor * f.motor // motor flow at full setting
	f.xp, f.xm = qm/(dPump*f.pump), 1
	if math.Abs(f.xp) > 1 {
		f.xp = math.Copysign(1, f.xp)
		f.xm = f.xp * dPump * f.pump / qm
	}
	f.dp = f.pumpT / (f.xp * dPump)
}

// benchPoints returns operating points of range 1 of the benchmark layout
// that both the lossless and the lossy layout solve without error, away
// from the mechanical point (where the Sequential schedule's minimum motor
// setting leaves a band unreachable).
func benchPoints(tb testing.TB) []Point {
	tb.Helper()
	sl, sy := NewSolver(benchLayout(tb, false)), NewSolver(benchLayout(tb, true))
	var st State
	var pts []Point
	for _, rpm := range []float64{150, 300, 450, 600, 750, 900, 1250, 1400} {
		for _, nm := range []float64{-400, 300, 800, 1500} {
			p := Point{Range: 1, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(rpm), Torque: units.NewtonMetres(nm)}},
				PTO: []units.Torque{units.NewtonMetres(150)}}
			if sl.Solve(p, &st) == nil && sy.Solve(p, &st) == nil {
				pts = append(pts, p)
			}
		}
	}
	if len(pts) < 16 {
		tb.Fatalf("only %d benchmark points solve", len(pts))
	}
	return pts
}

var sinkFloor float64

// floorPoints evaluates the floor on every point and returns the sum of the
// input torques (so that the work cannot be optimised away).
func floorPoints(pts []Point, d float64, out *floorPoint) float64 {
	var sum float64
	for i := range pts {
		p := &pts[i]
		floor(testI0, d, d, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
			float64(p.Outputs[0].Torque), float64(p.PTO[0]), out)
		sum += out.inputT
	}
	return sum
}

// TestFloorMatchesSolver keeps the floor honest: the closed form and the
// general solver on the lossless layout agree to 1e-9.
func TestFloorMatchesSolver(t *testing.T) {
	pts := benchPoints(t)
	s := NewSolver(benchLayout(t, false))
	d := float64(units.CCPerRev(100))
	var st State
	var f floorPoint
	for _, p := range pts {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		floor(testI0, d, d, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
			float64(p.Outputs[0].Torque), float64(p.PTO[0]), &f)
		lr := &st.Loops[0]
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"pump speed", float64(lr.Pump.Speed), f.pump},
			{"motor speed", float64(lr.Motors[0].Speed), f.motor},
			{"pump torque", float64(lr.Pump.Torque), f.pumpT},
			{"motor torque", float64(lr.Motors[0].Torque), f.motorT},
			{"input torque", float64(st.InputTorque), f.inputT},
			{"hydraulic power", float64(lr.HydraulicPower), f.hydraulic},
			{"hydraulic share", st.HydraulicShare, f.share},
			{"pressure", float64(lr.Pressure), f.dp},
			{"pump setting", lr.Pump.Setting, f.xp},
			{"motor setting", lr.Motors[0].Setting, f.xm},
		} {
			if !testutil.Close(c.got, c.want, 1e-9, 1e-9) {
				t.Errorf("%v rpm, %v N·m: %s %g, closed form %g", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque), c.name, c.got, c.want)
			}
		}
	}
}

// BenchmarkFloor is the closed-form lossless evaluation, per point of
// benchPoints (ns/op is per point).
func BenchmarkFloor(b *testing.B) {
	pts := benchPoints(b)
	d := float64(units.CCPerRev(100))
	var f floorPoint
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		p := &pts[i]
		floor(testI0, d, d, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
			float64(p.Outputs[0].Torque), float64(p.PTO[0]), &f)
		sinkFloor += f.inputT
		if i++; i == len(pts) {
			i = 0
		}
	}
}

// BenchmarkSolveVsFloor solves the points of benchPoints (ns/op is per
// point) and reports the ratio of its time per point to the closed-form
// lossless floor's, measured in the same run ("x-floor"), and for the lossy
// layout also the ratio to the hand-written lossy evaluation of
// lossyfloor_test.go ("x-lossy-floor"). The cases: lossless and lossy on
// the compiled path with Brief states (what a sweep or a search does), the
// same lossy points in an order where the speed changes from each point to
// the next (as in a map), lossy with the full state, and lossy on the
// general path with the full state (the solver before the compiled path,
// kept for the comparison).
func BenchmarkSolveVsFloor(b *testing.B) {
	all := benchPoints(b)
	// The same points ordered so that no two in a row share a speed (torque
	// slowest, as a map steps them): a point then never finds its Curve
	// prepared at its speeds by the point before (prepareCurve).
	bySpeed := slices.Clone(all)
	slices.SortStableFunc(bySpeed, func(p, q Point) int { return cmp.Compare(p.Outputs[0].Torque, q.Outputs[0].Torque) })
	for _, c := range []struct {
		name                  string
		lossy, brief, general bool
		pts                   []Point
	}{
		{"lossless", false, true, false, all},
		{"lossy", true, true, false, all},
		{"lossy-speed-fastest", true, true, false, bySpeed},
		{"lossy-full-state", true, false, false, all},
		{"lossy-general", true, false, true, all},
	} {
		pts := c.pts
		b.Run(c.name, func(b *testing.B) {
			s := NewSolver(benchLayout(b, c.lossy))
			s.general = c.general
			st := State{Brief: c.brief}
			for _, p := range pts {
				if err := s.Solve(p, &st); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				if err := s.Solve(pts[i], &st); err != nil {
					b.Fatal(err)
				}
				if i++; i == len(pts) {
					i = 0
				}
			}
			b.StopTimer()
			// The ratios side by side: rounds of the solver, the floor and
			// the lossy floor in turn over all points, the best round of
			// each (other load on a shared machine only adds time).
			rounds := 200
			if testing.Short() {
				rounds = 5
			}
			solve := func() {
				for k := range pts {
					_ = s.Solve(pts[k], &st)
				}
			}
			d := float64(units.CCPerRev(100))
			var f floorPoint
			var lf lossyPoint
			lp := benchLossyParams()
			lossless := func() { sinkFloor += floorPoints(pts, d, &f) }
			lossy := func() {
				for k := range pts {
					p := &pts[k]
					lossyFloor(&lp, benchRanges[1].Ratio, float64(p.Input), float64(p.Outputs[0].Speed),
						float64(p.Outputs[0].Torque), float64(p.PTO[0]), &lf)
					sinkLossy += lf.inputT
				}
			}
			best := sideBySide(rounds, len(pts), solve, lossless, lossy)
			b.ReportMetric(best[0]/best[1], "x-floor")
			if c.lossy {
				b.ReportMetric(best[0]/best[2], "x-lossy-floor")
			}
		})
	}
}

// sideBySide runs each of fs (one pass over n points each) in turn, rounds
// times, each timed over enough passes to take about 50 µs, and returns the
// best time per point of each.
func sideBySide(rounds, n int, fs ...func()) []float64 {
	best := make([]float64, len(fs))
	reps := make([]int, len(fs))
	for i, f := range fs {
		best[i] = math.Inf(1)
		start := time.Now()
		f()
		reps[i] = max(1, int(50*time.Microsecond/max(time.Since(start), time.Nanosecond)))
	}
	for range rounds {
		for i, f := range fs {
			start := time.Now()
			for range reps[i] {
				f()
			}
			best[i] = math.Min(best[i], float64(time.Since(start).Nanoseconds())/float64(reps[i]*n))
		}
	}
	return best
}

// BenchmarkSolveOutputCoupled solves one operating point of a two-range
// output-coupled split with lossy units, gears and set: 0 allocations per
// solve once the State has been used.
func BenchmarkSolveOutputCoupled(b *testing.B) {
	s := NewSolver(benchLayout(b, true))
	var st State
	p := Point{Range: 1, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(700), Torque: units.NewtonMetres(1200)}},
		PTO: []units.Torque{units.NewtonMetres(150)}}
	if err := s.Solve(p, &st); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := s.Solve(p, &st); err != nil {
			b.Fatal(err)
		}
	}
}

func TestSolveAllocatesNothing(t *testing.T) {
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(t, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}})
	if err != nil {
		t.Fatal(err)
	}
	s := NewSolver(l)
	var st State
	p := Point{Range: 1, Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(700), Torque: units.NewtonMetres(1200)}}}
	if err := s.Solve(p, &st); err != nil {
		t.Fatal(err)
	}
	if n := testing.AllocsPerRun(50, func() { _ = s.Solve(p, &st) }); n != 0 {
		t.Errorf("Solve allocates %v times per call", n)
	}
}

// TestSolveAllocatesNothingOverPoints solves every benchmark point with one
// solver and State after a single warm-up solve: no point allocates.
func TestSolveAllocatesNothingOverPoints(t *testing.T) {
	pts := benchPoints(t)
	s := NewSolver(benchLayout(t, true))
	var st State
	if err := s.Solve(pts[0], &st); err != nil {
		t.Fatal(err)
	}
	n := testing.AllocsPerRun(5, func() {
		for _, p := range pts {
			_ = s.Solve(p, &st)
		}
	})
	if n != 0 {
		t.Errorf("solving %d points allocates %v times", len(pts), n)
	}
}

// BenchmarkCompiledSteps times, one by one, the steps a lossy benchmark
// point takes on the compiled path (compiled.go), each repeated on the same
// point with everything else held, beside the whole solve: the item by
// item profile behind the ratio to the lossy floor. In order: the entry's
// checks, the held settings, the shaft speeds, the units' speed limits,
// the loop's Curve at those speeds, the factored system of the range and
// directions, Newton's method on the loop pressure (every evaluation),
// one evaluation of the unit torques alone, the key ports' torques with
// the reading of the directions, the loop state at the final pressure, the
// sizing of the State, the summary (margins included) and the margins
// alone. The solve of the same point again keeps its Curve (the speeds
// are those it was prepared at: prepareCurve), so the curve step is not
// part of it; the other steps add up to about six sevenths of the solve,
// the rest is the calls between them.
func BenchmarkCompiledSteps(b *testing.B) {
	s := NewSolver(benchLayout(b, true))
	st := State{Brief: true}
	p := benchPoints(b)[5]
	if err := s.Solve(p, &st); err != nil {
		b.Fatal(err)
	}
	e, r, c := s.recent, &s.l.ranges[p.Range], &s.comp
	el := &s.l.elems[s.l.loops[0]]
	wp := units.AngularVelocity(s.w[el.shafts[0]])
	var evals int
	for _, step := range []struct {
		name string
		f    func()
	}{
		{"solve", func() { _ = s.Solve(p, &st) }},
		{"check", func() { _ = s.checkEntry(&p, &st) }},
		{"held-settings", func() { s.setPins(&p, false) }},
		{"speeds", func() { s.l.speeds(r, float64(p.Input), s.outW, s.w) }},
		{"unit-speeds", func() { _ = s.unitSpeeds() }},
		{"curve", func() { el.loop.Curve(wp, c.wms, &c.curve) }},
		{"system", func() { s.entry(r, &p) }},
		{"newton", func() { s.newton(e, &p, nil, nil, math.Inf(1), &evals) }},
		{"unit-torques", func() { c.curve.Torques(st.Loops[0].Pressure, c.settings, c.tau, c.slope) }},
		{"key-pass", func() { s.keyPass(e, nil) }},
		{"loop-state", func() { _ = c.curve.Fill(st.Loops[0].Pressure, c.settings, &st.Loops[0].LoopState) }},
		{"size", func() { st.size(s.l) }},
		{"summary", func() { s.summaryC(&st, &p, r, st.Iterations, 1) }},
		{"margins", func() { s.margins(&st, true) }},
	} {
		b.Run(step.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				step.f()
			}
		})
	}
}
