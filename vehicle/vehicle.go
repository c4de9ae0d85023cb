package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// Spec describes a vehicle. Zero optional fields take the documented
// defaults.
type Spec struct {
	// Mass is the operating mass (with ballast and mounted implement), > 0.
	Mass units.Mass
	// RotatingMass is the translating mass equivalent to the rotating
	// wheels and driveline (see RotatingMass), >= 0; default 0.
	RotatingMass units.Mass
	// DragArea is the drag coefficient times the frontal area, c_d·A;
	// default 0 (no aerodynamic drag).
	DragArea units.Area
	// AirDensity for the drag; default AirDensity.
	AirDensity units.Density
	// Tyres are the wheels on the ground. Required.
	Tyres Traction
	// Transmission is the drive from the engine to the final drive. Required.
	Transmission Transmission
	// FinalDrive is the ratio of transmission output speed to wheel-shaft
	// speed (> 0); required.
	FinalDrive float64
	// FinalDriveEfficiency of the final drives in (0, 1]; default 0.97.
	FinalDriveEfficiency float64
	// Engine is the engine. Required.
	Engine *Engine
	// PTO is the power take-off driveline; zero means none.
	PTO PTO
	// Geometry of the centre of mass and hitch; nil skips the axle-load
	// check (the Tyres adapter makes its own).
	Geometry *Geometry
}

// DefaultFinalDriveEfficiency is used when Spec.FinalDriveEfficiency is zero.
// Common practice (no published source): about 0.97 for a bevel set and
// planetary final drives.
const DefaultFinalDriveEfficiency = 0.97

// A Vehicle is a built, immutable vehicle, safe for concurrent use when its
// Tyres and Transmission are.
type Vehicle struct {
	s Spec
	// rep, set on the vehicle a simulation hands its strategy, remembers
	// the strategy's last answer (repeats).
	rep *repeats
}

// New validates the spec and builds the vehicle.
func New(s Spec) (*Vehicle, error) {
	if err := positive("Spec.Mass", s.Mass); err != nil {
		return nil, err
	}
	if err := nonNegative("Spec.RotatingMass", s.RotatingMass); err != nil {
		return nil, err
	}
	if err := nonNegative("Spec.DragArea", s.DragArea); err != nil {
		return nil, err
	}
	if s.AirDensity == 0 {
		s.AirDensity = AirDensity
	}
	if err := positive("Spec.AirDensity", s.AirDensity); err != nil {
		return nil, err
	}
	if s.Tyres == nil {
		return nil, invalid("Spec.Tyres", math.NaN(), "is required")
	}
	if s.Transmission == nil || s.Transmission.Ranges() < 1 {
		return nil, invalid("Spec.Transmission", math.NaN(), "is required and needs a range")
	}
	if err := positive("Spec.FinalDrive", s.FinalDrive); err != nil {
		return nil, err
	}
	if s.FinalDriveEfficiency == 0 {
		s.FinalDriveEfficiency = DefaultFinalDriveEfficiency
	}
	if err := fraction("Spec.FinalDriveEfficiency", s.FinalDriveEfficiency); err != nil {
		return nil, err
	}
	if s.Engine == nil {
		return nil, invalid("Spec.Engine", math.NaN(), "is required")
	}
	if err := s.PTO.validate(); err != nil {
		return nil, err
	}
	if s.Geometry != nil {
		g := *s.Geometry
		if err := g.validate(); err != nil {
			return nil, err
		}
		s.Geometry = &g
	}
	return &Vehicle{s: s}, nil
}

// Spec returns the vehicle's spec with defaults filled in.
func (v *Vehicle) Spec() Spec { return v.s }

// Engine returns the vehicle's engine.
func (v *Vehicle) Engine() *Engine { return v.s.Engine }

// A Demand is what the vehicle is asked to do at one instant.
type Demand struct {
	Speed        units.Speed        // travel speed, >= 0
	Acceleration units.Acceleration // along the travel direction
	Draft        units.Force        // implement draft at the hitch, >= 0
	Trailer      Trailer            // towed trailer; zero value: none
	Grade        float64            // rise over run; positive uphill
	PTOPower     units.Power        // power at the PTO shaft, >= 0
	// PTOSpeed is the PTO shaft speed demanded (PTO540, PTO1000); it fixes
	// the engine speed. Zero: any PTO speed.
	PTOSpeed units.AngularVelocity
	// Ground is the tyres on the surface of this demand; nil means the
	// vehicle's Spec.Tyres.
	Ground Traction
	// TurnRadius is the radius of the rear axle centre's path in a steady
	// turn; zero means straight ahead. In a turn the front axle travels
	// faster than the rear (the Ackermann relation of traction.Vehicle.Turn):
	// a mechanical front drive at a fixed lead winds up, a front axle with
	// a motor of its own (AxleTransmission) runs at its own speed.
	TurnRadius units.Length
}

// Validate reports whether the demand is usable.
func (d Demand) Validate() error {
	if err := nonNegative("Demand.Speed", d.Speed); err != nil {
		return err
	}
	if err := isFinite("Demand.Acceleration", d.Acceleration); err != nil {
		return err
	}
	if err := nonNegative("Demand.Draft", d.Draft); err != nil {
		return err
	}
	if err := d.Trailer.Validate(); err != nil {
		return err
	}
	if err := isFinite("Demand.Grade", d.Grade); err != nil {
		return err
	}
	if math.Abs(d.Grade) > 1 {
		return invalid("Demand.Grade", d.Grade, "must be within ±1 (45°)")
	}
	if err := nonNegative("Demand.PTOPower", d.PTOPower); err != nil {
		return err
	}
	if err := nonNegative("Demand.TurnRadius", d.TurnRadius); err != nil {
		return err
	}
	return nonNegative("Demand.PTOSpeed", d.PTOSpeed)
}

// Flows are the power flows of an operating point, all in watts. They
// balance in two stages:
//
//	Fuel   = EngineLoss + Engine
//	Engine = EngineBraking + Hydrostatic + Mechanical + NoLoad + PTOLoss + PTO
//	         + Slip + Rolling + Brake + Drawbar + Trailer + Aero + Grade + Inertia
//
// Hydrostatic, Mechanical and NoLoad are the transmission's losses
// (Mechanical the load-dependent rest including the final drive, NoLoad
// the load-independent drag, by name in Drive.NoLoad), Slip and Rolling
// the tractor's tyre losses. When the load drives the vehicle (downhill,
// slowing) the power flows back: the engine, motored, absorbs up to its
// motoring torque (EngineBraking, with Engine and Fuel zero) and the
// service brakes absorb the rest (Brake). Drawbar is the implement's draft times speed,
// Trailer the trailer's rolling loss, Grade and Inertia the rate of change
// of potential and kinetic energy of tractor and trailer.
//
// Mechanical is a residual (it closes the chain). MechanicalByElement is the
// same loss computed independently, element by element from each one's own
// model: the transmission's mechanical losses as it reports them plus the
// final drive's loss from its efficiency. The two agree to rounding when
// every loss is accounted for; the audit carries both.
type Flows struct {
	Fuel, EngineLoss, Engine               units.Power
	EngineBraking                          units.Power
	Hydrostatic, Mechanical, PTOLoss, PTO  units.Power
	NoLoad                                 units.Power
	Slip, Rolling, Brake                   units.Power
	Drawbar, Trailer, Aero, Grade, Inertia units.Power
	MechanicalByElement                    units.Power
	// FrontSlip and RearSlip split Slip between the axles (they are a
	// breakdown of Slip, not further sinks; zero when the ground does not
	// report them). Circulating is the power an axle driven backwards
	// returns into the driveline (a fixed lead in a turn), carried by the
	// other axle on top of the useful power: a measure, not a sink.
	FrontSlip, RearSlip, Circulating units.Power
}

// A Point is a solved operating point.
type Point struct {
	Demand       Demand
	EngineSpeed  units.AngularVelocity
	EngineTorque units.Torque
	// LoadRatio is the engine torque over the full-load torque at its speed.
	LoadRatio float64
	FuelRate  units.MassFlow
	// Range is the transmission range in use, -1 with the drive disengaged
	// (standing still).
	Range int
	Drive DrivePoint
	// Slip of the driven wheels (the rear wheels when both axles drive).
	Slip float64
	// FrontSlip is the front wheels' slip and FrontShare the front axle's
	// share of the wheel torque, when the transmission drives both axles
	// at their own speeds (AxleTransmission); zero otherwise.
	FrontSlip, FrontShare float64
	// Pull is the net pull the tyres give (drawbar + trailer + grade + drag + inertia).
	Pull  units.Force
	Flows Flows
	// Flags are the rated limits crossed that do not make the point
	// infeasible (tyre load above its rating, a transmission rating).
	Flags []Flag
}

// FlagTyreOverload is the name of the flag of a tyre carrying more than its
// rated load.
const FlagTyreOverload = "tyre load"

// TransmissionEfficiency returns the transmission's output over input
// power, 0 with the drive disengaged.
func (p Point) TransmissionEfficiency() float64 {
	if p.Range < 0 {
		return 0
	}
	return p.Drive.Efficiency(p.EngineSpeed)
}

// At solves the demand with the engine at speed w and the transmission in
// range rng. It is the primitive the strategies search over. Standing
// still (zero speed and acceleration) disengages the drive and rng is
// ignored.
func (v *Vehicle) At(d Demand, w units.AngularVelocity, rng int) (Point, error) {
	return v.at(d, w, rng, nil, nil)
}

// at is At; a non-nil ty holds what does not depend on the engine speed
// or range (d's validation, the axle loads and the tyres' solution of d), solved on the
// first call that needs it and reused by the others of a search, and a
// non-nil buf gives a LayoutDrive's point its slices.
func (v *Vehicle) at(d Demand, w units.AngularVelocity, rng int, ty *tyreMemo, buf *driveBuf) (Point, error) {
	if err := ty.validate(d); err != nil {
		return Point{}, err
	}
	if !finite(float64(w)) || w <= 0 {
		return Point{}, invalid("engine speed", w, "must be finite and positive")
	}
	s := &v.s
	p := Point{Demand: d, EngineSpeed: w, Range: -1}
	f := &p.Flows
	vs := float64(d.Speed)

	// PTO.
	if d.PTOPower > 0 || d.PTOSpeed > 0 {
		if len(s.PTO.Ratios) == 0 {
			return Point{}, invalid("Demand.PTOPower", d.PTOPower, "needs a vehicle with a PTO")
		}
		if s.PTO.MaxPower > 0 && d.PTOPower > s.PTO.MaxPower {
			return Point{}, &LimitError{Quantity: "PTO power", Value: units.Of(d.PTOPower), Bound: "PTO rating", Limit: units.Of(s.PTO.MaxPower), Err: ErrPTOLimit}
		}
		if d.PTOSpeed > 0 && !s.PTO.matches(w, d.PTOSpeed) {
			return Point{}, &LimitError{Quantity: "engine speed", Value: units.Of(w),
				Bound: "engine speed for the PTO speed", Limit: units.Of(units.AngularVelocity(s.PTO.Ratios[0] * float64(d.PTOSpeed))), Err: ErrInfeasible}
		}
		if s.PTO.MaxPower == 0 && d.PTOPower > 0 {
			p.Flags = append(p.Flags, Flag{Name: "PTO power: PTO rating not given, not checked", Unchecked: true})
		}
		f.PTO = d.PTOPower
		f.PTOLoss = units.Power(float64(d.PTOPower) * (1/s.PTO.efficiency() - 1))
	}
	if d.PTOPower == 0 && s.PTO.Idle != nil {
		// The PTO driveline turns without load: its idle drag.
		f.PTOLoss = s.PTO.Idle.Power(w)
	}
	ptoTorque := units.TorqueFromPower(f.PTO+f.PTOLoss, w)

	// Resistances.
	m := float64(s.Mass)
	mt := float64(d.Trailer.Mass)
	a := float64(d.Acceleration)
	f.Drawbar = units.PowerFromForce(d.Draft, d.Speed)
	f.Trailer = units.PowerFromForce(d.Trailer.rolling(d.Grade), d.Speed)
	aero := AeroDrag(s.DragArea, s.AirDensity, d.Speed)
	f.Aero = units.PowerFromForce(aero, d.Speed)
	f.Grade = units.Power((m + mt) * float64(units.Gravity) * sinGrade(d.Grade) * vs)
	f.Inertia = units.Power((m + float64(s.RotatingMass) + mt + float64(d.Trailer.RotatingMass)) * a * vs)
	pull := float64(d.Draft) + float64(d.Trailer.Pull(d.Grade, d.Acceleration)) + float64(aero) +
		float64(GradeResistance(s.Mass, d.Grade)) + float64(InertiaResistance(s.Mass, s.RotatingMass, d.Acceleration))
	p.Pull = units.Force(pull)

	if s.Geometry != nil {
		if err := ty.axleLoads(v, d); err != nil {
			return Point{}, err
		}
	}

	driveTorque := units.Torque(0)
	ground := s.Tyres
	if d.Ground != nil {
		ground = d.Ground
	}
	at, axleDrive := s.Transmission.(AxleTransmission)
	if vs > 0 && axleDrive {
		t, err := v.axlesPoint(&p, at, ground, pull, d, w, rng, ptoTorque, ty)
		if err != nil {
			return Point{}, err
		}
		driveTorque = t
	}
	if vs > 0 && !axleDrive {
		wh, err := ty.drive(ground, units.Force(math.Max(pull, 0)), d)
		if err != nil {
			return Point{}, err
		}
		if !finite(float64(wh.Power), float64(wh.Speed), wh.Slip, float64(wh.SlipLoss), float64(wh.RollingLoss)) || wh.Speed <= 0 {
			return Point{}, invalid("Traction.Drive", math.NaN(), "returned a non-finite or non-positive state")
		}
		useful := math.Max(pull, 0) * vs
		if bal := float64(wh.Power) - float64(wh.SlipLoss) - float64(wh.RollingLoss) - useful; math.Abs(bal) > 1e-6*math.Max(float64(wh.Power), 1) {
			return Point{}, &LimitError{Quantity: "tyre power balance", Value: units.Of(units.Power(bal)), Bound: "tolerance", Limit: units.Of(units.Power(1e-6 * float64(wh.Power))), Err: ErrTraction}
		}
		p.Slip = wh.Slip
		if wh.Overloaded {
			p.Flags = append(p.Flags, Flag{Name: FlagTyreOverload, Value: units.Of(wh.TyreLoad), Limit: units.Of(wh.RatedLoad)})
		}
		if wh.Outside != "" {
			p.Flags = append(p.Flags, Flag{Name: "traction model outside its fitted range: " + wh.Outside, Extrapolated: true})
		}
		if wh.Unrated != "" {
			p.Flags = append(p.Flags, Flag{Name: wh.Unrated + " " + FlagTyreOverload, Unchecked: true})
		}
		f.Rolling = wh.RollingLoss
		// Close the tyre balance exactly on the slip loss (its rounding is
		// within the check above).
		f.Slip = units.Power(float64(wh.Power) - float64(wh.RollingLoss) - useful)
		f.FrontSlip, f.RearSlip, f.Circulating = wh.FrontSlipLoss, wh.RearSlipLoss, wh.Circulating
		wheelPower := float64(wh.Power)
		if pull < 0 {
			wheelPower += pull * vs
		}
		rng = min(max(rng, 0), s.Transmission.Ranges()-1)
		out := units.AngularVelocity(float64(wh.Speed) * s.FinalDrive)
		// wp is the wheel power into the drive: positive driving, negative
		// in overrun, when the final drive passes on η_fd of it backwards.
		operate := func(wp float64) (DrivePoint, error) {
			ot := units.Torque(wp / s.FinalDriveEfficiency / float64(out))
			if wp < 0 {
				ot = units.Torque(wp * s.FinalDriveEfficiency / float64(out))
			}
			var (
				dp  DrivePoint
				err error
			)
			if ld, ok := s.Transmission.(*LayoutDrive); ok && buf != nil {
				dp, err = ld.operate(rng, w, out, ot, buf)
			} else {
				dp, err = s.Transmission.Operate(rng, w, out, ot)
			}
			if err != nil {
				return dp, err
			}
			pin := float64(units.PowerFromTorque(dp.InputTorque, w))
			pout := float64(units.PowerFromTorque(dp.OutputTorque, dp.OutputSpeed))
			losses := float64(dp.HydrostaticLoss) + float64(dp.MechanicalLoss) + float64(dp.NoLoadLoss)
			if !finite(pin, pout, losses) || dp.HydrostaticLoss < 0 || dp.MechanicalLoss < 0 || dp.NoLoadLoss < 0 ||
				math.Abs(pin-pout-losses) > 1e-6*math.Max(math.Abs(pin), 1) ||
				math.Abs(pout-float64(ot)*float64(out)) > 1e-6*math.Max(math.Abs(pout), 1) {
				return dp, &LimitError{Quantity: "transmission power balance", Value: units.Of(units.Power(pin - pout - losses)), Bound: "tolerance", Limit: units.Of(units.Power(1e-6 * math.Abs(pin))), Err: ErrTransmission}
			}
			return dp, nil
		}
		wp := wheelPower
		dp, err := operate(wp)
		if err != nil {
			return Point{}, err
		}
		if wp < 0 {
			// Overrun: the engine absorbs up to its motoring torque; the
			// service brakes take the rest of the wheel power.
			tm := float64(v.s.Engine.MotoringTorque(w))
			if float64(dp.InputTorque+ptoTorque) < -tm {
				var ferr error
				g := func(x float64) float64 {
					d, err := operate(x)
					if err != nil {
						ferr = err
						return math.NaN()
					}
					return float64(d.InputTorque+ptoTorque) + tm
				}
				x, err := numeric.Brent(g, wheelPower, 0, 1e-9*math.Abs(wheelPower), 100)
				if ferr != nil {
					return Point{}, ferr
				}
				if err != nil {
					return Point{}, &LimitError{Quantity: "overrun wheel power", Value: units.Of(units.Power(wheelPower)), Bound: "no engine braking share found above", Limit: units.Of(units.Power(0)), Err: ErrTransmission}
				}
				wp = x
				if dp, err = operate(wp); err != nil {
					return Point{}, err
				}
			}
			f.Brake = units.Power(wp - wheelPower)
		}
		pin := float64(units.PowerFromTorque(dp.InputTorque, w))
		p.Range = rng
		p.Drive = dp
		if len(p.Flags) == 0 {
			// The drive's flags, shared: capacity-limited, an append copies.
			p.Flags = dp.Flags[:len(dp.Flags):len(dp.Flags)]
		} else {
			p.Flags = append(p.Flags, dp.Flags...)
		}
		driveTorque = dp.InputTorque
		f.Hydrostatic = dp.HydrostaticLoss
		f.NoLoad = dp.NoLoadLoss
		// The mechanical line takes the final drive and the transmission's
		// own closure rounding, so the chain closes exactly.
		f.Mechanical = units.Power(pin - float64(dp.HydrostaticLoss) - float64(dp.NoLoadLoss) - wp)
		fd := wp * (1/s.FinalDriveEfficiency - 1)
		if wp < 0 {
			fd = -wp * (1 - s.FinalDriveEfficiency)
		}
		f.MechanicalByElement = dp.MechanicalLoss + units.Power(fd)
	}
	// Standing still, the brakes hold any net pull and no work is done.

	// Engine. Driven by the load (et < 0), it is motored: it absorbs its
	// motoring torque at most (the brakes took the rest above) and burns
	// no fuel.
	// Common practice (no published source): electronically governed
	// diesels cut injection entirely while the load drives them above
	// idle speed (overrun fuel cut-off); the fuel map, measured with the
	// engine driving, says nothing about this range.
	et := driveTorque + ptoTorque
	max, err := v.s.Engine.MaxTorque(w)
	if err != nil {
		return Point{}, err
	}
	p.EngineTorque = et
	p.LoadRatio = float64(et) / float64(max)
	if et < 0 {
		if tm := v.s.Engine.MotoringTorque(w); et < -tm*(1+1e-6) {
			return Point{}, &LimitError{Quantity: "engine motored torque", Value: units.Of(-et), Bound: "motoring torque", Limit: units.Of(tm), EngineSpeed: w, Err: ErrEngineLimit}
		}
		f.EngineBraking = units.Power(-float64(et) * float64(w))
		return p, nil
	}
	if err := v.s.Engine.check(w, et); err != nil {
		return Point{}, err
	}
	fuel, err := v.s.Engine.FuelRate(w, et)
	if err != nil {
		return Point{}, err
	}
	p.FuelRate = fuel
	f.Engine = units.Power(float64(et) * float64(w))
	f.Fuel = units.Power(float64(fuel) * float64(v.s.Engine.fuel.HeatingValue))
	f.EngineLoss = f.Fuel - f.Engine
	if f.EngineLoss < 0 {
		return Point{}, &LimitError{Quantity: "engine efficiency", Value: units.Plain(float64(f.Engine) / float64(f.Fuel)), Limit: units.Plain(1), Err: ErrInvalid}
	}
	return p, nil
}
