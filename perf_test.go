package powersplit

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// TestPropertyFactoredMatchesFull: the solver with its factored reference
// systems (factor.go) and the solver that factors every system in full
// reach the same state, up to rounding, and the same outcome.
func TestPropertyFactoredMatchesFull(t *testing.T) {
	t.Parallel()
	both := 0
	defer func() {
		t.Logf("%d points solved both ways", both)
	}()
	rapid.Check(t, func(t *rapid.T) {
		c := rapid.Custom(genCase).Draw(t, "layout and point")
		fast, full := NewSolver(c.l), NewSolver(c.l)
		full.noFactor = true
		var a, b State
		ea, eb := fast.Solve(c.p, &a), full.Solve(c.p, &b)
		if (ea == nil) != (eb == nil) {
			t.Fatalf("%s: factored: %v; full: %v", c.kind, ea, eb)
		}
		if ea != nil {
			return
		}
		both++
		scale := math.Abs(float64(b.InputPower)) + math.Abs(float64(b.OutputPower+b.PTOPower)) + 1e-3*b.powerScale()
		for _, q := range []struct {
			name string
			x, y float64
		}{
			{"input power", float64(a.InputPower), float64(b.InputPower)},
			{"output power", float64(a.OutputPower), float64(b.OutputPower)},
			{"loss", float64(a.Loss), float64(b.Loss)},
		} {
			if !testutil.Close(q.x, q.y, 1e-9, 1e-9*scale) {
				t.Fatalf("%s: %s factored %g, full %g", c.kind, q.name, q.x, q.y)
			}
		}
		for j := range a.Loops {
			pa, pb := float64(a.Loops[j].Pressure), float64(b.Loops[j].Pressure)
			if !testutil.Close(pa, pb, 1e-9, 1e-3) {
				t.Fatalf("%s: loop %d pressure factored %g, full %g", c.kind, j, pa, pb)
			}
		}
		for i := range a.ports {
			ta, tb := float64(a.ports[i].Torque), float64(b.ports[i].Torque)
			if !testutil.Close(ta, tb, 1e-9, 1e-9*math.Sqrt(b.powerScale())) {
				t.Fatalf("%s: port %d torque factored %g, full %g", c.kind, i, ta, tb)
			}
		}
	})
}

// TestLoopErrFinite: a loop error without a value (the schedule found no
// settings) never puts NaN into the public *LimitError.
func TestLoopErrFinite(t *testing.T) {
	for _, c := range []struct {
		name     string
		settings []float64
		want     float64
	}{
		{"no state", nil, 0},
		{"all NaN", []float64{math.NaN(), math.NaN()}, 0},
		{"last finite", []float64{math.NaN(), -0.4}, 0.4},
		{"largest", []float64{0.3, 1.2}, 1.2},
	} {
		var st *hydrostat.LoopState
		if c.settings != nil {
			st = &hydrostat.LoopState{Settings: c.settings}
		}
		err := loopErr("hydrostat", fmt.Errorf("%w: test", hydrostat.ErrNoSolution), st)
		var le *LimitError
		if !errors.As(err, &le) {
			t.Fatalf("%s: %v is no *LimitError", c.name, err)
		}
		if bad(le.Value.SI) || bad(le.Limit.SI) || le.Value.SI != c.want {
			t.Errorf("%s: value %v limit %v, want %v", c.name, le.Value, le.Limit, c.want)
		}
		if !errors.Is(err, ErrUnreachable) || !errors.Is(err, hydrostat.ErrNoSolution) {
			t.Errorf("%s: %v should match ErrUnreachable and hydrostat.ErrNoSolution", c.name, err)
		}
	}
}

// TestFirstSolveAllocates: the very first solve of a fresh solver, into a
// State already sized for the layout, allocates only the sparse storage of
// the systems it factors (A_ref and its two triangles, values and columns
// each: six blocks a system, sized to the system rather than to n × n at
// NewSolver), and a repeated solve nothing.
func TestFirstSolveAllocates(t *testing.T) {
	pts := benchPoints(t)
	l := benchLayout(t, true)
	const runs = 5
	for i, p := range pts {
		// Fresh solvers, each solving p once (AllocsPerRun runs once
		// more to warm up): the mean count of a first solve.
		solvers := make([]*Solver, runs+1)
		states := make([]State, runs+1)
		for k := range solvers {
			solvers[k] = NewSolver(l)
			states[k].size(l.l)
		}
		k := 0
		a := testing.AllocsPerRun(runs, func() {
			_ = solvers[k].Solve(p, &states[k])
			k++
		})
		s := solvers[0]
		systems := 0
		for k := range s.cache {
			if s.cache[k].used {
				systems++
			}
		}
		if systems == 0 || a > float64(6*systems) {
			t.Errorf("point %d: a fresh solver's first solve allocates %v times for %d factored systems", i, a, systems)
		}
		st := &states[0]
		if a := testing.AllocsPerRun(3, func() { _ = s.Solve(p, st) }); a != 0 {
			t.Errorf("point %d: a repeated solve allocates %v times", i, a)
		}
	}
}

// BenchmarkNewSolver builds a solver for the lossy benchmark layout: what
// a design search pays per candidate before its first point.
func BenchmarkNewSolver(b *testing.B) {
	l := benchLayout(b, true)
	b.ReportAllocs()
	for b.Loop() {
		_ = NewSolver(l)
	}
}

// TestLimitErrorText: the allocation-lean LimitError.Error gives the text
// of the plain format, and never repeats its cause.
func TestLimitErrorText(t *testing.T) {
	for _, e := range []*LimitError{
		{Element: "hydrostat", Quantity: "high-line pressure", Value: units.Of(units.Bar(530)), Bound: "relief setting", Limit: units.Of(units.Bar(500)), Err: ErrInfeasible},
		{Element: "range 1", Quantity: "output speed", Value: units.Of(units.RadPerSec(123.456789)), Limit: units.Of(units.RadPerSec(100)), Err: ErrInfeasible},
		{Element: "hydrostat", Quantity: "motor setting", Value: units.Plain(-0.125), Bound: "schedule's minimum motor setting", Limit: units.Plain(0.2), Err: ErrUnreachable,
			Cause: &hydrostat.LimitError{Quantity: "motor setting", Value: units.Plain(-0.125), Limit: units.Plain(0.2), Err: hydrostat.ErrSettingLimit}},
		{Element: "x", Quantity: "y", Value: units.Plain(math.Inf(1)), Limit: units.Plain(0)},
	} {
		bound, dir := e.Bound, "above"
		if bound == "" {
			bound = "limit"
		}
		if e.Value.SI < e.Limit.SI {
			dir = "below"
		}
		want := fmt.Sprintf("%v: %s: %s %v %s %s %v", e.Err, e.Element, e.Quantity, e.Value, dir, bound, e.Limit)
		if got := e.Error(); got != want {
			t.Errorf("got %q, want %q", got, want)
		}
	}
}

// TestSlabErrorsKept checks that the errors a Solver returns from its slabs
// stay as they were returned: the infeasible points of a map-like sweep in
// a row (unit speed, relief and setting limits), each error kept, none
// changed by the later ones.
func TestSlabErrorsKept(t *testing.T) {
	t.Parallel()
	s := NewSolver(benchLayout(t, true))
	var st State
	type kept struct {
		err  error
		copy LimitError
		hl   hydrostat.LimitError // the cause's copy, if a loop limit
	}
	var all []kept
	settings := 0
	for k := range 1000 {
		p := Point{Range: 1, Input: units.RPM(2000),
			Outputs: []OutputDemand{{Speed: units.RPM(300 + 24*float64(k%50)), Torque: units.NewtonMetres(-1500 + 90*float64(k/50))}},
			PTO:     []units.Torque{0}}
		err := s.Solve(p, &st)
		if err == nil {
			continue
		}
		le, ok := errors.AsType[*LimitError](err)
		if !ok {
			t.Fatalf("point %d: %v, want a *LimitError", k, err)
		}
		c := kept{err: err, copy: *le}
		if hl, ok := errors.AsType[*hydrostat.LimitError](le.Cause); ok {
			c.hl = *hl
			if errors.Is(hl, hydrostat.ErrSettingLimit) {
				settings++
			}
		}
		all = append(all, c)
	}
	if len(all) < 3*slabSize || settings < slabSize+1 {
		t.Fatalf("%d errors, %d setting limits: too few to fill several slabs", len(all), settings)
	}
	seen := map[*LimitError]bool{}
	for k, c := range all {
		le, _ := errors.AsType[*LimitError](c.err)
		if seen[le] {
			t.Fatalf("error %d: %p returned twice", k, le)
		}
		seen[le] = true
		if *le != c.copy {
			t.Errorf("error %d changed after it was returned: %+v, was %+v", k, *le, c.copy)
		}
		if hl, ok := errors.AsType[*hydrostat.LimitError](le.Cause); ok && *hl != c.hl {
			t.Errorf("cause of error %d changed: %+v, was %+v", k, *hl, c.hl)
		}
	}
}

// TestLimitErrorIsAllocatesNothing: errors.Is on a *LimitError finds its
// sentinels and its cause's, and tells other sentinels apart, without
// allocating (a search asks it of every point it refuses).
func TestLimitErrorIsAllocatesNothing(t *testing.T) {
	var err error = &LimitError{Element: "hydrostat", Quantity: "motor setting", Value: units.Plain(1.2), Limit: units.Plain(1),
		Err: ErrUnreachable, Cause: &hydrostat.LimitError{Quantity: "motor setting", Err: hydrostat.ErrSettingLimit}}
	for _, c := range []struct {
		target error
		want   bool
	}{
		{ErrUnreachable, true}, {ErrInfeasible, true}, {hydrostat.ErrSettingLimit, true},
		{ErrInput, false}, {ErrSingular, false}, {hydrostat.ErrPressureLimit, false},
	} {
		if got := errors.Is(err, c.target); got != c.want {
			t.Errorf("errors.Is(err, %v) = %v, want %v", c.target, got, c.want)
		}
		if a := testing.AllocsPerRun(10, func() { _ = errors.Is(err, c.target) }); a != 0 {
			t.Errorf("errors.Is(err, %v) allocates %v times", c.target, a)
		}
	}
	var le *LimitError
	if !errors.As(err, &le) || le.Err != ErrUnreachable {
		t.Errorf("errors.As: %v", le)
	}
	var hl *hydrostat.LimitError
	if !errors.As(err, &hl) || hl.Err != hydrostat.ErrSettingLimit {
		t.Errorf("errors.As the cause: %v", hl)
	}
}
