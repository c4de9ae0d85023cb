// Command demoday runs the demo tractor's working day.
//
// Until the layouts and vehicle packages land it prints the demo tractor's
// headline figures, read through the units package.
package main

import (
	"fmt"

	"github.com/powersplit-dev/powersplit/units"
)

func main() {
	power := units.Kilowatts(160)
	engine := units.RPM(2100)
	fmt.Printf("demo tractor: %v (%.0f hp) at %v, rated torque %.0f N·m\n",
		power, power.Horsepower(), engine, float64(units.TorqueFromPower(power, engine)))
}
