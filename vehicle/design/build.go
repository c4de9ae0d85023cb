package design

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

// checker gathers the mistakes Validate finds.
type checker struct {
	f    *File
	errs []error
}

func (c *checker) add(path string, format string, args ...any) {
	c.errs = append(c.errs, c.f.fieldError(path, fmt.Errorf("%w: %s", ErrValue, fmt.Sprintf(format, args...))))
}

// positive checks that a quantity (or a count) is finite and > 0. A value
// not from a file is shown in its display unit.
func (c *checker) positive(path string, v float64, show fmt.Stringer) {
	if v > 0 && !math.IsInf(v, 0) {
		return
	}
	if _, ok := c.f.index[path]; ok || v == 0 {
		if v == 0 && !ok {
			c.add(path, "missing (must be greater than zero)")
			return
		}
		c.add(path, "must be greater than zero")
		return
	}
	e := c.f.fieldError(path, fmt.Errorf("%w: must be greater than zero", ErrValue))
	if show != nil {
		e.Value = show.String()
	} else {
		e.Value = fmt.Sprint(v)
	}
	c.errs = append(c.errs, e)
}

// efficiency checks an optional efficiency: 0 (left out, the default) or
// within (0, 1].
func (c *checker) efficiency(path string, v float64) {
	if !(v >= 0 && v <= 1) {
		c.add(path, "%v must lie in (0, 1] (0 or left out: the default)", v)
	}
}

// Validate checks what decoding cannot: required values present and
// positive, words from their lists, names of surfaces, implements and
// trailers that exist, and that each transmission builds. Errors are
// *FieldError values, joined.
func (f *File) Validate() error {
	c := &checker{f: f}
	t := f.Tractor
	c.positive("tractor.mass", float64(t.Mass), t.Mass)
	c.positive("tractor.wheelbase", float64(t.Wheelbase), t.Wheelbase)
	c.positive("tractor.centreOfMass", float64(t.CentreOfMass), t.CentreOfMass)
	c.positive("tractor.finalDrive", t.FinalDrive, nil)
	for _, a := range []struct {
		name string
		axle Axle
	}{{"tractor.front", t.Front}, {"tractor.rear", t.Rear}} {
		y := a.axle.Tyre
		c.positive(a.name+".tyre.diameter", float64(y.Diameter), y.Diameter)
		c.positive(a.name+".tyre.width", float64(y.Width), y.Width)
		c.positive(a.name+".tyre.sectionHeight", float64(y.SectionHeight), y.SectionHeight)
		c.positive(a.name+".tyre.rollingRadius", float64(y.RollingRadius), y.RollingRadius)
		c.positive(a.name+".wheels", float64(a.axle.Wheels), nil)
	}
	c.efficiency("tractor.finalDriveEfficiency", t.FinalDriveEfficiency)
	c.efficiency("pto.efficiency", f.PTO.Efficiency)
	if math.IsNaN(t.FrontLead) || math.Abs(t.FrontLead) > 0.2 {
		c.add("tractor.frontLead", "must lie within ±0.2")
	}
	if !(t.Ballast >= 0 && t.Ballast <= t.Mass) {
		c.add("tractor.ballast", "%v must lie between 0 and the operating mass %v (it is part of it)", t.Ballast, t.Mass)
	}
	if !(t.MaxMass >= 0) {
		c.add("tractor.maxMass", "%v must not be negative (0 means not given)", t.MaxMass)
	}
	if fm := t.FrontMotor; fm != nil {
		c.positive("tractor.frontMotor.motor.displacement", float64(fm.Motor.Displacement), fm.Motor.Displacement)
		c.positive("tractor.frontMotor.finalDrive", fm.FinalDrive, nil)
		c.efficiency("tractor.frontMotor.finalDriveEfficiency", fm.FinalDriveEfficiency)
		c.positive("tractor.frontMotor.declutchAbove", float64(fm.DeclutchAbove), fm.DeclutchAbove)
		if !slices.Contains([]string{"", "schedule", "least power"}, fm.Control) {
			c.add("tractor.frontMotor.control", "not one of schedule, least power")
		}
		if t.Front.Tyre.RollingRadius > 0 && t.Rear.Tyre.RollingRadius > 0 && t.FinalDrive > 0 && fm.FinalDrive > 0 && fm.DeclutchAbove > 0 {
			if _, err := f.Transmission.frontLayout(f); err != nil {
				c.errs = append(c.errs, f.fieldError("tractor.frontMotor", err))
			}
		}
	}
	c.positive("engine.rated", float64(f.Engine.Rated), f.Engine.Rated)
	if len(f.Engine.Curve) < 2 {
		c.add("engine.curve", "needs at least two points")
	}
	f.Transmission.validate(c, "transmission")
	for i, a := range f.Alternatives {
		a.validate(c, fmt.Sprintf("alternatives[%d]", i))
	}
	for _, name := range sortedKeys(f.Surfaces) {
		if _, _, err := f.Surfaces[name].build(); err != nil {
			c.errs = append(c.errs, f.fieldError(join("surfaces", name), err))
		}
	}
	for _, name := range sortedKeys(f.Implements) {
		if _, err := f.Implements[name].build(); err != nil {
			c.errs = append(c.errs, f.fieldError(join("implements", name), err))
		}
	}
	if len(f.Day.Segments) == 0 {
		c.add("day.segments", "the day has no segments")
	}
	for i, g := range f.Day.Segments {
		p := fmt.Sprintf("day.segments[%d]", i)
		if !slices.Contains([]string{"field", "turn", "road", "pto"}, g.Kind) {
			c.add(p+".kind", "not one of field, turn, road, pto")
		}
		if _, ok := f.Surfaces[g.Surface]; g.Surface != "" && !ok {
			c.add(p+".surface", "no surface of that name in \"surfaces\"")
		}
		if _, ok := f.Implements[g.Implement]; g.Implement != "" && !ok {
			c.add(p+".implement", "no implement of that name in \"implements\"")
		}
		if _, ok := f.Trailers[g.Trailer]; g.Trailer != "" && !ok {
			c.add(p+".trailer", "no trailer of that name in \"trailers\"")
		}
		if g.Kind == "field" && g.Implement == "" {
			c.add(p+".implement", "a field segment needs an implement")
		}
	}
	if r := f.Requirements; r != nil {
		for i, p := range r.Pulls {
			if _, ok := f.Surfaces[p.Surface]; p.Surface != "" && !ok {
				c.add(fmt.Sprintf("requirements.pulls[%d].surface", i), "no surface of that name in \"surfaces\"")
			}
			c.positive(fmt.Sprintf("requirements.pulls[%d].speed", i), float64(p.Speed), p.Speed)
		}
		for i, m := range []float64{r.UnitSpeedMargin, r.PressureMargin, r.ShiftTolerance} {
			if !(m >= 0 && m < 1) {
				c.add([]string{"requirements.unitSpeedMargin", "requirements.pressureMargin", "requirements.shiftTolerance"}[i], "must lie in [0, 1)")
			}
		}
	}
	return errors.Join(c.errs...)
}

func sortedKeys[V any](m map[string]V) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return keys
}

func (t Transmission) validate(c *checker, field string) {
	n := len(c.errs)
	if !slices.Contains([]string{"input-coupled", "output-coupled", "compound"}, t.Kind) {
		c.add(field+".kind", "not one of input-coupled, output-coupled, compound")
	}
	if t.Kind == "compound" && t.Set2 == nil {
		c.add(field+".set2", "a compound split needs a second set")
	}
	c.positive(field+".pump.displacement", float64(t.Pump.Displacement), t.Pump.Displacement)
	c.positive(field+".motor.displacement", float64(t.Motor.Displacement), t.Motor.Displacement)
	c.positive(field+".relief", float64(t.Relief), t.Relief)
	for i, r := range t.Ranges {
		if r.Locked && t.Kind == "compound" {
			c.add(fmt.Sprintf("%s.ranges[%d].locked", field, i), "a compound split has no locked range here")
		}
	}
	if len(t.Ranges) == 0 {
		c.add(field+".ranges", "needs at least one range gear")
	}
	t.validateParts(c, field)
	if len(c.errs) > n {
		return
	}
	if _, err := t.Layout(); err != nil {
		c.errs = append(c.errs, c.f.fieldError(field, err))
	}
}

// BuildEngine builds the engine.
func (s *File) BuildEngine() (*vehicle.Engine, error) {
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

// rearOutput returns the rear output shaft's speed at travel speed v
// without slip.
func (s *File) rearOutput(v units.Speed) units.AngularVelocity {
	return units.AngularVelocity(s.Tractor.FinalDrive * float64(v) / float64(s.Tractor.Rear.Tyre.RollingRadius))
}

// FrontLayout builds transmission t with the tractor's front motor as a
// second motor of its loop (powersplit.SecondMotor), its setting curve and
// declutch speed turned from travel speeds into rear output speeds
// (without slip). It needs a tractor with a FrontMotor and an input- or
// output-coupled t.
func (s *File) FrontLayout(t Transmission) (powersplit.Layout, error) {
	return t.frontLayout(s)
}

func (t Transmission) frontLayout(s *File) (powersplit.Layout, error) {
	fm := s.Tractor.FrontMotor
	if fm == nil {
		return powersplit.Layout{}, errors.New("the tractor has no front motor")
	}
	second := &powersplit.SecondMotor{Ratio: fm.Ratio, DeclutchAbove: s.rearOutput(fm.DeclutchAbove)}
	if second.Ratio == 0 {
		second.Ratio = 1
	}
	for _, p := range fm.Setting {
		second.Setting.Speeds = append(second.Setting.Speeds, s.rearOutput(p.Speed))
		second.Setting.Settings = append(second.Setting.Settings, p.Setting)
	}
	l, _, err := t.layout(&fm.Motor, second)
	if err != nil {
		return l, err
	}
	return t.withLosses(l)
}

// Layout builds the transmission layout, with its no-load losses when the
// design lists them.
func (t Transmission) Layout() (powersplit.Layout, error) {
	l, _, err := t.built()
	return l, err
}

// built is Layout, with the hydrostatic loop the layout holds (the rated
// limits of its units are in its spec).
func (t Transmission) built() (powersplit.Layout, hydrostat.Loop, error) {
	l, loop, err := t.layout(nil, nil)
	if err != nil {
		return l, loop, err
	}
	l, err = t.withLosses(l)
	return l, loop, err
}

// layout builds the layout, with a second motor when front is set, and
// returns it with its loop.
func (t Transmission) layout(front *Unit, second *powersplit.SecondMotor) (powersplit.Layout, hydrostat.Loop, error) {
	set, err := t.Set.build()
	if err != nil {
		return powersplit.Layout{}, hydrostat.Loop{}, fmt.Errorf("set: %w", err)
	}
	loop, err := t.loop(front)
	if err != nil {
		return powersplit.Layout{}, loop, err
	}
	l, err := t.split(set, loop, second)
	return l, loop, err
}

// split composes the layout of t's kind from its set and loop.
func (t Transmission) split(set planetary.Set, loop hydrostat.Loop, second *powersplit.SecondMotor) (powersplit.Layout, error) {
	if second != nil && t.Kind != "input-coupled" && t.Kind != "output-coupled" {
		return powersplit.Layout{}, fmt.Errorf("a front motor needs an input- or output-coupled split, not %q", t.Kind)
	}
	ranges := make([]powersplit.RangeGear, len(t.Ranges))
	for i, r := range t.Ranges {
		ranges[i] = powersplit.RangeGear{Name: r.Name, Ratio: r.Ratio, FromVariator: r.FromVariator, Locked: r.Locked}
	}
	switch t.Kind {
	case "input-coupled":
		return powersplit.InputCoupled(powersplit.InputCoupledSpec{Set: set, Loop: loop,
			InputRatio: t.InputRatio, PumpRatio: t.PumpRatio, MotorRatio: t.MotorRatio,
			Ranges: ranges, GearEfficiency: t.GearEfficiency, Second: second})
	case "output-coupled":
		return powersplit.OutputCoupled(powersplit.OutputCoupledSpec{Set: set, Loop: loop,
			InputRatio: t.InputRatio, PumpRatio: t.PumpRatio, MotorRatio: t.MotorRatio,
			Ranges: ranges, GearEfficiency: t.GearEfficiency, Second: second})
	case "compound":
		set2, err := t.Set2.build()
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
		if r.FromVariator {
			return powersplit.Layout{}, fmt.Errorf("ranges[%d]: fromVariator: a compound split takes every range from its summing shaft", i)
		}
		g := b.Shaft(name + " gear")
		b.Gear(name+" gear", sum, g, r.Ratio, eta)
		b.Clutch(name+" clutch", g, out)
		b.Range(name, name+" clutch")
	}
	return b.Build()
}

func (t Transmission) loop(front *Unit) (hydrostat.Loop, error) {
	loss := hydrostat.Wilson{Slip: t.Losses.Slip, Viscous: t.Losses.Viscous, Friction: t.Losses.Friction,
		ConstantPressure: t.Losses.ConstantPressure, ConstantTorque: t.Losses.ConstantTorque}
	mk := func(name string, u Unit) (hydrostat.Unit, error) {
		h, err := hydrostat.NewUnit(hydrostat.UnitSpec{MaxDisplacement: u.Displacement, MaxSpeed: u.MaxSpeed,
			RatedPressure: u.RatedPressure, PeakPressure: u.PeakPressure, Loss: loss, Swing: u.Swing})
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
	oil, err := t.hydraulicOil()
	if err != nil {
		return hydrostat.Loop{}, err
	}
	temp := units.Celsius(50)
	if t.OilTemperature != nil {
		temp = *t.OilTemperature
	}
	motors := []hydrostat.Unit{motor}
	if front != nil {
		fm, err := mk("front motor", *front)
		if err != nil {
			return hydrostat.Loop{}, err
		}
		motors = append(motors, fm)
	}
	l, err := hydrostat.NewLoop(hydrostat.LoopSpec{Pump: pump, Motors: motors, Oil: oil,
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
func (s *File) Implement(name string) (vehicle.Implement, error) {
	im, ok := s.Implements[name]
	if !ok {
		return vehicle.Implement{}, fmt.Errorf("%s: no implement named %q", s.source, name)
	}
	return im.build()
}

// Surface returns the named surface and its traction model.
func (s *File) Surface(name string) (traction.Surface, traction.Model, error) {
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
func (s *File) TractionVehicle() traction.Vehicle {
	t := s.Tractor
	tyre := func(y Tyre) traction.Tyre {
		return traction.Tyre{Diameter: y.Diameter, Width: y.Width, SectionHeight: y.SectionHeight,
			RollingRadius: y.RollingRadius, Deflection: y.Deflection, RatedLoad: y.RatedLoad}
	}
	return traction.Vehicle{Mass: t.Mass, Wheelbase: t.Wheelbase, CentreOfMass: t.CentreOfMass,
		FittedBallast: t.Ballast, MaxMass: t.MaxMass,
		Hitch: traction.Hitch{Height: t.HitchHeight, Behind: t.HitchBehind},
		Front: traction.Axle{Tyre: tyre(t.Front.Tyre), Wheels: t.Front.Wheels, Track: t.Front.Track},
		Rear:  traction.Axle{Tyre: tyre(t.Rear.Tyre), Wheels: t.Rear.Wheels, Track: t.Rear.Track}}
}

// Ground returns the tyres on a named surface as the vehicle package sees
// them: on soil the front axle is driven with the tractor's lead; on a road
// (the road model) the front drive is disengaged and the front wheels roll
// free, as is usual to avoid wind-up on a hard surface.
func (s *File) Ground(surface string) (vehicle.Tyres, error) {
	sf, m, err := s.Surface(surface)
	if err != nil {
		return vehicle.Tyres{}, err
	}
	_, road := m.(traction.Road)
	return vehicle.Tyres{Vehicle: s.TractionVehicle(), Model: m, Surface: sf, FrontDrive: !road, Lead: s.Tractor.FrontLead}, nil
}

// Vehicle builds the tractor with transmission t. Its default ground is
// the surface of the day's first segment that names one.
func (s *File) Vehicle(t Transmission) (*vehicle.Vehicle, error) {
	return s.vehicle(t, nil)
}

// vehicle is Vehicle; a non-nil l is t's layout, built already.
func (s *File) vehicle(t Transmission, l *powersplit.Layout) (*vehicle.Vehicle, error) {
	var drive vehicle.Transmission
	if fm := s.Tractor.FrontMotor; fm != nil {
		l, err := s.FrontLayout(t)
		if err != nil {
			return nil, fmt.Errorf("%s: transmission %q with the front motor: %w", s.source, t.Name, err)
		}
		ctl := vehicle.FrontSchedule
		if fm.Control == "least power" {
			ctl = vehicle.FrontLeastPower
		}
		tr := s.Tractor
		d, err := vehicle.FromFrontMotorLayout(l, vehicle.FrontMotorSpec{FinalDrive: fm.FinalDrive, Efficiency: fm.FinalDriveEfficiency,
			AxleRatio: fm.FinalDrive * float64(tr.Rear.Tyre.RollingRadius) / (tr.FinalDrive * float64(tr.Front.Tyre.RollingRadius)), Control: ctl})
		if err != nil {
			return nil, err
		}
		drive = d
	} else {
		if l == nil {
			built, err := t.Layout()
			if err != nil {
				return nil, fmt.Errorf("%s: transmission %q: %w", s.source, t.Name, err)
			}
			l = &built
		}
		d, err := vehicle.FromLayout(*l)
		if err != nil {
			return nil, err
		}
		drive = d
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
	if id := s.PTO.Idle; id != nil {
		lube, err := t.lubricant()
		if err != nil {
			return nil, fmt.Errorf("pto.idle: %w", err)
		}
		pto.Idle = &vehicle.PTOIdle{
			Plates:    powersplit.Plates{Films: id.Films, Inner: id.Inner, Outer: id.Outer, Clearance: id.Clearance},
			Bearings:  powersplit.Bearings{MeanDiameter: id.MeanDiameter, F0: id.F0, Count: id.Bearings},
			Lubricant: lube,
		}
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
func (s *File) Cycle() ([]vehicle.Segment, error) {
	out := make([]vehicle.Segment, 0, len(s.Day.Segments))
	for i, g := range s.Day.Segments {
		seg := vehicle.Segment{Name: g.Name, Speed: g.Speed, Distance: g.Distance, Duration: g.Duration.Std(),
			Grade: g.Grade, PTOPower: g.PTOPower, PTOSpeed: g.PTOSpeed, TurnRadius: g.TurnRadius}
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
func (s *File) Step() Duration {
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
