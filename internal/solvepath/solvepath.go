// Package solvepath holds the switch the benchmarks use to measure the
// layout solver before and after its compiled path side by side, in one
// run, from any package: while General is set, every Solver made by
// powersplit.NewSolver solves on the general path only and sweeps and maps
// fill full states, as the solver did before the compiled path. It is
// internal and meant for benchmarks only: nothing else sets it.
package solvepath

import "sync/atomic"

// General, when set, sends every new Solver down the general path.
var General atomic.Bool
