package design

import (
	"path/filepath"
	"testing"

	"github.com/google/go-cmp/cmp"
	"github.com/google/go-cmp/cmp/cmpopts"
)

// saveLoad saves f, loads it back and checks the two equal, value for
// value and byte for byte when marshalled again; it returns the reloaded
// file and f's saved bytes.
func saveLoad(t testing.TB, f *File) (*File, []byte) {
	t.Helper()
	path := filepath.Join(t.TempDir(), "saved.json")
	if err := f.Save(path); err != nil {
		t.Fatal(err)
	}
	g, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if diff := cmp.Diff(f, g, cmpopts.IgnoreUnexported(File{})); diff != "" {
		t.Errorf("load, save, load: values differ (-saved +loaded):\n%s", diff)
	}
	x, _ := f.Marshal()
	y, _ := g.Marshal()
	if string(x) != string(y) {
		t.Error("Marshal of the reloaded file differs from the saved bytes")
	}
	return g, x
}

// reparse marshals a parsed design, parses the text again and checks the
// two equal.
func reparse(t testing.TB, a *File) {
	t.Helper()
	b, err := a.Marshal()
	if err != nil {
		t.Fatalf("Marshal of a parsed design: %v", err)
	}
	c, err := Parse("again.json", b)
	if err != nil {
		t.Fatalf("Parse of a saved design: %v", err)
	}
	if diff := cmp.Diff(a, c, cmpopts.IgnoreUnexported(File{})); diff != "" {
		t.Errorf("parse, save, parse: values differ:\n%s", diff)
	}
}
