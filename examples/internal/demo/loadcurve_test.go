package demo

import (
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// The demo transmission's efficiency over travel speed at full and part
// load, with every loss source on, against published levels.
//
// Source: a field test of a tractor drive line (abstract of a paper in a
// Korean agricultural-machinery journal, indexed at riss.kr, control no.
// f9cbc119c1945aa5ffe0bdc3ef48d419): power transmission efficiency of the
// drive line varied from 56 to 86 % (mean 72.5 %) in field work, and the
// loss by drag torque was about 61 % of the whole loss during transport.
// That drive line is a tractor's, not a power-split's, and includes more
// parts (front-axle drive, the whole rear axle) than the demo's
// transmission plus final drive.
//
// From memory (not re-read): Continuously variable tractor transmissions
// (2005), ASAE publication 913C0305: power-split transmissions about 85–90 %
// near the mechanical points at full load, falling at part load.
//
// Findings (the model is not tuned to these): at 25 % load the drive line
// lies inside the field range at every speed. At full load the
// transmission reaches 89–92 % (drive line 86–89 %), at or just above the
// upper end of both published levels: the demo's hydrostatic units
// (pump 0.95–0.96, motor 0.92–0.96 overall at 230–350 bar, from the
// design file's Wilson coefficients, friction 1 % of the ideal torque) and
// its mesh count (one input gear, the planetary set, one range gear per
// range) are at the favourable end of real transmissions (with the Wilson
// friction coefficient at 0.03 instead of 0.01 the full-load points fall
// to 87–91 %). So the full-load points are held only between the field
// minimum 0.56 and 0.93 — a guard of this project, not a published bound,
// three points above the recalled upper end — so that a change lifting
// them further fails here and is looked at.
func TestLoadCurvePublished(t *testing.T) {
	t.Parallel()
	sc, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	w := units.RPM(1900)
	var kmh []float64
	for v := 4.0; v <= 40; v += 3 {
		kmh = append(kmh, v)
	}
	full, err := LoadCurve(sc, w, 0.9, kmh)
	if err != nil {
		t.Fatal(err)
	}
	part, err := LoadCurve(sc, w, 0.25, kmh)
	if err != nil {
		t.Fatal(err)
	}
	if len(full) < len(kmh)-2 || len(part) < len(kmh)-2 {
		t.Fatalf("only %d and %d of %d speeds solved", len(full), len(part), len(kmh))
	}
	for _, p := range part {
		// Source: field range 56–86 % (drive line), see above.
		if p.DriveLine < 0.56 || p.DriveLine > 0.86 {
			t.Errorf("25 %% load at %.0f km/h: drive line %.3f outside the field range 0.56–0.86", p.KMH, p.DriveLine)
		}
		if !(p.NoLoad > 0) {
			t.Errorf("25 %% load at %.0f km/h: no no-load loss", p.KMH)
		}
	}
	for _, c := range [][]LoadPoint{full, part} {
		for _, p := range c {
			t.Logf("load %.2f %4.0f km/h %-6s transmission %.3f drive line %.3f (hydrostatic %v, mechanical %v, no-load %v)",
				p.Load, p.KMH, p.Range, p.Efficiency, p.DriveLine, p.Hydrostatic, p.Mechanical, p.NoLoad)
		}
	}
	byKMH := map[float64]LoadPoint{}
	for _, p := range full {
		byKMH[p.KMH] = p
		if p.DriveLine < 0.56 || p.Efficiency > 0.93 {
			t.Errorf("full load at %.0f km/h: transmission %.3f, drive line %.3f", p.KMH, p.Efficiency, p.DriveLine)
		}
	}
	// Falling at part load, at every speed both reach.
	for _, p := range part {
		if f, ok := byKMH[p.KMH]; ok && !(p.Efficiency < f.Efficiency) {
			t.Errorf("%.0f km/h: part load %.3f not below full load %.3f", p.KMH, p.Efficiency, f.Efficiency)
		}
	}
	// At transport speed and part load, the no-load drag is a large share
	// of the loss (the field test: about 61 %, a single reading).
	for _, p := range part {
		if p.KMH >= 30 {
			share := float64(p.NoLoad) / float64(p.NoLoad+p.Hydrostatic+p.Mechanical)
			if share < 0.25 || share > 0.75 {
				t.Errorf("%.0f km/h, 25 %% load: no-load share of the loss %.2f outside 0.25–0.75", p.KMH, share)
			}
		}
	}
}
