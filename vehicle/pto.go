package vehicle

import (
	"math"

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
