// Package powersplit computes the steady state of continuously variable
// hydro-mechanical power-split transmissions for off-road vehicles. The
// module is a set of packages, each building on those before it: units
// (typed SI quantities), planetary (epicyclic sets: kinematics, statics and
// mesh losses), hydrostat (axial-piston units, loss models, oil and closed
// loops with their displacement schedules), traction (tyres on soil and
// road), powersplit (this package: transmissions composed from shafts and
// elements, and the one solver for all of them) and vehicle (the whole
// machine over a working day). Every element port has the speed of its
// shaft and the torque the shaft applies to the element, so the power into
// an element at a port is T·ω, the sum of those powers over an element's
// ports is its loss, and no loss is negative.
//
// # Layouts: shafts and elements
//
// A layout is a small network. Shafts are nodes with one speed each;
// elements connect them through ports:
//
//	element            ports                 kinematics                     torques and loss
//	gear pair          a, b                  ωb = r·ωa                      r·Tb + k·Ta = 0, k = η (a drives) or 1/η (b drives)
//	planetary set      sun, ring, carrier    ωs − i0·ωr − (1−i0)·ωc = 0     Tr = kR·Ts, Tc = −(1+kR)·Ts (planetary.Set.TorqueFactors)
//	hydrostatic loop   pump, motor 1, ...    none: its ratio is free        T = f(Δp) for each unit (hydrostat.Loop.At)
//	clutch             a, b                  engaged: ωa = ωb               engaged: Ta + Tb = 0; open: Ta = Tb = 0
//	brake              a                     engaged: ωa = 0                open: Ta = 0
//	input              engine shaft          ω given                        torque solved
//	output             one shaft             ω given                        torque given
//	free output        one shaft             ω given                        torque solved
//	PTO                its own shaft         geared to its source           torque given
//
// Compose a layout with a Builder:
//
//	b := powersplit.NewBuilder()
//	engine, pump, motor, out := b.Shaft("engine"), b.Shaft("pump"), b.Shaft("motor"), b.Shaft("output")
//	b.Input("engine", engine)
//	b.Gear("pump gear", engine, pump, 1.1, 0.985) // ωpump = 1.1·ωengine
//	b.Loop("hydrostat", loop, pump, motor)        // loop from hydrostat.NewLoop
//	b.Gear("final", motor, out, 0.5, 0.985)
//	b.Output("output", out)
//	b.PTO("PTO", engine, 1000.0/2000, 0.985)     // 1000 rpm at 2000 rpm engine speed
//	layout, err := b.Build()
//
// Build validates the network and reports, as typed errors: a shaft with no
// element (ErrUnconnected), two members of a set or two units of a loop on
// one shaft, duplicate names, no or two inputs, no output, a range that
// engages an unknown clutch (all ErrLayout, in a *LayoutError); for every
// range, kinematics that leave shaft speeds free or over-constrain them
// (a *KinematicsError naming the free shafts), and a torque balance with more
// or fewer equations than unknowns (ErrTorques: the number of outputs with a
// given torque must equal the number of loops). A built Layout is immutable
// and safe to share between goroutines.
//
// Ranges are named sets of engaged clutches and brakes (Builder.Range); a
// range may carry a speed limit for the first output (Builder.RangeLimit),
// for example a second motor declutched above a set speed.
//
// # The solver
//
// Solver.Solve takes a Point — range, input speed, one speed and torque per
// output, one torque per PTO — and fills a State:
//
//	s := powersplit.NewSolver(layout)
//	var st powersplit.State
//	err := s.Solve(powersplit.Point{
//		Range:   0,
//		Input:   units.RPM(2000),
//		Outputs: []powersplit.OutputDemand{{Speed: units.RPM(300), Torque: units.NewtonMetres(2500)}},
//		PTO:     []units.Torque{units.NewtonMetres(200)},
//	}, &st)
//
// Kinematics first: with every loop's ratio free, the constraint rows of the
// range form a square, non-singular system K·ω = B·[ωin, ωout…]. Build
// factors it once per range, so at a point the shaft speeds are a small
// matrix–vector product. The loops' schedules then set the displacements
// from the unit speeds.
//
// Torques next: the unknowns are every port torque and every loop's pressure
// difference Δp; the rows are the torque balance of each shaft (ΣT = 0 over
// its ports) and the relations of the table above. Gear and planetary
// relations depend on the direction the power flows, and the units' torques
// on Δp through their loss models, so the solver iterates: a lossless first
// pass, then loss directions from the powers of the last solution and each
// loop linearised about its last Δp (a quasi-Newton method: the slope
// ∂T/∂Δp of each unit is that of its ideal torque at the first iterate,
// then a secant through the last two iterates, and a finite step where
// neither serves), until Δp stops changing and no direction changes.
// Iterates beyond
// 1.5 times the relief pressure are held there, and a point that keeps
// asking for more is infeasible. Where Newton's method does not settle (loss
// models with kinks, a unit near zero displacement) the pressure of a single
// loop is bracketed over ±1.5 times the relief pressure and found by Brent's
// method; no bracket means the loop cannot give the torque the point needs
// (ErrInfeasible). An element whose direction keeps flipping carries almost
// no power; if the directions oscillate, every combination of the flipping
// ones is tried with Δp iterated alone, and the first self-consistent one is
// kept; when none is, there is no steady state (ErrSelfLocking). The power
// balance
//
//	P_in = Σ P_out + Σ P_PTO + Σ losses
//
// is then checked with every loss computed from its element's model (gear
// (1−η)·P_driving, set (1−η0)·rolling power, loop from the unit loss
// models) and must close to 1e-9 relative, else a *ConvergenceError. The
// torque system is factored once per range and set of loss directions (a
// sparse LU with partial pivoting, internal/sparse) and each iteration
// solved by a low-rank (Woodbury) update of that factorisation, in the
// Solver's own storage: repeated solves allocate nothing.
//
// # The compiled path
//
// Almost every layout has one hydrostatic loop, and there the iteration
// above reduces to one equation. With the loss directions fixed and the
// units' torques τ given, every port torque is a fixed linear function of
// the given output and PTO torques b and of τ, T_port = H·b + W·τ, from the
// factored system of the range and directions; the torques balance at the
// loop pressure Δp where
//
//	F(Δp) = H_X·b + W_X·τ(Δp) + z_X(Δp) = 0
//
// (X the row of the pressure, z the drag sources' part, which for a charge
// pump follows the loop's leakage). hydrostat.Curve gives τ(Δp), the
// leakage and their exact slopes, so Newton's method settles in three or
// four evaluations from Δp = 0; the directions read off the solution must be
// those assumed, else the equation is solved again with the new ones. The
// first guess is the directions of the last point of the same range with
// the same signs of output power and unit speeds; a torque within
// rounding reads the same whatever the guess, and a guess that fails is
// followed by the lossless start, so a point's result never depends on
// the points solved before it. Solve takes this path by itself wherever
// it applies, motors held at settings of their own included (a second
// motor's curve or a Point's Settings: the loop's Pinned schedule), and
// hands every point it cannot decide (several loops, a schedule other than
// Sequential or Pinned, a locked range, a pump near standstill, directions
// that oscillate, a pressure pressed beyond the relief, a limit crossed
// other than a setting limit) to the iteration above, so the errors are
// the same; both paths
// give the same state to 1e-12 (property tests check it over random
// layouts). A State with Brief set gets the summary a sweep, map or search
// reads, and the compiled path then computes only the port torques that
// summary needs.
//
// Limits are errors, never hidden: a *LimitError carries the quantity,
// value and limit. ErrUnreachable (also matching ErrInfeasible) means no
// displacement setting gives the speed ratio asked for; ErrInfeasible
// covers the loop's relief pressure, unit speed and peak pressure limits and
// a range's output speed limit. State.Margins lists the distance from every
// limit at a feasible point, and every limit a unit's spec leaves at zero
// as not checked (Margin.Unchecked; Layout.Unrated lists them without a
// point); State.Flags lists rated continuous pressures exceeded below the
// relief setting. Margins and limit errors carry units.Measure values,
// which print in the trade's units (bar, rpm, cm³/rev).
//
// # The summary and the full state
//
// One call solves a point, Solver.Solve, and one kind of value holds the
// result, State. A sweep, a map or a design search reads a few numbers per
// point; writing every port, shaft, element and margin costs more than
// solving the point. So a caller that needs only those few sets
// State.Brief before Solve: the State then holds the summary (range, input
// torque and power, outputs and PTOs, losses, efficiency, hydraulic share,
// each loop's pressure, settings, unit speeds and torques, the flags and
// the binding margin, State.Binding, the limit with the least room left)
// and leaves Shafts, Elements and Margins empty. Everything it holds equals
// the full State of the same point to rounding, and the errors are the
// same. The zero State (Brief unset) gets the full state, as before; to
// see the full state of a point found with Brief States (the best
// candidate of a search), solve it again with Brief unset. Sweeps, maps and
// the vehicle's drive use Brief States.
//
// # Hydraulic power share
//
// State.HydraulicShare is the power the pump delivers into the loop, Δp·Q,
// over the input power: positive when power passes from the pump to the
// motors, negative when it passes back (circulating power). Lossless, with
// ν = ωout/ωin and ν_p, ν_m the ratios at which the pump and the motor stop
// (mechanical points), it is
//
//	compound split:  P_h/P_in = (ν − ν_p)(ν − ν_m) / (ν·(ν_m − ν_p))
//	output-coupled:  P_h/P_in = 1 − ν/ν_M        (motor on the output: ν_m = 0)
//	input-coupled:   P_h/P_in = 1 − ν_M/ν        (pump on the input: ν_p → ∞)
//
// (Hydrostatic power-splitting transmissions for wheeled vehicles:
// classification and theory of operation, SAE paper 680549, 1968;
// Continuously variable tractor transmissions, ASAE Distinguished Lecture
// Series No. 29, 2005; Design parameters for continuously variable
// power-split transmissions using planetaries with 3 active shafts,
// Journal of Terramechanics 47, 2010; from memory), and in general
// P_h/P_in = d ln ν / d ln r with r = ωmotor/ωpump, the sensitivity of the
// overall ratio to the variator's ratio. That identity follows from the
// lossless power balance of a one-degree-of-freedom network (the variator's
// power is its torque times the change of speed its ratio makes); a general
// proof by matrix algebra is published in Proceedings of the IMechE, Part
// D, vol. 205, 1991, doi:10.1243/PIME_PROC_1991_205_151_02 (read: its
// abstract only; its authors and title are not checked here).
// At a mechanical point the share is zero and the transmission is purely
// mechanical: its efficiency is the product of the gear and planetary
// efficiencies on the mechanical path. The tests check all of this on every
// builder and on a compound split.
//
// # Builders
//
// The standard layouts are functions over the same elements, solved by the
// same solver:
//
//   - OutputCoupled: the planetary set at the input splits the engine power
//     between the pump and the summing shaft; the motor adds on the summing
//     shaft, which drives the output through range gears and clutches.
//   - InputCoupled: the pump turns at a fixed ratio to the engine; the set
//     sums the engine's mechanical path and the motor on the output side.
//   - PureHydrostatic: pump to motor to the range gears; optionally a
//     SecondMotor driving a second output (an axle of its own, a free
//     output) declutched and braked above a set speed.
//
// Each takes any number of RangeGears and PTOs; the units turn both ways,
// so reverse comes from the hydrostat. A split's range gear may start from
// the planetary member on the hydrostat's side (RangeGear.FromVariator): in
// an output-coupled split the units then swap roles (the share is counted
// from motor to pump, Builder.ReverseShare), in an input-coupled split the
// range is purely hydrostatic. A compound split with two sets and
// two mechanical points is composed from the public elements in the
// package example.
//
// # A second motor on an axle of its own
//
// OutputCoupled, InputCoupled and PureHydrostatic take a SecondMotor: a
// second motor of the same loop on an output of its own ("axle 2", a
// FreeOutput), for example a front axle. Both motors see the one loop
// pressure Δp, so with ideal units each output's torque is its motor's
// x·D·Δp through its gear; the front output's torque is solved, not
// given. Every range comes twice: with the motor clutched in, up to the
// declutch speed of the first output (a range speed limit, reported in
// State.Margins), and as name+" single" with the motor declutched, braked
// still and held at zero setting (no torque, no drag); the pair shares
// the first output's kinematics, so the change between them is
// synchronous.
//
// The second motor's setting is the layout's SettingCurve of the first
// output's speed (swing back with travel speed, then declutch), a
// MotorSetting in the Point, or the one Solver.BestSetting finds for the
// least State.Loss plus a loss outside the layout (the tyres' slip, which
// the vehicle knows). With a motor held, the loop's other settings follow
// hydrostat.Pinned. Solver.SolveTotal meets a total of the outputs'
// torques (a tractive force) instead of the first output's torque.
//
// # Range logic
//
// Solver.Interval gives the output speeds a range reaches at an input speed
// (unit speed limits, displacement settings within range, the range's
// speed limit). Solver.ShiftPoints finds synchronous shift points between
// adjacent ranges: output speeds at which every shaft turns alike in both
// ranges, so the oncoming clutch closes without slip. Range gears taken
// from the summing shaft alone are synchronous only at standstill (shifting
// them needs a jump of the variator's ratio); a range taken from the
// variator's member (RangeGear.FromVariator) next to one from the summing
// member shifts synchronously where the two members' speeds match the
// gears.
// Solver.Feasible lists the ranges in which a point solves, and Solver.Best
// solves it in the best by a Policy (default HighestEfficiency).
//
// # Load-independent losses
//
// The elements' losses above depend on the load. The losses a test bench
// measures with no load are drag sources: a torque T_d between a shaft and
// the housing (or across an open clutch) that depends only on speeds and
// the oil, entered in the shaft's torque balance, Σ port torques + T_d = 0,
// with its loss T_d·ω ≥ 0 listed by name in State.Drags and included in
// State.Loss (State.DragLoss), so the power balance still closes. Each is
// off unless the layout adds it (Builder methods or Layout.WithLosses):
//
//	source              model (doc of the type)                              source
//	bearings            M = 10⁻⁷·f0·(ν·n)^(2/3)·dm³ + f1·P1·dm  [N·mm]         Palmgren (Rolling Bearing Analysis)
//	churning, windage   P = 7.37·fg·ν·n³·D^4.7·(…)/(Ag·10²⁶)  [kW]             ISO/TR 14179-1
//	open plates         T = z·π·μ·Δω·(ro⁴ − ri⁴)/(2h)                          laminar film (Newton)
//	idle PTO            open plates + bearings while the PTO carries no torque
//	charge pump         P = p_c·(Q_leak + Q_flush)/η on a named shaft         (leakage from the loop)
//
// The charge pump's torque follows the loop's leakage, so it is updated
// with every evaluation of the loop; the others are fixed once the speeds
// are known. The oil is the layout's Lubricant (ν and ρ at the operating
// temperature).
//
// # Locked ranges and the mechanical point
//
// A range declared locked (Builder.LockedRange, RangeGear.Locked) holds a
// unit's member with a brake, so its kinematics fix the loop's ratio: the
// loop is bypassed with its units destroked (settings 0, Δp = 0) and the
// range runs at the one output speed its input speed gives. An
// output-coupled split can also run continuously through its mechanical
// point when its motor swings over centre (hydrostat.SwingOverCentre): see
// the example through the mechanical point.
//
// # Sweeps and maps
//
// Layout.Sweep solves over output speed at a given input speed and either
// output torque or input power; Layout.Map over output speed × output
// torque. Both run on several goroutines, one Solver each, with results
// independent of the number of workers, report progress through a
// callback, mark every infeasible cell with its reason, and write CSV.
//
// # Caution
//
// The library estimates; it does not certify. Hydraulic circuits at several
// hundred bar can injure. Rated pressures, speeds and loads of real
// components come from their manufacturers, road speed and braking are
// governed by local regulations, and safety-relevant designs need physical
// tests and qualified sign-off.
package powersplit
