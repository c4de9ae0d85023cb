package planetary_test

import (
	"testing"

	"github.com/powersplit-dev/powersplit/planetary"
)

var (
	benchSet, _ = planetary.FromRatio(-2.8, 0.98)
	benchSp, _  = benchSet.Solve(planetary.Speeds{Sun: 150, Ring: 40}, planetary.Carrier)
	sinkF       float64
)

func BenchmarkSolve(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		sp, _ := benchSet.Solve(benchSp, planetary.Carrier)
		sinkF += float64(sp.Carrier)
	}
}

func BenchmarkTorque(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		st, _ := benchSet.Torque(benchSp, planetary.Carrier, 250)
		sinkF += float64(st.Loss)
	}
}

func BenchmarkTorqueFactors(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		kr, kc := benchSet.TorqueFactors(benchSet.FlowOf(benchSp, 10))
		sinkF += kr + kc
	}
}
