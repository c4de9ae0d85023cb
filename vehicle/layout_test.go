package vehicle_test

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"slices"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/internal/solvepath"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// demoLayout is a one-range output-coupled split built from invented, round
// numbers (no real machine).
func demoLayout(tb testing.TB) powersplit.Layout {
	tb.Helper()
	wil := hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	mk := func(cc float64) hydrostat.Unit {
		u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(cc),
			RatedPressure: units.Bar(420), PeakPressure: units.Bar(520), Loss: wil})
		if err != nil {
			tb.Fatal(err)
		}
		return u
	}
	lp, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: mk(100), Motors: []hydrostat.Unit{mk(100)},
		Oil: hydrostat.VG46, Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(500)})
	if err != nil {
		tb.Fatal(err)
	}
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		tb.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: lp, PumpRatio: 1.2, MotorRatio: 0.8})
	if err != nil {
		tb.Fatal(err)
	}
	return l
}

func TestFromLayout(t *testing.T) {
	t.Parallel()
	drive, err := vehicle.FromLayout(demoLayout(t))
	if err != nil {
		t.Fatal(err)
	}
	if drive.Ranges() != 1 {
		t.Fatalf("Ranges() = %d, want 1", drive.Ranges())
	}
	we := units.RPM(1800)
	ok := 0
	for _, outRPM := range []float64{300, 900, 1500, 2200} {
		out := units.RPM(outRPM)
		dp, err := drive.Operate(0, we, out, units.NewtonMetres(300))
		if err != nil {
			t.Logf("out %v: %v", out, err)
			continue
		}
		ok++
		pin := float64(dp.InputTorque) * float64(we)
		pout := 300 * float64(out)
		// Hand calculation: conservation, input = output + losses.
		if r := math.Abs(pin-pout-float64(dp.HydrostaticLoss+dp.MechanicalLoss)) / pin; r > 1e-9 {
			t.Errorf("out %v: power balance residual %g", out, r)
		}
		if dp.HydrostaticLoss < 0 || dp.MechanicalLoss < 0 {
			t.Errorf("out %v: negative loss %+v", out, dp)
		}
		if e := dp.Efficiency(we); !(e > 0 && e <= 1) {
			t.Errorf("out %v: efficiency %g", out, e)
		}
	}
	if ok < 2 {
		t.Fatalf("only %d of 4 points solved", ok)
	}
	if _, err := drive.Operate(3, we, units.RPM(100), 10); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("Operate(range 3) error = %v, want ErrInvalid", err)
	}
}

func TestLayoutVehicleCycle(t *testing.T) {
	t.Parallel()
	drive, err := vehicle.FromLayout(demoLayout(t))
	if err != nil {
		t.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{
		Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: drive,
		FinalDrive: 20, Engine: demoEngine(t, true),
	})
	if err != nil {
		t.Fatal(err)
	}
	cycle := []vehicle.Segment{
		{Name: "start", Kind: vehicle.Accelerate, Speed: units.KMH(6), Acceleration: 0.5},
		{Name: "cultivate", Kind: vehicle.FieldPass, Speed: units.KMH(6), Distance: units.Metres(50),
			Implement: &vehicle.Implement{Row: vehicle.FieldCultivatorSecondary, Width: 20, Texture: vehicle.Medium, Depth: units.Centimetres(10)}},
	}
	day, err := vehicle.Simulate(v, vehicle.LeastFuel{Samples: 12}, cycle, vehicle.Options{Step: 2e9})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range day.Segments {
		if s.Err != nil {
			t.Errorf("segment %s: %v", s.Name, s.Err)
			continue
		}
		if r := s.Audit.RelativeResidual(); r > 1e-6 {
			t.Errorf("segment %s: audit residual %g", s.Name, r)
		}
		if s.Audit.Hydrostatic <= 0 {
			t.Errorf("segment %s: hydrostatic loss %v, want > 0", s.Name, s.Audit.Hydrostatic)
		}
		checkMechanicalLine(t, s.Name, s.Audit)
	}
	t.Logf("%+v", day.Audit)
}

// A locked range at the mechanical point: the least-fuel strategy runs it
// at the one engine speed that gives the travel speed, where no power
// passes the hydrostat.
func TestLockedRangeStrategy(t *testing.T) {
	t.Parallel()
	set, err := planetary.FromRatio(-2.5, 0.98)
	if err != nil {
		t.Fatal(err)
	}
	u, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: units.CCPerRev(110), MaxSpeed: units.RPM(4000),
		Loss: hydrostat.Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}})
	if err != nil {
		t.Fatal(err)
	}
	loop, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: u, Motors: []hydrostat.Unit{u}, Oil: hydrostat.VG46,
		Temperature: units.Celsius(60), Charge: units.Bar(20), Relief: units.Bar(450)})
	if err != nil {
		t.Fatal(err)
	}
	l, err := powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop, PumpRatio: 1.2, MotorRatio: 0.8,
		Ranges: []powersplit.RangeGear{{Name: "split", Ratio: 0.5}, {Name: "locked", Ratio: 0.5, Locked: true}}})
	if err != nil {
		t.Fatal(err)
	}
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.02), Transmission: drive, FinalDrive: 20,
		Engine: demoEngine(t, true)})
	if err != nil {
		t.Fatal(err)
	}
	d := vehicle.Demand{Speed: units.KMH(20), Draft: units.Kilonewtons(12)}
	p, err := vehicle.LeastFuel{}.Operate(v, d)
	if err != nil {
		t.Fatal(err)
	}
	nu, ok := l.LockedRatio(1)
	if !ok {
		t.Fatal("range 1 not locked")
	}
	// The locked point: the engine speed that gives the output speed.
	wl := units.AngularVelocity(float64(p.Drive.OutputSpeed) / nu)
	lp, err := v.At(d, wl, 1)
	if err != nil {
		t.Fatalf("locked range at %v: %v", wl, err)
	}
	t.Logf("chosen: range %d at %v, fuel %v, efficiency %.3f; locked: %v, fuel %v, efficiency %.3f",
		p.Range, p.EngineSpeed, p.FuelRate, p.TransmissionEfficiency(), wl, lp.FuelRate, lp.TransmissionEfficiency())
	if lp.Drive.HydrostaticShare != 0 || !(lp.TransmissionEfficiency() > 0.85) {
		t.Errorf("locked point: share %v, efficiency %v", lp.Drive.HydrostaticShare, lp.TransmissionEfficiency())
	}
	// The strategy saw the locked point: it chose it or one that burns less.
	if p.FuelRate > lp.FuelRate {
		t.Errorf("least fuel %v above the locked range's %v", p.FuelRate, lp.FuelRate)
	}
}

// TestLayoutDriveErrors: a point the solver refuses comes back as the
// kind (ErrTransmission, or ErrInvalid for the solver's bad input) joined
// to the solver's own error by ": ", both found by errors.Is and the
// solver's typed error by errors.As.
func TestLayoutDriveErrors(t *testing.T) {
	t.Parallel()
	l := demoLayout(t)
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name     string
		engine   units.AngularVelocity
		out      units.AngularVelocity
		kind     error
		rootKind error
	}{
		{"output beyond the range", units.RPM(1800), units.RPM(90000), vehicle.ErrTransmission, powersplit.ErrInfeasible},
		{"engine speed not a number", units.AngularVelocity(math.NaN()), units.RPM(900), vehicle.ErrInvalid, powersplit.ErrInput},
	} {
		_, got := drive.Operate(0, c.engine, c.out, units.NewtonMetres(300))
		var st powersplit.State
		want := powersplit.NewSolver(l).Solve(powersplit.Point{Range: 0, Input: c.engine,
			Outputs: []powersplit.OutputDemand{{Speed: c.out, Torque: units.NewtonMetres(300)}}}, &st)
		if got == nil || want == nil {
			t.Fatalf("%s: Operate error %v, solver error %v, want both", c.name, got, want)
		}
		if s, w := got.Error(), c.kind.Error()+": "+want.Error(); s != w {
			t.Errorf("%s: Operate error\n got %q\nwant %q", c.name, s, w)
		}
		if !errors.Is(got, c.kind) || !errors.Is(got, c.rootKind) {
			t.Errorf("%s: Operate error %v is not %v and %v", c.name, got, c.kind, c.rootKind)
		}
		if other := map[error]error{vehicle.ErrInvalid: vehicle.ErrTransmission, vehicle.ErrTransmission: vehicle.ErrInvalid}[c.kind]; errors.Is(got, other) {
			t.Errorf("%s: Operate error %v is %v as well", c.name, got, other)
		}
	}
	_, err = drive.Operate(0, units.RPM(1800), units.RPM(90000), units.NewtonMetres(300))
	if le, ok := errors.AsType[*powersplit.LimitError](err); !ok || le.Quantity == "" {
		t.Errorf("Operate error %v: no *powersplit.LimitError with its quantity", err)
	}
}

// TestLeastFuelPointOwnsItsSlices: with a layout that has drag sources
// (bearings), the point LeastFuel returns is the point At solves at its
// engine speed and range, no-load parts by name included, and stays so
// after further searches (its slices are its own, not the search's).
func TestLeastFuelPointOwnsItsSlices(t *testing.T) {
	t.Parallel()
	l, err := demoLayout(t).WithLosses(powersplit.NoLoad{
		Lubricant: powersplit.Lubricant{Viscosity: hydrostat.VG46.Viscosity(units.Celsius(70)), Density: hydrostat.VG46.Density(units.Celsius(70))},
		Bearings: []powersplit.ShaftBearings{{Name: "input bearings", Shaft: "engine",
			Bearings: powersplit.Bearings{MeanDiameter: units.Millimetres(85), F0: 2, Count: 2}}},
	})
	if err != nil {
		t.Fatal(err)
	}
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: drive,
		FinalDrive: 20, Engine: demoEngine(t, true)})
	if err != nil {
		t.Fatal(err)
	}
	var kept []vehicle.Point
	var copies []vehicle.Point
	for _, kmh := range []float64{4, 8, 12, 6} {
		p, err := vehicle.LeastFuel{}.Operate(v, vehicle.Demand{Speed: units.KMH(kmh), Draft: units.Kilonewtons(12)})
		if err != nil {
			t.Fatalf("%v km/h: %v", kmh, err)
		}
		if len(p.Drive.NoLoad) != 1 || p.Drive.NoLoad[0].Name != "input bearings" || !(p.Drive.NoLoad[0].Power > 0) {
			t.Fatalf("%v km/h: no-load parts %+v, want the input bearings' loss", kmh, p.Drive.NoLoad)
		}
		q, err := v.At(p.Demand, p.EngineSpeed, p.Range)
		if err != nil {
			t.Fatalf("%v km/h: At(%v, range %d): %v", kmh, p.EngineSpeed, p.Range, err)
		}
		if !reflect.DeepEqual(p, q) {
			t.Errorf("%v km/h: LeastFuel's point\n%+v\nis not At's at its engine speed and range\n%+v", kmh, p, q)
		}
		kept = append(kept, p)
		c := p
		c.Drive.NoLoad = slices.Clone(p.Drive.NoLoad)
		c.Drive.Flags, c.Flags = slices.Clone(p.Drive.Flags), slices.Clone(p.Flags)
		copies = append(copies, c)
	}
	for i := range kept {
		if !reflect.DeepEqual(kept[i], copies[i]) {
			t.Errorf("point %d changed after later searches:\n%+v\nwant\n%+v", i, kept[i], copies[i])
		}
	}
}

// TestLayoutDriveSolvesLikeASolver: the drive's Solve and Interval give
// what a solver of its own layout gives.
func TestLayoutDriveSolvesLikeASolver(t *testing.T) {
	t.Parallel()
	l := demoLayout(t)
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		t.Fatal(err)
	}
	s := powersplit.NewSolver(l)
	we := units.RPM(1800)
	for _, out := range []float64{300, 900, 1500, 90000} {
		p := powersplit.Point{Input: we, Outputs: []powersplit.OutputDemand{{Speed: units.RPM(out), Torque: units.NewtonMetres(300)}}}
		var got, want powersplit.State
		errGot, errWant := drive.Solve(p, &got), s.Solve(p, &want)
		if fmt.Sprint(errGot) != fmt.Sprint(errWant) || !reflect.DeepEqual(got, want) {
			t.Errorf("out %v rpm: drive.Solve = %v, %+v\nwant %v, %+v", out, errGot, got.InputTorque, errWant, want.InputTorque)
		}
	}
	p := powersplit.Point{Input: we, Outputs: []powersplit.OutputDemand{{}}}
	got, errGot := drive.Interval(p)
	want, errWant := s.Interval(p)
	if errGot != nil || errWant != nil || len(want) == 0 || !reflect.DeepEqual(got, want) {
		t.Errorf("drive.Interval = %v, %v; want %v, %v (not empty)", got, errGot, want, errWant)
	}
}

// TestZeroLayoutDriveSolvesNothing: the zero LayoutDrive refuses Solve and
// Interval with ErrInvalid.
func TestZeroLayoutDriveSolvesNothing(t *testing.T) {
	t.Parallel()
	var d vehicle.LayoutDrive
	var st powersplit.State
	if err := d.Solve(powersplit.Point{}, &st); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("zero LayoutDrive.Solve = %v, want ErrInvalid", err)
	}
	if _, err := d.Interval(powersplit.Point{}); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("zero LayoutDrive.Interval = %v, want ErrInvalid", err)
	}
}

// fresh is LeastFuel on a vehicle built anew from the one it is handed,
// which remembers nothing: a simulation under it searches every step.
type fresh struct{}

func (fresh) Operate(v *vehicle.Vehicle, d vehicle.Demand) (vehicle.Point, error) {
	w, err := vehicle.New(v.Spec())
	if err != nil {
		return vehicle.Point{}, err
	}
	return vehicle.LeastFuel{}.Operate(w, d)
}

// countingDrive counts the points its LayoutDrive solves.
type countingDrive struct {
	*vehicle.LayoutDrive
	n int
}

func (c *countingDrive) Operate(rng int, engine, out units.AngularVelocity, torque units.Torque) (vehicle.DrivePoint, error) {
	c.n++
	return c.LayoutDrive.Operate(rng, engine, out, torque)
}

// TestSimulateRepeatsAnswers: a simulation answers a step that repeats the
// demand before it from memory (most steps of the short cycle: the drive
// solves a small share of the points), and its day equals, to the bit, the
// day of one that searches every step: on the general and the compiled
// path of the layout solver, whose points do not depend on the points
// solved before them.
func TestSimulateRepeatsAnswers(t *testing.T) {
	for _, general := range []bool{false, true} {
		solvepath.General.Store(general)
		drive, err := vehicle.FromLayout(demoLayout(t))
		solvepath.General.Store(false)
		if err != nil {
			t.Fatal(err)
		}
		cd := &countingDrive{LayoutDrive: drive}
		v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), Transmission: cd,
			FinalDrive: 20, Engine: demoEngine(t, true),
			PTO: vehicle.PTO{Ratios: []float64{3.5, 1.9}, MaxPower: units.Kilowatts(130)}})
		if err != nil {
			t.Fatal(err)
		}
		got, err := vehicle.Simulate(v, vehicle.LeastFuel{}, demoCycle(), vehicle.Options{})
		if err != nil {
			t.Fatal(err)
		}
		remembered := cd.n
		cd.n = 0
		want, err := vehicle.Simulate(v, fresh{}, demoCycle(), vehicle.Options{})
		if err != nil {
			t.Fatal(err)
		}
		if err := got.Err(); err != nil {
			t.Fatalf("general %v: %v", general, err)
		}
		if !reflect.DeepEqual(got, want) {
			t.Errorf("general %v: the day with answers from memory differs from the day searched step by step", general)
		}
		if 10*remembered > cd.n {
			t.Errorf("general %v: %d points solved with answers from memory, %d without: want a tenth or less", general, remembered, cd.n)
		}
	}
}
