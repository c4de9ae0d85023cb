package vehicle

import (
	"math"
	"slices"

	"gonum.org/v1/gonum/interp"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// Fuel describes the fuel an engine burns.
type Fuel struct {
	// Density of the liquid fuel; default DieselDensity.
	Density units.Density
	// HeatingValue is the lower heating value: the energy released by
	// burning one kilogram. Default DieselHeatingValue.
	HeatingValue units.Energy
}

// Diesel fuel defaults.
//
// Common practice (no published source): diesel fuel of about 835 kg/m³
// and a lower heating value of about 42.8 MJ/kg.
const (
	DieselDensity      units.Density = 835
	DieselHeatingValue units.Energy  = 42.8e6
)

// A FuelMap tabulates brake specific fuel consumption over engine speed and
// engine torque. SFC[i][j] is the consumption at Speeds[i] and Torques[j].
type FuelMap struct {
	Speeds  []units.AngularVelocity           // strictly increasing, at least two
	Torques []units.Torque                    // strictly increasing, positive, at least two
	SFC     [][]units.SpecificFuelConsumption // len(Speeds) rows of len(Torques) positive values
}

// EngineSpec describes an engine. Zero optional fields take the documented
// defaults.
type EngineSpec struct {
	// CurveSpeeds and CurveTorques are the full-load torque curve: at least
	// two points, speeds strictly increasing and positive, torques positive.
	// The engine runs only between the first and last speed.
	CurveSpeeds  []units.AngularVelocity
	CurveTorques []units.Torque
	// Idle is the low idle speed; default the first curve speed.
	Idle units.AngularVelocity
	// Rated is the rated speed, on the curve; required.
	Rated units.AngularVelocity
	// Map is the fuel map. Nil means the ASABE D497 fuel equation, scaled to
	// the rated power.
	Map *FuelMap
	// Fuel is the fuel burned; zero fields mean diesel.
	Fuel Fuel

	// Overrun. When the load drives the engine (downhill, slowing) the fuel
	// is cut and the engine, motored, absorbs its motoring torque. A
	// measured motoring curve (MotoringSpeeds strictly increasing and
	// positive, MotoringTorques ≥ 0 as magnitudes, at least two points;
	// held constant beyond its ends) takes precedence; without one the
	// Chen–Flynn friction estimate below is used, from the swept volume
	// (Displacement; zero means RatedPower/(30 kW/L)), the Stroke (zero
	// means 125 mm) and the CompressionRatio (zero means 17).
	MotoringSpeeds   []units.AngularVelocity
	MotoringTorques  []units.Torque
	Displacement     units.Volume
	Stroke           units.Length
	CompressionRatio float64
}

// An Engine is a built, immutable engine model, safe for concurrent use.
type Engine struct {
	curve      interp.PiecewiseLinear
	lo, hi     float64 // curve speed range, rad/s
	idle       units.AngularVelocity
	rated      units.AngularVelocity
	ratedPower units.Power
	fuelGrid   numeric.Grid2 // fuel mass flow (kg/s) over speed, torque
	tMin, t2   float64       // lowest and second-lowest map torque
	hasMap     bool
	fuel       Fuel
	// overrun: a measured motoring curve, or the Chen–Flynn estimate
	motoring           interp.PiecewiseLinear
	motLo, motHi       float64 // the curve's speed range; motHi = 0 without a curve
	vd, stroke, pMaxMo float64 // swept volume (m³), stroke (m), motored peak pressure (Pa)
}

// NewEngine validates the spec and builds the engine.
func NewEngine(s EngineSpec) (*Engine, error) {
	n := len(s.CurveSpeeds)
	if n < 2 || len(s.CurveTorques) != n {
		return nil, invalid("EngineSpec.CurveSpeeds", float64(n), "needs at least two points and as many torques")
	}
	xs := make([]float64, n)
	ys := make([]float64, n)
	for i := range n {
		xs[i], ys[i] = float64(s.CurveSpeeds[i]), float64(s.CurveTorques[i])
		if err := positive("EngineSpec.CurveSpeeds", units.AngularVelocity(xs[i])); err != nil {
			return nil, err
		}
		if err := positive("EngineSpec.CurveTorques", units.Torque(ys[i])); err != nil {
			return nil, err
		}
		if i > 0 && xs[i] <= xs[i-1] {
			return nil, invalid("EngineSpec.CurveSpeeds", units.AngularVelocity(xs[i]), "must be strictly increasing")
		}
	}
	e := &Engine{lo: xs[0], hi: xs[n-1], idle: s.Idle, rated: s.Rated, fuel: s.Fuel}
	if err := e.curve.Fit(xs, ys); err != nil {
		return nil, invalid("EngineSpec.CurveSpeeds", math.NaN(), err.Error())
	}
	if e.idle == 0 {
		e.idle = units.AngularVelocity(e.lo)
	}
	if !finite(float64(e.idle)) || float64(e.idle) < e.lo || float64(e.idle) > e.hi {
		return nil, invalid("EngineSpec.Idle", units.AngularVelocity(e.idle), "must lie on the torque curve")
	}
	if !finite(float64(e.rated)) || float64(e.rated) < float64(e.idle) || float64(e.rated) > e.hi {
		return nil, invalid("EngineSpec.Rated", units.AngularVelocity(e.rated), "must lie on the torque curve, at or above idle")
	}
	e.ratedPower = units.PowerFromTorque(units.Torque(e.curve.Predict(float64(e.rated))), e.rated)
	if e.fuel.Density == 0 {
		e.fuel.Density = DieselDensity
	}
	if e.fuel.HeatingValue == 0 {
		e.fuel.HeatingValue = DieselHeatingValue
	}
	if err := positive("Fuel.Density", e.fuel.Density); err != nil {
		return nil, err
	}
	if err := positive("Fuel.HeatingValue", e.fuel.HeatingValue); err != nil {
		return nil, err
	}
	if s.Map != nil {
		if err := e.buildMap(s.Map); err != nil {
			return nil, err
		}
	}
	if err := e.buildMotoring(&s); err != nil {
		return nil, err
	}
	return e, nil
}

// Defaults of the motoring estimate.
//
// Common practice (no published source): specific outputs of about
// 25–35 kW per litre of swept volume for current turbocharged tractor
// diesels, strokes of 110–140 mm and compression ratios of 16–18.
const (
	defaultSpecificOutput   = 30e3 / 1e-3 // W per m³ of swept volume
	defaultStroke           = 0.125       // m
	defaultCompressionRatio = 17.0
)

func (e *Engine) buildMotoring(s *EngineSpec) error {
	if n := len(s.MotoringSpeeds); n > 0 || len(s.MotoringTorques) > 0 {
		if n < 2 || len(s.MotoringTorques) != n {
			return invalid("EngineSpec.MotoringSpeeds", float64(n), "needs at least two points and as many torques")
		}
		xs, ys := make([]float64, n), make([]float64, n)
		for i := range n {
			xs[i], ys[i] = float64(s.MotoringSpeeds[i]), float64(s.MotoringTorques[i])
			if err := positive("EngineSpec.MotoringSpeeds", xs[i]); err != nil {
				return err
			}
			if err := nonNegative("EngineSpec.MotoringTorques", ys[i]); err != nil {
				return err
			}
			if i > 0 && xs[i] <= xs[i-1] {
				return invalid("EngineSpec.MotoringSpeeds", xs[i], "must be strictly increasing")
			}
		}
		if err := e.motoring.Fit(xs, ys); err != nil {
			return invalid("EngineSpec.MotoringSpeeds", math.NaN(), err.Error())
		}
		e.motLo, e.motHi = xs[0], xs[n-1]
		return nil
	}
	if err := nonNegative("EngineSpec.Displacement", float64(s.Displacement)); err != nil {
		return err
	}
	if err := nonNegative("EngineSpec.Stroke", float64(s.Stroke)); err != nil {
		return err
	}
	if err := nonNegative("EngineSpec.CompressionRatio", s.CompressionRatio); err != nil {
		return err
	}
	e.vd, e.stroke = float64(s.Displacement), float64(s.Stroke)
	if e.vd == 0 {
		e.vd = float64(e.ratedPower) / defaultSpecificOutput
	}
	if e.stroke == 0 {
		e.stroke = defaultStroke
	}
	cr := s.CompressionRatio
	if cr == 0 {
		cr = defaultCompressionRatio
	}
	if cr <= 1 {
		return invalid("EngineSpec.CompressionRatio", cr, "must be above 1")
	}
	// Motored peak pressure: polytropic compression from atmospheric
	// pressure, p_max = p₀·r^1.3.
	e.pMaxMo = 101325 * math.Pow(cr, 1.3)
	return nil
}

// MotoringTorque returns the torque the engine absorbs when motored at
// speed w with the fuel cut, as a magnitude. With a motoring curve in the
// spec it is interpolated (constant beyond the curve's ends); otherwise it
// is the friction mean effective pressure of the Chen–Flynn correlation
//
//	FMEP = 0.137 bar + p_max/200 + 0.162 bar·s/m · S_p
//
// with p_max the motored peak cylinder pressure p₀·r^1.3 and S_p = 2·s·n
// the mean piston speed, turned into torque for a four-stroke engine by
// the definition of mean effective pressure, T = FMEP·V_d/(4π).
//
// From memory: Development of a single cylinder compression ignition
// research engine, SAE 650733 (1965), as quoted in Internal Combustion
// Engine Fundamentals (1988), ch. 13; the coefficients were recalled, not
// re-read. The mean effective pressure relation T = p_me·V_d/(2π·n_c),
// n_c = 2 revolutions per cycle, is the textbook definition. Motoring FMEP
// includes pumping losses and the engine's own auxiliaries; an exhaust
// brake or an engine brake adds to it and belongs in a measured curve.
func (e *Engine) MotoringTorque(w units.AngularVelocity) units.Torque {
	x := math.Abs(float64(w))
	if e.motHi > 0 {
		return units.Torque(e.motoring.Predict(math.Min(math.Max(x, e.motLo), e.motHi)))
	}
	sp := 2 * e.stroke * x / (2 * math.Pi) // m/s
	fmep := 0.137e5 + e.pMaxMo/200 + 0.162e5*sp
	return units.Torque(fmep * e.vd / (4 * math.Pi))
}

// buildMap converts the SFC grid to a grid of fuel mass flow ṁ = b·T·ω,
// which is interpolated bilinearly; fuel flow rather than SFC is
// interpolated so that fuel stays monotone in torque wherever the tabulated
// flows are.
func (e *Engine) buildMap(m *FuelMap) error {
	ns, nt := len(m.Speeds), len(m.Torques)
	if ns < 2 || nt < 2 || len(m.SFC) != ns {
		return invalid("FuelMap", float64(ns), "needs at least two speeds and torques and one SFC row per speed")
	}
	xs := make([]float64, ns)
	ys := make([]float64, nt)
	for j, t := range m.Torques {
		ys[j] = float64(t)
		if err := positive("FuelMap.Torques", units.Torque(ys[j])); err != nil {
			return err
		}
	}
	z := make([][]float64, ns)
	for i, w := range m.Speeds {
		xs[i] = float64(w)
		if err := positive("FuelMap.Speeds", units.AngularVelocity(xs[i])); err != nil {
			return err
		}
		if len(m.SFC[i]) != nt {
			return invalid("FuelMap.SFC", float64(i), "row has the wrong length")
		}
		z[i] = make([]float64, nt)
		for j, b := range m.SFC[i] {
			if err := positive("FuelMap.SFC", b); err != nil {
				return err
			}
			z[i][j] = float64(b) * ys[j] * xs[i]
		}
	}
	g, err := numeric.NewGrid2(xs, ys, z)
	if err != nil {
		return invalid("FuelMap", math.NaN(), err.Error())
	}
	if xs[0] > e.lo || xs[ns-1] < e.hi {
		return invalid("FuelMap.Speeds", units.AngularVelocity(xs[0]), "must cover the torque curve's speed range")
	}
	e.fuelGrid, e.tMin, e.t2, e.hasMap = g, ys[0], ys[1], true
	return nil
}

// Idle returns the low idle speed.
func (e *Engine) Idle() units.AngularVelocity { return e.idle }

// Rated returns the rated speed.
func (e *Engine) Rated() units.AngularVelocity { return e.rated }

// RatedPower returns the full-load power at rated speed.
func (e *Engine) RatedPower() units.Power { return e.ratedPower }

// SpeedRange returns the lowest and highest speed of the torque curve.
func (e *Engine) SpeedRange() (lo, hi units.AngularVelocity) {
	return units.AngularVelocity(e.lo), units.AngularVelocity(e.hi)
}

// Fuel returns the fuel the engine burns.
func (e *Engine) Fuel() Fuel { return e.fuel }

// MaxTorque returns the full-load torque at speed w; a speed outside the
// curve is a *LimitError wrapping ErrEngineLimit.
func (e *Engine) MaxTorque(w units.AngularVelocity) (units.Torque, error) {
	if e == nil || !(e.hi > 0) {
		return 0, invalid("engine", math.NaN(), "not built with NewEngine")
	}
	x := float64(w)
	if math.IsNaN(x) {
		return 0, invalid("engine speed", w, "must be a number")
	}
	if x < e.lo*(1-1e-12) {
		return 0, &LimitError{Quantity: "engine speed", Value: units.Of(w), Bound: "lowest speed of the full-load curve", Limit: units.Of(units.AngularVelocity(e.lo)), Err: ErrEngineLimit}
	}
	if x > e.hi*(1+1e-12) {
		return 0, &LimitError{Quantity: "engine speed", Value: units.Of(w), Bound: "highest speed of the full-load curve", Limit: units.Of(units.AngularVelocity(e.hi)), Err: ErrEngineLimit}
	}
	return units.Torque(e.curve.Predict(x)), nil
}

// check returns an error when torque t at speed w lies beyond the curve or
// is negative.
func (e *Engine) check(w units.AngularVelocity, t units.Torque) error {
	if !finite(float64(t)) || t < 0 {
		return invalid("engine torque", t, "must be finite and not negative")
	}
	max, err := e.MaxTorque(w)
	if err != nil {
		return err
	}
	if t > max*(1+1e-12) {
		return &LimitError{Quantity: "engine torque", Value: units.Of(t), Bound: "full-load torque", Limit: units.Of(max), EngineSpeed: w, Err: ErrEngineLimit}
	}
	return nil
}

// FuelRate returns the fuel mass flow at speed w and torque t. Torque beyond
// the full-load curve or a speed outside it is a *LimitError wrapping
// ErrEngineLimit.
//
// With a map, the fuel flow ṁ = b·T·ω is interpolated bilinearly over the
// map's grid; below the map's lowest torque it is extrapolated linearly in
// torque along the first two torque rows (a Willans line), never below
// zero, so an unloaded engine still burns its friction fuel. Without a map the ASABE D497 equation gives the
// volume flow
//
//	Q = (0.22·X + 0.096)·P_rated·[1 − (N/N_rated − 1)·(0.45·X − 0.877)]  (L/h, P in kW)
//
// with X = P/P_rated the load ratio and N/N_rated the speed ratio, and the
// fuel's density gives the mass flow.
func (e *Engine) FuelRate(w units.AngularVelocity, t units.Torque) (units.MassFlow, error) {
	if err := e.check(w, t); err != nil {
		return 0, err
	}
	if e.hasMap {
		tt := float64(t)
		if tt >= e.tMin {
			f, err := e.fuelGrid.At(float64(w), tt)
			if err != nil {
				return 0, &LimitError{Quantity: "engine speed", Value: units.Of(w), Bound: "highest speed of the fuel map", Limit: units.Of(units.AngularVelocity(e.hi)), Err: ErrEngineLimit}
			}
			return units.MassFlow(f), nil
		}
		// Below the map: extrapolate along the first two rows (a Willans line).
		f1, err1 := e.fuelGrid.At(float64(w), e.tMin)
		f2, err2 := e.fuelGrid.At(float64(w), e.t2)
		if err1 != nil || err2 != nil {
			return 0, &LimitError{Quantity: "engine speed", Value: units.Of(w), Bound: "highest speed of the fuel map", Limit: units.Of(units.AngularVelocity(e.hi)), Err: ErrEngineLimit}
		}
		f := f1 + (f2-f1)/(e.t2-e.tMin)*(tt-e.tMin)
		return units.MassFlow(math.Max(f, 0)), nil
	}
	x := float64(units.PowerFromTorque(t, w)) / float64(e.ratedPower)
	q := D497Fuel(x, float64(w)/float64(e.rated), e.ratedPower)
	return units.MassFlowFromVolumeFlow(q, e.fuel.Density), nil
}

// D497Fuel returns the diesel fuel volume flow of the ASABE D497 equation
//
//	Q = (0.22·X + 0.096)·P_rated·[1 − (n − 1)·(0.45·X − 0.877)]  (L/h, P_rated in kW)
//
// at load ratio X (power over rated power) and speed ratio n (engine speed
// over rated speed; 1 at full throttle). The standard states it for rated
// PTO power; the engine model applies it to rated engine power.
//
// From memory: ASABE D497.7 (2011), section on fuel consumption, after
// Predicting tractor fuel consumption, Applied Engineering in Agriculture
// 20(5) (2004); the coefficients were recalled.
func D497Fuel(x, n float64, rated units.Power) units.VolumeFlow {
	lph := (0.22*x + 0.096) * rated.Kilowatts() * (1 - (n-1)*(0.45*x-0.877))
	return units.LitresPerHour(lph)
}

// SpecificFuel returns the brake specific fuel consumption at speed w and
// torque t > 0.
func (e *Engine) SpecificFuel(w units.AngularVelocity, t units.Torque) (units.SpecificFuelConsumption, error) {
	if err := positive("engine torque", t); err != nil {
		return 0, err
	}
	m, err := e.FuelRate(w, t)
	if err != nil {
		return 0, err
	}
	return units.SpecificFuelConsumption(float64(m) / float64(units.PowerFromTorque(t, w))), nil
}

// speeds returns n speeds spread evenly over [lo, hi] clipped to the
// curve (helper for searches).
func (e *Engine) speeds(lo, hi float64, n int) []float64 {
	lo, hi = math.Max(lo, e.lo), math.Min(hi, e.hi)
	out := make([]float64, 0, n)
	if n < 2 || hi <= lo {
		return append(out, lo)
	}
	for i := range n {
		out = append(out, lo+(hi-lo)*float64(i)/float64(n-1))
	}
	return slices.Clip(out)
}
