package design

import (
	"fmt"
	"hash/fnv"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
)

// Param is one parameter of a design space.
type Param struct {
	// Name names the parameter in reports and CSV headers.
	Name string
	// Lo and Hi bound a free parameter (Lo ≤ Hi, both finite).
	Lo, Hi float64
	// Fixed holds the parameter at Value; the search does not vary it.
	Fixed bool
	// Value is the fixed value.
	Value float64
	// Integer rounds the parameter to a whole number (tooth counts); Lo
	// and Hi are then rounded inwards.
	Integer bool
}

// Space is a design space: the parameters of a design, each free within
// bounds or fixed. A candidate is a vector of all parameters in order.
type Space struct {
	// Name names the space (a CSV header carries it).
	Name   string
	Params []Param
}

// Validate reports a space that cannot be searched.
func (s Space) Validate() error {
	if len(s.Params) == 0 {
		return fmt.Errorf("%w: space %q has no parameters", ErrValue, s.Name)
	}
	seen := map[string]bool{}
	for i, p := range s.Params {
		bad := func(why string) error {
			return fmt.Errorf("%w: space %q: parameter %d %q: %s", ErrValue, s.Name, i, p.Name, why)
		}
		if p.Name == "" || strings.ContainsAny(p.Name, ",\n\"") {
			return bad("needs a name without commas, quotes or line breaks")
		}
		if seen[p.Name] {
			return bad("named twice")
		}
		seen[p.Name] = true
		for _, v := range []float64{p.Lo, p.Hi, p.Value} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return bad("bounds and value must be finite")
			}
		}
		if !p.Fixed && !(p.Lo <= p.Hi) {
			return bad("needs Lo ≤ Hi")
		}
		if !p.Fixed && p.Integer && math.Ceil(p.Lo) > math.Floor(p.Hi) {
			return bad("holds no whole number")
		}
	}
	if s.Free() > len(firstPrimes) {
		return fmt.Errorf("%w: space %q: more than %d free parameters", ErrValue, s.Name, len(firstPrimes))
	}
	return nil
}

// Free returns the number of free parameters.
func (s Space) Free() int {
	n := 0
	for _, p := range s.Params {
		if !p.Fixed {
			n++
		}
	}
	return n
}

// Names returns the parameter names in order.
func (s Space) Names() []string {
	out := make([]string, len(s.Params))
	for i, p := range s.Params {
		out[i] = p.Name
	}
	return out
}

// Fingerprint identifies the space's definition: its name, and every
// parameter's name, bounds, fixed value and kind. Parts of one search
// must share it.
func (s Space) Fingerprint() string {
	h := fnv.New64a()
	h.Write([]byte(s.Name))
	for _, p := range s.Params {
		fmt.Fprintf(h, "\x00%s\x00%s\x00%s\x00%t\x00%s\x00%t", p.Name,
			strconv.FormatFloat(p.Lo, 'g', -1, 64), strconv.FormatFloat(p.Hi, 'g', -1, 64), p.Fixed,
			strconv.FormatFloat(p.Value, 'g', -1, 64), p.Integer)
	}
	return fmt.Sprintf("%016x", h.Sum64())
}

// At maps a point u of the unit cube (one coordinate per free parameter,
// each in [0, 1]) to a candidate: every parameter's value, fixed ones
// included, integers rounded.
func (s Space) At(u []float64) []float64 {
	x := make([]float64, len(s.Params))
	k := 0
	for i, p := range s.Params {
		if p.Fixed {
			x[i] = p.Value
			continue
		}
		t := math.Min(math.Max(u[k], 0), 1)
		k++
		lo, hi := p.Lo, p.Hi
		if p.Integer {
			lo, hi = math.Ceil(lo)-0.5, math.Floor(hi)+0.5
		}
		v := lo + t*(hi-lo)
		if p.Integer {
			v = math.Min(math.Max(math.Round(v), math.Ceil(p.Lo)), math.Floor(p.Hi))
		}
		x[i] = v
	}
	return x
}

// Unit is the inverse of At for the free parameters: the unit-cube point
// of candidate x (clamped into the bounds).
func (s Space) Unit(x []float64) []float64 {
	u := make([]float64, 0, s.Free())
	for i, p := range s.Params {
		if p.Fixed {
			continue
		}
		lo, hi := p.Lo, p.Hi
		if p.Integer {
			lo, hi = math.Ceil(lo)-0.5, math.Floor(hi)+0.5
		}
		t := 0.0
		if hi > lo {
			t = (x[i] - lo) / (hi - lo)
		}
		u = append(u, math.Min(math.Max(t, 0), 1))
	}
	return u
}

// Sampler gives the space-filling sample of a design space: the scrambled
// Halton sequence of "A randomized Halton algorithm in R" (2017),
// arXiv:1706.02808, exactly as gonum's stat/samplemv.Halton (Kind
// samplemv.Owen) draws it from a PCG source seeded with (seed, seed), but
// computed for one index at a time, so candidate i depends only on (space,
// seed, i) and parts of a search never compute each other's points.
type Sampler struct {
	dim   int
	perms [][][]int // per dimension, per digit: the permutation of the digits
}

// NewSampler prepares the sample of dim dimensions for a seed.
func NewSampler(dim int, seed uint64) *Sampler {
	r := rand.New(rand.NewPCG(seed, seed))
	s := &Sampler{dim: dim, perms: make([][][]int, dim)}
	for j := range dim {
		b := firstPrimes[j]
		b2r := 1 / float64(b)
		for 1-b2r < 1 { // the digits a float64 resolves, as gonum counts them
			s.perms[j] = append(s.perms[j], r.Perm(b))
			b2r /= float64(b)
		}
	}
	return s
}

// Point writes the i-th point (i ≥ 0) into u (length dim) and returns it.
func (s *Sampler) Point(i int, u []float64) []float64 {
	for j := range s.dim {
		b := int64(firstPrimes[j])
		div := int64(1)
		b2r := 1 / float64(b)
		v := 0.0
		for _, p := range s.perms[j] {
			dig := (int64(i) / div) % b
			v += float64(p[dig]) * b2r
			div *= b
			b2r /= float64(b)
		}
		u[j] = v
	}
	return u
}

// firstPrimes are the Halton bases, one per dimension.
var firstPrimes = []int{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97}
