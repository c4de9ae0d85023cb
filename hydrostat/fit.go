package hydrostat

import (
	"fmt"
	"math"
	"strconv"

	"github.com/powersplit-dev/powersplit/internal/numeric"
	"github.com/powersplit-dev/powersplit/units"
	"gonum.org/v1/gonum/mat"
)

// Measurement is one steady operating point of a unit on a test bench, in
// the terms of ISO 4409: magnitudes, each as the standard measures it.
type Measurement struct {
	Speed       units.AngularVelocity // shaft speed |ω|, > 0
	Pressure    units.Pressure        // pressure difference |Δp| between the ports, > 0
	Setting     float64               // relative displacement x in (0, 1]
	Flow        units.VolumeFlow      // effective flow: delivered (pump) or supplied (motor), > 0
	Torque      units.Torque          // shaft torque: driving (pump) or delivered (motor), > 0
	Temperature units.Temperature     // oil temperature at the inlet
	Mode        Mode                  // Pumping or Motoring
}

// Efficiencies are the ISO 4409 efficiencies of one measurement.
type Efficiencies struct {
	Volumetric, HydroMechanical, Overall float64
}

// ISO4409 returns the efficiencies of m computed directly from the
// measured quantities, with the displacement x·D_max (D_max per radian):
//
//	pumping:  η_v = Q/(x·D·ω),  η_hm = Δp·x·D/T,  η = Δp·Q/(T·ω)
//	motoring: η_v = x·D·ω/Q,    η_hm = T/(Δp·x·D), η = T·ω/(Δp·Q)
//
// Unlike Point's efficiencies these are not clipped to [0, 1]: a value
// above one shows a measurement (or a displacement) that does not fit.
func ISO4409(m Measurement, maxDisplacement units.Displacement) (Efficiencies, error) {
	if err := m.valid(); err != nil {
		return Efficiencies{}, err
	}
	d := float64(maxDisplacement)
	if !(d > 0) || !finite(d) {
		return Efficiencies{}, fmt.Errorf("%w: maximum displacement %v", ErrInvalid, d)
	}
	qi := m.Setting * d * float64(m.Speed)
	ti := float64(m.Pressure) * m.Setting * d
	q, t := float64(m.Flow), float64(m.Torque)
	var e Efficiencies
	if m.Mode == Pumping {
		e = Efficiencies{Volumetric: q / qi, HydroMechanical: ti / t}
	} else {
		e = Efficiencies{Volumetric: qi / q, HydroMechanical: t / ti}
	}
	e.Overall = e.Volumetric * e.HydroMechanical
	if !finite(e.Volumetric) || !finite(e.HydroMechanical) || !finite(e.Overall) {
		return Efficiencies{}, fmt.Errorf("%w: efficiencies of %+v overflow", ErrInvalid, m)
	}
	return e, nil
}

func (m Measurement) valid() error {
	ok := finite(float64(m.Speed)) && m.Speed > 0 && finite(float64(m.Pressure)) && m.Pressure > 0 &&
		finite(m.Setting) && m.Setting > 0 && m.Setting <= 1 && finite(float64(m.Flow)) && m.Flow > 0 &&
		finite(float64(m.Torque)) && m.Torque > 0 && finite(float64(m.Temperature)) && m.Temperature > 0 &&
		(m.Mode == Pumping || m.Mode == Motoring)
	if !ok {
		return fmt.Errorf("%w: measurement needs positive finite speed, pressure, flow, torque and temperature, a setting in (0, 1] and mode pumping or motoring: %+v", ErrInvalid, m)
	}
	return nil
}

// FitSpec says which unit the measurements belong to and which terms of the
// Wilson model to fit. Slip, Viscous, Friction and ConstantPressure are
// always fitted; the terms not asked for stay zero.
type FitSpec struct {
	MaxDisplacement units.Displacement // D_max of the unit tested (per radian)
	Oil             Oil                // the test oil; each measurement's temperature selects μ, ρ, β
	// Compressibility fits the dead-volume ratio Cr of the compression
	// flow loss (and turns the term on).
	Compressibility bool
	// Hydrodynamic fits the churning coefficient Ch.
	Hydrodynamic bool
	// ConstantTorque fits a truly constant torque T_0 besides p_c·D_t; the
	// two can only be told apart with TorqueSetting > 0 and measurements at
	// several settings.
	ConstantTorque bool
	// SettingShares fits the setting shares s_q and s_t (needs measurements
	// at two or more settings); otherwise both are 0, the classic form.
	SettingShares bool
}

// Fit is a Wilson model fitted to measurements, with what the fit left.
type Fit struct {
	Model Wilson
	// Per measurement, in the order given: measured minus model leakage and
	// loss torque, and the model's ISO 4409 efficiencies minus the
	// measured ones (Measured).
	LeakageResiduals []units.VolumeFlow
	TorqueResiduals  []units.Torque
	Measured         []Efficiencies
	EfficiencyErrors []Efficiencies
	// Root mean square of the residuals, and the largest magnitude of the
	// overall-efficiency error.
	RMSLeakage      units.VolumeFlow
	RMSTorque       units.Torque
	MaxOverallError float64
	// Condition numbers of the two least-squares problems (columns scaled
	// to unit length); above MaxCondition the fit is refused.
	LeakageCondition, TorqueCondition float64
}

// MaxCondition is the largest condition number of a least-squares problem
// that FitWilson accepts: beyond it the measurements cannot tell two
// coefficients apart (their columns are nearly proportional).
const MaxCondition = 1e8

// FitWilson fits the Wilson model (with the extensions FitSpec asks for) to
// test-bench measurements by least squares, separately for the leakage and
// for the loss torque, the two quantities the measurements give directly:
//
//	pumping:  L = x·D·ω − Q,  τ = T − Δp·x·D
//	motoring: L = Q − x·D·ω,  τ = Δp·x·D − T
//
// The model is linear in its coefficients except through the torque's
// setting share s_t: the leakage coefficients (Cs, and Cs·s_q with
// SettingShares; Cr) and, at a given s_t, the torque coefficients (Cv, Cf,
// p_c, T_0, Ch) are found by linear least squares with gonum/mat (QR),
// with every coefficient held non-negative (the best feasible set of
// active coefficients, an exact non-negative least squares for these few
// unknowns); s_t, where fitted, by a bounded one-dimensional minimisation
// of the remaining torque residual (variable projection). Leakage and
// torque residuals are not weighted; points of very different size weigh
// by their size.
//
// Data that cannot determine a coefficient — fewer points than
// coefficients, all points at one setting when SettingShares is asked, or
// columns so nearly proportional that the condition number exceeds
// MaxCondition (all points at one speed and temperature cannot tell Cv
// from p_c) — are refused with ErrUndetermined, naming the coefficient.
func FitWilson(spec FitSpec, ms []Measurement) (Fit, error) {
	d := float64(spec.MaxDisplacement)
	if !(d > 0) || !finite(d) {
		return Fit{}, fmt.Errorf("%w: maximum displacement %v", ErrInvalid, d)
	}
	if !spec.Oil.valid {
		return Fit{}, fmt.Errorf("%w: oil not built with NewOil", ErrInvalid)
	}
	n := len(ms)
	fl := make([]fluid, n)
	leak := make([]float64, n)
	tau := make([]float64, n)
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for i, m := range ms {
		if err := m.valid(); err != nil {
			return Fit{}, fmt.Errorf("measurement %d: %w", i, err)
		}
		f, err := spec.Oil.at(m.Temperature)
		if err != nil {
			return Fit{}, fmt.Errorf("measurement %d: %w", i, err)
		}
		fl[i] = f
		qi := m.Setting * d * float64(m.Speed)
		ti := float64(m.Pressure) * m.Setting * d
		if m.Mode == Pumping {
			leak[i], tau[i] = qi-float64(m.Flow), float64(m.Torque)-ti
		} else {
			leak[i], tau[i] = float64(m.Flow)-qi, ti-float64(m.Torque)
		}
		xmin, xmax = math.Min(xmin, m.Setting), math.Max(xmax, m.Setting)
	}
	if spec.SettingShares && !(xmax-xmin > 1e-6) {
		return Fit{}, fmt.Errorf("%w: the setting shares need measurements at two or more settings (all at %v)", ErrUndetermined, xmin)
	}

	// Leakage: L = Cs·(1 − s_q)·D·Δp/μ + Cs·s_q·x·D·Δp/μ [+ Cr·D·ω·Δp/β + x·D·ω·Δp/β].
	lnames := []string{"slip Cs"}
	if spec.SettingShares {
		lnames = []string{"slip Cs·(1 − s_q)", "slip Cs·s_q"}
	}
	if spec.Compressibility {
		lnames = append(lnames, "dead volume Cr")
	}
	if n < len(lnames) {
		return Fit{}, fmt.Errorf("%w: %d measurements for %d leakage coefficients", ErrUndetermined, n, len(lnames))
	}
	la := mat.NewDense(n, len(lnames), nil)
	ly := make([]float64, n)
	for i, m := range ms {
		dp, w, x := float64(m.Pressure), float64(m.Speed), m.Setting
		c := d * dp / fl[i].mu
		k := 0
		la.Set(i, k, c)
		k++
		if spec.SettingShares {
			la.Set(i, k, x*c)
			k++
		}
		ly[i] = leak[i]
		if spec.Compressibility {
			r := d * w * dp / fl[i].beta
			la.Set(i, k, r)
			ly[i] -= x * r
		}
	}
	lc, lcond, err := nnls(la, ly, lnames)
	if err != nil {
		return Fit{}, err
	}
	var model Wilson
	model.Slip = lc[0]
	if spec.SettingShares {
		model.Slip = lc[0] + lc[1]
		if model.Slip > 0 {
			model.LeakageSetting = lc[1] / model.Slip
		}
	}
	if spec.Compressibility {
		model.Compressibility = true
		model.DeadVolume = lc[len(lc)-1]
	}

	// Torque: at a given s_t, τ = Cv·D_t·μ·ω + Cf·D_t·Δp + p_c·D_t [+ T_0] [+ Ch·ρ·ω²·D_t^(5/3)].
	tnames := []string{"viscous Cv", "friction Cf", "constant pressure p_c"}
	if spec.ConstantTorque {
		tnames = append(tnames, "constant torque T_0")
	}
	if spec.Hydrodynamic {
		tnames = append(tnames, "hydrodynamic Ch")
	}
	if n < len(tnames) {
		return Fit{}, fmt.Errorf("%w: %d measurements for %d torque coefficients", ErrUndetermined, n, len(tnames))
	}
	ta := mat.NewDense(n, len(tnames), nil)
	fill := func(st float64) {
		for i, m := range ms {
			dp, w := float64(m.Pressure), float64(m.Speed)
			dt := d * (1 - st + st*m.Setting)
			ta.Set(i, 0, dt*fl[i].mu*w)
			ta.Set(i, 1, dt*dp)
			ta.Set(i, 2, dt)
			k := 3
			if spec.ConstantTorque {
				ta.Set(i, k, 1)
				k++
			}
			if spec.Hydrodynamic {
				c := math.Cbrt(dt)
				ta.Set(i, k, fl[i].rho*w*w*dt*c*c)
			}
		}
	}
	st := 0.0
	if spec.SettingShares {
		ssr := func(s float64) float64 {
			fill(s)
			c, _, err := nnls(ta, tau, nil)
			if err != nil {
				return math.Inf(1)
			}
			return sumSq(ta, c, tau)
		}
		best, fbest := 0.0, ssr(0)
		if f1 := ssr(1); f1 < fbest {
			best, fbest = 1, f1
		}
		if s, fs := numeric.Minimize(ssr, 0, 1, 1e-9); fs < fbest {
			best = s
		}
		st = best
	}
	fill(st)
	tc, tcond, err := nnls(ta, tau, tnames)
	if err != nil {
		return Fit{}, err
	}
	model.TorqueSetting = st
	model.Viscous, model.Friction, model.ConstantPressure = tc[0], tc[1], units.Pressure(tc[2])
	k := 3
	if spec.ConstantTorque {
		model.ConstantTorque = units.Torque(tc[k])
		k++
	}
	if spec.Hydrodynamic {
		model.Hydrodynamic = tc[k]
	}
	if err := model.Validate(); err != nil {
		return Fit{}, fmt.Errorf("%w: fitted model invalid: %v", ErrUndetermined, err)
	}
	return evaluateFit(model, spec, ms, leak, tau, lcond, tcond)
}

// evaluateFit fills the residuals and the efficiency errors of model.
func evaluateFit(model Wilson, spec FitSpec, ms []Measurement, leak, tau []float64, lcond, tcond float64) (Fit, error) {
	u, err := NewUnit(UnitSpec{MaxDisplacement: spec.MaxDisplacement, Loss: model})
	if err != nil {
		return Fit{}, err
	}
	n := len(ms)
	f := Fit{Model: model, LeakageResiduals: make([]units.VolumeFlow, n), TorqueResiduals: make([]units.Torque, n),
		Measured: make([]Efficiencies, n), EfficiencyErrors: make([]Efficiencies, n),
		LeakageCondition: lcond, TorqueCondition: tcond}
	var sl, st float64
	for i, m := range ms {
		dp := m.Pressure
		if m.Mode == Motoring {
			dp = -dp // the motor's own frame: p_out − p_in < 0
		}
		p, err := u.At(m.Setting, m.Speed, dp, spec.Oil, m.Temperature)
		if err != nil && !isLimit(err) {
			return Fit{}, fmt.Errorf("measurement %d: %w", i, err)
		}
		e, err := ISO4409(m, spec.MaxDisplacement)
		if err != nil {
			return Fit{}, fmt.Errorf("measurement %d: %w", i, err)
		}
		f.Measured[i] = e
		f.EfficiencyErrors[i] = Efficiencies{Volumetric: p.Volumetric - e.Volumetric,
			HydroMechanical: p.HydroMechanical - e.HydroMechanical, Overall: p.Overall - e.Overall}
		f.MaxOverallError = math.Max(f.MaxOverallError, math.Abs(f.EfficiencyErrors[i].Overall))
		rl, rt := leak[i]-float64(p.Leakage), tau[i]-float64(p.LossTorque)
		f.LeakageResiduals[i], f.TorqueResiduals[i] = units.VolumeFlow(rl), units.Torque(rt)
		sl += rl * rl
		st += rt * rt
	}
	f.RMSLeakage = units.VolumeFlow(math.Sqrt(sl / float64(n)))
	f.RMSTorque = units.Torque(math.Sqrt(st / float64(n)))
	return f, nil
}

// sumSq returns ‖A·c − y‖².
func sumSq(a *mat.Dense, c, y []float64) float64 {
	r, k := a.Dims()
	var s float64
	for i := range r {
		v := -y[i]
		for j := range k {
			v += a.At(i, j) * c[j]
		}
		s += v * v
	}
	return s
}

// nnls solves min ‖A·c − y‖ over c ≥ 0 for the few columns of A: the least
// squares solution on each subset of active columns (by QR), the best
// feasible one kept. It first checks the conditioning of A with its columns
// scaled to unit length and, when names is not nil, refuses A whose
// condition number exceeds MaxCondition, naming the coefficient the
// smallest singular vector loads most. It returns the coefficients and the
// condition number.
func nnls(a *mat.Dense, y []float64, names []string) (c []float64, cond float64, err error) {
	r, k := a.Dims()
	scale := make([]float64, k)
	as := mat.NewDense(r, k, nil)
	for j := range k {
		var s float64
		for i := range r {
			s += a.At(i, j) * a.At(i, j)
		}
		s = math.Sqrt(s)
		if !(s > 0) || !finite(s) {
			if names != nil {
				return nil, math.Inf(1), fmt.Errorf("%w: the measurements give no information on the %s (its column is zero)", ErrUndetermined, names[j])
			}
			s = 1
		}
		scale[j] = s
		for i := range r {
			as.Set(i, j, a.At(i, j)/s)
		}
	}
	var svd mat.SVD
	if !svd.Factorize(as, mat.SVDThin) {
		return nil, math.Inf(1), fmt.Errorf("%w: singular value decomposition failed", ErrUndetermined)
	}
	sv := svd.Values(nil)
	cond = math.Inf(1)
	if sv[k-1] > 0 {
		cond = sv[0] / sv[k-1]
	}
	if names != nil && !(cond <= MaxCondition) {
		var v mat.Dense
		svd.VTo(&v)
		worst, big := 0, -1.0
		for j := range k {
			if a := math.Abs(v.At(j, k-1)); a > big {
				worst, big = j, a
			}
		}
		return nil, cond, fmt.Errorf("%w: the %s cannot be told from the other coefficients (condition number %s); vary what it multiplies",
			ErrUndetermined, names[worst], strconv.FormatFloat(cond, 'g', 3, 64))
	}
	best := math.Inf(1)
	c = make([]float64, k)
	yv := mat.NewVecDense(r, y)
	for mask := 1; mask < 1<<k; mask++ {
		var cols []int
		for j := range k {
			if mask&(1<<j) != 0 {
				cols = append(cols, j)
			}
		}
		if len(cols) > r {
			continue
		}
		sub := mat.NewDense(r, len(cols), nil)
		for jj, j := range cols {
			for i := range r {
				sub.Set(i, jj, as.At(i, j))
			}
		}
		var qr mat.QR
		qr.Factorize(sub)
		var sol mat.VecDense
		if err := qr.SolveVecTo(&sol, false, yv); err != nil {
			continue // singular subset
		}
		cand := make([]float64, k)
		ok := true
		for jj, j := range cols {
			v := sol.AtVec(jj) / scale[j]
			if v < 0 || !finite(v) {
				ok = false
				break
			}
			cand[j] = v
		}
		if !ok {
			continue
		}
		if s := sumSq(a, cand, y); s < best {
			best = s
			copy(c, cand)
		}
	}
	if math.IsInf(best, 1) {
		// No subset with non-negative coefficients: all zero.
		for j := range c {
			c[j] = 0
		}
	}
	return c, cond, nil
}
