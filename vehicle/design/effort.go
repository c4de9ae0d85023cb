package design

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Limits that bound the pull of a tractive-effort diagram, as
// EffortPoint.Limit names them.
const (
	LimitEngine    = "engine"          // the engine's full-load torque
	LimitPressure  = "relief pressure" // the loop's relief setting (or a unit's peak pressure)
	LimitUnitSpeed = "unit speed"      // a pump or motor at its greatest speed
	LimitRatio     = "ratio range"     // the variator at the end of its settings: the range does not reach the speed
	LimitTraction  = "traction"        // the tyres at the greatest slip allowed, or beyond their peak pull
	LimitStability = "stability"       // the front axle unloaded
	LimitNone      = "none"            // no limit within the search bound (the bound is the pull)
)

// EffortSpec sets up a full-load tractive-effort diagram. Zero fields take
// the documented defaults.
type EffortSpec struct {
	// Speeds are the travel speeds; default 80 speeds evenly from 0.5 km/h
	// to 60 km/h.
	Speeds []units.Speed
	// EngineSpeed is the engine speed of the diagram; default the engine's
	// rated speed (full engine power).
	EngineSpeed units.AngularVelocity
	// Ground is the tyres on the surface; default the vehicle's own.
	Ground vehicle.Traction
	// MaxSlip is the greatest wheel slip counted as usable pull; default
	// 0.15. Common practice (no published source): drawbar work is
	// planned at 8–15 % slip on soil; pull bought with more slip wears
	// tyres and soil for little gain.
	MaxSlip float64
	// Resolution is the pull's resolution; default 10 N.
	Resolution units.Force
}

// EffortPoint is one point of a tractive-effort diagram: the greatest
// drawbar pull on level ground in one range at one travel speed.
type EffortPoint struct {
	Range int
	Speed units.Speed
	// Feasible is false when the range cannot run the speed at all (Pull
	// is then zero and Limit says why).
	Feasible bool
	// Pull is the greatest drawbar pull (implement draft at the hitch).
	Pull units.Force
	// Limit names what stops more pull (one of the Limit constants, or the
	// error's text for anything else).
	Limit string
	// Slip and EngineTorque are at the greatest pull.
	Slip         float64
	EngineTorque units.Torque
}

// Classify names the limit an operating point's error reports (one of the
// Limit constants), or returns the error's text.
func Classify(err error) string {
	var le *powersplit.LimitError
	switch {
	case err == nil:
		return LimitNone
	case errors.Is(err, hydrostat.ErrPressureLimit):
		return LimitPressure
	case errors.Is(err, hydrostat.ErrSpeedLimit):
		return LimitUnitSpeed
	case errors.Is(err, hydrostat.ErrSettingLimit), errors.Is(err, powersplit.ErrUnreachable):
		return LimitRatio
	case errors.As(err, &le):
		switch q := le.Quantity; {
		case strings.Contains(q, "pressure"):
			return LimitPressure
		case strings.Contains(q, "output speed"):
			return LimitRatio
		case strings.Contains(q, "speed"):
			return LimitUnitSpeed
		case strings.Contains(q, "setting"):
			return LimitRatio
		}
	}
	switch {
	case errors.Is(err, vehicle.ErrEngineLimit):
		return LimitEngine
	case errors.Is(err, vehicle.ErrTraction):
		return LimitTraction
	case errors.Is(err, vehicle.ErrStability):
		return LimitStability
	}
	return err.Error()
}

// TractiveEffort returns the full-load tractive-effort diagram of v: for
// every range and travel speed, the greatest drawbar pull on level ground
// with the engine at spec.EngineSpeed, found by bisection on the pull to
// spec.Resolution, with the limit that binds. Points are ordered by range,
// then speed.
func TractiveEffort(v *vehicle.Vehicle, spec EffortSpec) ([]EffortPoint, error) {
	return tractiveEffort(v, spec, false)
}

// tractiveEffort is TractiveEffort. With greatest set, only the point of
// greatest pull at each speed (the last range's of equal pulls) is
// exact: a range's bisection stops once its pull cannot exceed the
// greatest an earlier range reached at that speed, and its point then
// holds a pull below that one.
func tractiveEffort(v *vehicle.Vehicle, spec EffortSpec, greatest bool) ([]EffortPoint, error) {
	if spec.EngineSpeed == 0 {
		spec.EngineSpeed = v.Engine().Rated()
	}
	if spec.MaxSlip == 0 {
		spec.MaxSlip = 0.15
	}
	if spec.Resolution == 0 {
		spec.Resolution = 10
	}
	if len(spec.Speeds) == 0 {
		for i := range 80 {
			spec.Speeds = append(spec.Speeds, units.KMH(0.5+59.5*float64(i)/79))
		}
	}
	if !(spec.MaxSlip > 0 && spec.MaxSlip < 1) || !(spec.Resolution > 0) || !(spec.EngineSpeed > 0) ||
		math.IsInf(float64(spec.EngineSpeed), 0) || math.IsInf(float64(spec.Resolution), 0) {
		return nil, fmt.Errorf("%w: EffortSpec: slip %g, resolution %v, engine speed %v", ErrValue, spec.MaxSlip, spec.Resolution, spec.EngineSpeed)
	}
	top := units.Force(2 * float64(v.Spec().Mass) * float64(units.Gravity)) // beyond any tyre's pull
	ranges := v.Spec().Transmission.Ranges()
	out := make([]EffortPoint, 0, ranges*len(spec.Speeds))
	var best []units.Force // with greatest: the greatest pull so far at each speed
	if greatest {
		best = make([]units.Force, len(spec.Speeds))
	}
	for rg := range ranges {
		for i, s := range spec.Speeds {
			if !(s > 0) || math.IsInf(float64(s), 0) {
				return nil, fmt.Errorf("%w: EffortSpec.Speeds: %v", ErrValue, s)
			}
			var beat units.Force
			if greatest {
				beat = best[i]
			}
			pt := greatestPull(v, spec, rg, s, top, beat)
			out = append(out, pt)
			if greatest && pt.Feasible && pt.Pull >= best[i] {
				best[i] = pt.Pull
			}
		}
	}
	return out, nil
}

// errSlip is a point's slip above EffortSpec.MaxSlip: only its kind is
// read (Classify), so it is one value rather than words per point.
var errSlip = fmt.Errorf("%w: slip above the greatest counted", vehicle.ErrTraction)

// greatestPull bisects on the draft between a feasible and an infeasible
// pull. It stops early once the infeasible pull is at or below beat (0:
// never): the point's pull is then below beat, but not the greatest.
func greatestPull(v *vehicle.Vehicle, spec EffortSpec, rg int, s units.Speed, top, beat units.Force) EffortPoint {
	try := func(draft units.Force) (vehicle.Point, error) {
		p, err := v.At(vehicle.Demand{Speed: s, Draft: draft, Ground: spec.Ground}, spec.EngineSpeed, rg)
		if err == nil && p.Slip > spec.MaxSlip {
			err = errSlip
		}
		return p, err
	}
	pt := EffortPoint{Range: rg, Speed: s}
	p, err := try(0)
	if err != nil {
		pt.Limit = Classify(err)
		return pt
	}
	pt.Feasible = true
	lo, hi := units.Force(0), top
	best := p
	if q, err := try(hi); err == nil {
		pt.Pull, pt.Limit, pt.Slip, pt.EngineTorque = hi, LimitNone, q.Slip, q.EngineTorque
		return pt
	} else {
		pt.Limit = Classify(err)
	}
	for hi-lo > spec.Resolution && hi > beat {
		mid := (lo + hi) / 2
		q, err := try(mid)
		if err == nil {
			lo, best = mid, q
		} else {
			hi, pt.Limit = mid, Classify(err)
		}
	}
	pt.Pull, pt.Slip, pt.EngineTorque = lo, best.Slip, best.EngineTorque
	return pt
}

// WriteEffortCSV writes a tractive-effort diagram as CSV: range (index and
// name from names, when given), speed in km/h, pull in kN, the binding
// limit, slip and engine torque.
func WriteEffortCSV(w io.Writer, pts []EffortPoint, names []string) error {
	b := []byte("range,range_name,speed_kmh,feasible,pull_kN,limit,slip,engine_torque_Nm\n")
	for _, p := range pts {
		name := ""
		if p.Range < len(names) {
			name = names[p.Range]
		}
		b = strconv.AppendInt(b, int64(p.Range), 10)
		b = append(b, ',')
		b = strconv.AppendQuote(b, name)
		b = append(b, ',')
		b = strconv.AppendFloat(b, p.Speed.KMH(), 'g', 8, 64)
		b = append(b, ',')
		b = strconv.AppendBool(b, p.Feasible)
		b = append(b, ',')
		b = strconv.AppendFloat(b, float64(p.Pull)/1e3, 'g', 8, 64)
		b = append(b, ',')
		b = strconv.AppendQuote(b, p.Limit)
		b = append(b, ',')
		b = strconv.AppendFloat(b, p.Slip, 'g', 6, 64)
		b = append(b, ',')
		b = strconv.AppendFloat(b, float64(p.EngineTorque), 'g', 8, 64)
		b = append(b, '\n')
	}
	_, err := w.Write(b)
	return err
}
