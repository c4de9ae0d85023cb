// Command frontmotor compares two ways of driving the demo tractor's front
// axle: the mechanical front drive at a fixed 2 % lead, and a second motor
// on the transmission's loop that drives the front axle at its own speed
// (swung back with travel speed and declutched above it). It runs both
// through the same working day, headland turns included, and sweeps
// ploughing and turning against travel speed.
//
//	go run ./examples/frontmotor [-out folder] [-design file.json] [-quick]
//
// -quick takes one-minute time steps for the day and a coarser engine
// speed search and speed sweep (a check that it runs, in seconds).
//
// The built-in design is the demo tractor with a front-axle motor
// (print it with -print-design); a file given by -design must have a
// "frontMotor" under "tractor". The same file without its front motor is
// the mechanical drive. It writes into the output folder:
// frontmotor_fuel.svg/.png (fuel rate ploughing against travel speed),
// frontmotor_slip.svg/.png (front and rear slip), frontmotor_split.svg/.png
// (the front axle's share of the wheel torque), frontmotor_turn.svg/.png
// (losses of a headland turn against travel speed) and frontmotor.csv (the
// sweep).
package main

import (
	"encoding/csv"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strconv"

	"github.com/powersplit-dev/powersplit/examples/internal/demo"
	"github.com/powersplit-dev/powersplit/examples/internal/figures"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

var quick bool

// strategy is the least-fuel search (coarser with -quick).
func strategy() vehicle.LeastFuel {
	if quick {
		return vehicle.LeastFuel{Samples: 8, Tolerance: 1e-3}
	}
	return vehicle.LeastFuel{}
}

func main() {
	demo.MainFrontMotor("frontmotor", "mechanical front drive at a fixed lead against a front-axle motor on the loop",
		func(fs *flag.FlagSet) {
			fs.BoolVar(&quick, "quick", false, "one-minute steps, a coarser engine speed search and speed sweep")
		}, run)
}

// drive is one of the two tractors.
type drive struct {
	name string
	v    *vehicle.Vehicle
	sc   *demo.Scenario
}

func run(r *demo.Run) error {
	sc := r.Scenario
	if sc.Tractor.FrontMotor == nil {
		return errors.New("the design file's tractor has no \"frontMotor\"; see -print-design")
	}
	mechSc := *sc
	mechSc.Tractor.FrontMotor = nil
	fm, err := sc.Vehicle(sc.Transmission)
	if err != nil {
		return err
	}
	mech, err := mechSc.Vehicle(sc.Transmission)
	if err != nil {
		return err
	}
	drives := []drive{
		{name: fmt.Sprintf("mechanical, %.0f %% lead", 100*sc.Tractor.FrontLead), v: mech, sc: &mechSc},
		{name: "front-axle motor", v: fm, sc: sc},
	}
	if err := day(r, drives); err != nil {
		return err
	}
	if !quick {
		// The front setting of least engine power, point by point, in the
		// ploughing sweep (some twenty solves a point: not for the day).
		lpSc := *sc
		lpFM := *sc.Tractor.FrontMotor
		lpFM.Control = "least power"
		lpSc.Tractor.FrontMotor = &lpFM
		lp, err := lpSc.Vehicle(sc.Transmission)
		if err != nil {
			return err
		}
		drives = append(drives, drive{name: "front-axle motor, least-power setting", v: lp, sc: &lpSc})
	}
	return sweep(r, drives)
}

// day runs the working day with both drives.
func day(r *demo.Run, drives []drive) error {
	r.Heading("The working day, least-fuel strategy")
	t := demo.NewTable("", "fuel", "slip front", "slip rear", "hydrostat", "mechanical", "turns: fuel", "turns: tyres", "turns: circulating")
	for _, d := range drives {
		cycle, err := d.sc.Cycle()
		if err != nil {
			return err
		}
		step := d.sc.Step().Std()
		if quick {
			step = 60e9
		}
		dy, err := vehicle.Simulate(d.v, strategy(), cycle, vehicle.Options{Step: step})
		if err != nil {
			return err
		}
		if err := dy.Err(); err != nil {
			r.Printf("  %s: some segments did not run: %s\n", d.name, demo.FirstLine(err))
		}
		a := dy.Audit
		var turn vehicle.Audit
		for _, sg := range dy.Segments {
			if sg.Kind == vehicle.HeadlandTurn {
				turn = sg.Audit
			}
		}
		mj := func(e units.Energy) string { return demo.F(e.Megajoules(), 1, "MJ") }
		t.Row(d.name, demo.F(a.Fuel.Kilograms(), 2, "kg"), mj(a.FrontSlip), mj(a.RearSlip), mj(a.Hydrostatic), mj(a.Mechanical),
			demo.F(turn.Fuel.Kilograms(), 2, "kg"), mj(turn.Slip+turn.Rolling), mj(turn.Circulating))
	}
	t.Write(r.W)
	r.Note("Slip losses are shown per axle; circulating energy is what an axle driven backwards returned into the " +
		"driveline in the turns (a measure, not a further loss: it is paid for in the slip and transmission losses).")
	return nil
}

// row is one travel speed of the sweep for one drive.
type row struct {
	fuel, slipF, slipR, share, turnLoss, turnCirc, turnFuel float64
}

// sweep runs ploughing and a headland turn against travel speed.
func sweep(r *demo.Run, drives []drive) error {
	sc := drives[1].sc
	var plough *vehicle.Implement
	var ground, turnGround vehicle.Traction
	var radius units.Length
	cycle, err := sc.Cycle()
	if err != nil {
		return err
	}
	for _, g := range cycle {
		if g.Kind == vehicle.FieldPass && plough == nil {
			plough, ground = g.Implement, g.Ground
		}
		if g.Kind == vehicle.HeadlandTurn {
			turnGround, radius = g.Ground, g.TurnRadius
		}
	}
	if plough == nil || turnGround == nil {
		return errors.New("the day needs a field pass and a headland turn for the sweep")
	}
	if radius == 0 {
		radius = units.Metres(6)
	}
	var speeds []float64
	dv := 0.5
	if quick {
		dv = 1
	}
	for v := 3.0; v <= 14.0001; v += dv {
		speeds = append(speeds, v)
	}
	rows := make([][]row, len(drives))
	for i, d := range drives {
		rows[i] = make([]row, len(speeds))
		for k, kmh := range speeds {
			nan := math.NaN()
			rw := row{nan, nan, nan, nan, nan, nan, nan}
			v := units.KMH(kmh)
			draft, err := plough.Draft(v)
			if err != nil {
				return err
			}
			if p, err := strategy().Operate(d.v, vehicle.Demand{Speed: v, Draft: draft, Ground: ground}); err == nil {
				rw.fuel = p.FuelRate.KilogramsPerHour()
				rw.slipR = 100 * p.Slip
				rw.slipF = 100 * p.FrontSlip
				if i == 0 {
					rw.slipF = 100 * (1 - (1-p.Slip)/(1+sc.Tractor.FrontLead))
					rw.share = nan
				} else {
					rw.share = 100 * p.FrontShare
				}
			}
			if i == 2 {
				rows[i][k] = rw
				continue // the least-power setting: ploughing only
			}
			if p, err := strategy().Operate(d.v, vehicle.Demand{Speed: v, Ground: turnGround, TurnRadius: radius}); err == nil {
				f := p.Flows
				rw.turnLoss = (f.Slip + f.Rolling + f.Hydrostatic + f.Mechanical + f.NoLoad).Kilowatts()
				rw.turnCirc = f.Circulating.Kilowatts()
				rw.turnFuel = p.FuelRate.KilogramsPerHour()
			}
			rows[i][k] = rw
		}
	}
	r.Heading(fmt.Sprintf("Ploughing and turning (radius %.0f m) against travel speed", float64(radius)))
	t := demo.NewTable("km/h", "fuel kg/h", "", "slip front %", "", "slip rear %", "", "front share %", "turn loss kW", "", "circulating kW")
	t.Row("", "mech.", "motor", "mech.", "motor", "mech.", "motor", "motor", "mech.", "motor", "mech.")
	f := func(x float64, p int) string {
		if math.IsNaN(x) {
			return "—"
		}
		return strconv.FormatFloat(x, 'f', p, 64)
	}
	for k, kmh := range speeds {
		if math.Mod(kmh, 1) != 0 {
			continue
		}
		a, b := rows[0][k], rows[1][k]
		t.Row(f(kmh, 0), f(a.fuel, 2), f(b.fuel, 2), f(a.slipF, 1), f(b.slipF, 1), f(a.slipR, 1), f(b.slipR, 1), f(b.share, 0),
			f(a.turnLoss, 2), f(b.turnLoss, 2), f(a.turnCirc, 2))
	}
	t.Write(r.W)
	if len(drives) > 2 {
		t := demo.NewTable("km/h", "fuel kg/h", "front setting chosen: share %", "slip front %", "slip rear %")
		for k, kmh := range speeds {
			if math.Mod(kmh, 1) != 0 {
				continue
			}
			c := rows[2][k]
			t.Row(f(kmh, 0), f(c.fuel, 2), f(c.share, 0), f(c.slipF, 1), f(c.slipR, 1))
		}
		r.Printf("\n  %s:\n", drives[2].name)
		t.Write(r.W)
	}
	r.Note("Mechanical front slip follows from the rear slip and the lead: 1 − (1 − s_rear)/(1 + lead). Above the front " +
		"motor's declutch speed the front wheels roll free and the motor stands still; a dash marks a point beyond a limit.")

	series := func(get func(row) float64, label string, dashed bool, i int) figures.Series {
		s := figures.Series{Name: label, Dashed: dashed}
		for k, kmh := range speeds {
			s.X = append(s.X, kmh)
			s.Y = append(s.Y, get(rows[i][k]))
		}
		return s
	}
	var files []string
	add := func(fs []string, err error) error {
		files = append(files, fs...)
		return err
	}
	var names []string
	for _, d := range drives {
		names = append(names, d.name)
	}
	// extra appends the least-power drive's series, when it ran.
	extra := func(ss ...any) []figures.Series {
		var out []figures.Series
		for _, x := range ss {
			switch v := x.(type) {
			case figures.Series:
				out = append(out, v)
			case func(int) figures.Series:
				if len(drives) > 2 {
					out = append(out, v(2))
				}
			}
		}
		return out
	}
	if err := add(figures.Lines(r.Out, "frontmotor_fuel", figures.Axes{Title: r.Scenario.Name + ": fuel while ploughing (least-fuel engine speed and range)",
		X: "travel speed (km/h)", Y: "fuel (kg/h)", LegendBottom: true},
		extra(series(func(w row) float64 { return w.fuel }, names[0], false, 0), series(func(w row) float64 { return w.fuel }, names[1], false, 1),
			func(i int) figures.Series { return series(func(w row) float64 { return w.fuel }, names[i], true, i) })...)); err != nil {
		return err
	}
	if err := add(figures.Lines(r.Out, "frontmotor_slip", figures.Axes{Title: r.Scenario.Name + ": wheel slip while ploughing", X: "travel speed (km/h)", Y: "slip (%)"},
		series(func(w row) float64 { return w.slipF }, names[0]+": front", true, 0), series(func(w row) float64 { return w.slipR }, names[0]+": rear", false, 0),
		series(func(w row) float64 { return w.slipF }, names[1]+": front", true, 1), series(func(w row) float64 { return w.slipR }, names[1]+": rear", false, 1))); err != nil {
		return err
	}
	if err := add(figures.Lines(r.Out, "frontmotor_split", figures.Axes{Title: r.Scenario.Name + ": front axle's share of the wheel torque (front-axle motor)",
		X: "travel speed (km/h)", Y: "front share (%)"},
		extra(series(func(w row) float64 { return w.share }, names[1], false, 1),
			func(i int) figures.Series { return series(func(w row) float64 { return w.share }, names[i], true, i) })...)); err != nil {
		return err
	}
	if err := add(figures.Lines(r.Out, "frontmotor_turn", figures.Axes{Title: fmt.Sprintf("%s: headland turn, radius %.0f m: losses", r.Scenario.Name, float64(radius)),
		X: "travel speed (km/h)", Y: "power (kW)", LegendLeft: true},
		series(func(w row) float64 { return w.turnLoss }, names[0]+": driveline and tyre losses", false, 0),
		series(func(w row) float64 { return w.turnCirc }, names[0]+": circulating", true, 0),
		series(func(w row) float64 { return w.turnLoss }, names[1]+": driveline and tyre losses", false, 1))); err != nil {
		return err
	}
	csvPath := filepath.Join(r.Out, "frontmotor.csv")
	if err := demo.WriteFile(csvPath, func(w io.Writer) error {
		cw := csv.NewWriter(w)
		if err := cw.Write([]string{"drive", "speed_kmh", "plough_fuel_kg_per_h", "slip_front", "slip_rear", "front_torque_share",
			"turn_loss_kW", "turn_circulating_kW", "turn_fuel_kg_per_h"}); err != nil {
			return err
		}
		for i, d := range drives {
			for k, kmh := range speeds {
				w := rows[i][k]
				g := func(x float64) string { // a point beyond a limit is left empty
					if math.IsNaN(x) {
						return ""
					}
					return strconv.FormatFloat(x, 'g', 6, 64)
				}
				if err := cw.Write([]string{d.name, g(kmh), g(w.fuel), g(w.slipF / 100), g(w.slipR / 100), g(w.share / 100),
					g(w.turnLoss), g(w.turnCirc), g(w.turnFuel)}); err != nil {
					return err
				}
			}
		}
		cw.Flush()
		return cw.Error()
	}); err != nil {
		return err
	}
	r.Printf("\n")
	r.Wrote(append(files, csvPath)...)
	return nil
}
