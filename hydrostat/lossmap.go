package hydrostat

import (
	"fmt"
	"math"
	"sort"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
)

// MapSpec holds measured efficiencies of a unit, for users with test data.
// The tables are indexed [setting][speed][pressure], over the magnitudes of
// setting, speed and pressure difference. Values are ISO 4409 efficiencies
// in (0, 1].
type MapSpec struct {
	Speeds    []units.AngularVelocity // |ω|, strictly increasing, ≥ 0, at least 2
	Pressures []units.Pressure        // |Δp|, strictly increasing, ≥ 0, at least 2
	// Settings are the |x| of the layers, strictly increasing in (0, 1].
	// With a single layer the table applies at every setting (a fixed unit).
	Settings        []float64
	Volumetric      [][][]float64 // η_v when pumping (and motoring, if the next two are nil)
	HydroMechanical [][][]float64 // η_hm when pumping (and motoring, if the next two are nil)
	// Optional tables for motoring; nil means the pumping tables serve both.
	MotoringVolumetric      [][][]float64
	MotoringHydroMechanical [][][]float64
}

// Map is a measured-map loss model: it interpolates the efficiency tables
// bilinearly in speed and pressure and linearly between setting layers, and
// turns the efficiencies into leakage and loss torque so that a unit using
// it reproduces the tabled efficiencies. A point outside the tables is
// ErrOutsideMap, never extrapolated. Idle points (zero setting, speed or
// pressure) have no losses. The map ignores the oil: it holds for the oil
// and temperature of the test.
type Map struct {
	settings []float64
	// grids[k][layer]: k = 0 pump η_v, 1 pump η_hm, 2 motor η_v, 3 motor η_hm
	grids [4][]numeric.Grid2
}

// NewMap validates s and builds the map.
func NewMap(s MapSpec) (Map, error) {
	if len(s.Settings) == 0 {
		return Map{}, fmt.Errorf("%w: map needs at least one setting layer", ErrInvalid)
	}
	for i, x := range s.Settings {
		if !(x > 0 && x <= 1) || (i > 0 && !(x > s.Settings[i-1])) {
			return Map{}, fmt.Errorf("%w: map settings must increase strictly within (0, 1]", ErrInvalid)
		}
	}
	xs := make([]float64, len(s.Speeds))
	for i, w := range s.Speeds {
		xs[i] = float64(w)
		if !(xs[i] >= 0) {
			return Map{}, fmt.Errorf("%w: map speed %v", ErrInvalid, w)
		}
	}
	ys := make([]float64, len(s.Pressures))
	for i, p := range s.Pressures {
		ys[i] = float64(p)
		if !(ys[i] >= 0) {
			return Map{}, fmt.Errorf("%w: map pressure %v", ErrInvalid, p)
		}
	}
	tables := [4][][][]float64{s.Volumetric, s.HydroMechanical, s.MotoringVolumetric, s.MotoringHydroMechanical}
	if (tables[2] == nil) != (tables[3] == nil) {
		return Map{}, fmt.Errorf("%w: give both motoring tables or neither", ErrInvalid)
	}
	if tables[2] == nil {
		tables[2], tables[3] = tables[0], tables[1]
	}
	m := Map{settings: append([]float64(nil), s.Settings...)}
	for k, t := range tables {
		if len(t) != len(s.Settings) {
			return Map{}, fmt.Errorf("%w: table %d has %d layers for %d settings", ErrInvalid, k, len(t), len(s.Settings))
		}
		for _, layer := range t {
			for _, row := range layer {
				for _, v := range row {
					if !(v > 0 && v <= 1) {
						return Map{}, fmt.Errorf("%w: map efficiency %v outside (0, 1]", ErrInvalid, v)
					}
				}
			}
			g, err := numeric.NewGrid2(xs, ys, layer)
			if err != nil {
				return Map{}, fmt.Errorf("%w: %v", ErrInvalid, err)
			}
			m.grids[k] = append(m.grids[k], g)
		}
	}
	return m, nil
}

// Validate reports whether the map was built with NewMap.
func (m Map) Validate() error {
	if len(m.settings) == 0 {
		return fmt.Errorf("%w: map not built with NewMap", ErrInvalid)
	}
	return nil
}

// Efficiencies returns the interpolated volumetric and hydraulic-mechanical
// efficiency for the given mode (Motoring selects the motoring tables) at
// |x|, |ω| and |Δp|.
func (m Map) Efficiencies(mode Mode, setting float64, w units.AngularVelocity, dp units.Pressure) (volumetric, hydroMechanical float64, err error) {
	if len(m.settings) == 0 {
		return 0, 0, fmt.Errorf("%w: map not built with NewMap", ErrInvalid)
	}
	x, sw, sp := math.Abs(setting), math.Abs(float64(w)), math.Abs(float64(dp))
	k := 0
	if mode == Motoring {
		k = 2
	}
	ev, err := m.layered(k, x, sw, sp)
	if err != nil {
		return 0, 0, err
	}
	eh, err := m.layered(k+1, x, sw, sp)
	if err != nil {
		return 0, 0, err
	}
	return ev, eh, nil
}

func (m *Map) layered(k int, x, w, p float64) (float64, error) {
	gs := m.grids[k]
	if len(gs) == 1 {
		return m.grid(gs[0], w, p)
	}
	n := len(m.settings)
	if !(x >= m.settings[0] && x <= m.settings[n-1]) {
		return 0, ErrOutsideMap
	}
	i := sort.SearchFloat64s(m.settings, x) - 1
	i = max(0, min(i, n-2))
	a, err := m.grid(gs[i], w, p)
	if err != nil {
		return 0, err
	}
	b, err := m.grid(gs[i+1], w, p)
	if err != nil {
		return 0, err
	}
	u := (x - m.settings[i]) / (m.settings[i+1] - m.settings[i])
	return a + u*(b-a), nil
}

func (m *Map) grid(g numeric.Grid2, w, p float64) (float64, error) {
	v, err := g.At(w, p)
	if err != nil {
		return 0, ErrOutsideMap
	}
	return v, nil
}

// Losses implements LossModel: pumping L = (1 − η_v)·Q_i and
// τ = T_i·(1/η_hm − 1); motoring L = Q_i·(1/η_v − 1) and τ = T_i·(1 − η_hm),
// with Q_i = |x|·D_max·|ω| and T_i = |x|·D_max·|Δp|.
func (m Map) Losses(c Condition) (Losses, error) {
	if c.Mode == Idle {
		return Losses{}, nil
	}
	ev, eh, err := m.Efficiencies(c.Mode, c.Setting, c.Speed, c.Pressure)
	if err != nil {
		return Losses{}, err
	}
	d := math.Abs(c.Setting) * float64(c.MaxDisplacement)
	qi := d * math.Abs(float64(c.Speed))
	ti := d * math.Abs(float64(c.Pressure))
	if c.Mode == Motoring {
		return Losses{Leakage: units.VolumeFlow(qi * (1/ev - 1)), Torque: units.Torque(ti * (1 - eh))}, nil
	}
	return Losses{Leakage: units.VolumeFlow(qi * (1 - ev)), Torque: units.Torque(ti * (1/eh - 1))}, nil
}
