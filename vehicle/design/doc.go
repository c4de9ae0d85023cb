// Package design reads, checks and writes design files: a whole machine —
// tractor, engine, PTO, transmission (and alternatives to compare), the
// surfaces, implements and trailers it works with, and its working day —
// as one documented JSON file, and builds the library's values from it.
//
// # The file
//
// A design file is one JSON object whose keys are the json names of File's
// fields (go doc design.File lists each with its unit and meaning). Every
// physical value is a string in the units package's text form, in any unit
// it reads ("420 bar", "2100 rpm", "8.5 t", "110 cm³/rev", "6 km/h");
// ratios, efficiencies and coefficients are plain numbers; durations are
// written "25 s", "25 min" or "1.5 h". The "format" key holds the format
// version (Format; a file without it is read as the current version, a
// newer one is refused).
//
// Parse refuses what a plain JSON decoder would take silently: a key the
// format does not have (often a misspelling, or a key differing only in
// case), a key given twice in one object, a value of the wrong JSON type.
// Every mistake is a *FieldError giving the file, the line, the JSON path
// ("transmission.pump.displacement", "day.segments[3].speed") and the
// value as the user wrote it, in the user's unit; errors.Is tells the kind
// (ErrUnknownKey, ErrDuplicateKey, ErrType, ErrValue, ErrSyntax, ErrFormat,
// or an error of the units package for a quantity text it cannot read).
//
// Values round-trip: Load a file, change fields in Go, Save it, Load it
// again, and the values are equal (quantities are written in a unit from
// which they read back exactly).
//
// # Building the machine
//
// File.Vehicle builds a vehicle.Vehicle with one of the file's
// transmissions, File.Cycle the working day as vehicle segments,
// Transmission.Layout the transmission as a powersplit.Layout.
//
//	f, err := design.Load("tractor.json")
//	if err != nil {
//		log.Fatal(err) // tractor.json:76: transmission.relief = "450 bra": ...
//	}
//	f.Transmission.Pump.Displacement = units.CCPerRev(90)
//	v, err := f.Vehicle(f.Transmission)
//	...
//	err = f.Save("smaller-pump.json")
//
// # Caution
//
// The library estimates; it does not certify. Hydraulic circuits at
// several hundred bar can injure; road speed, brakes, ballast and tyre
// loads are governed by local regulations and the manufacturers' ratings.
// A design chosen with this package needs physical tests and a qualified
// engineer's sign-off.
package design
