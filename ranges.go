package powersplit

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit/units"
)

// The range logic works on the kinematics alone: shaft speeds are affine in
// the output speed at a given input speed, the unit speeds and the
// displacement settings needed (from the loop's schedule at zero pressure)
// decide whether a speed is reachable.

// outputSpeeds fills s.outW for first-output speed v, the other outputs
// following the first in the proportion of template p (held at their speeds
// in p when p's first output speed is zero).
func (s *Solver) outputSpeeds(p *Point, v float64) {
	w0 := float64(p.Outputs[0].Speed)
	s.outW[0] = v
	for i := 1; i < len(s.outW); i++ {
		if w0 != 0 {
			s.outW[i] = v * float64(p.Outputs[i].Speed) / w0
		} else {
			s.outW[i] = float64(p.Outputs[i].Speed)
		}
	}
}

// reachable reports whether first-output speed v is kinematically reachable
// in range rg at input speed p.Input: unit speeds within their maxima,
// settings within range, the range's speed limit kept.
func (s *Solver) reachable(p *Point, rg int, v float64) bool {
	l := s.l
	r := &l.ranges[rg]
	if r.maxOut > 0 && math.Abs(v) > r.maxOut {
		return false
	}
	s.outputSpeeds(p, v)
	q := *p
	q.Range = rg
	s.setPins(&q, false)
	s.lockedNow = r.locked
	if r.locked {
		if _, ok := r.lockedSpeed(float64(p.Input), s.outW); !ok {
			return false
		}
	}
	l.speeds(r, float64(p.Input), s.outW, s.w)
	if r.locked {
		snapSpeeds(s.w)
	}
	// The unit speeds and the loops at zero pressure, as unitSpeeds and
	// evalLoops(true) judge them, without building the errors they would
	// return: only whether there is one.
	if s.overSpeed() >= 0 {
		return false
	}
	clear(s.dp)
	for j := range l.loops {
		if s.trial(j) != nil {
			return false
		}
	}
	return true
}

// SpeedInterval is a connected interval [Lo, Hi] of first-output speeds.
type SpeedInterval struct {
	Lo, Hi units.AngularVelocity
}

// Interval returns every interval of first-output speeds that range p.Range
// reaches at input speed p.Input, in increasing order of speed: the
// connected sets of speeds at which every unit is within its speed limit
// and the schedule finds settings within range (evaluated at zero load). A
// range whose motor reaches its speed limit near standstill, for example,
// reaches one interval in reverse and one forward. Other outputs follow the
// first in the proportion of p's output speeds. Intervals narrower than
// 1/200 of the searched span may be missed. It returns ErrUnreachable when
// the range reaches no speed.
func (s *Solver) Interval(p Point) ([]SpeedInterval, error) {
	if err := s.check(&p); err != nil {
		return nil, err
	}
	l := s.l
	r := &l.ranges[p.Range]
	if r.locked {
		// A locked range reaches one speed: the one its input speed gives.
		s.outputSpeeds(&p, 0)
		v, _ := r.lockedSpeed(float64(p.Input), s.outW)
		s.outputSpeeds(&p, v)
		if want, ok := r.lockedSpeed(float64(p.Input), s.outW); ok && s.reachable(&p, p.Range, v) {
			return []SpeedInterval{{Lo: units.AngularVelocity(want), Hi: units.AngularVelocity(want)}}, nil
		}
		return nil, s.limitErr(LimitError{Element: r.name, Quantity: "output speed", Value: units.Of(units.AngularVelocity(v)),
			Bound: boundLockedSpeed, Limit: units.Of(units.AngularVelocity(v)), Err: ErrUnreachable})
	}
	// Speeds of every unit are affine in v: a + b·v.
	V := 0.0
	s.outputSpeeds(&p, 0)
	l.speeds(r, float64(p.Input), s.outW, s.w)
	a := append([]float64(nil), s.w...)
	s.outputSpeeds(&p, 1)
	l.speeds(r, float64(p.Input), s.outW, s.w)
	for _, e := range l.loops {
		el := &l.elems[e]
		spec := el.loop.Spec()
		for k, sh := range el.shafts {
			u := spec.Pump
			if k > 0 {
				u = spec.Motors[k-1]
			}
			b := s.w[sh] - a[sh]
			if ms := float64(u.Spec().MaxSpeed); ms > 0 && b != 0 {
				V = math.Max(V, (ms+math.Abs(a[sh]))/math.Abs(b))
			}
		}
	}
	if V == 0 {
		V = 10 * math.Abs(float64(p.Input))
	}
	if r.maxOut > 0 {
		V = math.Min(V, r.maxOut)
	}
	if V == 0 || math.IsInf(V, 0) {
		return nil, &LimitError{Element: r.name, Err: ErrUnreachable, Cause: errNoSpeed}
	}
	const n = 200
	at := func(i int) float64 { return -V + 2*V*float64(i)/n }
	edge := func(in, out float64) float64 {
		for k := 0; k < 50; k++ {
			m := (in + out) / 2
			if s.reachable(&p, p.Range, m) {
				in = m
			} else {
				out = m
			}
		}
		return in
	}
	var out []SpeedInterval
	runLo := -1
	for i := 0; i <= n+1; i++ {
		ok := i <= n && s.reachable(&p, p.Range, at(i))
		switch {
		case ok && runLo < 0:
			runLo = i
		case !ok && runLo >= 0:
			lv, hv := at(runLo), at(i-1)
			if runLo > 0 {
				lv = edge(lv, at(runLo-1))
			}
			if i <= n {
				hv = edge(hv, at(i))
			}
			out = append(out, SpeedInterval{Lo: units.AngularVelocity(lv), Hi: units.AngularVelocity(hv)})
			runLo = -1
		}
	}
	if len(out) == 0 {
		return nil, &LimitError{Element: r.name, Err: ErrUnreachable, Cause: errNoSpeed}
	}
	return out, nil
}

// ShiftPoint is a synchronous shift point between two ranges: the output
// speed at which every shaft turns at the same speed in both ranges, so the
// oncoming clutch closes without slip and without a speed jump.
type ShiftPoint struct {
	From, To int
	Output   units.AngularVelocity
	// Ratio is the loop's speed ratio ωmotor/ωpump (first loop, first motor)
	// at the shift.
	Ratio float64
}

// ShiftPoints returns the synchronous shift points between adjacent ranges
// (i, i+1) at input speed p.Input, other outputs following the first as in
// Interval. A pair of ranges has one when the shaft speeds of both ranges,
// affine in the output speed, coincide at some output speed both ranges
// reach; range gears placed after the summing shaft coincide only at
// standstill, which is not reported.
func (s *Solver) ShiftPoints(p Point) ([]ShiftPoint, error) {
	if err := s.check(&p); err != nil {
		return nil, err
	}
	l := s.l
	S := len(l.shafts)
	speedsAt := func(rg int, v float64) []float64 {
		s.outputSpeeds(&p, v)
		l.speeds(&l.ranges[rg], float64(p.Input), s.outW, s.w)
		return append([]float64(nil), s.w...)
	}
	var out []ShiftPoint
	for i := 0; i+1 < len(l.ranges); i++ {
		a0, a1 := speedsAt(i, 0), speedsAt(i, 1)
		b0, b1 := speedsAt(i+1, 0), speedsAt(i+1, 1)
		// d + e·v = 0 for every shaft.
		num, den, scale := 0.0, 0.0, math.Abs(float64(p.Input))
		for k := 0; k < S; k++ {
			d := a0[k] - b0[k]
			e := (a1[k] - a0[k]) - (b1[k] - b0[k])
			num += d * e
			den += e * e
			scale = math.Max(scale, math.Abs(a0[k])+math.Abs(b0[k]))
		}
		if den == 0 {
			continue
		}
		v := -num / den
		if v == 0 || math.Abs(v) < 1e-12*scale {
			continue
		}
		ok := true
		for k := 0; k < S; k++ {
			d := a0[k] - b0[k]
			e := (a1[k] - a0[k]) - (b1[k] - b0[k])
			if math.Abs(d+e*v) > 1e-9*(scale+math.Abs(v)) {
				ok = false
				break
			}
		}
		if !ok || !s.reachable(&p, i, v) || !s.reachable(&p, i+1, v) {
			continue
		}
		ratio := math.NaN()
		if len(l.loops) > 0 {
			el := &l.elems[l.loops[0]]
			ratio = s.w[el.shafts[1]] / s.w[el.shafts[0]]
		}
		out = append(out, ShiftPoint{From: i, To: i + 1, Output: units.AngularVelocity(v), Ratio: ratio})
	}
	return out, nil
}

// Policy chooses between two solved states of the same operating point in
// different ranges.
type Policy interface {
	// Better reports whether a is to be preferred to b.
	Better(a, b *State) bool
}

// HighestEfficiency is the default Policy: the higher overall efficiency
// wins; on a tie, the lower range index.
type HighestEfficiency struct{}

// Better implements Policy.
func (HighestEfficiency) Better(a, b *State) bool { return a.Efficiency > b.Efficiency }

// Feasible appends to dst the ranges in which p (its Range ignored) solves
// without error, and returns it.
func (s *Solver) Feasible(p Point, dst []int) []int {
	s.scratch.Brief = true
	for i := range s.l.ranges {
		p.Range = i
		if s.Solve(p, &s.scratch) == nil {
			dst = append(dst, i)
		}
	}
	return dst
}

// Best solves p in every range (its Range ignored), writes the state of the
// best feasible range by policy pol (nil means HighestEfficiency) into st
// and returns nil. With no feasible range it returns a *RangesError with
// each range's reason (the range's own error when the layout has one
// range), and st.Range is Auto: no range was chosen.
func (s *Solver) Best(p Point, pol Policy, st *State) error {
	return resetOnInput(s.best(p, pol, st), st)
}

func (s *Solver) best(p Point, pol Policy, st *State) error {
	if st == nil {
		return errNilState
	}
	if pol == nil {
		pol = HighestEfficiency{}
	}
	found := false
	nr := len(s.l.ranges)
	var errs []error
	s.scratch.Brief = st.Brief
	for i := range nr {
		p.Range = i
		err := s.Solve(p, &s.scratch)
		if err != nil {
			if errors.Is(err, ErrInput) {
				return err
			}
			if !found {
				if errs == nil {
					errs = make([]error, nr)
				}
				errs[i] = err
			}
			continue
		}
		if !found || pol.Better(&s.scratch, st) {
			st.copyFrom(&s.scratch)
			found = true
		}
	}
	if found {
		return nil
	}
	st.copyFrom(&s.scratch)
	st.Range, st.RangeName = Auto, ""
	if nr == 1 {
		return errs[0]
	}
	names := make([]string, nr)
	for i := range names {
		names[i] = s.l.ranges[i].name
	}
	return &RangesError{Ranges: names, Errs: errs}
}

// RangesError reports why no range solved an operating point: one error per
// range, in range order, with the range's name. errors.Is matches a
// sentinel when any range's error matches it.
type RangesError struct {
	Ranges []string // range names
	Errs   []error  // Errs[i] is why range Ranges[i] failed
}

// Error returns "no range solves the point: <range>: <reason>; ...".
func (e *RangesError) Error() string {
	var b strings.Builder
	b.WriteString("powersplit: no range solves the point")
	for i, err := range e.Errs {
		if i == 0 {
			b.WriteString(": ")
		} else {
			b.WriteString("; ")
		}
		b.WriteString(strconv.Quote(e.Ranges[i]))
		b.WriteString(": ")
		if err != nil {
			b.WriteString(err.Error())
		}
	}
	return b.String()
}

// Unwrap returns every range's error.
func (e *RangesError) Unwrap() []error { return e.Errs }

// copyFrom copies src into st, reusing st's storage when it fits.
func (st *State) copyFrom(src *State) {
	ports, els, sh, outs, ptos, loops, mar, fl, dr := st.ports, st.Elements, st.Shafts, st.Outputs, st.PTOs, st.Loops, st.Margins, st.Flags, st.Drags
	*st = *src
	st.Drags = copyInto(dr, src.Drags)
	st.ports = copyInto(ports, src.ports)
	off := 0
	st.Elements = copyInto(els, src.Elements)
	for i := range st.Elements {
		n := len(st.Elements[i].Ports)
		st.Elements[i].Ports = st.ports[off : off+n : off+n]
		off += n
	}
	st.Shafts = copyInto(sh, src.Shafts)
	st.Outputs = copyInto(outs, src.Outputs)
	st.PTOs = copyInto(ptos, src.PTOs)
	if len(loops) != len(src.Loops) {
		loops = make([]LoopResult, len(src.Loops))
	}
	for j := range src.Loops {
		m, set := loops[j].Motors, loops[j].Settings
		loops[j] = src.Loops[j]
		loops[j].Motors = copyInto(m, src.Loops[j].Motors)
		loops[j].Settings = copyInto(set, src.Loops[j].Settings)
	}
	st.Loops = loops
	if mar == nil {
		mar = make([]Margin, 0, cap(src.Margins))
	}
	if fl == nil {
		fl = make([]Margin, 0, cap(src.Flags))
	}
	st.Margins = append(mar[:0], src.Margins...)
	st.Flags = append(fl[:0], src.Flags...)
}

// copyInto returns a copy of src in dst's storage when it has room: nil
// for nil, empty for empty.
func copyInto[T any](dst, src []T) []T {
	if src == nil {
		return nil
	}
	if dst == nil || cap(dst) < len(src) {
		dst = make([]T, len(src))
	}
	dst = dst[:len(src)]
	copy(dst, src)
	return dst
}

// errNoSpeed is the cause of an interval search that found no reachable
// output speed.
var errNoSpeed = errors.New("no output speed of the range is reachable at this input speed")
