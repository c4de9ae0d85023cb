package traction

import (
	"math"
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

// TestWheelNetIsPullNet: the net pull the slip searches read (the
// netModel short cut, and loadNet's terms worked out once per load) is
// Pull's Net to the bit (loadNet's gross pull Pull's Gross), and bigNeg where Pull refuses the load or slip,
// for a tyre on each soil over loads and slips in and out of range.
func TestWheelNetIsPullNet(t *testing.T) {
	t.Parallel()
	// Invented sizes (round numbers).
	tyre := Tyre{Diameter: units.Metres(1.85), Width: units.Metres(0.65), SectionHeight: units.Metres(0.42),
		RollingRadius: units.Metres(0.86), Deflection: units.Metres(0.08)}
	loads := []float64{-1, 0, 1, 2e3, 1.2e4, 3.5e4, 8e4, math.Inf(1), math.NaN()}
	slips := []float64{-0.7, MinSlip, -0.12, -1e-9, 0, 1e-6, 0.05, 0.15, 0.6, 0.999, 1, math.NaN()}
	checked := 0
	for _, s := range []Surface{HardSoil(), FirmSoil(), TilledSoil(), SoftSoil()} {
		w, err := NewWheel(tyre, s, Brixius{})
		if err != nil {
			t.Fatal(err)
		}
		if _, ok := w.model.(netModel); !ok {
			t.Fatal("Brixius is not a netModel: the test checks nothing")
		}
		for _, load := range loads {
			for _, slip := range slips {
				want, wantGross := bigNeg, bigNeg
				if p, err := (Brixius{}).Pull(tyre, s, units.Force(load), slip); err == nil {
					want, wantGross = float64(p.Net), float64(p.Gross)
					checked++
				}
				if got := w.net(units.Force(load), slip); math.Float64bits(got) != math.Float64bits(want) {
					t.Errorf("%s: net(%g N, slip %g) = %v, want %v", s.Name, load, slip, got, want)
				}
				c := w.at(units.Force(load))
				if got := c.net(slip); math.Float64bits(got) != math.Float64bits(want) {
					t.Errorf("%s: at(%g N).net(slip %g) = %v, want %v", s.Name, load, slip, got, want)
				}
				if got := c.gross(slip); math.Float64bits(got) != math.Float64bits(wantGross) {
					t.Errorf("%s: at(%g N).gross(slip %g) = %v, want %v", s.Name, load, slip, got, wantGross)
				}
			}
		}
	}
	if checked < 50 {
		t.Errorf("only %d accepted points compared", checked)
	}
}
