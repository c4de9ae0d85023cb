package vehicle_test

import (
	"errors"
	"math"
	"testing"
	"time"

	"pgregory.net/rapid"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// genVehicle draws a valid vehicle directly (no filtering).
func genVehicle() *rapid.Generator[*vehicle.Vehicle] {
	return rapid.Custom(func(t *rapid.T) *vehicle.Vehicle {
		spec := demoEngineSpec()
		k := rapid.Float64Range(0.5, 2).Draw(t, "engine scale")
		for i := range spec.CurveTorques {
			spec.CurveTorques[i] = units.Torque(k * float64(spec.CurveTorques[i]))
		}
		if rapid.Bool().Draw(t, "fuel map") {
			m := demoMap()
			for i := range m.Torques {
				m.Torques[i] = units.Torque(k * float64(m.Torques[i]))
			}
			spec.Map = m
		}
		e, err := vehicle.NewEngine(spec)
		if err != nil {
			t.Fatalf("engine: %v", err)
		}
		var tr vehicle.Transmission
		if rapid.Bool().Draw(t, "layout of the root package") {
			tr = genLayoutDrive(t)
		} else {
			est := &vehicle.SplitEstimate{
				Spans:                 []vehicle.SplitRange{{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5}},
				MechanicalEfficiency:  rapid.Float64Range(0.9, 0.99).Draw(t, "eta mech"),
				HydrostaticEfficiency: rapid.Float64Range(0.7, 0.9).Draw(t, "eta hydro"),
				NoLoadLoss:            units.Kilowatts(rapid.Float64Range(0, 3).Draw(t, "no-load kW")),
			}
			if rapid.Bool().Draw(t, "second range") {
				est.Spans = append(est.Spans, vehicle.SplitRange{MinRatio: 0.5, MaxRatio: 2, MechanicalPoint: 1.3})
			}
			tr = est
		}
		m := units.Tonnes(rapid.Float64Range(3, 15).Draw(t, "mass t"))
		v, err := vehicle.New(vehicle.Spec{
			Mass:         m,
			RotatingMass: units.Mass(rapid.Float64Range(0, 0.05).Draw(t, "rotating share") * float64(m)),
			DragArea:     units.SquareMetres(rapid.Float64Range(0, 6).Draw(t, "drag area")),
			Tyres: vehicle.SlipCurve{Weight: units.ForceFromMass(m, units.Gravity), Radius: units.Metres(0.85),
				Rolling:      rapid.Float64Range(0.01, 0.1).Draw(t, "rolling"),
				PeakTraction: rapid.Float64Range(0.6, 1).Draw(t, "peak traction"),
				SlipRate:     rapid.Float64Range(5, 20).Draw(t, "slip rate")},
			Transmission: tr,
			FinalDrive:   rapid.Float64Range(15, 25).Draw(t, "final drive"),
			Engine:       e,
			PTO:          vehicle.PTO{Ratios: []float64{3.5, 1.9}},
		})
		if err != nil {
			t.Fatalf("vehicle: %v", err)
		}
		return v
	})
}

// genLayoutDrive draws a real layout of the root package (an output-coupled
// or input-coupled split with two ranges, or a pure hydrostatic drive) with
// invented, round unit sizes and loss coefficients, solved by the root
// package's solver through vehicle.FromLayout. Output speeds of 0 to about
// 1.2 × engine speed are reachable in some range (checked by the share of
// feasible draws below).
func genLayoutDrive(t *rapid.T) vehicle.Transmission {
	wil := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5,
		Friction: rapid.Float64Range(0.005, 0.02).Draw(t, "friction coefficient"), ConstantPressure: units.Bar(1)}
	cc := rapid.Float64Range(80, 160).Draw(t, "unit cc")
	mk := func() hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(480), Loss: wil})
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	lp, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: mk(), Motors: []hydrostat.Unit{mk()},
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(480)})
	if err != nil {
		t.Fatal(err)
	}
	set, err := planetary.FromRatio(rapid.Float64Range(-3, -2).Draw(t, "i0"), rapid.Float64Range(0.97, 0.99).Draw(t, "eta0"))
	if err != nil {
		t.Fatal(err)
	}
	var l powersplit.Layout
	switch kind := rapid.IntRange(0, 2).Draw(t, "layout kind"); kind {
	case 0:
		l, err = powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8,
			Ranges: []powersplit.RangeGear{{Ratio: 0.45}, {Ratio: 0.85}}})
	case 1:
		l, err = powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: lp, PumpRatio: 1.1,
			Ranges: []powersplit.RangeGear{{Ratio: 0.6}, {Ratio: 1.1}}})
	default:
		l, err = powersplit.PureHydrostatic(powersplit.PureHydrostaticSpec{Loop: lp, PumpRatio: 1.2,
			Ranges: []powersplit.RangeGear{{Ratio: 0.5}, {Ratio: 1}}})
	}
	if err != nil {
		t.Fatal(err)
	}
	d, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// infeasible reports whether err is one of the documented kinds of an
// operating point the vehicle cannot run (as opposed to a bug or bad input).
func infeasible(err error) bool {
	for _, k := range []error{vehicle.ErrInfeasible, vehicle.ErrEngineLimit, vehicle.ErrTraction,
		vehicle.ErrStability, vehicle.ErrTransmission, vehicle.ErrPTOLimit} {
		if errors.Is(err, k) {
			return true
		}
	}
	return false
}

// genSegment draws a valid segment (it may still be infeasible).
func genSegment() *rapid.Generator[vehicle.Segment] {
	return rapid.Custom(func(t *rapid.T) vehicle.Segment {
		kind := vehicle.Kind(rapid.IntRange(0, 4).Draw(t, "kind"))
		s := vehicle.Segment{Name: kind.String(), Kind: kind,
			Speed: units.KMH(rapid.Float64Range(2, 30).Draw(t, "kmh")),
			Grade: rapid.Float64Range(-0.08, 0.08).Draw(t, "grade")}
		switch kind {
		case vehicle.FieldPass:
			s.Distance = units.Metres(rapid.Float64Range(5, 150).Draw(t, "distance"))
			rows := vehicle.DraftRows()
			s.Implement = &vehicle.Implement{Row: rows[rapid.IntRange(0, len(rows)-1).Draw(t, "row")],
				Width: rapid.Float64Range(0.5, 6).Draw(t, "width"), Depth: units.Centimetres(rapid.Float64Range(5, 25).Draw(t, "depth cm")),
				Texture: vehicle.Texture(rapid.IntRange(0, 2).Draw(t, "texture"))}
			if rapid.Bool().Draw(t, "pto implement") {
				s.Implement.PTOPower = units.Kilowatts(rapid.Float64Range(1, 40).Draw(t, "pto kW"))
				s.Implement.PTOSpeed = rapid.SampledFrom([]units.AngularVelocity{0, vehicle.PTO540, vehicle.PTO1000}).Draw(t, "pto speed")
			}
		case vehicle.HeadlandTurn, vehicle.StationaryPTO:
			s.Duration = time.Duration(rapid.Float64Range(1, 40).Draw(t, "seconds") * 1e9)
			s.PTOPower = units.Kilowatts(rapid.Float64Range(0, 60).Draw(t, "pto kW"))
			s.PTOSpeed = rapid.SampledFrom([]units.AngularVelocity{0, vehicle.PTO540, vehicle.PTO1000}).Draw(t, "pto speed")
		case vehicle.RoadTransfer:
			n := rapid.IntRange(1, 3).Draw(t, "stretches")
			for range n {
				s.Profile = append(s.Profile, vehicle.Stretch{Length: units.Metres(rapid.Float64Range(10, 200).Draw(t, "length")),
					Grade: rapid.Float64Range(-0.1, 0.1).Draw(t, "stretch grade")})
			}
			s.Trailer = vehicle.Trailer{Mass: units.Tonnes(rapid.Float64Range(0, 12).Draw(t, "trailer t")), RollingCoefficient: 0.02}
		case vehicle.Accelerate:
			s.StartSpeed = units.Speed(rapid.Float64Range(0, 0.5).Draw(t, "start share") * float64(s.Speed))
			s.Acceleration = units.Acceleration(rapid.Float64Range(0.1, 1.5).Draw(t, "acceleration"))
			s.Trailer = vehicle.Trailer{Mass: units.Tonnes(rapid.Float64Range(0, 8).Draw(t, "trailer t")), RollingCoefficient: 0.02}
		}
		return s
	})
}

// TestPropertyAuditCloses: the audit of every segment that runs closes, and
// its loss lines are never negative; the residual mechanical line agrees
// with the same loss summed element by element. A segment may fail only
// with a documented infeasibility; at least 60 % of the drawn segments must
// run (about 95 % do).
func TestPropertyAuditCloses(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.6)
	rapid.Check(t, func(t *rapid.T) {
		v := genVehicle().Draw(t, "vehicle")
		cycle := rapid.SliceOfN(genSegment(), 1, 4).Draw(t, "cycle")
		var s vehicle.Strategy = vehicle.LeastFuel{Samples: 8}
		if rapid.Bool().Draw(t, "fixed speed") {
			s = vehicle.FixedSpeed{Speed: units.RPM(rapid.Float64Range(900, 2200).Draw(t, "rpm"))}
		}
		day, err := vehicle.Simulate(v, s, cycle, vehicle.Options{Step: 2 * time.Second})
		if err != nil {
			t.Fatal(err)
		}
		for _, sg := range day.Segments {
			reach.Drew()
			if sg.Err != nil {
				if !infeasible(sg.Err) {
					t.Fatalf("segment %s: error of an undocumented kind: %v", sg.Name, sg.Err)
				}
				continue
			}
			reach.Reached()
			a := sg.Audit
			// The same loss summed two ways agrees to the rounding of the
			// energies summed: relative to the engine's work, or to the
			// loss itself where the engine does no work (a segment driven
			// downhill gave 1.0e-9 J of 5.7 kJ against a bound of 1e-9 J).
			scale := math.Max(math.Abs(float64(a.EngineWork)), math.Abs(float64(a.Mechanical)))
			if gap := math.Abs(float64(a.Mechanical - a.MechanicalByElement)); gap > 1e-6*scale+1e-9 {
				t.Fatalf("segment %s: mechanical loss %v by closure, %v by element (gap %g J, engine work %g J)", sg.Name, a.Mechanical, a.MechanicalByElement, gap, float64(a.EngineWork))
			}
			if r := a.RelativeResidual(); !(r <= 1e-6) {
				t.Fatalf("segment %s: residual %g, audit %+v", sg.Name, r, a)
			}
			for name, x := range map[string]units.Energy{"engine loss": a.EngineLoss, "hydrostatic": a.Hydrostatic,
				"mechanical": a.Mechanical, "slip": a.Slip, "rolling": a.Rolling, "brake": a.Brake, "fuel": a.FuelEnergy} {
				if !(x >= 0) || math.IsInf(float64(x), 0) {
					t.Fatalf("segment %s: %s = %v", sg.Name, name, x)
				}
			}
		}
		if r := day.Audit.RelativeResidual(); !(r <= 1e-6) {
			t.Fatalf("day residual %g", r)
		}
	})
}

// genDemand draws a travelling field demand.
func genDemand(t *rapid.T) vehicle.Demand {
	return vehicle.Demand{
		Speed: units.KMH(rapid.Float64Range(2, 25).Draw(t, "kmh")),
		Draft: units.Kilonewtons(rapid.Float64Range(0, 40).Draw(t, "draft kN")),
		Grade: rapid.Float64Range(-0.05, 0.05).Draw(t, "grade"),
	}
}

// TestPropertyLeastFuelBeatsFixedSpeed: where a fixed engine speed runs a
// demand, the least-fuel strategy runs it too, on no more fuel. Skipped only
// where the fixed speed is infeasible (a documented kind); at least 50 % of
// the draws must reach the comparison (about 80 % do).
func TestPropertyLeastFuelBeatsFixedSpeed(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.5)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		v := genVehicle().Draw(t, "vehicle")
		d := genDemand(t)
		w := units.RPM(rapid.Float64Range(800, 2300).Draw(t, "fixed rpm"))
		fixed, err := vehicle.FixedSpeed{Speed: w}.Operate(v, d)
		if infeasible(err) {
			t.Skip("fixed speed infeasible")
		} else if err != nil {
			t.Fatalf("fixed speed: %v", err)
		}
		reach.Reached()
		least, err := vehicle.LeastFuel{}.Operate(v, d)
		if err != nil {
			t.Fatalf("least fuel infeasible where fixed speed %v is feasible: %v", w, err)
		}
		// The refinement tolerance allows 1e-6 relative.
		if float64(least.FuelRate) > float64(fixed.FuelRate)*(1+1e-6) {
			t.Fatalf("least fuel %v at %v > fixed %v at %v", least.FuelRate, least.EngineSpeed, fixed.FuelRate, w)
		}
	})
}

// TestPropertyFuelMonotoneInPull: at a fixed engine speed more pull never
// takes less fuel, and a larger pull is never feasible where a smaller one
// is not. Skipped only on documented infeasibility; at least 50 % of the
// draws must reach the comparison (about 80 % do).
func TestPropertyFuelMonotoneInPull(t *testing.T) {
	t.Parallel()
	var reach testutil.Reach
	defer reach.Check(t, 0.5)
	rapid.Check(t, func(t *rapid.T) {
		reach.Drew()
		v := genVehicle().Draw(t, "vehicle")
		d := genDemand(t)
		s := vehicle.FixedSpeed{Speed: units.RPM(rapid.Float64Range(1000, 2200).Draw(t, "rpm"))}
		extra := units.Kilonewtons(rapid.Float64Range(0, 10).Draw(t, "extra kN"))
		p1, err1 := s.Operate(v, d)
		d.Draft += extra
		p2, err2 := s.Operate(v, d)
		if err2 == nil && err1 != nil {
			t.Fatalf("a larger pull is feasible but the smaller is not: %v", err1)
		}
		for _, err := range []error{err1, err2} {
			if err != nil && !infeasible(err) {
				t.Fatalf("error of an undocumented kind: %v", err)
			}
		}
		if err1 != nil || err2 != nil {
			t.Skip("infeasible")
		}
		reach.Reached()
		if float64(p2.FuelRate) < float64(p1.FuelRate)*(1-1e-12) {
			t.Fatalf("fuel %v at the larger pull < %v", p2.FuelRate, p1.FuelRate)
		}
	})
}

func FuzzSimulate(f *testing.F) {
	f.Add(0, 8.0, 100.0, 10.0, 0.0, 3.0, 0.0, 0.0)
	f.Add(2, 30.0, 500.0, 0.0, 0.05, 0.0, 8.0, 0.0)
	f.Add(3, 0.0, 0.0, 60.0, 0.0, 0.0, 0.0, 40.0)
	f.Add(4, 20.0, 0.0, 0.0, 0.02, 0.0, 5.0, 0.0)
	f.Add(1, -1.0, math.NaN(), math.Inf(1), 2.0, -3.0, -1.0, -5.0)
	v := demoVehicle(f, false)
	f.Fuzz(func(t *testing.T, kind int, kmh, dist, secs, grade, width, trailerT, ptoKW float64) {
		s := vehicle.Segment{Kind: vehicle.Kind(kind), Speed: units.KMH(kmh), StartSpeed: units.KMH(kmh / 3),
			Acceleration: 0.5, Distance: units.Metres(dist), Grade: grade,
			Duration: time.Duration(math.Max(math.Min(secs, 1e6), -1e6) * 1e9),
			Trailer:  vehicle.Trailer{Mass: units.Tonnes(trailerT), RollingCoefficient: 0.02},
			Profile:  []vehicle.Stretch{{Length: units.Metres(dist), Grade: grade}},
			PTOPower: units.Kilowatts(ptoKW), PTOSpeed: vehicle.PTO540}
		if width != 0 {
			s.Implement = &vehicle.Implement{Row: vehicle.TandemDiskSecondary, Width: width, Depth: units.Centimetres(10)}
		}
		day, err := vehicle.Simulate(v, vehicle.LeastFuel{Samples: 6}, []vehicle.Segment{s}, vehicle.Options{Step: 5 * time.Second, MaxSteps: 2000})
		if err != nil {
			if !errors.Is(err, vehicle.ErrInvalid) && !errors.Is(err, vehicle.ErrEmptyCycle) {
				t.Fatalf("unexpected error kind: %v", err)
			}
			return
		}
		a := day.Audit
		if math.IsNaN(float64(a.FuelEnergy)) || math.IsInf(float64(a.FuelEnergy), 0) || math.IsNaN(a.RelativeResidual()) {
			t.Fatalf("non-finite audit %+v", a)
		}
		if day.Segments[0].Err == nil && a.RelativeResidual() > 1e-6 {
			t.Fatalf("residual %g", a.RelativeResidual())
		}
		if day.Segments[0].Err == nil && math.Abs(float64(a.Mechanical-a.MechanicalByElement)) > 1e-6*math.Abs(float64(a.EngineWork))+1e-9 {
			t.Fatalf("mechanical loss %v by closure, %v by element", a.Mechanical, a.MechanicalByElement)
		}
		if err := day.Segments[0].Err; err != nil && !infeasible(err) && !errors.Is(err, vehicle.ErrInvalid) {
			t.Fatalf("segment error of no documented kind: %v", err)
		}
	})
}

func FuzzNewEngine(f *testing.F) {
	f.Add(800.0, 2100.0, 2300.0, 600.0, 900.0, 300.0, 800.0, false)
	f.Add(800.0, 2100.0, 2300.0, 600.0, 900.0, 300.0, 800.0, true)
	f.Add(0.0, -1.0, math.NaN(), 0.0, math.Inf(1), -3.0, 0.0, true)
	f.Fuzz(func(t *testing.T, lo, rated, hi, t0, t1, t2, idle float64, withMap bool) {
		s := vehicle.EngineSpec{
			CurveSpeeds:  []units.AngularVelocity{units.RPM(lo), units.RPM((lo + hi) / 2), units.RPM(hi)},
			CurveTorques: []units.Torque{units.Torque(t0), units.Torque(t1), units.Torque(t2)},
			Idle:         units.RPM(idle), Rated: units.RPM(rated),
		}
		if withMap {
			s.Map = demoMap()
		}
		e, err := vehicle.NewEngine(s)
		if err != nil {
			if !errors.Is(err, vehicle.ErrInvalid) {
				t.Fatalf("error kind: %v", err)
			}
			return
		}
		w := e.Rated()
		tq, err := e.MaxTorque(w)
		if err != nil {
			t.Fatalf("MaxTorque(rated): %v", err)
		}
		m, err := e.FuelRate(w, tq/2)
		if err == nil && (math.IsNaN(float64(m)) || math.IsInf(float64(m), 0) || m < 0) {
			t.Fatalf("fuel %v", m)
		}
		// More torque at the same speed never burns less fuel.
		if full, err2 := e.FuelRate(w, tq); err == nil && err2 == nil && full < m {
			t.Fatalf("fuel %v at full torque %v < %v at half", full, tq, m)
		}
	})
}
