// Command traction studies the demo tractor's tyres on the ASABE D497 soils:
// the pull, slip and tractive efficiency it reaches on each soil, and what a
// front axle driven by its own motor (independent) gains over the
// mechanical front drive with a fixed 2 % lead, straight ahead and in a
// turn.
//
//	go run ./examples/traction [-out folder] [-design file.json]
//
// It writes tractive_efficiency.svg/.png (tractive efficiency against slip
// per soil, the recommended slip band shaded), pull_slip.svg/.png (drawbar
// pull against slip, with the working pull) and traction.csv (the curves)
// into the output folder.
package main

import (
	"encoding/csv"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit/examples/internal/demo"
	"github.com/powersplit-dev/powersplit/examples/internal/figures"
	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

func main() {
	demo.Main("traction", "pull, slip and tractive efficiency of the demo tractor on each soil", run)
}

// soil is one surface of the study.
type soil struct {
	surface traction.Surface
	class   traction.Class
}

func soils() []soil {
	return []soil{
		{traction.HardSoil(), traction.ClassHard},
		{traction.FirmSoil(), traction.ClassFirm},
		{traction.TilledSoil(), traction.ClassTilled},
		{traction.SoftSoil(), traction.ClassSoft},
	}
}

// curve is the vehicle's state over a sweep of drawbar pull.
type curve struct {
	name        string
	pull        []float64 // kN
	slip        []float64 // rear-axle slip, fraction
	efficiency  []float64 // tractive efficiency, fraction
	best        traction.Drive
	bestPull    units.Force
	maxPull     units.Force
	maxPullSlip float64
}

func run(r *demo.Run) error {
	sc := r.Scenario
	veh := sc.TractionVehicle()
	if err := veh.Validate(); err != nil {
		return err
	}
	lead := sc.Tractor.FrontLead
	speed := units.KMH(7)
	model := traction.Brixius{}

	r.Printf("Tractor: %v, wheelbase %v, front tyres %v × %v, rear tyres %v × %v,\n",
		sc.Tractor.Mass, sc.Tractor.Wheelbase, sc.Tractor.Front.Tyre.Diameter, sc.Tractor.Front.Tyre.Width,
		sc.Tractor.Rear.Tyre.Diameter, sc.Tractor.Rear.Tyre.Width)
	r.Printf("mechanical front drive with a %s lead; Brixius (1987) traction model as in ASABE D497.7;\n", demo.Pct(lead, 1))
	r.Printf("travel speed %v, drawbar pull horizontal at the hitch (%v high).\n", speed, sc.Tractor.HitchHeight)

	// 1. Pull, slip and tractive efficiency per soil.
	r.Heading("Pull, slip and tractive efficiency on each soil (fixed lead)")
	var curves []curve
	tb := demo.NewTable("soil", "cone index", "best TE", "at pull", "at slip", "D497 slip range", "D497 drawbar/PTO (MFWD)", "max pull", "at slip")
	for _, s := range soils() {
		c, err := sweep(veh, model, s.surface, speed, lead)
		if err != nil {
			return fmt.Errorf("%s: %w", s.surface.Name, err)
		}
		curves = append(curves, c)
		rec, recErr := traction.Recommended(s.class)
		slipRange, te := "not tabulated", "not tabulated"
		if recErr == nil {
			slipRange = demo.Pct(rec.SlipLow, 0) + " to " + demo.Pct(rec.SlipHigh, 0)
			te = demo.Pct(rec.DrawbarPTOFrontAssist, 0)
		}
		tb.Row(s.surface.Name, demo.F(float64(s.surface.ConeIndex)/1e3, 0, "kPa"), demo.Pct(c.best.Efficiency, 1),
			demo.F(c.bestPull.Kilonewtons(), 1, "kN"), demo.Pct(c.best.Rear.Wheel.Slip, 1), slipRange, te,
			demo.F(c.maxPull.Kilonewtons(), 1, "kN"), demo.Pct(c.maxPullSlip, 1))
	}
	tb.Write(r.W)
	r.Printf("  Slip is the rear axle's (the front axle slips more by the lead). Tractive efficiency is the\n")
	r.Printf("  drawbar power over the wheels' input power. D497 columns: recommended slip and the typical\n")
	r.Printf("  ratio of drawbar power to PTO power of a front-wheel-assist tractor (from memory); that\n")
	r.Printf("  ratio includes the driveline's losses: compare it with best TE times a transmission\n")
	r.Printf("  efficiency, not with the TE itself.\n")

	// 2. Independent front drive against the fixed lead, straight ahead.
	pull, what := workingPull(sc, speed)
	r.Printf("\nWorking pull for the comparisons below: %s (%s).\n", demo.F(pull.Kilonewtons(), 1, "kN"), what)
	r.Heading(fmt.Sprintf("Independent front drive against a fixed %s lead, straight, at %s pull", demo.Pct(lead, 0), demo.F(pull.Kilonewtons(), 1, "kN")))
	tb = demo.NewTable("soil", "drive", "slip F / R", "torque share F", "wheel power", "drawbar power", "circulating", "TE")
	for _, s := range soils() {
		op := traction.Operation{Pull: pull, Speed: speed}
		fixed, errF := veh.FixedRatio(model, s.surface, op, lead)
		ind, errI := veh.Independent(model, s.surface, op)
		for _, d := range []struct {
			name string
			dr   traction.Drive
			err  error
		}{{"fixed lead", fixed, errF}, {"independent", ind, errI}} {
			if d.err != nil {
				tb.Row(s.surface.Name, d.name, "cannot give the pull: "+short(d.err), "", "", "", "", "")
				continue
			}
			tb.Row(s.surface.Name, d.name, demo.Pct(d.dr.Front.Wheel.Slip, 1)+" / "+demo.Pct(d.dr.Rear.Wheel.Slip, 1),
				demo.Pct(d.dr.TorqueShare, 0), demo.F(d.dr.InputPower.Kilowatts(), 1, "kW"),
				demo.F(d.dr.DrawbarPower.Kilowatts(), 1, "kW"), demo.F(d.dr.CirculatingPower.Kilowatts(), 2, "kW"),
				demo.Pct(d.dr.Efficiency, 1))
		}
		if errF == nil && errI == nil {
			tb.Row("", "gain", "", "", demo.F((fixed.InputPower-ind.InputPower).Kilowatts(), 2, "kW"), "", "",
				demo.F(100*(ind.Efficiency-fixed.Efficiency), 2, "points"))
		}
		tb.Rule()
	}
	tb.Write(r.W)

	// 3. In a turn: the fixed lead against the speed ratio the turn needs.
	firm := traction.FirmSoil()
	turnPull := units.Kilonewtons(5)
	turnSpeed := units.KMH(5)
	r.Heading(fmt.Sprintf("Turning on firm soil at %v with %v pull (implement raised, headland)", turnSpeed, turnPull))
	tb = demo.NewTable("rear radius", "front/rear speed", "drive", "wheel power", "circulating (wind-up)", "TE")
	for _, rad := range []float64{5, 8, 12, 20, 40} {
		radius := units.Metres(rad)
		op := traction.Operation{Pull: turnPull, Speed: turnSpeed}
		fixed, geo, errF := veh.FixedRatioTurn(model, firm, op, lead, radius)
		ind, _, errI := veh.IndependentTurn(model, firm, op, radius)
		if errF != nil && errI != nil {
			tb.Row(demo.F(rad, 0, "m"), "", "both drives", "cannot turn: "+short(errF), "", "")
			continue
		}
		ratio := demo.F(geo.SpeedRatio, 3, "")
		for _, d := range []struct {
			name string
			dr   traction.Drive
			err  error
		}{{"fixed lead", fixed, errF}, {"independent", ind, errI}} {
			if d.err != nil {
				tb.Row(demo.F(rad, 0, "m"), ratio, d.name, "cannot turn: "+short(d.err), "", "")
				continue
			}
			tb.Row(demo.F(rad, 0, "m"), ratio, d.name, demo.F(d.dr.InputPower.Kilowatts(), 2, "kW"),
				demo.F(d.dr.CirculatingPower.Kilowatts(), 2, "kW"), demo.Pct(d.dr.Efficiency, 1))
			ratio = ""
		}
		tb.Rule()
	}
	tb.Write(r.W)
	r.Printf("  In a tight turn the front axle must run faster than the rear by the ratio shown; a fixed\n")
	r.Printf("  %s lead falls short, the front wheels brake and the rear ones push: wind-up power\n", demo.Pct(lead, 0))
	r.Printf("  circulates through the driveline. Negative slips extrapolate the traction equations\n")
	r.Printf("  (fitted to driving wheels): read the wind-up figures as estimates.\n")

	// 4. Ballast for the plough's pull.
	target := 0.09
	if rec, err := traction.Recommended(traction.ClassFirm); err == nil {
		target = (rec.SlipLow + rec.SlipHigh) / 2
	}
	r.Heading(fmt.Sprintf("Ballast for %s pull at %s slip (mid of the D497 range) on firm soil", demo.F(pull.Kilonewtons(), 1, "kN"), demo.Pct(target, 0)))
	adv, err := veh.Ballast(model, firm, traction.Operation{Pull: pull, Speed: speed}, traction.FrontWheelAssist, traction.Towed, target)
	if err != nil {
		r.Printf("  no advice: %v\n", err)
	} else {
		tb = demo.NewTable("quantity", "value")
		tb.Row("recommended front share (static)", demo.Pct(adv.FrontShare, 0))
		tb.Row("operating mass for the pull", demo.F(adv.Mass.Kilograms()/1000, 2, "t"))
		tb.Row("ballast to add (negative: remove)", demo.F(adv.Ballast.Kilograms(), 0, "kg"))
		tb.Row("  on the front axle", demo.F(adv.FrontBallast.Kilograms(), 0, "kg"))
		tb.Row("  on the rear axle", demo.F(adv.RearBallast.Kilograms(), 0, "kg"))
		tb.Row("front tyres above rating", strconv.FormatBool(adv.FrontOverloaded))
		tb.Row("rear tyres above rating", strconv.FormatBool(adv.RearOverloaded))
		tb.Write(r.W)
		r.Note(ballastVerdict(sc.Tractor.Ballast, adv))
		r.Note("Caution: " + adv.Caution)
	}

	// Figure and CSV.
	r.Heading("Files")
	var series, pulls []figures.Series
	for _, c := range curves {
		series = append(series, figures.Series{Name: c.name, X: scale(c.slip, 100), Y: scale(c.efficiency, 100)})
		pulls = append(pulls, figures.Series{Name: c.name, X: scale(c.slip, 100), Y: c.pull})
	}
	var band *figures.Band
	if rec, err := traction.Recommended(traction.ClassFirm); err == nil {
		band = &figures.Band{Name: "recommended slip on firm soil (ASABE D497)", From: 100 * rec.SlipLow, To: 100 * rec.SlipHigh}
	}
	files, err := figures.Lines(r.Out, "tractive_efficiency",
		figures.Axes{Title: sc.Name + ": tractive efficiency against slip (fixed lead, 7 km/h)",
			X: "rear-axle slip (%)", Y: "tractive efficiency (%)", YMin: 0, YMax: 100, XMin: 0, XMax: 40, Band: band,
			LegendBottom: true, Note: demo.FigureCaution}, series...)
	if err != nil {
		return err
	}
	r.Wrote(files...)
	files, err = figures.Lines(r.Out, "pull_slip",
		figures.Axes{Title: sc.Name + ": drawbar pull against slip (fixed lead, 7 km/h)",
			X: "rear-axle slip (%)", Y: "drawbar pull (kN)", XMin: 0, XMax: 40, Band: band, LegendBottom: true,
			Limits: []figures.Limit{{Name: "working pull " + demo.F(pull.Kilonewtons(), 1, "kN"), Y: pull.Kilonewtons()}},
			Note:   demo.FigureCaution}, pulls...)
	if err != nil {
		return err
	}
	r.Wrote(files...)
	path := filepath.Join(r.Out, "traction.csv")
	if err := writeCSV(path, sc.Name, speed, curves); err != nil {
		return err
	}
	r.Wrote(path)
	return nil
}

// workingPull returns the draft of the day's first field implement at
// speed v, or 25 kN when the day has none.
func workingPull(sc *demo.Scenario, v units.Speed) (units.Force, string) {
	for _, g := range sc.Day.Segments {
		if g.Kind != "field" {
			continue
		}
		im, err := sc.Implement(g.Implement)
		if err != nil {
			break
		}
		d, err := im.Draft(v)
		if err != nil {
			break
		}
		return d, fmt.Sprintf("the %s's ASABE D497 draft at %v", g.Implement, v)
	}
	return units.Kilonewtons(25), "a typical heavy pull; the day has no field work"
}

// sweep runs the vehicle with the fixed lead over drawbar pulls from light
// to the most the soil gives.
func sweep(veh traction.Vehicle, m traction.Model, s traction.Surface, v units.Speed, lead float64) (curve, error) {
	c := curve{name: s.Name}
	weight := veh.Weight()
	const n = 80
	for i := 1; i <= n; i++ {
		p := units.Force(float64(weight) * 0.95 * float64(i) / n)
		d, err := veh.FixedRatio(m, s, traction.Operation{Pull: p, Speed: v}, lead)
		if err != nil {
			if errors.Is(err, traction.ErrPull) || errors.Is(err, traction.ErrUnstable) {
				break
			}
			return c, err
		}
		c.pull = append(c.pull, p.Kilonewtons())
		c.slip = append(c.slip, d.Rear.Wheel.Slip)
		c.efficiency = append(c.efficiency, d.Efficiency)
		if d.Efficiency > c.best.Efficiency {
			c.best, c.bestPull = d, p
		}
		c.maxPull, c.maxPullSlip = p, d.Rear.Wheel.Slip
	}
	if len(c.pull) == 0 {
		return c, fmt.Errorf("no pull could be given")
	}
	return c, nil
}

func scale(xs []float64, k float64) []float64 {
	out := make([]float64, len(xs))
	for i, x := range xs {
		out[i] = k * x
	}
	return out
}

func writeCSV(path, design string, speed units.Speed, curves []curve) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := csv.NewWriter(f)
	_ = w.Write([]string{"design", "soil", "speed_kmh", "pull_kN", "rear_slip_pct", "tractive_efficiency_pct"})
	for _, c := range curves {
		for i := range c.pull {
			_ = w.Write([]string{design, c.name, strconv.FormatFloat(speed.KMH(), 'g', 6, 64), strconv.FormatFloat(c.pull[i], 'g', 6, 64),
				strconv.FormatFloat(100*c.slip[i], 'g', 6, 64), strconv.FormatFloat(100*c.efficiency[i], 'g', 6, 64)})
		}
	}
	w.Flush()
	if err := w.Error(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// short returns an error's message, shortened for a table cell.
func short(err error) string {
	var pe *traction.PullError
	if errors.As(err, &pe) {
		return "limit " + demo.F(pe.Limit.Kilonewtons(), 1, "kN")
	}
	s := err.Error()
	if len(s) > 60 {
		s = s[:57] + "..."
	}
	return s
}

// ballastVerdict says whether the advice can be followed: never removing
// more than the fitted ballast, never beyond the permissible mass or a
// tyre's rated load.
func ballastVerdict(fitted units.Mass, adv traction.BallastAdvice) string {
	kg := func(m units.Mass) string { return demo.F(m.Kilograms(), 0, "kg") }
	var v string
	switch {
	case adv.FrontOverloaded || adv.RearOverloaded:
		v = "Not permissible: the advised mass loads a tyre beyond its rating. Pull less (a narrower implement) or accept more slip."
	case adv.Bound == "fitted ballast":
		v = "The tractor is heavier than the pull needs (" + kg(adv.PullMass) + ") even without its " + kg(fitted) +
			" of fitted ballast: remove it all; the rest is the tractor's own mass."
	case adv.Bound != "":
		v = "Held at " + kg(adv.Mass) + " by the " + adv.Bound + ": the pull asks for " + kg(adv.PullMass) +
			", so the target slip is not reached. Pull less or accept more slip."
	case adv.Ballast < 0:
		v = "Within limits: remove " + kg(-adv.Ballast) + " of the " + kg(fitted) + " of fitted ballast for this pull."
	default:
		v = "Within limits: add " + kg(adv.Ballast) + " for this pull."
	}
	v += " The advice keeps to: " + strings.Join(adv.Respects, ", ") + "."
	if len(adv.NotChecked) > 0 {
		v += " Not checked (not in the design file): " + strings.Join(adv.NotChecked, ", ") + "."
	}
	return v
}
