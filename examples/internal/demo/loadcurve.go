package demo

import (
	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// A LoadPoint is the demo transmission at one travel speed and engine
// load, in the range of best efficiency.
type LoadPoint struct {
	Load       float64 // engine power over its full-load power at the speed
	KMH        float64 // theoretical travel speed (no slip)
	Range      string
	Efficiency float64 // transmission: output over input power
	// DriveLine is Efficiency times the final drive's efficiency.
	DriveLine float64
	// Losses of the transmission: hydrostatic, load-dependent mechanical
	// (gears, planetary sets) and no-load (drag sources).
	Hydrostatic, Mechanical, NoLoad units.Power
}

// LoadCurve solves the design's transmission at engine speed w with the
// engine delivering load × its full-load power, at each travel speed, in
// every range, and keeps the most efficient feasible range per speed. A
// speed no range reaches is left out.
func LoadCurve(sc *Scenario, w units.AngularVelocity, load float64, kmh []float64) ([]LoadPoint, error) {
	l, err := sc.Transmission.Layout()
	if err != nil {
		return nil, err
	}
	eng, err := sc.BuildEngine()
	if err != nil {
		return nil, err
	}
	full, err := eng.MaxTorque(w)
	if err != nil {
		return nil, err
	}
	etaFD := sc.Tractor.FinalDriveEfficiency
	if etaFD == 0 {
		etaFD = vehicle.DefaultFinalDriveEfficiency
	}
	pin := load * float64(units.PowerFromTorque(full, w))
	s := powersplit.NewSolver(l)
	var st powersplit.State
	var out []LoadPoint
	for _, v := range kmh {
		wout := units.AngularVelocity(sc.Tractor.FinalDrive) * units.AngularFromSpeed(units.KMH(v), sc.Tractor.Rear.Tyre.RollingRadius)
		best := LoadPoint{Efficiency: -1}
		for rg := range l.Ranges() {
			// The output torque that takes about the wanted input power,
			// refined once by the efficiency found.
			tq := units.Torque(0.9 * pin / float64(wout))
			p := powersplit.Point{Range: rg, Input: w, Outputs: []powersplit.OutputDemand{{Speed: wout, Torque: tq}}}
			if s.Solve(p, &st) != nil {
				continue
			}
			p.Outputs[0].Torque = units.Torque(float64(tq) * pin / float64(st.InputPower))
			if s.Solve(p, &st) != nil || st.InputTorque > full || st.Efficiency <= best.Efficiency {
				continue
			}
			best = LoadPoint{Load: load, KMH: v, Range: st.RangeName, Efficiency: st.Efficiency, DriveLine: st.Efficiency * etaFD,
				Hydrostatic: st.HydrostatLoss, NoLoad: st.DragLoss, Mechanical: st.Loss - st.HydrostatLoss - st.DragLoss}
		}
		if best.Efficiency >= 0 {
			out = append(out, best)
		}
	}
	return out, nil
}
