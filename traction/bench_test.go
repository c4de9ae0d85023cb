package traction_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/traction"
	"github.com/powersplit-dev/powersplit/units"
)

func BenchmarkBrixiusPull(b *testing.B) {
	s := traction.FirmSoil()
	var m traction.Model = traction.Brixius{}
	b.ReportAllocs()
	for b.Loop() {
		_, _ = m.Pull(rearTyre, s, units.Kilonewtons(25), 0.1)
	}
}

func BenchmarkSlipForPull(b *testing.B) {
	w, _ := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	b.ReportAllocs()
	for b.Loop() {
		if _, err := w.SlipForPull(units.Kilonewtons(25), units.Kilonewtons(8)); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFixedRatio(b *testing.B) {
	v := demoVehicle()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.FixedRatio(traction.Brixius{}, traction.FirmSoil(), firmOp, 0.02); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkIndependent(b *testing.B) {
	v := demoVehicle()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := v.Independent(traction.Brixius{}, traction.FirmSoil(), firmOp); err != nil {
			b.Fatal(err)
		}
	}
}

// TestSlipSolveAllocs keeps the slip solver allocation-free.
func TestSlipSolveAllocs(t *testing.T) {
	w, _ := traction.NewWheel(rearTyre, traction.FirmSoil(), traction.Brixius{})
	n := testing.AllocsPerRun(50, func() {
		_, _ = w.SlipForPull(units.Kilonewtons(25), units.Kilonewtons(8))
	})
	if n != 0 {
		t.Errorf("SlipForPull allocates %g times per call, want 0", n)
	}
}
