package vehicle

import (
	"math"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
)

// Standard PTO shaft speeds.
//
// Source: ISO 500-1:2014, Agricultural tractors — Rear-mounted power
// take-off types 1, 2, 3 and 4 — Part 1: general specifications, safety
// requirements, dimensions for master shield and clearance zone: nominal
// speeds 540 r/min (type 1) and 1 000 r/min (types 1 to 4).
var (
	PTO540  = units.RPM(540)
	PTO1000 = units.RPM(1000)
)

// A PTO is the power take-off driveline: one or more fixed ratios from the
// engine to the PTO shaft (for example one for 540 and one for 1000 r/min
// shafts). Its zero value is "no PTO".
type PTO struct {
	// Ratios are engine speed over PTO shaft speed, one per selectable
	// PTO gear; empty means no PTO.
	Ratios []float64
	// Efficiency of the PTO driveline in (0, 1]; default 0.95.
	Efficiency float64
	// MaxPower is the PTO shaft's rated power; zero means no limit.
	MaxPower units.Power
	// Idle is the drag of the PTO driveline while no PTO power is asked
	// (disengaged or unloaded); nil means none.
	Idle *PTOIdle
}

// PTOIdle is the idle drag of a PTO driveline: the open wet plates of its
// clutch, slipping at the clutch's input speed, and the bearings turning
// with it, by the models of powersplit.PlateTorque (viscous film drag) and
// powersplit.BearingTorque (Palmgren), in the given oil. Under load the
// driveline's Efficiency accounts for its losses instead.
type PTOIdle struct {
	Plates    powersplit.Plates
	Bearings  powersplit.Bearings // MeanDiameter zero: no bearings
	Lubricant powersplit.Lubricant
	// SpeedRatio is the clutch input's speed over the engine speed; zero
	// means 1.
	SpeedRatio float64
}

// Power returns the idle drag power at engine speed w.
func (i *PTOIdle) Power(w units.AngularVelocity) units.Power {
	r := i.SpeedRatio
	if r == 0 {
		r = 1
	}
	ws := units.AngularVelocity(r * math.Abs(float64(w)))
	mu := units.DynamicFromKinematic(i.Lubricant.Viscosity, i.Lubricant.Density)
	t := float64(powersplit.PlateTorque(i.Plates, mu, ws))
	if i.Bearings.MeanDiameter > 0 {
		n := i.Bearings.Count
		if n == 0 {
			n = 1
		}
		t += float64(n) * float64(powersplit.BearingTorque(i.Bearings, i.Lubricant.Viscosity, ws))
	}
	return units.Power(t * float64(ws))
}

func (i *PTOIdle) validate() error {
	p := i.Plates
	if p.Films <= 0 || !(p.Inner > 0) || !(p.Outer > p.Inner) || !(p.Clearance > 0) ||
		!finite(float64(p.Inner), float64(p.Outer), float64(p.Clearance)) {
		return invalid("PTO.Idle.Plates", float64(p.Films), "needs films > 0 and 0 < inner < outer, clearance > 0, finite")
	}
	if err := positive("PTO.Idle.Lubricant.Viscosity", i.Lubricant.Viscosity); err != nil {
		return err
	}
	if err := positive("PTO.Idle.Lubricant.Density", i.Lubricant.Density); err != nil {
		return err
	}
	if b := i.Bearings; b.MeanDiameter != 0 {
		if err := positive("PTO.Idle.Bearings.MeanDiameter", b.MeanDiameter); err != nil {
			return err
		}
		if err := positive("PTO.Idle.Bearings.F0", b.F0); err != nil {
			return err
		}
		if err := nonNegative("PTO.Idle.Bearings.F1", b.F1); err != nil {
			return err
		}
		if err := nonNegative("PTO.Idle.Bearings.Load", b.Load); err != nil {
			return err
		}
		if b.Count < 0 {
			return invalid("PTO.Idle.Bearings.Count", float64(b.Count), "must be ≥ 0")
		}
	}
	return nonNegative("PTO.Idle.SpeedRatio", i.SpeedRatio)
}

// DefaultPTOEfficiency is the PTO driveline efficiency used when none is
// given. Common practice (no published source).
const DefaultPTOEfficiency = 0.95

// EngineSpeed returns the engine speed ω_engine = ratio·s that turns the
// PTO shaft at speed s through one PTO ratio.
func EngineSpeed(ratio float64, s units.AngularVelocity) (units.AngularVelocity, error) {
	if err := positive("PTO ratio", ratio); err != nil {
		return 0, err
	}
	if err := positive("PTO shaft speed", s); err != nil {
		return 0, err
	}
	return units.AngularVelocity(ratio * float64(s)), nil
}

// EngineSpeeds returns the engine speeds that turn the PTO shaft at speed
// s, one per PTO ratio, in the order of Ratios.
func (p PTO) EngineSpeeds(s units.AngularVelocity) ([]units.AngularVelocity, error) {
	if len(p.Ratios) == 0 {
		return nil, invalid("PTO.Ratios", 0.0, "the vehicle has no PTO")
	}
	out := make([]units.AngularVelocity, len(p.Ratios))
	for i, r := range p.Ratios {
		w, err := EngineSpeed(r, s)
		if err != nil {
			return nil, err
		}
		out[i] = w
	}
	return out, nil
}

func (p PTO) validate() error {
	for _, r := range p.Ratios {
		if err := positive("PTO.Ratios", r); err != nil {
			return err
		}
	}
	if p.Efficiency != 0 {
		if err := fraction("PTO.Efficiency", p.Efficiency); err != nil {
			return err
		}
	}
	if p.Idle != nil {
		if err := p.Idle.validate(); err != nil {
			return err
		}
	}
	return nonNegative("PTO.MaxPower", p.MaxPower)
}

// matches reports whether engine speed w turns the shaft at s through one
// of the ratios.
func (p PTO) matches(w, s units.AngularVelocity) bool {
	for _, r := range p.Ratios {
		want := r * float64(s)
		if math.Abs(float64(w)-want) <= 1e-9*want {
			return true
		}
	}
	return false
}

func (p PTO) efficiency() float64 {
	if p.Efficiency == 0 {
		return DefaultPTOEfficiency
	}
	return p.Efficiency
}
