package design

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"runtime/debug"
	"slices"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/optimize"
)

// Problem is what a search explores: a design space, the names of the
// objectives (all minimised) and the evaluation of one candidate.
type Problem struct {
	Space Space
	// Objectives name the objectives in the order Evaluate returns them.
	Objectives []string
	// Evaluate scores candidate x (every parameter, in Space order). It
	// returns the objectives, or a non-empty reason when x is infeasible
	// (a requirement missed, a point it cannot run). It must be a pure
	// function of x and safe for concurrent use.
	Evaluate func(x []float64) (objectives []float64, reason string)
}

// Result is one evaluated candidate.
type Result struct {
	// Index is the candidate's index in the space-filling sample (-1 for a
	// refined design).
	Index int
	// X holds every parameter's value, in Space order.
	X []float64
	// Feasible reports whether the candidate meets every requirement;
	// Reason says why not.
	Feasible bool
	Reason   string
	// Objectives are the objective values (NaN when infeasible).
	Objectives []float64
}

// Explore sets up a space-filling exploration, or part k of n of one.
type Explore struct {
	Problem
	// Seed selects the scrambling of the sample.
	Seed uint64
	// Candidates is the number of candidates of the whole search.
	Candidates int
	// Part and Parts split the search: this run evaluates the candidates
	// i with i mod Parts = Part. Parts 0 means 1.
	Part, Parts int
	// Workers is the number of goroutines; 0 means GOMAXPROCS. Results do
	// not depend on it.
	Workers int
	// Progress, when not nil, is called after each candidate with the
	// number done and the total of this part, serialised.
	Progress func(done, total int)
}

func (e *Explore) check() error {
	if e.Parts == 0 {
		e.Parts = 1
	}
	if err := e.Space.Validate(); err != nil {
		return err
	}
	switch {
	case e.Evaluate == nil:
		return fmt.Errorf("%w: Explore needs an Evaluate function", ErrValue)
	case e.Candidates < 1:
		return fmt.Errorf("%w: Explore.Candidates %d must be positive", ErrValue, e.Candidates)
	case e.Parts < 1 || e.Part < 0 || e.Part >= e.Parts:
		return fmt.Errorf("%w: part %d of %d", ErrValue, e.Part, e.Parts)
	}
	for _, o := range e.Objectives {
		if o == "" || strings.ContainsAny(o, ",\n\"") {
			return fmt.Errorf("%w: objective name %q", ErrValue, o)
		}
	}
	return nil
}

// Indices returns the candidate indices of this part, in order.
func (e Explore) Indices() []int {
	parts := max(e.Parts, 1)
	var out []int
	for i := e.Part; i < e.Candidates; i += parts {
		out = append(out, i)
	}
	return out
}

// Candidate returns candidate i of the space for the seed: it depends only
// on (space, seed, i).
func Candidate(s Space, seed uint64, i int) []float64 {
	u := NewSampler(s.Free(), seed).Point(i, make([]float64, s.Free()))
	return s.At(u)
}

// Run evaluates this part's candidates on Workers goroutines and returns
// their results in index order. The results are the same for any number of
// workers.
func (e Explore) Run() ([]Result, error) {
	if err := e.check(); err != nil {
		return nil, err
	}
	idx := e.Indices()
	out := make([]Result, len(idx))
	sampler := NewSampler(e.Space.Free(), e.Seed)
	workers := e.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	var (
		next atomic.Int64
		done int
		mu   sync.Mutex
		wg   sync.WaitGroup
	)
	for range min(workers, len(idx)) {
		wg.Go(func() {
			u := make([]float64, e.Space.Free())
			for {
				k := int(next.Add(1) - 1)
				if k >= len(idx) {
					return
				}
				x := e.Space.At(sampler.Point(idx[k], u))
				out[k] = evaluate(e.Problem, idx[k], x)
				if e.Progress != nil {
					mu.Lock()
					done++
					e.Progress(done, len(idx))
					mu.Unlock()
				}
			}
		})
	}
	wg.Wait()
	return out, nil
}

// evaluate runs the problem's evaluation and normalises its result.
func evaluate(p Problem, i int, x []float64) Result {
	obj, reason := p.Evaluate(x)
	r := Result{Index: i, X: x, Feasible: reason == "", Reason: reason, Objectives: make([]float64, len(p.Objectives))}
	if r.Feasible && len(obj) != len(p.Objectives) {
		r.Feasible, r.Reason = false, fmt.Sprintf("evaluation returned %d objectives, want %d", len(obj), len(p.Objectives))
	}
	for k := range r.Objectives {
		r.Objectives[k] = math.NaN()
		if r.Feasible {
			r.Objectives[k] = obj[k]
			if math.IsNaN(obj[k]) || math.IsInf(obj[k], 0) {
				r.Feasible, r.Reason = false, "objective "+p.Objectives[k]+" not finite"
			}
		}
	}
	if !r.Feasible {
		for k := range r.Objectives {
			r.Objectives[k] = math.NaN()
		}
	}
	return r
}

// Dominates reports whether a is at least as good as b in every objective
// of obj (all when obj is empty) and better in one. Only feasible results
// dominate or are dominated.
func Dominates(a, b Result, obj ...int) bool {
	if !a.Feasible || !b.Feasible {
		return false
	}
	if len(obj) == 0 {
		obj = allObjectives(len(a.Objectives))
	}
	better := false
	for _, k := range obj {
		switch {
		case a.Objectives[k] > b.Objectives[k]:
			return false
		case a.Objectives[k] < b.Objectives[k]:
			better = true
		}
	}
	return better
}

func allObjectives(n int) []int {
	obj := make([]int, n)
	for k := range obj {
		obj[k] = k
	}
	return obj
}

// Pareto returns the feasible results no other feasible result dominates
// in the objectives obj (all when empty), sorted by the first of them,
// then by index.
func Pareto(rs []Result, obj ...int) []Result {
	var feas []Result
	for _, r := range rs {
		if r.Feasible {
			feas = append(feas, r)
		}
	}
	if len(feas) == 0 {
		return nil
	}
	if len(obj) == 0 {
		obj = allObjectives(len(feas[0].Objectives))
	}
	var out []Result
	for _, r := range feas {
		if !slices.ContainsFunc(feas, func(q Result) bool { return Dominates(q, r, obj...) }) {
			out = append(out, r)
		}
	}
	slices.SortStableFunc(out, func(a, b Result) int {
		if c := cmpFloat(a.Objectives[obj[0]], b.Objectives[obj[0]]); c != 0 {
			return c
		}
		return a.Index - b.Index
	})
	return out
}

// Best returns the feasible result with the least weighted sum of
// objectives (ties: the lowest index), and false when none is feasible.
// Nil weights mean the first objective alone.
func Best(rs []Result, weights []float64) (Result, bool) {
	if len(weights) == 0 {
		weights = []float64{1}
	}
	best, ok := Result{}, false
	bestV := math.Inf(1)
	for _, r := range rs {
		if !r.Feasible {
			continue
		}
		if v := weighted(r.Objectives, weights); v < bestV {
			best, bestV, ok = r, v, true
		}
	}
	return best, ok
}

func weighted(obj, w []float64) float64 {
	s := 0.0
	for k, v := range obj {
		if k < len(w) {
			s += w[k] * v
		}
	}
	return s
}

// RefineSpec sets up Refine. Zero fields take the documented defaults.
type RefineSpec struct {
	// Weights weigh the objectives into the one value Nelder–Mead
	// minimises; default the first objective alone.
	Weights []float64
	// Evaluations bounds the number of evaluations; default 200.
	Evaluations int
	// Step is the initial simplex size in the unit cube; default 0.05.
	Step float64
}

// Refine improves a feasible start by gonum's Nelder–Mead over the free
// parameters, scaled to the unit cube and clamped into the bounds
// (integers rounded), then polishes integer parameters by single steps.
// An infeasible trial scores +∞, so the simplex backs away from the
// requirements' edges; the search is deterministic. It returns the best
// feasible result seen (start when nothing beats it).
func Refine(p Problem, start Result, spec RefineSpec) (Result, error) {
	if err := p.Space.Validate(); err != nil {
		return start, err
	}
	if !start.Feasible {
		return start, fmt.Errorf("%w: Refine needs a feasible start", ErrValue)
	}
	if len(spec.Weights) == 0 {
		spec.Weights = []float64{1}
	}
	if spec.Evaluations == 0 {
		spec.Evaluations = 200
	}
	if spec.Step == 0 {
		spec.Step = 0.05
	}
	best := start
	bestV := weighted(start.Objectives, spec.Weights)
	f := func(u []float64) float64 {
		x := p.Space.At(u)
		r := evaluate(p, -1, x)
		if !r.Feasible {
			return math.Inf(1)
		}
		v := weighted(r.Objectives, spec.Weights)
		if v < bestV {
			best, bestV = r, v
		}
		return v
	}
	u0 := p.Space.Unit(start.X)
	if len(u0) == 0 {
		return start, nil
	}
	// The evaluation limit or convergence ends the search with the best
	// feasible point seen; an error of the method itself is returned with
	// that point.
	_, err := optimize.Minimize(optimize.Problem{Func: f}, u0,
		&optimize.Settings{FuncEvaluations: spec.Evaluations, Converger: &optimize.FunctionConverge{Absolute: 1e-12, Iterations: 50}},
		&optimize.NelderMead{SimplexSize: spec.Step})
	// The simplex stalls on the plateaus of rounded integer parameters:
	// polish each by single steps while that improves.
	for improved := true; improved; {
		improved = false
		for i, q := range p.Space.Params {
			if q.Fixed || !q.Integer {
				continue
			}
			for _, step := range []float64{-1, 1} {
				for {
					x := slices.Clone(best.X)
					x[i] += step
					if x[i] < math.Ceil(q.Lo) || x[i] > math.Floor(q.Hi) {
						break
					}
					r := evaluate(p, -1, x)
					if !r.Feasible || weighted(r.Objectives, spec.Weights) >= bestV {
						break
					}
					best, bestV, improved = r, weighted(r.Objectives, spec.Weights), true
				}
			}
		}
	}
	return best, err
}

// Header is the first lines of a part's CSV file: what the part belongs
// to. Parts merge only when their headers agree (Part aside).
type Header struct {
	Space       string // the space's name
	Fingerprint string // Space.Fingerprint
	Seed        uint64
	Candidates  int
	Part, Parts int
	Version     string // the library's module version
	Params      []string
	Objectives  []string
}

// Version returns the version of this library as the build records it
// ("(devel)" in a working copy).
func Version() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "unknown"
	}
	const mod = "github.com/powersplit-dev/powersplit"
	if bi.Main.Path == mod {
		return bi.Main.Version
	}
	for _, d := range bi.Deps {
		if d.Path == mod {
			return d.Version
		}
	}
	return "unknown"
}

func (e Explore) header() Header {
	return Header{Space: e.Space.Name, Fingerprint: e.Space.Fingerprint(), Seed: e.Seed, Candidates: e.Candidates,
		Part: e.Part, Parts: max(e.Parts, 1), Version: Version(), Params: e.Space.Names(), Objectives: e.Objectives}
}

// completeLine ends a part's file; a file without it is an interrupted
// part and is run again.
const completeLine = "# complete"

// WriteCSV writes a part's results: comment lines with the header, a
// column row (index, feasible, reason, the parameters, the objectives),
// one row per result with numbers that read back exactly (an infeasible
// candidate's objectives left empty), and a closing "# complete" line.
func WriteCSV(w io.Writer, h Header, rs []Result) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "# powersplit design search\n# space: %s\n# fingerprint: %s\n# seed: %d\n# candidates: %d\n# part: %d of %d\n# version: %s\n",
		h.Space, h.Fingerprint, h.Seed, h.Candidates, h.Part, h.Parts, h.Version)
	bw.WriteString("index,feasible,reason")
	for _, n := range append(slices.Clone(h.Params), h.Objectives...) {
		bw.WriteString("," + n)
	}
	bw.WriteByte('\n')
	var b []byte
	for _, r := range rs {
		b = strconv.AppendInt(b[:0], int64(r.Index), 10)
		b = append(b, ',')
		b = strconv.AppendBool(b, r.Feasible)
		b = append(b, ',')
		b = strconv.AppendQuote(b, r.Reason)
		for _, v := range append(slices.Clone(r.X), r.Objectives...) {
			b = append(b, ',')
			if !math.IsNaN(v) { // an infeasible candidate's objectives stay empty
				b = strconv.AppendFloat(b, v, 'g', -1, 64)
			}
		}
		b = append(b, '\n')
		bw.Write(b)
	}
	bw.WriteString(completeLine + "\n")
	return bw.Flush()
}

// ReadCSV reads a part written by WriteCSV. It returns ErrIncomplete for a
// file without its closing line.
func ReadCSV(r io.Reader) (Header, []Result, error) {
	var h Header
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<16), 1<<24)
	line := 0
	complete := false
	var rs []Result
	bad := func(format string, args ...any) error {
		return fmt.Errorf("%w: line %d: %s", ErrSyntax, line, fmt.Sprintf(format, args...))
	}
	for sc.Scan() {
		line++
		t := sc.Text()
		if complete {
			return h, nil, bad("data after %q", completeLine)
		}
		switch {
		case t == completeLine:
			complete = true
			continue
		case strings.HasPrefix(t, "# "):
			k, v, _ := strings.Cut(t[2:], ": ")
			var err error
			switch k {
			case "space":
				h.Space = v
			case "fingerprint":
				h.Fingerprint = v
			case "seed":
				h.Seed, err = strconv.ParseUint(v, 10, 64)
			case "candidates":
				h.Candidates, err = strconv.Atoi(v)
			case "part":
				_, err = fmt.Sscanf(v, "%d of %d", &h.Part, &h.Parts)
			case "version":
				h.Version = v
			}
			if err != nil {
				return h, nil, bad("header %q: %v", k, err)
			}
			continue
		case strings.HasPrefix(t, "index,"):
			cols := strings.Split(t, ",")[3:]
			h.Params = nil
			h.Objectives = nil
			// The split between parameters and objectives is recorded by
			// the caller's Problem; keep every column as a parameter here
			// and split in Merge.
			h.Params = cols
			continue
		}
		rec, err := parseRow(t)
		if err != nil {
			return h, nil, bad("%v", err)
		}
		rs = append(rs, rec)
	}
	if err := sc.Err(); err != nil {
		return h, nil, err
	}
	if !complete {
		return h, rs, ErrIncomplete
	}
	return h, rs, nil
}

// parseRow reads index,feasible,"reason",values...
func parseRow(t string) (Result, error) {
	var r Result
	i := strings.IndexByte(t, ',')
	if i < 0 {
		return r, errors.New("too few columns")
	}
	idx, err := strconv.Atoi(t[:i])
	if err != nil {
		return r, err
	}
	t = t[i+1:]
	j := strings.IndexByte(t, ',')
	if j < 0 {
		return r, errors.New("too few columns")
	}
	feas, err := strconv.ParseBool(t[:j])
	if err != nil {
		return r, err
	}
	t = t[j+1:]
	q, err := strconv.QuotedPrefix(t)
	if err != nil {
		return r, err
	}
	reason, _ := strconv.Unquote(q)
	t = t[len(q):]
	var vals []float64
	for _, f := range strings.Split(strings.TrimPrefix(t, ","), ",") {
		if f == "" && t == "" {
			break
		}
		if f == "" {
			vals = append(vals, math.NaN())
			continue
		}
		v, err := strconv.ParseFloat(f, 64)
		if err != nil {
			return r, err
		}
		vals = append(vals, v)
	}
	return Result{Index: idx, Feasible: feas, Reason: reason, X: vals}, nil
}

// ErrIncomplete is a part's file without its closing line: the part was
// interrupted and must run again.
var ErrIncomplete = errors.New("design: incomplete part file")

// PartFile names part k of n in a folder: part-0003-of-0010.csv.
func PartFile(dir string, k, n int) string {
	return filepath.Join(dir, fmt.Sprintf("part-%04d-of-%04d.csv", k, n))
}

// RunPart runs this part and writes it to path, unless path already holds
// this part complete (same header): then it reads it back and reports
// skipped. The file appears only when complete (written aside, then
// renamed), so an interrupted run leaves no partial part. A file at path
// from another search (other space, seed, candidates, parts or version)
// is replaced.
func (e Explore) RunPart(path string) (rs []Result, skipped bool, err error) {
	if err := e.check(); err != nil {
		return nil, false, err
	}
	want := e.header()
	if f, err := os.Open(path); err == nil {
		h, old, rerr := ReadCSV(f)
		f.Close()
		if rerr == nil && sameRun(h, want) && h.Part == want.Part {
			return e.split(old), true, nil
		}
	}
	rs, err = e.Run()
	if err != nil {
		return nil, false, err
	}
	tmp := path + ".partial"
	f, err := os.Create(tmp)
	if err != nil {
		return nil, false, err
	}
	if err := WriteCSV(f, want, rs); err != nil {
		f.Close()
		return nil, false, err
	}
	if err := f.Close(); err != nil {
		return nil, false, err
	}
	return rs, false, os.Rename(tmp, path)
}

// sameRun reports whether two headers belong to one search.
func sameRun(a, b Header) bool {
	return a.Space == b.Space && a.Fingerprint == b.Fingerprint && a.Seed == b.Seed && a.Candidates == b.Candidates &&
		a.Parts == b.Parts && a.Version == b.Version &&
		slices.Equal(a.Params, append(slices.Clone(b.Params), b.Objectives...))
}

// split divides the value columns read back into parameters and
// objectives.
func (e Explore) split(rs []Result) []Result {
	n := len(e.Space.Params)
	for i := range rs {
		v := rs[i].X
		if len(v) >= n {
			rs[i].X, rs[i].Objectives = v[:n:n], v[n:]
		}
	}
	return rs
}

// Merge reads the files of every part of one search and returns the
// results in index order: exactly what one run of the whole search
// returns. Every part 0..n-1 must be present once, complete, and of the
// same search as e (space, seed, candidates, parts, version).
func (e Explore) Merge(paths ...string) ([]Result, error) {
	if err := e.check(); err != nil {
		return nil, err
	}
	want := e.header()
	seen := make([]bool, want.Parts)
	out := make([]Result, 0, e.Candidates)
	for _, p := range paths {
		f, err := os.Open(p)
		if err != nil {
			return nil, err
		}
		h, rs, err := ReadCSV(f)
		f.Close()
		if err != nil {
			return nil, fmt.Errorf("%s: %w", p, err)
		}
		if !sameRun(h, want) {
			return nil, fmt.Errorf("%w: %s belongs to another search (space %q %s, seed %d, %d candidates, %d parts, version %s)",
				ErrValue, p, h.Space, h.Fingerprint, h.Seed, h.Candidates, h.Parts, h.Version)
		}
		if h.Part < 0 || h.Part >= want.Parts || seen[h.Part] {
			return nil, fmt.Errorf("%w: %s: part %d of %d given twice or out of range", ErrValue, p, h.Part, h.Parts)
		}
		seen[h.Part] = true
		out = append(out, e.split(rs)...)
	}
	for k, ok := range seen {
		if !ok {
			return nil, fmt.Errorf("%w: part %d of %d missing", ErrValue, k, want.Parts)
		}
	}
	slices.SortFunc(out, func(a, b Result) int { return a.Index - b.Index })
	if len(out) != e.Candidates {
		return nil, fmt.Errorf("%w: %d results, want %d", ErrValue, len(out), e.Candidates)
	}
	for i, r := range out {
		if r.Index != i {
			return nil, fmt.Errorf("%w: result %d has index %d", ErrValue, i, r.Index)
		}
	}
	return out, nil
}
