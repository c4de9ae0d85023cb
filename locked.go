package powersplit

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
)

// Locked (mechanical) ranges. A range whose engaged clutches and brakes fix
// the loops' speed ratios — for example a brake holding the pump member of
// an output-coupled split, which is its mechanical point — has one
// kinematic constraint more per loop than shafts: the shaft speeds follow
// from the input speed alone, and the output speed the point asks for must
// be the one the range gives. In such a range every loop is bypassed with
// its units destroked: all settings zero and no loop pressure, so the units
// carry only the torques of their own losses at zero displacement (the
// drag of a destroked unit turning). The torque system takes Δp = 0 as the
// loop's relation in place of the free ratio.

// LockedRange declares range name a locked (mechanical) range: its engaged
// clutches and brakes must fix the ratio of every loop (one kinematic
// constraint more than shafts per loop, for example a brake on a unit's
// shaft), and the loops are bypassed with their units destroked. Build
// reports a range declared locked whose constraints do not do that, and
// an undeclared range that is over-determined, as kinematics errors.
func (b *Builder) LockedRange(name string) {
	if b.lockedRanges == nil {
		b.lockedRanges = map[string]bool{}
	}
	b.lockedRanges[name] = true
}

// destroked is the schedule of a loop in a locked range: every unit at
// setting zero, whatever the speeds and pressure.
type destroked struct{}

// Settings implements hydrostat.Schedule.
func (destroked) Settings(_ hydrostat.Loop, _ units.AngularVelocity, _ []units.AngularVelocity, _ units.Pressure, x []float64) error {
	clear(x)
	return nil
}

// prepareLocked sets up range r as a locked range from its kinematic rows
// k·ω = bm·g (rows = S + number of loops, rank S): the least-squares speed
// map and the consistency rows the given speeds must satisfy.
func (l *layout) prepareLocked(r *rangeDef, k, bm *mat.Dense) bool {
	rows, S := k.Dims()
	_, nG := bm.Dims()
	var g mat.Dense
	if err := g.Solve(k, bm); err != nil {
		return false
	}
	// Orthonormal basis of the consistency conditions: the left null space
	// of k, from its SVD (columns S.. of U).
	var svd mat.SVD
	if !svd.Factorize(k, mat.SVDFull) {
		return false
	}
	var u mat.Dense
	svd.UTo(&u)
	var cons mat.Dense
	cons.Mul(u.Slice(0, rows, S, rows).T(), bm)
	r.consist = r.consist[:0]
	for i := 0; i < rows-S; i++ {
		for j := 0; j < nG; j++ {
			r.consist = append(r.consist, cons.At(i, j))
		}
	}
	r.nConsist = rows - S
	// The least-squares map carries rounding of order 1e-16 of its largest
	// entry where the exact map has zeros (a held shaft): clear it, so a
	// braked shaft stands exactly still.
	gmax := mat.Norm(&g, math.Inf(1))
	r.g = make([]float64, S*nG)
	for s := 0; s < S; s++ {
		for j := 0; j < nG; j++ {
			if v := g.At(s, j); math.Abs(v) > 1e-13*gmax {
				r.g[s*nG+j] = v
			}
		}
	}
	r.locked = true
	return true
}

// lockedSpeed checks that the point's speeds g = [ωin, ωout...] satisfy
// the locked range's consistency rows and returns the first output speed
// the range gives at this input speed (the other outputs as given), and
// whether the point's own speed is that one (to 1e-9 relative).
func (r *rangeDef) lockedSpeed(win float64, wout []float64) (float64, bool) {
	nG := 1 + len(wout)
	ok := true
	want := wout[0]
	for i := 0; i < r.nConsist; i++ {
		row := r.consist[i*nG : (i+1)*nG]
		res, scale := row[0]*win, math.Abs(row[0]*win)
		for j, w := range wout {
			res += row[1+j] * w
			scale += math.Abs(row[1+j] * w)
		}
		if math.Abs(res) > 1e-9*scale+1e-12 {
			ok = false
		}
		if i == 0 && row[1] != 0 {
			want = wout[0] - res/row[1]
		}
	}
	return want, ok
}

// boundLockedSpeed names the limit of a point outside a locked range's
// one output speed.
const boundLockedSpeed = "the locked range's output speed at this input speed"

// initLocked makes the destroked copies of the loops when a range of the
// layout is locked.
func (s *Solver) initLocked() {
	l := s.l
	any := false
	for i := range l.ranges {
		any = any || l.ranges[i].locked
	}
	if !any {
		return
	}
	s.lockLoop = make([]hydrostat.Loop, len(l.loops))
	for j, e := range l.loops {
		lp, err := l.elems[e].loop.WithSchedule(destroked{})
		if err != nil {
			panic("powersplit: destroked schedule: " + err.Error())
		}
		s.lockLoop[j] = lp
	}
}

// snapSpeeds sets to zero the speeds below 1e-12 of the largest: in a
// locked range the speeds come from a least-squares map, whose rounding
// would leave a held shaft turning at 1e-16 of the others.
func snapSpeeds(w []float64) {
	var m float64
	for _, v := range w {
		m = maxAbs(m, v)
	}
	for i, v := range w {
		if math.Abs(v) < 1e-12*m {
			w[i] = 0
		}
	}
}

// BoundLockedSpeed is the Bound of the *LimitError (ErrUnreachable) of a
// point whose output speed is not the one its locked range gives: its
// Value is the output speed asked, its Limit the one the range gives.
const BoundLockedSpeed = boundLockedSpeed

// LockedRatio returns the first output's speed over the input speed of
// range rng when it is a locked range whose other outputs are free of it
// (ok false otherwise, and for a range that is not locked).
func (l Layout) LockedRatio(rng int) (ratio float64, ok bool) {
	if l.l == nil || rng < 0 || rng >= len(l.l.ranges) {
		return 0, false
	}
	r := &l.l.ranges[rng]
	nG := 1 + len(l.l.outputs)
	if !r.locked || r.nConsist != 1 || r.consist[1] == 0 {
		return 0, false
	}
	for j := 2; j < nG; j++ {
		if r.consist[j] != 0 {
			return 0, false
		}
	}
	return -r.consist[0] / r.consist[1], true
}
