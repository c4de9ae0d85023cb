package powersplit

import (
	"errors"
	"math"
	"testing"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

func finiteState(st *State) bool {
	for _, v := range []float64{float64(st.InputPower), float64(st.OutputPower), float64(st.PTOPower), float64(st.Loss),
		float64(st.InputTorque), st.Efficiency, st.HydraulicShare} {
		if bad(v) {
			return false
		}
	}
	for _, e := range st.Elements {
		if bad(float64(e.Loss)) {
			return false
		}
		for _, p := range e.Ports {
			if bad(float64(p.Speed)) || bad(float64(p.Torque)) || bad(float64(p.Power)) {
				return false
			}
		}
	}
	return true
}

// checkSolved checks what every state Solve returns without an error must
// satisfy: finite values, every loss ≥ 0, each element's ports taking its
// loss, the layout's power balance (input = outputs + PTOs + losses) within
// 1e-9 of the powers that flow, and the demanded output speeds.
func checkSolved(t fataler, st *State, p Point) {
	t.Helper()
	if !finiteState(st) {
		t.Fatalf("non-finite state without error: %+v", st)
	}
	pin, pout, ppto := float64(st.InputPower), float64(st.OutputPower), float64(st.PTOPower)
	scale := math.Abs(pin) + math.Abs(pout) + math.Abs(ppto) + 1e-3*st.powerScale()
	loss := 0.0
	for _, e := range st.Elements {
		if e.Loss < 0 {
			t.Fatalf("%s: loss %v < 0", e.Name, e.Loss)
		}
		loss += float64(e.Loss)
		if e.Kind == InputKind || e.Kind == OutputKind || e.Kind == FreeOutputKind || e.Kind == PTOKind {
			continue
		}
		sum := 0.0
		for _, q := range e.Ports {
			sum += float64(q.Power)
		}
		if math.Abs(sum-float64(e.Loss)) > 1e-9*scale {
			t.Fatalf("%s: ports take %g W, loss %v", e.Name, sum, e.Loss)
		}
	}
	if r := math.Abs(pin - pout - ppto - loss); r > 1e-9*scale {
		t.Fatalf("power balance: in %v, out %v, PTO %v, losses %g W (residual %g of %g)", st.InputPower, st.OutputPower, st.PTOPower, loss, r, scale)
	}
	for i, o := range p.Outputs {
		if i < len(st.Outputs) && o.Speed != 0 && math.Abs(float64(st.Outputs[i].Speed-o.Speed)) > 1e-12*maxSpeed(st) {
			t.Fatalf("output %d turns at %v, demanded %v", i, st.Outputs[i].Speed, o.Speed)
		}
	}
}

// fataler is what checkSolved needs of a *testing.T or a *rapid.T.
type fataler interface {
	Helper()
	Fatalf(format string, args ...any)
}

// maxSpeed returns the largest shaft speed magnitude of st, in rad/s.
func maxSpeed(st *State) float64 {
	m := 0.0
	for _, sh := range st.Shafts {
		m = math.Max(m, math.Abs(float64(sh.Speed)))
	}
	return m
}

// knownKind reports whether err is one of the package's documented kinds.
func knownKind(err error) bool {
	for _, k := range []error{ErrInput, ErrInfeasible, ErrNoConvergence, ErrSingular, ErrKinematics, ErrTorques, ErrLayout} {
		if errors.Is(err, k) {
			return true
		}
	}
	return false
}

// FuzzSolve feeds arbitrary operating points to a lossy two-range
// output-coupled split: an error or a finite state, never a panic or NaN.
func FuzzSolve(f *testing.F) {
	f.Add(1, 2000.0, 700.0, 1200.0, 150.0)
	f.Add(0, 2000.0, -200.0, -500.0, 0.0)
	f.Add(0, 0.0, 0.0, 0.0, 0.0)
	f.Add(1, 2000.0, 5000.0, 1e6, 0.0)
	f.Add(2, math.NaN(), 1.0, 1.0, 1.0)
	f.Add(0, 1500.0, math.Inf(1), 1.0, 1.0)
	f.Add(-1, 1500.0, 100.0, 1.0, -1e9)
	lp := makeLoop(f, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(f, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}, PTOs: []PTOSpec{{Ratio: 0.27}}})
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, rng int, in, out, tq, pto float64) {
		s := NewSolver(l)
		var st State
		p := Point{Range: rng, Input: units.RPM(in), Outputs: []OutputDemand{{Speed: units.RPM(out), Torque: units.Torque(tq)}},
			PTO: []units.Torque{units.Torque(pto)}}
		err := s.Solve(p, &st)
		if err != nil {
			if !knownKind(err) {
				t.Fatalf("error of no documented kind: %v", err)
			}
			return
		}
		checkSolved(t, &st, p)
		// The PTO is geared to the engine (ratio 0.27).
		// Kinematics close to rounding of the largest shaft speed.
		if w := 0.27 * float64(p.Input); math.Abs(float64(st.PTOs[0].Speed)-w) > 1e-12*maxSpeed(&st) {
			t.Fatalf("PTO at %v, want 0.27 × %v", st.PTOs[0].Speed, p.Input)
		}
	})
}

// FuzzBuilders feeds arbitrary numbers to the layout builders.
func FuzzBuilders(f *testing.F) {
	f.Add(uint8(0), -2.5, 1.2, 0.8, 0.3, 0.98, 1.0)
	f.Add(uint8(1), -2.5, 1.1, 0.9, 0.6, 0.98, 0.0)
	f.Add(uint8(2), 0.0, 1.1, 0.0, 0.5, 1.0, 300.0)
	f.Add(uint8(3), math.NaN(), math.Inf(1), -1.0, 0.0, 2.0, -1.0)
	f.Add(uint8(1), 1.0, 0.0, 0.0, 0.0, 0.0, 0.0)
	f.Add(uint8(4*7+0), -2.5, 1.2, 0.8, 0.3, 0.98, 1.0)  // output-coupled, Input = Member(7)
	f.Add(uint8(4*4+1), -2.5, 1.1, 0.9, 0.6, 0.98, 0.0)  // input-coupled, Input = Member(4)
	f.Add(uint8(4*63+0), -2.5, 1.2, 0.8, 0.3, 0.98, 1.0) // Member(63)
	lp := makeLoop(f, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson})
	lp2 := makeLoop(f, loopSpec{pumpCC: 100, motorCC: 100, motors: 2})
	// which packs the builder (which%4) and, for the split builders, the
	// input member (which/4 as a planetary.Member; 0 is NoMember, the
	// default layout).
	f.Fuzz(func(t *testing.T, which uint8, i0, r1, r2, r3, eta, extra float64) {
		set, err := planetaryFromRatio(i0, 0.98)
		if err != nil && which%4 < 2 {
			return // the planetary package rejects the ratio
		}
		member := planetary.Member(which / 4)
		var l Layout
		switch which % 4 {
		case 0:
			l, err = OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, PumpRatio: r1, MotorRatio: r2, Ranges: []RangeGear{{Ratio: r3}}, GearEfficiency: eta,
				Input: member})
		case 1:
			l, err = InputCoupled(InputCoupledSpec{Set: set, Loop: lp, PumpRatio: r1, InputRatio: r2, Ranges: []RangeGear{{Ratio: r3}}, GearEfficiency: eta,
				Input: member})
		case 2:
			l, err = PureHydrostatic(PureHydrostaticSpec{Loop: lp, PumpRatio: r1, Ranges: []RangeGear{{Ratio: r3}}, GearEfficiency: eta})
		case 3:
			l, err = PureHydrostatic(PureHydrostaticSpec{Loop: lp2, PumpRatio: r1, Ranges: []RangeGear{{Ratio: r3}}, GearEfficiency: eta,
				Second: &SecondMotor{Ratio: r2, DeclutchAbove: units.RPM(extra)}})
		}
		// A member outside sun, ring and carrier (and the unset default)
		// must be refused, never built into some other transmission.
		switch member {
		case planetary.NoMember, planetary.Sun, planetary.Ring, planetary.Carrier:
		default:
			if which%4 < 2 && !errors.Is(err, ErrInput) {
				t.Fatalf("builder %d with input member %d: error %v, want ErrInput", which%4, int(member), err)
			}
		}
		if err != nil {
			return
		}
		s := NewSolver(l)
		var st State
		p := Point{Input: units.RPM(2000), Outputs: make([]OutputDemand, len(l.Outputs()))}
		p.Outputs[0] = OutputDemand{Speed: units.RPM(100), Torque: 100}
		if err := s.Solve(p, &st); err == nil {
			checkSolved(t, &st, p)
		} else if !knownKind(err) {
			t.Fatalf("error of no documented kind: %v", err)
		}
	})
}

// FuzzSweep feeds arbitrary sweep and map specs: a spec error, or cells
// that are feasible with finite values or carry a reason.
func FuzzSweep(f *testing.F) {
	f.Add(-1, 2000.0, 100.0, 1200.0, 500.0, 0.0, uint8(4))
	f.Add(0, 2000.0, -300.0, 300.0, 0.0, 60e3, uint8(3))
	f.Add(1, math.NaN(), 0.0, 1.0, 1.0, 1.0, uint8(2))
	f.Add(5, 1500.0, 1.0, 1.0, math.Inf(-1), 0.0, uint8(1))
	lp := makeLoop(f, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 4500})
	l, err := OutputCoupled(OutputCoupledSpec{Set: mustSet(f, testI0, 0.98), Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []RangeGear{{Ratio: 0.2}, {Ratio: 0.4}}})
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, rng int, in, from, to, tq, power float64, steps uint8) {
		n := int(steps%6) + 1
		sw, err := l.Sweep(SweepSpec{Range: rng, Input: units.RPM(in), From: units.RPM(from), To: units.RPM(to), Steps: n,
			Torque: units.Torque(tq), Power: units.Power(power), Workers: 2})
		if err == nil {
			for _, c := range sw.Cells() {
				if c.OK && (bad(c.Efficiency) || bad(float64(c.InputPower)) || bad(c.HydraulicShare)) {
					t.Fatalf("non-finite feasible cell %+v", c)
				}
				if !c.OK && c.Reason() == "" {
					t.Fatalf("infeasible cell without reason")
				}
			}
		}
		m, err := l.Map(MapSpec{Range: rng, Input: units.RPM(in), SpeedFrom: units.RPM(from), SpeedTo: units.RPM(to), SpeedSteps: n,
			TorqueFrom: 0, TorqueTo: units.Torque(tq), TorqueSteps: n, Workers: 2})
		if err == nil && (len(m.Torques) != n || len(m.Feasible()) != n) {
			t.Fatalf("%d torques, %d mask rows for %d steps", len(m.Torques), len(m.Feasible()), n)
		}
	})
}

// FuzzSolveLayouts solves random valid layouts of every builder (the
// property tests' generators) at random points, in and far outside their
// ranges: never a panic, never a NaN in the State whether Solve succeeds
// or not, an error of a documented kind, and the power balance within
// 1e-9 (checkSolved) whenever Solve returns nil.
func FuzzSolveLayouts(f *testing.F) {
	f.Fuzz(rapid.MakeFuzz(func(t *rapid.T) {
		_, l := genLayout(t)
		s := NewSolver(l)
		p := Point{Range: rapid.IntRange(-1, l.Ranges()).Draw(t, "range"),
			Input:   units.RPM(rapid.SampledFrom([]float64{-1, 0, 1, 900, 2100, 1e5, 2e5}).Draw(t, "engine rpm class") * rapid.Float64Range(0.5, 1.5).Draw(t, "engine rpm scale")),
			Outputs: make([]OutputDemand, len(l.Outputs()))}
		for i := range p.Outputs {
			p.Outputs[i].Speed = units.RPM(rapid.Float64Range(-3000, 3000).Draw(t, "output rpm"))
		}
		p.Outputs[0].Torque = units.NewtonMetres(rapid.Float64Range(-2e4, 2e4).Draw(t, "output N·m"))
		if len(l.PTOs()) > 0 && rapid.Bool().Draw(t, "PTO load") {
			p.PTO = []units.Torque{units.NewtonMetres(rapid.Float64Range(-500, 2000).Draw(t, "PTO N·m"))}
		}
		st := State{Brief: rapid.Bool().Draw(t, "brief")}
		err := s.Solve(p, &st)
		if !finiteState(&st) || bad(st.Residual) || bad(float64(st.HydrostatLoss)) {
			t.Fatalf("NaN in the State (error %v): %+v", err, st)
		}
		if err != nil {
			if !knownKind(err) {
				t.Fatalf("error of no documented kind: %v", err)
			}
			return
		}
		if st.Brief {
			// The summary's balance: input = outputs + PTOs + losses.
			pin, pout := float64(st.InputPower), float64(st.OutputPower+st.PTOPower)
			scale := math.Abs(pin) + math.Abs(pout) + float64(st.Loss)
			if r := math.Abs(pin - pout - float64(st.Loss)); r > 1e-9*scale+1e-9 {
				t.Fatalf("brief power balance: in %v, out %v, loss %v", st.InputPower, st.OutputPower+st.PTOPower, st.Loss)
			}
			return
		}
		checkSolved(t, &st, p)
	}))
}

// FuzzBuilderMembers builds both split builders with arbitrary member
// values: a value outside sun, ring and carrier (and unset) must be an
// *InputError naming a field that holds such a value; valid members build
// the split they name, or fail with a documented kind (a member given
// twice, one member alone).
func FuzzBuilderMembers(f *testing.F) {
	f.Add(false, 0, 0, 0, 1.2, 0.8)
	f.Add(false, 3, 1, 2, 1.2, 0.8)
	f.Add(true, 2, 1, 3, 1.1, 0.9)
	f.Add(false, 7, 1, 2, 1.2, 0.8)
	f.Add(true, 2, -1, 3, 1.1, 0.9)
	f.Add(false, 3, 1, 1<<40, 1.2, 0.8)
	f.Add(true, 1, 0, 0, 1.1, 0.9)
	set := mustSet(f, testI0, 0.98)
	lp := makeLoop(f, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson})
	f.Fuzz(func(t *testing.T, input bool, a, b, c int, r1, r2 float64) {
		ms := [3]planetary.Member{planetary.Member(a), planetary.Member(b), planetary.Member(c)}
		names := [3]string{"Input", "Pump", "Output"}
		var l Layout
		var err error
		if input {
			names[1] = "Motor"
			l, err = InputCoupled(InputCoupledSpec{Set: set, Loop: lp, PumpRatio: r1, InputRatio: r2, Input: ms[0], Motor: ms[1], Output: ms[2]})
		} else {
			l, err = OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, PumpRatio: r1, MotorRatio: r2, Input: ms[0], Pump: ms[1], Output: ms[2]})
		}
		valid := func(m planetary.Member) bool { return m >= planetary.NoMember && m <= planetary.Carrier }
		if !valid(ms[0]) || !valid(ms[1]) || !valid(ms[2]) {
			var ie *InputError
			if !errors.As(err, &ie) {
				// The ratios are checked first; a bad ratio may come before.
				if errors.Is(err, ErrInput) {
					return
				}
				t.Fatalf("members %v: %v, want an *InputError", ms, err)
			}
			for i, n := range names {
				if ie.Field == n && !valid(ms[i]) {
					return
				}
			}
			if ie.Field == "PumpRatio" || ie.Field == "MotorRatio" || ie.Field == "InputRatio" {
				return
			}
			t.Fatalf("members %v: %v names no invalid member", ms, err)
		}
		if err != nil {
			if !knownKind(err) {
				t.Fatalf("members %v: error of no documented kind: %v", ms, err)
			}
			return
		}
		// Built: it solves a point, or fails with a documented kind.
		var st State
		p := Point{Input: units.RPM(2000), Outputs: []OutputDemand{{Speed: units.RPM(300), Torque: 100}}}
		if err := NewSolver(l).Solve(p, &st); err == nil {
			checkSolved(t, &st, p)
		} else if !knownKind(err) {
			t.Fatalf("members %v: solve error of no documented kind: %v", ms, err)
		}
	})
}
