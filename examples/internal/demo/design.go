// Package demo holds what the example programs share about the demo
// tractor: its design file (built in, or a user's copy given by -design),
// and the command-line plumbing every example uses (the -out and -design
// flags, progress, aligned tables). The file format itself, its decoding
// and the construction of the library's values from it live in the public
// package vehicle/design.
//
// The built-in design file is invented. It describes no real machine,
// maker, farm or place.
package demo

import (
	"bytes"
	_ "embed"

	"github.com/powersplit-dev/powersplit/vehicle/design"
)

//go:embed tractor.json
var builtin []byte

// BuiltinName is how errors and reports name the built-in design file.
const BuiltinName = "tractor.json (built in)"

// Builtin returns a copy of the built-in design file.
func Builtin() []byte { return bytes.Clone(builtin) }

// Default returns the built-in design.
func Default() (*Scenario, error) { return design.Parse(BuiltinName, builtin) }

//go:embed tractor_frontmotor.json
var builtinFrontMotor []byte

// BuiltinFrontMotorName names the built-in variant of the demo tractor
// whose front axle is driven by a second motor of the transmission's loop.
const BuiltinFrontMotorName = "tractor_frontmotor.json (built in)"

// FrontMotor returns the built-in front-axle motor variant of the demo
// tractor.
func FrontMotor() (*Scenario, error) { return design.Parse(BuiltinFrontMotorName, builtinFrontMotor) }

// The demo's names for the design file's types.
type (
	Scenario     = design.File
	Transmission = design.Transmission
	Segment      = design.Segment
	Duration     = design.Duration
)
