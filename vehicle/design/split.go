package design

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Parameter names Apply and SplitProblem understand. A range gear's ratio
// is "range1", "range2", ... (1 for the lowest range).
const (
	ParamFixedCarrierRatio = "fixedCarrierRatio" // Transmission.Set.FixedCarrierRatio
	ParamInputRatio        = "inputRatio"        // Transmission.InputRatio
	ParamPumpRatio         = "pumpRatio"         // Transmission.PumpRatio
	ParamMotorRatio        = "motorRatio"        // Transmission.MotorRatio
	ParamPumpDisplacement  = "pumpDisplacement"  // Transmission.Pump.Displacement, in cm³/rev
	ParamMotorDisplacement = "motorDisplacement" // Transmission.Motor.Displacement, in cm³/rev
	ParamRelief            = "relief"            // Transmission.Relief, in bar
	ParamFinalDrive        = "finalDrive"        // Tractor.FinalDrive
)

// Objectives of SplitProblem, in order; all are minimised.
var SplitObjectives = []string{
	"fuel_kg",         // fuel burned over the duty spectrum under the least-fuel strategy, kg
	"displacement_cc", // installed hydrostatic displacement, pump plus motor, cm³/rev
	"peak_bar",        // highest loop pressure over the duty spectrum, bar
}

// Apply returns a copy of f whose transmission (and final drive) take the
// candidate's parameter values; f is not changed. The copy can be checked,
// simulated and saved like any design file.
func (f *File) Apply(s Space, x []float64) (*File, error) {
	if len(x) != len(s.Params) {
		return nil, fmt.Errorf("%w: candidate of %d values for %d parameters", ErrValue, len(x), len(s.Params))
	}
	g := *f
	g.index = nil
	t := f.Transmission
	t.Ranges = slices.Clone(t.Ranges)
	for i, p := range s.Params {
		v := x[i]
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("%w: %s = %g", ErrValue, p.Name, v)
		}
		switch p.Name {
		case ParamFixedCarrierRatio:
			t.Set.FixedCarrierRatio = v
			t.Set.Teeth = nil // a searched ratio has no tooth counts
		case ParamInputRatio:
			t.InputRatio = v
		case ParamPumpRatio:
			t.PumpRatio = v
		case ParamMotorRatio:
			t.MotorRatio = v
		case ParamPumpDisplacement:
			t.Pump.Displacement = units.CCPerRev(v)
		case ParamMotorDisplacement:
			t.Motor.Displacement = units.CCPerRev(v)
		case ParamRelief:
			t.Relief = units.Bar(v)
		case ParamFinalDrive:
			g.Tractor.FinalDrive = v
		default:
			k, err := strconv.Atoi(strings.TrimPrefix(p.Name, "range"))
			if !strings.HasPrefix(p.Name, "range") || err != nil || k < 1 || k > len(t.Ranges) {
				return nil, fmt.Errorf("%w: parameter %q is not one a split design has", ErrValue, p.Name)
			}
			t.Ranges[k-1].Ratio = v
		}
	}
	g.Transmission = t
	return &g, nil
}

// SplitProblem is the search problem of f's transmission over space s:
// each candidate is f with the parameters applied (Apply); it is feasible
// when it builds and meets req (f's Requirements when req is nil), and is
// scored by SplitObjectives over the duty spectrum of f's day.
func (f *File) SplitProblem(s Space, req *Requirements) (Problem, error) {
	if err := s.Validate(); err != nil {
		return Problem{}, err
	}
	if _, err := f.Apply(s, s.At(make([]float64, s.Free()))); err != nil {
		return Problem{}, err
	}
	if req == nil {
		req = f.Requirements
	}
	cycle, err := f.Cycle()
	if err != nil {
		return Problem{}, err
	}
	spec, err := Spectrum(cycle)
	if err != nil {
		return Problem{}, err
	}
	eval := func(x []float64) ([]float64, string) {
		g, err := f.Apply(s, x)
		if err != nil {
			return nil, err.Error()
		}
		return g.Score(req, spec)
	}
	return Problem{Space: s, Objectives: slices.Clone(SplitObjectives), Evaluate: eval}, nil
}

// Score evaluates f's transmission: it checks req (a failed requirement,
// or a transmission that does not build, makes the reason), then runs the
// spectrum under the least-fuel strategy and returns SplitObjectives.
func (f *File) Score(req *Requirements, spec []SpectrumPoint) ([]float64, string) {
	t := f.Transmission
	// The layout, vehicle and solver serve the check and the spectrum.
	l, loop, err := t.built()
	if err != nil {
		return nil, firstLine(err)
	}
	v, err := f.vehicle(t, &l)
	if err != nil {
		return nil, firstLine(err)
	}
	solver := solverOf(v, l)
	if req != nil {
		rep, err := f.check(t, l, limitsOf(loop), v, solver, req)
		if err != nil {
			return nil, firstLine(err)
		}
		if !rep.Feasible() {
			return nil, strings.Join(rep.Failed(), "; ")
		}
	}
	var fuel, peak float64
	for _, p := range spec {
		pt, err := vehicle.LeastFuel{}.Operate(v, p.Demand)
		if err != nil {
			return nil, p.Name + ": " + firstLine(err)
		}
		fuel += float64(pt.FuelRate) * p.Time.Seconds()
		if pt.Range < 0 {
			continue
		}
		// The high line's absolute pressure, charge + |Δp|, as the vehicle
		// solved the point (its front motor taking its share, if any).
		peak = math.Max(peak, float64(pt.Drive.Hydrostat.HighPressure))
	}
	disp := (float64(t.Pump.Displacement) + float64(t.Motor.Displacement)) / float64(units.CCPerRev(1))
	return []float64{fuel, disp, units.Pressure(peak).Bar()}, ""
}

func firstLine(err error) string {
	s, _, _ := strings.Cut(err.Error(), "\n")
	return s
}
