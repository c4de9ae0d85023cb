// Package hydrostat models axial-piston pumps and motors, their losses, the
// oil that fills them and the closed loops they form, as an engineer sizing
// a hydrostatic transmission would.
//
// # Units and settings
//
// A Unit is a pump or a motor: the same model works in all four quadrants.
// Its size is the maximum displacement D_max, stored per radian (write
// units.CCPerRev(100)); or it follows from the geometry of z pistons of
// diameter d on a pitch circle of diameter D at the maximum angle α:
//
//	V = z·(π d²/4)·D·tan α   per revolution (swashplate)
//	V = z·(π d²/4)·D·sin α   per revolution (bent axis)
//
// The setting x is the signed relative displacement in [-1, 1], D = x·D_max;
// x = tan α/tan α_max (swashplate) or sin α/sin α_max (bent axis), and
// Unit.AngleFromSetting and Unit.SettingFromAngle convert both ways.
// UnitSpec.Swing states how far the unit can swing: to exactly zero
// (SwingToZero, settings in [0, 1]) or through zero and over centre
// (SwingOverCentre, [-1, 1]); unstated, the schedules keep their defaults.
// At x = 0 the ideal flow and torque are exactly zero and only the losses
// remain.
//
// # Signs, power and the ISO 4409 efficiencies
//
// A unit's Point is in its own frame. Its outlet is the port it delivers
// into when x·ω > 0, and Δp = p_out − p_in (either sign). Then
//
//	Q_i = x·D_max·ω                 ideal flow into the outlet
//	T_i = Δp·x·D_max                ideal torque (shaft on unit)
//	Q   = Q_i − sgn(Δp)·L           effective flow (L ≥ 0, from high to low side)
//	T   = T_i + sgn(ω)·τ            shaft torque on the unit (τ ≥ 0 opposes motion)
//	P_mech = T·ω,  P_hyd = Δp·Q,  P_loss = |ω|·τ + |Δp|·L = P_mech − P_hyd ≥ 0
//
// The unit is Pumping when the ideal power Δp·Q_i > 0 and Motoring when it
// is negative, Idle when zero. Efficiencies follow the definitions of
// ISO 4409 for pumps and for motors:
//
//	pumping:  η_v = Q/Q_i,  η_hm = T_i/T,  η = η_v·η_hm = P_hyd/P_mech
//	motoring: η_v = Q_i/Q,  η_hm = T/T_i,  η = η_v·η_hm = P_mech/P_hyd (magnitudes)
//
// A ratio that would turn negative (losses larger than the ideal power, for
// example a pump at a tiny setting whose leakage exceeds its ideal flow)
// is reported as 0. An Idle point converts no power; its efficiencies are
// defined as 1 and its loss is in Point.Loss. At ω = 0 the loss torque is
// not applied (static friction is indeterminate): T = T_i.
//
// # The Wilson loss model
//
// The Wilson model (Trans. ASME 71, 1949, in the form of Proc. IMechE 198B,
// 1984) takes laminar leakage ∝ D·Δp/μ, viscous drag torque ∝ D·μ·ω, Coulomb
// friction torque ∝ D·Δp and a constant torque. Here, with D per radian, μ
// the dynamic viscosity, ρ the density and β the bulk modulus:
//
//	L = Cs·D_q·|Δp|/μ  [+ (Cr + |x|)·D_max·|ω|·|Δp|/β  if Compressibility]
//	τ = Cv·D_t·μ·|ω| + Cf·D_t·|Δp| + p_c·D_t + T_0 + Ch·ρ·ω²·D_t^(5/3)
//	D_q = D_max·(1 − s_q + s_q·|x|),  D_t = D_max·(1 − s_t + s_t·|x|)
//
// All coefficients are dimensionless (p_c, the constant torque expressed as
// a pressure, is a units.Pressure), so one set scales across unit sizes.
// With s_q = s_t = 0 (the default) every term scales with the maximum
// displacement, the classic form; with 1 it scales with the set
// displacement |x|·D_max; values between blend the two (the
// setting-dependent terms of the Proc. IMechE 198B paper). The hydrodynamic
// term Ch (churning, ∝ ω²) is that paper's extension (1984); the
// compression loss, oil compressed in the dead volume V₀ and the swept
// volume each stroke and lost on decompression, follows the argument of
// the book Hydrostatic Pumps and Motors (2001) with Cr = V₀/(2π·D_max).
//
// Per radian or per revolution: only the coefficients that multiply a
// displacement written per revolution, V = 2π·D, change with the
// convention: Cs and Cv are 2π times smaller and Ch (2π)^(5/3) times smaller
// when quoted for Q_s = Cs·V·Δp/μ, T_v = Cv·V·μ·ω, T_h = Ch·ρ·ω²·V^(5/3)
// (ω in rad/s). With D per radian, Cf is the friction torque as a fraction
// of the ideal torque at full setting, and a source quoting that fraction
// means the same number per revolution; p_c is a pressure either way.
// WilsonPerRev converts and says which source forms it assumes.
// The "constant" term p_c·D_t falls with the setting when s_t > 0;
// ConstantTorque T_0 stays the same at every setting. Typical orders (From
// memory, for illustration only):
// Cs ≈ 10⁻⁹…10⁻⁸, Cv ≈ 10⁴…10⁵, Cf ≈ 0.01…0.05.
//
// # Loss models from measurements
//
// Engineers get test-bench data, not coefficients. FitWilson takes
// measurements in the form of ISO 4409 (speed, pressure difference,
// setting, effective flow, shaft torque, oil temperature, pumping or
// motoring) and fits the Wilson model and its extensions by least squares:
// the leakage and loss torque follow from each measurement directly, the
// coefficients by linear least squares (gonum/mat), non-negative, the
// torque's setting share by a bounded one-dimensional search. It reports
// the residuals, the fitted model's efficiency errors against the ISO 4409
// efficiencies of the measurements (ISO4409) and the conditioning, and
// refuses data that cannot determine a coefficient (ErrUndetermined).
//
// Map is the alternative for users with test data: tables of η_v and η_hm
// over speed, pressure and setting, interpolated (bilinear in speed and
// pressure, linear between settings) and never extrapolated. Any other
// model plugs in through the LossModel interface.
//
// # Both ways round
//
// Unit.At goes from pressure to torque and flow; Unit.PressureFor goes
// from a torque demand to the pressure.
//
// # Oil
//
// Oil viscosity follows the ASTM D341 (Walther) equation through two known
// points, log₁₀ log₁₀(ν + 0.7) = A − B·log₁₀ T (ν in cSt, T in K); density
// ρ = ρ_ref/(1 + α·(T − T_ref)); the bulk modulus is constant.
// ViscosityIndex computes the viscosity index by ASTM D2270 (Table 1,
// interpolated, and its equations above 70 cSt); NewGradeOil builds an oil
// from its ISO 3448 grade and viscosity index. VG32, VG46 and VG68 are ISO
// 3448 grades of mineral oil with round 100 °C values, of viscosity index
// 102.2, 101.6 and 99.3. A user who knows the dynamic viscosity at the
// operating point gives it directly (OilSpec.Viscosity): it then holds at
// every temperature.
//
// # Closed loops
//
// A Loop joins one pump and one or more motors in parallel on lines A and
// B: the pump's outlet is A and each motor's outlet is B, so positive
// settings and speeds drive the motors forward. The loop pressure is
// Δp = p_A − p_B; the low line is at the charge pressure, the high line at
// Charge + |Δp|, and the relief valve limits it. Flow continuity on line A:
//
//	Q_pump = Σ Q_motor,i        (each Q_motor,i = ideal + leakage drawn from A)
//
// so the loop's hydraulic powers cancel and Σ T·ω over all shafts equals the
// sum of the unit losses. Loop.At takes shaft speeds and Δp and chooses the
// settings with the loop's Schedule: Sequential (pump swings out first with
// the motors at full; then the motors swing back with the pump at full) or
// MinLoss (the free motor setting at which the loop loss is least for the
// torque the motors carry). Both swing the motors back as far as their
// Swing allows: to exactly zero (the top of an input-planetary layout: pump
// at full stroke standing still, motor at zero, the drive purely
// mechanical), or through zero and over centre, continuously through a
// standing pump shaft (the mechanical point of an output-coupled split).
// With every motor at zero the motors' load no longer sets the loop
// pressure; the pump's torque does (see Loop.At). Loop.Solve takes torque demands and finds Δp;
// with MinLoss its result minimises the loss for that demand. Reaching the
// relief pressure, a unit's speed or peak pressure, or a setting limit
// returns a *LimitError with the value and the limit (errors.Is(err,
// ErrLimit)), together with the state, which holds the same limit as a
// value (LoopState.Limit). Loop.Trial is At for the inner loop of a
// caller's iteration: the same state, the crossed limit reported by its
// bare sentinel, and no allocation.
//
// NewLoop refuses a relief setting above the lowest peak pressure of the
// loop's units (or a unit's rated pressure where it gives no peak): the
// relief must protect every unit. A zero MaxSpeed, RatedPressure or
// PeakPressure means "not rated": that limit is not checked, and the root
// package's margins say so; LoopSpec.Strict refuses such a unit.
//
// # Usage
//
//	pump, _ := hydrostat.NewUnit(hydrostat.UnitSpec{
//		MaxDisplacement: units.CCPerRev(90), MaxSpeed: units.RPM(3000),
//		RatedPressure: units.Bar(420), PeakPressure: units.Bar(480),
//		Loss: hydrostat.Wilson{Slip: 5e-9, Viscous: 5e4, Friction: 0.02},
//	})
//	p, err := pump.At(0.8, units.RPM(2000), units.Bar(250), hydrostat.VG46, units.Celsius(60))
//
// # Sources
//
// Performance criteria for positive displacement pumps and fluid motors,
// Trans. ASME 71 (1949). The mathematical modelling of hydrostatic pumps
// and motors, Proc. IMechE 198B (1984). Hydrostatic Pumps and Motors,
// Academic Books International (2001). ISO 4409 (test methods and
// efficiency definitions for pumps and motors), ISO 3448 (viscosity grades),
// ASTM D341 (viscosity–temperature charts), ASTM D2270 (viscosity index).
//
// # Safety
//
// Hydraulic circuits at several hundred bar can injure: fluid jets
// penetrate skin, and hoses and fittings fail. This package estimates; it
// does not certify. Rated pressures and speeds come from the unit maker's
// ratings, relief settings and circuit design follow local codes and
// standards (for example ISO 4413), and safety-relevant designs need
// physical tests and a qualified engineer's sign-off.
package hydrostat
