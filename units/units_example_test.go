package units_test

import (
	"encoding/json"
	"fmt"

	"github.com/powersplit-dev/powersplit/units"
)

func Example() {
	relief := units.Bar(420)
	engine := units.RPM(2100)
	fmt.Println(relief, engine, units.KMH(40))
	fmt.Printf("%.0f psi, %.1f rad/s\n", relief.PSI(), engine.RadPerSec())
	// Output:
	// 420 bar 2100 rpm 40 km/h
	// 6092 psi, 219.9 rad/s
}

func ExampleParsePressure() {
	p, err := units.ParsePressure("5000 psi")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(p)
	_, err = units.ParsePressure("420 rpm")
	fmt.Println(err)
	// Output:
	// 344.738 bar
	// units: parsing pressure "420 rpm": unknown unit
}

func ExampleTemperature_Sub() {
	oil := units.Celsius(80)
	ambient := units.Fahrenheit(68)
	fmt.Println(oil, ambient, oil.Sub(ambient))
	// Output:
	// 80 °C 20 °C 60 K
}

func ExampleFlowFromDisplacement() {
	// A 210 cm³/rev pump at 2000 rpm against 300 bar, ideal (no losses).
	d := units.CCPerRev(210)
	w := units.RPM(2000)
	dp := units.Bar(300)
	q := units.FlowFromDisplacement(d, w)
	t := units.TorqueFromPressure(dp, d)
	fmt.Printf("%.0f L/min, %.1f N·m\n", q.LitresPerMinute(), float64(t))
	fmt.Println(units.PowerFromFlow(dp, q), units.PowerFromTorque(t, w))
	// Output:
	// 420 L/min, 1002.7 N·m
	// 210 kW 210 kW
}

func ExamplePressure_UnmarshalText() {
	var cfg struct {
		Relief units.Pressure        `json:"relief"`
		Rated  units.AngularVelocity `json:"rated"`
	}
	err := json.Unmarshal([]byte(`{"relief": "420 bar", "rated": "2100 rpm"}`), &cfg)
	fmt.Println(cfg.Relief, cfg.Rated, err)
	// Output:
	// 420 bar 2100 rpm <nil>
}
