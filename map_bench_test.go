package powersplit

import (
	"io"
	"math"
	"runtime"
	"slices"
	"strconv"
	"sync"
	"testing"
	"time"

	"github.com/powersplit-dev/powersplit/units"
)

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

// BenchmarkMapWriteCSV writes the CSV of the 200 × 200 map (50 × 50 in
// -short mode); ns/row is per cell.
func BenchmarkMapWriteCSV(b *testing.B) {
	n := 200
	if testing.Short() {
		n = 50
	}
	m, err := benchLayout(b, true).Map(benchMapSpec(n, 0))
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := m.WriteCSV(io.Discard); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n*n), "ns/row")
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
		// A switch of GOMAXPROCS stops the world: it is made outside the
		// timed maps, for both (it was inside the 2-core time only).
		runtime.GOMAXPROCS(1)
		start := time.Now()
		if _, err := l.Map(one); err != nil {
			b.Fatal(err)
		}
		d1 := time.Since(start)
		runtime.GOMAXPROCS(2)
		start = time.Now()
		if _, err := l.Map(two); err != nil {
			b.Fatal(err)
		}
		d2 := time.Since(start)
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

// TestMapWorkersIdentical checks that a map solved by 1, 2 and 4 workers
// is bit-identical, cell by cell, and again by 1 worker from the pool
// after them: a square map and a wide one of 3 rows. The compiled
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
			if len(m1.Feasible()) != rows || len(m.Feasible()) != rows {
				t.Fatalf("%d rows: maps have %d and %d rows", rows, len(m1.Feasible()), len(m.Feasible()))
			}
			compareMaps(t, m1, m, n*rows)
		}
		// Again with 1 worker: the pooled workers have solved other
		// points since, which must not change a result.
		again, err := l.Map(spec1)
		if err != nil {
			t.Fatal(err)
		}
		compareMaps(t, m1, again, n*rows)
	}
}

// compareMaps fails t unless m1 and m4 agree bit for bit: every number a
// cell reports, its reason and its binding margin, and the storage behind
// them (the same error and margin-name indices, the same tables).
func compareMaps(t *testing.T, m1, m4 Map, cells int) {
	t.Helper()
	same := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
	if !slices.Equal(m1.res.binds, m4.res.binds) || m1.res.n != m4.res.n || m1.res.size != m4.res.size {
		t.Fatalf("tables differ: margin names %v and %v, %d and %d cells in blocks of %d and %d", m1.res.binds, m4.res.binds,
			m1.res.n, m4.res.n, m1.res.size, m4.res.size)
	}
	ok := 0
	for i := range m1.Torques {
		for j := range m1.Speeds {
			a, c := m1.At(i, j), m4.At(i, j)
			if a.OK {
				ok++
			}
			ra, blk1 := m1.res.cell(i*len(m1.Speeds) + j)
			rc, blk4 := m4.res.cell(i*len(m1.Speeds) + j)
			if len(blk1.errs) != len(blk4.errs) {
				t.Fatalf("cell %d,%d: %d and %d errors in its block", i, j, len(blk1.errs), len(blk4.errs))
			}
			ba, bc := a.Binding, c.Binding
			if a.OK != c.OK || a.Reason() != c.Reason() || a.Range != c.Range || ra.aux != rc.aux ||
				!same(float64(a.OutputSpeed), float64(c.OutputSpeed)) || !same(float64(a.OutputTorque), float64(c.OutputTorque)) ||
				!same(float64(a.InputTorque), float64(c.InputTorque)) || !same(float64(a.InputPower), float64(c.InputPower)) ||
				!same(float64(a.OutputPower), float64(c.OutputPower)) || !same(float64(a.Loss), float64(c.Loss)) ||
				!same(a.Efficiency, c.Efficiency) || !same(a.HydraulicShare, c.HydraulicShare) ||
				!same(float64(a.Pressure), float64(c.Pressure)) || !same(float64(a.HighPressure), float64(c.HighPressure)) ||
				!same(float64(a.PumpSpeed), float64(c.PumpSpeed)) || !same(float64(a.MotorSpeed), float64(c.MotorSpeed)) ||
				!same(a.PumpSetting, c.PumpSetting) || !same(a.MotorSetting, c.MotorSetting) ||
				ba.Element != bc.Element || ba.Quantity != bc.Quantity || ba.Bound != bc.Bound || ba.Unchecked != bc.Unchecked ||
				ba.Value.Kind != bc.Value.Kind || !same(ba.Value.SI, bc.Value.SI) || !same(ba.Limit.SI, bc.Limit.SI) {
				t.Fatalf("cell %d,%d differs: 1 worker %+v, more workers %+v", i, j, a, c)
			}
		}
	}
	if ok < cells/4 {
		t.Errorf("only %d of %d cells feasible; the map should exercise the solver", ok, cells)
	}
}
