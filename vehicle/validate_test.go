package vehicle_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/internal/testutil"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// TestValidationNamesTheField: every invalid value of a spec, demand or
// model is refused with ErrInvalid, as an *InputError naming the field.
func TestValidationNamesTheField(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	good := func() vehicle.Spec {
		return vehicle.Spec{Mass: units.Tonnes(9), Tyres: demoTyres(0.03), FinalDrive: 20, Engine: demoEngine(t, false),
			Transmission: &vehicle.SplitEstimate{Spans: []vehicle.SplitRange{{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5}},
				MechanicalEfficiency: 0.95, HydrostaticEfficiency: 0.8}}
	}
	spec := func(f func(*vehicle.Spec)) func() error {
		return func() error {
			s := good()
			f(&s)
			_, err := vehicle.New(s)
			return err
		}
	}
	est := func(f func(*vehicle.SplitEstimate)) func() error {
		return func() error {
			e := vehicle.SplitEstimate{Spans: []vehicle.SplitRange{{MinRatio: 0, MaxRatio: 0.8, MechanicalPoint: 0.5}},
				MechanicalEfficiency: 0.95, HydrostaticEfficiency: 0.8}
			f(&e)
			return e.Validate()
		}
	}
	curve := func(f func(*vehicle.SlipCurve)) func() error {
		return func() error {
			c := demoTyres(0.03)
			f(&c)
			return c.Validate()
		}
	}
	demand := func(f func(*vehicle.Demand)) func() error {
		return func() error {
			d := vehicle.Demand{Speed: units.KMH(8), Draft: units.Kilonewtons(20)}
			f(&d)
			return d.Validate()
		}
	}
	idle := func(f func(*vehicle.PTOIdle)) func() error {
		i := vehicle.PTOIdle{
			Plates:    powersplit.Plates{Films: 8, Inner: units.Millimetres(60), Outer: units.Millimetres(90), Clearance: units.Millimetres(0.2)},
			Bearings:  powersplit.Bearings{MeanDiameter: units.Millimetres(70), F0: 2},
			Lubricant: powersplit.Lubricant{Viscosity: units.Centistokes(40), Density: units.KilogramsPerCubicMetre(870)},
		}
		f(&i)
		return spec(func(s *vehicle.Spec) { s.PTO = vehicle.PTO{Ratios: []float64{3.5}, Idle: &i} })
	}
	geometry := func(g vehicle.Geometry) func() error {
		return spec(func(s *vehicle.Spec) { s.Geometry = &g })
	}
	cases := []struct {
		field string
		run   func() error
	}{
		{"Spec.Mass", spec(func(s *vehicle.Spec) { s.Mass = 0 })},
		{"Spec.RotatingMass", spec(func(s *vehicle.Spec) { s.RotatingMass = -1 })},
		{"Spec.DragArea", spec(func(s *vehicle.Spec) { s.DragArea = units.Area(nan) })},
		{"PTO.Ratios", spec(func(s *vehicle.Spec) { s.PTO = vehicle.PTO{Ratios: []float64{3.5, 0}} })},
		{"PTO.Efficiency", spec(func(s *vehicle.Spec) { s.PTO = vehicle.PTO{Ratios: []float64{3.5}, Efficiency: 1.2} })},
		{"PTO.MaxPower", spec(func(s *vehicle.Spec) { s.PTO = vehicle.PTO{Ratios: []float64{3.5}, MaxPower: -1} })},
		{"Geometry.Wheelbase", geometry(vehicle.Geometry{CentreOfMass: 1})},
		{"Geometry.CentreOfMass", geometry(vehicle.Geometry{Wheelbase: 2.8})},
		{"Geometry.CentreOfMass", geometry(vehicle.Geometry{Wheelbase: 2.8, CentreOfMass: 2.8})},
		{"Geometry.CentreOfMassHeight", geometry(vehicle.Geometry{Wheelbase: 2.8, CentreOfMass: 1, CentreOfMassHeight: -1})},
		{"Geometry.HitchHeight", geometry(vehicle.Geometry{Wheelbase: 2.8, CentreOfMass: 1, HitchHeight: units.Length(nan)})},
		{"SplitEstimate.Spans", est(func(e *vehicle.SplitEstimate) { e.Spans = nil })},
		{"SplitRange", est(func(e *vehicle.SplitEstimate) { e.Spans[0].MaxRatio = 0 })},
		{"SplitEstimate.MechanicalEfficiency", est(func(e *vehicle.SplitEstimate) { e.MechanicalEfficiency = 0 })},
		{"SplitEstimate.HydrostaticEfficiency", est(func(e *vehicle.SplitEstimate) { e.HydrostaticEfficiency = 1.1 })},
		{"SplitEstimate.NoLoadLoss", est(func(e *vehicle.SplitEstimate) { e.NoLoadLoss = -1 })},
		{"SplitEstimate.MaxInputTorque", est(func(e *vehicle.SplitEstimate) { e.MaxInputTorque = -1 })},
		{"SlipCurve.Weight", curve(func(c *vehicle.SlipCurve) { c.Weight = 0 })},
		{"SlipCurve.Radius", curve(func(c *vehicle.SlipCurve) { c.Radius = -1 })},
		{"SlipCurve.Rolling", curve(func(c *vehicle.SlipCurve) { c.Rolling = 1 })},
		{"SlipCurve.PeakTraction", curve(func(c *vehicle.SlipCurve) { c.PeakTraction = 2.5 })},
		{"SlipCurve.SlipRate", curve(func(c *vehicle.SlipCurve) { c.SlipRate = 0 })},
		{"Demand.Speed", demand(func(d *vehicle.Demand) { d.Speed = -1 })},
		{"Demand.Acceleration", demand(func(d *vehicle.Demand) { d.Acceleration = units.Acceleration(math.Inf(1)) })},
		{"Demand.Draft", demand(func(d *vehicle.Demand) { d.Draft = -1 })},
		{"Trailer.Mass", demand(func(d *vehicle.Demand) { d.Trailer.Mass = -1 })},
		{"Trailer.RotatingMass", demand(func(d *vehicle.Demand) { d.Trailer.RotatingMass = units.Mass(nan) })},
		{"Trailer.RollingCoefficient", demand(func(d *vehicle.Demand) { d.Trailer.RollingCoefficient = -0.1 })},
		{"Trailer.RollingCoefficient", demand(func(d *vehicle.Demand) { d.Trailer.RollingCoefficient = 1 })},
		{"Demand.Grade", demand(func(d *vehicle.Demand) { d.Grade = nan })},
		{"Demand.Grade", demand(func(d *vehicle.Demand) { d.Grade = 1.5 })},
		{"Demand.PTOPower", demand(func(d *vehicle.Demand) { d.PTOPower = -1 })},
		{"inertiaKgM2", func() error { _, err := vehicle.RotatingMass(-1, 1, 0.8); return err }},
		{"ratio", func() error { _, err := vehicle.RotatingMass(10, nan, 0.8); return err }},
		{"r", func() error { _, err := vehicle.RotatingMass(10, 1, 0); return err }},
		{"PTORow", func() error { _, err := vehicle.PTORow{A: -1}.Power(2, 0); return err }},
		{"width", func() error { _, err := vehicle.DiskMower.Power(-2, 0); return err }},
		{"feed", func() error { _, err := vehicle.SquareBaler.Power(0, -1); return err }},
		{"DraftRow", func() error { r := vehicle.MoldboardPlough; r.C = nan; return r.Validate() }},
		{"DraftRow.A", func() error { return vehicle.DraftRow{F: [3]float64{1, 1, 1}}.Validate() }},
		{"DraftRow.F", func() error { r := vehicle.MoldboardPlough; r.F[2] = 0; return r.Validate() }},
		{"DraftRow.F", func() error {
			r := vehicle.MoldboardPlough
			r.F[1] = 2.5
			_, err := r.Draft(vehicle.Medium, units.KMH(7), 2.4, units.Centimetres(18))
			return err
		}},
		{"Texture", func() error {
			_, err := vehicle.MoldboardPlough.Draft(5, units.KMH(7), 2.4, units.Centimetres(18))
			return err
		}},
		{"speed", func() error {
			_, err := vehicle.MoldboardPlough.Draft(vehicle.Fine, -1, 2.4, units.Centimetres(18))
			return err
		}},
		{"width", func() error {
			_, err := vehicle.MoldboardPlough.Draft(vehicle.Fine, units.KMH(7), 0, units.Centimetres(18))
			return err
		}},
		{"depth", func() error { _, err := vehicle.MoldboardPlough.Draft(vehicle.Fine, units.KMH(7), 2.4, 0); return err }},
		{"PTO.Idle.Plates", idle(func(i *vehicle.PTOIdle) { i.Plates.Outer = i.Plates.Inner })},
		{"PTO.Idle.Lubricant.Viscosity", idle(func(i *vehicle.PTOIdle) { i.Lubricant.Viscosity = 0 })},
		{"PTO.Idle.Lubricant.Density", idle(func(i *vehicle.PTOIdle) { i.Lubricant.Density = -1 })},
		{"PTO.Idle.Bearings.MeanDiameter", idle(func(i *vehicle.PTOIdle) { i.Bearings.MeanDiameter = -0.1 })},
		{"PTO.Idle.Bearings.F0", idle(func(i *vehicle.PTOIdle) { i.Bearings.F0 = 0 })},
		{"PTO.Idle.Bearings.F1", idle(func(i *vehicle.PTOIdle) { i.Bearings.F1 = -1 })},
		{"PTO.Idle.Bearings.Load", idle(func(i *vehicle.PTOIdle) { i.Bearings.Load = units.Force(nan) })},
		{"PTO.Idle.Bearings.Count", idle(func(i *vehicle.PTOIdle) { i.Bearings.Count = -1 })},
		{"PTO.Idle.SpeedRatio", idle(func(i *vehicle.PTOIdle) { i.SpeedRatio = -1 })},
		{"Driveline.FinalDrive", func() error { return vehicle.Driveline{RollingRadius: 0.8}.Validate() }},
		{"Driveline.RollingRadius", func() error { return vehicle.Driveline{FinalDrive: 20}.Validate() }},
		{"Driveline.Efficiency", func() error { return vehicle.Driveline{FinalDrive: 20, RollingRadius: 0.8, Efficiency: 1.5}.Validate() }},
	}
	for _, c := range cases {
		err := c.run()
		var ie *vehicle.InputError
		if !errors.Is(err, vehicle.ErrInvalid) || !errors.As(err, &ie) || ie.Field != c.field {
			t.Errorf("%s: error %v, want an *InputError for that field", c.field, err)
			continue
		}
		if !strings.Contains(err.Error(), c.field) {
			t.Errorf("%s: message %q does not name the field", c.field, err)
		}
	}
}

func TestSmallAccessors(t *testing.T) {
	t.Parallel()
	// Hand calculations.
	// PTO power a + b·W + c·F: a disk mower 5 kW per metre, 3 m: 15 kW; a
	// baler 2 kW + 1 kWh/t at 10 t/h: 2 + 10 = 12 kW.
	if p, err := vehicle.DiskMower.Power(3, 0); err != nil || !testutil.Close(p.Kilowatts(), 15, 1e-12, 0) {
		t.Errorf("DiskMower.Power(3 m) = %v, %v, want 15 kW", p, err)
	}
	if p, err := vehicle.SquareBaler.Power(0, units.KilogramsPerHour(10000)); err != nil || !testutil.Close(p.Kilowatts(), 12, 1e-12, 0) {
		t.Errorf("SquareBaler.Power(10 t/h) = %v, %v, want 12 kW", p, err)
	}
	for tx, want := range map[vehicle.Texture]string{vehicle.Fine: "fine", vehicle.Medium: "medium", vehicle.Coarse: "coarse", 7: "unknown texture"} {
		if got := tx.String(); got != want {
			t.Errorf("Texture(%d) = %q, want %q", int(tx), got, want)
		}
	}
	if got := vehicle.Concrete.String(); got == "" || got == "unknown road" {
		t.Errorf("Concrete.String() = %q", got)
	}
	if got := vehicle.Road(-1).String(); got != "unknown road" {
		t.Errorf("Road(-1).String() = %q", got)
	}
	e := demoEngine(t, false)
	if lo, hi := e.SpeedRange(); !testutil.Close(lo.RPM(), 800, 1e-12, 0) || !testutil.Close(hi.RPM(), 2300, 1e-12, 0) {
		t.Errorf("SpeedRange() = %v, %v, want 800, 2300 rpm (the curve's ends)", lo, hi)
	}
	v := demoVehicle(t, false)
	if d := vehicle.DrivelineOf(v, units.Metres(0.85)); d.FinalDrive <= 0 || d.RollingRadius != units.Metres(0.85) || d.Validate() != nil {
		t.Errorf("DrivelineOf = %+v (%v)", d, d.Validate())
	}
	// FromLayout refuses the zero layout; a built drive hands its layout back.
	if _, err := vehicle.FromLayout(powersplit.Layout{}); !errors.Is(err, vehicle.ErrInvalid) {
		t.Errorf("FromLayout(zero) error = %v", err)
	}
	l := demoLayout(t)
	if d, err := vehicle.FromLayout(l); err != nil || d.Layout().Ranges() != l.Ranges() || len(d.Layout().Outputs()) != 1 {
		t.Errorf("FromLayout(demo).Layout() = %v, %v", d, err)
	}
	// Simulate reports progress after each step, ending at the total.
	var calls, last, total int
	_, err := vehicle.Simulate(v, vehicle.LeastFuel{Samples: 6}, []vehicle.Segment{{Name: "pto", Kind: vehicle.StationaryPTO,
		Duration: 20e9, PTOPower: units.Kilowatts(30), PTOSpeed: vehicle.PTO1000}},
		vehicle.Options{Step: 5e9, Progress: func(done, n int) { calls, last, total = calls+1, done, n }})
	if err != nil || calls == 0 || last != total || total < 4 {
		t.Errorf("progress: %d calls, last %d of %d, %v", calls, last, total, err)
	}
	se := &vehicle.SegmentError{Index: 2, Name: "road", At: 3e9, Err: vehicle.ErrTraction}
	if !errors.Is(se, vehicle.ErrTraction) || !strings.Contains(se.Error(), `segment 2 "road" at 3s`) {
		t.Errorf("SegmentError = %q", se.Error())
	}
}

// TestTyresUnratedAndRefusals: the wheels name the axles whose tyres carry
// no load rating (their load is not checked), and the adapter refuses a
// negative pull, a standing start and a missing model.
func TestTyresUnratedAndRefusals(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		front, rear units.Force // rated loads; 0: not rated
		want        string
	}{
		{0, 0, "front and rear"},
		{0, units.Kilonewtons(60), "front"},
		{units.Kilonewtons(40), 0, "rear"},
		{units.Kilonewtons(40), units.Kilonewtons(60), ""},
	} {
		ty := demoTraction(t)
		ty.Vehicle.Front.Tyre.RatedLoad, ty.Vehicle.Rear.Tyre.RatedLoad = c.front, c.rear
		w, err := ty.Drive(units.Kilonewtons(20), 0, units.KMH(7))
		if err != nil {
			t.Fatal(err)
		}
		if w.Unrated != c.want {
			t.Errorf("rated %v/%v: Unrated = %q, want %q", c.front, c.rear, w.Unrated, c.want)
		}
	}
	ty := demoTraction(t)
	for name, run := range map[string]func() error{
		"pull":         func() error { _, err := ty.Drive(-1, 0, units.KMH(7)); return err },
		"travel speed": func() error { _, err := ty.Drive(units.Kilonewtons(20), 0, 0); return err },
		"Tyres.Model": func() error {
			n := ty
			n.Model = nil
			_, err := n.Drive(units.Kilonewtons(20), 0, units.KMH(7))
			return err
		},
	} {
		var ie *vehicle.InputError
		if err := run(); !errors.As(err, &ie) || ie.Field != name {
			t.Errorf("%s: error %v, want an *InputError for it", name, err)
		}
	}
}
