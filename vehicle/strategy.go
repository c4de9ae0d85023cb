package vehicle

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// A Strategy chooses the engine speed and transmission range for a demand.
type Strategy interface {
	// Operate returns the operating point the strategy chooses for d, or an
	// error wrapping ErrInfeasible (joined with the last limit met) when no
	// point meets every limit.
	Operate(v *Vehicle, d Demand) (Point, error)
}

// LeastFuel chooses, over every range and every engine speed from idle to
// the top of the torque curve, the point of least fuel flow that meets
// every limit. A demanded PTO speed fixes the engine speed; then only the
// range is chosen.
// Between points of equal fuel — on a descent, where the motored engine
// burns none — it chooses the one that leaves the least to the service
// brakes (the most engine braking), as a driver holding a high engine
// speed downhill does.
//
// The search samples Samples speeds per range and refines the best sample
// by Brent's minimiser to Tolerance, so it finds the least fuel to within
// that tolerance when fuel flow is unimodal in engine speed near the
// optimum, as it is for usual engine maps. The least fuel often lies on an
// edge of the feasible engine speeds (the lowest speed that still carries
// the demand): the best sample's neighbours that fail are bisected for that
// edge. A transmission that reports the ratios each range reaches
// (RatioSpanner, as LayoutDrive does) has the engine speeds of their edges
// sampled too, so an island of feasible speeds narrower than the sample
// spacing (beside the band a motor cannot pass around a mechanical point)
// is not missed.
type LeastFuel struct {
	Samples   int     // speeds sampled per range; default 24
	Tolerance float64 // relative speed tolerance of the refinement; default 1e-7
}

// remembered answers demand d of strategy s by op, or from the memory of
// s's last answer that a simulation's vehicle keeps (Simulate), and
// remembers the answer there.
func remembered(v *Vehicle, s Strategy, d Demand, op func(*Vehicle, Demand) (Point, error)) (Point, error) {
	if v == nil {
		return Point{}, invalid("vehicle", math.NaN(), "is nil")
	}
	if a, ok := v.repeat(s, d); ok {
		return a.p, a.err
	}
	p, err := op(v, d)
	v.remember(s, d, p, err)
	return p, err
}

// Operate implements Strategy.
func (s LeastFuel) Operate(v *Vehicle, d Demand) (Point, error) {
	return remembered(v, s, d, s.operate)
}

// operate is Operate without the memory of a simulation's last answer.
func (s LeastFuel) operate(v *Vehicle, d Demand) (Point, error) {
	if err := d.Validate(); err != nil {
		return Point{}, err
	}
	e := v.Engine()
	if ws, err := ptoEngineSpeeds(v, d); err != nil {
		return Point{}, err
	} else if ws != nil {
		return bestRange(v, d, ws)
	}
	sr := newSearch(v, d)
	defer sr.release()
	n := s.Samples
	if n < 2 {
		n = 24
	}
	tol := s.Tolerance
	if !(tol > 0) {
		tol = 1e-7
	}
	lo, hi := float64(e.Idle()), e.hi
	if d.Speed == 0 && d.Acceleration == 0 {
		// Drive disengaged: only the engine speed matters.
		p, err := refine(sr, 0, e.speeds(lo, hi, n), tol)
		if err != nil {
			return Point{}, infeasible(err)
		}
		return own(p), nil
	}
	var (
		best  Point
		found bool
		tries []try
		out   units.AngularVelocity // the output speed the demand needs, once a point shows it
	)
	rs, spanned := v.s.Transmission.(RatioSpanner)
	if _, axles := v.s.Transmission.(AxleTransmission); axles {
		spanned = false // two axle speeds: no single output speed to place
	}
	ranges := v.s.Transmission.Ranges()
	results := make([]Point, ranges)
	errs := make([]error, ranges)
	locked := make([]bool, ranges)
	spannedAt := make([]bool, ranges)
	for r := range ranges {
		if lp, ok, err := lockedPoint(sr, r); ok {
			// A locked range runs at one engine speed for this travel speed.
			locked[r] = true
			if err != nil {
				tries = append(tries, try{rng: r, err: err})
			} else if !found || better(lp, best) {
				best, found = lp, true
			}
			continue
		}
		// A range may reach the demand's ratio only on islands narrower
		// than the sample spacing (a band around a mechanical point the
		// motor cannot pass splits it): once a point shows the output speed
		// the demand needs, sample the edges of every interval of ratios
		// the range reaches as well.
		ws := e.speeds(lo, hi, n)
		if spanned && out > 0 {
			ws = withEdges(ws, rs.RatioSpans(r, units.AngularVelocity(hi)), float64(out), lo, hi)
			spannedAt[r] = true
		}
		results[r], errs[r] = refine(sr, r, ws, tol)
		if errs[r] == nil && results[r].Drive.OutputSpeed > 0 {
			out = results[r].Drive.OutputSpeed
		}
	}
	for r := range ranges {
		if locked[r] {
			continue
		}
		if spanned && out > 0 && !spannedAt[r] {
			// Ranges solved before the output speed was known.
			ws := withEdges(e.speeds(lo, hi, n), rs.RatioSpans(r, units.AngularVelocity(hi)), float64(out), lo, hi)
			p, err := refine(sr, r, ws, tol)
			if err == nil && (errs[r] != nil || better(p, results[r])) {
				results[r], errs[r] = p, nil
			}
		}
		if errs[r] != nil {
			tries = append(tries, try{rng: r, err: errs[r]})
			continue
		}
		if !found || better(results[r], best) {
			best, found = results[r], true
		}
	}
	if !found {
		return Point{}, infeasibleTries(v.s.Transmission, tries)
	}
	return own(best), nil
}

// A LockedRatioer is a Transmission with locked (mechanical) ranges: each
// runs at one output speed per engine speed, output = ratio·engine.
type LockedRatioer interface {
	LockedRatio(rng int) (ratio float64, ok bool)
}

// lockedPoint solves demand d in range r when r is a locked range of the
// vehicle's transmission (ok true): at the one engine speed that gives the
// output speed the travel speed needs. The output speed comes from the
// transmission's own report of the speed asked (a point at idle speed).
func lockedPoint(sr *search, r int) (Point, bool, error) {
	v := sr.v
	lr, ok := v.s.Transmission.(LockedRatioer)
	if !ok {
		return Point{}, false, nil
	}
	nu, ok := lr.LockedRatio(r)
	if !ok || !(nu > 0) {
		return Point{}, false, nil
	}
	w0 := v.Engine().Idle()
	p, err := sr.at(w0, r)
	if err == nil {
		return p, true, nil
	}
	le, isLimit := errors.AsType[*powersplit.LimitError](err)
	if !isLimit || le.Bound != powersplit.BoundLockedSpeed {
		return Point{}, true, err
	}
	p, err = sr.at(units.AngularVelocity(le.Value.SI/nu), r)
	return p, true, err
}

// better reports whether p burns less fuel than q, or as little (both
// zero: the engine motored with its fuel cut, on a descent) with less
// work for the service brakes, that is with more engine braking.
func better(p, q Point) bool {
	return p.FuelRate < q.FuelRate || (p.FuelRate == q.FuelRate && p.Flows.Brake < q.Flows.Brake)
}

// refine samples the speeds in range r and refines the best sample.
func refine(sr *search, r int, ws []float64, tol float64) (Point, error) {
	bestI := -1
	var (
		best    Point
		lastErr error
	)
	for i, w := range ws {
		p, err := sr.at(units.AngularVelocity(w), r)
		if err != nil {
			lastErr = err
			continue
		}
		if bestI < 0 || better(p, best) {
			best, bestI = p, i
		}
	}
	if bestI < 0 {
		return Point{}, lastErr
	}
	// The least fuel often lies on the edge of the feasible speeds (the
	// lowest engine speed whose ratio or torque still carries the demand),
	// which may fall between two samples: find each edge next to the best
	// sample.
	feasible := func(w float64) (Point, bool) {
		p, err := sr.at(units.AngularVelocity(w), r)
		return p, err == nil
	}
	for _, j := range []int{bestI - 1, bestI + 1} {
		if j < 0 || j >= len(ws) {
			continue
		}
		if _, ok := feasible(ws[j]); ok {
			continue
		}
		if p, ok := edge(feasible, ws[j], ws[bestI], tol); ok && better(p, best) {
			best = p
		}
	}
	a := ws[max(bestI-1, 0)]
	b := ws[min(bestI+1, len(ws)-1)]
	if b > a {
		fuel := func(w float64) float64 {
			p, err := sr.at(units.AngularVelocity(w), r)
			if err != nil {
				return math.Inf(1)
			}
			return float64(p.FuelRate)
		}
		x, fx := numeric.Minimize(fuel, a, b, tol*b)
		if fx < float64(best.FuelRate) {
			if p, err := sr.at(units.AngularVelocity(x), r); err == nil {
				best = p
			}
		}
	}
	return best, nil
}

// A RatioSpanner is a Transmission that reports the intervals of output
// speed over engine speed a range reaches (at no load, with the engine at
// the given speed). LeastFuel uses them to find ranges that reach a demand
// only on narrow islands of engine speed.
type RatioSpanner interface {
	RatioSpans(rng int, engine units.AngularVelocity) [][2]float64
}

// withEdges returns the sample speeds ws with, added in order, the engine
// speeds within [lo, hi] at which output speed out sits at an edge of one of
// the ratio spans, each nudged just inside its span.
func withEdges(ws []float64, spans [][2]float64, out, lo, hi float64) []float64 {
	ws = slices.Clone(ws)
	for _, sp := range spans {
		for k, rho := range sp {
			if !(rho > 0) {
				continue
			}
			// The low ratio edge is the high engine speed edge.
			nudge := 1 + 1e-6
			if k == 1 {
				nudge = 1 - 1e-6
			}
			if w := out / (rho * nudge); w >= lo && w <= hi {
				ws = append(ws, w)
			}
		}
	}
	slices.Sort(ws)
	return ws
}

// edge bisects between an infeasible speed bad and a feasible speed good
// to within tol relative and returns the feasible point nearest the edge.
func edge(feasible func(float64) (Point, bool), bad, good, tol float64) (Point, bool) {
	p, ok := feasible(good)
	if !ok {
		return Point{}, false
	}
	for range 60 {
		if math.Abs(good-bad) <= tol*math.Abs(good) {
			break
		}
		mid := 0.5 * (bad + good)
		if q, ok := feasible(mid); ok {
			good, p = mid, q
		} else {
			bad = mid
		}
	}
	return p, true
}

// FixedSpeed runs the engine at one speed (a hand throttle setting) and
// chooses the range of least fuel. A demanded PTO speed overrides Speed.
type FixedSpeed struct {
	Speed units.AngularVelocity
}

// Operate implements Strategy.
func (s FixedSpeed) Operate(v *Vehicle, d Demand) (Point, error) {
	return remembered(v, s, d, s.operate)
}

// operate is Operate without the memory of a simulation's last answer.
func (s FixedSpeed) operate(v *Vehicle, d Demand) (Point, error) {
	if err := d.Validate(); err != nil {
		return Point{}, err
	}
	ws, err := ptoEngineSpeeds(v, d)
	if err != nil {
		return Point{}, err
	}
	if ws == nil {
		ws = []units.AngularVelocity{s.Speed}
	}
	return bestRange(v, d, ws)
}

// bestRange returns the least-fuel range and engine speed among ws.
func bestRange(v *Vehicle, d Demand, ws []units.AngularVelocity) (Point, error) {
	ranges := v.s.Transmission.Ranges()
	if d.Speed == 0 && d.Acceleration == 0 {
		ranges = 1 // drive disengaged
	}
	var (
		best  Point
		found bool
		tries []try
	)
	sr := newSearch(v, d)
	defer sr.release()
	for _, w := range ws {
		for r := range ranges {
			p, err := sr.at(w, r)
			if err != nil {
				tries = append(tries, try{rng: r, engine: w, err: err})
				continue
			}
			if !found || better(p, best) {
				best, found = p, true
			}
		}
	}
	if !found {
		return Point{}, infeasibleTries(v.s.Transmission, tries)
	}
	return own(best), nil
}

// ptoEngineSpeeds returns the engine speeds a demanded PTO speed allows,
// nil when none is demanded.
func ptoEngineSpeeds(v *Vehicle, d Demand) ([]units.AngularVelocity, error) {
	if d.PTOSpeed == 0 {
		return nil, nil
	}
	return v.s.PTO.EngineSpeeds(d.PTOSpeed)
}

// try is one range (and engine speed, if fixed) a strategy tried in vain.
type try struct {
	rng    int
	engine units.AngularVelocity // 0: the strategy searched the engine speed
	err    error
}

// infeasibleTries is infeasible with each try's error named by its range
// (and engine speed); the names are built only when every try failed.
func infeasibleTries(tr Transmission, tries []try) error {
	errs := make([]error, len(tries))
	for i, t := range tries {
		if t.engine != 0 {
			errs[i] = fmt.Errorf("%s at %v: %w", RangeName(tr, t.rng), t.engine, t.err)
		} else {
			errs[i] = fmt.Errorf("%s: %w", RangeName(tr, t.rng), t.err)
		}
	}
	return infeasible(errs...)
}

// infeasible joins ErrInfeasible with the limits met (one per range).
func infeasible(errs ...error) error {
	if len(errs) == 1 && errors.Is(errs[0], ErrInfeasible) {
		return errs[0]
	}
	return errors.Join(append([]error{ErrInfeasible}, errs...)...)
}
