package hydrostat

import (
	"testing"

	"github.com/powersplit-dev/powersplit/units"
)

func BenchmarkUnitAt(b *testing.B) {
	l := demoLoop(b, 1, nil)
	u := l.spec.Pump
	oil, temp := VG46, units.Celsius(60)
	b.ReportAllocs()
	for b.Loop() {
		_, _ = u.At(0.7, units.RPM(2000), units.Bar(250), oil, temp)
	}
}

func BenchmarkLoopAtSequential(b *testing.B) {
	l := demoLoop(b, 2, nil)
	speeds := []units.AngularVelocity{units.RPM(1500), units.RPM(1500)}
	var st LoopState
	b.ReportAllocs()
	for b.Loop() {
		_ = l.At(units.RPM(2000), speeds, units.Bar(250), &st)
	}
}

func BenchmarkLoopAtMinLoss(b *testing.B) {
	l := demoLoop(b, 2, MinLoss{})
	speeds := []units.AngularVelocity{units.RPM(1500), units.RPM(1500)}
	var st LoopState
	b.ReportAllocs()
	for b.Loop() {
		_ = l.At(units.RPM(2000), speeds, units.Bar(250), &st)
	}
}

func BenchmarkLoopSolve(b *testing.B) {
	l := demoLoop(b, 1, nil)
	in := LoopInput{PumpSpeed: units.RPM(2000), MotorSpeeds: []units.AngularVelocity{units.RPM(1200)},
		MotorTorques: []units.Torque{-300}}
	b.ReportAllocs()
	for b.Loop() {
		_, _ = l.Solve(in)
	}
}

// BenchmarkLoopAtOverCentre evaluates a loop whose motor has swung over
// centre (pump turning backwards slowly, as just past a mechanical point).
func BenchmarkLoopAtOverCentre(b *testing.B) {
	l := swingLoop(b, SwingUnstated, SwingOverCentre, demoWilson, nil)
	speeds := []units.AngularVelocity{units.RPM(1500)}
	var st LoopState
	b.ReportAllocs()
	for b.Loop() {
		_ = l.At(units.RPM(-300), speeds, units.Bar(250), &st)
	}
}
