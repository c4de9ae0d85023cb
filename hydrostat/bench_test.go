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

// BenchmarkCurve times what a layout solver's compiled path asks of a loop
// per point: preparing the Curve at the shaft speeds, one evaluation of the
// unit torques and their slopes, of the leakage and its slope, and the
// final Fill of the loop state; for
// the classic Wilson model (torque at full displacement, the common case)
// and for the model with every term (torque displacement following the
// setting, hydrodynamic and compressibility terms).
func BenchmarkCurve(b *testing.B) {
	classic := Wilson{Slip: 1e-9, Viscous: 2e5, Friction: 0.01, ConstantPressure: units.Bar(1)}
	unit := func(cc float64) Unit {
		return mustUnit(b, UnitSpec{MaxDisplacement: units.CCPerRev(cc), MaxSpeed: units.RPM(4500), Loss: classic})
	}
	cl, err := NewLoop(LoopSpec{Pump: unit(100), Motors: []Unit{unit(100)}, Oil: VG46, Temperature: units.Celsius(60),
		Charge: units.Bar(25), Relief: units.Bar(450)})
	if err != nil {
		b.Fatal(err)
	}
	for _, lc := range []struct {
		name string
		l    Loop
	}{{"classic", cl}, {"every-term", demoLoop(b, 1, nil)}} {
		l := lc.l
		wp, wm := units.RPM(2100), []units.AngularVelocity{units.RPM(1700)}
		var c Curve
		set := make([]float64, 2)
		tq := make([]units.Torque, 2)
		sl := make([]units.Displacement, 2)
		var st LoopState
		b.Run(lc.name+"/prepare", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				l.Curve(wp, wm, &c)
			}
		})
		if !l.Curve(wp, wm, &c) {
			b.Fatal("no Curve")
		}
		b.Run(lc.name+"/torques", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				c.Torques(units.Bar(180), set, tq, sl)
			}
		})
		b.Run(lc.name+"/leakage", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				_, _, _ = c.Leakage(units.Bar(180))
			}
		})
		// Fill at the settings Torques gives (run on its own, the torques
		// benchmark above would leave them zero: an idle loop).
		if !c.Torques(units.Bar(180), set, tq, sl) || set[0] == 0 {
			b.Fatal("no torques")
		}
		b.Run(lc.name+"/fill", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				_ = c.Fill(units.Bar(180), set, &st)
			}
		})
		if !c.fixed {
			// Without the losses Torques kept (Fill at another point than
			// the last Torques): the loss model for every unit.
			b.Run(lc.name+"/fill-uncached", func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					c.cached = false
					_ = c.Fill(units.Bar(180), set, &st)
				}
			})
		}
	}
}
