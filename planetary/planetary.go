package planetary

import (
	"errors"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// Member names one of the three shafts of a set. The zero Member is
// NoMember, so that a field left unset is never taken for a real member.
type Member int

// The members of a set.
const (
	// NoMember is the zero value: no member given. Every function that
	// takes a member refuses it (ErrMember); a spec field left at
	// NoMember means its documented default.
	NoMember Member = iota
	Sun
	Ring
	Carrier
)

// String returns "sun", "ring", "carrier" or "no member".
func (m Member) String() string {
	switch m {
	case NoMember:
		return "no member"
	case Sun:
		return "sun"
	case Ring:
		return "ring"
	case Carrier:
		return "carrier"
	}
	return "Member(" + fmtNum(float64(m)) + ")"
}

func (m Member) valid() bool { return m >= Sun && m <= Carrier }

// Arrangement says how sun and ring are connected through the planets.
type Arrangement int

// The arrangements.
const (
	// SinglePlanet: each planet meshes with sun and ring; i0 = −z_ring/z_sun.
	SinglePlanet Arrangement = iota
	// DoublePlanet: planet pairs; the inner planet meshes with the sun, the
	// outer one with the ring and the two with each other; i0 = +z_ring/z_sun.
	DoublePlanet
)

// String returns "single planet" or "double planet".
func (a Arrangement) String() string {
	switch a {
	case SinglePlanet:
		return "single planet"
	case DoublePlanet:
		return "double planet"
	}
	return "Arrangement(" + fmtNum(float64(a)) + ")"
}

// Default basic (fixed-carrier) efficiencies, used where a Design or
// FromRatio gives zero.
const (
	// DefaultSingleEfficiency is η0 of a single-planet set.
	// From memory: Epicyclic Drive Trains (1982) gives η0 ≈ 0.97…0.99
	// for simple single-planet (negative-ratio) sets; 0.98 is the middle.
	// It equals one external mesh (≈ 0.985) times one internal mesh (≈ 0.995).
	DefaultSingleEfficiency = 0.98
	// DefaultDoubleEfficiency is η0 of a double-planet set. Its power path
	// from sun to ring in the carrier frame crosses two external meshes and
	// one internal mesh, one external mesh more than a single-planet set:
	// 0.98 × 0.99 ≈ 0.970 (hand calculation with an external-mesh efficiency
	// of 0.99). From memory: Epicyclic Drive Trains (1982) puts such
	// positive-ratio sets with planet pairs about one point below simple
	// sets.
	DefaultDoubleEfficiency = 0.97
)

// Design describes a set by tooth counts. Zero Module means "not given":
// the neighbour check needs only tooth counts with standard addendum (the
// module cancels) and then reports lengths in multiples of the module.
// Zero BasicEfficiency means the default for the arrangement.
type Design struct {
	Sun, Ring, Planet int          // teeth; Planet is the planet meshing the sun
	Planets           int          // number of planets (planet pairs), ≥ 1
	Arrangement       Arrangement  // SinglePlanet (default) or DoublePlanet
	Module            units.Length // normal module of all meshes; 0: not given
	BasicEfficiency   float64      // η0 in (0,1]; 0 means DefaultSingleEfficiency or DefaultDoubleEfficiency
	// OuterPlanet is the tooth count of the outer planet of a pair (the one
	// meshing the ring) in a DoublePlanet set; 0 means equal to Planet.
	// Ignored for SinglePlanet.
	OuterPlanet int
	// Profile-shift coefficients x (addendum modification in multiples of
	// the module, tool moved out of the blank positive); 0 means unshifted.
	// RingShift > 0 moves the ring's teeth outward (its tip circle grows to
	// m(z_ring − 2 + 2x)), so that, like a positive planet shift, it widens
	// the planet–ring centre distance (ISO 21771 counts an internal gear's
	// shift with the opposite sign). OuterPlanetShift is the outer planet's
	// of a pair (with OuterPlanet 0, the outer planet copies the inner one,
	// shift included, unless OuterPlanetShift is given). See Check for what
	// shifts allow.
	SunShift, PlanetShift, RingShift, OuterPlanetShift float64
}

// Set is a planetary gear set: its fixed-carrier ratio i0, basic efficiency
// η0 and, when built by New, its tooth counts. A Set is immutable and safe
// for concurrent use. The zero Set is not valid; build one with New or
// FromRatio.
type Set struct {
	i0, eta0 float64
	d        Design
	teeth    bool
}

// New validates d, runs the design checks (see Check) and returns the set.
// Every violated condition is reported, joined with errors.Join; each is a
// *DesignError or *InputError (find them with errors.As).
func New(d Design) (Set, error) {
	if err := Check(d); err != nil {
		return Set{}, err
	}
	d = normalise(d)
	i0 := float64(d.Ring) / float64(d.Sun)
	if d.Arrangement == SinglePlanet {
		i0 = -i0
	}
	if err := checkBand(i0, d.BasicEfficiency); err != nil {
		return Set{}, err
	}
	return Set{i0: i0, eta0: d.BasicEfficiency, d: d, teeth: true}, nil
}

func normalise(d Design) Design {
	if d.BasicEfficiency == 0 {
		if d.Arrangement == DoublePlanet {
			d.BasicEfficiency = DefaultDoubleEfficiency
		} else {
			d.BasicEfficiency = DefaultSingleEfficiency
		}
	}
	if d.Arrangement == SinglePlanet {
		d.OuterPlanet = 0
		d.OuterPlanetShift = 0
	} else if d.OuterPlanet == 0 {
		d.OuterPlanet = d.Planet
		if d.OuterPlanetShift == 0 {
			d.OuterPlanetShift = d.PlanetShift
		}
	}
	return d
}

// FromRatio returns a set given only by its fixed-carrier ratio i0 and basic
// efficiency η0, for concept studies; eta0 == 0 means the default
// (DefaultSingleEfficiency for i0 < 0, DefaultDoubleEfficiency for i0 > 0).
//
// i0 must be finite and outside the band [η0, 1/η0] around one: there the
// set is self-locking when driven from the carrier and the carrier torque
// does not fix the sun torque (i0 = 1 itself is a set that only turns as a
// block). Such a set has no tooth counts: PlanetSpeeds returns ErrNoTeeth.
func FromRatio(i0, eta0 float64) (Set, error) {
	if math.IsNaN(i0) || math.IsInf(i0, 0) || i0 == 0 {
		return Set{}, &InputError{Quantity: "fixed-carrier ratio", Value: i0, Limit: math.NaN(), Err: ErrRatio}
	}
	if math.IsNaN(eta0) || eta0 < 0 || eta0 > 1 {
		return Set{}, &InputError{Quantity: "basic efficiency", Value: eta0, Limit: 1, Err: ErrEfficiency}
	}
	if eta0 == 0 {
		eta0 = DefaultSingleEfficiency
		if i0 > 0 {
			eta0 = DefaultDoubleEfficiency
		}
	}
	if err := checkBand(i0, eta0); err != nil {
		return Set{}, err
	}
	return Set{i0: i0, eta0: eta0}, nil
}

// checkBand rejects i0 in [η0, 1/η0], where 1 − i0·η0 and 1 − i0/η0 (the
// carrier torque factors of the two flow directions) differ in sign or vanish.
func checkBand(i0, eta0 float64) error {
	if i0 >= eta0 && i0 <= 1/eta0 {
		return &InputError{Quantity: "fixed-carrier ratio (self-locking band [η0, 1/η0])", Value: i0, Limit: 1 / eta0, Err: ErrRatio}
	}
	return nil
}

// FixedCarrierRatio returns i0 = (ωSun − ωCarrier)/(ωRing − ωCarrier), the
// ratio sun to ring with the carrier held.
func (s Set) FixedCarrierRatio() float64 { return s.i0 }

// BasicEfficiency returns η0, the efficiency of the set with the carrier held.
func (s Set) BasicEfficiency() float64 { return s.eta0 }

// Design returns the tooth counts the set was built from (with defaults
// filled in) and true, or a zero Design and false for a set from FromRatio.
func (s Set) Design() (Design, bool) { return s.d, s.teeth }

// valid reports whether s was built by New or FromRatio.
func (s Set) valid() bool { return s.i0 != 0 && s.eta0 > 0 }

var errZeroSet = errors.Join(ErrRatio, errors.New("planetary: zero Set, build one with New or FromRatio"))
