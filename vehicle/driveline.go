package vehicle

import (
	"github.com/powersplit-dev/powersplit/units"
)

// A Driveline converts between the transmission's output shaft and the
// wheels on the ground: the final drive (ratio of output speed to wheel
// speed), the tyres' rolling radius and the final drive's efficiency. With
// slip s of the driven wheels,
//
//	ω_out = i_fd · v / (r · (1 − s))
//	T_out = F · r / (i_fd · η_fd)        (driving: the final drive's loss is taken from the output)
//	v     = ω_out · r · (1 − s) / i_fd
//	F     = T_out · i_fd · η_fd / r
//
// where F is the pull at the wheels (net pull plus the tyres' motion
// resistance when the gross pull is wanted).
type Driveline struct {
	FinalDrive    float64      // i_fd > 0
	RollingRadius units.Length // r > 0
	// Efficiency of the final drive in (0, 1]; zero means
	// DefaultFinalDriveEfficiency.
	Efficiency float64
}

// DrivelineOf returns the driveline of vehicle v with rolling radius r
// (the vehicle's tyres know theirs; the driveline needs it given).
func DrivelineOf(v *Vehicle, r units.Length) Driveline {
	return Driveline{FinalDrive: v.s.FinalDrive, RollingRadius: r, Efficiency: v.s.FinalDriveEfficiency}
}

// Validate reports whether the driveline is usable.
func (d Driveline) Validate() error {
	if err := positive("Driveline.FinalDrive", d.FinalDrive); err != nil {
		return err
	}
	if err := positive("Driveline.RollingRadius", float64(d.RollingRadius)); err != nil {
		return err
	}
	if d.Efficiency != 0 {
		return fraction("Driveline.Efficiency", d.Efficiency)
	}
	return nil
}

func (d Driveline) eta() float64 {
	if d.Efficiency == 0 {
		return DefaultFinalDriveEfficiency
	}
	return d.Efficiency
}

// OutputSpeed returns the output-shaft speed at travel speed v and wheel
// slip s in [0, 1).
func (d Driveline) OutputSpeed(v units.Speed, slip float64) units.AngularVelocity {
	return units.AngularVelocity(d.FinalDrive * float64(v) / (float64(d.RollingRadius) * (1 - slip)))
}

// TravelSpeed returns the travel speed at output-shaft speed w and wheel
// slip s in [0, 1).
func (d Driveline) TravelSpeed(w units.AngularVelocity, slip float64) units.Speed {
	return units.Speed(float64(w) * float64(d.RollingRadius) * (1 - slip) / d.FinalDrive)
}

// OutputTorque returns the output-shaft torque that drives pull F at the
// wheels.
func (d Driveline) OutputTorque(pull units.Force) units.Torque {
	return units.Torque(float64(pull) * float64(d.RollingRadius) / (d.FinalDrive * d.eta()))
}

// Pull returns the pull at the wheels that output-shaft torque t drives.
func (d Driveline) Pull(t units.Torque) units.Force {
	return units.Force(float64(t) * d.FinalDrive * d.eta() / float64(d.RollingRadius))
}
