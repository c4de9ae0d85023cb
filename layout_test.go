package powersplit

import (
	"errors"
	"testing"

	"github.com/powersplit-dev/powersplit/planetary"
)

func TestBuildErrors(t *testing.T) {
	t.Parallel()
	set := mustSet(t, testI0, 0.98)
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	cases := []struct {
		name  string
		build func(b *Builder)
		want  error
		free  []string // for kinematics errors: the shafts reported free
	}{
		{"no shafts", func(b *Builder) {}, ErrLayout, nil},
		{"unconnected shaft", func(b *Builder) {
			in, m, out := b.Shaft("in"), b.Shaft("motor"), b.Shaft("out")
			b.Shaft("spare")
			b.Input("engine", in)
			b.Loop("hst", lp, in, m)
			b.Gear("g", m, out, 0.5, 1)
			b.Output("out", out)
		}, ErrUnconnected, nil},
		{"member on two shafts", func(b *Builder) {
			a, c := b.Shaft("a"), b.Shaft("c")
			b.Planetary("p", set, a, a, c)
		}, ErrLayout, nil},
		{"zero set", func(b *Builder) {
			a, c, d := b.Shaft("a"), b.Shaft("c"), b.Shaft("d")
			b.Planetary("p", planetary.Set{}, a, c, d)
		}, ErrLayout, nil},
		{"bad gear ratio", func(b *Builder) {
			a, c := b.Shaft("a"), b.Shaft("c")
			b.Gear("g", a, c, 0, 1)
		}, ErrLayout, nil},
		{"bad efficiency", func(b *Builder) {
			a, c := b.Shaft("a"), b.Shaft("c")
			b.Gear("g", a, c, 2, 1.2)
		}, ErrLayout, nil},
		{"no input", func(b *Builder) {
			a, c := b.Shaft("a"), b.Shaft("c")
			b.Gear("g", a, c, 2, 1)
			b.Output("out", c)
		}, ErrLayout, nil},
		{"duplicate name", func(b *Builder) {
			a, c := b.Shaft("a"), b.Shaft("c")
			b.Gear("g", a, c, 2, 1)
			b.Gear("g", a, c, 3, 1)
		}, ErrLayout, nil},
		{"under-determined: idle planetary member", func(b *Builder) {
			in, m, out, x := b.Shaft("in"), b.Shaft("motor"), b.Shaft("out"), b.Shaft("x")
			b.Input("engine", in)
			b.Loop("hst", lp, in, m)
			b.Gear("g", m, out, 0.5, 1)
			b.Output("out", out)
			// a set with two members free: x and the carrier shaft
			y := b.Shaft("y")
			b.Planetary("p", set, out, x, y)
		}, ErrKinematics, []string{"x", "y"}},
		{"over-determined: mechanical path fixes the ratio", func(b *Builder) {
			in, m, out := b.Shaft("in"), b.Shaft("motor"), b.Shaft("out")
			b.Input("engine", in)
			b.Loop("hst", lp, in, m)
			b.Gear("g", m, out, 0.5, 1)
			b.Gear("direct", in, out, 0.3, 1)
			b.Output("out", out)
		}, ErrKinematics, nil},
		{"torques: no loop for the given output torque", func(b *Builder) {
			in, out := b.Shaft("in"), b.Shaft("out")
			b.Input("engine", in)
			b.Clutch("c", in, out)
			b.Output("out", out)
			b.Range("open")
		}, ErrTorques, nil},
		{"unknown clutch in range", func(b *Builder) {
			in, m := b.Shaft("in"), b.Shaft("motor")
			b.Input("engine", in)
			b.Loop("hst", lp, in, m)
			b.Output("out", m)
			b.Range("1", "no such clutch")
		}, ErrLayout, nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b := NewBuilder()
			c.build(b)
			_, err := b.Build()
			if !errors.Is(err, c.want) {
				t.Fatalf("Build() = %v, want %v", err, c.want)
			}
			if c.free != nil {
				var ke *KinematicsError
				if !errors.As(err, &ke) {
					t.Fatalf("%v is no *KinematicsError", err)
				}
				if len(ke.Free) != len(c.free) || ke.Free[0] != c.free[0] || ke.Free[1] != c.free[1] {
					t.Errorf("free shafts %v, want %v", ke.Free, c.free)
				}
			}
		})
	}
}

func TestBuilderSpecErrors(t *testing.T) {
	t.Parallel()
	set := mustSet(t, testI0, 0.98)
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100})
	lp2 := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, motors: 2})
	if _, err := OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp2}); !errors.Is(err, ErrInput) {
		t.Errorf("two-motor loop in output-coupled: %v", err)
	}
	if _, err := OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, Input: planetary.Ring, Pump: planetary.Ring, Output: planetary.Sun}); !errors.Is(err, ErrLayout) {
		t.Errorf("two members alike: %v", err)
	}
	if _, err := InputCoupled(InputCoupledSpec{Set: set, Loop: lp, Ranges: []RangeGear{{Ratio: 0}}}); !errors.Is(err, ErrInput) {
		t.Errorf("zero range ratio: %v", err)
	}
	if _, err := PureHydrostatic(PureHydrostaticSpec{Loop: lp, Second: &SecondMotor{Ratio: 1, DeclutchAbove: 1}}); !errors.Is(err, ErrInput) {
		t.Errorf("second motor on a one-motor loop: %v", err)
	}
	if _, err := OutputCoupled(OutputCoupledSpec{Set: set, Loop: lp, GearEfficiency: 1.5}); !errors.Is(err, ErrInput) {
		t.Errorf("efficiency 1.5: %v", err)
	}
}
