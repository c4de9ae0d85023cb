package hydrostat

import (
	"fmt"
	"math"

	"github.com/powersplit-dev/powersplit/units"
)

// LossModel gives the leakage flow and the loss torque of a unit at an
// operating point. Implementations must be safe for concurrent use, should
// not allocate, and must return finite, non-negative losses or an error.
type LossModel interface {
	Losses(c Condition) (Losses, error)
}

// Condition is an operating point as a loss model sees it.
type Condition struct {
	Setting         float64               // relative displacement x in [-1, 1]
	MaxDisplacement units.Displacement    // D_max, per radian
	Speed           units.AngularVelocity // signed shaft speed ω
	Pressure        units.Pressure        // |Δp|, high minus low, ≥ 0
	Viscosity       units.DynamicViscosity
	Density         units.Density
	BulkModulus     units.Pressure
	Temperature     units.Temperature
	Mode            Mode // from the sign of the ideal power Δp·x·D_max·ω
}

// Losses are the two loss quantities of a unit. Both are magnitudes.
type Losses struct {
	Leakage units.VolumeFlow // ≥ 0, flow from the high to the low side (all flow losses)
	Torque  units.Torque     // ≥ 0, loss torque opposing the motion
}

// Wilson is the Wilson loss model (Trans. ASME 71, 1949) in dimensionless
// coefficients, with the extensions of Proc. IMechE 198B (1984) and of
// Hydrostatic Pumps and Motors (2001). D is per radian (see doc.go for the
// exact form and for coefficients quoted per revolution). The zero value is
// lossless.
//
//	Q_s = Cs·D_q·|Δp|/μ                          laminar leakage
//	Q_r = (Cr + |x|)·D_max·|ω|·|Δp|/β             compression (if Compressibility)
//	T_v = Cv·D_t·μ·|ω|                           viscous drag
//	T_f = Cf·D_t·|Δp|                            Coulomb friction ∝ load
//	T_c = p_c·D_t + T_0                          constant torque
//	T_h = Ch·ρ·ω²·D_t^(5/3)                      hydrodynamic (churning) torque
//	D_q = D_max·(1 − s_q + s_q·|x|),  D_t = D_max·(1 − s_t + s_t·|x|)
//
// The term p_c·D_t is constant in speed and pressure but, with
// TorqueSetting s_t > 0, falls with the setting like every other torque
// term (at x = 0 it is (1 − s_t)·p_c·D_max). ConstantTorque T_0 is truly
// constant: the same at every setting, speed and pressure (a seal or
// bearing drag that no swash angle changes). Neither acts at ω = 0.
type Wilson struct {
	Slip         float64 // Cs, laminar leakage coefficient, ≥ 0
	Viscous      float64 // Cv, viscous drag coefficient, ≥ 0
	Friction     float64 // Cf, Coulomb friction coefficient, ≥ 0 (torque loss per ideal torque at full setting)
	Hydrodynamic float64 // Ch, churning torque coefficient, ≥ 0

	// ConstantPressure p_c expresses a constant loss torque as the
	// pressure difference that would produce it at displacement D_t (so it
	// scales with the unit's size and, with TorqueSetting > 0, with the
	// setting).
	ConstantPressure units.Pressure
	// ConstantTorque T_0 is a loss torque independent of setting, speed and
	// pressure (not of size: it belongs to one unit), ≥ 0; 0 means none.
	ConstantTorque units.Torque

	// Compressibility adds the compression flow loss Q_r; DeadVolume is Cr,
	// the dead volume of all cylinders at full setting divided by the
	// volume displaced per revolution at full setting (typically 0.2–1).
	Compressibility bool
	DeadVolume      float64

	// LeakageSetting s_q and TorqueSetting s_t in [0, 1] choose how the
	// leakage and the torque terms scale: 0 (default) with the maximum
	// displacement (the classic Wilson form), 1 with the set displacement
	// |x|·D_max, in between a blend.
	LeakageSetting float64
	TorqueSetting  float64
}

// Validate reports an error for negative, NaN or infinite coefficients or
// settings shares outside [0, 1].
func (m Wilson) Validate() error {
	for _, c := range []struct {
		name string
		v    float64
	}{
		{"slip", m.Slip}, {"viscous", m.Viscous}, {"friction", m.Friction},
		{"hydrodynamic", m.Hydrodynamic}, {"constant pressure", float64(m.ConstantPressure)},
		{"constant torque", float64(m.ConstantTorque)},
		{"dead volume", m.DeadVolume},
	} {
		if !finite(c.v) || c.v < 0 {
			return fmt.Errorf("%w: Wilson %s coefficient %v must be finite and ≥ 0", ErrInvalid, c.name, c.v)
		}
	}
	for _, s := range []float64{m.LeakageSetting, m.TorqueSetting} {
		if !(s >= 0 && s <= 1) {
			return fmt.Errorf("%w: Wilson setting share %v must be in [0, 1]", ErrInvalid, s)
		}
	}
	return nil
}

// Losses implements LossModel.
func (m Wilson) Losses(c Condition) (Losses, error) {
	return m.losses(c.Setting, float64(c.MaxDisplacement), float64(c.Speed), float64(c.Pressure),
		float64(c.Viscosity), float64(c.Density), float64(c.BulkModulus), 0)
}

// losses is Losses on plain numbers (Unit.eval calls it directly); d53,
// when positive, is dmax^(5/3), known to the unit.
func (m *Wilson) losses(x, dmax, w, dp, mu, rho, beta, d53 float64) (Losses, error) {
	x, dp, w = math.Abs(x), math.Abs(dp), math.Abs(w)
	if !(dmax > 0) || !(mu > 0) || !finite(dmax) || !finite(mu) || !finite(dp) || !finite(w) || !(x <= 1) {
		return Losses{}, fmt.Errorf("%w: Wilson needs D_max > 0, viscosity > 0 and finite values", ErrInvalid)
	}
	dq := dmax * (1 - m.LeakageSetting + m.LeakageSetting*x)
	dt := dmax * (1 - m.TorqueSetting + m.TorqueSetting*x)
	leak := m.Slip * dq * dp / mu
	if m.Compressibility {
		if !(beta > 0) || !finite(beta) {
			return Losses{}, fmt.Errorf("%w: compressibility needs a positive bulk modulus", ErrInvalid)
		}
		leak += (m.DeadVolume + x) * dmax * w * dp / beta
	}
	tau := m.Viscous*dt*mu*w + m.Friction*dt*dp + float64(m.ConstantPressure)*dt + float64(m.ConstantTorque)
	if m.Hydrodynamic > 0 {
		if !(rho > 0) || !finite(rho) {
			return Losses{}, fmt.Errorf("%w: hydrodynamic torque needs a positive density", ErrInvalid)
		}
		if m.TorqueSetting != 0 || !(d53 > 0) {
			c := math.Cbrt(dt) // dt^(5/3) = dt·∛dt², a third of the cost of math.Pow
			d53 = dt * c * c
		}
		tau += m.Hydrodynamic * rho * w * w * d53
	}
	return Losses{Leakage: units.VolumeFlow(leak), Torque: units.Torque(tau)}, nil
}

// WilsonPerRev converts coefficients quoted for the per-revolution form of
// the model into the per-radian coefficients of Wilson. The form assumed,
// with V = 2π·D the displacement per revolution and ω in rad/s:
//
//	Q_s = Cs'·V_q·|Δp|/μ          → Cs = 2π·Cs'
//	T_v = Cv'·V_t·μ·|ω|           → Cv = 2π·Cv'
//	T_h = Ch'·ρ·ω²·V_t^(5/3)      → Ch = (2π)^(5/3)·Ch'
//	T_f = Cf·(V_t·|Δp|/2π)        friction as a fraction of the ideal torque: Cf unchanged
//	T_c = p_c·V_t/2π + T_0        constant torque as a pressure, or a torque: unchanged
//
// Only the coefficients that multiply a displacement written per
// revolution change: a friction quoted as a fraction of the ideal torque
// (2 % is 2 % however the displacement is written) and a pressure are the
// same in both forms, and so are the dead-volume ratio and the setting
// shares. Check the source's own equations before converting:
//
//   - a source that writes the friction (or the constant torque) on the
//     per-revolution displacement without the 2π, T_f = Cf'·V·|Δp|, has
//     Cf = 2π·Cf' (p_c = 2π·p_c'): convert those two by hand;
//   - a source that writes the speed in revolutions per second where it
//     multiplies V, T_v = Cv'·V·μ·n, has V·n = D·ω and so Cv = Cv' (not this
//     function);
//   - a source that quotes efficiencies, η_v = 1 − Cs·|Δp|/(μ·ω) with ω in
//     rad/s, has per-radian coefficients whatever unit it gives the
//     displacement in (not this function).
func WilsonPerRev(m Wilson) Wilson {
	const k = 2 * math.Pi
	m.Slip *= k
	m.Viscous *= k
	m.Hydrodynamic *= math.Pow(k, 5.0/3)
	return m
}
