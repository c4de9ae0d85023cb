package units

import "time"

// The relations between quantities that the rest of the library uses. Each
// is the plain SI product or quotient; none checks its arguments, and a zero
// divisor gives an infinity or NaN exactly as float64 division does, so
// callers that divide must check first.

// PowerFromTorque returns the mechanical power P = T·ω.
func PowerFromTorque(t Torque, w AngularVelocity) Power { return Power(float64(t) * float64(w)) }

// TorqueFromPower returns the torque T = P/ω.
func TorqueFromPower(p Power, w AngularVelocity) Torque { return Torque(float64(p) / float64(w)) }

// PowerFromForce returns the power P = F·v of a force moving at a speed.
func PowerFromForce(f Force, v Speed) Power { return Power(float64(f) * float64(v)) }

// ForceFromPower returns the force F = P/v.
func ForceFromPower(p Power, v Speed) Force { return Force(float64(p) / float64(v)) }

// PowerFromFlow returns the hydraulic power P = Δp·Q.
func PowerFromFlow(dp Pressure, q VolumeFlow) Power { return Power(float64(dp) * float64(q)) }

// FlowFromDisplacement returns the geometric flow Q = D·ω of a unit of displacement D
// turning at ω.
func FlowFromDisplacement(d Displacement, w AngularVelocity) VolumeFlow {
	return VolumeFlow(float64(d) * float64(w))
}

// SpeedFromFlow returns the shaft speed ω = Q/D at which displacement D passes flow Q.
func SpeedFromFlow(q VolumeFlow, d Displacement) AngularVelocity {
	return AngularVelocity(float64(q) / float64(d))
}

// TorqueFromPressure returns the geometric torque T = Δp·D of displacement D at the
// pressure difference Δp (D per radian, so no 2π appears).
func TorqueFromPressure(dp Pressure, d Displacement) Torque { return Torque(float64(dp) * float64(d)) }

// PressureFromTorque returns the pressure difference Δp = T/D.
func PressureFromTorque(t Torque, d Displacement) Pressure { return Pressure(float64(t) / float64(d)) }

// TorqueFromForce returns the torque T = F·r of a force at a radius.
func TorqueFromForce(f Force, r Length) Torque { return Torque(float64(f) * float64(r)) }

// ForceFromTorque returns the force F = T/r at a radius.
func ForceFromTorque(t Torque, r Length) Force { return Force(float64(t) / float64(r)) }

// SpeedFromAngular returns the surface speed v = ω·r at a radius.
func SpeedFromAngular(w AngularVelocity, r Length) Speed { return Speed(float64(w) * float64(r)) }

// AngularFromSpeed returns the angular speed ω = v/r of a wheel of radius r.
func AngularFromSpeed(v Speed, r Length) AngularVelocity {
	return AngularVelocity(float64(v) / float64(r))
}

// EnergyFromPower returns the energy E = P·t delivered at a constant power for a duration.
func EnergyFromPower(p Power, d time.Duration) Energy { return Energy(float64(p) * d.Seconds()) }

// FuelFromPower returns the fuel mass flow ṁ = b·P at specific fuel consumption b.
func FuelFromPower(b SpecificFuelConsumption, p Power) MassFlow {
	return MassFlow(float64(b) * float64(p))
}

// MassFromVolume returns the mass m = ρ·V.
func MassFromVolume(v Volume, rho Density) Mass { return Mass(float64(v) * float64(rho)) }

// MassFlowFromVolumeFlow returns the mass flow ṁ = ρ·Q, for example fuel in L/h to kg/h.
func MassFlowFromVolumeFlow(q VolumeFlow, rho Density) MassFlow {
	return MassFlow(float64(q) * float64(rho))
}

// VolumeFlowFromMassFlow returns the volume flow Q = ṁ/ρ.
func VolumeFlowFromMassFlow(m MassFlow, rho Density) VolumeFlow {
	return VolumeFlow(float64(m) / float64(rho))
}

// KinematicFromDynamic returns the kinematic viscosity ν = μ/ρ.
func KinematicFromDynamic(mu DynamicViscosity, rho Density) KinematicViscosity {
	return KinematicViscosity(float64(mu) / float64(rho))
}

// DynamicFromKinematic returns the dynamic viscosity μ = ν·ρ.
func DynamicFromKinematic(nu KinematicViscosity, rho Density) DynamicViscosity {
	return DynamicViscosity(float64(nu) * float64(rho))
}

// ForceFromMass returns the force F = m·a.
func ForceFromMass(m Mass, a Acceleration) Force { return Force(float64(m) * float64(a)) }

// Gravity is standard acceleration of gravity, gn = 9.806 65 m/s² (exact by definition).
const Gravity Acceleration = standardGravity
