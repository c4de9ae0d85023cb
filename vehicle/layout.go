package vehicle

import (
	"math"
	"sync"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// A LayoutDrive adapts a layout of the root package (a power-split,
// hydrostatic or other network solved by powersplit.Solver) to
// Transmission. The layout must have exactly one output (given speed and
// torque); its PTOs, if any, are left unloaded: the vehicle's PTO is
// described by Spec.PTO. Operate is safe for concurrent use (one solver
// guarded by a lock).
type LayoutDrive struct {
	layout powersplit.Layout
	mu     sync.Mutex
	solver *powersplit.Solver
	st     powersplit.State
	names  flagNames // the names of the solver's flags, made once
	outs   []powersplit.OutputDemand
	// unrated are the flags of the layout's limits that are not rated.
	unrated []Flag
	// spans caches, per range, the ratios of output to engine speed the
	// range reaches (see RatioSpans); nil until asked.
	spans [][][2]float64
}

// FromLayout returns the Transmission view of layout l.
func FromLayout(l powersplit.Layout) (*LayoutDrive, error) {
	if !l.Valid() {
		return nil, invalid("layout", math.NaN(), "is the zero Layout")
	}
	if n := len(l.Outputs()); n != 1 {
		return nil, invalid("layout outputs", float64(n), "must be exactly one")
	}
	if l.Ranges() < 1 {
		return nil, invalid("layout ranges", 0.0, "needs at least one range")
	}
	d := &LayoutDrive{layout: l, solver: powersplit.NewSolver(l), outs: make([]powersplit.OutputDemand, 1)}
	for _, u := range l.Unrated() {
		d.unrated = append(d.unrated, Flag{Name: u, Unchecked: true})
	}
	return d, nil
}

// Ranges implements Transmission.
func (d *LayoutDrive) Ranges() int { return d.layout.Ranges() }

// RangeName implements RangeNamer with the layout's range names.
func (d *LayoutDrive) RangeName(i int) string { return d.layout.RangeName(i) }

// Layout returns the adapted layout.
func (d *LayoutDrive) Layout() powersplit.Layout { return d.layout }

// Operate implements Transmission. Losses of the layout's hydrostatic loops
// are HydrostaticLoss, its drag sources (powersplit.State.Drags) NoLoadLoss
// and NoLoad by name, all other elements' losses MechanicalLoss. Rated
// limits the solver flags without making the point infeasible are listed in
// DrivePoint.Flags, and so are the layout's limits that are not rated
// (Flag.Unchecked; see powersplit.Layout.Unrated).
func (d *LayoutDrive) Operate(rng int, engine, out units.AngularVelocity, outTorque units.Torque) (DrivePoint, error) {
	return d.operate(rng, engine, out, outTorque, nil)
}

// operate is Operate with the point's slices (NoLoad, Flags) from buf
// (nil: new ones).
func (d *LayoutDrive) operate(rng int, engine, out units.AngularVelocity, outTorque units.Torque, buf *driveBuf) (DrivePoint, error) {
	if rng < 0 || rng >= d.layout.Ranges() {
		return DrivePoint{}, invalid("range", float64(rng), "does not exist")
	}
	d.mu.Lock()
	defer d.mu.Unlock()
	d.outs[0] = powersplit.OutputDemand{Speed: out, Torque: outTorque}
	d.st.Brief = true // the summary is all a drive point needs
	err := d.solver.Solve(powersplit.Point{Range: rng, Input: engine, Outputs: d.outs}, &d.st)
	if err != nil {
		return DrivePoint{}, &driveError{err}
	}
	return drivePoint(&d.st, rng, out, outTorque, d.unrated, &d.names, buf), nil
}

// errUnbuilt is a LayoutDrive's refusal to solve without a layout (the
// zero LayoutDrive).
var errUnbuilt = invalid("LayoutDrive", math.NaN(), "not built with FromLayout")

// Solve solves point p of the drive's layout into st with the drive's own
// solver, under its lock, as powersplit.Solver.Solve does: a caller that
// solves points of the same layout (a design check) needs no solver of
// its own.
func (d *LayoutDrive) Solve(p powersplit.Point, st *powersplit.State) error {
	if d.solver == nil {
		return errUnbuilt
	}
	d.mu.Lock()
	defer d.mu.Unlock()
	return d.solver.Solve(p, st)
}

// Interval returns the output speeds range p.Range reaches, from the
// drive's own solver under its lock, as powersplit.Solver.Interval does.
func (d *LayoutDrive) Interval(p powersplit.Point) ([]powersplit.SpeedInterval, error) {
	if d.solver == nil {
		return nil, errUnbuilt
	}
	d.mu.Lock()
	defer d.mu.Unlock()
	return d.solver.Interval(p)
}

// LockedRatio returns the output over engine speed of range rng when it is
// a locked (mechanical) range of the layout (powersplit.Layout.LockedRatio).
func (d *LayoutDrive) LockedRatio(rng int) (float64, bool) { return d.layout.LockedRatio(rng) }

// RatioSpans implements RatioSpanner: the intervals of output speed over
// engine speed that range rng reaches at no load with the engine at speed
// engine, from powersplit.Solver.Interval. The result is cached per range
// for the first engine speed asked.
func (d *LayoutDrive) RatioSpans(rng int, engine units.AngularVelocity) [][2]float64 {
	if rng < 0 || rng >= d.layout.Ranges() || !(engine > 0) {
		return nil
	}
	d.mu.Lock()
	defer d.mu.Unlock()
	if d.spans == nil {
		d.spans = make([][][2]float64, d.layout.Ranges())
	}
	if d.spans[rng] != nil {
		return d.spans[rng]
	}
	d.outs[0] = powersplit.OutputDemand{Speed: 1}
	iv, err := d.solver.Interval(powersplit.Point{Range: rng, Input: engine, Outputs: d.outs})
	spans := [][2]float64{}
	if err == nil {
		for _, v := range iv {
			spans = append(spans, [2]float64{float64(v.Lo) / float64(engine), float64(v.Hi) / float64(engine)})
		}
	}
	d.spans[rng] = spans
	return spans
}
