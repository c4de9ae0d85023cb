package design

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Requirements are what the design must do, the "requirements" object of
// a design file. Every field is optional; a zero field is not checked.
type Requirements struct {
	// TopSpeed is the forward travel speed the tractor must reach (km/h).
	TopSpeed units.Speed `json:"topSpeed,omitempty"`
	// TopSpeedEngine is the engine speed at or below which TopSpeed must be
	// reached (rpm; default the rated speed).
	TopSpeedEngine units.AngularVelocity `json:"topSpeedEngine,omitempty"`
	// Standstill asks that the forward speeds start at standstill: some
	// range reaches zero travel speed, so no starting clutch slips.
	Standstill bool `json:"standstill,omitempty"`
	// LowestSpeed is the lowest forward travel speed that must be reached
	// without slipping a clutch, when Standstill is not asked (km/h). The
	// gap and unit-speed checks cover the speeds from it (or from
	// standstill) to TopSpeed.
	LowestSpeed units.Speed `json:"lowestSpeed,omitempty"`
	// ReverseSpeed is the reverse travel speed some range must reach
	// (km/h).
	ReverseSpeed units.Speed `json:"reverseSpeed,omitempty"`
	// Pulls are drawbar pulls wanted at travel speeds at full engine
	// power, each on a surface of the file.
	Pulls []PullRequirement `json:"pulls,omitempty"`
	// PTOSpeeds are PTO shaft speeds the PTO must offer at or below the
	// rated engine speed (rpm).
	PTOSpeeds []units.AngularVelocity `json:"ptoSpeeds,omitempty"`
	// UnitSpeedMargin is the fraction by which every unit's speed must stay
	// below its greatest speed over the forward speeds up to TopSpeed at
	// rated engine speed (0.05 for 5 %), a front motor's up to its declutch
	// speed.
	UnitSpeedMargin float64 `json:"unitSpeedMargin,omitempty"`
	// PressureMargin is the fraction by which the relief setting must stay
	// below the lowest peak pressure of the units, a front motor's
	// included (rated pressure where no peak is given).
	PressureMargin float64 `json:"pressureMargin,omitempty"`
	// ShiftTolerance is the greatest relative mismatch of the variator's
	// speed ratio (motor over pump) between the two ranges of each range
	// change, at the common travel speed where they match best, at rated
	// engine speed (0.02 for 2 %). Ranges with no common speed count as a
	// mismatch of 100 %.
	ShiftTolerance float64 `json:"shiftTolerance,omitempty"`
	// CornerPower is the greatest hydrostat corner power (relief pressure
	// times the pump's full flow at rated engine speed) as a fraction of
	// the engine's rated power (1.2 for 120 %).
	CornerPower float64 `json:"cornerPower,omitempty"`
}

// PullRequirement is a drawbar pull wanted at a travel speed.
type PullRequirement struct {
	// Speed is the travel speed (km/h).
	Speed units.Speed `json:"speed"`
	// Pull is the drawbar pull wanted (kN).
	Pull units.Force `json:"pull"`
	// Surface names one of the file's surfaces (default: the surface of
	// the day's first field segment).
	Surface string `json:"surface,omitempty"`
}

// Check is one requirement checked.
type Check struct {
	// Name says what was required, with the wanted value in its unit.
	Name string
	// Met reports whether the requirement holds.
	Met bool
	// Margin is the relative margin: positive when met with room,
	// negative when missed (for example 0.05: 5 % better than wanted).
	Margin float64
	// Got is the value reached, in words with its unit.
	Got string
	// At is the operating point where the requirement binds, in words
	// ("range field at 12.3 km/h, engine 2100 rpm"); "" when it has none.
	At string
	// Binding is that operating point as values (nil when it has none).
	Binding *Binding
}

// Binding is the operating point where a requirement binds.
type Binding struct {
	Range  int                   // range index
	Speed  units.Speed           // travel speed (no slip for speed checks)
	Engine units.AngularVelocity // engine speed
}

// Interval is a connected span of travel speeds one range reaches at an
// engine speed (negative: reverse), with the wheels not slipping. A range
// may reach more than one.
type Interval struct {
	Range    int
	Name     string
	Lo, Hi   units.Speed
	Feasible bool // false: the range reaches no speed
}

// Gap is a span of forward travel speeds no range reaches.
type Gap struct{ From, To units.Speed }

// Report is the feasibility report of one transmission of a design file.
type Report struct {
	// Design names the transmission.
	Design string
	// Checks are the requirements, in the order of Requirements' fields.
	Checks []Check
	// Intervals are the ranges' travel speeds at rated engine speed, by
	// range, then speed.
	Intervals []Interval
	// Standstill reports whether some range reaches zero travel speed.
	Standstill bool
	// Gaps are spans of forward speeds no range reaches, between the
	// lowest speed reached (or standstill) and the highest.
	Gaps []Gap
}

// Feasible reports whether every check is met.
func (r Report) Feasible() bool {
	for _, c := range r.Checks {
		if !c.Met {
			return false
		}
	}
	return true
}

// Failed returns the names of the checks not met, for a reason kept with
// an infeasible candidate.
func (r Report) Failed() []string {
	var out []string
	for _, c := range r.Checks {
		if !c.Met {
			out = append(out, c.Name)
		}
	}
	return out
}

// WriteText writes the report as an aligned table.
func (r Report) WriteText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "feasibility of %q\n", r.Design)
	for _, iv := range r.Intervals {
		if iv.Feasible {
			fmt.Fprintf(&b, "  range %-8s %7.2f to %6.2f km/h\n", iv.Name, iv.Lo.KMH(), iv.Hi.KMH())
		} else {
			fmt.Fprintf(&b, "  range %-8s reaches no speed\n", iv.Name)
		}
	}
	if r.Standstill {
		b.WriteString("  standstill: reached\n")
	} else {
		b.WriteString("  standstill: NOT reached (a starting clutch must slip)\n")
	}
	for _, g := range r.Gaps {
		fmt.Fprintf(&b, "  GAP: no range reaches %.2f to %.2f km/h\n", g.From.KMH(), g.To.KMH())
	}
	for _, c := range r.Checks {
		mark := "met   "
		if !c.Met {
			mark = "FAILED"
		}
		fmt.Fprintf(&b, "  %s %-52s margin %+7.1f %%  got %s", mark, c.Name, 100*c.Margin, c.Got)
		if c.At != "" {
			fmt.Fprintf(&b, "  at %s", c.At)
		}
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// travel converts an output shaft speed to a travel speed without slip.
func (f *File) travel(out units.AngularVelocity) units.Speed {
	return units.Speed(float64(out) / f.Tractor.FinalDrive * float64(f.Tractor.Rear.Tyre.RollingRadius))
}

// intervals returns each range's travel speeds at engine speed w, from s,
// a solver of l, and each range's first interval of output speeds as s
// gives it (for pumpSpeed).
func (f *File) intervals(s pointSolver, l powersplit.Layout, names []string, w units.AngularVelocity) ([]Interval, []reach) {
	var out []Interval
	first := make([]reach, l.Ranges())
	for rg := range l.Ranges() {
		ivs, err := s.Interval(powersplit.Point{Range: rg, Input: w, Outputs: []powersplit.OutputDemand{{}}})
		if err != nil || len(ivs) == 0 {
			out = append(out, Interval{Range: rg, Name: names[rg]})
			continue
		}
		first[rg] = reach{iv: ivs[0], ok: true}
		for _, iv := range ivs {
			out = append(out, Interval{Range: rg, Name: names[rg], Lo: f.travel(iv.Lo), Hi: f.travel(iv.Hi), Feasible: true})
		}
	}
	return out, first
}

// reach is a range's first interval of output speeds at one engine speed;
// ok is false when the range reaches none.
type reach struct {
	iv powersplit.SpeedInterval
	ok bool
}

// Check checks transmission t of the file against f's requirements (none
// when req is nil: the report then lists the speed coverage only).
func (f *File) Check(t Transmission, req *Requirements) (Report, error) {
	l, loop, err := t.built()
	if err != nil {
		return Report{Design: t.Name}, err
	}
	v, err := f.vehicle(t, &l)
	if err != nil {
		return Report{Design: t.Name}, err
	}
	return f.check(t, l, limitsOf(loop), v, solverOf(v, l), req)
}

// A pointSolver solves points of one layout: a powersplit.Solver, or the
// vehicle's vehicle.LayoutDrive, which has one already.
type pointSolver interface {
	Solve(p powersplit.Point, st *powersplit.State) error
	Interval(p powersplit.Point) ([]powersplit.SpeedInterval, error)
}

// solverOf returns a solver of l, t's layout: the drive of v when it
// solves l (a vehicle without a front motor), else a new one.
func solverOf(v *vehicle.Vehicle, l powersplit.Layout) pointSolver {
	if d, ok := v.Spec().Transmission.(*vehicle.LayoutDrive); ok && d.Layout() == l {
		return d
	}
	return powersplit.NewSolver(l)
}

// check is Check with t's layout l, the rated speeds lim of its loop's
// units, vehicle v and a solver s of l, built once for every check (and
// for Score): the solver's points do not depend on the points it solved
// before.
func (f *File) check(t Transmission, l powersplit.Layout, lim unitLimits, v *vehicle.Vehicle, s pointSolver, req *Requirements) (Report, error) {
	rep := Report{Design: t.Name}
	eng := v.Engine()
	rated := eng.Rated()
	names := t.RangeNames()
	var first []reach
	rep.Intervals, first = f.intervals(s, l, names, rated)

	// Coverage of the forward speeds: merge the intervals.
	var spans [][2]float64
	for _, iv := range rep.Intervals {
		if iv.Feasible && iv.Hi > 0 {
			spans = append(spans, [2]float64{max(float64(iv.Lo), 0), float64(iv.Hi)})
			if iv.Lo <= 0 {
				rep.Standstill = true
			}
		}
	}
	slices.SortFunc(spans, func(a, b [2]float64) int { return cmpFloat(a[0], b[0]) })
	reach := 0.0
	for i, s := range spans {
		if i > 0 && s[0] > reach {
			rep.Gaps = append(rep.Gaps, Gap{From: units.Speed(reach), To: units.Speed(s[0])})
		}
		reach = max(reach, s[1])
	}
	if req == nil {
		return rep, nil
	}
	add := func(c Check) { rep.Checks = append(rep.Checks, c) }
	st := powersplit.State{Brief: true} // the checks' points, one after another

	if req.Standstill {
		c := Check{Name: "forward speeds start at standstill", Met: rep.Standstill, Got: "not reached"}
		if len(spans) > 0 {
			c.Got = fmt.Sprintf("lowest %.2f km/h", units.Speed(spans[0][0]).KMH())
			c.Margin = -spans[0][0] / spans[len(spans)-1][1] // short of standstill, relative to the top speed
		}
		add(c)
	}
	if req.LowestSpeed > 0 && !req.Standstill {
		c := Check{Name: fmt.Sprintf("forward speeds start at or below %.1f km/h", req.LowestSpeed.KMH()), Got: "no forward speed", Margin: -1}
		if len(spans) > 0 {
			c.Got = fmt.Sprintf("lowest %.2f km/h", units.Speed(spans[0][0]).KMH())
			c.Margin = 1 - spans[0][0]/float64(req.LowestSpeed)
			c.Met = c.Margin >= 0
		}
		add(c)
	}
	if req.TopSpeed > 0 {
		we := req.TopSpeedEngine
		if we == 0 {
			we = rated
		}
		ivs := rep.Intervals
		if we != rated {
			ivs, _ = f.intervals(s, l, names, we)
		}
		best, at := 0.0, ""
		for _, iv := range ivs {
			if iv.Feasible && float64(iv.Hi) > best {
				best = float64(iv.Hi)
				at = fmt.Sprintf("range %s at %.2f km/h, engine %.0f rpm", iv.Name, iv.Hi.KMH(), we.RPM())
			}
		}
		m := best/float64(req.TopSpeed) - 1
		add(Check{Name: fmt.Sprintf("top speed %.1f km/h at or below %.0f rpm", req.TopSpeed.KMH(), we.RPM()),
			Met: m >= 0, Margin: m, Got: fmt.Sprintf("%.2f km/h", units.Speed(best).KMH()), At: at})
		// Gaps up to the top speed.
		var worst float64
		for _, g := range rep.Gaps {
			if g.From < req.TopSpeed && g.To > req.LowestSpeed {
				worst = max(worst, float64(min(g.To, req.TopSpeed)-max(g.From, req.LowestSpeed)))
			}
		}
		if len(spans) == 0 || spans[len(spans)-1][1] < float64(req.TopSpeed) {
			worst = max(worst, float64(req.TopSpeed)-max(reach, float64(req.LowestSpeed)))
		}
		add(Check{Name: fmt.Sprintf("no speed gap from %.1f to %.1f km/h", req.LowestSpeed.KMH(), req.TopSpeed.KMH()), Met: worst == 0,
			Margin: 0 - worst/float64(req.TopSpeed), // 0 − 0 is +0: no "-0 %" for a met check
			Got:    fmt.Sprintf("widest gap %.2f km/h", units.Speed(worst).KMH())})
	}
	if req.ReverseSpeed > 0 {
		best, at := 0.0, ""
		for _, iv := range rep.Intervals {
			if iv.Feasible && float64(-iv.Lo) > best {
				best = float64(-iv.Lo)
				at = fmt.Sprintf("range %s at %.2f km/h reverse", iv.Name, -iv.Lo.KMH())
			}
		}
		m := best/float64(req.ReverseSpeed) - 1
		add(Check{Name: fmt.Sprintf("reverse %.1f km/h", req.ReverseSpeed.KMH()), Met: m >= 0, Margin: m,
			Got: fmt.Sprintf("%.2f km/h", units.Speed(best).KMH()), At: at})
	}
	for i, p := range req.Pulls {
		surface := p.Surface
		if surface == "" {
			surface = f.firstSurface("field")
		}
		ground, err := f.Ground(surface)
		if err != nil {
			return rep, f.fieldError(fmt.Sprintf("requirements.pulls[%d].surface", i), err)
		}
		// Only the greatest pull over the ranges is read: tractiveEffort
		// need not finish the ranges that cannot reach it.
		pts, err := tractiveEffort(v, EffortSpec{Speeds: []units.Speed{p.Speed}, Ground: ground}, true)
		if err != nil {
			return rep, err
		}
		var best EffortPoint
		for _, q := range pts {
			if q.Feasible && q.Pull >= best.Pull {
				best = q
			}
		}
		m := float64(best.Pull)/float64(p.Pull) - 1
		c := Check{Name: fmt.Sprintf("pull %.1f kN at %.1f km/h on %s", float64(p.Pull)/1e3, p.Speed.KMH(), surface),
			Met: m >= 0, Margin: m, Got: fmt.Sprintf("%.1f kN", float64(best.Pull)/1e3)}
		if best.Feasible {
			c.At = fmt.Sprintf("range %s at %.1f km/h, engine %.0f rpm, limited by %s", names[best.Range], p.Speed.KMH(), rated.RPM(), best.Limit)
			c.Binding = &Binding{Range: best.Range, Speed: p.Speed, Engine: rated}
		}
		add(c)
	}
	for _, want := range req.PTOSpeeds {
		c := Check{Name: fmt.Sprintf("PTO %.0f rpm at or below rated engine speed", want.RPM()), Got: "not offered", Margin: -1}
		for _, s := range f.PTO.Speeds {
			if math.Abs(float64(s-want)) <= 1e-6*float64(want) && f.PTO.AtEngine > 0 {
				c.Margin = float64(rated)/float64(f.PTO.AtEngine) - 1
				c.Met = c.Margin >= 0
				c.Got = fmt.Sprintf("at %.0f rpm engine", f.PTO.AtEngine.RPM())
			}
		}
		add(c)
	}
	if req.UnitSpeedMargin > 0 {
		add(f.unitSpeedCheck(s, l, lim, &st, rep.Intervals, rated, req))
	}
	if req.PressureMargin > 0 {
		limit := math.Inf(1)
		us := []Unit{t.Pump, t.Motor}
		if fm := f.Tractor.FrontMotor; fm != nil {
			us = append(us, fm.Motor) // the front motor shares the loop's pressure
		}
		for _, u := range us {
			p := u.PeakPressure
			if p == 0 {
				p = u.RatedPressure
			}
			if p > 0 {
				limit = math.Min(limit, float64(p))
			}
		}
		c := Check{Name: fmt.Sprintf("relief %.0f %% below the units' peak pressure", 100*req.PressureMargin),
			Got: fmt.Sprintf("relief %.0f bar", t.Relief.Bar())}
		if math.IsInf(limit, 1) {
			c.Got += ", units not rated: not checked"
			c.Margin = -1
		} else {
			c.Margin = 1 - float64(t.Relief)/limit - req.PressureMargin
			c.Met = c.Margin >= 0
			c.Got += fmt.Sprintf(" against %.0f bar", units.Pressure(limit).Bar())
		}
		add(c)
	}
	if req.ShiftTolerance > 0 && l.Ranges() > 1 {
		add(f.shiftCheck(s, l, lim, &st, names, rep.Intervals, rated, req.ShiftTolerance))
	}
	if req.CornerPower > 0 {
		corner := f.cornerPower(s, t, &st, first, rated)
		ratio := float64(corner) / float64(eng.RatedPower())
		add(Check{Name: fmt.Sprintf("hydrostat corner power at most %.0f %% of engine power", 100*req.CornerPower),
			Met: ratio <= req.CornerPower, Margin: 1 - ratio/req.CornerPower,
			Got: fmt.Sprintf("%.0f kW (%.0f %%)", float64(corner)/1e3, 100*ratio)})
	}
	return rep, nil
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// firstSurface returns the surface of the day's first segment of a kind
// (any kind when none has one).
func (f *File) firstSurface(kind string) string {
	for _, g := range f.Day.Segments {
		if g.Kind == kind && g.Surface != "" {
			return g.Surface
		}
	}
	for _, g := range f.Day.Segments {
		if g.Surface != "" {
			return g.Surface
		}
	}
	return ""
}

// cornerPower is the relief pressure times the pump's full flow at engine
// speed w: the greatest power the loop could carry. first holds each
// range's first interval of output speeds at w; st is the State to
// solve into (Brief).
func (f *File) cornerPower(s pointSolver, t Transmission, st *powersplit.State, first []reach, w units.AngularVelocity) units.Power {
	pump := f.pumpSpeed(s, st, first, w)
	return units.Power(float64(t.Relief) * float64(t.Pump.Displacement) * float64(pump))
}

// pumpSpeed is the pump's speed at engine speed w, from a point solved in
// the middle of the first interval of the first range that reaches one
// (first holds them, by range), solved into st (Brief will do).
func (f *File) pumpSpeed(s pointSolver, st *powersplit.State, first []reach, w units.AngularVelocity) units.AngularVelocity {
	for rg, r := range first {
		if !r.ok {
			continue
		}
		mid := (r.iv.Lo + r.iv.Hi) / 2
		if err := s.Solve(powersplit.Point{Range: rg, Input: w, Outputs: []powersplit.OutputDemand{{Speed: mid}}}, st); err != nil {
			continue
		}
		if len(st.Loops) > 0 {
			return units.AngularVelocity(math.Abs(float64(st.Loops[0].Pump.Speed)))
		}
	}
	return 0
}

// outSpeed converts a travel speed to the output shaft speed (no slip).
func (f *File) outSpeed(v units.Speed) units.AngularVelocity {
	return units.AngularVelocity(float64(v) * f.Tractor.FinalDrive / float64(f.Tractor.Rear.Tyre.RollingRadius))
}

// unitLimits are the rated greatest speeds of the units of a layout's
// loop (rad/s; 0: not rated, not checked): the pump's, then each motor's.
type unitLimits []float64

// limitsOf reads the rated greatest speeds of loop's units from its spec.
func limitsOf(loop hydrostat.Loop) unitLimits {
	spec := loop.Spec()
	lim := make(unitLimits, 0, 1+len(spec.Motors))
	lim = append(lim, float64(spec.Pump.Spec().MaxSpeed))
	for _, m := range spec.Motors {
		lim = append(lim, float64(m.Spec().MaxSpeed))
	}
	return lim
}

// speeds returns, for the solved state st of a layout whose loop has the
// units' limits lim, the worst speed of a rated unit relative to its limit
// (0 with none rated) and that unit (0 the pump, k the k-th motor), and
// the variator's speed ratio, motor over pump (first motor), as magnitudes
// (0 with the pump still). Magnitudes are what the range-change check has
// always compared: a ratio whose sign differs between two ranges is not
// seen there as a jump.
func (lim unitLimits) speeds(st *powersplit.State) (worst float64, unit int, ratio float64) {
	if len(st.Loops) == 0 {
		return 0, 0, 0
	}
	lp := &st.Loops[0]
	for k, limit := range lim {
		w := lp.Pump.Speed
		if k > 0 {
			if k > len(lp.Motors) {
				break
			}
			w = lp.Motors[k-1].Speed
		}
		if r := math.Abs(float64(w)) / limit; limit > 0 && r > worst {
			worst, unit = r, k
		}
	}
	if pump := math.Abs(float64(lp.Pump.Speed)); pump > 0 && len(lp.Motors) > 0 {
		ratio = math.Abs(float64(lp.Motors[0].Speed)) / pump
	}
	return worst, unit, ratio
}

// unitState solves range rg at travel speed v (no load) into st (a Brief
// State will do), the output's demand written into out (one, the
// caller's, reused), and returns the worst unit speed over its limit, the
// unit that sets it and the variator's speed ratio, motor over pump (see
// unitLimits.speeds).
func (f *File) unitState(s pointSolver, st *powersplit.State, out []powersplit.OutputDemand, lim unitLimits, rg int, w units.AngularVelocity, v units.Speed) (worst float64, unit int, ratio float64, ok bool) {
	out[0] = powersplit.OutputDemand{Speed: f.outSpeed(v)}
	if err := s.Solve(powersplit.Point{Range: rg, Input: w, Outputs: out}, st); err != nil {
		return 0, 0, 0, false
	}
	worst, unit, ratio = lim.speeds(st)
	return worst, unit, ratio, true
}

// unitSpeedCheck finds, at each forward speed up to the top speed, the
// range that keeps the units furthest below their greatest speeds, and
// reports the speed where even that range comes closest, with the
// solver's own margin of the binding unit at that point; a tractor's front
// motor, which turns with the front wheels up to its declutch speed in
// every range, is held to its greatest speed there. Its points are solved
// into st (Brief will do).
func (f *File) unitSpeedCheck(s pointSolver, l powersplit.Layout, lim unitLimits, st *powersplit.State, ivs []Interval, w units.AngularVelocity, req *Requirements) Check {
	out := make([]powersplit.OutputDemand, 1)
	top := req.TopSpeed
	if top == 0 {
		for _, iv := range ivs {
			top = max(top, iv.Hi)
		}
	}
	names := make([]string, l.Ranges())
	for _, iv := range ivs {
		names[iv.Range] = iv.Name
	}
	worst := 0.0
	var (
		bound    bool // a point set worst
		bind     Binding
		bindUnit int // the unit that sets worst at bind
	)
	low := req.LowestSpeed
	if req.Standstill {
		low = 0
	}
	// At each speed the best range has the least share of a limit, the
	// lowest index of equal ones. A speed raises worst only if even its
	// best range is above worst, so once one range is at or below worst
	// the others need not be solved. The range tried first is the best at
	// the speed before.
	const n = 60
	nr, first := l.Ranges(), 0
	for k := range n + 1 {
		v := low + (top-low)*units.Speed(k)/n
		if v <= 0 {
			continue
		}
		best, bestRange, bestUnit := math.Inf(1), 0, 0
		for j := range nr {
			rg := (first + j) % nr
			r, u, _, ok := f.unitState(s, st, out, lim, rg, w, v)
			if ok && (r < best || r == best && rg < bestRange) {
				best, bestRange, bestUnit = r, rg, u
			}
			if best <= worst {
				break
			}
		}
		if math.IsInf(best, 1) { // a gap: the gap check reports it
			continue
		}
		first = bestRange
		if best > worst {
			worst, bound = best, true
			bind, bindUnit = Binding{Range: bestRange, Speed: v, Engine: w}, bestUnit
		}
	}
	// The front motor (a second motor of the loop in the front layout)
	// turns with the front wheels, whatever the range, up to its declutch
	// speed: at travel speed v without slip its shaft turns at
	// FinalDrive·v/(r_front·Ratio), the fastest at the declutch speed or
	// the top speed, whichever comes first. The pump's and the rear
	// motor's speeds are the same with it as without it.
	front := ""
	if fm := f.Tractor.FrontMotor; fm != nil && fm.Motor.MaxSpeed > 0 && f.Tractor.Front.Tyre.RollingRadius > 0 {
		v := min(top, fm.DeclutchAbove)
		ratio := fm.Ratio
		if ratio == 0 {
			ratio = 1
		}
		wm := fm.FinalDrive * float64(v) / (float64(f.Tractor.Front.Tyre.RollingRadius) * ratio)
		if share := math.Abs(wm) / float64(fm.Motor.MaxSpeed); v > 0 && share > worst {
			worst, bound = share, false
			front = fmt.Sprintf("front motor at %.2f km/h (declutched above %.2f km/h): %.0f of %.0f rpm",
				v.KMH(), fm.DeclutchAbove.KMH(), units.AngularVelocity(wm).RPM(), fm.Motor.MaxSpeed.RPM())
		}
	}
	// Words for the binding point only.
	at := front
	var bindAt *Binding
	if bound {
		at = fmt.Sprintf("range %s at %.2f km/h, engine %.0f rpm: %s", names[bind.Range], bind.Speed.KMH(), w.RPM(),
			f.speedMargin(s, lim, bind, bindUnit))
		bindAt = &bind
	}
	margin := 1 - worst - req.UnitSpeedMargin
	return Check{Name: fmt.Sprintf("unit speeds %.0f %% below their greatest", 100*req.UnitSpeedMargin),
		Met: margin >= 0, Margin: margin, Got: fmt.Sprintf("%.1f %% of the greatest", 100*worst), At: at, Binding: bindAt}
}

// speedMargin returns in words the solver's margin of unit's speed (see
// unitLimits.speeds) at point b, from the point's full State: the margin
// of that unit's speed against its limit.
func (f *File) speedMargin(s pointSolver, lim unitLimits, b Binding, unit int) string {
	var st powersplit.State
	if err := s.Solve(powersplit.Point{Range: b.Range, Input: b.Engine, Outputs: []powersplit.OutputDemand{{Speed: f.outSpeed(b.Speed)}}}, &st); err != nil {
		return "not solved again: " + firstLine(err) // the sweep solved this point: failing now is a bug
	}
	if len(st.Loops) == 0 || unit > len(st.Loops[0].Motors) {
		return "no loop"
	}
	w := st.Loops[0].Pump.Speed
	if unit > 0 {
		w = st.Loops[0].Motors[unit-1].Speed
	}
	v := math.Abs(float64(w))
	for _, m := range st.Margins {
		if m.Value.Kind == units.AngularVelocityKind && !m.Unchecked && m.Value.SI == v && m.Limit.SI == lim[unit] {
			return fmt.Sprintf("%s %s %.0f of %.0f rpm", m.Element, m.Quantity, units.AngularVelocity(m.Value.SI).RPM(), units.AngularVelocity(m.Limit.SI).RPM())
		}
	}
	return fmt.Sprintf("%s unit %d speed %.0f of %.0f rpm", st.Loops[0].Name, unit, units.AngularVelocity(v).RPM(), units.AngularVelocity(lim[unit]).RPM())
}

// shiftCheck compares the variator's speed ratio (motor over pump) in the
// two ranges of each range change, at the common travel speed where they
// come closest: a synchronous change needs no jump of the variator. Its
// points are solved into st (Brief will do).
func (f *File) shiftCheck(s pointSolver, l powersplit.Layout, lim unitLimits, st *powersplit.State, names []string, ivs []Interval, w units.AngularVelocity, tol float64) Check {
	out := make([]powersplit.OutputDemand, 1)
	worst, at := 0.0, ""
	for i := 0; i+1 < l.Ranges(); i++ {
		lo, hi := math.Inf(1), math.Inf(-1) // the overlap of both ranges' forward speeds
		for _, a := range ivs {
			for _, b := range ivs {
				if a.Range == i && b.Range == i+1 && a.Feasible && b.Feasible {
					x, y := math.Max(float64(a.Lo), float64(b.Lo)), math.Min(float64(a.Hi), float64(b.Hi))
					if x <= y && y > 0 {
						lo, hi = math.Max(x, 0), y
					}
				}
			}
		}
		best, found := 1.0, false
		var bestV units.Speed
		var bestA, bestB float64
		if lo <= hi {
			const n = 40
			for k := range n + 1 {
				v := units.Speed(lo + (hi-lo)*float64(k)/n)
				_, _, ra, okA := f.unitState(s, st, out, lim, i, w, v)
				_, _, rb, okB := f.unitState(s, st, out, lim, i+1, w, v)
				if !okA || !okB || math.Max(math.Abs(ra), math.Abs(rb)) == 0 {
					continue
				}
				mis := math.Abs(ra-rb) / math.Max(math.Abs(ra), math.Abs(rb))
				if mis < best {
					best, found = mis, true
					bestV, bestA, bestB = v, ra, rb
				}
			}
		}
		if best >= worst {
			worst = best
			// Words for the worst change only.
			if found {
				at = fmt.Sprintf("range change %s → %s at %.2f km/h: variator %.3f against %.3f", names[i], names[i+1], bestV.KMH(), bestA, bestB)
			} else {
				at = fmt.Sprintf("range change %s → %s: no common speed", names[i], names[i+1])
			}
		}
	}
	return Check{Name: fmt.Sprintf("range changes match within %.1f %%", 100*tol),
		Met: worst <= tol, Margin: tol - worst, Got: fmt.Sprintf("worst mismatch %.2f %%", 100*worst), At: at}
}
