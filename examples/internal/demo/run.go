package demo

import (
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strings"
	"sync"
	"sync/atomic"
	"time"
	"unicode/utf8"

	"github.com/powersplit-dev/powersplit/units"
	"github.com/powersplit-dev/powersplit/vehicle"
	"github.com/powersplit-dev/powersplit/vehicle/design"
)

// Run is what every example program starts with: the scenario (built in,
// or the file given by -design) and the output folder (given by -out, or a
// fresh temporary folder).
type Run struct {
	Scenario *Scenario
	Out      string
	W        io.Writer // the report; standard output
}

// Start parses the common flags of an example program, loads the scenario
// and makes the output folder. With -print-design it writes the built-in
// scenario file to standard output and returns (nil, nil): the caller
// exits.
func Start(program, about string, extra ...func(*flag.FlagSet)) (*Run, error) {
	return startWith(program, about, builtin, BuiltinName, extra...)
}

// startWith is Start with the built-in design file data, named name.
func startWith(program, about string, data []byte, name string, extra ...func(*flag.FlagSet)) (*Run, error) {
	fs := flag.NewFlagSet(program, flag.ContinueOnError)
	for _, add := range extra {
		add(fs)
	}
	out := fs.String("out", "", "folder for the figures and CSV files (default: a fresh temporary folder)")
	designPath := fs.String("design", "", "scenario file (JSON) to use instead of the built-in demo tractor")
	print := fs.Bool("print-design", false, "print the built-in scenario file, to copy and edit, and exit")
	fs.Usage = func() {
		fmt.Fprintf(fs.Output(), "%s: %s\n\nUsage: go run ./examples/%s [flags]\n\n", program, about, program)
		fs.PrintDefaults()
	}
	if err := fs.Parse(os.Args[1:]); err != nil {
		return nil, err
	}
	if *print {
		_, err := os.Stdout.Write(data)
		return nil, err
	}
	var (
		sc  *Scenario
		err error
	)
	if *designPath != "" {
		sc, err = design.Load(*designPath)
	} else {
		sc, err = design.Parse(name, data)
	}
	if err != nil {
		return nil, err
	}
	if err := Strict(sc); err != nil {
		return nil, err
	}
	dir := *out
	if dir == "" {
		dir, err = os.MkdirTemp("", "powersplit-"+program+"-")
	} else {
		err = os.MkdirAll(dir, 0o755)
	}
	if err != nil {
		return nil, err
	}
	r := &Run{Scenario: sc, Out: dir, W: os.Stdout}
	fmt.Fprintf(r.W, "%s — %s\n", program, about)
	fmt.Fprintf(r.W, "design: %s, %s (%s)\n", sc.Name, sc.Owner, sc.Source())
	fmt.Fprintf(r.W, "output folder: %s\n", dir)
	r.Preamble()
	fmt.Fprintln(r.W)
	return r, nil
}

// Main runs body after Start and exits with status 1 on an error.
func Main(program, about string, body func(r *Run) error) {
	MainFlags(program, about, nil, body)
}

// MainFlags is Main for a program with flags of its own, which flags
// registers on the flag set before it is parsed.
func MainFlags(program, about string, flags func(*flag.FlagSet), body func(r *Run) error) {
	mainWith(program, about, builtin, BuiltinName, flags, body)
}

// MainFrontMotor is MainFlags with the demo tractor with a front-axle
// motor as the built-in design.
func MainFrontMotor(program, about string, flags func(*flag.FlagSet), body func(r *Run) error) {
	mainWith(program, about, builtinFrontMotor, BuiltinFrontMotorName, flags, body)
}

func mainWith(program, about string, data []byte, name string, flags func(*flag.FlagSet), body func(r *Run) error) {
	var extra []func(*flag.FlagSet)
	if flags != nil {
		extra = append(extra, flags)
	}
	r, err := startWith(program, about, data, name, extra...)
	if err == nil && r != nil {
		err = body(r)
		if err == nil {
			fmt.Fprintln(r.W)
			r.Note(Caution)
		}
	}
	if err == flag.ErrHelp {
		return
	}
	if err != nil {
		fmt.Fprintf(os.Stderr, "%s: %v\n", program, err)
		os.Exit(1)
	}
}

// Heading prints a section heading.
func (r *Run) Heading(title string) {
	fmt.Fprintf(r.W, "\n%s\n%s\n", title, strings.Repeat("─", utf8.RuneCountInString(title)))
}

// Printf prints to the report.
func (r *Run) Printf(format string, args ...any) { fmt.Fprintf(r.W, format, args...) }

// Note prints text wrapped at 96 columns, indented by two spaces.
func (r *Run) Note(text string) {
	line := " "
	for _, w := range strings.Fields(text) {
		if utf8.RuneCountInString(line)+1+utf8.RuneCountInString(w) > 96 {
			fmt.Fprintln(r.W, line)
			line = " "
		}
		line += " " + w
	}
	if strings.TrimSpace(line) != "" {
		fmt.Fprintln(r.W, line)
	}
}

// Wrote lists the files written.
func (r *Run) Wrote(files ...string) {
	for _, f := range files {
		fmt.Fprintf(r.W, "  wrote %s\n", f)
	}
}

// Terminal reports whether standard error is a terminal.
func Terminal() bool {
	fi, err := os.Stderr.Stat()
	return err == nil && fi.Mode()&os.ModeCharDevice != 0
}

// Progress returns a progress callback for a sweep, a map or a simulation
// that counts what (a plural noun: "operating points", "time steps"). It
// reports on standard error the share done, the count and the time left,
// only when standard error is a terminal and only once the work has taken
// more than a second. It is safe for concurrent use.
func Progress(label, what string) func(done, total int) {
	if !Terminal() {
		return func(int, int) {}
	}
	start := time.Now()
	var (
		mu      sync.Mutex
		shown   bool
		lastPct = -1
	)
	return func(done, total int) {
		mu.Lock()
		defer mu.Unlock()
		el := time.Since(start)
		if total <= 0 || el < time.Second && !shown {
			return
		}
		pct := 100 * done / total
		if pct != lastPct {
			left := "done"
			if done > 0 && done < total {
				rem := time.Duration(float64(el) * float64(total-done) / float64(done))
				left = "about " + rem.Round(time.Second).String() + " left"
			}
			fmt.Fprintf(os.Stderr, "\r%s: %3d %% (%d of %d %s), %s   ", label, pct, done, total, what, left)
			lastPct, shown = pct, true
		}
		if done >= total && shown {
			fmt.Fprintln(os.Stderr)
		}
	}
}

// Table is a report table with aligned columns: the first column left
// aligned, the others right aligned.
type Table struct {
	rows [][]string
}

// NewTable starts a table with a header row.
func NewTable(header ...string) *Table { return &Table{rows: [][]string{header}} }

// Row adds a row.
func (t *Table) Row(cells ...string) { t.rows = append(t.rows, cells) }

// Rule adds a rule line.
func (t *Table) Rule() { t.rows = append(t.rows, nil) }

// Write prints the table, indented by two spaces.
func (t *Table) Write(w io.Writer) {
	var width []int
	for _, r := range t.rows {
		for i, c := range r {
			if i >= len(width) {
				width = append(width, 0)
			}
			width[i] = max(width[i], utf8.RuneCountInString(c))
		}
	}
	total := 0
	for _, n := range width {
		total += n + 2
	}
	for k, r := range t.rows {
		if r == nil || k == 1 {
			fmt.Fprintf(w, "  %s\n", strings.Repeat("·", max(total-2, 1)))
			if r == nil {
				continue
			}
		}
		var b strings.Builder
		b.WriteString("  ")
		for i, c := range r {
			pad := strings.Repeat(" ", width[i]-utf8.RuneCountInString(c))
			if i == 0 {
				b.WriteString(c + pad)
			} else {
				b.WriteString("  " + pad + c)
			}
		}
		fmt.Fprintln(w, strings.TrimRight(b.String(), " "))
	}
}

// F formats a finite number with a unit, for example F(12.345, 1, "kg")
// is "12.3 kg". A NaN or infinite value prints as "—" with no number, so a
// report never shows NaN.
func F(v float64, prec int, unit string) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	if v == 0 {
		v = 0 // no "-0"
	}
	s := fmt.Sprintf("%.*f", prec, v)
	if s == "-"+strings.TrimPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	if unit == "" {
		return s
	}
	return s + " " + unit
}

// Pct formats a fraction as a percentage with a unit.
func Pct(frac float64, prec int) string { return F(100*frac, prec, "%") }

// Stepper wraps a vehicle strategy to report progress by time step: each
// call of Operate is one step of a simulation. It is safe for concurrent
// use, so several simulations can share one.
type Stepper struct {
	Inner  vehicle.Strategy
	Total  int                   // expected steps, from CountSteps
	Report func(done, total int) // from Progress
	done   atomic.Int64
}

// Operate implements vehicle.Strategy.
func (s *Stepper) Operate(v *vehicle.Vehicle, d vehicle.Demand) (vehicle.Point, error) {
	if n := int(s.done.Add(1)); n < s.Total {
		s.Report(n, s.Total)
	}
	return s.Inner.Operate(v, d)
}

// Finish reports the work complete.
func (s *Stepper) Finish() { s.Report(s.Total, s.Total) }

// CountSteps returns the number of time steps a simulation of the cycle
// takes, for a progress report.
func CountSteps(cycle []vehicle.Segment, step time.Duration) int {
	n := 0
	count := func(seconds float64) {
		n += max(1, int(math.Ceil(seconds/step.Seconds()-1e-9)))
	}
	for _, g := range cycle {
		switch g.Kind {
		case vehicle.FieldPass:
			if g.Speed > 0 {
				count(float64(g.Distance) / float64(g.Speed))
			}
		case vehicle.RoadTransfer:
			for _, s := range g.Profile {
				if g.Speed > 0 {
					count(float64(s.Length) / float64(g.Speed))
				}
			}
		default:
			count(g.Duration.Seconds())
		}
	}
	return max(n, 1)
}

// NearZero is the output power below which an efficiency or a share of it
// is shown as "—": a ratio of two small powers says nothing about the
// design.
const NearZero = units.Power(500)

// Ratio formats an efficiency or hydraulic share frac in percent, or "—"
// when the output power out is below NearZero or below 2 % of the input
// power in (the engine only turning the drive over), or when the engine
// takes no power in (overrun: the load drives the engine).
func Ratio(frac float64, out, in units.Power, prec int) string {
	if in <= 0 || math.Abs(float64(out)) < float64(NearZero) || math.Abs(float64(out)) < 0.02*math.Abs(float64(in)) {
		return "—"
	}
	return Pct(frac, prec)
}
