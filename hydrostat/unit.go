package hydrostat

import (
	"fmt"
	"math"
	"strings"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// Kind is the construction of an axial-piston unit, which sets how the
// displacement follows the angle.
type Kind int

const (
	// Swashplate: V = z·A·D·tan α; the setting is tan α / tan α_max.
	Swashplate Kind = iota
	// BentAxis: V = z·A·D·sin α; the setting is sin α / sin α_max.
	BentAxis
)

// String returns "swashplate" or "bent axis".
func (k Kind) String() string {
	switch k {
	case Swashplate:
		return "swashplate"
	case BentAxis:
		return "bent axis"
	}
	return "Kind(" + fmt.Sprint(int(k)) + ")"
}

// Swing says which displacement settings a unit's swashplate or yoke can
// reach. The schedules read it (see Sequential and MinLoss); Unit.At and
// Loop.At report a setting outside it as a *LimitError (ErrSettingLimit).
type Swing int

const (
	// SwingUnstated (the zero value): Unit.At accepts settings in [-1, 1];
	// the schedules swing a pump over centre and keep a motor at or above
	// their MinMotorSetting (0.2 by default), as for a unit whose stops
	// the designer has not stated.
	SwingUnstated Swing = iota
	// SwingToZero: settings in [0, 1]; the unit swings back to exactly zero
	// displacement but not over centre.
	SwingToZero
	// SwingOverCentre: settings in [-1, 1]; the unit swings through zero
	// and over centre, reversing its flow at the same shaft direction.
	SwingOverCentre
)

// String returns "unstated", "to zero" or "over centre".
func (s Swing) String() string {
	switch s {
	case SwingUnstated:
		return "unstated"
	case SwingToZero:
		return "to zero"
	case SwingOverCentre:
		return "over centre"
	}
	return "Swing(" + fmt.Sprint(int(s)) + ")"
}

// swingNames are the texts of MarshalText, in the order of the constants.
var swingNames = [...]string{"unstated", "to zero", "over centre"}

// MarshalText implements encoding.TextMarshaler: "unstated", "to zero" or
// "over centre". A Swing outside the constants is an error (ErrInvalid).
func (s Swing) MarshalText() ([]byte, error) {
	if s < SwingUnstated || s > SwingOverCentre {
		return nil, fmt.Errorf("%w: %v is not a swing", ErrInvalid, s)
	}
	return []byte(swingNames[s]), nil
}

// UnmarshalText implements encoding.TextUnmarshaler. It reads the texts of
// MarshalText, ignoring case, surrounding blanks and a hyphen or
// underscore in place of the space ("over-centre", "TO_ZERO"); any other
// text is an error (ErrInvalid) and leaves s unchanged.
func (s *Swing) UnmarshalText(text []byte) error {
	t := strings.ToLower(strings.TrimSpace(string(text)))
	t = strings.NewReplacer("-", " ", "_", " ").Replace(t)
	for i, name := range swingNames {
		if t == name {
			*s = Swing(i)
			return nil
		}
	}
	return fmt.Errorf("%w: swing %q is not one of %q, %q, %q", ErrInvalid, text, swingNames[0], swingNames[1], swingNames[2])
}

// lowest returns the smallest setting of the swing: 0 for SwingToZero, −1
// otherwise.
func (s Swing) lowest() float64 {
	if s == SwingToZero {
		return 0
	}
	return -1
}

// UnitSpec describes an axial-piston unit, pump or motor; the same unit
// works in all four quadrants. A zero limit means "not rated" and is not
// checked.
type UnitSpec struct {
	// MaxDisplacement is the displacement at full setting (stored per radian;
	// write units.CCPerRev(100)). Zero means: computed from the geometry.
	MaxDisplacement units.Displacement
	MaxSpeed        units.AngularVelocity // rated maximum speed; 0: not rated
	RatedPressure   units.Pressure        // continuous pressure difference; 0: not rated
	PeakPressure    units.Pressure        // peak pressure difference; 0: not rated
	Loss            LossModel             // nil means lossless (ideal)
	// Swing is the range of settings the unit can reach; the zero value
	// SwingUnstated keeps the schedules' defaults (see Swing).
	Swing Swing

	// Geometry, optional. With all of Pistons, PistonDiameter, PitchDiameter
	// and MaxAngle given the displacement follows from them (and must agree
	// with a given MaxDisplacement within 2 %). MaxAngle alone enables the
	// angle conversions.
	Kind           Kind
	Pistons        int
	PistonDiameter units.Length
	PitchDiameter  units.Length // diameter of the circle the piston axes lie on
	MaxAngle       units.Angle  // swash angle or bent-axis angle at full setting
}

// Unit is a built, immutable axial-piston unit.
type Unit struct {
	spec UnitSpec
	dmax float64 // m³/rad
	wil  *Wilson // a copy of spec.Loss when it is a Wilson value (no interface call in eval)
	d53  float64 // dmax^(5/3), for the hydrodynamic term
}

// GeometricDisplacement returns the displacement of z pistons of diameter d
// on a pitch circle of diameter D at angle α:
// V = z·(π d²/4)·D·tan α per revolution for a swashplate unit, sin α for a
// bent-axis unit. The result is stored per radian (V/2π).
func GeometricDisplacement(k Kind, pistons int, piston, pitch units.Length, angle units.Angle) (units.Displacement, error) {
	d, p, a := float64(piston), float64(pitch), float64(angle)
	if pistons <= 0 || !(d > 0) || !(p > 0) || !(a > 0) || math.IsInf(d, 0) || math.IsInf(p, 0) || !(a < math.Pi/2) {
		return 0, fmt.Errorf("%w: geometry needs pistons > 0, finite positive diameters and 0 < angle < 90°", ErrInvalid)
	}
	var f float64
	switch k {
	case Swashplate:
		f = math.Tan(a)
	case BentAxis:
		f = math.Sin(a)
	default:
		return 0, fmt.Errorf("%w: unknown kind %d", ErrInvalid, int(k))
	}
	perRev := float64(pistons) * math.Pi / 4 * d * d * p * f
	return units.Displacement(perRev / (2 * math.Pi)), nil
}

// finite reports whether x is neither NaN nor infinite (x − x is NaN for
// both).
func finite(x float64) bool { return x-x == 0 }

// NewUnit validates s and returns the unit.
func NewUnit(s UnitSpec) (Unit, error) {
	for _, v := range []struct {
		name string
		x    units.Measure
	}{
		{"maximum displacement", units.Of(s.MaxDisplacement)},
		{"maximum speed", units.Of(s.MaxSpeed)},
		{"rated pressure", units.Of(s.RatedPressure)},
		{"peak pressure", units.Of(s.PeakPressure)},
		{"piston diameter", units.Of(s.PistonDiameter)},
		{"pitch diameter", units.Of(s.PitchDiameter)},
		{"maximum angle", units.Of(s.MaxAngle)},
	} {
		if !finite(v.x.SI) || v.x.SI < 0 {
			return Unit{}, fmt.Errorf("%w: %s %v must be finite and non-negative", ErrInvalid, v.name, v.x)
		}
	}
	if s.Pistons < 0 {
		return Unit{}, fmt.Errorf("%w: piston count %d", ErrInvalid, s.Pistons)
	}
	if s.Kind != Swashplate && s.Kind != BentAxis {
		return Unit{}, fmt.Errorf("%w: unknown kind %d", ErrInvalid, int(s.Kind))
	}
	if s.Swing < SwingUnstated || s.Swing > SwingOverCentre {
		return Unit{}, fmt.Errorf("%w: unknown swing %d", ErrInvalid, int(s.Swing))
	}
	if s.MaxAngle >= units.Degrees(90) {
		return Unit{}, fmt.Errorf("%w: maximum angle %v must be below 90°", ErrInvalid, s.MaxAngle)
	}
	if s.RatedPressure > 0 && s.PeakPressure > 0 && s.PeakPressure < s.RatedPressure {
		return Unit{}, fmt.Errorf("%w: peak pressure %v below rated pressure %v", ErrInvalid, s.PeakPressure, s.RatedPressure)
	}
	geom := s.Pistons > 0 && s.PistonDiameter > 0 && s.PitchDiameter > 0 && s.MaxAngle > 0
	d := float64(s.MaxDisplacement)
	if geom {
		g, err := GeometricDisplacement(s.Kind, s.Pistons, s.PistonDiameter, s.PitchDiameter, s.MaxAngle)
		if err != nil {
			return Unit{}, err
		}
		if d == 0 {
			d = float64(g)
			s.MaxDisplacement = g
		} else if math.Abs(d-float64(g)) > 0.02*d {
			return Unit{}, fmt.Errorf("%w: maximum displacement %v disagrees with the geometry's %v", ErrInvalid, s.MaxDisplacement, g)
		}
	}
	if !(d > 0) {
		return Unit{}, fmt.Errorf("%w: maximum displacement must be positive (or the geometry complete)", ErrInvalid)
	}
	if v, ok := s.Loss.(interface{ Validate() error }); ok {
		if err := v.Validate(); err != nil {
			return Unit{}, err
		}
	}
	u := Unit{spec: s, dmax: d, d53: math.Pow(d, 5.0/3)}
	if w, ok := s.Loss.(Wilson); ok {
		u.wil = &w
	}
	return u, nil
}

// Spec returns the specification the unit was built from, with
// MaxDisplacement filled in from the geometry where it was zero.
func (u Unit) Spec() UnitSpec { return u.spec }

// Displacement returns the signed displacement x·D_max at setting x.
func (u Unit) Displacement(setting float64) units.Displacement {
	return units.Displacement(setting * u.dmax)
}

// AngleFromSetting returns the swash or bent-axis angle of a setting x in
// [-1, 1]: atan(x·tan α_max) for a swashplate, asin(x·sin α_max) for a bent
// axis. It needs MaxAngle in the spec.
func (u Unit) AngleFromSetting(setting float64) (units.Angle, error) {
	if !finite(setting) || math.Abs(setting) > 1 {
		return 0, &LimitError{Quantity: "setting", Value: units.Plain(setting), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, setting)), Err: ErrSettingLimit}
	}
	a := float64(u.spec.MaxAngle)
	if !(a > 0) {
		return 0, fmt.Errorf("%w: the unit has no maximum angle", ErrInvalid)
	}
	if u.spec.Kind == BentAxis {
		return units.Angle(math.Asin(setting * math.Sin(a))), nil
	}
	return units.Angle(math.Atan(setting * math.Tan(a))), nil
}

// SettingFromAngle returns the relative displacement of an angle in
// [-α_max, α_max] (tan α/tan α_max or sin α/sin α_max).
func (u Unit) SettingFromAngle(angle units.Angle) (float64, error) {
	a := float64(u.spec.MaxAngle)
	if !(a > 0) {
		return 0, fmt.Errorf("%w: the unit has no maximum angle", ErrInvalid)
	}
	x := float64(angle)
	if !finite(x) {
		return 0, fmt.Errorf("%w: angle %v", ErrInvalid, units.Angle(x))
	}
	if math.Abs(x) > a*(1+1e-12) {
		return 0, &LimitError{Quantity: "angle", Value: units.Of(units.Angle(x)), Bound: "maximum angle", Limit: units.Of(units.Angle(math.Copysign(a, x))), Err: ErrSettingLimit}
	}
	var s float64
	if u.spec.Kind == BentAxis {
		s = math.Sin(x) / math.Sin(a)
	} else {
		s = math.Tan(x) / math.Tan(a)
	}
	return math.Max(-1, math.Min(1, s)), nil
}

// Mode says which way a unit converts power.
type Mode int

const (
	// Pumping: mechanical power in, hydraulic power out (Δp·Q_ideal > 0).
	Pumping Mode = iota
	// Motoring: hydraulic power in, mechanical power out (Δp·Q_ideal < 0).
	Motoring
	// Idle: no ideal power (zero setting, speed or pressure difference).
	Idle
)

// String returns "pumping", "motoring" or "idle".
func (m Mode) String() string {
	switch m {
	case Pumping:
		return "pumping"
	case Motoring:
		return "motoring"
	case Idle:
		return "idle"
	}
	return "Mode(" + fmt.Sprint(int(m)) + ")"
}

// Point is a unit's state at one operating point, in the unit's own frame:
// Pressure is p_out − p_in, where the outlet is the port the unit delivers
// into when setting·speed > 0; Flow is the effective flow into the outlet
// (positive when pumping against a positive Pressure); Torque is the torque
// its shaft applies TO the unit.
type Point struct {
	Setting     float64
	Speed       units.AngularVelocity
	Pressure    units.Pressure
	IdealFlow   units.VolumeFlow // x·D_max·ω
	Flow        units.VolumeFlow // IdealFlow − sgn(Δp)·Leakage
	Leakage     units.VolumeFlow // ≥ 0, flow lost from the high to the low side
	IdealTorque units.Torque     // Δp·x·D_max
	Torque      units.Torque     // IdealTorque + sgn(ω)·LossTorque
	LossTorque  units.Torque     // ≥ 0, opposes the motion (not applied at ω = 0)
	// ISO 4409 efficiencies in [0, 1]: pumping η_v = Q/Q_i, η_hm = T_i/T;
	// motoring η_v = Q_i/Q, η_hm = T/T_i; Overall = η_v·η_hm. A ratio that
	// would turn negative (losses larger than the ideal power) is 0; Idle
	// points report 1 (no power is converted; read Loss).
	Volumetric, HydroMechanical, Overall float64
	Mode                                 Mode
	Mechanical                           units.Power // T·ω into the unit from its shaft
	Hydraulic                            units.Power // Δp·Flow delivered into the circuit
	Loss                                 units.Power // |ω|·LossTorque + |Δp|·Leakage = Mechanical − Hydraulic ≥ 0
	AboveRated                           bool        // |Δp| above the continuous rated pressure
}

// fluid is the oil state a unit is evaluated with.
type fluid struct {
	mu, rho, beta float64
	temp          units.Temperature
}

func (o Oil) at(t units.Temperature) (fluid, error) {
	if !o.valid {
		return fluid{}, fmt.Errorf("%w: oil not built with NewOil", ErrInvalid)
	}
	tk := float64(t)
	if !finite(tk) || tk <= 0 {
		return fluid{}, fmt.Errorf("%w: temperature %v", ErrInvalid, t)
	}
	f := fluid{mu: float64(o.DynamicViscosity(t)), rho: float64(o.Density(t)), beta: float64(o.spec.BulkModulus), temp: t}
	if !(f.mu > 0) || !finite(f.mu) || !(f.rho > 0) {
		return fluid{}, fmt.Errorf("%w: oil properties out of range at %v", ErrInvalid, t)
	}
	return f, nil
}

// At evaluates the unit at setting x in [-1, 1], shaft speed w and pressure
// difference dp = p_out − p_in (either sign), with the given oil at temp.
// At x = 0 the ideal flow and torque are exactly zero and the unit is Idle:
// only its losses remain (no division by the setting anywhere).
//
// Invalid input (NaN, infinite, a zero Unit or Oil) returns ErrInvalid and a
// zero Point; |x| > 1, or x < 0 for a SwingToZero unit, returns a
// *LimitError (ErrSettingLimit) and a zero Point. A pressure above the peak pressure or a speed above the maximum
// speed returns the full Point together with a *LimitError, so the caller
// sees both the state and the crossed limit. At does not allocate unless
// it returns an error.
func (u Unit) At(setting float64, w units.AngularVelocity, dp units.Pressure, oil Oil, temp units.Temperature) (Point, error) {
	f, err := oil.at(temp)
	if err != nil {
		return Point{}, err
	}
	var p Point
	if err := u.eval(setting, float64(w), float64(dp), f, &p); err != nil {
		return Point{}, err
	}
	if err := u.swingErr(setting, "setting"); err != nil {
		return Point{}, err
	}
	return p, u.limits(&p)
}

// belowSwing reports whether setting x lies below the unit's swing (a
// negative setting of a SwingToZero unit).
func (u *Unit) belowSwing(x float64) bool {
	return x < 0 && u.spec.Swing == SwingToZero
}

// swingErr returns a *LimitError when x lies outside the unit's swing.
func (u *Unit) swingErr(x float64, name string) error {
	if u.belowSwing(x) {
		return &LimitError{Quantity: name, Value: units.Plain(x), Bound: "zero (the unit swings to one side only)", Limit: units.Plain(0), Err: ErrSettingLimit}
	}
	return nil
}

func sgn(x float64) float64 {
	switch {
	case x > 0:
		return 1
	case x < 0:
		return -1
	}
	return 0
}

// eval fills p without checking the rated limits.
func (u *Unit) eval(x, w, dp float64, f fluid, p *Point) error {
	if !(u.dmax > 0) {
		return fmt.Errorf("%w: unit not built with NewUnit", ErrInvalid)
	}
	if !finite(x) || !finite(w) || !finite(dp) {
		return fmt.Errorf("%w: setting %v, speed %v, pressure %v", ErrInvalid, x, units.AngularVelocity(w), units.Pressure(dp))
	}
	if math.Abs(x) > 1 {
		return &LimitError{Quantity: "setting", Value: units.Plain(x), Bound: "full displacement", Limit: units.Plain(math.Copysign(1, x)), Err: ErrSettingLimit}
	}
	qi, ti, mode := u.ideal(x, w, dp)
	var leak, tau float64
	if wm := u.wil; wm != nil {
		// The common model without the interface call and the Condition.
		ls, err := wm.losses(x, u.dmax, w, math.Abs(dp), f.mu, f.rho, f.beta, u.d53)
		if err != nil {
			return err
		}
		leak, tau = float64(ls.Leakage), float64(ls.Torque)
	} else if u.spec.Loss != nil {
		ls, err := u.spec.Loss.Losses(Condition{
			Setting: x, MaxDisplacement: units.Displacement(u.dmax), Speed: units.AngularVelocity(w),
			Pressure: units.Pressure(math.Abs(dp)), Viscosity: units.DynamicViscosity(f.mu),
			Density: units.Density(f.rho), BulkModulus: units.Pressure(f.beta),
			Temperature: f.temp, Mode: mode,
		})
		if err != nil {
			return err
		}
		leak, tau = float64(ls.Leakage), float64(ls.Torque)
	}
	return u.point(p, x, w, dp, qi, ti, mode, leak, tau)
}

// ideal returns the ideal flow x·D·ω and torque Δp·x·D of u and its mode,
// the sign of the ideal power Δp·x·ω; a product that underflows to zero
// counts as Idle so the efficiencies stay defined.
func (u *Unit) ideal(x, w, dp float64) (qi, ti float64, mode Mode) {
	qi = x * u.dmax * w
	ti = dp * x * u.dmax
	mode = Idle
	if qi != 0 && ti != 0 {
		if sgn(dp)*sgn(x)*sgn(w) > 0 {
			mode = Pumping
		} else {
			mode = Motoring
		}
	}
	return qi, ti, mode
}

// point writes u's operating point into p from its setting x, speed w,
// pressure dp, ideal flow and torque, mode, leakage and loss torque, and
// refuses a loss model's negative or infinite leakage or torque and a
// result that overflows.
func (u *Unit) point(p *Point, x, w, dp, qi, ti float64, mode Mode, leak, tau float64) error {
	if !(leak >= 0) || !(tau >= 0) || math.IsInf(leak, 0) || math.IsInf(tau, 0) {
		return fmt.Errorf("%w: leakage %v, loss torque %v", ErrModel, units.VolumeFlow(leak), units.Torque(tau))
	}
	q := qi - sgn(dp)*leak
	t := ti + sgn(w)*tau
	// Field by field: a composite literal through a pointer is built on
	// the stack and copied, a third of the cost of the whole evaluation.
	p.Setting, p.Speed, p.Pressure = x, units.AngularVelocity(w), units.Pressure(dp)
	p.IdealFlow, p.Flow, p.Leakage = units.VolumeFlow(qi), units.VolumeFlow(q), units.VolumeFlow(leak)
	p.IdealTorque, p.Torque, p.LossTorque = units.Torque(ti), units.Torque(t), units.Torque(tau)
	p.Mode = mode
	p.Mechanical, p.Hydraulic = units.Power(t*w), units.Power(dp*q)
	p.Loss = units.Power(math.Abs(w)*tau + math.Abs(dp)*leak)
	p.AboveRated = false
	switch mode {
	case Pumping:
		p.Volumetric = clamp01(q / qi)
		p.HydroMechanical = clamp01(ti / t)
	case Motoring:
		p.Volumetric = clamp01(qi / q)
		p.HydroMechanical = clamp01(t / ti)
	default:
		p.Volumetric, p.HydroMechanical = 1, 1
	}
	p.Overall = p.Volumetric * p.HydroMechanical
	if !finite(float64(p.Mechanical)) || !finite(float64(p.Hydraulic)) || !finite(float64(p.Loss)) {
		return fmt.Errorf("%w: result overflows", ErrInvalid)
	}
	if r := float64(u.spec.RatedPressure); r > 0 && math.Abs(dp) > r {
		p.AboveRated = true
	}
	return nil
}

func clamp01(v float64) float64 {
	if !(v > 0) {
		return 0
	}
	if v > 1 {
		return 1
	}
	return v
}

// unitNames names the limits of a unit evaluated on its own.
var unitNames = [2]string{"unit pressure", "unit speed"}

// limits returns a *LimitError for the first rated limit p crosses.
func (u *Unit) limits(p *Point) error {
	var e LimitError
	if !u.crossed(p, &unitNames, &e) {
		return nil
	}
	out := e // on the heap only when a limit is crossed
	return &out
}

// crossed reports whether p crosses a rated limit of u (peak pressure, then
// maximum speed) and, if so, writes it into e; names are the quantities'
// names (pressure, speed).
func (u *Unit) crossed(p *Point, names *[2]string, e *LimitError) bool {
	if pk := float64(u.spec.PeakPressure); pk > 0 && math.Abs(float64(p.Pressure)) > pk {
		*e = LimitError{Quantity: names[0], Value: units.Of(units.Pressure(math.Abs(float64(p.Pressure)))), Bound: "peak pressure", Limit: units.Of(u.spec.PeakPressure), Err: ErrPressureLimit}
		return true
	}
	if ms := float64(u.spec.MaxSpeed); ms > 0 && math.Abs(float64(p.Speed)) > ms {
		*e = LimitError{Quantity: names[1], Value: units.Of(units.AngularVelocity(math.Abs(float64(p.Speed)))), Bound: "maximum speed", Limit: units.Of(u.spec.MaxSpeed), Err: ErrSpeedLimit}
		return true
	}
	return false
}

// isBareLimit reports whether err is one of the limit sentinels themselves
// (as Loop.Trial reports them).
func isBareLimit(err error) bool {
	return err == ErrPressureLimit || err == ErrSpeedLimit || err == ErrSettingLimit
}

// PressureFor is At the other way round: it finds the pressure difference
// at which the unit's shaft torque (the torque its shaft applies TO the
// unit, as in Point.Torque) equals t, at setting x and speed w, and returns
// the Point there. The search runs over ±PeakPressure (±10 kbar for a unit
// without a peak rating); a torque that needs more returns a *LimitError
// with the needed pressure estimated from the ideal torque Δp = t/(x·D_max).
func (u Unit) PressureFor(setting float64, w units.AngularVelocity, t units.Torque, oil Oil, temp units.Temperature) (Point, error) {
	f, err := oil.at(temp)
	if err != nil {
		return Point{}, err
	}
	if !finite(float64(t)) {
		return Point{}, fmt.Errorf("%w: torque %v", ErrInvalid, t)
	}
	var p Point
	if err := u.eval(setting, float64(w), 0, f, &p); err != nil {
		return Point{}, err
	}
	if err := u.swingErr(setting, "setting"); err != nil {
		return Point{}, err
	}
	pmax := float64(u.spec.PeakPressure)
	if pmax == 0 {
		pmax = 1e9
	}
	var ferr error
	g := func(dp float64) float64 {
		if e := u.eval(setting, float64(w), dp, f, &p); e != nil {
			ferr = e
			return math.NaN()
		}
		return float64(p.Torque - t)
	}
	ga, gb := g(-pmax), g(pmax)
	if ferr != nil {
		return Point{}, ferr
	}
	if (ga > 0) == (gb > 0) && ga != 0 && gb != 0 {
		if setting == 0 {
			return Point{}, fmt.Errorf("%w: a unit at zero setting takes no torque from pressure", ErrNoSolution)
		}
		need := float64(t) / (setting * u.dmax)
		dp := math.Copysign(pmax, need)
		if e := u.eval(setting, float64(w), dp, f, &p); e != nil {
			return Point{}, e
		}
		return p, &LimitError{Quantity: "unit pressure needed", Value: units.Of(units.Pressure(math.Abs(need))), Bound: "peak pressure", Limit: units.Of(units.Pressure(pmax)), Err: ErrPressureLimit}
	}
	dp, err := numeric.Brent(g, -pmax, pmax, 1e-12*pmax, 200)
	if ferr != nil {
		return Point{}, ferr
	}
	if err != nil {
		return Point{}, fmt.Errorf("%w: pressure search: %v", ErrNoSolution, err)
	}
	if e := u.eval(setting, float64(w), dp, f, &p); e != nil {
		return Point{}, e
	}
	return p, u.limits(&p)
}
