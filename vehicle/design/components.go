package design

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/planetary"
	"github.com/powersplit-dev/powersplit/units"
)

// Teeth gives a planetary set by its tooth counts and profile shifts
// (planetary.Design); the set is then built by planetary.New with its
// design checks (coaxial condition with the shifts, assembly, neighbour
// clearance, undercut, pointed teeth), and its fixed-carrier ratio follows
// from the teeth: −ring/sun for single planets, +ring/sun for planet
// pairs.
type Teeth struct {
	// Sun, Ring and Planet are the tooth counts of the sun, the ring and
	// the planet meshing the sun.
	Sun    int `json:"sun"`
	Ring   int `json:"ring"`
	Planet int `json:"planet"`
	// Planets is the number of planets (planet pairs), ≥ 1, equally
	// spaced.
	Planets int `json:"planets"`
	// Arrangement is "single planet" (optional; the default) or "double
	// planet" (planet pairs).
	Arrangement string `json:"arrangement,omitempty"`
	// OuterPlanet is the tooth count of a pair's outer planet, the one
	// meshing the ring (optional; double planet only; the same as Planet
	// when left out).
	OuterPlanet int `json:"outerPlanet,omitempty"`
	// Module is the normal module of all meshes (optional, mm; without it
	// lengths in the checks' messages are in modules).
	Module units.Length `json:"module,omitempty"`
	// SunShift, PlanetShift, RingShift and OuterPlanetShift are the
	// profile-shift coefficients x of each gear: the tool's offset in
	// modules, positive out of the blank (optional; 0, unshifted, when
	// left out; each within ±2). A positive RingShift moves the ring's
	// teeth outward and, like a positive planet shift, widens the
	// planet–ring centre distance (see planetary.Design). An external gear
	// of fewer than 17 teeth needs a positive shift against undercut:
	// x ≥ (17 − z)/17.
	SunShift         float64 `json:"sunShift,omitempty"`
	PlanetShift      float64 `json:"planetShift,omitempty"`
	RingShift        float64 `json:"ringShift,omitempty"`
	OuterPlanetShift float64 `json:"outerPlanetShift,omitempty"`
}

// arrangements are the words of Teeth.Arrangement.
var arrangements = map[string]planetary.Arrangement{"": planetary.SinglePlanet,
	"single planet": planetary.SinglePlanet, "double planet": planetary.DoublePlanet}

// keyError is a mistake at a key below the object being built; validate
// turns it into a FieldError at that key's path.
type keyError struct {
	key string // relative path, for example "set.teeth" or "oilViscosityIndex"
	err error
}

func (e *keyError) Error() string { return e.key + ": " + e.err.Error() }
func (e *keyError) Unwrap() error { return e.err }

// build returns the planetary set: from Teeth when given (a
// FixedCarrierRatio given as well must agree with the teeth's), else from
// FixedCarrierRatio. Errors are *keyError values relative to the set.
func (s Set) build() (planetary.Set, error) {
	if s.Teeth == nil {
		set, err := planetary.FromRatio(s.FixedCarrierRatio, s.BasicEfficiency)
		if err != nil {
			return set, &keyError{"fixedCarrierRatio", err}
		}
		return set, nil
	}
	tt := s.Teeth
	arr, ok := arrangements[strings.ToLower(strings.TrimSpace(tt.Arrangement))]
	if !ok {
		return planetary.Set{}, &keyError{"teeth.arrangement", fmt.Errorf("%w: %q is not one of single planet, double planet", ErrValue, tt.Arrangement)}
	}
	set, err := planetary.New(planetary.Design{Sun: tt.Sun, Ring: tt.Ring, Planet: tt.Planet, Planets: tt.Planets,
		Arrangement: arr, OuterPlanet: tt.OuterPlanet, Module: tt.Module, BasicEfficiency: s.BasicEfficiency,
		SunShift: tt.SunShift, PlanetShift: tt.PlanetShift, RingShift: tt.RingShift, OuterPlanetShift: tt.OuterPlanetShift})
	if err != nil {
		return set, &keyError{"teeth", err}
	}
	if i0 := set.FixedCarrierRatio(); s.FixedCarrierRatio != 0 && math.Abs(s.FixedCarrierRatio-i0) > 1e-9*math.Abs(i0) {
		return set, &keyError{"fixedCarrierRatio", fmt.Errorf("%w: %s disagrees with the teeth's %s (leave it out, or give the teeth's)",
			ErrValue, strconv.FormatFloat(s.FixedCarrierRatio, 'g', -1, 64), strconv.FormatFloat(i0, 'g', -1, 64))}
	}
	return set, nil
}

// presets are the oils of Transmission.Oil without a viscosity index.
var presets = map[float64]hydrostat.Oil{32: hydrostat.VG32, 46: hydrostat.VG46, 68: hydrostat.VG68}

// grade reads an ISO viscosity grade written "VG46", "VG 46" or "ISO VG
// 46" (any case) and returns its number.
func grade(s string) (float64, bool) {
	t := strings.ToUpper(strings.ReplaceAll(s, " ", ""))
	t = strings.TrimPrefix(t, "ISO")
	if !strings.HasPrefix(t, "VG") {
		return 0, false
	}
	g, err := strconv.ParseFloat(t[2:], 64)
	if err != nil || !slices.Contains(hydrostat.ISOGrades[:], g) {
		return 0, false
	}
	return g, true
}

// hydraulicOil builds the loop's oil from Oil, OilViscosityIndex and
// OilViscosity. Errors are *keyError values relative to the transmission.
func (t Transmission) hydraulicOil() (hydrostat.Oil, error) {
	if t.OilViscosity != 0 {
		if t.Oil != "" || t.OilViscosityIndex != nil {
			return hydrostat.Oil{}, &keyError{"oilViscosity", fmt.Errorf("%w: give either a fixed viscosity or an oil grade (with its viscosity index), not both", ErrValue)}
		}
		if !(t.OilViscosity > 0) || math.IsInf(float64(t.OilViscosity), 0) {
			return hydrostat.Oil{}, &keyError{"oilViscosity", fmt.Errorf("%w: must be greater than zero", ErrValue)}
		}
		o, err := hydrostat.NewOil(hydrostat.OilSpec{Name: "fixed " + t.OilViscosity.String(), Viscosity: t.OilViscosity})
		if err != nil {
			return o, &keyError{"oilViscosity", err}
		}
		return o, nil
	}
	g, ok := grade(t.Oil)
	if t.OilViscosityIndex != nil {
		if !ok {
			return hydrostat.Oil{}, &keyError{"oil", fmt.Errorf("%w: %q is not an ISO 3448 viscosity grade (VG2 to VG3200)", ErrValue, t.Oil)}
		}
		o, err := hydrostat.NewGradeOil(g, *t.OilViscosityIndex)
		if err != nil {
			return o, &keyError{"oilViscosityIndex", err}
		}
		return o, nil
	}
	if o, ok := presets[g]; ok {
		return o, nil
	}
	if ok {
		return hydrostat.Oil{}, &keyError{"oil", fmt.Errorf("%w: %q needs its viscosity index (oilViscosityIndex); only VG32, VG46 and VG68 have presets", ErrValue, t.Oil)}
	}
	if t.Oil == "" {
		return hydrostat.Oil{}, &keyError{"oil", fmt.Errorf("%w: missing (an ISO grade such as \"VG46\", or give oilViscosity)", ErrValue)}
	}
	return hydrostat.Oil{}, &keyError{"oil", fmt.Errorf("%w: %q is not one of VG32, VG46, VG68 (other ISO grades with oilViscosityIndex)", ErrValue, t.Oil)}
}

// validateParts checks the parts this file adds to a transmission (sets
// by teeth, oil by grade and viscosity index or fixed viscosity, the
// constant loss torque) with the JSON path of the key at fault.
func (t Transmission) validateParts(c *checker, field string) {
	at := func(prefix string, err error) {
		path := field
		var ke *keyError
		if errors.As(err, &ke) {
			path, err = field+"."+prefix+ke.key, ke.err
		}
		c.errs = append(c.errs, c.f.fieldError(path, err))
	}
	if t.Set.Teeth != nil {
		if _, err := t.Set.build(); err != nil {
			at("set.", err)
		}
	}
	if t.Set2 != nil && t.Set2.Teeth != nil {
		if _, err := t.Set2.build(); err != nil {
			at("set2.", err)
		}
	}
	if _, err := t.hydraulicOil(); err != nil {
		at("", err)
	}
	if ct := float64(t.Losses.ConstantTorque); !(ct >= 0) || math.IsInf(ct, 0) {
		c.add(field+".losses.constantTorque", "must be zero or greater")
	}
}
