// Package vehicle puts a transmission design to work: a whole machine —
// engine, transmission, final drive, tyres, PTO — pulling implements and
// trailers through a working day, with the fuel it burns and an energy
// account that closes.
//
// # The machine
//
// A Vehicle is built by New from a Spec: its mass (and the equivalent
// translating mass of its rotating parts), drag area, the Tyres on the
// ground (a Traction), the Transmission from the engine to the final drive,
// the final drive ratio and efficiency, the Engine, the PTO and optionally
// its Geometry (wheelbase, centre of mass, hitch height), from which
// Vehicle.AxleLoads finds the axle loads and reports an unloaded front axle.
//
// The Transmission interface is small on purpose:
//
//	Ranges() int
//	Operate(range, engine speed, output speed, output torque) (DrivePoint, error)
//
// A DrivePoint gives the input torque the engine must supply and the losses
// split into hydrostatic and mechanical. FromLayout adapts any layout of the
// root package (solved by powersplit.Solver) to it; SplitEstimate is a quick
// estimate from the mechanical points for early studies. Traction is as
// small: SlipCurve is a simple exponential pull–slip model, and Tyres adapts
// the traction package's two-axle vehicle (Brixius and the other models).
//
// # Resistances
//
// The tyres must give the net pull
//
//	P = D + F_trailer + ½·ρ·c_d·A·v² + m·g·sin θ + (m + m_r)·a
//
// with D the implement draft, F_trailer = m_t·g·(f_t·cos θ + sin θ) +
// (m_t + m_tr)·a, θ = atan(grade) and m_r the rotating parts' equivalent
// mass m_r = Σ J·i²/r² (RotatingMass). The tyres add their own rolling
// resistance and slip: the wheel power is P·v + slip loss + rolling loss.
// When the load drives the vehicle (downhill, slowing) the power flows back
// through the transmission to the engine, which, motored with its fuel
// cut, absorbs up to its motoring torque (Engine.MotoringTorque: a measured
// curve from the spec, or the Chen–Flynn friction estimate); the service
// brakes absorb only the surplus. Caution: engine braking on a descent
// depends on the gear held and the engine's real motoring torque; brake
// sizing and descent speeds are governed by local regulations and the
// manufacturer's ratings, not by this estimate.
//
// # Implements
//
// Draft follows the ASABE D497 implement draft equation
//
//	D = F_i·[A + B·S + C·S²]·W·T
//
// (D in N, S travel speed in km/h, W width in m, rows or tools, T depth in
// cm, T = 1 for minor tillage and seeding, F_i the soil texture factor:
// Fine, Medium, Coarse). The table rows (MoldboardPlough, ChiselPlough,
// TandemDiskPrimary, FieldCultivatorPrimary, PlanterDrawn, ...) are from
// ASABE D497.7 (2011) Table 1 as recalled, not read: check them against
// the standard before relying on them. PTO-driven implements add PTO power
// (PTORow: P = a + b·W + c·F).
//
// # Engine and fuel
//
// NewEngine builds an engine from its full-load torque curve (interpolated
// piecewise linearly; speeds outside the curve and torques above it are
// *LimitError values wrapping ErrEngineLimit) and either a fuel map of
// specific fuel consumption over speed × torque (interpolated as fuel
// flow on the grid) or, without a map, the ASABE D497 equation
//
//	Q = (0.22·X + 0.096)·P_rated·[1 − (N/N_rated − 1)·(0.45·X − 0.877)]  L/h
//
// with X the load ratio. PTO540 and PTO1000 are the ISO 500-1 standard
// shaft speeds; a PTO speed demand fixes the engine speed through one of
// the PTO ratios (EngineSpeed).
// Under load the PTO driveline loses P·(1/η − 1); with no PTO power asked,
// a PTO with Idle set loses the drag of its open clutch plates and its
// bearings instead (PTOIdle.Power), in the PTO loss line.
//
// # Strategies
//
// A Strategy picks the engine speed and range for a Demand. LeastFuel
// searches every range and engine speed (sampled, then refined by Brent's
// minimiser) for the least fuel flow within every limit; FixedSpeed holds
// the engine at one speed (a hand throttle) and picks the range. Both honour
// a PTO speed demand. Vehicle.At solves one engine speed and range and is
// the primitive they share.
//
// # Two axles at their own speeds
//
// A FrontMotorDrive (an AxleTransmission, built by FromFrontMotorLayout from
// a layout with a powersplit.SecondMotor) drives the front axle by a second
// motor of the loop. With Tyres as the ground, Vehicle.At then solves each
// axle's slip from its own pull: the front axle's net pull N_f is found so
// that the torque the transmission gives the front wheels equals the torque
// their slip needs, with k·N_f + N_r = pull, where k is the front axle's
// travel speed over the rear's (1 straight ahead, in a turn of radius R the
// Ackermann relation of traction.Vehicle.Turn). The transmission gets both
// axles' speeds and the rear's torque and returns the front's. The front
// motor's setting is the layout's curve of travel speed (FrontSchedule) or
// the setting of least engine power at each point (FrontLeastPower). A
// mechanical front drive at a fixed lead runs turns through
// traction.Vehicle.FixedRatioTurn (Demand.TurnRadius, Segment.TurnRadius):
// the wind-up shows as Flows.Circulating. Flows and Audit split the slip
// loss between the axles (FrontSlip, RearSlip). When the load drives the
// vehicle (downhill, slowing) the rear wheels give power back through the
// transmission (overrun) until the engine absorbs its motoring torque; the
// service brakes take the rest.
//
// # Duty cycles and the energy audit
//
// Simulate runs a day of Segments — FieldPass, HeadlandTurn, RoadTransfer
// (trailer, grade profile), StationaryPTO, Accelerate — in time steps
// evaluated at the mid-step speed, and returns per-step states (engine
// point, range, efficiencies, slip, fuel) and an Audit per segment and for
// the day:
//
//	fuel energy = engine loss + engine braking + hydrostatic + mechanical
//	            + no-load + PTO loss + PTO work + slip + rolling + brake
//	            + drawbar + trailer rolling + drag + Δ potential + Δ kinetic
//
// where the no-load line (the transmission's load-independent drag) is also
// broken down by name (Audit.NoLoadParts).
//
// Δ kinetic is ½·m_eq·(v₁² − v₀²) from the segment's end speeds, which the
// mid-point rule reproduces exactly, so the account closes to rounding
// (RelativeResidual, relative to the energy turnover; tested below 1e-6).
// A segment that cannot be run is reported with its reason (a
// *SegmentError) and the rest of the day still runs. Day.WriteCSV and
// Day.WriteAuditCSV write the results.
//
// # Usage
//
//	v, err := vehicle.New(vehicle.Spec{Mass: units.Tonnes(9), Tyres: tyres,
//		Transmission: drive, FinalDrive: 20, Engine: engine})
//	day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{})
//	fmt.Println(day.Audit.Fuel, day.Audit.RelativeResidual())
//
// # Cautions
//
// The package estimates; it does not certify. Road speed with a trailer,
// braking on grades, ballast, hitch loads and tyre load ratings are governed
// by local regulations and by the manufacturers' ratings; decisions that
// bear on safety need physical tests and qualified engineers. The model
// reports an unloaded front axle (ErrStability, through Tyres), pulls beyond
// traction (ErrTraction) and rated limits crossed (Point.Flags,
// SegmentResult.Flags) rather than hiding them, but it does not model
// braking capacity, stability on side slopes or the trailer's own brakes.
//
// # Sources
//
// ASABE D497.7 (2011), Agricultural Machinery Management Data: implement
// draft (Table 1) and tractor fuel consumption, after Predicting tractor
// fuel consumption, Applied Engineering in Agriculture 20(5), 2004 (from
// memory). ISO 500-1:2014 for the PTO speeds. Theory of Ground Vehicles,
// 3rd ed., Wiley, 2001, for road rolling-resistance coefficients. ISO 2533
// for the standard air density. The engine's motoring torque: Development
// of a single cylinder compression ignition research engine, SAE paper
// 650733, 1965 (from memory).
package vehicle
