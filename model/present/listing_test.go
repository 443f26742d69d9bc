package present

import (
	"bytes"
	"errors"
	"strings"
	"testing"
	"unicode/utf8"

	"drawdown/calc/testkit"
	"drawdown/presets"
)

// The listing shows every entry, fits 80 columns, and never declares
// anything safe.
func TestWriteListing(t *testing.T) {
	c := presets.Builtin()
	var buf bytes.Buffer
	if err := WriteListing(&buf, c); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for i, line := range strings.Split(out, "\n") {
		if n := utf8.RuneCountInString(line); n > 80 {
			t.Errorf("line %d is %d columns: %q", i+1, n, line)
		}
		if strings.HasSuffix(line, " ") {
			t.Errorf("line %d has trailing space", i+1)
		}
	}
	var ids []string
	for _, l := range c.Liquids() {
		ids = append(ids, "  "+l.ID+"  ")
	}
	for _, m := range c.Materials() {
		ids = append(ids, "  "+m.ID+"  ")
	}
	for _, h := range c.Hoses() {
		ids = append(ids, "  "+h.ID+" ")
	}
	for _, f := range c.Fittings() {
		ids = append(ids, "  "+f.ID+"  ")
	}
	for _, tk := range c.Tanks() {
		ids = append(ids, "  "+tk.ID+"  ")
	}
	for _, id := range ids {
		if !strings.Contains(out, id) {
			t.Errorf("listing lacks %q", id)
		}
	}
	low := strings.ToLower(out)
	for _, w := range []string{"is safe", "are safe", "safe to", "nan", "+inf"} {
		if strings.Contains(low, w) {
			t.Errorf("listing contains %q", w)
		}
	}
	if strings.Count(out, "source") < len(c.Materials())+len(c.Fittings())+len(c.Tanks()) {
		t.Error("listing shows too few sources")
	}
	// A failing writer's error comes back.
	if err := WriteListing(failWriter{}, c); err == nil {
		t.Error("write error lost")
	}
}

func TestWrap(t *testing.T) {
	got := wrap("density 1000 kg/m³ and pressure 2.34 kPa", 20)
	for _, l := range got {
		if strings.HasPrefix(l, "kPa") || strings.HasPrefix(l, "kg/m³") || utf8.RuneCountInString(l) > 20 {
			t.Errorf("wrap: %q", got)
		}
	}
	if got := wrap(strings.Repeat("x", 45), 20); len(got) != 3 {
		t.Errorf("long word: %q", got)
	}
}

// The listing of the built-in catalogue, kept as a golden file so that a
// change to any entry or to the layout shows in review. Refresh with
// go test ./model/present -run TestListingGolden -update.
func TestListingGolden(t *testing.T) {
	var buf bytes.Buffer
	if err := WriteListing(&buf, presets.Builtin()); err != nil {
		t.Fatal(err)
	}
	testkit.Golden(t, "testdata/listing.golden", buf.Bytes())
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, errors.New("disk full") }

// The listing carries the rule against starting by mouth.
func TestListingNeverByMouth(t *testing.T) {
	var buf bytes.Buffer
	if err := WriteListing(&buf, presets.Builtin()); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(buf.String(), "Never start a siphon by mouth") {
		t.Error("listing lacks the never-by-mouth caution")
	}
}
