// Command design chooses a transmission for the demo tractor: from the
// requirements in its design file it explores a three-range input-coupled
// split — fixed-carrier ratio, pump gear, pump and motor sizes, the three
// range ratios and the final drive — over a space-filling sample of
// candidates, refines the best by Nelder–Mead, and reports the chosen
// design's feasibility, the Pareto front of fuel against hydrostat size,
// and the chosen design against the demo design over the same day.
//
//	go run ./examples/design [-out folder] [-design file.json] [-candidates 2000] [-seed 1]
//	go run ./examples/design -parts 8 -part 3 -out runs/   # one part of a split search
//	go run ./examples/design -parts 8 -merge -out runs/    # merge the parts and report
//
// It writes into the output folder: design_pareto.svg/.png (fuel against
// installed displacement, every feasible candidate and the front),
// design_effort_chosen.svg/.png and design_effort_demo.svg/.png (full-load
// tractive-effort diagrams), design_effort_*.csv, design_candidates.csv
// (every candidate, with its reason when infeasible) and
// chosen_design.json (the chosen design as a design file).
package main

import (
	"cmp"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"time"

	"github.com/powersplit-dev/powersplit/examples/internal/demo"
	"github.com/powersplit-dev/powersplit/examples/internal/figures"
	"github.com/powersplit-dev/powersplit/vehicle"
	"github.com/powersplit-dev/powersplit/vehicle/design"
)

var (
	candidates        = 2000
	seed       uint64 = 1
	part              = -1
	parts             = 0
	merge      bool
	workers    = 0
)

func main() {
	demo.MainFlags("design", "choose a three-range input-coupled split for the demo tractor's requirements", func(fs *flag.FlagSet) {
		fs.IntVar(&candidates, "candidates", candidates, "candidates in the space-filling sample")
		fs.Uint64Var(&seed, "seed", seed, "seed of the sample's scrambling")
		fs.IntVar(&parts, "parts", parts, "split the search into this many parts (with -part or -merge)")
		fs.IntVar(&part, "part", part, "run only this part (0-based; default: the array job's index from JOB_COMPLETION_INDEX or SLURM_ARRAY_TASK_ID when -parts is set)")
		fs.BoolVar(&merge, "merge", merge, "merge the parts' files in the output folder and report")
		fs.IntVar(&workers, "workers", workers, "goroutines (default: GOMAXPROCS)")
	}, run)
}

// space is the design space around the demo's input-coupled split.
func space() design.Space {
	return design.Space{Name: "demo three-range input-coupled split", Params: []design.Param{
		{Name: design.ParamFixedCarrierRatio, Lo: -3.5, Hi: -1.8},
		{Name: design.ParamPumpRatio, Lo: 0.8, Hi: 1.5},
		{Name: design.ParamPumpDisplacement, Lo: 60, Hi: 140},
		{Name: design.ParamMotorDisplacement, Lo: 60, Hi: 140},
		{Name: "range1", Lo: 0.12, Hi: 0.25},
		{Name: "range2", Lo: 0.3, Hi: 0.55},
		{Name: "range3", Lo: 0.8, Hi: 1.2},
		{Name: design.ParamFinalDrive, Lo: 11, Hi: 16},
	}}
}

// partIndex returns the part to run: -part, or the batch scheduler's
// array index.
func partIndex() (int, error) {
	if part >= 0 {
		return part, nil
	}
	for _, env := range []string{"JOB_COMPLETION_INDEX", "SLURM_ARRAY_TASK_ID"} {
		if v := os.Getenv(env); v != "" {
			var k int
			if _, err := fmt.Sscanf(v, "%d", &k); err != nil {
				return 0, fmt.Errorf("%s=%q is not a part index", env, v)
			}
			return k, nil
		}
	}
	return -1, nil
}

func run(r *demo.Run) error {
	sc := r.Scenario
	if sc.Requirements == nil {
		return fmt.Errorf("%s states no requirements: add a \"requirements\" object", sc.Source())
	}
	// The base design: the file's three-range input-coupled split.
	base := *sc
	found := false
	for _, t := range append([]design.Transmission{sc.Transmission}, sc.Alternatives...) {
		if t.Kind == "input-coupled" && len(t.Ranges) == 3 {
			base.Transmission, found = t, true
			break
		}
	}
	if !found {
		return fmt.Errorf("%s has no three-range input-coupled transmission to start from", sc.Source())
	}
	p, err := base.SplitProblem(space(), nil)
	if err != nil {
		return err
	}
	ex := design.Explore{Problem: p, Seed: seed, Candidates: candidates, Workers: workers}
	start := time.Now()
	var rs []design.Result
	k, err := partIndex()
	if err != nil {
		return err
	}
	switch {
	case parts > 0 && !merge:
		if k < 0 {
			return fmt.Errorf("-parts %d needs -part, JOB_COMPLETION_INDEX or SLURM_ARRAY_TASK_ID", parts)
		}
		ex.Part, ex.Parts = k, parts
		ex.Progress = demo.Progress(fmt.Sprintf("part %d of %d", k, parts), "candidates")
		path := design.PartFile(r.Out, k, parts)
		res, skipped, err := ex.RunPart(path)
		if err != nil {
			return err
		}
		if skipped {
			r.Printf("part %d of %d is already complete in %s: skipped.\n", k, parts, path)
		} else {
			el := time.Since(start)
			r.Printf("part %d of %d: %d candidates in %v (%.0f candidates/s)\n", k, parts, len(res), el.Round(time.Millisecond), float64(len(res))/el.Seconds())
			r.Wrote(path)
		}
		return nil
	case merge:
		if parts < 1 {
			return fmt.Errorf("-merge needs -parts")
		}
		ex.Parts = parts
		var files []string
		for k := range parts {
			files = append(files, design.PartFile(r.Out, k, parts))
		}
		if rs, err = ex.Merge(files...); err != nil {
			return err
		}
		r.Printf("merged %d parts: %d candidates\n", parts, len(rs))
	default:
		ex.Progress = demo.Progress("exploring the design space", "candidates")
		if rs, err = ex.Run(); err != nil {
			return err
		}
	}
	explored := time.Since(start)
	return report(r, sc, &base, p, rs, explored)
}

func report(r *demo.Run, sc *design.File, base *design.File, p design.Problem, rs []design.Result, explored time.Duration) error {
	feasible := 0
	reasons := map[string]int{}
	for _, c := range rs {
		if c.Feasible {
			feasible++
			continue
		}
		for _, why := range strings.Split(c.Reason, "; ") {
			reasons[why]++
		}
	}
	r.Heading("Exploration")
	if merge {
		r.Printf("%d candidates (seed %d) over %d parameters, merged from %d parts; %d feasible.\n",
			len(rs), seed, p.Space.Free(), parts, feasible)
	} else {
		r.Printf("%d candidates (seed %d) over %d parameters in %v on %d cores: %.0f candidates/s; %d feasible.\n",
			len(rs), seed, p.Space.Free(), explored.Round(time.Millisecond), runtime.GOMAXPROCS(0), float64(len(rs))/explored.Seconds(), feasible)
	}
	type tally struct {
		why string
		n   int
	}
	var ts []tally
	for why, n := range reasons {
		ts = append(ts, tally{why, n})
	}
	slices.SortFunc(ts, func(a, b tally) int { return cmp.Or(b.n-a.n, strings.Compare(a.why, b.why)) })
	tb := demo.NewTable("requirement missed", "candidates")
	for _, t := range ts {
		tb.Row(t.why, fmt.Sprint(t.n))
	}
	tb.Write(r.W)
	best, ok := design.Best(rs, nil)
	if !ok {
		return fmt.Errorf("no candidate meets the requirements: widen the space or relax them")
	}
	t0 := time.Now()
	refined, err := design.Refine(p, best, design.RefineSpec{Evaluations: 150})
	if err != nil {
		r.Printf("refinement stopped: %v\n", demo.FirstLine(err))
	}
	r.Printf("best candidate %d: %.3f kg over the spectrum; refined by Nelder–Mead in %v: %.3f kg.\n",
		best.Index, best.Objectives[0], time.Since(t0).Round(time.Millisecond), refined.Objectives[0])

	// The Pareto front of fuel against installed displacement.
	front := design.Pareto(rs, 0, 1)
	r.Heading("Pareto front: fuel over the duty spectrum against installed displacement")
	tb = demo.NewTable(append([]string{"candidate", "fuel", "pump + motor", "peak pressure"}, p.Space.Names()...)...)
	for _, m := range front {
		row := []string{fmt.Sprint(m.Index), demo.F(m.Objectives[0], 2, "kg"), demo.F(m.Objectives[1], 0, "cm³/rev"), demo.F(m.Objectives[2], 0, "bar")}
		for _, x := range m.X {
			row = append(row, demo.F(x, 3, ""))
		}
		tb.Row(row...)
	}
	tb.Write(r.W)

	chosen, err := base.Apply(p.Space, refined.X)
	if err != nil {
		return err
	}
	chosen.Name = sc.Name + ", chosen by search"
	chosen.Transmission.Name = "chosen three-range input-coupled split"
	r.Heading("Feasibility of the chosen design")
	rep, err := chosen.Check(chosen.Transmission, sc.Requirements)
	if err != nil {
		return err
	}
	if err := rep.WriteText(r.W); err != nil {
		return err
	}
	r.Heading("The demo design against the same requirements")
	demoRep, err := sc.Check(sc.Transmission, sc.Requirements)
	if err != nil {
		return err
	}
	if err := demoRep.WriteText(r.W); err != nil {
		return err
	}

	// The same day for both.
	r.Heading("The working day: chosen design against the demo design")
	tb = demo.NewTable("design", "fuel", "segments not run")
	for _, d := range []struct {
		name string
		f    *design.File
	}{{"demo: " + sc.Transmission.Name, sc}, {"chosen", chosen}} {
		v, err := d.f.Vehicle(d.f.Transmission)
		if err != nil {
			return err
		}
		cycle, err := d.f.Cycle()
		if err != nil {
			return err
		}
		day, err := vehicle.Simulate(v, vehicle.LeastFuel{}, cycle, vehicle.Options{Step: d.f.Step().Std(),
			Progress: demo.Progress("simulating the day ("+d.name+")", "time steps")})
		if err != nil {
			return err
		}
		failed := 0
		for _, s := range day.Segments {
			if s.Err != nil {
				failed++
			}
		}
		tb.Row(d.name, demo.F(float64(day.Audit.Fuel), 1, "kg"), fmt.Sprint(failed))
	}
	tb.Write(r.W)

	// Files.
	var wrote []string
	path := filepath.Join(r.Out, "chosen_design.json")
	if err := chosen.Save(path); err != nil {
		return err
	}
	wrote = append(wrote, path)
	path = filepath.Join(r.Out, "design_candidates.csv")
	if err := demo.WriteFile(path, func(w io.Writer) error {
		return design.WriteCSV(w, design.Header{Space: p.Space.Name, Fingerprint: p.Space.Fingerprint(), Seed: seed,
			Candidates: len(rs), Parts: 1, Version: design.Version(), Params: p.Space.Names(), Objectives: p.Objectives}, rs)
	}); err != nil {
		return err
	}
	wrote = append(wrote, path)
	var all, pf figures.Series
	all.Name, all.Points = "feasible candidates", true
	pf.Name = "Pareto front"
	for _, c := range rs {
		if c.Feasible {
			all.X, all.Y = append(all.X, c.Objectives[1]), append(all.Y, c.Objectives[0])
		}
	}
	for _, m := range front {
		pf.X, pf.Y = append(pf.X, m.Objectives[1]), append(pf.Y, m.Objectives[0])
	}
	files, err := figures.Lines(r.Out, "design_pareto", figures.Axes{Title: r.Scenario.Name + ": fuel over the duty spectrum against hydrostat size",
		X: "installed displacement, pump + motor (cm³/rev)", Y: "fuel (kg)"}, all, pf)
	if err != nil {
		return err
	}
	wrote = append(wrote, files...)
	for _, d := range []struct {
		name string
		f    *design.File
	}{{"demo", sc}, {"chosen", chosen}} {
		files, err := effort(r, d.name, d.f)
		if err != nil {
			return err
		}
		wrote = append(wrote, files...)
	}
	r.Heading("Files")
	r.Wrote(wrote...)
	return nil
}

// effort writes the full-load tractive-effort diagram of a design on the
// day's field surface.
func effort(r *demo.Run, name string, f *design.File) ([]string, error) {
	v, err := f.Vehicle(f.Transmission)
	if err != nil {
		return nil, err
	}
	surface := ""
	for _, g := range f.Day.Segments {
		if g.Kind == "field" && g.Surface != "" {
			surface = g.Surface
			break
		}
	}
	ground, err := f.Ground(surface)
	if err != nil {
		return nil, err
	}
	pts, err := design.TractiveEffort(v, design.EffortSpec{Ground: ground})
	if err != nil {
		return nil, err
	}
	names := f.Transmission.RangeNames()
	path := filepath.Join(r.Out, "design_effort_"+name+".csv")
	if err := demo.WriteFile(path, func(w io.Writer) error { return design.WriteEffortCSV(w, pts, names) }); err != nil {
		return nil, err
	}
	series := make([]figures.Series, len(names))
	for i := range series {
		series[i].Name = "range " + names[i]
	}
	for _, p := range pts {
		y := float64(p.Pull) / 1e3
		if !p.Feasible {
			y = nan
		}
		series[p.Range].X = append(series[p.Range].X, p.Speed.KMH())
		series[p.Range].Y = append(series[p.Range].Y, y)
	}
	files, err := figures.Lines(r.Out, "design_effort_"+name, figures.Axes{
		Title: fmt.Sprintf("%s: full-load tractive effort, %s design, %s, engine at %.0f rpm", r.Scenario.Name, name, surface, v.Engine().Rated().RPM()),
		X:     "travel speed (km/h)", Y: "drawbar pull (kN)", Note: demo.FigureCaution}, series...)
	return append([]string{path}, files...), err
}

var nan = math.NaN()
