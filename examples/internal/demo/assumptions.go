package demo

import (
	"fmt"
	"strings"

	"github.com/powersplit-dev/powersplit"
	"github.com/powersplit-dev/powersplit/vehicle"
)

// Caution is the safety note every example program prints and every
// figure with pressures, loads or speeds carries (shortened on figures).
const Caution = "Caution: these are estimates from the given data, not ratings. Sizing of pressurised and " +
	"load-bearing parts, ballast, brakes and road use follow local codes, the component makers' ratings " +
	"and qualified engineers' judgement; safety-relevant designs need physical tests."

// FigureCaution is the one-line form of Caution for figures.
const FigureCaution = "Estimates from the given data; part sizing and road use follow local codes, makers' ratings and qualified engineers."

// FuelModel names the engine's fuel model: the design file's map, or the
// ASABE D497 equation when the file has none.
func FuelModel(sc *Scenario) string {
	if sc.Engine.FuelMap != nil {
		return "specific fuel map from the design file"
	}
	return "ASABE D497 fuel equation (the design file has no fuel map)"
}

// Assumptions lists the defaults a run takes where the design file is
// silent and the limits no example checks.
func Assumptions(sc *Scenario) (defaults, unchecked []string) {
	t := sc.Tractor
	if t.FinalDriveEfficiency == 0 {
		defaults = append(defaults, fmt.Sprintf("final drive efficiency %.2f", vehicle.DefaultFinalDriveEfficiency))
	}
	tr := sc.Transmission
	if tr.GearEfficiency == 0 {
		defaults = append(defaults, fmt.Sprintf("gear mesh efficiency %.3f", powersplit.DefaultGearEfficiency))
	}
	if tr.OilTemperature == nil {
		defaults = append(defaults, "oil temperature 50 °C")
	}
	if sc.Day.Step == 0 {
		defaults = append(defaults, "time step 1 s")
	}
	if t.Front.Tyre.RatedLoad == 0 || t.Rear.Tyre.RatedLoad == 0 {
		unchecked = append(unchecked, "tyre load (no rated load given)")
	}
	if t.MaxMass == 0 {
		unchecked = append(unchecked, "permissible operating mass")
	}
	if tr.Pump.RatedPressure == 0 || tr.Motor.RatedPressure == 0 {
		unchecked = append(unchecked, "rated continuous pressure of the units")
	}
	unchecked = append(unchecked, "tyre speed rating", "brakes and stopping distance", "road speed and axle-load regulations",
		"shaft, gear and bearing strength", "hitch and drawbar ratings", "oil temperature rise")
	return defaults, unchecked
}

// Strict refuses a design with a hydrostatic unit whose maximum speed,
// rated or peak pressure is not given: the example programs run strict, so
// no unit limit is silently left unchecked (the library itself accepts an
// unrated unit and lists the limit as not checked, see
// powersplit.Layout.Unrated).
func Strict(sc *Scenario) error {
	for _, tr := range append([]Transmission{sc.Transmission}, sc.Alternatives...) {
		l, err := tr.Layout()
		if err != nil {
			return err
		}
		if u := l.Unrated(); len(u) > 0 {
			name := tr.Name
			if name == "" {
				name = "the transmission"
			}
			return fmt.Errorf("%s: unrated unit limits (the example programs need every unit's maxSpeed, ratedPressure and peakPressure): %s",
				name, strings.Join(u, "; "))
		}
	}
	return nil
}

// Preamble prints the fuel model, the defaults and the unchecked limits.
func (r *Run) Preamble() {
	sc := r.Scenario
	defaults, unchecked := Assumptions(sc)
	r.Printf("fuel model: %s\n", FuelModel(sc))
	if len(defaults) == 0 {
		r.Printf("defaults taken: none (every optional value is in the design file)\n")
	} else {
		r.Printf("defaults taken: %s\n", strings.Join(defaults, ", "))
	}
	r.Printf("not checked: %s\n", strings.Join(unchecked, ", "))
}
