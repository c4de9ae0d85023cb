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
// # Requirements and the feasibility report
//
// Requirements (the optional "requirements" object of a file) state what
// the design must do: top speed at or below an engine speed, standstill
// or a lowest working speed, reverse speed, drawbar pulls at travel
// speeds, PTO speeds, unit-speed and pressure margins, matching range
// changes and the hydrostat's corner power. File.Check returns a Report:
// each requirement met or not with its relative margin and the operating
// point where it binds (Check.Binding), the speeds each range reaches at
// rated engine speed, and — always, required or not — whether the forward
// speeds start at standstill and every gap between ranges.
//
// # The tractive-effort diagram
//
// TractiveEffort finds, for every range and travel speed, the greatest
// drawbar pull at full engine power on level ground, by bisection on the
// pull, and names the limit that binds: the engine's full-load torque, the
// relief pressure, a unit's greatest speed, the variator's ratio range, or
// the tyres (beyond their peak pull, or beyond the slip counted as usable,
// 15 % by default). WriteEffortCSV writes it; the examples draw it.
//
// # A day as a duty spectrum
//
// Spectrum condenses a working day into its steady operating points
// (travel speed, draft, trailer, grade, PTO demand, ground) weighted by
// time; SpectrumFuel runs them under a strategy. For the constant-speed
// segments the vehicle package simulates, the spectrum's fuel equals the
// day's (2e-15 relative on the demo day) at one solve per point instead of
// one per time step.
//
// # Search
//
// A Space holds named parameters, each free within bounds (whole numbers
// where Integer is set) or fixed. A Problem adds the objectives (all
// minimised) and the evaluation of one candidate; File.SplitProblem makes
// the usual one (parameters named by the Param constants and "range1",
// "range2", ...; feasible when the requirements are met; objectives fuel
// over the duty spectrum, installed displacement and peak pressure).
//
// Explore evaluates a space-filling sample: candidate i is point i of
// the scrambled Halton sequence of arXiv:1706.02808 (the one gonum's
// samplemv.Halton draws), computed for its index alone, so it depends only
// on (space, seed, i) and the results are identical for one worker or many.
// Pareto returns the non-dominated feasible candidates, Best the best by
// weighted objectives, Refine improves it by gonum's Nelder–Mead (bounds by
// clamping, integers by single steps). File.Apply turns a candidate into a
// design file to check, simulate or Save.
//
// A large search splits into parts: part k of n evaluates the indices
// i ≡ k (mod n); RunPart writes its CSV (the header names the space and its
// fingerprint, the seed, the number of candidates and the library version)
// and skips a part already complete, so a rerun resumes; Merge reads the
// parts and returns exactly the results of one run. An existing batch
// scheduler runs the parts (a Kubernetes Indexed Job, a Slurm job array:
// see the README); nothing here talks to a cluster. Explore.Progress and
// vehicle.Options.Progress report (done, total).
//
// # Caution
//
// The library estimates; it does not certify. Hydraulic circuits at
// several hundred bar can injure; road speed, brakes, ballast and tyre
// loads are governed by local regulations and the manufacturers' ratings.
// A design chosen with this package needs physical tests and a qualified
// engineer's sign-off.
package design
