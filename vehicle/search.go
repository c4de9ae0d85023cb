package vehicle

import (
	"sync"

	"github.com/powersplit-dev/powersplit/units"
)

// A tyreMemo holds what a point of a demand needs that depends on neither
// the engine speed nor the range: the axle loads' check and the tyres'
// solution. A strategy's search over engine speeds and ranges solves them
// once per demand (the first point that needs them) instead of once per
// point. A nil *tyreMemo solves them every time.
type tyreMemo struct {
	loadsDone bool
	loadsErr  error
	driveDone bool
	wheels    Wheels
	driveErr  error
}

// axleLoads returns v.AxleLoads(d)'s error, once per memo.
func (m *tyreMemo) axleLoads(v *Vehicle, d Demand) error {
	if m == nil {
		_, _, err := v.AxleLoads(d)
		return err
	}
	if !m.loadsDone {
		_, _, m.loadsErr = v.AxleLoads(d)
		m.loadsDone = true
	}
	return m.loadsErr
}

// drive returns the tyres' solution of d on ground at net pull pull, once
// per memo.
func (m *tyreMemo) drive(ground Traction, pull units.Force, d Demand) (Wheels, error) {
	if m == nil {
		return driveOn(ground, pull, d.Grade, d.Speed, d.TurnRadius)
	}
	if !m.driveDone {
		m.wheels, m.driveErr = driveOn(ground, pull, d.Grade, d.Speed, d.TurnRadius)
		m.driveDone = true
	}
	return m.wheels, m.driveErr
}

// A search is one demand solved at many engine speeds and ranges, as the
// strategies do: each engine speed and range is solved once (a search
// asks for many twice: the samples of a range searched again with its
// ratio edges, the best sample again for its edges, the refined minimum),
// and the tyres once (tyreMemo). Points are functions of the vehicle,
// demand, engine speed and range alone (the root solver's points do not
// depend on the points solved before them), so a point given again is the
// point solved. Searches are pooled: get one with newSearch, give it back
// with release.
type search struct {
	v     *Vehicle
	d     Demand
	tyres tyreMemo
	seen  []seenPoint
}

// seenPoint is one engine speed and range a search solved, and the outcome.
type seenPoint struct {
	w   units.AngularVelocity
	rng int
	p   Point
	err error
}

var searches = sync.Pool{New: func() any { return new(search) }}

// newSearch returns a search of demand d with vehicle v.
func newSearch(v *Vehicle, d Demand) *search {
	s := searches.Get().(*search)
	s.v, s.d = v, d
	return s
}

// release clears the search (so the pool holds no points, errors or
// vehicles) and gives it back to the pool.
func (s *search) release() {
	clear(s.seen)
	*s = search{seen: s.seen[:0]}
	searches.Put(s)
}

// at is s.v.At(s.d, w, rng), each engine speed and range solved once.
func (s *search) at(w units.AngularVelocity, rng int) (Point, error) {
	for i := range s.seen {
		if q := &s.seen[i]; q.w == w && q.rng == rng {
			return q.p, q.err
		}
	}
	p, err := s.v.at(s.d, w, rng, &s.tyres)
	s.seen = append(s.seen, seenPoint{w: w, rng: rng, p: p, err: err})
	return p, err
}
