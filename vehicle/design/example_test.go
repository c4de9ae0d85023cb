package design_test

import (
	"fmt"
	"os"
	"strings"

	"github.com/powersplit-dev/powersplit/vehicle/design"
)

// A design file with a misspelt key and a duplicate key: Parse names the
// place of each.
func ExampleParse() {
	data, err := os.ReadFile("testdata/tractor.json")
	if err != nil {
		fmt.Println(err)
		return
	}
	text := strings.Replace(string(data), `"wheelbase": "2.9 m",`, `"wheelbase": "2.9 m", "wheelbase": "3 m",`, 1)
	_, err = design.Parse("mine.json", []byte(text))
	fmt.Println(err)
	text = strings.Replace(string(data), `"relief": "450 bar"`, `"relief": "450 bra"`, 1)
	_, err = design.Parse("mine.json", []byte(text))
	fmt.Println(err)
	// Output:
	// mine.json:10: tractor.wheelbase: design: duplicate key: "wheelbase" is given twice in tractor (first on line 10)
	// mine.json:76: transmission.relief = "450 bra": units: parsing pressure "450 bra": unknown unit
}

// Check a design against its requirements.
func ExampleFile_Check() {
	f, err := design.Load("testdata/tractor.json")
	if err != nil {
		fmt.Println(err)
		return
	}
	rep, err := f.Check(f.Transmission, f.Requirements)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("feasible:", rep.Feasible(), "standstill:", rep.Standstill)
	for _, c := range rep.Checks[:3] {
		fmt.Printf("%-45s met %-5v margin %+.3f\n", c.Name, c.Met, c.Margin)
	}
	// Output:
	// feasible: false standstill: false
	// forward speeds start at standstill            met false margin -0.042
	// top speed 50.0 km/h at or below 1900 rpm      met true  margin +0.108
	// no speed gap from 3.0 to 50.0 km/h            met true  margin +0.000
}

// A small search: a space of two parameters, 32 candidates, the Pareto
// front of two objectives.
func ExampleExplore() {
	p := design.Problem{
		Space: design.Space{Name: "example", Params: []design.Param{
			{Name: "x", Lo: 0, Hi: 1},
			{Name: "teeth", Lo: 17, Hi: 23, Integer: true},
		}},
		Objectives: []string{"a", "b"},
		Evaluate: func(x []float64) ([]float64, string) {
			if x[1] == 23 {
				return nil, "23 teeth do not fit"
			}
			return []float64{x[0] * x[0], (1 - x[0]) * (1 - x[0])}, ""
		},
	}
	rs, err := design.Explore{Problem: p, Seed: 1, Candidates: 32}.Run()
	if err != nil {
		fmt.Println(err)
		return
	}
	front := design.Pareto(rs)
	fmt.Printf("%d candidates, %d on the front; candidate 0: x %.4f, %g teeth\n", len(rs), len(front), rs[0].X[0], rs[0].X[1])
	// Output:
	// 32 candidates, 27 on the front; candidate 0: x 0.7122, 22 teeth
}
