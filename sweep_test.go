package powersplit

import (
	"bytes"
	"encoding/csv"
	"math"
	"reflect"
	"runtime"
	"slices"
	"strconv"
	"testing"
	"time"
	"weak"

	"github.com/powersplit-dev/powersplit/hydrostat"
	"github.com/powersplit-dev/powersplit/units"
	"pgregory.net/rapid"
)

// TestMapCellsMatchSolve checks the compact storage of a map against the
// solver: over random valid layouts (the property generators) and a small
// map around a random point, with a fixed range or Auto, every cell that
// Map.At returns equals, bit for bit, what Solve (or Best) gives for that
// point on a Brief State: the error (rebuilt or kept) field by field, the
// range, every number and the binding margin with its names. One worker,
// fresh for the new layout, and the reference solver take the cells in the
// same order: the compiled path's first guess of the loss directions is the
// last point's, and near a change of direction the guess can decide the
// last bits of a result. And the table of margin names fixed
// before the run holds every binding margin met (none added during it) and
// lists the margins of the full State (all but the rated pressures, which
// are flags that never bind, and the other ranges' speed limits), in the
// same order.
func TestMapCellsMatchSolve(t *testing.T) {
	t.Parallel()
	rapid.Check(t, func(t *rapid.T) {
		c := genCase(t)
		var full State
		if err := NewSolver(c.l).Solve(c.p, &full); err == nil {
			var names []marginName
			for _, m := range full.Margins {
				if m.Bound != boundRated {
					names = append(names, newMarginName(m.Element, m.Quantity, m.Bound, m.Limit.SI, m.Value.Kind, m.Unchecked))
				}
			}
			// The table holds every range's speed limit, the State only its
			// range's.
			want := slices.DeleteFunc(marginNames(c.l.l), func(n marginName) bool {
				return n.bound == boundRangeSpeed && n.element != full.RangeName
			})
			if !slices.Equal(names, want) {
				t.Fatalf("%s: margin names %v, the full State's %v", c.kind, want, names)
			}
		}
		auto := rapid.Bool().Draw(t, "Auto")
		rg := c.p.Range
		if auto {
			rg = Auto
		}
		v, tq := c.p.Outputs[0].Speed, c.p.Outputs[0].Torque
		spec := MapSpec{Range: rg, Input: c.p.Input, SpeedFrom: v / 2, SpeedTo: 3 * v / 2, SpeedSteps: 5,
			TorqueFrom: -tq, TorqueTo: 2 * tq, TorqueSteps: 4, PTO: c.p.PTO, Workers: 1}
		m, err := c.l.Map(spec)
		if err != nil {
			t.Fatalf("Map: %v", err)
		}
		if got, want := len(m.res.binds), len(marginNames(c.l.l)); got != want {
			t.Errorf("%s: %d margin names after the run, %d before: %v", c.kind, got, want, m.res.binds[want:])
		}
		s := NewSolver(c.l)
		st := State{Brief: true}
		same := func(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
		for i, tq := range m.Torques {
			for j, v := range m.Speeds {
				p := c.p
				p.Outputs = make([]OutputDemand, len(c.p.Outputs))
				for k := range p.Outputs {
					p.Outputs[k].Speed = v
				}
				p.Outputs[0].Torque = tq
				var err error
				if auto {
					err = s.Best(p, nil, &st)
				} else {
					err = s.Solve(p, &st)
				}
				cl := m.At(i, j)
				if cl.OK != (err == nil) || cl.Reason() != (Cell{Err: err}).Reason() || cl.Range != st.Range {
					t.Fatalf("cell %d,%d: OK %v %q range %d; Solve: %v, range %d", i, j, cl.OK, cl.Reason(), cl.Range, err, st.Range)
				}
				// The error, rebuilt from the cell or kept, equals Solve's
				// field by field, causes included.
				if !reflect.DeepEqual(cl.Err, err) {
					t.Fatalf("cell %d,%d: error %#v, Solve %#v", i, j, cl.Err, err)
				}
				if !same(float64(cl.OutputSpeed), float64(v)) {
					t.Fatalf("cell %d,%d: speed %v, want %v", i, j, cl.OutputSpeed, v)
				}
				if err != nil {
					continue
				}
				lp := st.Loops[0]
				for _, q := range []struct {
					name      string
					got, want float64
				}{
					{"output torque", float64(cl.OutputTorque), float64(st.Outputs[0].Torque)},
					{"input torque", float64(cl.InputTorque), float64(st.InputTorque)},
					{"input power", float64(cl.InputPower), float64(st.InputPower)},
					{"output power", float64(cl.OutputPower), float64(st.OutputPower)},
					{"loss", float64(cl.Loss), float64(st.Loss)},
					{"efficiency", cl.Efficiency, st.Efficiency},
					{"hydraulic share", cl.HydraulicShare, st.HydraulicShare},
					{"pressure", float64(cl.Pressure), float64(lp.Pressure)},
					{"high pressure", float64(cl.HighPressure), float64(lp.High)},
					{"pump speed", float64(cl.PumpSpeed), float64(lp.Pump.Speed)},
					{"motor speed", float64(cl.MotorSpeed), float64(lp.Motors[0].Speed)},
					{"pump setting", cl.PumpSetting, lp.Pump.Setting},
					{"motor setting", cl.MotorSetting, lp.Motors[0].Setting},
					{"binding value", cl.Binding.Value.SI, st.Binding.Value.SI},
					{"binding limit", cl.Binding.Limit.SI, st.Binding.Limit.SI},
				} {
					if !same(q.got, q.want) {
						t.Fatalf("%s cell %d,%d: %s %.17g, Solve %.17g", c.kind, i, j, q.name, q.got, q.want)
					}
				}
				b, w := cl.Binding, st.Binding
				if b.Element != w.Element || b.Quantity != w.Quantity || b.Bound != w.Bound || b.Unchecked != w.Unchecked ||
					b.Value.Kind != w.Value.Kind || b.Limit.Kind != w.Limit.Kind {
					t.Fatalf("%s cell %d,%d: binding %+v, Solve %+v", c.kind, i, j, b, w)
				}
			}
		}
	})
}

// TestWriteCSVMatchesEncodingCSV checks the map's own CSV writer against
// encoding/csv writing the same records field by field (the writer before
// it was made to append into one buffer): byte for byte equal, for a map
// over two ranges with feasible and infeasible cells and design names that
// need quoting, and for a pure hydrostatic map with its motor held at 0.7,
// where pressures and speeds bind (with Sequential a setting at full
// displacement, no room left, binds everywhere).
func TestWriteCSVMatchesEncodingCSV(t *testing.T) {
	t.Parallel()
	lp := makeLoop(t, loopSpec{pumpCC: 100, motorCC: 100, lossy: true, wilson: demoWilson, maxRPM: 3000,
		sched: hydrostat.Pinned{Held: []float64{0.7}}})
	pure, err := PureHydrostatic(PureHydrostaticSpec{Loop: lp, PumpRatio: 1.2, Ranges: []RangeGear{{Ratio: 0.3}}})
	if err != nil {
		t.Fatal(err)
	}
	type mapCase struct {
		l    Layout
		spec MapSpec
	}
	var cases []mapCase
	for _, design := range []string{"", "plain", "a,b", " lead", "q\"x", `\.`, "line\nbreak", "cr\rx", "\u00a0nbsp"} {
		cases = append(cases, mapCase{resultsLayout(t), MapSpec{Design: design, Range: Auto, Input: units.RPM(2000),
			SpeedFrom: units.RPM(-200), SpeedTo: units.RPM(1400), SpeedSteps: 9,
			TorqueFrom: units.NewtonMetres(100), TorqueTo: units.NewtonMetres(6000), TorqueSteps: 5}})
	}
	cases = append(cases, mapCase{pure, MapSpec{Design: "pure", Range: 0, Input: units.RPM(2000),
		SpeedFrom: units.RPM(50), SpeedTo: units.RPM(1500), SpeedSteps: 9,
		TorqueFrom: units.NewtonMetres(100), TorqueTo: units.NewtonMetres(3000), TorqueSteps: 7}})
	ok, bad, bound := 0, 0, 0
	for _, mc := range cases {
		m, err := mc.l.Map(mc.spec)
		if err != nil {
			t.Fatal(err)
		}
		var got, want bytes.Buffer
		if err := m.WriteCSV(&got); err != nil {
			t.Fatal(err)
		}
		cw := csv.NewWriter(&want)
		_ = cw.Write(CSVHeader)
		for i := range m.Torques {
			for j := range m.Speeds {
				c := m.At(i, j)
				switch {
				case !c.OK:
					bad++
				case c.Binding.Limit.SI != 1:
					bound++
					fallthrough
				default:
					ok++
				}
				_ = cw.Write(refRecord(c, m.Design, m.Input, m.RangeNames))
			}
		}
		cw.Flush()
		if got.String() != want.String() {
			t.Errorf("design %q: WriteCSV\n%s\nencoding/csv\n%s", mc.spec.Design, got.String(), want.String())
		}
	}
	if ok == 0 || bad == 0 || bound == 0 {
		t.Errorf("%d feasible, %d infeasible cells, %d bound by a limit other than a setting; want all three", ok, bad, bound)
	}
}

// refRecord is a cell's CSV record as the writer built it before it
// appended into one buffer, for encoding/csv.
func refRecord(c Cell, design string, in units.AngularVelocity, names []string) []string {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', 10, 64) }
	head := []string{design, f(in.RPM()), f(c.OutputSpeed.RPM()), f(float64(c.OutputTorque))}
	if !c.OK {
		return append(head, "false", "", "", "", "", "", "", "", "", "", "", "", "", "", "", "", c.Reason())
	}
	rg := strconv.Itoa(c.Range)
	if c.Range >= 0 && c.Range < len(names) {
		rg = names[c.Range]
	}
	bind, left := "", ""
	if c.Binding.Limit.SI > 0 {
		bind = c.Binding.Element + " " + c.Binding.Quantity
		left = f(100 * c.Binding.Left().SI / c.Binding.Limit.SI)
	}
	return append(head, "true", rg,
		f(float64(c.InputTorque)), f(c.InputPower.Kilowatts()), f(c.OutputPower.Kilowatts()), f(c.Loss.Kilowatts()),
		f(100*c.Efficiency), f(100*c.HydraulicShare), f(c.Pressure.Bar()), f(c.HighPressure.Bar()),
		f(c.PumpSpeed.RPM()), f(c.MotorSpeed.RPM()), f(100*c.PumpSetting), f(100*c.MotorSetting), bind, left, "")
}

// TestLimitErrorShapes keeps the rebuilding of a failed cell's limit
// error (limitShape) complete: it copies every field of LimitError and
// hydrostat.LimitError that exists now; a new field fails this test until
// limitShape keeps it too.
func TestLimitErrorShapes(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		typ    reflect.Type
		fields int
	}{
		{reflect.TypeFor[LimitError](), 7},           // Element, Quantity, Value, Bound, Limit, Err, Cause
		{reflect.TypeFor[hydrostat.LimitError](), 5}, // Quantity, Value, Bound, Limit, Err
	} {
		if n := c.typ.NumField(); n != c.fields {
			t.Errorf("%v has %d fields, limitShape rebuilds %d", c.typ, n, c.fields)
		}
	}
}

// TestCellHasNoPointers keeps a map's storage out of the garbage
// collector's way: the stored cell holds numbers only (a 200 × 200 map of
// cells with pointers spent about a fifth of its time on the collector's
// scans and write barriers), in 120 bytes.
func TestCellHasNoPointers(t *testing.T) {
	t.Parallel()
	typ := reflect.TypeFor[cell]()
	for i := range typ.NumField() {
		switch f := typ.Field(i); f.Type.Kind() {
		case reflect.Float64, reflect.Int32, reflect.Uint32:
		default:
			t.Errorf("cell.%s is a %v; want numbers only", f.Name, f.Type)
		}
	}
	if typ.Size() > 120 {
		t.Errorf("cell is %d bytes, want at most 120", typ.Size())
	}
}

// TestWorkerPoolLetsLayoutGo checks that the pool of idle map workers does
// not keep a layout alive: once the layout is unreachable, the collector
// frees it (the pooled workers refer to it) and its pool's entry goes.
// Not parallel: it counts the entries.
func TestWorkerPoolLetsLayoutGo(t *testing.T) {
	count := func() int {
		n := 0
		workerPools.Range(func(_, _ any) bool { n++; return true })
		return n
	}
	before := count()
	key := func() weak.Pointer[layout] {
		l := benchLayout(t, true)
		if _, err := l.Map(benchMapSpec(8, 2)); err != nil {
			t.Fatal(err)
		}
		if _, ok := workerPools.Load(weak.Make(l.l)); !ok {
			t.Fatal("the map left no pool of workers for its layout")
		}
		return weak.Make(l.l)
	}()
	for range 100 {
		runtime.GC()
		if _, ok := workerPools.Load(key); !ok && key.Value() == nil {
			if n := count(); n > before {
				t.Errorf("%d pools after the layout went, %d before", n, before)
			}
			return
		}
		time.Sleep(time.Millisecond)
	}
	t.Errorf("the layout is still alive (%v) or its pool still listed after 100 collections", key.Value() != nil)
}

// TestOnceErrorsDetach: with once set (a map's cell), a refused point's
// error is the solver's own, rewritten by the next refused point; detach
// gives a copy (its cause copied too) that the next solve leaves as it
// was, equal to the error a solve without once returns.
func TestOnceErrorsDetach(t *testing.T) {
	l := benchLayout(t, true)
	s := NewSolver(l)
	st := State{Brief: true}
	spec := benchMapSpec(20, 1)
	var refused []Point
	for i := range 20 {
		for j := range 20 {
			v := float64(spec.SpeedFrom) + float64(spec.SpeedTo-spec.SpeedFrom)*float64(j)/19
			tq := float64(spec.TorqueFrom) + float64(spec.TorqueTo-spec.TorqueFrom)*float64(i)/19
			p := Point{Range: spec.Range, Input: spec.Input, Outputs: []OutputDemand{{Speed: units.AngularVelocity(v), Torque: units.Torque(tq)}}, PTO: spec.PTO}
			if s.Solve(p, &st) != nil {
				refused = append(refused, p)
			}
		}
	}
	if len(refused) < 2 {
		t.Fatalf("only %d refused points to work with", len(refused))
	}
	for i := 0; i+1 < len(refused); i++ {
		want := s.Solve(refused[i], &st)
		s.once = true
		got := s.detach(s.Solve(refused[i], &st))
		_ = s.Solve(refused[i+1], &st) // rewrites the once errors
		s.once = false
		if got.Error() != want.Error() {
			t.Errorf("point %d: detached %q, plain %q", i, got, want)
		}
		if le, ok := got.(*LimitError); !ok || le == &s.onceErr {
			t.Errorf("point %d: detach returned the solver's own error", i)
		} else if hl, ok := le.Cause.(*hydrostat.LimitError); ok && hl == &s.onceHydr {
			t.Errorf("point %d: detach kept the solver's own cause", i)
		}
	}
}
