package design

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/samplemv"
)

// TestSamplerMatchesGonum: the index-wise sampler gives exactly gonum's
// scrambled Halton batch.
func TestSamplerMatchesGonum(t *testing.T) {
	t.Parallel()
	const n, d, seed = 300, 7, 42
	batch := mat.NewDense(n, d, nil)
	samplemv.Halton{Kind: samplemv.Owen, Q: unitCube{}, Src: rand.NewPCG(seed, seed)}.Sample(batch)
	s := NewSampler(d, seed)
	u := make([]float64, d)
	for _, i := range []int{0, 1, 2, 17, 123, n - 1} {
		s.Point(i, u)
		for j := range d {
			if u[j] != batch.At(i, j) {
				t.Fatalf("point %d, dimension %d: %v, gonum %v", i, j, u[j], batch.At(i, j))
			}
		}
	}
}

// unitCube is the uniform distribution on the unit cube: its quantile is
// the identity.
type unitCube struct{}

func (unitCube) Quantile(x, p []float64) []float64 {
	if x == nil {
		x = make([]float64, len(p))
	}
	copy(x, p)
	return x
}

func TestSpaceAt(t *testing.T) {
	t.Parallel()
	s := Space{Name: "t", Params: []Param{
		{Name: "a", Lo: 1, Hi: 3},
		{Name: "b", Fixed: true, Value: 7},
		{Name: "teeth", Lo: 20.2, Hi: 30.9, Integer: true},
	}}
	if err := s.Validate(); err != nil {
		t.Fatal(err)
	}
	cases := []struct{ u, want []float64 }{
		{[]float64{0, 0}, []float64{1, 7, 21}},
		{[]float64{1, 1}, []float64{3, 7, 30}},
		{[]float64{0.5, 0.5}, []float64{2, 7, 26}}, // 20.5 + 0.5·10 = 25.5 rounds to 26
	}
	for _, c := range cases {
		got := s.At(c.u)
		for i := range got {
			if got[i] != c.want[i] {
				t.Errorf("At(%v) = %v, want %v", c.u, got, c.want)
				break
			}
		}
	}
	for _, bad := range []Space{
		{Name: "empty"},
		{Name: "dup", Params: []Param{{Name: "a", Hi: 1}, {Name: "a", Hi: 1}}},
		{Name: "inverted", Params: []Param{{Name: "a", Lo: 2, Hi: 1}}},
		{Name: "no integer", Params: []Param{{Name: "a", Lo: 1.2, Hi: 1.8, Integer: true}}},
	} {
		if err := bad.Validate(); err == nil {
			t.Errorf("Validate(%s) = nil, want an error", bad.Name)
		}
	}
}
