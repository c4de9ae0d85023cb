package design

import (
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"
	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/internal/solvepath"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// demoSpace is a three-range input-coupled split around the test file's
// design.
func demoSpace() Space {
	return Space{Name: "test three-range input-coupled split", Params: []Param{
		{Name: ParamFixedCarrierRatio, Lo: -3.5, Hi: -1.8},
		{Name: ParamPumpRatio, Lo: 0.8, Hi: 1.5},
		{Name: ParamPumpDisplacement, Lo: 60, Hi: 140},
		{Name: ParamMotorDisplacement, Lo: 60, Hi: 140},
		{Name: "range1", Lo: 0.12, Hi: 0.25},
		{Name: "range2", Lo: 0.3, Hi: 0.55},
		{Name: "range3", Lo: 0.8, Hi: 1.2},
		{Name: ParamFinalDrive, Lo: 11, Hi: 16},
	}}
}

func demoFile(t testing.TB) *File {
	t.Helper()
	f, err := Load(filepath.Join("testdata", "tractor.json"))
	if err != nil {
		t.Fatal(err)
	}
	f.Requirements.Standstill = false
	return f
}

// TestReportMarginsAtBinding (property): over candidates of the space, the
// unit-speed check's margin is what the solver gives at the check's binding
// point, and the pull check's is the tractive-effort diagram's at its own.
func TestReportMarginsAtBinding(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	s := demoSpace()
	draws, speedChecks, pullChecks := 0, 0, 0
	defer func() {
		// Most draws must reach both comparisons, or the property is empty.
		if 2*speedChecks < draws || 2*pullChecks < draws {
			t.Errorf("reached %d unit-speed and %d pull comparisons in %d draws, want at least half each", speedChecks, pullChecks, draws)
		}
	}()
	rapid.Check(t, func(t *rapid.T) {
		draws++
		seed := rapid.Uint64Range(0, 1000).Draw(t, "seed")
		i := rapid.IntRange(0, 5000).Draw(t, "index")
		g, err := f.Apply(s, Candidate(s, seed, i))
		if err != nil {
			t.Fatal(err)
		}
		rep, err := g.Check(g.Transmission, g.Requirements)
		if err != nil {
			t.Skip("does not build:", err)
		}
		l, err := g.Transmission.Layout()
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range rep.Checks {
			if c.Binding == nil {
				continue
			}
			b := c.Binding
			switch {
			case c.Name == "unit speeds 2 % below their greatest":
				var st powersplit.State
				out := units.AngularVelocity(float64(b.Speed) * g.Tractor.FinalDrive / float64(g.Tractor.Rear.Tyre.RollingRadius))
				if err := powersplit.NewSolver(l).Solve(powersplit.Point{Range: b.Range, Input: b.Engine,
					Outputs: []powersplit.OutputDemand{{Speed: out}}}, &st); err != nil {
					t.Fatalf("solver at the binding point: %v", err)
				}
				worst := 0.0
				var bind powersplit.Margin
				for _, m := range st.Margins {
					if m.Value.Kind == units.AngularVelocityKind && !m.Unchecked && m.Limit.SI > 0 && m.Value.SI/m.Limit.SI > worst {
						worst, bind = m.Value.SI/m.Limit.SI, m
					}
				}
				speedChecks++
				if want := 1 - worst - g.Requirements.UnitSpeedMargin; math.Abs(c.Margin-want) > 1e-12 {
					t.Fatalf("%s: margin %.15g, solver at %+v gives %.15g", c.Name, c.Margin, *b, want)
				}
				// The words name the solver's margin.
				words := fmt.Sprintf(": %s %s %.0f of %.0f rpm", bind.Element, bind.Quantity,
					units.AngularVelocity(bind.Value.SI).RPM(), units.AngularVelocity(bind.Limit.SI).RPM())
				if !strings.HasSuffix(c.At, words) {
					t.Fatalf("%s: at %q, want it to end in the solver's margin %q", c.Name, c.At, words)
				}
			case len(g.Requirements.Pulls) > 0 && strings.HasPrefix(c.Name, "pull "):
				v, err := g.Vehicle(g.Transmission)
				if err != nil {
					t.Fatal(err)
				}
				gr, _ := g.Ground(g.firstSurface("field"))
				pts, err := TractiveEffort(v, EffortSpec{Speeds: []units.Speed{b.Speed}, Ground: gr})
				if err != nil {
					t.Fatal(err)
				}
				pullChecks++
				want := float64(pts[b.Range].Pull)/float64(g.Requirements.Pulls[0].Pull) - 1
				if math.Abs(c.Margin-want) > 1e-12 {
					t.Fatalf("%s: margin %.15g, diagram at %+v gives %.15g", c.Name, c.Margin, *b, want)
				}
			}
		}
	})
}

// TestSplitSearchDeterministic: the real problem gives identical results
// with one worker and two.
func TestSplitSearchDeterministic(t *testing.T) {
	t.Parallel()
	f := demoFile(t)
	p, err := f.SplitProblem(demoSpace(), nil)
	if err != nil {
		t.Fatal(err)
	}
	n := 24
	if testing.Short() {
		n = 8
	}
	a, err := Explore{Problem: p, Seed: 3, Candidates: n, Workers: 1}.Run()
	if err != nil {
		t.Fatal(err)
	}
	b, err := Explore{Problem: p, Seed: 3, Candidates: n, Workers: 2}.Run()
	if err != nil {
		t.Fatal(err)
	}
	if diff := cmp.Diff(a, b, cmpopts.EquateNaNs()); diff != "" {
		t.Errorf("1 and 2 workers differ:\n%s", diff)
	}
	// The chosen design saves and loads back equal.
	g, err := f.Apply(p.Space, a[0].X)
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "chosen.json")
	if err := g.Save(path); err != nil {
		t.Fatal(err)
	}
	h, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if h.Transmission.Pump.Displacement != g.Transmission.Pump.Displacement || h.Tractor.FinalDrive != g.Tractor.FinalDrive {
		t.Errorf("saved candidate reloads as pump %v, final drive %g; want %v, %g",
			h.Transmission.Pump.Displacement, h.Tractor.FinalDrive, g.Transmission.Pump.Displacement, g.Tractor.FinalDrive)
	}
}

// BenchmarkCandidate measures candidate evaluations per second of the
// three-range split problem (requirements check and duty spectrum), the
// candidates drawn as Explore.Run draws them (one Sampler).
//
// "general" evaluates the same candidates with the layouts solved on the
// general path only (the solver before its compiled path).
func BenchmarkCandidate(b *testing.B) {
	for _, general := range []bool{false, true} {
		name := "compiled"
		if general {
			name = "general"
		}
		b.Run(name, func(b *testing.B) {
			solvepath.General.Store(general)
			defer solvepath.General.Store(false)
			f := demoFile(b)
			p, err := f.SplitProblem(demoSpace(), nil)
			if err != nil {
				b.Fatal(err)
			}
			sampler := NewSampler(p.Space.Free(), 1)
			u := make([]float64, p.Space.Free())
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				p.Evaluate(p.Space.At(sampler.Point(i, u)))
				i++
			}
			b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "candidates/s")
		})
	}
}

// TestScoreFrontMotor: with a front motor, Score's peak pressure is the
// high line's at the least-fuel points as the vehicle runs them, the front
// motor taking its share: the greatest pressure margin of the front
// layout's full State solved again at each point (with the front setting
// and speed the vehicle chose). Solving them on the rear-only layout, with
// the whole torque on the rear motor, is not the same machine (it found
// the test design's ploughing beyond the relief valve).
func TestScoreFrontMotor(t *testing.T) {
	t.Parallel()
	f := parsed(t)
	f.Tractor.FrontMotor = frontMotor()
	cycle, err := f.Cycle()
	if err != nil {
		t.Fatal(err)
	}
	spec, err := Spectrum(cycle)
	if err != nil {
		t.Fatal(err)
	}
	obj, why := f.Score(nil, spec)
	if why != "" {
		t.Fatalf("Score = %q, want a score", why)
	}
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	l, err := f.FrontLayout(f.Transmission)
	if err != nil {
		t.Fatal(err)
	}
	info, _ := l.SecondMotor()
	sv := powersplit.NewSolver(l)
	var st powersplit.State
	peak, points := 0.0, 0
	for _, p := range spec {
		pt, err := vehicle.LeastFuel{}.Operate(v, p.Demand)
		if err != nil {
			t.Fatalf("%s: %v", p.Name, err)
		}
		if pt.Range < 0 {
			continue
		}
		d := pt.Drive
		q := powersplit.Point{Range: pt.Range, Input: pt.EngineSpeed, Outputs: []powersplit.OutputDemand{
			{Speed: d.OutputSpeed, Torque: d.OutputTorque}, {Speed: d.FrontSpeed}}}
		if !d.Declutched {
			q.Settings = []powersplit.MotorSetting{{Loop: info.Loop, Motor: info.Motor, Setting: d.FrontSetting}}
		}
		if err := sv.Solve(q, &st); err != nil {
			t.Fatalf("%s: front layout at the least-fuel point: %v", p.Name, err)
		}
		for _, m := range st.Margins {
			if m.Value.Kind == units.PressureKind {
				peak = math.Max(peak, m.Value.SI)
			}
		}
		points++
	}
	if points == 0 {
		t.Fatal("no spectrum point drives")
	}
	// Solved again by another solver: equal to rounding.
	if got := obj[2]; math.Abs(got-units.Pressure(peak).Bar()) > 1e-9*got {
		t.Errorf("Score peak %.12g bar, the front layout's points give %.12g bar", got, units.Pressure(peak).Bar())
	}
	if relief := f.Transmission.Relief.Bar(); !(obj[2] <= relief) {
		t.Errorf("Score peak %g bar above the relief %g bar at feasible points", obj[2], relief)
	}
}
