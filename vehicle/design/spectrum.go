package design

import (
	"fmt"
	"math"
	"reflect"
	"time"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// SpectrumPoint is one operating point of a duty spectrum and the time the
// day spends at it.
type SpectrumPoint struct {
	Name   string
	Demand vehicle.Demand
	Time   time.Duration
}

// Spectrum condenses a working day into a weighted duty spectrum: one
// steady operating point per field pass, headland turn, PTO segment and
// road stretch (travel speed, draft, trailer, grade, PTO demand, ground),
// weighted by the time spent there. Identical points are merged.
//
// The vehicle package simulates a day in time steps at constant speed
// within each piece, so every step of a piece asks for the same demand:
// the spectrum's fuel under the same strategy equals the day's up to the
// strategy's own tolerance (TestSpectrumFuel shows the figure), at a cost of
// one solve per point instead of one per time step.
func Spectrum(cycle []vehicle.Segment) ([]SpectrumPoint, error) {
	var out []SpectrumPoint
	add := func(name string, d vehicle.Demand, seconds float64) {
		for i := range out {
			// DeepEqual: a user's Traction may hold slices, where == panics.
			if reflect.DeepEqual(out[i].Demand, d) {
				out[i].Time += time.Duration(math.Round(seconds * 1e9))
				return
			}
		}
		out = append(out, SpectrumPoint{Name: name, Demand: d, Time: time.Duration(math.Round(seconds * 1e9))})
	}
	for i, g := range cycle {
		d := vehicle.Demand{Speed: g.Speed, Grade: g.Grade, Ground: g.Ground}
		switch g.Kind {
		case vehicle.FieldPass:
			if !(g.Speed > 0) {
				return nil, fmt.Errorf("%w: segment %d %q: speed %v", ErrValue, i, g.Name, g.Speed)
			}
			if g.Implement != nil {
				dr, err := g.Implement.Draft(g.Speed)
				if err != nil {
					return nil, fmt.Errorf("segment %d %q: %w", i, g.Name, err)
				}
				d.Draft, d.PTOPower, d.PTOSpeed = dr, g.Implement.PTOPower, g.Implement.PTOSpeed
			}
			add(g.Name, d, float64(g.Distance)/float64(g.Speed))
		case vehicle.HeadlandTurn:
			add(g.Name, d, g.Duration.Seconds())
		case vehicle.StationaryPTO:
			d.Speed = 0
			d.PTOPower, d.PTOSpeed = g.PTOPower, g.PTOSpeed
			if g.Implement != nil {
				d.PTOPower, d.PTOSpeed = g.Implement.PTOPower, g.Implement.PTOSpeed
			}
			add(g.Name, d, g.Duration.Seconds())
		case vehicle.RoadTransfer:
			if !(g.Speed > 0) {
				return nil, fmt.Errorf("%w: segment %d %q: speed %v", ErrValue, i, g.Name, g.Speed)
			}
			d.Trailer = g.Trailer
			for _, st := range g.Profile {
				d.Grade = st.Grade
				add(g.Name, d, float64(st.Length)/float64(g.Speed))
			}
		default:
			return nil, fmt.Errorf("%w: segment %d %q: kind %v has no steady point", ErrValue, i, g.Name, g.Kind)
		}
	}
	return out, nil
}

// SpectrumFuel returns the fuel energy (and mass) the vehicle burns over
// the spectrum under strategy s, or the first point it cannot run.
func SpectrumFuel(v *vehicle.Vehicle, s vehicle.Strategy, spec []SpectrumPoint) (units.Energy, units.Mass, error) {
	var e, m float64
	for _, p := range spec {
		pt, err := s.Operate(v, p.Demand)
		if err != nil {
			return 0, 0, fmt.Errorf("%s: %w", p.Name, err)
		}
		t := p.Time.Seconds()
		e += float64(pt.Flows.Fuel) * t
		m += float64(pt.FuelRate) * t
	}
	return units.Energy(e), units.Mass(m), nil
}
