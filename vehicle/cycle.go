package vehicle

import (
	"errors"
	"math"
	"time"

	"github.com/powersplit-dev/powersplit/units"
)

// Kind is the kind of a duty-cycle segment.
type Kind int

// Segment kinds.
const (
	// FieldPass travels Distance at Speed with an Implement working (its
	// draft and PTO load) on a constant Grade.
	FieldPass Kind = iota
	// HeadlandTurn travels at Speed for Duration with the implement raised:
	// no draft and no PTO load.
	HeadlandTurn
	// RoadTransfer travels at Speed along a Profile of stretches of given
	// length and grade, towing the Trailer.
	RoadTransfer
	// StationaryPTO stands still for Duration driving the PTO (PTOPower at
	// PTOSpeed, or the Implement's PTO load).
	StationaryPTO
	// Accelerate speeds up from StartSpeed (zero: from rest) to Speed at a
	// constant Acceleration on a constant Grade, towing the Trailer.
	Accelerate
)

// String returns the kind's name.
func (k Kind) String() string {
	switch k {
	case FieldPass:
		return "field pass"
	case HeadlandTurn:
		return "headland turn"
	case RoadTransfer:
		return "road transfer"
	case StationaryPTO:
		return "stationary PTO"
	case Accelerate:
		return "acceleration"
	}
	return "unknown segment kind"
}

// A Stretch is a piece of a road profile.
type Stretch struct {
	Length units.Length // > 0
	Grade  float64      // rise over run, within ±1
}

// A Segment is one part of a working day. Which fields apply depends on
// Kind (see the Kind constants); the others are ignored.
type Segment struct {
	Name         string
	Kind         Kind
	Speed        units.Speed        // travel speed (final speed for Accelerate)
	StartSpeed   units.Speed        // Accelerate: initial speed, >= 0
	Acceleration units.Acceleration // Accelerate: > 0
	Distance     units.Length       // FieldPass: pass length
	Duration     time.Duration      // HeadlandTurn, StationaryPTO
	Implement    *Implement         // FieldPass; StationaryPTO (PTO load only)
	Trailer      Trailer            // RoadTransfer, Accelerate
	Profile      []Stretch          // RoadTransfer
	Grade        float64            // FieldPass, HeadlandTurn, StationaryPTO, Accelerate
	PTOPower     units.Power        // StationaryPTO without an Implement
	PTOSpeed     units.AngularVelocity
	// Ground is the tyres on this segment's surface (field, road); nil
	// means the vehicle's Spec.Tyres.
	Ground Traction
	// TurnRadius is the rear axle's path radius of a HeadlandTurn; zero
	// means the turn is run straight ahead (no steering geometry).
	TurnRadius units.Length
}

// Options control a simulation. Zero fields take the defaults.
type Options struct {
	// Step is the time step; default 1 s.
	Step time.Duration
	// MaxSteps bounds the steps of one segment; default 1 000 000. A
	// segment that needs more is reported as invalid.
	MaxSteps int
	// Progress, when not nil, is called after each time step with the
	// steps done and the total steps of the day.
	Progress func(done, total int)
}

// counting is a strategy that reports progress after each step.
type counting struct {
	inner       Strategy
	done, total int
	report      func(done, total int)
}

func (c *counting) Operate(v *Vehicle, d Demand) (Point, error) {
	p, err := c.inner.Operate(v, d)
	c.done++
	c.report(min(c.done, c.total), c.total)
	return p, err
}

// A Step is the state of the vehicle over one time step (evaluated at the
// step's mid-point speed).
type Step struct {
	Segment                int
	Start                  time.Duration // from the start of the day
	Duration               time.Duration
	Speed                  units.Speed
	Grade                  float64
	EngineSpeed            units.AngularVelocity
	EngineTorque           units.Torque
	Range                  int    // -1 with the drive disengaged
	RangeName              string // the range's name, when the transmission has names
	TransmissionEfficiency float64
	HydrostaticShare       float64
	Slip                   float64
	// FrontSlip and FrontShare are the front wheels' slip and the front
	// axle's share of the wheel torque with a transmission that drives
	// both axles (zero otherwise).
	FrontSlip, FrontShare float64
	FuelRate              units.MassFlow
	// Hydrostat is the loop's pressure and unit speeds and settings (zero
	// with the drive disengaged or when the transmission reports none).
	Hydrostat UnitState
}

// An Audit is the energy account of a segment or a day. It closes as
//
//	FuelEnergy = EngineLoss + EngineBraking + Hydrostatic + Mechanical + NoLoad
//	           + PTOLoss + PTOWork + Slip + Rolling + Brake + Drawbar + Trailer
//	           + Aero + Potential + Kinetic
//
// where EngineWork = FuelEnergy − EngineLoss, Potential is the gain in
// potential energy (m·g·Δh over tractor and trailer) and Kinetic the gain
// in kinetic energy (½·m_eq·(v₁² − v₀²), rotating parts included), both
// computed from the segment's states rather than summed from the steps.
type Audit struct {
	Duration   time.Duration
	Distance   units.Length
	Fuel       units.Mass
	FuelEnergy units.Energy
	EngineLoss units.Energy
	EngineWork units.Energy
	// EngineBraking is the energy the motored engine absorbs in overrun
	// (downhill, slowing), with the fuel cut.
	EngineBraking units.Energy
	// Transmission losses: hydrostatic, mechanical (load-dependent,
	// including the final drive) and no-load (load-independent drag, by
	// name in NoLoadParts, in the order first met).
	Hydrostatic, Mechanical, NoLoad units.Energy
	NoLoadParts                     []EnergyPart
	PTOLoss, PTOWork                units.Energy
	// Tyre losses of the tractor, and energy the brakes absorb.
	Slip, Rolling, Brake units.Energy
	// FrontSlip and RearSlip split Slip between the axles (a breakdown, not
	// further sinks); Circulating is the energy an axle driven backwards
	// returned into the driveline (a fixed lead in a turn), a measure and
	// not a sink.
	FrontSlip, RearSlip, Circulating units.Energy
	// Work done on the implement (draft), the trailer's rolling loss, drag.
	Drawbar, Trailer, Aero units.Energy
	Potential, Kinetic     units.Energy
	// MechanicalByElement is Mechanical computed independently: the sum
	// over the steps of each element's loss from its own model (see
	// Flows.MechanicalByElement). It is not part of Sinks: it checks the
	// residual line Mechanical.
	MechanicalByElement units.Energy
}

// An EnergyPart is one named line of an energy account.
type EnergyPart struct {
	Name   string
	Energy units.Energy
}

// addPart adds e to the part named name of parts.
func addPart(parts []EnergyPart, name string, e units.Energy) []EnergyPart {
	for i := range parts {
		if parts[i].Name == name {
			parts[i].Energy += e
			return parts
		}
	}
	return append(parts, EnergyPart{Name: name, Energy: e})
}

// Sinks returns the sum of every line the fuel energy goes to.
func (a Audit) Sinks() units.Energy {
	return a.EngineLoss + a.EngineBraking + a.Hydrostatic + a.Mechanical + a.NoLoad + a.PTOLoss + a.PTOWork +
		a.Slip + a.Rolling + a.Brake + a.Drawbar + a.Trailer + a.Aero + a.Potential + a.Kinetic
}

// Residual returns FuelEnergy − Sinks().
func (a Audit) Residual() units.Energy { return a.FuelEnergy - a.Sinks() }

// Turnover returns the energy that passes through the account: the fuel
// energy plus the magnitudes of the potential and kinetic energy changes
// (downhill or slowing, stored energy feeds the brakes and losses too).
func (a Audit) Turnover() units.Energy {
	return a.FuelEnergy + units.Energy(math.Abs(float64(a.Potential))+math.Abs(float64(a.Kinetic)))
}

// RelativeResidual returns |Residual|/Turnover (0 when nothing is left
// over).
func (a Audit) RelativeResidual() float64 {
	r := math.Abs(float64(a.Residual()))
	if r == 0 {
		return 0
	}
	return r / math.Max(float64(a.Turnover()), math.SmallestNonzeroFloat64)
}

// Volume returns the fuel volume burned at the fuel's density.
func (a Audit) Volume(f Fuel) units.Volume {
	return units.Volume(float64(a.Fuel) / float64(f.Density))
}

func (a *Audit) add(b Audit) {
	a.Duration += b.Duration
	a.Distance += b.Distance
	a.Fuel += b.Fuel
	a.FuelEnergy += b.FuelEnergy
	a.EngineLoss += b.EngineLoss
	a.EngineWork += b.EngineWork
	a.EngineBraking += b.EngineBraking
	a.Hydrostatic += b.Hydrostatic
	a.Mechanical += b.Mechanical
	a.NoLoad += b.NoLoad
	for _, p := range b.NoLoadParts {
		a.NoLoadParts = addPart(a.NoLoadParts, p.Name, p.Energy)
	}
	a.PTOLoss += b.PTOLoss
	a.PTOWork += b.PTOWork
	a.Slip += b.Slip
	a.FrontSlip += b.FrontSlip
	a.RearSlip += b.RearSlip
	a.Circulating += b.Circulating
	a.Rolling += b.Rolling
	a.Brake += b.Brake
	a.Drawbar += b.Drawbar
	a.Trailer += b.Trailer
	a.Aero += b.Aero
	a.Potential += b.Potential
	a.Kinetic += b.Kinetic
	a.MechanicalByElement += b.MechanicalByElement
}

// A SegmentResult is the outcome of one segment. Err is non-nil (a
// *SegmentError) when the segment could not be run; then Steps and Audit
// are empty and the day's totals leave it out.
type SegmentResult struct {
	Index int
	Name  string
	Kind  Kind
	Err   error
	Steps []Step
	Audit Audit
	// Flags are the rated limits crossed during the segment that did not
	// make it infeasible, one per name, with the largest value reached and
	// the time spent beyond the rating. Check them: they are warnings.
	Flags []Flag
}

// A Day is the result of a duty cycle.
type Day struct {
	// Design names the design or run; Simulate leaves it empty for the
	// caller to set. The CSV writers put it in every row.
	Design   string
	Segments []SegmentResult
	// Audit is the sum of the audits of the segments that ran.
	Audit Audit
}

// Err returns the segments' errors joined, or nil when every segment ran.
func (d Day) Err() error {
	var errs []error
	for _, s := range d.Segments {
		if s.Err != nil {
			errs = append(errs, s.Err)
		}
	}
	return errors.Join(errs...)
}

// piece is one time step of a segment before it is solved.
type piece struct {
	dt, v0, v1, grade float64
}

// Simulate runs the duty cycle with the vehicle under the strategy. The
// strategy is handed a copy of v that remembers the last answer LeastFuel
// or FixedSpeed gave, so a step that repeats the demand before it (every
// step of a steady segment does) is answered without a second search; the
// answer is the same, as the vehicle's parts (tyres, transmission, engine)
// answer the same question the same way. Each
// segment starts from its own speeds: only Accelerate changes speed within
// the account. A segment that cannot be run (bad input, beyond the engine,
// beyond traction, ...) is reported in its SegmentResult with the reason,
// and the rest of the cycle still runs. The returned error is non-nil only
// for a nil vehicle or strategy, an empty cycle (ErrEmptyCycle) or bad
// options.
func Simulate(v *Vehicle, s Strategy, cycle []Segment, opt Options) (Day, error) {
	if v == nil || s == nil {
		return Day{}, invalid("Simulate", math.NaN(), "needs a vehicle and a strategy")
	}
	if len(cycle) == 0 {
		return Day{}, ErrEmptyCycle
	}
	if opt.Step == 0 {
		opt.Step = time.Second
	}
	if opt.Step < time.Millisecond {
		return Day{}, invalid("Options.Step (s)", opt.Step.Seconds(), "must be at least 1 ms")
	}
	if opt.MaxSteps == 0 {
		opt.MaxSteps = 1_000_000
	}
	if opt.MaxSteps < 1 {
		return Day{}, invalid("Options.MaxSteps", float64(opt.MaxSteps), "must be positive")
	}
	if opt.Progress != nil {
		c := &counting{inner: s, report: opt.Progress}
		for _, seg := range cycle {
			if ps, err := seg.pieces(opt); err == nil {
				c.total += len(ps)
			}
		}
		s = c
	}
	// The strategy gets the vehicle with a memory of its last answer: the
	// steps of a steady segment repeat one demand (repeats).
	v = &Vehicle{s: v.s, rep: &repeats{}}
	day := Day{Segments: make([]SegmentResult, len(cycle))}
	var clock float64
	for i, seg := range cycle {
		res := SegmentResult{Index: i, Name: seg.Name, Kind: seg.Kind}
		pieces, err := seg.pieces(opt)
		if err != nil {
			res.Err = &SegmentError{Index: i, Name: seg.Name, Err: err}
			day.Segments[i] = res
			continue
		}
		var dur float64
		for _, p := range pieces {
			dur += p.dt
		}
		steps, audit, flags, at, err := v.run(s, seg, i, pieces, clock)
		if err != nil {
			res.Err = &SegmentError{Index: i, Name: seg.Name, At: seconds(at), Err: err}
		} else {
			res.Steps, res.Audit, res.Flags = steps, audit, flags
			day.Audit.add(audit)
		}
		day.Segments[i] = res
		clock += dur
	}
	return day, nil
}

// pieces validates the segment and splits it into time steps.
func (g Segment) pieces(opt Options) ([]piece, error) {
	dt := opt.Step.Seconds()
	v := float64(g.Speed)
	if err := isFinite("Segment.Grade", g.Grade); err != nil {
		return nil, err
	}
	if math.Abs(g.Grade) > 1 {
		return nil, invalid("Segment.Grade", g.Grade, "must be within ±1 (45°)")
	}
	var out []piece
	add := func(total, v0, v1, grade float64) error {
		n := math.Ceil(total/dt - 1e-9)
		if n < 1 {
			n = 1
		}
		if int(n)+len(out) > opt.MaxSteps || math.IsInf(n, 0) {
			return invalid("segment steps", n, "exceed Options.MaxSteps")
		}
		acc := (v1 - v0) / total
		t := 0.0
		for k := 0; k < int(n); k++ {
			h := math.Min(dt, total-t)
			if k == int(n)-1 {
				h = total - t
			}
			a0, a1 := v0+acc*t, v0+acc*(t+h)
			if k == int(n)-1 {
				a1 = v1
			}
			out = append(out, piece{dt: h, v0: a0, v1: a1, grade: grade})
			t += h
		}
		return nil
	}
	switch g.Kind {
	case FieldPass:
		if err := positive("Segment.Speed", g.Speed); err != nil {
			return nil, err
		}
		if err := positive("Segment.Distance", g.Distance); err != nil {
			return nil, err
		}
		return out, add(float64(g.Distance)/v, v, v, g.Grade)
	case HeadlandTurn:
		if err := positive("Segment.Speed", g.Speed); err != nil {
			return nil, err
		}
		if g.Duration <= 0 {
			return nil, invalid("Segment.Duration (s)", g.Duration.Seconds(), "must be positive")
		}
		return out, add(g.Duration.Seconds(), v, v, g.Grade)
	case RoadTransfer:
		if err := positive("Segment.Speed", g.Speed); err != nil {
			return nil, err
		}
		if len(g.Profile) == 0 {
			return nil, invalid("Segment.Profile", 0.0, "needs at least one stretch")
		}
		for _, st := range g.Profile {
			if err := positive("Stretch.Length", st.Length); err != nil {
				return nil, err
			}
			if !finite(st.Grade) || math.Abs(st.Grade) > 1 {
				return nil, invalid("Stretch.Grade", st.Grade, "must be finite and within ±1")
			}
			if err := add(float64(st.Length)/v, v, v, st.Grade); err != nil {
				return nil, err
			}
		}
		return out, nil
	case StationaryPTO:
		if g.Duration <= 0 {
			return nil, invalid("Segment.Duration (s)", g.Duration.Seconds(), "must be positive")
		}
		return out, add(g.Duration.Seconds(), 0, 0, g.Grade)
	case Accelerate:
		v0 := float64(g.StartSpeed)
		if err := nonNegative("Segment.StartSpeed", v0); err != nil {
			return nil, err
		}
		if err := positive("Segment.Speed", g.Speed); err != nil {
			return nil, err
		}
		if v <= v0 {
			return nil, invalid("Segment.Speed", v, "must exceed StartSpeed")
		}
		if err := positive("Segment.Acceleration", g.Acceleration); err != nil {
			return nil, err
		}
		return out, add((v-v0)/float64(g.Acceleration), v0, v, g.Grade)
	}
	return nil, invalid("Segment.Kind", float64(g.Kind), "is not a known kind")
}

// demandFor returns the demand of a piece of the segment.
func (g Segment) demandFor(p piece) (Demand, error) {
	vm := 0.5 * (p.v0 + p.v1)
	d := Demand{Speed: units.Speed(vm), Grade: p.grade, Acceleration: units.Acceleration((p.v1 - p.v0) / p.dt), Ground: g.Ground}
	if g.Kind == HeadlandTurn {
		d.TurnRadius = g.TurnRadius
	}
	if g.Kind == Accelerate || g.Kind == RoadTransfer {
		d.Trailer = g.Trailer
	}
	switch g.Kind {
	case FieldPass:
		if g.Implement != nil {
			dr, err := g.Implement.Draft(units.Speed(vm))
			if err != nil {
				return Demand{}, err
			}
			d.Draft = dr
			d.PTOPower, d.PTOSpeed = g.Implement.PTOPower, g.Implement.PTOSpeed
		}
	case StationaryPTO:
		d.PTOPower, d.PTOSpeed = g.PTOPower, g.PTOSpeed
		if g.Implement != nil {
			d.PTOPower, d.PTOSpeed = g.Implement.PTOPower, g.Implement.PTOSpeed
		}
	}
	return d, d.Validate()
}

// run solves the pieces of one segment.
func (v *Vehicle) run(s Strategy, g Segment, idx int, pieces []piece, clock float64) ([]Step, Audit, []Flag, float64, error) {
	steps := make([]Step, 0, len(pieces))
	var a Audit
	var t float64
	mEq := float64(v.s.Mass) + float64(v.s.RotatingMass)
	mGrav := float64(v.s.Mass)
	if g.Kind == Accelerate || g.Kind == RoadTransfer {
		mEq += float64(g.Trailer.Mass) + float64(g.Trailer.RotatingMass)
		mGrav += float64(g.Trailer.Mass)
	}
	var rise, dist float64
	var flags []Flag
	for _, pc := range pieces {
		d, err := g.demandFor(pc)
		if err != nil {
			return nil, Audit{}, nil, t, err
		}
		p, err := s.Operate(v, d)
		if err != nil {
			return nil, Audit{}, nil, t, err
		}
		h := pc.dt
		flags = addFlags(flags, p.Flags, seconds(h))
		f := p.Flows
		e := func(x units.Power) units.Energy { return units.Energy(float64(x) * h) }
		a.Fuel += units.Mass(float64(p.FuelRate) * h)
		a.FuelEnergy += e(f.Fuel)
		a.EngineLoss += e(f.EngineLoss)
		a.EngineWork += e(f.Engine)
		a.EngineBraking += e(f.EngineBraking)
		a.Hydrostatic += e(f.Hydrostatic)
		a.Mechanical += e(f.Mechanical)
		a.MechanicalByElement += e(f.MechanicalByElement)
		a.NoLoad += e(f.NoLoad)
		for _, part := range p.Drive.NoLoad {
			a.NoLoadParts = addPart(a.NoLoadParts, part.Name, e(part.Power))
		}
		a.PTOLoss += e(f.PTOLoss)
		a.PTOWork += e(f.PTO)
		a.Slip += e(f.Slip)
		a.FrontSlip += e(f.FrontSlip)
		a.RearSlip += e(f.RearSlip)
		a.Circulating += e(f.Circulating)
		a.Rolling += e(f.Rolling)
		a.Brake += e(f.Brake)
		a.Drawbar += e(f.Drawbar)
		a.Trailer += e(f.Trailer)
		a.Aero += e(f.Aero)
		ds := float64(d.Speed) * h
		dist += ds
		rise += ds * sinGrade(pc.grade)
		steps = append(steps, Step{
			Segment: idx, Start: seconds(clock + t), Duration: seconds(h),
			Speed: d.Speed, Grade: pc.grade, EngineSpeed: p.EngineSpeed, EngineTorque: p.EngineTorque,
			Range: p.Range, RangeName: p.Drive.RangeName, Hydrostat: p.Drive.Hydrostat,
			TransmissionEfficiency: p.TransmissionEfficiency(),
			HydrostaticShare:       p.Drive.HydrostaticShare, Slip: p.Slip, FuelRate: p.FuelRate,
			FrontSlip: p.FrontSlip, FrontShare: p.FrontShare,
		})
		t += h
	}
	v0, v1 := pieces[0].v0, pieces[len(pieces)-1].v1
	a.Kinetic = units.Energy(0.5 * mEq * (v1*v1 - v0*v0))
	a.Potential = units.Energy(mGrav * float64(units.Gravity) * rise)
	a.Distance = units.Length(dist)
	a.Duration = seconds(t)
	return steps, a, flags, t, nil
}

func seconds(s float64) time.Duration { return time.Duration(math.Round(s * 1e9)) }
