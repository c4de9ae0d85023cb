// Command compare sizes three power-split designs for the same demo tractor
// — the input-coupled split it has, an output-coupled split and a compound
// split (two planetary sets, two mechanical points) — and runs each through
// the same working day, side by side.
//
//	go run ./examples/compare [-out folder] [-design file.json]
//
// It writes into the output folder: compare_efficiency.svg/.png
// (efficiency against travel speed, best range, for each design),
// compare_fuel.svg/.png (each alternative's fuel minus the first design's,
// segment by segment) and
// compare_<design>.csv (each design's day, step by step).
package main

import (
	"cmp"
	"fmt"
	"math"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/examples/internal/demo"
	"github.com/powersplit-dev/powersplit/examples/internal/figures"
	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
)

func main() {
	demo.Main("compare", "output-coupled, input-coupled and compound splits for the same tractor and day", run)
}

var study = units.RPM(1600)

// result is one design's study.
type result struct {
	t      demo.Transmission
	layout powersplit.Layout
	spans  []string
	ivs    []powersplit.SpeedInterval // every range's reachable speeds at the study speed
	sweep  powersplit.Sweep
	day    vehicle.Day
	fuel   vehicle.Fuel
	err    error
}

func run(r *demo.Run) error {
	sc := r.Scenario
	designs := append([]demo.Transmission{sc.Transmission}, sc.Alternatives...)
	if len(designs) < 2 {
		r.Printf("The design file has no alternatives to compare; add some under \"alternatives\".\n")
	}
	cycle, err := sc.Cycle()
	if err != nil {
		return err
	}
	eng, err := sc.BuildEngine()
	if err != nil {
		return err
	}
	full, err := eng.MaxTorque(study)
	if err != nil {
		return err
	}
	power := units.Power(0.75 * float64(units.PowerFromTorque(full, study)))
	dl := vehicle.Driveline{FinalDrive: sc.Tractor.FinalDrive, RollingRadius: sc.Tractor.Rear.Tyre.RollingRadius,
		Efficiency: sc.Tractor.FinalDriveEfficiency}
	kmh := func(w units.AngularVelocity) float64 { return dl.TravelSpeed(w, 0).KMH() }
	out := func(v float64) units.AngularVelocity { return dl.OutputSpeed(units.KMH(v), 0) }

	// Each design on its own goroutine: the day takes a few seconds.
	results := make([]*result, len(designs))
	ps := &demo.Stepper{Inner: vehicle.LeastFuel{}, Total: len(designs) * demo.CountSteps(cycle, sc.Step().Std()),
		Report: demo.Progress("simulating the day for each design", "time steps")}
	var wg sync.WaitGroup
	for i, t := range designs {
		res := &result{t: t}
		results[i] = res
		wg.Go(func() {
			res.layout, res.err = t.Layout()
			if res.err != nil {
				return
			}
			s := powersplit.NewSolver(res.layout)
			for rg := range res.layout.Ranges() {
				ivs, err := s.Interval(powersplit.Point{Range: rg, Input: study, Outputs: []powersplit.OutputDemand{{Speed: 1}}})
				if err != nil {
					res.spans = append(res.spans, res.layout.RangeName(rg)+": unreachable")
					continue
				}
				res.ivs = append(res.ivs, ivs...)
				for _, iv := range ivs {
					res.spans = append(res.spans, fmt.Sprintf("%s %s–%s", res.layout.RangeName(rg), demo.F(kmh(iv.Lo), 1, ""), demo.F(kmh(iv.Hi), 1, "km/h")))
				}
			}
			res.sweep, res.err = res.layout.Sweep(powersplit.SweepSpec{Design: t.Name, Range: powersplit.Auto, Input: study,
				From: out(1), To: out(50), Steps: 120, Power: power, Workers: 1})
			if res.err != nil {
				return
			}
			v, err := sc.Vehicle(t)
			if err != nil {
				res.err = err
				return
			}
			res.fuel = v.Engine().Fuel()
			res.day, res.err = vehicle.Simulate(v, ps, cycle, vehicle.Options{Step: sc.Step().Std()})
			res.day.Design = t.Name
		})
	}
	wg.Wait()
	ps.Finish()
	for _, res := range results {
		if res.err != nil {
			return fmt.Errorf("design %q: %w", res.t.Name, res.err)
		}
	}

	// The designs.
	r.Printf("Same engine, tyres, final drive and working day; only the transmission changes.\n")
	r.Heading("The designs (invented sizes, same engine, tyres and final drive)")
	tb := demo.NewTable(append([]string{""}, names(results)...)...)
	row := func(label string, f func(res *result) string) {
		cells := []string{label}
		for _, res := range results {
			cells = append(cells, f(res))
		}
		tb.Row(cells...)
	}
	row("ranges", func(res *result) string { return fmt.Sprintf("%d", len(res.t.Ranges)) })
	row("planetary sets (fixed-carrier ratio)", func(res *result) string {
		s := demo.F(res.t.Set.FixedCarrierRatio, 2, "")
		if res.t.Set2 != nil {
			s += " and " + demo.F(res.t.Set2.FixedCarrierRatio, 2, "")
		}
		return s
	})
	row("pump / motor", func(res *result) string {
		return demo.F(res.t.Pump.Displacement.CCPerRev(), 0, "") + " / " + demo.F(res.t.Motor.Displacement.CCPerRev(), 0, "cm³/rev")
	})
	row("relief pressure", func(res *result) string { return demo.F(float64(res.t.Relief)/1e5, 0, "bar") })
	tb.Write(r.W)
	r.Printf("\n  Speed span of each range at %v (theoretical travel speed):\n", study)
	for _, res := range results {
		r.Note(res.t.Name + ": " + strings.Join(res.spans, "; "))
	}
	for _, res := range results {
		r.Note(coverage(res.t.Name, res.ivs, kmh))
	}

	// Efficiency against speed.
	r.Heading(fmt.Sprintf("Transmission efficiency at %v and %s engine power, best range", study, demo.F(power.Kilowatts(), 0, "kW")))
	tb = demo.NewTable(append([]string{"travel speed"}, names(results)...)...)
	var series []figures.Series
	for _, res := range results {
		s := figures.Series{Name: fullNames([]*result{res})[0]}
		for i, c := range res.sweep.Cells() {
			s.X = append(s.X, kmh(res.sweep.Speeds[i]))
			if c.OK {
				s.Y = append(s.Y, 100*c.Efficiency)
			} else {
				s.Y = append(s.Y, math.NaN())
			}
		}
		series = append(series, s)
	}
	for _, at := range []float64{3, 6, 8, 12, 20, 30, 40} {
		cells := []string{demo.F(at, 0, "km/h")}
		for _, s := range series {
			cells = append(cells, valueAt(s, at))
		}
		tb.Row(cells...)
	}
	tb.Write(r.W)
	r.Printf("  \"—\": the design cannot carry that power at that speed (a limit crossed, or no range reaches it).\n")

	// The day side by side.
	r.Heading("The same working day, least-fuel strategy")
	tb = demo.NewTable(append([]string{"segment (fuel)"}, names(results)...)...)
	for k, g := range cycle {
		cells := []string{g.Name}
		for _, res := range results {
			s := res.day.Segments[k]
			if s.Err != nil {
				cells = append(cells, "cannot run")
				continue
			}
			cells = append(cells, demo.F(s.Audit.Volume(res.fuel).Litres(), 2, "L"))
		}
		tb.Row(cells...)
	}
	tb.Rule()
	var totals []float64
	rowDay := func(label string, f func(res *result, a vehicle.Audit) string) {
		cells := []string{label}
		for _, res := range results {
			cells = append(cells, f(res, res.day.Audit))
		}
		tb.Row(cells...)
	}
	rowDay("day fuel (segments that ran)", func(res *result, a vehicle.Audit) string {
		totals = append(totals, a.Volume(res.fuel).Litres())
		return demo.F(a.Volume(res.fuel).Litres(), 1, "L")
	})
	rowDay("segments that could not run", func(res *result, a vehicle.Audit) string {
		n := 0
		for _, s := range res.day.Segments {
			if s.Err != nil {
				n++
			}
		}
		return fmt.Sprintf("%d of %d", n, len(res.day.Segments))
	})
	rowDay("hydrostatic loss", func(res *result, a vehicle.Audit) string { return demo.F(a.Hydrostatic.Megajoules(), 1, "MJ") })
	rowDay("mechanical loss (with final drive)", func(res *result, a vehicle.Audit) string {
		return demo.F(a.Mechanical.Megajoules(), 1, "MJ")
	})
	rowDay("transmission efficiency, driving", func(res *result, a vehicle.Audit) string {
		in := a.EngineWork - a.PTOLoss - a.PTOWork
		if in <= 0 {
			return "—"
		}
		return demo.Pct(float64(in-a.Hydrostatic-a.Mechanical)/float64(in), 1)
	})
	rowDay("audit residual (relative)", func(res *result, a vehicle.Audit) string {
		return fmt.Sprintf("%.1e", a.RelativeResidual())
	})
	tb.Write(r.W)
	for _, res := range results {
		for _, s := range res.day.Segments {
			if s.Err != nil {
				r.Note(fmt.Sprintf("%s, %s: %s", res.t.Name, s.Name, demo.FirstLine(s.Err)))
			}
		}
	}
	r.Note("Transmission efficiency while driving is the engine's work into the transmission, less the PTO, " +
		"over what reaches the wheels (final drive included). A design that cannot run a segment is not " +
		"charged its fuel: compare the totals only where every segment ran.")

	// Files.
	r.Heading("Files")
	files, err := figures.Lines(r.Out, "compare_efficiency", figures.Axes{
		Title: fmt.Sprintf("%s: efficiency of each design at %v, %.0f kW", sc.Name, study, power.Kilowatts()),
		X:     "travel speed (km/h, no slip)", Y: "transmission efficiency (%)",
		YMin: 75, YMax: 97, LegendBottom: true, Note: demo.FigureCaution}, series...)
	if err != nil {
		return err
	}
	r.Wrote(files...)
	// Fuel: the alternatives' differences from the first design, segment by
	// segment (a 2 % difference is invisible in bars of the totals).
	var panels []figures.BarPanel
	for _, res := range results[1:] {
		var labels []string
		var diff []float64
		for k := range cycle {
			a, b := results[0].day.Segments[k], res.day.Segments[k]
			labels = append(labels, strconv.Itoa(k+1))
			if a.Err != nil || b.Err != nil {
				diff = append(diff, math.NaN())
				continue
			}
			diff = append(diff, b.Audit.Volume(res.fuel).Litres()-a.Audit.Volume(results[0].fuel).Litres())
		}
		panels = append(panels, figures.BarPanel{Axes: figures.Axes{Title: res.t.Name, X: "segment of the day (as in the table)", Y: "fuel difference (L)"},
			Labels: labels, Values: diff})
	}
	if len(panels) > 0 {
		files, err = figures.BarPanels(r.Out, "compare_fuel",
			sc.Name+": fuel per segment, each alternative minus the first design",
			"First design: "+results[0].t.Name+". Positive: the alternative burns more; a segment a design cannot run has no bar.", panels...)
		if err != nil {
			return err
		}
		r.Wrote(files...)
	}
	_ = totals
	for _, res := range results {
		path := filepath.Join(r.Out, "compare_"+demo.FileName(res.t.Kind)+".csv")
		if err := demo.WriteFile(path, res.day.WriteCSV); err != nil {
			return err
		}
		r.Wrote(path)
	}
	return nil
}

// names returns short column names: the designs' kinds.
func names(rs []*result) []string {
	out := make([]string, len(rs))
	for i, r := range rs {
		out[i] = r.t.Kind
	}
	return out
}

// fullNames returns the designs' names.
func fullNames(rs []*result) []string {
	out := make([]string, len(rs))
	for i, r := range rs {
		out[i] = r.t.Name
		if out[i] == "" {
			out[i] = r.t.Kind
		}
	}
	return out
}

// valueAt returns the series' value at the point nearest x, formatted.
func valueAt(s figures.Series, x float64) string {
	best, bi := math.Inf(1), -1
	for i, sx := range s.X {
		if d := math.Abs(sx - x); d < best {
			best, bi = d, i
		}
	}
	if bi < 0 || math.IsNaN(s.Y[bi]) {
		return "—"
	}
	return demo.F(s.Y[bi], 1, "%")
}

// coverage says whether the ranges together reach every forward speed from
// standstill to the design's top speed at the study engine speed: whether
// it can start from standstill, and where it has gaps between ranges.
func coverage(name string, ivs []powersplit.SpeedInterval, kmh func(units.AngularVelocity) float64) string {
	sorted := slices.Clone(ivs)
	slices.SortFunc(sorted, func(a, b powersplit.SpeedInterval) int { return cmp.Compare(a.Lo, b.Lo) })
	start := false
	var gaps []string
	reach := units.AngularVelocity(0)
	for _, iv := range sorted {
		if iv.Lo <= 0 && iv.Hi > 0 {
			start = true
		}
		if iv.Hi <= reach {
			continue
		}
		if iv.Lo > reach {
			gaps = append(gaps, fmt.Sprintf("%s to %s", demo.F(kmh(reach), 1, ""), demo.F(kmh(iv.Lo), 1, "km/h")))
		}
		reach = max(reach, iv.Hi)
	}
	var b strings.Builder
	b.WriteString(name + ": ")
	if start {
		b.WriteString("starts from standstill")
	} else {
		b.WriteString("CANNOT START FROM STANDSTILL (no range reaches zero travel speed)")
	}
	if len(gaps) == 0 {
		b.WriteString("; no speed gap")
	} else {
		b.WriteString("; SPEED GAPS (no range reaches these speeds): " + strings.Join(gaps, ", "))
	}
	b.WriteString("; top " + demo.F(kmh(reach), 1, "km/h") + " at " + study.String() + ".")
	return b.String()
}
