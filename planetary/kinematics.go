package planetary

import (
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Speeds are the speeds of the three members, signed, in one rotational sense.
type Speeds struct{ Sun, Ring, Carrier units.AngularVelocity }

// Of returns the speed of member m (zero for an invalid member).
func (sp Speeds) Of(m Member) units.AngularVelocity {
	switch m {
	case Sun:
		return sp.Sun
	case Ring:
		return sp.Ring
	case Carrier:
		return sp.Carrier
	}
	return 0
}

// WillisTolerance is the largest relative Willis residual (see Set.Residual)
// that Set.Torque and Set.PlanetSpeeds accept as consistent speeds.
const WillisTolerance = 1e-9

// Solve returns sp with the speed of the unknown member filled in from the
// other two by the Willis equation
//
//	ωSun − i0·ωRing − (1 − i0)·ωCarrier = 0.
//
// The unknown member's field of sp is ignored. NaN or infinite known speeds,
// or a result that would overflow, give an *InputError wrapping ErrNotFinite.
// Solve does not allocate.
func (s Set) Solve(sp Speeds, unknown Member) (Speeds, error) {
	if !s.valid() {
		return Speeds{}, errZeroSet
	}
	if !unknown.valid() {
		return Speeds{}, ErrMember
	}
	for m := Sun; m <= Carrier; m++ {
		if m != unknown {
			if v := float64(sp.Of(m)); !isFinite(v) {
				return Speeds{}, notFinite(m.String()+" speed", v)
			}
		}
	}
	i0 := s.i0
	ws, wr, wc := float64(sp.Sun), float64(sp.Ring), float64(sp.Carrier)
	var w float64
	switch unknown {
	case Sun:
		w = i0*wr + (1-i0)*wc
		sp.Sun = units.AngularVelocity(w)
	case Ring:
		w = (ws - (1-i0)*wc) / i0
		sp.Ring = units.AngularVelocity(w)
	case Carrier:
		w = (ws - i0*wr) / (1 - i0)
		sp.Carrier = units.AngularVelocity(w)
	}
	if !isFinite(w) {
		return Speeds{}, notFinite(unknown.String()+" speed", w)
	}
	return sp, nil
}

// Residual returns the relative residual of the Willis equation for sp,
// |ωSun − i0·ωRing − (1 − i0)·ωCarrier| / (|ωSun| + |i0·ωRing| + |(1 − i0)·ωCarrier|),
// zero when all speeds are zero.
func (s Set) Residual(sp Speeds) float64 {
	a, b, c := float64(sp.Sun), s.i0*float64(sp.Ring), (1-s.i0)*float64(sp.Carrier)
	scale := math.Abs(a) + math.Abs(b) + math.Abs(c)
	if scale == 0 {
		return 0
	}
	return math.Abs(a-b-c) / scale
}

// Ratio returns the speed ratio ω_in/ω_out from member in to member out with
// the third member held (speed zero). The six cases, from the Willis equation:
//
//	carrier held: ωSun/ωRing = i0                ωRing/ωSun = 1/i0
//	ring held:    ωSun/ωCarrier = 1 − i0         ωCarrier/ωSun = 1/(1 − i0)
//	sun held:     ωRing/ωCarrier = 1 − 1/i0      ωCarrier/ωRing = i0/(i0 − 1)
//
// in and out must be two different valid members (ErrMember otherwise).
func (s Set) Ratio(in, out Member) (float64, error) {
	if !s.valid() {
		return 0, errZeroSet
	}
	if !in.valid() || !out.valid() || in == out {
		return 0, ErrMember
	}
	// Output speed 1, the held member's speed 0: solve for the input.
	var sp Speeds
	switch out {
	case Sun:
		sp.Sun = 1
	case Ring:
		sp.Ring = 1
	case Carrier:
		sp.Carrier = 1
	}
	r, err := s.Solve(sp, in)
	if err != nil {
		return 0, err
	}
	return float64(r.Of(in)), nil
}

// PlanetSpeeds are the speeds of the planets about their own axes:
// relative to the carrier (the speeds their bearings see) and absolute (in
// the frame of the housing, relative speed plus carrier speed, the speed
// a churning or windage estimate needs). For a SinglePlanet set Outer
// equals Inner.
type PlanetSpeeds struct {
	Inner units.AngularVelocity // the planet meshing the sun, relative to the carrier
	Outer units.AngularVelocity // the planet meshing the ring (double planet), relative to the carrier
	// InnerAbsolute and OuterAbsolute are Inner and Outer plus the carrier
	// speed.
	InnerAbsolute, OuterAbsolute units.AngularVelocity
}

// PlanetSpeeds returns the planet speeds relative to the carrier and
// absolute. With u = ωSun − ωCarrier, an external mesh reversing the sense:
//
//	single planet: ωPlanet − ωCarrier = −(z_sun/z_planet)·u
//	double planet: inner −(z_sun/z_inner)·u, outer +(z_sun/z_outer)·u
//	absolute:      ωPlanet = (ωPlanet − ωCarrier) + ωCarrier
//
// Profile shifts change the centre distances, not these ratios (the
// base-circle ratio of each mesh is the tooth ratio).
//
// The speeds must satisfy the Willis equation (ErrWillis otherwise); a set
// from FromRatio has no tooth counts (ErrNoTeeth).
func (s Set) PlanetSpeeds(sp Speeds) (PlanetSpeeds, error) {
	if !s.valid() {
		return PlanetSpeeds{}, errZeroSet
	}
	if !s.teeth {
		return PlanetSpeeds{}, ErrNoTeeth
	}
	if err := s.checkSpeeds(sp); err != nil {
		return PlanetSpeeds{}, err
	}
	u := float64(sp.Sun) - float64(sp.Carrier)
	if math.IsInf(u, 0) {
		return PlanetSpeeds{}, &InputError{Quantity: "sun speed relative to carrier", Value: u, Limit: math.MaxFloat64, Err: ErrNotFinite}
	}
	zs := float64(s.d.Sun)
	in := -zs / float64(s.d.Planet) * u
	out := in
	if s.d.Arrangement == DoublePlanet {
		out = zs / float64(s.d.OuterPlanet) * u
	}
	wc := float64(sp.Carrier)
	ia, oa := in+wc, out+wc
	if !isFinite(ia) || !isFinite(oa) {
		return PlanetSpeeds{}, &InputError{Quantity: "absolute planet speed", Value: ia + oa, Limit: math.MaxFloat64, Err: ErrNotFinite}
	}
	return PlanetSpeeds{Inner: units.AngularVelocity(in), Outer: units.AngularVelocity(out),
		InnerAbsolute: units.AngularVelocity(ia), OuterAbsolute: units.AngularVelocity(oa)}, nil
}

// checkSpeeds checks that all three speeds are finite and satisfy Willis.
func (s Set) checkSpeeds(sp Speeds) error {
	for m := Sun; m <= Carrier; m++ {
		if v := float64(sp.Of(m)); !isFinite(v) {
			return notFinite(m.String()+" speed", v)
		}
	}
	if r := s.Residual(sp); !(r <= WillisTolerance) {
		return &InputError{Quantity: "relative Willis residual", Value: r, Limit: WillisTolerance, Err: ErrWillis}
	}
	return nil
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// notFinite builds the error for a NaN or infinite value; callers build the
// name only on this error path so the hot paths do not allocate.
func notFinite(q string, v float64) error {
	return &InputError{Quantity: q, Value: v, Limit: math.MaxFloat64, Err: ErrNotFinite}
}
