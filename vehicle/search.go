package vehicle

import (
	"reflect"
	"slices"
	"sync"

	"github.com/powersplit-dev/powersplit/units"
)

// A tyreMemo holds what a point of a demand needs that depends on neither
// the engine speed nor the range: the demand's validation, the axle loads'
// check and the tyres' solution. A strategy's search over engine speeds and ranges solves them
// once per demand (the first point that needs them) instead of once per
// point. A nil *tyreMemo solves them every time.
type tyreMemo struct {
	validDone bool
	validErr  error
	loadsDone bool
	loadsErr  error
	driveDone bool
	wheels    Wheels
	driveErr  error
	axlesDone bool
	pair      axlePair
	axlesErr  error
}

// validate returns d.Validate(), once per memo.
func (m *tyreMemo) validate(d Demand) error {
	if m == nil {
		return d.Validate()
	}
	if !m.validDone {
		m.validErr = d.Validate()
		m.validDone = true
	}
	return m.validErr
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

// axles returns the axle pair of a two-axle point of d at net pull pull
// (>= 0) on t, once per memo; a nil memo makes it anew in *buf. The pair
// is not to be changed: each solve copies the axles it searches.
func (m *tyreMemo) axles(buf *axlePair, t Tyres, pull float64, d Demand) (*axlePair, error) {
	if m == nil {
		var err error
		*buf, err = newAxlePair(t, pull, d)
		return buf, err
	}
	if !m.axlesDone {
		m.pair, m.axlesErr = newAxlePair(t, pull, d)
		m.axlesDone = true
	}
	return &m.pair, m.axlesErr
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
	buf   driveBuf
	// seen are the engine speeds and ranges solved, kept apart from their
	// outcomes (large) so the look-up reads a few cache lines.
	seen     []seenKey
	outcomes []outcome
}

// seenKey is one engine speed and range a search solved.
type seenKey struct {
	w   units.AngularVelocity
	rng int
}

// outcome is the point or error of a seenKey.
type outcome struct {
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
	clear(s.outcomes)
	s.buf.reset()
	*s = search{seen: s.seen[:0], outcomes: s.outcomes[:0], buf: s.buf}
	searches.Put(s)
}

// at is s.v.At(s.d, w, rng), each engine speed and range solved once.
func (s *search) at(w units.AngularVelocity, rng int) (Point, error) {
	for i, k := range s.seen {
		if k.w == w && k.rng == rng {
			o := &s.outcomes[i]
			return o.p, o.err
		}
	}
	p, err := s.v.at(s.d, w, rng, &s.tyres, &s.buf)
	s.seen = append(s.seen, seenKey{w: w, rng: rng})
	s.outcomes = append(s.outcomes, outcome{p: p, err: err})
	return p, err
}

// A driveBuf hands out the slices of the drive points a search solves
// (NoLoad, Flags) from a few large ones kept across searches, so a point
// costs no allocation of its own. A point's slices are capacity-limited
// (an append copies) and stay valid while the search runs; the point a
// strategy returns is given slices of its own (own). A nil *driveBuf
// makes new slices.
type driveBuf struct {
	parts []LossPart
	flag  []Flag
}

// lossParts returns n parts.
func (b *driveBuf) lossParts(n int) []LossPart {
	if b == nil {
		return make([]LossPart, n)
	}
	return carve(&b.parts, n)
}

// flags returns n flags.
func (b *driveBuf) flags(n int) []Flag {
	if b == nil {
		return make([]Flag, n)
	}
	return carve(&b.flag, n)
}

// carve returns the next n elements of the block *buf, starting a new
// block (twice the last, at least 16·n) when it is full; the slices given
// out of the old block keep it.
func carve[T any](buf *[]T, n int) []T {
	if cap(*buf)-len(*buf) < n {
		*buf = make([]T, 0, max(2*cap(*buf), 16*n))
	}
	k := len(*buf)
	*buf = (*buf)[:k+n]
	return (*buf)[k : k+n : k+n]
}

// reset makes the blocks' room free again once no point given from them
// is in use.
func (b *driveBuf) reset() {
	clear(b.parts)
	clear(b.flag)
	b.parts, b.flag = b.parts[:0], b.flag[:0]
}

// own returns p with slices of its own in place of a search's blocks.
func own(p Point) Point {
	if len(p.Drive.NoLoad) > 0 {
		p.Drive.NoLoad = slices.Clone(p.Drive.NoLoad)
	}
	if n := len(p.Drive.Flags); n > 0 {
		shared := len(p.Flags) > 0 && &p.Flags[0] == &p.Drive.Flags[0]
		p.Drive.Flags = slices.Clip(slices.Clone(p.Drive.Flags))
		if shared {
			p.Flags = p.Drive.Flags
		}
	}
	return p
}

// flagNames holds the names of a solver's flags ("element: quantity"), so
// each is built once per transmission rather than once per point.
type flagNames struct {
	known []flagName
}

type flagName struct{ element, quantity, name string }

// maxFlagNames bounds the names kept; a name beyond them is built anew.
const maxFlagNames = 64

// name returns element + ": " + quantity.
func (c *flagNames) name(element, quantity string) string {
	for _, k := range c.known {
		if k.element == element && k.quantity == quantity {
			return k.name
		}
	}
	n := element + ": " + quantity
	if len(c.known) < maxFlagNames {
		c.known = append(c.known, flagName{element, quantity, n})
	}
	return n
}

// repeats remembers, for the vehicle a simulation hands its strategy, the
// last demand LeastFuel or FixedSpeed answered on it, with the answer: the
// steps of a steady segment repeat one demand, and an answer depends only
// on the vehicle, the strategy and the demand (the parts of a vehicle are
// built values; a layout solver's point does not depend on the points it
// solved before). The memory lives as long as the simulation.
type repeats struct {
	mu       sync.Mutex
	ok       bool
	strategy Strategy // the strategy's value: LeastFuel or FixedSpeed
	d        Demand
	p        Point // with slices of its own, handed out as copies
	err      error
}

// An answer is a strategy's point for a demand, or its error.
type answer struct {
	p   Point
	err error
}

// repeat returns the answer strategy s gave v for demand d when d is the
// last demand it answered there.
func (v *Vehicle) repeat(s Strategy, d Demand) (answer, bool) {
	r := v.rep
	if r == nil || !canCompare(d) {
		return answer{}, false
	}
	r.mu.Lock()
	defer r.mu.Unlock()
	if !r.ok || r.strategy != s || r.d != d {
		return answer{}, false
	}
	return answer{own(r.p), r.err}, true
}

// remember keeps strategy s's answer p, err to demand d on v.
func (v *Vehicle) remember(s Strategy, d Demand, p Point, err error) {
	r := v.rep
	if r == nil || !canCompare(d) {
		return
	}
	r.mu.Lock()
	defer r.mu.Unlock()
	r.ok, r.strategy, r.d, r.p, r.err = true, s, d, own(p), err
}

// canCompare reports whether d can be compared with == (its Ground may
// hold a value that cannot: then d is never remembered).
func canCompare(d Demand) bool {
	return d.Ground == nil || reflect.ValueOf(d.Ground).Comparable()
}
