package figures

import (
	"bytes"
	"image/png"
	"math"
	"os"
	"strings"
	"testing"
)

// checkFiles checks that paths are one SVG and one decodable PNG.
func checkFiles(t *testing.T, paths []string) {
	t.Helper()
	if len(paths) != 2 {
		t.Fatalf("wrote %d files, want 2 (SVG and PNG)", len(paths))
	}
	for _, p := range paths {
		data, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		switch {
		case strings.HasSuffix(p, ".svg"):
			if !bytes.HasPrefix(bytes.TrimSpace(data), []byte("<?xml")) && !bytes.HasPrefix(bytes.TrimSpace(data), []byte("<svg")) {
				t.Errorf("%s is not an SVG", p)
			}
			if bytes.Contains(data, []byte("NaN")) {
				t.Errorf("%s contains NaN", p)
			}
		case strings.HasSuffix(p, ".png"):
			if _, err := png.Decode(bytes.NewReader(data)); err != nil {
				t.Errorf("%s: %v", p, err)
			}
		default:
			t.Errorf("unexpected file %s", p)
		}
	}
}

func TestLinesWithGaps(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	files, err := Lines(t.TempDir(), "lines", Axes{Title: "t", X: "x (m)", Y: "y (s)"},
		Series{Name: "a", X: []float64{0, 1, 2, 3, 4}, Y: []float64{1, 2, nan, 4, 5}},
		Series{Name: "b", X: []float64{0, 1, 2}, Y: []float64{2, 1, 0}, Points: true, Dashed: true})
	if err != nil {
		t.Fatal(err)
	}
	checkFiles(t, files)
	if _, err := Lines(t.TempDir(), "empty", Axes{}, Series{X: []float64{nan}, Y: []float64{1}}); err == nil {
		t.Error("Lines with no finite point = nil error")
	}
}

func TestHeatMapWithInfeasibleCells(t *testing.T) {
	t.Parallel()
	g := Grid{X: []float64{0, 1, 2, 3, 4, 5}, Y: []float64{0, 1, 2, 3}}
	for r := range g.Y {
		g.Z = append(g.Z, nil)
		g.Feasible = append(g.Feasible, nil)
		for c := range g.X {
			g.Z[r] = append(g.Z[r], float64(r*c))
			// The top right corner is infeasible, and its value NaN.
			ok := r+c < 6
			if !ok {
				g.Z[r][c] = math.NaN()
			}
			g.Feasible[r] = append(g.Feasible[r], ok)
		}
	}
	env := Series{Name: "envelope", X: []float64{0, 5}, Y: []float64{3, 1}}
	files, err := HeatMap(t.TempDir(), "map", Axes{Title: "t", X: "x", Y: "y"}, g,
		MapOptions{Levels: []float64{2, 4, 6}, ZLabel: "z", Envelope: &env,
			Points: []Series{{Name: "p", X: []float64{1}, Y: []float64{1}}}})
	if err != nil {
		t.Fatal(err)
	}
	checkFiles(t, files)
	z, ok := filled(g)
	if !ok {
		t.Fatal("filled: no feasible cell")
	}
	for r := range z {
		for c := range z[r] {
			if math.IsNaN(z[r][c]) || math.IsInf(z[r][c], 0) {
				t.Errorf("filled grid (%d, %d) = %v, want finite", r, c, z[r][c])
			}
		}
	}
}

func TestBars(t *testing.T) {
	t.Parallel()
	files, err := Bars(t.TempDir(), "bars", Axes{Title: "t", Y: "fuel (L)"}, []string{"a", "b"}, []float64{1, math.NaN()})
	if err != nil {
		t.Fatal(err)
	}
	checkFiles(t, files)
	if _, err := Bars(t.TempDir(), "bad", Axes{}, []string{"a"}, nil); err == nil {
		t.Error("Bars with mismatched labels = nil error")
	}
}

// TestNiceTicks checks that the major ticks step by 1, 2, 2.5 or 5 times a
// power of ten, six to ten of them, with labels free of rounding noise.
func TestNiceTicks(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		lo, hi float64
		want   string // labels of the major ticks
	}{
		{0, 45, "0 5 10 15 20 25 30 35 40 45"},
		{-110, 115, "-100 -75 -50 -25 0 25 50 75 100"},
		{800, 2250, "800 1000 1200 1400 1600 1800 2000 2200"},
		{0.1, 0.7, "0.1 0.2 0.3 0.4 0.5 0.6 0.7"},
	} {
		var got []string
		for _, tk := range (niceTicks{}).Ticks(c.lo, c.hi) {
			if tk.Label != "" {
				got = append(got, tk.Label)
			}
		}
		if s := strings.Join(got, " "); s != c.want {
			t.Errorf("ticks on [%g, %g] = %q, want %q", c.lo, c.hi, s, c.want)
		}
	}
}

func TestPanelsAndBarPanels(t *testing.T) {
	t.Parallel()
	s := Series{Name: "a", X: []float64{0, 1, 2}, Y: []float64{1, 3, 2}, Step: true}
	files, err := Panels(t.TempDir(), "panels", "a design: two panels", "a note",
		Panel{Axes: Axes{Y: "y (m)", Limits: []Limit{{Name: "limit", Y: 2.5}}}, Series: []Series{s}},
		Panel{Axes: Axes{X: "x (s)", Y: "range", YTicks: []string{"standing", "one"}}, Series: []Series{s}})
	if err != nil {
		t.Fatal(err)
	}
	checkFiles(t, files)
	files, err = BarPanels(t.TempDir(), "bars", "a design: bars", "",
		BarPanel{Axes: Axes{Title: "left", Y: "E (MJ)"}, Labels: []string{"a", "b"}, Values: []float64{3, -1}},
		BarPanel{Axes: Axes{Title: "right", Y: "E (MJ)"}, Labels: []string{"c"}, Values: []float64{math.NaN()}, Share: 0.3})
	if err != nil {
		t.Fatal(err)
	}
	checkFiles(t, files)
	if _, err := Panels(t.TempDir(), "none", "t", ""); err == nil {
		t.Error("Panels with no panel = nil error")
	}
}
