package powersplit

import (
	"math"
	"runtime"
	"strconv"
	"sync"
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
// the compiled path with Brief states (what a sweep or a search does), lossy
// with the full state, and lossy on the general path with the full state
// (the solver before the compiled path, kept for the comparison).
func BenchmarkSolveVsFloor(b *testing.B) {
	pts := benchPoints(b)
	for _, c := range []struct {
		name                  string
		lossy, brief, general bool
	}{
		{"lossless", false, true, false},
		{"lossy", true, true, false},
		{"lossy-full-state", true, false, false},
		{"lossy-general", true, false, true},
	} {
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

// benchMapSpec is an efficiency map of range 2 of the benchmark layout over
// output speed × output torque, n × n points; part of it is infeasible (the
// band around the mechanical point, torques beyond the relief pressure).
func benchMapSpec(n, workers int) MapSpec {
	return MapSpec{Range: 1, Input: units.RPM(2000), SpeedFrom: units.RPM(540), SpeedTo: units.RPM(1420), SpeedSteps: n,
		TorqueFrom: units.NewtonMetres(-1500), TorqueTo: units.NewtonMetres(3000), TorqueSteps: n,
		PTO: []units.Torque{units.NewtonMetres(150)}, Workers: workers}
}

// BenchmarkMap solves n × n efficiency maps with GOMAXPROCS workers (run
// with -cpu 1,2 to see the parallel speed-up); ns/op is per map and
// ns/point per grid point. In -short mode (CI: -benchtime=1x) only the
// 20 × 20 and 50 × 50 maps run, so the benchmark stays quick.
func BenchmarkMap(b *testing.B) {
	l := benchLayout(b, true)
	sizes := []int{50, 100, 200}
	if testing.Short() {
		sizes = []int{20, 50}
	}
	for _, n := range sizes {
		b.Run(strconv.Itoa(n)+"x"+strconv.Itoa(n), func(b *testing.B) {
			spec := benchMapSpec(n, 0)
			b.ReportAllocs()
			for b.Loop() {
				if _, err := l.Map(spec); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n*n), "ns/point")
		})
	}
}

// generalOnly returns a copy of l whose solvers take the general path
// only, with full states in maps and sweeps: the solver before the
// compiled path.
func generalOnly(l Layout) Layout {
	c := *l.l
	c.general = true
	return Layout{l: &c}
}

// BenchmarkMapVsGeneral solves the 200 × 200 map with all losses (50 × 50
// in -short mode) on GOMAXPROCS workers, with the compiled path and Brief
// states and with the general path and full states (today's map before the
// compiled path), in turn in every iteration, and reports how many times
// faster the first is ("x-faster", best of each over the iterations; on a
// shared machine other load only adds time) and the time per point of
// each.
func BenchmarkMapVsGeneral(b *testing.B) {
	l := benchLayout(b, true)
	g := generalOnly(l)
	n := 200
	if testing.Short() {
		n = 50
	}
	spec := benchMapSpec(n, 0)
	bestC, bestG := time.Duration(math.MaxInt64), time.Duration(math.MaxInt64)
	b.ReportAllocs()
	for b.Loop() {
		start := time.Now()
		if _, err := l.Map(spec); err != nil {
			b.Fatal(err)
		}
		mid := time.Now()
		if _, err := g.Map(spec); err != nil {
			b.Fatal(err)
		}
		bestC, bestG = min(bestC, mid.Sub(start)), min(bestG, time.Since(mid))
	}
	b.ReportMetric(float64(bestG)/float64(bestC), "x-faster")
	b.ReportMetric(float64(bestC.Nanoseconds())/float64(n*n), "ns/point")
	b.ReportMetric(float64(bestG.Nanoseconds())/float64(n*n), "ns/point-general")
}

// BenchmarkMapSpeedup solves the 200 × 200 map (50 × 50 in -short mode)
// on 1 core (GOMAXPROCS 1, 1 worker) and on 2 (GOMAXPROCS 2, 2 workers) in
// turn, each loop iteration both, and reports the parallel speed-up
// t(1 core)/t(2 cores) as "x-speedup" (best time of each over the
// iterations) and "x-speedup-mean" (mean times); ns/op is for the pair. It needs
// GOMAXPROCS ≥ 2 at the start and sets GOMAXPROCS itself, so one run on a
// 2-core machine measures both side by side. On 1 core the garbage
// collector and the runtime share the worker's core, as they would for a
// user limited to one.
func BenchmarkMapSpeedup(b *testing.B) {
	if runtime.GOMAXPROCS(0) < 2 {
		b.Skip("needs GOMAXPROCS ≥ 2")
	}
	l := benchLayout(b, true)
	n := 200
	if testing.Short() {
		n = 50
	}
	one, two := benchMapSpec(n, 1), benchMapSpec(n, 2)
	var t1, t2 time.Duration
	best1, best2 := time.Duration(math.MaxInt64), time.Duration(math.MaxInt64)
	b.ReportAllocs()
	procs := runtime.GOMAXPROCS(0)
	defer runtime.GOMAXPROCS(procs)
	for b.Loop() {
		runtime.GOMAXPROCS(1)
		start := time.Now()
		if _, err := l.Map(one); err != nil {
			b.Fatal(err)
		}
		mid := time.Now()
		runtime.GOMAXPROCS(2)
		if _, err := l.Map(two); err != nil {
			b.Fatal(err)
		}
		d1, d2 := mid.Sub(start), time.Since(mid)
		t1, t2 = t1+d1, t2+d2
		best1, best2 = min(best1, d1), min(best2, d2)
	}
	// On a shared machine other load only ever adds time: the best of each
	// is the cleaner measure; the mean is reported beside it.
	b.ReportMetric(float64(best1)/float64(best2), "x-speedup")
	b.ReportMetric(float64(t1)/float64(t2), "x-speedup-mean")
	b.ReportMetric(float64(t1.Nanoseconds())/float64(b.N*n*n), "ns/point-1w")
	b.ReportMetric(float64(t2.Nanoseconds())/float64(b.N*n*n), "ns/point-2w")
	b.ReportMetric(cpuCeiling(testing.Short()), "x-cpu-ceiling")
}

var sinkSpin float64

// spin is pure arithmetic on registers: no memory, no allocation.
func spin(n int) float64 {
	x := 1.0
	for range n {
		x = x*1.0000001 + 1e-9
	}
	return x
}

// cpuCeiling measures what two goroutines get out of the machine at this
// moment: the time of two units of pure arithmetic on one goroutine over
// their time on two. 2 on two idle cores; less on a shared or throttled
// machine, which bounds every parallel speed-up measured beside it.
func cpuCeiling(short bool) float64 {
	n := 20_000_000
	if short {
		n = 1_000_000
	}
	start := time.Now()
	sinkSpin += spin(n) + spin(n)
	one := time.Since(start)
	var wg sync.WaitGroup
	var r [2]float64
	start = time.Now()
	for k := range r {
		wg.Go(func() { r[k] = spin(n) })
	}
	wg.Wait()
	two := time.Since(start)
	sinkSpin += r[0] + r[1]
	return float64(one) / float64(two)
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

// TestMapWorkersIdentical checks that a map solved by 1, 2 and 4 workers
// is bit-identical, cell by cell: a square map (the workers take rows) and
// a wide one of 3 rows (the workers take chunks of cells). The compiled
// path's first guess of the directions is the last point's, which differs
// with the order the workers take the cells in: only the guess, never the
// result.
func TestMapWorkersIdentical(t *testing.T) {
	l := benchLayout(t, true)
	n := 40
	if testing.Short() {
		n = 16
	}
	for _, rows := range []int{n, 3} {
		spec1 := benchMapSpec(n, 1)
		spec1.TorqueSteps = rows
		m1, err := l.Map(spec1)
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range []int{2, 4} {
			spec := benchMapSpec(n, w)
			spec.TorqueSteps = rows
			m, err := l.Map(spec)
			if err != nil {
				t.Fatal(err)
			}
			if len(m1.Cells) != rows || len(m.Cells) != rows {
				t.Fatalf("%d rows: maps have %d and %d rows", rows, len(m1.Cells), len(m.Cells))
			}
			compareMaps(t, m1, m, n*rows)
		}
	}
}

// compareMaps fails t unless m1 and m4 agree bit for bit.
func compareMaps(t *testing.T, m1, m4 Map, cells int) {
	t.Helper()
	same := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
	ok := 0
	for i := range m1.Cells {
		for j := range m1.Cells[i] {
			a, c := m1.Cells[i][j], m4.Cells[i][j]
			if a.OK {
				ok++
			}
			if a.OK != c.OK || a.Reason() != c.Reason() || a.Range != c.Range ||
				!same(float64(a.OutputSpeed), float64(c.OutputSpeed)) || !same(float64(a.OutputTorque), float64(c.OutputTorque)) ||
				!same(float64(a.InputTorque), float64(c.InputTorque)) || !same(float64(a.InputPower), float64(c.InputPower)) ||
				!same(float64(a.OutputPower), float64(c.OutputPower)) || !same(float64(a.Loss), float64(c.Loss)) ||
				!same(a.Efficiency, c.Efficiency) || !same(a.HydraulicShare, c.HydraulicShare) ||
				!same(float64(a.Pressure), float64(c.Pressure)) || !same(a.PumpSetting, c.PumpSetting) ||
				!same(a.MotorSetting, c.MotorSetting) {
				t.Fatalf("cell %d,%d differs: 1 worker %+v, 4 workers %+v", i, j, a, c)
			}
		}
	}
	if ok < cells/4 {
		t.Errorf("only %d of %d cells feasible; the map should exercise the solver", ok, cells)
	}
}
