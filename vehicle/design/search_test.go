package design

import (
	"errors"
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"
	"pgregory.net/rapid"
)

// toyProblem has two objectives that pull apart (a Pareto front along
// x0 + x1 = const) and a constraint that cuts a corner off.
func toyProblem() Problem {
	return Problem{
		Space: Space{Name: "toy", Params: []Param{
			{Name: "x0", Lo: 0, Hi: 1},
			{Name: "fixed", Fixed: true, Value: 2},
			{Name: "teeth", Lo: 10, Hi: 40, Integer: true},
			{Name: "x1", Lo: -1, Hi: 1},
		}},
		Objectives: []string{"cost", "size"},
		Evaluate: func(x []float64) ([]float64, string) {
			if x[0]+x[3] > 1.5 {
				return nil, fmt.Sprintf("x0 + x1 = %.3g above 1.5", x[0]+x[3])
			}
			return []float64{(x[0]-0.2)*(x[0]-0.2) + x[2]/100, (x[3]+1)*(x[3]+1) + x[0]}, ""
		},
	}
}

var equateNaN = cmpopts.EquateNaNs()

func TestExploreWorkers(t *testing.T) {
	t.Parallel()
	p := toyProblem()
	one, err := Explore{Problem: p, Seed: 7, Candidates: 200, Workers: 1}.Run()
	if err != nil {
		t.Fatal(err)
	}
	var calls []int
	many, err := Explore{Problem: p, Seed: 7, Candidates: 200, Workers: 5,
		Progress: func(done, total int) { calls = append(calls, done) }}.Run()
	if err != nil {
		t.Fatal(err)
	}
	if diff := cmp.Diff(one, many, equateNaN); diff != "" {
		t.Errorf("1 worker and 5 workers differ:\n%s", diff)
	}
	if len(calls) != 200 || calls[199] != 200 {
		t.Errorf("progress called %d times, last %v; want 200, 200", len(calls), calls[len(calls)-1:])
	}
	// Candidate i depends only on (space, seed, i).
	for _, i := range []int{0, 17, 199} {
		if got := Candidate(p.Space, 7, i); !cmp.Equal(got, one[i].X) {
			t.Errorf("Candidate(%d) = %v, run gave %v", i, got, one[i].X)
		}
	}
	feasible := 0
	for _, r := range one {
		if r.Feasible {
			feasible++
		} else if r.Reason == "" {
			t.Errorf("infeasible candidate %d without a reason", r.Index)
		}
	}
	if feasible == 0 || feasible == len(one) {
		t.Errorf("%d of %d feasible; the toy constraint should cut some", feasible, len(one))
	}
}

// TestMergedPartsEqualOneRun (property): any split into parts, run to
// files and merged, equals one run; running a complete part again skips it.
func TestMergedPartsEqualOneRun(t *testing.T) {
	t.Parallel()
	p := toyProblem()
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 80).Draw(t, "candidates")
		parts := rapid.IntRange(1, 6).Draw(t, "parts")
		seed := rapid.Uint64().Draw(t, "seed")
		whole, err := Explore{Problem: p, Seed: seed, Candidates: n, Workers: 2}.Run()
		if err != nil {
			t.Fatal(err)
		}
		dir, err := os.MkdirTemp("", "design-parts-")
		if err != nil {
			t.Fatal(err)
		}
		defer os.RemoveAll(dir)
		var files []string
		for k := range parts {
			e := Explore{Problem: p, Seed: seed, Candidates: n, Part: k, Parts: parts, Workers: 1 + k%3}
			path := PartFile(dir, k, parts)
			if _, skipped, err := e.RunPart(path); err != nil || skipped {
				t.Fatalf("part %d: skipped %v, %v", k, skipped, err)
			}
			if _, skipped, err := e.RunPart(path); err != nil || !skipped {
				t.Fatalf("part %d again: skipped %v, %v; want skipped", k, skipped, err)
			}
			files = append(files, path)
		}
		merged, err := Explore{Problem: p, Seed: seed, Candidates: n, Parts: parts}.Merge(files...)
		if err != nil {
			t.Fatal(err)
		}
		if diff := cmp.Diff(whole, merged, equateNaN, cmpopts.EquateEmpty()); diff != "" {
			t.Fatalf("merged parts differ from one run:\n%s", diff)
		}
		if parts > 1 {
			if _, err := (Explore{Problem: p, Seed: seed, Candidates: n, Parts: parts}).Merge(files[1:]...); err == nil {
				t.Fatal("Merge with a part missing = nil error")
			}
			if _, err := (Explore{Problem: p, Seed: seed + 1, Candidates: n, Parts: parts}).Merge(files...); err == nil {
				t.Fatal("Merge of another seed's parts = nil error")
			}
		}
	})
}

// TestParetoProperty: every Pareto member is feasible and no evaluated
// feasible candidate dominates it; every feasible candidate left out is
// dominated by a member.
func TestParetoProperty(t *testing.T) {
	t.Parallel()
	p := toyProblem()
	rapid.Check(t, func(t *rapid.T) {
		seed := rapid.Uint64().Draw(t, "seed")
		n := rapid.IntRange(1, 150).Draw(t, "candidates")
		rs, err := Explore{Problem: p, Seed: seed, Candidates: n, Workers: 1}.Run()
		if err != nil {
			t.Fatal(err)
		}
		front := Pareto(rs)
		in := map[int]bool{}
		for _, m := range front {
			in[m.Index] = true
			if !m.Feasible {
				t.Fatalf("member %d infeasible", m.Index)
			}
			for _, r := range rs {
				if Dominates(r, m) {
					t.Fatalf("member %d %v dominated by %d %v", m.Index, m.Objectives, r.Index, r.Objectives)
				}
			}
		}
		for _, r := range rs {
			if r.Feasible && !in[r.Index] {
				dominated := false
				for _, m := range front {
					dominated = dominated || Dominates(m, r) || cmp.Equal(m.Objectives, r.Objectives)
				}
				if !dominated {
					t.Fatalf("feasible %d %v left out of the front but not dominated", r.Index, r.Objectives)
				}
			}
		}
	})
}

// TestRefineReachesKnownOptimum: a single-range design problem with a
// closed-form optimum. For an input-coupled split the hydraulic power
// share at speed ratio ν is ε(ν) = 1 − νM/ν, νM the ratio of the
// mechanical point.
// Source: SAE paper 680549 (1968), Hydrostatic power-splitting
// transmissions for wheeled vehicles — classification and theory of
// operation; the same relations in Continuously variable tractor
// transmissions (2005), ASAE Distinguished Lecture Series No. 29.
// With the variator's efficiency ηh and lossless gears the overall
// efficiency is η = 1/(1 + ε(1/ηh − 1)) for ε > 0 and 1/(1 + |ε|(1 − ηh))
// for circulating power (ε < 0). Choosing νM to maximise the lowest
// efficiency over a required range [ν1, ν2] equalises the two ends'
// losses (hand derivation from those relations):
//
//	(1/ηh)(1 − νM/ν2) = νM/ν1 − 1  ⇒  νM* = (1 + ηh)·ν1·ν2 / (ηh·ν2 + ν1)
//
// which is the harmonic mean 2ν1ν2/(ν1 + ν2) for a lossless variator.
// A second, integer parameter (a tooth count with a cost of its own)
// checks that the search handles integers alongside.
func TestRefineReachesKnownOptimum(t *testing.T) {
	t.Parallel()
	const nu1, nu2, etaH = 0.3, 1.2, 0.8
	eff := func(nuM, nu float64) float64 {
		eps := 1 - nuM/nu
		if eps >= 0 {
			return 1 / (1 + eps*(1/etaH-1))
		}
		return 1 / (1 - eps*(1-etaH))
	}
	p := Problem{
		Space: Space{Name: "single range", Params: []Param{
			{Name: "nuM", Lo: 0.1, Hi: 2},
			{Name: "teeth", Lo: 15, Hi: 60, Integer: true},
		}},
		Objectives: []string{"loss"},
		Evaluate: func(x []float64) ([]float64, string) {
			worst := math.Max(1-eff(x[0], nu1), 1-eff(x[0], nu2))
			return []float64{worst + 1e-4*math.Abs(x[1]-37)}, ""
		},
	}
	want := (1 + etaH) * nu1 * nu2 / (etaH*nu2 + nu1)
	rs, err := Explore{Problem: p, Seed: 1, Candidates: 64}.Run()
	if err != nil {
		t.Fatal(err)
	}
	start, ok := Best(rs, nil)
	if !ok {
		t.Fatal("no feasible start")
	}
	best, err := Refine(p, start, RefineSpec{Evaluations: 400})
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-4 // relative, on νM
	t.Logf("sample best νM %.6f, refined %.6f, closed form %.6f", start.X[0], best.X[0], want)
	if math.Abs(best.X[0]/want-1) > tol || best.X[1] != 37 {
		t.Errorf("refined νM = %.6g, teeth %g; want %.6g within %g, teeth 37", best.X[0], best.X[1], want, tol)
	}
}

func BenchmarkSampler(b *testing.B) {
	s := NewSampler(8, 3)
	u := make([]float64, 8)
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		s.Point(i, u)
		i++
	}
}

// TestExploreRefusesBadSettings: each setting Run cannot work with is
// refused with ErrValue and a message naming it, before any evaluation.
func TestExploreRefusesBadSettings(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name  string
		e     func(p Problem) Explore
		words string
	}{
		{"no candidates", func(p Problem) Explore { return Explore{Problem: p} }, "Candidates 0"},
		{"no Evaluate", func(p Problem) Explore {
			p.Evaluate = nil
			return Explore{Problem: p, Candidates: 3}
		}, "needs an Evaluate"},
		{"part beyond parts", func(p Problem) Explore { return Explore{Problem: p, Candidates: 3, Parts: 2, Part: 2} }, "part 2 of 2"},
		{"negative part", func(p Problem) Explore { return Explore{Problem: p, Candidates: 3, Part: -1} }, "part -1 of 1"},
		{"empty objective", func(p Problem) Explore {
			p.Objectives = []string{"cost", ""}
			return Explore{Problem: p, Candidates: 3}
		}, `objective name ""`},
		{"comma in objective", func(p Problem) Explore {
			p.Objectives = []string{"cost, size"}
			return Explore{Problem: p, Candidates: 3}
		}, `objective name "cost, size"`},
	}
	for _, c := range cases {
		p := toyProblem()
		calls := 0
		if p.Evaluate != nil {
			inner := p.Evaluate
			p.Evaluate = func(x []float64) ([]float64, string) { calls++; return inner(x) }
		}
		_, err := c.e(p).Run()
		if !errors.Is(err, ErrValue) {
			t.Errorf("%s: Run = %v, want ErrValue", c.name, err)
			continue
		}
		if !strings.Contains(err.Error(), c.words) {
			t.Errorf("%s: error %q does not contain %q", c.name, err, c.words)
		}
		if calls != 0 {
			t.Errorf("%s: %d evaluations before the refusal", c.name, calls)
		}
	}
}
