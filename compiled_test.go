package powersplit

import (
	"math"
	"testing"

	"pgregory.net/rapid"

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
		points++
		if fast.comp.hits > hits {
			compiled++
		}
		if !sameError(ea, eb) {
			t.Fatalf("%s: compiled: %v; general: %v", c.kind, ea, eb)
		}
		if ea != nil {
			return
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
	})
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

func TestCompiledLosslessHits(t *testing.T) {
	l := benchLayout(t, false)
	s := NewSolver(l)
	var st State
	pts := benchPoints(t)
	for _, p := range pts {
		if err := s.Solve(p, &st); err != nil {
			t.Fatal(err)
		}
	}
	t.Logf("%d of %d, iterations %d", s.comp.hits, len(pts), st.Iterations)
}

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
		tot += st.Iterations
	}
	t.Logf("%d points, %.2f evaluations each", len(pts), float64(tot)/float64(len(pts)))
}
