package model

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestParseTankTable(t *testing.T) {
	in := "level,volume\n# a 1 m² tank\n0, 0\n0.5 m; 500 L\n1\t1000\n"
	got, err := ParseTankTable(strings.NewReader(in), SI)
	if err != nil {
		t.Fatal(err)
	}
	want := []TablePoint{{0, 0}, {0.5, 0.5}, {1, 1}}
	if len(got) != len(want) {
		t.Fatalf("got %v", got)
	}
	for i := range want {
		if math.Abs(got[i].Level-want[i].Level) > 1e-12 || math.Abs(got[i].Volume-want[i].Volume) > 1e-12 {
			t.Errorf("row %d: %v, want %v", i, got[i], want[i])
		}
	}
	// US units: ft and US gallons (NIST SP 811: 1 ft = 0.3048 m, 1 gal = 3.785411784 L).
	us, err := ParseTankTable(strings.NewReader("0,0\n1,100\n"), US)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(us[1].Level-0.3048) > 1e-12 || math.Abs(us[1].Volume-0.3785411784) > 1e-12 {
		t.Errorf("US row: %v", us[1])
	}
}

func TestParseTankTableErrors(t *testing.T) {
	cases := []struct {
		in        string
		line, col int
		contains  string
	}{
		{"0,0\n1,NaN\n", 2, 2, "volume"},
		{"0,0\n1,2,3\n", 2, 0, "two cells"},
		{"0,0\n", 1, 0, "two rows"},
		{"0,0\n0x10,5\n", 2, 1, "level"},
	}
	for _, c := range cases {
		_, err := ParseTankTable(strings.NewReader(c.in), SI)
		var te *TableError
		if !errors.As(err, &te) || te.Line != c.line || te.Column != c.col || !strings.Contains(err.Error(), c.contains) {
			t.Errorf("%q: %v; want line %d column %d mentioning %q", c.in, err, c.line, c.col, c.contains)
		}
	}
}

func FuzzParseTankTable(f *testing.F) {
	f.Add("level,volume\n0,0\n1,100\n")
	f.Add("0;0\n0.5 m;200 L\n")
	f.Fuzz(func(t *testing.T, s string) {
		rows, err := ParseTankTable(strings.NewReader(s), SI)
		if err != nil {
			return
		}
		for _, r := range rows {
			if math.IsNaN(r.Level) || math.IsInf(r.Level, 0) || math.IsNaN(r.Volume) || math.IsInf(r.Volume, 0) {
				t.Fatalf("non-finite row %v from %q", r, s)
			}
		}
	})
}
