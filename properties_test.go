package powersplit

import (
	"errors"
	"math"
	"testing"

	"github.com/google/go-cmp/cmp"
	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
)

// A propCase is a random valid layout of one builder and a random point
// inside a range's reachable speed interval.
type propCase struct {
	kind string
	l    Layout
	p    Point
}

func genWilson(t *rapid.T) hydrostat.Wilson {
	k := rapid.Float64Range(0, 2).Draw(t, "loss scale")
	return hydrostat.Wilson{Slip: k * 1e-9, Viscous: k * 2e5, Friction: k * 0.01, ConstantPressure: units.Bar(k)}
}

func genLoop(t *rapid.T, motors int) hydrostat.Loop {
	lossy := rapid.Bool().Draw(t, "lossy units")
	var lm hydrostat.LossModel
	if lossy {
		lm = genWilson(t)
	}
	mk := func(label string) hydrostat.Unit {
		cc := rapid.Float64Range(40, 160).Draw(t, label+" cc/rev")
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc), Loss: lm,
			MaxSpeed: units.RPM(rapid.Float64Range(2500, 5000).Draw(t, label+" max rpm"))})
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	pump := mk("pump")
	ms := make([]hydrostat.Unit, motors)
	for i := range ms {
		ms[i] = mk("motor")
	}
	l, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: ms, Oil: hydrostat.VG46,
		Temperature: units.Celsius(rapid.Float64Range(30, 90).Draw(t, "oil °C")), Charge: units.Bar(20), Relief: units.Bar(2000)})
	if err != nil {
		t.Fatal(err)
	}
	return l
}

func genRanges(t *rapid.T, variator bool) []RangeGear {
	n := rapid.IntRange(1, 3).Draw(t, "ranges")
	out := make([]RangeGear, n)
	for i := range out {
		out[i] = RangeGear{Ratio: rapid.Float64Range(0.1, 0.7).Draw(t, "range ratio")}
		if variator {
			out[i].FromVariator = rapid.Bool().Draw(t, "from variator")
			if out[i].FromVariator {
				out[i].Ratio = rapid.Float64Range(0.03, 0.3).Draw(t, "variator range ratio")
			}
		}
	}
	return out
}

func genPTOs(t *rapid.T) []PTOSpec {
	if !rapid.Bool().Draw(t, "with PTO") {
		return nil
	}
	return []PTOSpec{{Ratio: rapid.Float64Range(0.25, 0.55).Draw(t, "PTO ratio")}}
}

func genLayout(t *rapid.T) (string, Layout) {
	kind := rapid.SampledFrom([]string{"output-coupled", "input-coupled", "pure", "pure two motors", "compound"}).Draw(t, "builder")
	eta := rapid.Float64Range(0.94, 1).Draw(t, "gear efficiency")
	eta0 := rapid.Float64Range(0.94, 1).Draw(t, "basic efficiency")
	i0 := rapid.Float64Range(-3.5, -1.6).Draw(t, "i0")
	set := func(i0 float64) (s planetaryT) {
		s, err := planetaryFromRatio(i0, eta0)
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
	var l Layout
	var err error
	switch kind {
	case "output-coupled":
		l, err = OutputCoupled(OutputCoupledSpec{Set: set(i0), Loop: genLoop(t, 1),
			PumpRatio: rapid.Float64Range(0.4, 1.2).Draw(t, "pump ratio"), MotorRatio: rapid.Float64Range(0.5, 1.5).Draw(t, "motor ratio"),
			Ranges: genRanges(t, true), GearEfficiency: eta, PTOs: genPTOs(t)})
	case "input-coupled":
		l, err = InputCoupled(InputCoupledSpec{Set: set(i0), Loop: genLoop(t, 1),
			PumpRatio: rapid.Float64Range(0.8, 1.6).Draw(t, "pump ratio"), InputRatio: rapid.Float64Range(0.7, 1.3).Draw(t, "input ratio"),
			Ranges: genRanges(t, true), GearEfficiency: eta, PTOs: genPTOs(t)})
	case "pure":
		l, err = PureHydrostatic(PureHydrostaticSpec{Loop: genLoop(t, 1), PumpRatio: rapid.Float64Range(0.8, 1.6).Draw(t, "pump ratio"),
			Ranges: genRanges(t, false), GearEfficiency: eta, PTOs: genPTOs(t)})
	case "pure two motors":
		l, err = PureHydrostatic(PureHydrostaticSpec{Loop: genLoop(t, 2), PumpRatio: rapid.Float64Range(0.8, 1.6).Draw(t, "pump ratio"),
			Ranges: genRanges(t, false), GearEfficiency: eta, PTOs: genPTOs(t),
			Second: &SecondMotor{Ratio: rapid.Float64Range(0.2, 0.8).Draw(t, "axle 2 ratio"), DeclutchAbove: units.RPM(rapid.Float64Range(100, 2000).Draw(t, "declutch rpm"))}})
	case "compound":
		b := NewBuilder()
		in, out, a, c := b.Shaft("I"), b.Shaft("O"), b.Shaft("A"), b.Shaft("B")
		b.Input("engine", in)
		b.Output("output", out)
		b.Planetary("set 1", set(i0), a, in, out)
		b.Planetary("set 2", set(rapid.Float64Range(-3.5, -1.6).Draw(t, "i0 2")), c, out, in)
		b.Loop("hydrostat", genLoop(t, 1), c, a)
		l, err = b.Build()
	}
	if err != nil {
		t.Fatalf("%s: %v", kind, err)
	}
	return kind, l
}

// genPoint draws a range, an input speed, a speed inside the range's
// reachable interval and a driving torque.
func genPoint(t *rapid.T, l Layout) Point {
	s := NewSolver(l)
	p := Point{Range: rapid.IntRange(0, l.Ranges()-1).Draw(t, "range"), Input: units.RPM(rapid.Float64Range(900, 2300).Draw(t, "engine rpm")),
		Outputs: make([]OutputDemand, len(l.l.outputs))}
	for i := range p.Outputs {
		p.Outputs[i].Speed = units.RPM(1) // proportional template: all outputs alike
	}
	if len(l.l.ptos) > 0 {
		p.PTO = []units.Torque{units.NewtonMetres(rapid.Float64Range(0, 400).Draw(t, "PTO N·m"))}
	}
	ivs, err := s.Interval(p)
	if errors.Is(err, ErrInfeasible) {
		t.Skipf("range reaches nothing: %v", err) // documented: no speed of the range is feasible
	}
	if err != nil {
		t.Fatalf("Interval: %v", err)
	}
	iv := ivs[rapid.IntRange(0, len(ivs)-1).Draw(t, "interval")]
	lo, hi := iv.Lo, iv.Hi
	v := float64(lo) + (float64(hi)-float64(lo))*rapid.Float64Range(0.02, 0.98).Draw(t, "place in interval")
	for i := range p.Outputs {
		p.Outputs[i].Speed = units.AngularVelocity(v)
	}
	tq := rapid.Float64Range(10, maxTorque).Draw(t, "output N·m")
	p.Outputs[0].Torque = units.NewtonMetres(math.Copysign(tq, v))
	return p
}

var maxTorque = 2000.0

func genCase(t *rapid.T) propCase {
	kind, l := genLayout(t)
	return propCase{kind: kind, l: l, p: genPoint(t, l)}
}

// kinematicResidual returns max |K·ω − B·g| / max|ω| over the constraint
// rows of the state's range.
func kinematicResidual(l Layout, st *State, p Point) float64 {
	k, bm := l.l.kinematic(&l.l.ranges[st.Range])
	rows, S := k.Dims()
	g := make([]float64, 1+len(p.Outputs))
	g[0] = float64(p.Input)
	for i, o := range p.Outputs {
		g[1+i] = float64(o.Speed)
	}
	scale := 0.0
	for _, sh := range st.Shafts {
		scale = math.Max(scale, math.Abs(float64(sh.Speed)))
	}
	worst := 0.0
	for i := 0; i < rows; i++ {
		r := 0.0
		for s := 0; s < S; s++ {
			r += k.At(i, s) * float64(st.Shafts[s].Speed)
		}
		for j := range g {
			r -= bm.At(i, j) * g[j]
		}
		worst = math.Max(worst, math.Abs(r))
	}
	if scale == 0 {
		return worst
	}
	return worst / scale
}

// TestPropertyConservation: on random layouts of every builder at random
// points inside a range's reachable interval, every element's ports take its
// loss, losses are never negative, the layout conserves power and the
// kinematic constraints hold. A draw is skipped only on the documented
// infeasibility (ErrInfeasible, ErrSelfLocking); at least 60 % of all draws
// must reach the balance checks.
func TestPropertyConservation(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.6)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		c := rapid.Custom(genCase).Draw(t, "layout and point")
		s := NewSolver(c.l)
		var st State
		err := s.Solve(c.p, &st)
		if errors.Is(err, ErrInfeasible) || errors.Is(err, ErrSelfLocking) {
			t.Skipf("%s infeasible: %v", c.kind, err)
		}
		if err != nil {
			t.Fatalf("%s: %v", c.kind, err)
		}
		reach.Reached()
		pin, pout, ppto := float64(st.InputPower), float64(st.OutputPower), float64(st.PTOPower)
		loss := 0.0
		// Relative to the powers that flow, with a floor of 1e-3 of the
		// largest port torque at the largest speed (points near standstill).
		scale := math.Abs(pin) + math.Abs(pout) + math.Abs(ppto) + 1e-3*st.powerScale()
		for _, e := range st.Elements {
			if e.Loss < 0 {
				t.Fatalf("%s: %s loss %v < 0", c.kind, e.Name, e.Loss)
			}
			loss += float64(e.Loss)
			if e.Kind == InputKind || e.Kind == OutputKind || e.Kind == FreeOutputKind || e.Kind == PTOKind {
				continue // sources and loads, not transmitting elements
			}
			// Each element: power in over its ports = its loss.
			sum := 0.0
			for _, p := range e.Ports {
				sum += float64(p.Power)
			}
			if math.Abs(sum-float64(e.Loss)) > 1e-9*scale {
				t.Fatalf("%s: %s ports take %g W, loss %v", c.kind, e.Name, sum, e.Loss)
			}
		}
		if r := math.Abs(pin - pout - ppto - loss); r > 1e-9*scale {
			t.Fatalf("%s: power balance residual %g of %g (in %v out %v PTO %v loss %g)", c.kind, r/scale, scale, st.InputPower, st.OutputPower, st.PTOPower, loss)
		}
		if r := kinematicResidual(c.l, &st, c.p); r > 1e-12 {
			t.Fatalf("%s: kinematic residual %g", c.kind, r)
		}
		if pin > 0 && pout+ppto > 0 && !(st.Efficiency > 0 && st.Efficiency <= 1) {
			t.Fatalf("%s: efficiency %g", c.kind, st.Efficiency)
		}
		var again State
		if err := s.Solve(c.p, &again); err != nil {
			t.Fatal(err)
		}
		if d := cmp.Diff(st, again, cmp.AllowUnexported(State{})); d != "" {
			t.Fatalf("%s: second solve differs:\n%s", c.kind, d)
		}
		fresh := NewSolver(c.l)
		if err := fresh.Solve(c.p, &again); err != nil {
			t.Fatal(err)
		}
		if d := cmp.Diff(st, again, cmp.AllowUnexported(State{})); d != "" {
			t.Fatalf("%s: solve on a fresh solver differs:\n%s", c.kind, d)
		}
	})
}

// TestPropertyMirror: the pure hydrostatic drive is symmetric, so driving
// backwards with the opposite torque mirrors the state: equal powers,
// losses and pressure magnitude, opposite settings.
//
// A draw is skipped only on the documented infeasibility (ErrInfeasible,
// ErrSelfLocking); at least 60 % of the draws must reach the comparison.
func TestPropertyMirror(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.6)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		l, err := PureHydrostatic(PureHydrostaticSpec{Loop: genLoop(t, 1), PumpRatio: rapid.Float64Range(0.8, 1.6).Draw(t, "pump ratio"),
			Ranges: genRanges(t, false), GearEfficiency: rapid.Float64Range(0.94, 1).Draw(t, "gear efficiency")})
		if err != nil {
			t.Fatal(err)
		}
		p := genPoint(t, l)
		s := NewSolver(l)
		var fw, rv State
		if err := s.Solve(p, &fw); errors.Is(err, ErrInfeasible) || errors.Is(err, ErrSelfLocking) {
			t.Skipf("infeasible: %v", err)
		} else if err != nil {
			t.Fatalf("forward: %v", err)
		}
		reach.Reached()
		q := p
		q.Outputs = []OutputDemand{{Speed: -p.Outputs[0].Speed, Torque: -p.Outputs[0].Torque}}
		if err := s.Solve(q, &rv); err != nil {
			t.Fatalf("reverse: %v", err)
		}
		near := func(name string, a, b float64) {
			if math.Abs(a-b) > 1e-9*math.Max(math.Abs(a), 1) {
				t.Fatalf("%s: forward %g, reverse %g", name, a, b)
			}
		}
		near("input power", float64(fw.InputPower), float64(rv.InputPower))
		near("output power", float64(fw.OutputPower), float64(rv.OutputPower))
		near("loss", float64(fw.Loss), float64(rv.Loss))
		near("|pressure|", math.Abs(float64(fw.Loops[0].Pressure)), math.Abs(float64(rv.Loops[0].Pressure)))
		near("pump setting", fw.Loops[0].Pump.Setting, -rv.Loops[0].Pump.Setting)
		near("hydraulic power", float64(fw.Loops[0].HydraulicPower), float64(rv.Loops[0].HydraulicPower))
		// The share divides by the input power: at a point that takes almost
		// none (an output stalled against its torque, 6e-8 W of losses) it is
		// a ratio of rounding errors, so compare it where power flows.
		if math.Abs(float64(fw.InputPower)) > 1 {
			near("share", fw.HydraulicShare, rv.HydraulicShare)
		}
	})
}
