package vehicle

import (
	"errors"
	"math"
	"sync"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

// An AxleTransmission drives the rear axle through its output and the front
// axle through an output of its own (a second motor of the loop, see
// powersplit.SecondMotor), so the axles turn at independent speeds. The
// vehicle gives it both axles' output speeds and the rear output's torque;
// the front output's torque follows from the loop pressure and the front
// motor's setting. A Vehicle whose Transmission is an AxleTransmission and
// whose ground is Tyres solves both axles' slips from their own pulls.
type AxleTransmission interface {
	Transmission
	// FrontFinalDrive returns the ratio of the front output's speed to the
	// front wheels' speed and the front final drive's efficiency.
	FrontFinalDrive() (ratio, efficiency float64)
	// OperateAxles runs range rng with the engine at speed engine, the
	// rear output at speed rear carrying rearTorque and the front output
	// at speed front; it returns the state with the front output's torque
	// in DrivePoint.FrontTorque. setting holds the front motor at that
	// setting; NaN leaves it to the transmission's own control.
	OperateAxles(rng int, engine, rear, front units.AngularVelocity, rearTorque units.Torque, setting float64) (DrivePoint, error)
}

// FrontControl says how a FrontMotorDrive sets its front motor.
type FrontControl int

const (
	// FrontSchedule sets the front motor by the layout's own setting
	// curve of travel speed (powersplit.SecondMotor.Setting).
	FrontSchedule FrontControl = iota
	// FrontLeastPower lets the vehicle choose, at every point, the front
	// setting that needs the least power from the engine: the least sum
	// of the transmission's losses and both axles' slip and rolling
	// losses. It costs some twenty solves of the point.
	FrontLeastPower
)

// A FrontMotorDrive adapts a layout with a second motor on the front axle
// (built by powersplit.OutputCoupled, InputCoupled or PureHydrostatic with
// a SecondMotor) to AxleTransmission. Operate, the single-output view, runs
// the front output at AxleRatio times the rear output's speed (the axles'
// speed ratio with equal travel and no slip) and reports the front
// output's torque and power beside the rear's. Safe for concurrent use (one
// solver guarded by a lock).
type FrontMotorDrive struct {
	layout   powersplit.Layout
	info     powersplit.SecondInfo
	fd, fEff float64
	ratio    float64
	control  FrontControl
	mu       sync.Mutex
	solver   *powersplit.Solver
	st       powersplit.State
	names    flagNames // the names of the solver's flags, made once
	outs     []powersplit.OutputDemand
	set      []powersplit.MotorSetting
}

// FrontMotorSpec describes a FrontMotorDrive.
type FrontMotorSpec struct {
	// FinalDrive is the ratio of the front output's speed to the front
	// wheels' speed, > 0.
	FinalDrive float64
	// Efficiency of the front final drive in (0, 1]; zero means
	// DefaultFinalDriveEfficiency.
	Efficiency float64
	// AxleRatio is the front output's speed over the rear output's at equal
	// travel speed and no slip: FinalDrive·r_rear/(rear final drive·r_front);
	// Operate runs the axles in this ratio. > 0.
	AxleRatio float64
	// Control sets the front motor; zero means FrontSchedule.
	Control FrontControl
}

// FromFrontMotorLayout returns the AxleTransmission view of layout l, which
// must have a second motor on its own output.
func FromFrontMotorLayout(l powersplit.Layout, s FrontMotorSpec) (*FrontMotorDrive, error) {
	if !l.Valid() {
		return nil, invalid("layout", math.NaN(), "is the zero Layout")
	}
	info, ok := l.SecondMotor()
	if !ok || len(l.Outputs()) != 2 {
		return nil, invalid("layout", math.NaN(), "needs a second motor on an output of its own (powersplit.SecondMotor)")
	}
	if err := positive("FrontMotorSpec.FinalDrive", s.FinalDrive); err != nil {
		return nil, err
	}
	if err := positive("FrontMotorSpec.AxleRatio", s.AxleRatio); err != nil {
		return nil, err
	}
	if s.Efficiency == 0 {
		s.Efficiency = DefaultFinalDriveEfficiency
	}
	if err := fraction("FrontMotorSpec.Efficiency", s.Efficiency); err != nil {
		return nil, err
	}
	if s.Control != FrontSchedule && s.Control != FrontLeastPower {
		return nil, invalid("FrontMotorSpec.Control", float64(s.Control), "is not a known control")
	}
	return &FrontMotorDrive{layout: l, info: info, fd: s.FinalDrive, fEff: s.Efficiency, ratio: s.AxleRatio, control: s.Control,
		solver: powersplit.NewSolver(l), outs: make([]powersplit.OutputDemand, 2), set: make([]powersplit.MotorSetting, 1)}, nil
}

// Ranges implements Transmission.
func (d *FrontMotorDrive) Ranges() int { return d.layout.Ranges() }

// Layout returns the adapted layout.
func (d *FrontMotorDrive) Layout() powersplit.Layout { return d.layout }

// Control returns how the front motor is set.
func (d *FrontMotorDrive) Control() FrontControl { return d.control }

// SecondMotor describes the layout's front motor.
func (d *FrontMotorDrive) SecondMotor() powersplit.SecondInfo { return d.info }

// FrontFinalDrive implements AxleTransmission.
func (d *FrontMotorDrive) FrontFinalDrive() (ratio, efficiency float64) { return d.fd, d.fEff }

// Operate implements Transmission: the front output at AxleRatio times out.
func (d *FrontMotorDrive) Operate(rng int, engine, out units.AngularVelocity, outTorque units.Torque) (DrivePoint, error) {
	return d.OperateAxles(rng, engine, out, units.AngularVelocity(d.ratio*float64(out)), outTorque, math.NaN())
}

// OperateAxles implements AxleTransmission.
func (d *FrontMotorDrive) OperateAxles(rng int, engine, rear, front units.AngularVelocity, rearTorque units.Torque, setting float64) (DrivePoint, error) {
	if rng < 0 || rng >= d.layout.Ranges() {
		return DrivePoint{}, invalid("range", float64(rng), "does not exist")
	}
	if !math.IsNaN(setting) && !(setting >= -1 && setting <= 1) {
		return DrivePoint{}, invalid("front setting", setting, "must be in [-1, 1] or NaN")
	}
	d.mu.Lock()
	defer d.mu.Unlock()
	d.outs[0] = powersplit.OutputDemand{Speed: rear, Torque: rearTorque}
	d.outs[1] = powersplit.OutputDemand{Speed: front}
	p := powersplit.Point{Range: rng, Input: engine, Outputs: d.outs}
	if !math.IsNaN(setting) && !d.declutched(rng) {
		d.set[0] = powersplit.MotorSetting{Loop: d.info.Loop, Motor: d.info.Motor, Setting: setting}
		p.Settings = d.set
	}
	d.st.Brief = true // the summary is all a drive point needs
	if err := d.solver.Solve(p, &d.st); err != nil {
		return DrivePoint{}, &driveError{err}
	}
	dp := drivePoint(&d.st, rng, rear, rearTorque, nil, &d.names, nil)
	dp.FrontSpeed, dp.FrontTorque = front, d.st.Outputs[1].Torque
	lp := &d.st.Loops[d.info.Loop]
	dp.FrontSetting = lp.Motors[d.info.Motor].Setting
	dp.Declutched = d.declutched(rng)
	if !dp.Declutched {
		dp.DeclutchMargin = d.info.DeclutchAbove - units.AngularVelocity(math.Abs(float64(rear)))
	}
	return dp, nil
}

// declutched reports whether the front motor is declutched in range rng
// (the builders' "single" ranges: no range speed limit).
func (d *FrontMotorDrive) declutched(rng int) bool {
	n := d.layout.RangeName(rng)
	return len(n) > 7 && n[len(n)-7:] == " single"
}

// drivePoint fills the DrivePoint of a solved layout state (losses split
// into the loops', the load-independent drag and the rest; the first
// loop's state; the flags, then extra, a drive's own flags, shared when
// the state has none). Its slices come from buf (nil: new ones), the
// flags' names from names.
func drivePoint(st *powersplit.State, rng int, out units.AngularVelocity, outTorque units.Torque, extra []Flag, names *flagNames, buf *driveBuf) DrivePoint {
	hydro := float64(st.HydrostatLoss)
	mech := float64(st.Loss) - hydro - float64(st.DragLoss)
	if mech < 0 { // rounding only: every element's loss is >= 0
		mech = 0
	}
	p := DrivePoint{
		Range:            rng,
		InputTorque:      st.InputTorque,
		OutputSpeed:      out,
		OutputTorque:     outTorque,
		HydrostaticLoss:  units.Power(hydro),
		MechanicalLoss:   units.Power(mech),
		NoLoadLoss:       st.DragLoss,
		HydrostaticShare: st.HydraulicShare,
		RangeName:        st.RangeName,
	}
	if len(st.Loops) > 0 {
		lp := &st.Loops[0]
		p.Hydrostat = UnitState{HighPressure: lp.High, PumpSpeed: lp.Pump.Speed, PumpSetting: lp.Pump.Setting}
		if len(lp.Motors) > 0 {
			p.Hydrostat.MotorSpeed, p.Hydrostat.MotorSetting = lp.Motors[0].Speed, lp.Motors[0].Setting
		}
	}
	if len(st.Drags) > 0 {
		p.NoLoad = buf.lossParts(len(st.Drags))
		for i, dr := range st.Drags {
			p.NoLoad[i] = LossPart{Name: dr.Name, Power: dr.Loss}
		}
	}
	if len(st.Flags) == 0 {
		// Shared by every point, capacity-limited: an append copies.
		p.Flags = extra[:len(extra):len(extra)]
		return p
	}
	p.Flags = buf.flags(len(st.Flags) + len(extra))
	for i, m := range st.Flags {
		p.Flags[i] = Flag{Name: names.name(m.Element, m.Quantity), Value: m.Value, Limit: m.Limit}
	}
	copy(p.Flags[len(st.Flags):], extra)
	return p
}

// DriveTurn is Drive in a steady turn of the rear axle's centre about
// radius (0: straight ahead): a driven front axle at the fixed lead is
// solved with the turn's front-to-rear speed ratio (wind-up where the lead
// is smaller than the turn needs; CirculatingPower is the power the braked
// axle returns), a free-rolling front as in Drive.
func (t Tyres) DriveTurn(pull units.Force, grade float64, v units.Speed, radius units.Length) (Wheels, error) {
	if radius == 0 || !t.FrontDrive {
		return t.Drive(pull, grade, v)
	}
	if err := nonNegative("pull", float64(pull)); err != nil {
		return Wheels{}, err
	}
	if err := positive("travel speed", float64(v)); err != nil {
		return Wheels{}, err
	}
	if t.Model == nil {
		return Wheels{}, invalid("Tyres.Model", math.NaN(), "is required")
	}
	d, _, err := t.Vehicle.FixedRatioTurn(t.Model, t.Surface, traction.Operation{Pull: pull, Speed: v}, t.Lead, radius)
	if err != nil {
		return Wheels{}, tractionErr(err)
	}
	return t.wheels(d), nil
}

func tractionErr(err error) error {
	switch {
	case errors.Is(err, traction.ErrPull):
		return errors.Join(ErrTraction, err)
	case errors.Is(err, traction.ErrUnstable):
		return errors.Join(ErrStability, err)
	}
	return errors.Join(ErrInvalid, err)
}

// axle is one axle of a two-axle point: its wheel under its load per
// wheel, wheel count, travel speed and the slip range searched. last, the
// slip its search found last, starts its next search: a point's axle pair
// holds the slips at the split's start, and each solve of the split
// searches copies of them (its result depends on its arguments alone).
type axle struct {
	w    traction.Wheel
	lw   traction.LoadedWheel
	load units.Force // per wheel
	n    float64
	v    units.Speed
	sLo  float64 // lowest slip searched (overrun)
	sMax float64 // slip of greatest net pull
	nLo  float64 // axle net pull at sLo
	nMax float64 // axle net pull at sMax
	wLo  float64 // wheel net pull at sLo
	wMax float64 // wheel net pull at sMax
	last float64 // slip of the last search (NaN: none yet)
}

func newAxle(a traction.Axle, s traction.Surface, m traction.Model, load units.Force, v units.Speed) (axle, error) {
	w, err := traction.NewWheel(a.Tyre, s, m)
	if err != nil {
		return axle{}, err
	}
	x := axle{w: w, n: float64(a.Wheels), v: v, last: math.NaN()}
	x.load = units.Force(float64(load) / x.n)
	if x.lw, err = w.Loaded(x.load); err != nil {
		return axle{}, err
	}
	mp, err := w.MaxPull(x.load)
	if err != nil {
		return axle{}, err
	}
	x.sMax, x.wMax, x.nMax = mp.Slip, float64(mp.Net), x.n*float64(mp.Net)
	// Overrun down to a slip of −0.3: an axle pushed along by the other.
	x.sLo = -0.3
	q, err := x.lw.Pull(x.sLo)
	if err != nil {
		return axle{}, err
	}
	x.wLo, x.nLo = float64(q.Net), x.n*float64(q.Net)
	return x, nil
}

// at returns the state of the axle (one wheel's values) giving axle net
// pull net (summed over its wheels).
func (x *axle) at(net float64) (traction.State, error) {
	// Per wheel: a pull at an end of the bracket to its rounding is that
	// end, never a pull beyond it.
	want := net / x.n
	var s float64
	switch {
	case want >= x.wMax:
		s = x.sMax
	case want <= x.wLo:
		s = x.sLo
	default:
		var err error
		s, err = x.lw.SlipFor(units.Force(want), x.sLo, x.sMax, x.last)
		if err != nil {
			return traction.State{}, err
		}
		x.last = s
	}
	q, err := x.lw.Pull(s)
	if err != nil {
		return traction.State{}, err
	}
	t := x.w.Tyre()
	return traction.StateOf(t, q, units.AngularVelocity(float64(x.v)/(float64(t.RollingRadius)*(1-s)))), nil
}

// axles is the solved two-axle point.
type axles struct {
	front, rear traction.State // one wheel each
	nf, nr      float64
	dp          DrivePoint
	frontWheelT float64 // front axle torque from the transmission (wheels)
	rearWheelT  float64 // rear axle torque the transmission gives
	brake       float64 // power the brakes absorb (W)
}

func (a *axles) slipLoss() (front, rear float64) {
	return a.nf * float64(a.front.SlipLoss), a.nr * float64(a.rear.SlipLoss)
}

func (a *axles) rolling() float64 {
	return a.nf*float64(a.front.RollingLoss) + a.nr*float64(a.rear.RollingLoss)
}

// axlePair is what the solves of one two-axle point share, a function of
// the tyres, the pull and the demand alone: both axles under their loads,
// the pull, the turn's front to rear speed ratio k, the range [lo, hi] of
// the front axle's net pull, the search's start x0 (the front wheels
// rolling free), both axles' states there and the rolling radii.
type axlePair struct {
	front, rear         axle
	pull, k, lo, hi, x0 float64
	fs0, rs0            traction.State // the axles' states at x0 (at0)
	at0                 bool
	rf, rr              float64
}

// newAxlePair returns the axle pair of a two-axle point at net pull pull
// (>= 0) on ty.
func newAxlePair(ty Tyres, pull float64, d Demand) (axlePair, error) {
	if ty.Model == nil {
		return axlePair{}, invalid("Tyres.Model", math.NaN(), "is required")
	}
	k := 1.0
	if d.TurnRadius > 0 {
		g, err := ty.Vehicle.Turn(d.TurnRadius)
		if err != nil {
			return axlePair{}, errors.Join(ErrInvalid, err)
		}
		k = g.SpeedRatio
	}
	loads, err := ty.Vehicle.DynamicLoads(units.Force(pull), 0)
	if err != nil {
		return axlePair{}, tractionErr(err)
	}
	fa, err := newAxle(ty.Vehicle.Front, ty.Surface, ty.Model, loads.Front, units.Speed(k*float64(d.Speed)))
	if err != nil {
		return axlePair{}, tractionErr(err)
	}
	ra, err := newAxle(ty.Vehicle.Rear, ty.Surface, ty.Model, loads.Rear, d.Speed)
	if err != nil {
		return axlePair{}, tractionErr(err)
	}
	// The front axle's net pull lies between its overrun and its greatest
	// pull, and leaves the rear between its own.
	lo := math.Max(fa.nLo, (pull-ra.nMax)/k)
	hi := math.Min(fa.nMax, (pull-ra.nLo)/k)
	if !(lo < hi) {
		return axlePair{}, &LimitError{Quantity: "pull of both axles", Value: units.Of(units.Force(pull)), Bound: "greatest pull of both axles",
			Limit: units.Of(units.Force(fa.nMax*k + ra.nMax)), Err: ErrTraction}
	}
	x0 := 0.0
	if fr, err := fa.w.FreeRolling(fa.load); err == nil {
		x0 = fa.n * float64(fr.Net)
	}
	pr := axlePair{front: fa, rear: ra, pull: pull, k: k, lo: lo, hi: hi, x0: math.Min(math.Max(x0, lo), hi),
		rf: float64(ty.Vehicle.Front.Tyre.RollingRadius), rr: float64(ty.Vehicle.Rear.Tyre.RollingRadius)}
	// Every solve asks for both axles at x0 first: their states (and the
	// slips the next searches start from, as they would after that first
	// search) are worked out here once. A failing axle is left to the
	// solves, which report it.
	fs, errF := pr.front.at(pr.x0)
	rs, errR := pr.rear.at(pull - k*pr.x0)
	if errF == nil && errR == nil {
		pr.fs0, pr.rs0, pr.at0 = fs, rs, true
	} else {
		pr.front.last, pr.rear.last = math.NaN(), math.NaN()
	}
	return pr, nil
}

// solveAxles solves the point of a vehicle whose front axle is driven by
// the transmission's front output: the front axle's net pull N_f is found
// so that the front wheels' torque the transmission gives equals the
// torque their slip needs, with k·N_f + N_r = pull (k the turn's front to
// rear speed ratio: the pulls balance in power, Σ N_i·v_i = pull·v), each
// axle's wheel speed from its own slip. relief (>= 0, W) is power the
// load gives back (downhill, slowing) and brake (in [0, relief]) the part
// of it the service brakes take: the rest is taken off the rear wheels'
// torque, which turns negative (overrun) when it exceeds what they need.
// pr is the point's axle pair, at its pull.
func (v *Vehicle) solveAxles(at AxleTransmission, pr *axlePair, relief, brake float64, w units.AngularVelocity, rng int, setting float64) (axles, error) {
	// Copies: each solve's searches start afresh (axle.last), so a
	// solve's result depends on its arguments alone.
	fa, ra := pr.front, pr.rear
	pull, k, lo, hi, x0 := pr.pull, pr.k, pr.lo, pr.hi, pr.x0
	fd, fEff := at.FrontFinalDrive()
	rfd, rEff := v.s.FinalDrive, v.s.FinalDriveEfficiency
	rf, rr := pr.rf, pr.rr
	var sol axles
	// g(N_f): front wheel torque given minus front wheel torque needed.
	g := func(nfront float64) (float64, error) {
		fs, rs := pr.fs0, pr.rs0
		if nfront != x0 || !pr.at0 {
			var err error
			if fs, err = fa.at(nfront); err != nil {
				return 0, err
			}
			if rs, err = ra.at(pull - k*nfront); err != nil {
				return 0, err
			}
		}
		// The rear wheel torque: what their slip needs, less the power the
		// load gives back that the brakes do not take (negative: overrun).
		tr := ra.n*float64(rs.Gross)*rr - (relief-brake)/float64(rs.WheelSpeed)
		tOut := tr / rfd / rEff
		if tr < 0 {
			tOut = tr / rfd * rEff
		}
		dp, err := at.OperateAxles(rng, w, units.AngularVelocity(rfd*float64(rs.WheelSpeed)),
			units.AngularVelocity(fd*float64(fs.WheelSpeed)), units.Torque(tOut), setting)
		if err != nil {
			return 0, err
		}
		tf := float64(dp.FrontTorque) * fd * fEff
		if dp.FrontTorque < 0 {
			tf = float64(dp.FrontTorque) * fd / fEff
		}
		sol = axles{front: fs, rear: rs, nf: fa.n, nr: ra.n, dp: dp, frontWheelT: tf, rearWheelT: tr, brake: brake}
		return tf - fa.n*float64(fs.Gross)*rf, nil
	}
	// Start with the front wheels free (no torque), then step towards the
	// torque the transmission gives them until the sign changes.
	g0, err := g(x0)
	if err != nil {
		return axles{}, err
	}
	if g0 == 0 {
		return sol, nil
	}
	// Secant steps from there through the last two values (g is close to
	// linear in N_f: about −r_f per newton of front pull), kept inside
	// the bracket of the last values of either sign once there is one
	// (bisecting it where a step would leave it); a split the
	// transmission refuses (a limit) is approached halfway, a few times,
	// before the limit is reported. sol always holds the last value's
	// solution.
	tolG := func(x float64) float64 { return 1e-10 * (math.Abs(x)*rf + math.Abs(pull)*rr + 1) }
	x := math.Min(math.Max(x0+g0/rf, lo), hi)
	try := func(xn, from float64) (float64, float64, error) {
		gn, err := g(xn)
		for h := 0; err != nil && h < 6; h++ {
			xn = 0.5 * (from + xn)
			gn, err = g(xn)
		}
		return xn, gn, err
	}
	x, g1, err := try(x, x0)
	if err != nil {
		return axles{}, err
	}
	xa, ga := x0, g0
	// The last points where g > 0 and g < 0 (NaN: none yet).
	xPos, xNeg := math.NaN(), math.NaN()
	side := func(x, g float64) {
		if g > 0 {
			xPos = x
		} else {
			xNeg = x
		}
	}
	side(xa, ga)
	for range 40 {
		if math.Abs(g1) <= tolG(x) {
			return sol, nil
		}
		if (x == hi && g1 > 0) || (x == lo && g1 < 0) {
			// The transmission gives the front wheels more (or less)
			// torque than any slip of theirs takes: beyond traction.
			return axles{}, &LimitError{Quantity: "front axle torque", Value: units.Of(units.Torque(sol.frontWheelT)),
				Bound: "torque a slip of the front axle matches", Limit: units.Of(units.Torque(fa.nMax * rf)), Err: ErrTraction}
		}
		side(x, g1)
		xn := x - g1*(x-xa)/(g1-ga)
		if g1 == ga || math.IsNaN(xn) {
			xn = x + g1/rf
		}
		if !math.IsNaN(xPos) && !math.IsNaN(xNeg) && !((xn-xPos)*(xn-xNeg) < 0) {
			xn = 0.5 * (xPos + xNeg)
		}
		xn = math.Min(math.Max(xn, lo), hi)
		if xn == x {
			if x == lo || x == hi {
				return axles{}, &LimitError{Quantity: "front axle torque", Value: units.Of(units.Torque(sol.frontWheelT)),
					Bound: "torque a slip of the front axle matches", Limit: units.Of(units.Torque(fa.nMax * rf)), Err: ErrTraction}
			}
			return sol, nil
		}
		xa, ga = x, g1
		x, g1, err = try(xn, x)
		if err != nil {
			return axles{}, err
		}
	}
	return axles{}, errors.Join(ErrTraction, traction.ErrNoConvergence)
}

// axlesAt solves the two-axle point for At: with the FrontLeastPower
// control the front setting of least engine power, else the
// transmission's own.
func (v *Vehicle) axlesAt(at AxleTransmission, pr *axlePair, relief, brake float64, w units.AngularVelocity, rng int) (axles, error) {
	fm, ok := at.(*FrontMotorDrive)
	if !ok || fm.control != FrontLeastPower || fm.declutched(rng) || relief > 0 {
		return v.solveAxles(at, pr, relief, brake, w, rng, math.NaN())
	}
	hi := fm.info.MaxSetting
	// The schedule's own setting is the first candidate, so the search
	// never ends above it.
	best, bestP := axles{}, math.Inf(1)
	if a, err := v.solveAxles(at, pr, relief, brake, w, rng, math.NaN()); err == nil {
		best, bestP = a, float64(a.dp.InputTorque)
	}
	power := func(x float64) float64 {
		a, err := v.solveAxles(at, pr, relief, brake, w, rng, x)
		if err != nil {
			return math.Inf(1)
		}
		if p := float64(a.dp.InputTorque); p < bestP {
			best, bestP = a, p
		}
		return float64(a.dp.InputTorque)
	}
	// A coarse scan over both signs (the setting that drives changes sign
	// with the loop's high side), then Brent's minimiser about the best.
	const n = 8
	bx, bp := math.NaN(), math.Inf(1)
	for i := 0; i <= n; i++ {
		x := -hi + 2*hi*float64(i)/n
		if p := power(x); p < bp {
			bx, bp = x, p
		}
	}
	if !math.IsInf(bestP, 1) && (math.IsNaN(bx) || bestP < bp) {
		bx = best.dp.FrontSetting
	}
	if math.IsNaN(bx) {
		return v.solveAxles(at, pr, relief, brake, w, rng, math.NaN())
	}
	step := 2 * hi / n
	numeric.Minimize(power, math.Max(-hi, bx-step), math.Min(hi, bx+step), 1e-3)
	return best, nil
}

// axlesPoint solves the two-axle drive of At and fills p's slips, drive,
// flows and flags; it returns the torque the transmission takes from the
// engine. memo (nil: none) holds the demand's axle pair.
func (v *Vehicle) axlesPoint(p *Point, at AxleTransmission, ground Traction, pull float64, d Demand, w units.AngularVelocity, rng int, ptoTorque units.Torque, memo *tyreMemo) (units.Torque, error) {
	ty, ok := ground.(Tyres)
	if !ok {
		return 0, invalid("Traction", math.NaN(), "a transmission that drives both axles needs Tyres as its ground")
	}
	vs := float64(d.Speed)
	relief := math.Max(0, -pull*vs)
	rng = min(max(rng, 0), at.Ranges()-1)
	var buf axlePair
	pair, err := memo.axles(&buf, ty, math.Max(pull, 0), d)
	if err != nil {
		return 0, err
	}
	a, err := v.axlesAt(at, pair, relief, 0, w, rng)
	if err != nil {
		return 0, err
	}
	if tm := float64(v.s.Engine.MotoringTorque(w)); relief > 0 && float64(a.dp.InputTorque+ptoTorque) < -tm {
		// Overrun beyond what the engine absorbs at its motoring torque:
		// the service brakes take the rest of the power given back.
		var ferr error
		h := func(b float64) float64 {
			x, err := v.axlesAt(at, pair, relief, b, w, rng)
			if err != nil {
				ferr = err
				return math.NaN()
			}
			a = x
			return float64(x.dp.InputTorque+ptoTorque) + tm
		}
		b, err := numeric.Brent(h, 0, relief, 1e-9*relief, 100)
		if ferr != nil {
			return 0, ferr
		}
		if err != nil {
			return 0, &LimitError{Quantity: "overrun wheel power", Value: units.Of(units.Power(relief)), Bound: "no engine braking share found above",
				Limit: units.Of(units.Power(0)), Err: ErrTransmission}
		}
		if h(b); ferr != nil {
			return 0, ferr
		}
	}
	f := &p.Flows
	dp := a.dp
	// Wheel input power T·ω of both axles, from the torques the
	// transmission gives.
	pf := a.frontWheelT * float64(a.front.WheelSpeed)
	pr := a.rearWheelT * float64(a.rear.WheelSpeed)
	wheelPower := pf + pr
	useful := math.Max(pull, 0) * vs
	sf, sr := a.slipLoss()
	f.Rolling = units.Power(a.rolling())
	f.FrontSlip, f.RearSlip = units.Power(sf), units.Power(sr)
	f.Brake = units.Power(a.brake)
	// Close the tyre balance on the slip loss (its rounding, and the
	// root's tolerance on the front torque, are checked below).
	f.Slip = units.Power(wheelPower + relief - a.brake - float64(f.Rolling) - useful)
	if bal := float64(f.Slip) - sf - sr; math.Abs(bal) > 1e-6*math.Max(math.Abs(wheelPower)+relief, 1) {
		return 0, &LimitError{Quantity: "tyre power balance", Value: units.Of(units.Power(bal)), Bound: "tolerance",
			Limit: units.Of(units.Power(1e-6 * math.Abs(wheelPower))), Err: ErrTraction}
	}
	// Circulating power: one axle driving while the other is driven
	// backwards (both given back, downhill, is overrun, not circulation).
	switch {
	case pf > 0 && pr < 0:
		f.Circulating = units.Power(-pr)
	case pr > 0 && pf < 0:
		f.Circulating = units.Power(-pf)
	}
	w0 := float64(w)
	pin := float64(dp.InputTorque) * w0
	pout := float64(dp.OutputTorque)*float64(dp.OutputSpeed) + float64(dp.FrontTorque)*float64(dp.FrontSpeed)
	losses := float64(dp.HydrostaticLoss) + float64(dp.MechanicalLoss) + float64(dp.NoLoadLoss)
	if !finite(pin, pout, losses) || math.Abs(pin-pout-losses) > 1e-6*math.Max(math.Abs(pin), 1) {
		return 0, &LimitError{Quantity: "transmission power balance", Value: units.Of(units.Power(pin - pout - losses)), Bound: "tolerance",
			Limit: units.Of(units.Power(1e-6 * math.Abs(pin))), Err: ErrTransmission}
	}
	f.Hydrostatic = dp.HydrostaticLoss
	f.NoLoad = dp.NoLoadLoss
	f.Mechanical = units.Power(pin - float64(dp.HydrostaticLoss) - float64(dp.NoLoadLoss) - wheelPower)
	// The same loss element by element: the transmission's mechanical loss
	// and both final drives' from their efficiencies.
	fdLoss := func(wp, eta float64) float64 {
		if wp < 0 {
			return -wp * (1 - eta)
		}
		return wp * (1/eta - 1)
	}
	_, fEff := at.FrontFinalDrive()
	f.MechanicalByElement = dp.MechanicalLoss + units.Power(fdLoss(pf, fEff)+fdLoss(pr, v.s.FinalDriveEfficiency))
	p.Range = rng
	p.Drive = dp
	p.Slip, p.FrontSlip = a.rear.Slip, a.front.Slip
	p.FrontShare = 0
	if t := a.frontWheelT + a.rearWheelT; t != 0 {
		p.FrontShare = a.frontWheelT / t
	}
	for _, x := range []struct {
		st    traction.State
		rated units.Force
	}{{a.front, ty.Vehicle.Front.Tyre.RatedLoad}, {a.rear, ty.Vehicle.Rear.Tyre.RatedLoad}} {
		if x.st.Overloaded {
			p.Flags = append(p.Flags, Flag{Name: FlagTyreOverload, Value: units.Of(x.st.Load), Limit: units.Of(x.rated)})
		}
	}
	p.Flags = append(p.Flags, dp.Flags...)
	return dp.InputTorque, nil
}

// driveOn runs ground's Drive, in a turn its DriveTurn when it has one.
func driveOn(ground Traction, pull units.Force, grade float64, v units.Speed, radius units.Length) (Wheels, error) {
	if radius > 0 {
		if t, ok := ground.(interface {
			DriveTurn(units.Force, float64, units.Speed, units.Length) (Wheels, error)
		}); ok {
			return t.DriveTurn(pull, grade, v, radius)
		}
	}
	return ground.Drive(pull, grade, v)
}
