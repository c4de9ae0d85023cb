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
