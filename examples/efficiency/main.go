// Command efficiency studies the demo transmission: its efficiency and the
// share of power through the hydrostat against travel speed in each range,
// and an efficiency map over travel speed × pull with the working day's
// operating points on it.
//
//	go run ./examples/efficiency [-out folder] [-design file.json]
//
// It writes into the output folder: efficiency_ranges.svg/.png,
// hydraulic_share.svg/.png, speed_plan.svg/.png (unit speeds and settings
// by range, with the unit limits), line_pressure.svg/.png (high-line
// pressure by range, with the relief and rated pressures),
// efficiency_map.svg/.png at 1600 rpm and efficiency_map_1200rpm and
// efficiency_map_2000rpm (each with the day's points near its engine
// speed), sweep_<range>.csv and one CSV per map.
package main

import (
	"fmt"
	"math"
	"path/filepath"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/examples/internal/demo"
	"github.com/powersplit-dev/powersplit/examples/internal/figures"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

func main() {
	demo.Main("efficiency", "efficiency of the demo transmission by range, and its efficiency map", run)
}

// study is the engine speed of the study.
var study = units.RPM(1600)

func run(r *demo.Run) error {
	sc := r.Scenario
	tr := sc.Transmission
	layout, err := tr.Layout()
	if err != nil {
		return fmt.Errorf("transmission: %w", err)
	}
	eng, err := sc.BuildEngine()
	if err != nil {
		return err
	}
	full, err := eng.MaxTorque(study)
	if err != nil {
		return err
	}
	conv := newConverter(sc)
	power := units.Power(0.75 * float64(units.PowerFromTorque(full, study)))

	r.Printf("Transmission: %s (%s), %d ranges; engine held at %v (full-load torque %s there).\n",
		tr.Name, tr.Kind, layout.Ranges(), study, demo.F(float64(full), 0, "N·m"))
	r.Printf("Travel speed is the theoretical speed of the rear wheels (no slip) through the final drive\n")
	r.Printf("%.3g:1; pull is the tractive force at the rear tyres' rolling radius, %v.\n", sc.Tractor.FinalDrive, sc.Tractor.Rear.Tyre.RollingRadius)

	// 1. Sweeps per range at a constant engine power.
	r.Heading(fmt.Sprintf("Efficiency and hydraulic share by range, at %s engine power", demo.F(power.Kilowatts(), 0, "kW")))
	solver := powersplit.NewSolver(layout)
	tb := demo.NewTable("range", "speed span", "best efficiency", "at speed", "mechanical point", "hydraulic share", "feasible points")
	var effSeries, shareSeries, pumpSeries, settingSeries, pressureSeries []figures.Series
	var csvs []string
	for rg := range layout.Ranges() {
		name := layout.RangeName(rg)
		ivs, err := solver.Interval(powersplit.Point{Range: rg, Input: study, Outputs: []powersplit.OutputDemand{{Speed: 1}}})
		if err != nil {
			tb.Row(name, "unreachable: "+err.Error(), "", "", "", "", "")
			continue
		}
		lo, hi := demo.Widest(ivs)
		sw, err := layout.Sweep(powersplit.SweepSpec{Design: sc.Transmission.Name, Range: rg, Input: study, From: lo, To: hi, Steps: 80,
			Power: power, Progress: demo.Progress("sweep "+name, "operating points")})
		if err != nil {
			return fmt.Errorf("sweep of range %s: %w", name, err)
		}
		path := filepath.Join(r.Out, "sweep_"+demo.FileName(name)+".csv")
		if err := demo.WriteFile(path, sw.WriteCSV); err != nil {
			return err
		}
		// The speed plan at light load (2 kN pull): the units' speeds and
		// settings over the range's whole reach.
		plan, err := layout.Sweep(powersplit.SweepSpec{Design: sc.Transmission.Name, Range: rg, Input: study, From: lo, To: hi, Steps: 80,
			Torque: conv.torque(units.Kilonewtons(2))})
		if err != nil {
			return fmt.Errorf("speed plan of range %s: %w", name, err)
		}
		ps := figures.Series{Name: name, Colour: rg + 1}
		ms := figures.Series{Colour: rg + 1, Dashed: true}
		pset := figures.Series{Colour: rg + 1}
		mset := figures.Series{Colour: rg + 1, Dashed: true}
		for i, c := range plan.Cells() {
			x := conv.kmh(plan.Speeds[i])
			ps.X, ms.X, pset.X, mset.X = append(ps.X, x), append(ms.X, x), append(pset.X, x), append(mset.X, x)
			if !c.OK {
				ps.Y, ms.Y = append(ps.Y, math.NaN()), append(ms.Y, math.NaN())
				pset.Y, mset.Y = append(pset.Y, math.NaN()), append(mset.Y, math.NaN())
				continue
			}
			ps.Y, ms.Y = append(ps.Y, c.PumpSpeed.RPM()), append(ms.Y, c.MotorSpeed.RPM())
			pset.Y, mset.Y = append(pset.Y, 100*c.PumpSetting), append(mset.Y, 100*c.MotorSetting)
		}
		pumpSeries = append(pumpSeries, ps, ms)
		settingSeries = append(settingSeries, pset, mset)
		pr := figures.Series{Name: name, Colour: rg + 1}
		for i, c := range sw.Cells() {
			pr.X = append(pr.X, conv.kmh(sw.Speeds[i]))
			if c.OK {
				pr.Y = append(pr.Y, c.HighPressure.Bar())
			} else {
				pr.Y = append(pr.Y, math.NaN())
			}
		}
		pressureSeries = append(pressureSeries, pr)
		xs := make([]float64, len(sw.Speeds))
		eff := make([]float64, len(sw.Speeds))
		share := make([]float64, len(sw.Speeds))
		best, bestAt, ok := 0.0, math.NaN(), 0
		mech, mechShare := math.NaN(), math.Inf(1)
		shLo, shHi := math.Inf(1), math.Inf(-1)
		for i, c := range sw.Cells() {
			xs[i] = conv.kmh(sw.Speeds[i])
			eff[i], share[i] = math.NaN(), math.NaN()
			if !c.OK {
				continue
			}
			ok++
			eff[i], share[i] = 100*c.Efficiency, 100*c.HydraulicShare
			if c.Efficiency > best {
				best, bestAt = c.Efficiency, xs[i]
			}
			if math.Abs(c.HydraulicShare) < mechShare {
				mechShare, mech = math.Abs(c.HydraulicShare), xs[i]
			}
			shLo, shHi = math.Min(shLo, c.HydraulicShare), math.Max(shHi, c.HydraulicShare)
		}
		mechText := "none in span"
		if mechShare < 0.03 {
			mechText = demo.F(mech, 1, "km/h")
		}
		if ok == 0 {
			tb.Row(name, demo.F(conv.kmh(lo), 1, "")+" to "+demo.F(conv.kmh(hi), 1, "km/h"), "no feasible point", "", "", "", "0 of 80")
			continue
		}
		tb.Row(name, demo.F(conv.kmh(lo), 1, "")+" to "+demo.F(conv.kmh(hi), 1, "km/h"), demo.Pct(best, 1), demo.F(bestAt, 1, "km/h"),
			mechText, demo.Pct(shLo, 0)+" to "+demo.Pct(shHi, 0), fmt.Sprintf("%d of %d", ok, len(sw.Speeds)))
		effSeries = append(effSeries, figures.Series{Name: name, X: xs, Y: eff})
		shareSeries = append(shareSeries, figures.Series{Name: name, X: xs, Y: share})
		csvs = append(csvs, path)
	}
	tb.Write(r.W)
	r.Wrote(csvs...)
	r.Note("A negative hydraulic share means power circulates back through the hydrostat. Points that " +
		"cross a limit (relief pressure, unit speed) at this power are left out of the figures.")
	alternating := false
	for _, rg := range sc.Transmission.Ranges {
		alternating = alternating || rg.FromVariator
	}
	if alternating {
		r.Note("Ranges taken from the variator's member alternate with ranges from the summing shaft: at each " +
			"synchronous shift point every shaft turns at the same speed in both ranges, and the variator sweeps " +
			"back the other way in the next range. Each row above covers a range's whole reach; a least-fuel " +
			"strategy drives each range mostly between its shift points, where no power circulates in this design. " +
			"The price of synchronous changes with a single planetary set: the hydrostat carries a fifth to two " +
			"thirds of the power in every range, so the efficiency stays a few points below that of a design " +
			"whose range gears all follow the summing shaft (go run ./examples/compare), which in turn must " +
			"jump its variator at every range change.")
		if sps, err := solver.ShiftPoints(powersplit.Point{Input: study, Outputs: []powersplit.OutputDemand{{Speed: 1}}}); err == nil {
			for _, sp := range sps {
				r.Note(fmt.Sprintf("Synchronous shift %s → %s at %s (loop speed ratio %.2f).", layout.RangeName(sp.From),
					layout.RangeName(sp.To), demo.F(conv.kmh(sp.Output), 1, "km/h"), sp.Ratio))
			}
		}
	} else {
		r.Note("Where every range gear follows the summing shaft, as in this layout, every range runs the same " +
			"span of summing-shaft speeds, scaled by its gear: the ranges repeat the same efficiency and share " +
			"at speeds in the ratio of their gears.")
	}
	if len(effSeries) == 0 {
		return fmt.Errorf("no range has a feasible point at %v", study)
	}
	files, err := figures.Lines(r.Out, "efficiency_ranges", figures.Axes{
		Title: fmt.Sprintf("%s: efficiency by range (engine %v, %.0f kW)", sc.Name, study, power.Kilowatts()),
		X:     "travel speed (km/h, no slip)", Y: "transmission efficiency (%)",
		YMin: 75, YMax: 97, LegendBottom: true, Note: demo.FigureCaution}, effSeries...)
	if err != nil {
		return err
	}
	r.Wrote(files...)
	files, err = figures.Lines(r.Out, "hydraulic_share", figures.Axes{
		Title: fmt.Sprintf("%s: power through the hydrostat (engine %v)", sc.Name, study),
		X:     "travel speed (km/h, no slip)", Y: "hydraulic power share (%, negative: circulating)",
		LegendBottom: true, Note: demo.FigureCaution}, shareSeries...)
	if err != nil {
		return err
	}
	r.Wrote(files...)

	// The speed plan and the line pressure.
	tr = sc.Transmission
	var speedLimits []figures.Limit
	if tr.Pump.MaxSpeed > 0 {
		speedLimits = append(speedLimits, figures.Limit{Name: "pump maximum " + tr.Pump.MaxSpeed.String(), Y: tr.Pump.MaxSpeed.RPM()},
			figures.Limit{Y: -tr.Pump.MaxSpeed.RPM()})
	}
	if tr.Motor.MaxSpeed > 0 && tr.Motor.MaxSpeed != tr.Pump.MaxSpeed {
		speedLimits = append(speedLimits, figures.Limit{Name: "motor maximum " + tr.Motor.MaxSpeed.String(), Y: tr.Motor.MaxSpeed.RPM()},
			figures.Limit{Y: -tr.Motor.MaxSpeed.RPM()})
	}
	files, err = figures.Panels(r.Out, "speed_plan",
		fmt.Sprintf("%s: speed plan at engine %v, light load (solid: pump, dashed: motor)", sc.Name, study), demo.FigureCaution,
		figures.Panel{Axes: figures.Axes{Y: "unit speed (rpm)", Limits: speedLimits, LegendBottom: true, XMin: 0, XMax: 45}, Series: pumpSeries},
		figures.Panel{Axes: figures.Axes{X: "travel speed (km/h, no slip)", Y: "displacement setting (%)",
			Limits: []figures.Limit{{Name: "full displacement", Y: 100}, {Y: -100}}, YMin: -110, YMax: 115, XMin: 0, XMax: 45}, Series: settingSeries})
	if err != nil {
		return err
	}
	r.Wrote(files...)
	limits := []figures.Limit{{Name: "relief setting " + tr.Relief.String(), Y: tr.Relief.Bar()}}
	if rp := tr.Pump.RatedPressure; rp > 0 {
		limits = append(limits, figures.Limit{Name: "rated continuous pressure " + rp.String(), Y: rp.Bar()})
	}
	files, err = figures.Lines(r.Out, "line_pressure", figures.Axes{
		Title: fmt.Sprintf("%s: high-line pressure by range (engine %v, %.0f kW)", sc.Name, study, power.Kilowatts()),
		X:     "travel speed (km/h, no slip)", Y: "high-line pressure (bar)", Limits: limits, YMin: 0, YMax: 1.1 * tr.Relief.Bar(),
		LegendBottom: true, Note: demo.FigureCaution}, pressureSeries...)
	if err != nil {
		return err
	}
	r.Wrote(files...)

	// 2. Full and part load over travel speed, every loss included.
	if err := loadCurves(r); err != nil {
		return err
	}

	// 3. Efficiency maps, one per engine speed; the day's driving points
	// appear on the map nearest their own engine speed.
	points, rpms, table, err := dayPoints(sc, conv)
	if err != nil {
		return err
	}
	maps := []struct {
		rpm    float64
		lo, hi float64 // engine speeds of the day's points shown on it
		base   string
	}{{1200, 0, 1400, "efficiency_map_1200rpm"}, {1600, 1400, 1800, "efficiency_map"}, {2000, 1800, math.Inf(1), "efficiency_map_2000rpm"}}
	for _, mp := range maps {
		at := units.RPM(mp.rpm)
		full, err := eng.MaxTorque(at)
		if err != nil {
			return err
		}
		r.Heading(fmt.Sprintf("Efficiency map over travel speed × pull (engine %v, best range per point)", at))
		if err := efficiencyMap(r, layout, conv, at, full, mp.base, mp.lo, mp.hi, points, rpms); err != nil {
			return err
		}
	}
	r.Printf("\n  The day's driving points (each marked on the map nearest its own engine speed):\n")
	table.Write(r.W)
	return nil
}

// efficiencyMap solves and draws the efficiency map at engine speed eng,
// marking the day's points whose engine speed lies in [lo, hi).
func efficiencyMap(r *demo.Run, layout powersplit.Layout, conv converter, eng units.AngularVelocity, full units.Torque,
	base string, lo, hi float64, points figures.Series, rpms []float64) error {
	sc := r.Scenario
	maxKMH := 45.0
	maxPull := 0.75 * float64(units.ForceFromMass(sc.Tractor.Mass, units.Gravity))
	m, err := layout.Map(powersplit.MapSpec{Design: sc.Transmission.Name, Range: powersplit.Auto, Input: eng,
		SpeedFrom: conv.output(0.5), SpeedTo: conv.output(maxKMH), SpeedSteps: 90,
		TorqueFrom: conv.torque(units.Kilonewtons(1)), TorqueTo: conv.torque(units.Force(maxPull)), TorqueSteps: 60,
		Progress: demo.Progress("efficiency map at "+eng.String(), "operating points")})
	if err != nil {
		return fmt.Errorf("map: %w", err)
	}
	path := filepath.Join(r.Out, base+".csv")
	if err := demo.WriteFile(path, m.WriteCSV); err != nil {
		return err
	}
	g := figures.Grid{X: make([]float64, len(m.Speeds)), Y: make([]float64, len(m.Torques))}
	for j, w := range m.Speeds {
		g.X[j] = conv.kmh(w)
	}
	for i, t := range m.Torques {
		g.Y[i] = conv.pull(t).Kilonewtons()
	}
	feasible, engineLimited := 0, 0
	g.Z = make([][]float64, len(m.Torques))
	g.Feasible = make([][]bool, len(m.Torques))
	env := figures.Series{Name: "feasibility envelope (transmission and engine)"}
	for i := range m.Torques {
		g.Z[i] = make([]float64, len(m.Speeds))
		g.Feasible[i] = make([]bool, len(m.Speeds))
		for j := range m.Speeds {
			c := m.At(i, j)
			if c.OK && c.InputTorque > full {
				engineLimited++
				continue
			}
			if c.OK {
				g.Z[i][j], g.Feasible[i][j] = 100*c.Efficiency, true
				feasible++
			}
		}
	}
	for j := range m.Speeds {
		top := -1
		for i := range m.Torques {
			if g.Feasible[i][j] {
				top = i
			}
		}
		y := math.NaN()
		if top >= 0 {
			y = g.Y[top]
		}
		env.X, env.Y = append(env.X, g.X[j]), append(env.Y, y)
	}
	pts := figures.Series{Name: fmt.Sprintf("the day's driving points at %.0f–%.0f rpm", math.Max(lo, 800), math.Min(hi, 2250)), Points: true}
	for k := range points.X {
		if rpms[k] >= lo && rpms[k] < hi {
			pts.X, pts.Y = append(pts.X, points.X[k]), append(pts.Y, points.Y[k])
		}
	}
	var marks []figures.Series
	if len(pts.X) > 0 {
		marks = append(marks, pts)
	}
	files, err := figures.HeatMap(r.Out, base, figures.Axes{
		Title: fmt.Sprintf("%s: transmission efficiency at engine %v, best range", sc.Name, eng),
		X:     "travel speed (km/h, no slip)", Y: "pull at the tyres (kN)", Note: demo.FigureCaution}, g,
		figures.MapOptions{Levels: []float64{70, 75, 80, 85, 88, 90, 92, 94}, ZLabel: "transmission efficiency (%)", ZMin: 70, ZMax: 96,
			Envelope: &env, Points: marks})
	if err != nil {
		return err
	}
	r.Printf("  %d of %d points feasible; %d more the transmission could run but the engine cannot\n",
		feasible, len(m.Speeds)*len(m.Torques), engineLimited)
	r.Printf("  (input torque above its full-load %s at %v); %d of the day's driving points on this map.\n",
		demo.F(float64(full), 0, "N·m"), eng, len(pts.X))
	r.Wrote(path)
	r.Wrote(files...)
	return nil
}

// loadCurves prints the transmission's efficiency over travel speed at
// full and part engine load, at rated speed, with its losses by kind.
func loadCurves(r *demo.Run) error {
	sc := r.Scenario
	eng, err := sc.BuildEngine()
	if err != nil {
		return err
	}
	w := units.RPM(1900)
	if lo, hi := eng.SpeedRange(); w < lo || w > hi {
		w = eng.Rated()
	}
	r.Heading(fmt.Sprintf("Efficiency over travel speed at full and part load (engine %v, best range per speed)", w))
	var kmh []float64
	for v := 4.0; v <= 40; v += 4 {
		kmh = append(kmh, v)
	}
	tb := demo.NewTable("load", "speed", "range", "transmission", "with final drive", "hydrostatic loss", "gear loss", "no-load loss")
	for i, load := range []float64{0.9, 0.5, 0.25} {
		pts, err := demo.LoadCurve(sc, w, load, kmh)
		if err != nil {
			return err
		}
		if i > 0 {
			tb.Rule()
		}
		for _, p := range pts {
			tb.Row(demo.Pct(load, 0), demo.F(p.KMH, 0, "km/h"), p.Range, demo.Pct(p.Efficiency, 1), demo.Pct(p.DriveLine, 1),
				demo.F(p.Hydrostatic.Kilowatts(), 2, "kW"), demo.F(p.Mechanical.Kilowatts(), 2, "kW"), demo.F(p.NoLoad.Kilowatts(), 2, "kW"))
		}
	}
	tb.Write(r.W)
	r.Note("Load is the engine's power over its full-load power at this speed. The efficiency includes " +
		"the hydrostatic units' losses (Wilson model), the mesh losses of every gear and planetary set, and " +
		"the design file's no-load losses: rolling bearings (Palmgren), churning and windage (ISO/TR 14179-1), " +
		"the open range clutches' plates and the charge pump. It leaves out the front-axle drive, the PTO " +
		"driveline and the hydraulics of the implement, steering and brakes. Levels recalled (not re-read) for tractor " +
		"power-split transmissions are about 85–90 % at full load near the mechanical points, falling at part load; " +
		"a field test of a tractor drive line found 56–86 % (see the README).")
	return nil
}

// converter turns output shaft quantities into travel speed (no slip) and
// pull at the rear tyres' rolling radius, through the library's Driveline.
type converter struct{ d vehicle.Driveline }

func newConverter(sc *demo.Scenario) converter {
	return converter{vehicle.Driveline{FinalDrive: sc.Tractor.FinalDrive, RollingRadius: sc.Tractor.Rear.Tyre.RollingRadius,
		Efficiency: sc.Tractor.FinalDriveEfficiency}}
}

func (c converter) kmh(w units.AngularVelocity) float64 { return c.d.TravelSpeed(w, 0).KMH() }

func (c converter) output(kmh float64) units.AngularVelocity {
	return c.d.OutputSpeed(units.KMH(kmh), 0)
}

func (c converter) pull(t units.Torque) units.Force { return c.d.Pull(t) }

func (c converter) torque(f units.Force) units.Torque { return c.d.OutputTorque(f) }

// dayPoints solves one operating point per driving segment (and per road
// stretch) of the day with the least-fuel strategy and returns them in map
// coordinates, with a table.
func dayPoints(sc *demo.Scenario, conv converter) (figures.Series, []float64, *demo.Table, error) {
	pts := figures.Series{Name: "the day's driving points", Points: true}
	var rpms []float64
	tb := demo.NewTable("segment", "speed", "pull", "engine", "range", "efficiency", "hydraulic share")
	v, err := sc.Vehicle(sc.Transmission)
	if err != nil {
		return pts, rpms, tb, err
	}
	cycle, err := sc.Cycle()
	if err != nil {
		return pts, rpms, tb, err
	}
	for _, g := range cycle {
		var demands []vehicle.Demand
		switch g.Kind {
		case vehicle.FieldPass:
			d := vehicle.Demand{Speed: g.Speed, Grade: g.Grade, Ground: g.Ground}
			if g.Implement != nil {
				dr, err := g.Implement.Draft(g.Speed)
				if err != nil {
					return pts, rpms, tb, err
				}
				d.Draft = dr
			}
			demands = append(demands, d)
		case vehicle.HeadlandTurn:
			demands = append(demands, vehicle.Demand{Speed: g.Speed, Grade: g.Grade, Ground: g.Ground})
		case vehicle.RoadTransfer:
			for _, s := range g.Profile {
				demands = append(demands, vehicle.Demand{Speed: g.Speed, Grade: s.Grade, Trailer: g.Trailer, Ground: g.Ground})
			}
		}
		for _, d := range demands {
			p, err := vehicle.LeastFuel{}.Operate(v, d)
			if err != nil {
				tb.Row(g.Name, demo.F(d.Speed.KMH(), 1, "km/h"), "cannot run: "+demo.FirstLine(err), "", "", "", "")
				continue
			}
			x := conv.kmh(p.Drive.OutputSpeed)
			y := conv.pull(p.Drive.OutputTorque).Kilonewtons()
			pout := units.PowerFromTorque(p.Drive.OutputTorque, p.Drive.OutputSpeed)
			pin := units.PowerFromTorque(p.Drive.InputTorque, p.EngineSpeed)
			pts.X, pts.Y = append(pts.X, x), append(pts.Y, y)
			rpms = append(rpms, p.EngineSpeed.RPM())
			tb.Row(g.Name, demo.F(d.Speed.KMH(), 1, "km/h"), demo.F(y, 1, "kN"), demo.F(p.EngineSpeed.RPM(), 0, "rpm"),
				sc.Transmission.RangeNames()[p.Range], demo.Ratio(p.TransmissionEfficiency(), pout, pin, 1), demo.Ratio(p.Drive.HydrostaticShare, pout, pin, 0))
		}
	}
	return pts, rpms, tb, nil
}
