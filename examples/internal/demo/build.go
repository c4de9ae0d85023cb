package demo

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// fieldError names a field of the file and what is wrong with it.
func fieldError(field, format string, args ...any) error {
	return fmt.Errorf("field %s: %s", field, fmt.Sprintf(format, args...))
}

// positive checks that v is finite and > 0.
func positive(errs *[]error, field string, v float64) {
	if !(v > 0) || math.IsInf(v, 0) {
		*errs = append(*errs, fieldError(field, "missing, zero or negative (got %g in SI units)", v))
	}
}

// validate checks what the decoder cannot: required fields present,
// references to named surfaces, implements and trailers resolvable.
func (s *Scenario) validate() error {
	var errs []error
	t := s.Tractor
	positive(&errs, "tractor.mass", float64(t.Mass))
	positive(&errs, "tractor.wheelbase", float64(t.Wheelbase))
	positive(&errs, "tractor.centreOfMass", float64(t.CentreOfMass))
	positive(&errs, "tractor.finalDrive", t.FinalDrive)
	for _, a := range []struct {
		name string
		axle Axle
	}{{"tractor.front", t.Front}, {"tractor.rear", t.Rear}} {
		positive(&errs, a.name+".tyre.diameter", float64(a.axle.Tyre.Diameter))
		positive(&errs, a.name+".tyre.width", float64(a.axle.Tyre.Width))
		positive(&errs, a.name+".tyre.sectionHeight", float64(a.axle.Tyre.SectionHeight))
		positive(&errs, a.name+".tyre.rollingRadius", float64(a.axle.Tyre.RollingRadius))
		positive(&errs, a.name+".wheels", float64(a.axle.Wheels))
	}
	if math.IsNaN(t.FrontLead) || math.Abs(t.FrontLead) > 0.2 {
		errs = append(errs, fieldError("tractor.frontLead", "must lie within ±0.2 (got %g)", t.FrontLead))
	}
	positive(&errs, "engine.rated", float64(s.Engine.Rated))
	if len(s.Engine.Curve) < 2 {
		errs = append(errs, fieldError("engine.curve", "needs at least two points"))
	}
	if err := s.Transmission.validate("transmission"); err != nil {
		errs = append(errs, err)
	}
	for i, a := range s.Alternatives {
		if err := a.validate(fmt.Sprintf("alternatives[%d]", i)); err != nil {
			errs = append(errs, err)
		}
	}
	for name, sf := range s.Surfaces {
		if _, _, err := sf.build(); err != nil {
			errs = append(errs, fmt.Errorf("field surfaces[%q]: %w", name, err))
		}
	}
	for name, im := range s.Implements {
		if _, err := im.build(); err != nil {
			errs = append(errs, fmt.Errorf("field implements[%q]: %w", name, err))
		}
	}
	if len(s.Day.Segments) == 0 {
		errs = append(errs, fieldError("day.segments", "the day has no segments"))
	}
	for i, g := range s.Day.Segments {
		f := fmt.Sprintf("day.segments[%d] (%q)", i, g.Name)
		if !slices.Contains([]string{"field", "turn", "road", "pto"}, g.Kind) {
			errs = append(errs, fieldError(f+".kind", "%q is not one of field, turn, road, pto", g.Kind))
		}
		if _, ok := s.Surfaces[g.Surface]; g.Surface != "" && !ok {
			errs = append(errs, fieldError(f+".surface", "no surface named %q in \"surfaces\"", g.Surface))
		}
		if _, ok := s.Implements[g.Implement]; g.Implement != "" && !ok {
			errs = append(errs, fieldError(f+".implement", "no implement named %q in \"implements\"", g.Implement))
		}
		if _, ok := s.Trailers[g.Trailer]; g.Trailer != "" && !ok {
			errs = append(errs, fieldError(f+".trailer", "no trailer named %q in \"trailers\"", g.Trailer))
		}
		if g.Kind == "field" && g.Implement == "" {
			errs = append(errs, fieldError(f+".implement", "a field segment needs an implement"))
		}
	}
	return errors.Join(errs...)
}

func (t Transmission) validate(field string) error {
	var errs []error
	if !slices.Contains([]string{"input-coupled", "output-coupled", "compound"}, t.Kind) {
		errs = append(errs, fieldError(field+".kind", "%q is not one of input-coupled, output-coupled, compound", t.Kind))
	}
	if t.Kind == "compound" && t.Set2 == nil {
		errs = append(errs, fieldError(field+".set2", "a compound split needs a second set"))
	}
	positive(&errs, field+".pump.displacement", float64(t.Pump.Displacement))
	positive(&errs, field+".motor.displacement", float64(t.Motor.Displacement))
	positive(&errs, field+".relief", float64(t.Relief))
	if len(t.Ranges) == 0 {
		errs = append(errs, fieldError(field+".ranges", "needs at least one range gear"))
	}
	if err := errors.Join(errs...); err != nil {
		return err
	}
	if _, err := t.Layout(); err != nil {
		return fmt.Errorf("field %s: %w", field, err)
	}
	return nil
}

// Engine builds the engine.
func (s *Scenario) BuildEngine() (*vehicle.Engine, error) {
	spec := vehicle.EngineSpec{Idle: s.Engine.Idle, Rated: s.Engine.Rated}
	for _, p := range s.Engine.Curve {
		spec.CurveSpeeds = append(spec.CurveSpeeds, p.Speed)
		spec.CurveTorques = append(spec.CurveTorques, p.Torque)
	}
	if m := s.Engine.FuelMap; m != nil {
		spec.Map = &vehicle.FuelMap{Speeds: m.Speeds, Torques: m.Torques, SFC: m.SFC}
	}
	e, err := vehicle.NewEngine(spec)
	if err != nil {
		return nil, fmt.Errorf("%s: field engine: %w", s.source, err)
	}
	return e, nil
}

// Layout builds the transmission layout.
func (t Transmission) Layout() (powersplit.Layout, error) {
	set, err := planetary.FromRatio(t.Set.FixedCarrierRatio, t.Set.BasicEfficiency)
	if err != nil {
		return powersplit.Layout{}, fmt.Errorf("set: %w", err)
	}
	loop, err := t.loop()
	if err != nil {
		return powersplit.Layout{}, err
	}
	ranges := make([]powersplit.RangeGear, len(t.Ranges))
	for i, r := range t.Ranges {
		ranges[i] = powersplit.RangeGear{Name: r.Name, Ratio: r.Ratio}
	}
	switch t.Kind {
	case "input-coupled":
		return powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: loop,
			InputRatio: t.InputRatio, PumpRatio: t.PumpRatio, MotorRatio: t.MotorRatio,
			Ranges: ranges, GearEfficiency: t.GearEfficiency})
	case "output-coupled":
		return powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop,
			InputRatio: t.InputRatio, PumpRatio: t.PumpRatio, MotorRatio: t.MotorRatio,
			Ranges: ranges, GearEfficiency: t.GearEfficiency})
	case "compound":
		set2, err := planetary.FromRatio(t.Set2.FixedCarrierRatio, t.Set2.BasicEfficiency)
		if err != nil {
			return powersplit.Layout{}, fmt.Errorf("set2: %w", err)
		}
		return compound(set, set2, loop, t.Ranges, t.GearEfficiency)
	}
	return powersplit.Layout{}, fmt.Errorf("kind %q unknown", t.Kind)
}

// compound composes a compound split from the root package's elements: the
// engine on shaft I, the summing shaft O, set 1 with sun A, ring I, carrier
// O and set 2 with sun B, ring O, carrier I; the pump on B and the motor on
// A; O drives the output through one gear and clutch per range. Willis gives
//
//	ωA = i1·ωI + (1 − i1)·ωO,   ωB = (1 − i2)·ωI + i2·ωO
//
// so the motor stands still at ωO/ωI = −i1/(1 − i1) and the pump at
// −(1 − i2)/i2: two mechanical points.
func compound(s1, s2 planetary.Set, loop hydrostat.Loop, rs []Range, eta float64) (powersplit.Layout, error) {
	if eta == 0 {
		eta = powersplit.DefaultGearEfficiency
	}
	b := powersplit.NewBuilder()
	in, sum, a, c, out := b.Shaft("engine"), b.Shaft("sum"), b.Shaft("A"), b.Shaft("B"), b.Shaft("output")
	b.Input("engine", in)
	b.Output("output", out)
	b.Planetary("set 1", s1, a, in, sum)
	b.Planetary("set 2", s2, c, sum, in)
	b.Loop("hydrostat", loop, c, a)
	for i, r := range rs {
		name := r.Name
		if name == "" {
			name = fmt.Sprintf("range %d", i+1)
		}
		g := b.Shaft(name + " gear")
		b.Gear(name+" gear", sum, g, r.Ratio, eta)
		b.Clutch(name+" clutch", g, out)
		b.Range(name, name+" clutch")
	}
	return b.Build()
}

func (t Transmission) loop() (hydrostat.Loop, error) {
	loss := hydrostat.Wilson{Slip: t.Losses.Slip, Viscous: t.Losses.Viscous, Friction: t.Losses.Friction,
		ConstantPressure: t.Losses.ConstantPressure}
	mk := func(name string, u Unit) (hydrostat.Unit, error) {
		h, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: u.Displacement, MaxSpeed: u.MaxSpeed,
			RatedPressure: u.RatedPressure, PeakPressure: u.PeakPressure, Loss: loss})
		if err != nil {
			return h, fmt.Errorf("%s: %w", name, err)
		}
		return h, nil
	}
	pump, err := mk("pump", t.Pump)
	if err != nil {
		return hydrostat.Loop{}, err
	}
	motor, err := mk("motor", t.Motor)
	if err != nil {
		return hydrostat.Loop{}, err
	}
	oils := map[string]hydrostat.Oil{"VG32": hydrostat.VG32, "VG46": hydrostat.VG46, "VG68": hydrostat.VG68}
	oil, ok := oils[strings.ReplaceAll(strings.ToUpper(t.Oil), " ", "")]
	if !ok {
		return hydrostat.Loop{}, fmt.Errorf("oil: %q is not one of VG32, VG46, VG68", t.Oil)
	}
	temp := units.Celsius(50)
	if t.OilTemperature.Set {
		temp = t.OilTemperature.Temperature
	}
	l, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: []hydrostat.Unit{motor}, Oil: oil,
		Temperature: temp, Charge: t.Charge, Relief: t.Relief,
		Schedule: hydrostat.Sequential{MinMotorSetting: t.MinMotorSetting}})
	if err != nil {
		return l, fmt.Errorf("loop: %w", err)
	}
	return l, nil
}

// build returns the traction surface and model.
func (sf Surface) build() (traction.Surface, traction.Model, error) {
	presets := map[string]func() traction.Surface{
		"hard": traction.HardSoil, "firm": traction.FirmSoil, "tilled": traction.TilledSoil, "soft": traction.SoftSoil,
		"concrete": traction.Concrete, "asphalt": traction.Asphalt, "gravel": traction.Gravel,
	}
	var out traction.Surface
	if sf.Preset != "" {
		f, ok := presets[sf.Preset]
		if !ok {
			return out, nil, fmt.Errorf("preset %q is not one of hard, firm, tilled, soft, concrete, asphalt, gravel", sf.Preset)
		}
		out = f()
	}
	if sf.ConeIndex != 0 {
		out.ConeIndex = sf.ConeIndex
	}
	if sf.RollingCoefficient != 0 {
		out.RollingCoefficient = sf.RollingCoefficient
	}
	if sf.Adhesion != 0 {
		out.Adhesion = sf.Adhesion
	}
	var m traction.Model
	switch sf.Model {
	case "brixius":
		m = traction.Brixius{}
	case "wismer-luth":
		m = traction.WismerLuth{}
	case "road":
		m = traction.Road{}
	default:
		return out, nil, fmt.Errorf("model %q is not one of brixius, wismer-luth, road", sf.Model)
	}
	if err := out.Validate(); err != nil {
		return out, nil, err
	}
	return out, m, nil
}

func (im Implement) build() (vehicle.Implement, error) {
	var out vehicle.Implement
	var names []string
	for _, r := range vehicle.DraftRows() {
		names = append(names, r.Name)
		if strings.EqualFold(r.Name, im.Row) {
			out.Row = r
		}
	}
	if out.Row.Name == "" {
		return out, fmt.Errorf("row %q is not a draft table row (%s)", im.Row, strings.Join(names, "; "))
	}
	tex := map[string]vehicle.Texture{"fine": vehicle.Fine, "medium": vehicle.Medium, "coarse": vehicle.Coarse}
	t, ok := tex[im.Texture]
	if !ok {
		return out, fmt.Errorf("texture %q is not one of fine, medium, coarse", im.Texture)
	}
	out.Width, out.Depth, out.Texture = im.Width, im.Depth, t
	return out, nil
}

// Implement returns the named implement.
func (s *Scenario) Implement(name string) (vehicle.Implement, error) {
	im, ok := s.Implements[name]
	if !ok {
		return vehicle.Implement{}, fmt.Errorf("%s: no implement named %q", s.source, name)
	}
	return im.build()
}

// Surface returns the named surface and its traction model.
func (s *Scenario) Surface(name string) (traction.Surface, traction.Model, error) {
	sf, ok := s.Surfaces[name]
	if !ok {
		return traction.Surface{}, nil, fmt.Errorf("%s: no surface named %q", s.source, name)
	}
	out, m, err := sf.build()
	if out.Name == "" {
		out.Name = name
	}
	return out, m, err
}

// TractionVehicle returns the tractor as the traction package sees it.
func (s *Scenario) TractionVehicle() traction.Vehicle {
	t := s.Tractor
	tyre := func(y Tyre) traction.Tyre {
		return traction.Tyre{Diameter: y.Diameter, Width: y.Width, SectionHeight: y.SectionHeight,
			RollingRadius: y.RollingRadius, Deflection: y.Deflection, RatedLoad: y.RatedLoad}
	}
	return traction.Vehicle{Mass: t.Mass, Wheelbase: t.Wheelbase, CentreOfMass: t.CentreOfMass,
		Hitch: traction.Hitch{Height: t.HitchHeight, Behind: t.HitchBehind},
		Front: traction.Axle{Tyre: tyre(t.Front.Tyre), Wheels: t.Front.Wheels, Track: t.Front.Track},
		Rear:  traction.Axle{Tyre: tyre(t.Rear.Tyre), Wheels: t.Rear.Wheels, Track: t.Rear.Track}}
}

// Ground returns the tyres on a named surface as the vehicle package sees
// them: on soil the front axle is driven with the tractor's lead; on a road
// (the road model) the front drive is disengaged and the front wheels roll
// free, as is usual to avoid wind-up on a hard surface.
func (s *Scenario) Ground(surface string) (vehicle.Tyres, error) {
	sf, m, err := s.Surface(surface)
	if err != nil {
		return vehicle.Tyres{}, err
	}
	_, road := m.(traction.Road)
	return vehicle.Tyres{Vehicle: s.TractionVehicle(), Model: m, Surface: sf, FrontDrive: !road, Lead: s.Tractor.FrontLead}, nil
}

// Vehicle builds the tractor with transmission t. Its default ground is
// the surface of the day's first segment that names one.
func (s *Scenario) Vehicle(t Transmission) (*vehicle.Vehicle, error) {
	l, err := t.Layout()
	if err != nil {
		return nil, fmt.Errorf("%s: transmission %q: %w", s.source, t.Name, err)
	}
	drive, err := vehicle.FromLayout(l)
	if err != nil {
		return nil, err
	}
	e, err := s.BuildEngine()
	if err != nil {
		return nil, err
	}
	var ground vehicle.Traction
	for _, g := range s.Day.Segments {
		if g.Surface != "" {
			ty, err := s.Ground(g.Surface)
			if err != nil {
				return nil, err
			}
			ground = ty
			break
		}
	}
	if ground == nil {
		return nil, fmt.Errorf("%s: no segment of the day names a surface", s.source)
	}
	pto := vehicle.PTO{Efficiency: s.PTO.Efficiency, MaxPower: s.PTO.MaxPower}
	for _, sp := range s.PTO.Speeds {
		pto.Ratios = append(pto.Ratios, float64(s.PTO.AtEngine)/float64(sp))
	}
	tr := s.Tractor
	v, err := vehicle.New(vehicle.Spec{
		Mass: tr.Mass, RotatingMass: tr.RotatingMass, DragArea: tr.DragArea,
		Tyres: ground, Transmission: drive, FinalDrive: tr.FinalDrive, FinalDriveEfficiency: tr.FinalDriveEfficiency,
		Engine: e, PTO: pto,
		Geometry: &vehicle.Geometry{Wheelbase: tr.Wheelbase, CentreOfMass: tr.CentreOfMass,
			CentreOfMassHeight: tr.CentreOfMassHeight, HitchHeight: tr.HitchHeight},
	})
	if err != nil {
		return nil, fmt.Errorf("%s: %w", s.source, err)
	}
	return v, nil
}

// Cycle returns the working day as the vehicle package's segments.
func (s *Scenario) Cycle() ([]vehicle.Segment, error) {
	out := make([]vehicle.Segment, 0, len(s.Day.Segments))
	for i, g := range s.Day.Segments {
		seg := vehicle.Segment{Name: g.Name, Speed: g.Speed, Distance: g.Distance, Duration: g.Duration.Std(),
			Grade: g.Grade, PTOPower: g.PTOPower, PTOSpeed: g.PTOSpeed}
		switch g.Kind {
		case "field":
			seg.Kind = vehicle.FieldPass
		case "turn":
			seg.Kind = vehicle.HeadlandTurn
		case "road":
			seg.Kind = vehicle.RoadTransfer
		case "pto":
			seg.Kind = vehicle.StationaryPTO
		}
		if g.Surface != "" {
			ty, err := s.Ground(g.Surface)
			if err != nil {
				return nil, err
			}
			seg.Ground = ty
		}
		if g.Implement != "" {
			im, err := s.Implement(g.Implement)
			if err != nil {
				return nil, fmt.Errorf("%s: day.segments[%d]: %w", s.source, i, err)
			}
			seg.Implement = &im
		}
		if g.Trailer != "" {
			tr := s.Trailers[g.Trailer]
			seg.Trailer = vehicle.Trailer{Mass: tr.Mass, RollingCoefficient: tr.RollingCoefficient}
		}
		for _, st := range g.Profile {
			seg.Profile = append(seg.Profile, vehicle.Stretch{Length: st.Length, Grade: st.Grade})
		}
		out = append(out, seg)
	}
	return out, nil
}

// Step returns the day's simulation time step (default 1 s).
func (s *Scenario) Step() Duration {
	if s.Day.Step == 0 {
		return Duration(1e9)
	}
	return s.Day.Step
}

// RangeNames returns the range names of transmission t, in order.
func (t Transmission) RangeNames() []string {
	out := make([]string, len(t.Ranges))
	for i, r := range t.Ranges {
		out[i] = r.Name
		if out[i] == "" {
			out[i] = fmt.Sprintf("range %d", i+1)
		}
	}
	return out
}
