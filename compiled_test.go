package powersplit

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// TestPropertyCompiledMatchesGeneral: over random layouts and points of the
// property generators (every one a single loop), the compiled path and the
// general path give the same error, and the same state to 1e-12 relative
// to the scale of each quantity (summaryDiff), full and Brief, every port
// torque included. Both orders of solving are checked against a fresh
// general solver, so the compiled path's first guess of the directions
// (the last point's) cannot change a result.
func TestPropertyCompiledMatchesGeneral(t *testing.T) {
	t.Parallel()
	compiled, points := 0, 0
	defer func() {
		t.Logf("%d of %d points solved on the compiled path", compiled, points)
		if points > 0 && compiled < points/2 {
			t.Errorf("only %d of %d points took the compiled path", compiled, points)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		if checkCompiled(t) {
			compiled++
		}
		points++
	})
}

// checkCompiled draws a layout and a point, solves the point on both paths
// (the compiled solver after a neighbouring point) and fails t unless they
// agree; it reports whether the compiled solver took the compiled path.
func checkCompiled(t *rapid.T) bool {
	c := rapid.Custom(genCase).Draw(t, "layout and point")
	gen, fast := NewSolver(c.l), NewSolver(c.l)
	gen.general = true
	// A neighbouring point first, so that the compiled path starts
	// from another point's directions.
	q := c.p
	q.Outputs = append([]OutputDemand(nil), c.p.Outputs...)
	q.Outputs[0].Torque = -q.Outputs[0].Torque * units.Torque(rapid.Float64Range(0, 1.5).Draw(t, "neighbour torque"))
	var scratch State
	_ = fast.Solve(q, &scratch)
	hits := fast.comp.hits
	var a, b State
	ea, eb := fast.Solve(c.p, &a), gen.Solve(c.p, &b)
	took := fast.comp.hits > hits
	if !sameError(ea, eb) && !foundBalance(ea, eb, &a, c.l) {
		t.Fatalf("%s: compiled: %v; general: %v", c.kind, ea, eb)
	}
	if ea != nil {
		return took
	}
	if d := summaryDiff(&a, &b, 1e-12); d != "" {
		t.Fatalf("%s: compiled %s", c.kind, d)
	}
	tscale := 0.0
	for i := range b.ports {
		tscale = math.Max(tscale, math.Abs(float64(b.ports[i].Torque)))
	}
	for i := range b.ports {
		ta, tb := float64(a.ports[i].Torque), float64(b.ports[i].Torque)
		if math.Abs(ta-tb) > 1e-12*(math.Abs(tb)+tscale) {
			t.Fatalf("%s: port %d torque compiled %.17g, general %.17g", c.kind, i, ta, tb)
		}
	}
	br := State{Brief: true}
	if err := fast.Solve(c.p, &br); err != nil || summaryDiff(&br, &a, 0) != "" {
		t.Fatalf("%s: Brief compiled %v: %s", c.kind, err, summaryDiff(&br, &a, 0))
	}
	return took
}

// foundBalance reports whether the compiled path's error ea is a setting
// limit at a torque balance below the relief where the general path's eb
// says it found no balance below the relief: the one place the two may
// differ. The general path looks for the balance by bracketing the loop
// pressure on a grid and can miss one where the schedule holds its
// settings at a limit; the compiled path's Newton steps on the same
// torques find it. It is accepted only if the hydrostat itself confirms
// the compiled loop state: Loop.At at the compiled pressure and unit
// speeds reports the same setting limit with the same unit torques
// (1e-9), below the relief.
func foundBalance(ea, eb error, a *State, l Layout) bool {
	var lb *LimitError
	if !errors.Is(ea, hydrostat.ErrSettingLimit) || !errors.As(eb, &lb) || lb.Quantity != "high-line pressure for a torque balance" {
		return false
	}
	el := &l.l.elems[l.l.loops[0]]
	lr := &a.Loops[0]
	if len(a.Loops) != 1 || !(lr.High < el.lspec.Relief) {
		return false
	}
	wms := make([]units.AngularVelocity, len(lr.Motors))
	for k := range wms {
		wms[k] = lr.Motors[k].Speed
	}
	var at hydrostat.LoopState
	if err := el.loop.At(lr.Pump.Speed, wms, lr.Pressure, &at); !errors.Is(err, hydrostat.ErrSettingLimit) {
		return false
	}
	close := func(x, y units.Torque) bool {
		return math.Abs(float64(x-y)) <= 1e-9*(math.Abs(float64(y))+1)
	}
	ok := close(at.Pump.Torque, lr.Pump.Torque)
	for k := range at.Motors {
		ok = ok && close(at.Motors[k].Torque, lr.Motors[k].Torque)
	}
	return ok
}

// FuzzCompiledMatchesGeneral is TestPropertyCompiledMatchesGeneral as a
// fuzz target.
func FuzzCompiledMatchesGeneral(f *testing.F) {
	f.Fuzz(rapid.MakeFuzz(func(t *rapid.T) { checkCompiled(t) }))
}

// TestCompiledOnBenchmarkPoints: every benchmark point takes the compiled
// path and agrees with the general path to 1e-12.
func TestCompiledOnBenchmarkPoints(t *testing.T) {
	l := benchLayout(t, true)
	gen, fast := NewSolver(l), NewSolver(l)
	gen.general = true
	var a, b State
	pts := benchPoints(t)
	for _, p := range pts {
		if err := fast.Solve(p, &a); err != nil {
			t.Fatal(err)
		}
		if err := gen.Solve(p, &b); err != nil {
			t.Fatal(err)
		}
		if d := summaryDiff(&a, &b, 1e-12); d != "" {
			t.Errorf("%v rpm, %v N·m: %s", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque), d)
		}
	}
	if fast.comp.hits != len(pts) {
		t.Errorf("%d of %d points took the compiled path", fast.comp.hits, len(pts))
	}
}

// TestCompiledLosslessHits: every benchmark point of the lossless layout
// takes the compiled path, and with ideal units (F linear in Δp) Newton's
// method lands in one step: two evaluations of the unit torques a point,
// the second at the pressure reached.
func TestCompiledLosslessHits(t *testing.T) {
	l := benchLayout(t, false)
	s := NewSolver(l)
	var st State
	pts := benchPoints(t)
	for _, p := range pts {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		if st.Iterations != 2 {
			t.Errorf("%v rpm, %v N·m: %d evaluations of the unit torques, want 2", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque), st.Iterations)
		}
	}
	if s.comp.hits != len(pts) {
		t.Errorf("%d of %d lossless points took the compiled path", s.comp.hits, len(pts))
	}
}

// TestCompiledEvals: on the lossy benchmark points the compiled path needs
// fewer evaluations of the unit torques than the hand-written lossy floor
// (4.4 a point, lossyfloor_test.go): three a point, the second step taken
// to the root of the parabola through the first two (quadStep); never
// more than 6 on a point.
func TestCompiledEvals(t *testing.T) {
	l := benchLayout(t, true)
	s := NewSolver(l)
	var st State
	pts := benchPoints(t)
	tot := 0
	for _, p := range pts {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
		if st.Iterations > 6 {
			t.Errorf("%v rpm, %v N·m: %d evaluations", p.Outputs[0].Speed.RPM(), float64(p.Outputs[0].Torque), st.Iterations)
		}
		tot += st.Iterations
	}
	mean := float64(tot) / float64(len(pts))
	t.Logf("%d points, %.2f evaluations each", len(pts), mean)
	if mean > 3.5 {
		t.Errorf("%.2f evaluations a point, want at most 3.5 (the lossy floor needs 4.4)", mean)
	}
}

// TestMapCompiledMatchesGeneral: the benchmark map (a fifth of it beyond
// the motors' setting range) solved on the compiled path and on the
// general path: every cell feasible in both or neither, with the same
// reason, and the same numbers to 1e-12 relative.
func TestMapCompiledMatchesGeneral(t *testing.T) {
	l := benchLayout(t, true)
	n := 60
	if testing.Short() {
		n = 24
	}
	spec := benchMapSpec(n, 1)
	mc, err := l.Map(spec)
	if err != nil {
		t.Fatal(err)
	}
	mg, err := generalOnly(l).Map(spec)
	if err != nil {
		t.Fatal(err)
	}
	bad, ok := 0, 0
	for i := range mc.Torques {
		for j := range mc.Speeds {
			a, b := mc.At(i, j), mg.At(i, j)
			if a.OK != b.OK || a.Reason() != b.Reason() {
				t.Fatalf("cell %d,%d: compiled %v %q, general %v %q", i, j, a.OK, a.Reason(), b.OK, b.Reason())
			}
			if !a.OK {
				bad++
				continue
			}
			ok++
			scale := math.Abs(float64(b.InputPower)) + math.Abs(float64(b.OutputPower))
			for _, q := range []struct {
				name string
				x, y float64
				s    float64
			}{
				{"input torque", float64(a.InputTorque), float64(b.InputTorque), 0},
				{"input power", float64(a.InputPower), float64(b.InputPower), scale},
				{"loss", float64(a.Loss), float64(b.Loss), scale},
				{"efficiency", a.Efficiency, b.Efficiency, 1},
				{"hydraulic share", a.HydraulicShare, b.HydraulicShare, 1},
				{"pressure", float64(a.Pressure), float64(b.Pressure), 1e5},
				{"pump setting", a.PumpSetting, b.PumpSetting, 1},
				{"motor setting", a.MotorSetting, b.MotorSetting, 1},
			} {
				if math.Abs(q.x-q.y) > 1e-12*(math.Abs(q.y)+q.s) {
					t.Fatalf("cell %d,%d: %s compiled %.17g, general %.17g", i, j, q.name, q.x, q.y)
				}
			}
		}
	}
	if bad == 0 || ok == 0 {
		t.Errorf("%d feasible and %d infeasible cells: the map should have both", ok, bad)
	}
}

// TestPropertyCompiledMatchesGeneralDrags: with drag sources (bearings,
// churning, open plates, idle PTO; and a charge pump on some layouts) both
// paths give the same error and the same state to 1e-12, the drags
// included. With a charge pump the agreement is to 5e-9: the general
// path takes the charge pump's torque from the leakage of its iterate
// before the last, and it stops once a step is below 1e-9 of the pressure
// (the next one would be below 1e-12), so its charge torque may lag the
// pressure it reports by about 1e-9 of itself; the compiled path takes it
// from the leakage at the pressure it reaches.
func TestPropertyCompiledMatchesGeneralDrags(t *testing.T) {
	t.Parallel()
	compiled, points := 0, 0
	defer func() {
		t.Logf("%d of %d points solved on the compiled path", compiled, points)
		if points > 4 && compiled == 0 {
			t.Error("no point took the compiled path")
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		kind, l0 := genLayout(t)
		n := genNoLoad(t, l0)
		if rapid.Bool().Draw(t, "no charge pump") {
			n.ChargePumps = nil
		}
		l, err := l0.WithLosses(n)
		if err != nil {
			t.Fatal(err)
		}
		p := genPoint(t, l0)
		tol := 1e-12
		if n.ChargePumps != nil {
			tol = 5e-9
		}
		a, b, took, solved := solveBothPaths(t, kind, l, p, tol)
		points++
		if took {
			compiled++
		}
		if !solved {
			return
		}
		for i := range b.Drags {
			da, db := a.Drags[i], b.Drags[i]
			if math.Abs(float64(da.Torque-db.Torque)) > tol*(math.Abs(float64(db.Torque))+1e-9) {
				t.Fatalf("%s: drag %s torque %.17g, general %.17g", kind, db.Name, float64(da.Torque), float64(db.Torque))
			}
		}
	})
}

// TestPropertyCompiledHistoryFree: a point's result does not depend on the
// points a solver solved before it (the first guess of the directions
// differs, the result may not): twenty points of a layout around a drawn
// one, solved forwards by one solver, backwards by another and speed by
// speed by a third, give the same bits, errors included. Maps rely on it for results identical with
// any number of workers, the vehicle's day for answering a repeated
// demand from memory.
func TestPropertyCompiledHistoryFree(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := rapid.Custom(genCase).Draw(t, "layout and point")
		v, tq := c.p.Outputs[0].Speed, c.p.Outputs[0].Torque
		var pts []Point
		for i := range 4 {
			for j := range 5 {
				p := c.p
				p.Outputs = make([]OutputDemand, len(c.p.Outputs))
				for k := range p.Outputs {
					p.Outputs[k].Speed = v/2 + units.AngularVelocity(float64(j)/4)*v
				}
				p.Outputs[0].Torque = -tq + 3*tq*units.Torque(float64(i)/3)
				pts = append(pts, p)
			}
		}
		type res struct {
			err  string
			bits [4]uint64
		}
		get := func(s *Solver, p Point, st *State) res {
			var r res
			if err := s.Solve(p, st); err != nil {
				r.err = err.Error()
			}
			r.bits = [4]uint64{math.Float64bits(float64(st.InputTorque)), math.Float64bits(float64(st.Loss)),
				math.Float64bits(st.HydraulicShare), math.Float64bits(float64(st.Loops[0].Pressure))}
			return r
		}
		a, b := NewSolver(c.l), NewSolver(c.l)
		sa, sb := State{Brief: true}, State{Brief: true}
		fwd := make([]res, len(pts))
		for i, p := range pts {
			fwd[i] = get(a, p, &sa)
		}
		for i := len(pts) - 1; i >= 0; i-- {
			if r := get(b, pts[i], &sb); r != fwd[i] {
				t.Fatalf("%s point %d: forwards %+v, backwards %+v", c.kind, i, fwd[i], r)
			}
		}
		// Along the torque axis (each speed's points in a row: the curve
		// prepared at the first is kept for the others, prepareCurve).
		d, sd := NewSolver(c.l), State{Brief: true}
		for j := range 5 {
			for i := range 4 {
				if r := get(d, pts[5*i+j], &sd); r != fwd[5*i+j] {
					t.Fatalf("%s point %d: forwards %+v, along the torques %+v", c.kind, 5*i+j, fwd[5*i+j], r)
				}
			}
		}
	})
}

// TestPropertyCompiledMatchesGeneralFront: splits with a second motor
// driving an axle of its own (genFront: its setting held at the point, set
// by a curve of the first output's speed, or declutched in the "single"
// ranges), so the loop runs its Pinned schedule: the compiled path and the
// general path give the same errors and the same numbers to 1e-12, and
// most such points take the compiled path.
func TestPropertyCompiledMatchesGeneralFront(t *testing.T) {
	t.Parallel()
	compiled, points := 0, 0
	defer func() {
		t.Logf("%d of %d points solved on the compiled path", compiled, points)
		if points > 10 && compiled < points/2 {
			t.Errorf("only %d of %d points took the compiled path", compiled, points)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		kind, l, p := genFront(t)
		_, _, took, _ := solveBothPaths(t, kind, l, p, 1e-12)
		points++
		if took {
			compiled++
		}
	})
}

// solveBothPaths solves p with a fresh solver on each path and fails t
// unless both give the same error (or the compiled path a balance
// Loop.At confirms, foundBalance) and, where they solve it, the same
// summary to tol. It returns both states, whether the compiled path took
// the point and whether it was solved.
func solveBothPaths(t *rapid.T, kind string, l Layout, p Point, tol float64) (a, b *State, took, solved bool) {
	gen, fast := NewSolver(l), NewSolver(l)
	gen.general = true
	a, b = new(State), new(State)
	ea, eb := fast.Solve(p, a), gen.Solve(p, b)
	took = fast.comp.hits > 0
	if !sameError(ea, eb) && !foundBalance(ea, eb, a, l) {
		t.Fatalf("%s: compiled: %v; general: %v", kind, ea, eb)
	}
	if ea != nil {
		return a, b, took, false
	}
	if d := summaryDiff(a, b, tol); d != "" {
		t.Fatalf("%s: compiled %s", kind, d)
	}
	return a, b, took, true
}
