package model

import (
	"bytes"
	"encoding/csv"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"drawdown/calc"
)

// US units: NIST SP 811 B.8: 1 ft = 0.3048 m, 1 in = 0.0254 m and
// 1 US gal = 3.785411784 L, exact.
const (
	ft  = 0.3048
	in  = 0.0254
	gal = 3.785411784e-3
)

func TestParseTankTable(t *testing.T) {
	cases := []struct {
		name string
		in   string
		sys  System
		want []TablePoint
	}{
		{"comma, header, comment", "level,volume\n# a 1 m² tank\n0, 0\n0.5 m, 500 L\n1,1000\n", SI, []TablePoint{{0, 0}, {0.5, 0.5}, {1, 1}}},
		{"semicolon", "0;0\n0.5;500\n", SI, []TablePoint{{0, 0}, {0.5, 0.5}}},
		{"tab", "0\t0\n0.5\t500\n", SI, []TablePoint{{0, 0}, {0.5, 0.5}}},
		{"CRLF and blank lines", "0,0\r\n\r\n0.5,500\r\n", SI, []TablePoint{{0, 0}, {0.5, 0.5}}},
		{"quoted cells", "\"level\",\"volume\"\n\"0\",\"0\"\n\"0.5 m\",\"500 L\"\n", SI, []TablePoint{{0, 0}, {0.5, 0.5}}},
		// The byte-order mark a spreadsheet writes: with a header...
		{"BOM, header", "\ufefflevel,volume\n0,0\n1,1000\n", SI, []TablePoint{{0, 0}, {1, 1}}},
		// ... and without one, the first row is data and kept.
		{"BOM, no header", "\ufeff0.2,200\n1,1000\n", SI, []TablePoint{{0.2, 0.2}, {1, 1}}},
		// Bare numbers in US units: ft and gal.
		{"US defaults", "0,0\n1,100\n", US, []TablePoint{{0, 0}, {ft, 100 * gal}}},
		// Units named in the header apply to bare numbers below them.
		{"header units (brackets)", "level (in),volume [gal]\n0,0\n12,10\n", SI, []TablePoint{{0, 0}, {12 * in, 10 * gal}}},
		{"header units (underscore)", "level_cm,volume_m3\n0,0\n50,0.5\n", US, []TablePoint{{0, 0}, {0.5, 0.5}}},
		{"a unit in the cell wins", "level (ft),volume (gal)\n0,0\n1 m,1 L\n", SI, []TablePoint{{0, 0}, {1, 1e-3}}},
		{"mixed number in a header unit", "level (in),volume (gal)\n0,0\n1-1/2,1\n", SI, []TablePoint{{0, 0}, {1.5 * in, gal}}},
	}
	for _, c := range cases {
		got, err := ParseTankTable(strings.NewReader(c.in), c.sys)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if len(got) != len(c.want) {
			t.Errorf("%s: got %v, want %v", c.name, got, c.want)
			continue
		}
		for i := range c.want {
			if math.Abs(got[i].Level-c.want[i].Level) > 1e-12 || math.Abs(got[i].Volume-c.want[i].Volume) > 1e-12 {
				t.Errorf("%s: row %d: %v, want %v", c.name, i, got[i], c.want[i])
			}
		}
	}
}

func TestParseTankTableErrors(t *testing.T) {
	cases := []struct {
		in        string
		line, col int
		contains  string
	}{
		{"0,0\n1,NaN\n", 2, 2, "volume"},
		{"0,0\n1,2,3\n", 2, 0, "expected two"},
		{"0,0\n", 1, 0, "two rows"},
		{"0,0\n0x10,5\n", 2, 1, "level"},
		// The first row is not taken for a header when it starts like a
		// number: a typo there is reported, not dropped.
		{"0x10,5\n1,1\n", 1, 1, "level"},
		// Empty cells: refused, never read as zero.
		{"0,,0\n1,1\n", 1, 2, "empty cell"},
		{"0,0\n1,\n", 2, 2, "empty cell"},
		{"0,0\n,5\n", 2, 1, "empty cell"},
		{"0,0\n\"\",5\n", 2, 1, "empty cell"},
		// Semicolons with decimal commas: refused with the reason.
		{"0;0\n0,5;500\n", 2, 1, "decimal comma"},
		{"0;0\n1;1000,5\n", 2, 2, "decimal comma"},
		{"0\t0\n0,5\t500\n", 2, 1, "decimal comma"},
		{"0,0\n0,5,500\n", 2, 0, "decimal comma?"},
		// Broken quoting: the line and position.
		{"0,0\n1,\"10\"0\n", 2, 0, "quote"},
		{"0,0\n1\n", 2, 0, "one cell"},
		{"", 0, 0, "two rows"},
	}
	for _, c := range cases {
		_, err := ParseTankTable(strings.NewReader(c.in), SI)
		var te *TableError
		if !errors.As(err, &te) || te.Line != c.line || te.Column != c.col || !strings.Contains(err.Error(), c.contains) {
			t.Errorf("%q: %v; want line %d field %d mentioning %q", c.in, err, c.line, c.col, c.contains)
		}
	}
}

// TestParseTankTableLimits: past calc.MaxTableRows rows or MaxTableBytes
// bytes a table is refused, never cut.
func TestParseTankTableLimits(t *testing.T) {
	var b strings.Builder
	for i := 0; i <= calc.MaxTableRows; i++ {
		b.WriteString(strconv.Itoa(i) + "," + strconv.Itoa(i) + "\n")
	}
	_, err := ParseTankTable(strings.NewReader(b.String()), SI)
	var te *TableError
	if !errors.As(err, &te) || te.Line != calc.MaxTableRows+1 || !strings.Contains(err.Error(), "more than") {
		t.Errorf("%d rows: %v", calc.MaxTableRows+1, err)
	}
	rows, err := ParseTankTable(strings.NewReader(b.String()[:strings.LastIndex(strings.TrimSuffix(b.String(), "\n"), "\n")+1]), SI)
	if err != nil || len(rows) != calc.MaxTableRows {
		t.Errorf("%d rows: %d read, %v", calc.MaxTableRows, len(rows), err)
	}
	big := "0,0\n1,1\n" + strings.Repeat("# padding\n", MaxTableBytes/10+1)
	if _, err := ParseTankTable(strings.NewReader(big), SI); err == nil || !strings.Contains(err.Error(), "1 MiB") {
		t.Errorf("%d bytes: %v", len(big), err)
	}
}

// TestReadTankTableFile: only a regular file is read; anything else is
// refused with a line saying what it is, at once.
func TestReadTankTableFile(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(dir, "good.csv")
	if err := os.WriteFile(good, []byte("level (m),volume (L)\n0,0\n1,1000\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if rows, err := ReadTankTableFile(good, SI); err != nil || len(rows) != 2 {
		t.Errorf("good file: %v %v", rows, err)
	}
	big := filepath.Join(dir, "big.csv")
	f, err := os.Create(big)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(MaxTableBytes + 1); err != nil {
		t.Fatal(err)
	}
	f.Close()
	cases := []struct{ path, want string }{
		{dir, "is a folder"},
		{filepath.Join(dir, "missing.csv"), "no such file"},
		{big, "at most 1 MiB"},
	}
	if _, err := os.Stat("/dev/zero"); err == nil {
		cases = append(cases, struct{ path, want string }{"/dev/zero", "is a device"})
	}
	if fifo, ok := makeFIFO(t, dir); ok {
		cases = append(cases, struct{ path, want string }{fifo, "is a named pipe"})
	}
	for _, c := range cases {
		_, err := ReadTankTableFile(c.path, SI)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %v; want %q", c.path, err, c.want)
		}
	}
}

// TestWriteTankTableRoundTrip: what writeTankTable writes reads back to the same
// values, bit for bit.
func TestWriteTankTableRoundTrip(t *testing.T) {
	rows := []TablePoint{{0, 0}, {0.1, 1.0 / 3}, {1e-7, 2.5e-9}, {1234.5678901234, 98765.4321}}
	var b bytes.Buffer
	if err := writeTankTable(&b, rows); err != nil {
		t.Fatal(err)
	}
	got, err := ParseTankTable(&b, US)
	if err != nil {
		t.Fatal(err)
	}
	for i := range rows {
		if got[i] != rows[i] {
			t.Errorf("row %d: %v, want %v", i, got[i], rows[i])
		}
	}
}

// FuzzParseTankTable: any input is read or refused with a TableError, never
// a panic; what is read is finite, within calc.MaxTableRows, and survives a
// round trip through writeTankTable unchanged.
func FuzzParseTankTable(f *testing.F) {
	f.Add("level,volume\n0,0\n1,100\n")
	f.Add("0;0\n0.5 m;200 L\n")
	f.Add("\ufeff\"Level (in)\",\"Volume (gal)\"\r\n\"0\",\"0\"\r\n\"4\",\"29.92\"\r\n")
	f.Add("0,,0\n1,1\n")
	f.Add("0;0\n0,5;500\n")
	f.Add("0\t0\n# note\n1-1/2 ft\t3 bbl\n")
	f.Fuzz(func(t *testing.T, s string) {
		rows, err := ParseTankTable(strings.NewReader(s), SI)
		if err != nil {
			var te *TableError
			if !errors.As(err, &te) {
				t.Fatalf("error %T %v is not a TableError", err, err)
			}
			return
		}
		if len(rows) < 2 || len(rows) > calc.MaxTableRows {
			t.Fatalf("%d rows", len(rows))
		}
		for _, r := range rows {
			if math.IsNaN(r.Level) || math.IsInf(r.Level, 0) || math.IsNaN(r.Volume) || math.IsInf(r.Volume, 0) {
				t.Fatalf("non-finite row %v from %q", r, s)
			}
		}
		var b bytes.Buffer
		if err := writeTankTable(&b, rows); err != nil {
			t.Fatal(err)
		}
		back, err := ParseTankTable(&b, US)
		if err != nil {
			t.Fatalf("round trip of %v: %v\n%s", rows, err, b.String())
		}
		for i := range rows {
			if back[i] != rows[i] {
				t.Fatalf("round trip row %d: %v, want %v", i, back[i], rows[i])
			}
		}
	})
}

// TestTableShapeChoice: the "table" tank shape is accepted (it comes with a
// calibration file, from the command line) but not offered by the picker,
// which has no way to load a file.
func TestTableShapeChoice(t *testing.T) {
	shape, _ := FieldByID(FieldTankShape)
	if err := shape.ValidateChoice("table", nil); err != nil {
		t.Errorf("table refused: %v", err)
	}
	if id, ok := shape.ChoiceID(" Table ", nil); !ok || id != calc.ShapeTable {
		t.Errorf("ChoiceID(Table) = %q, %v", id, ok)
	}
	for _, c := range shape.Choices(nil) {
		if c.ID == calc.ShapeTable {
			t.Error("the picker offers the table shape")
		}
	}
	recv, _ := FieldByID(FieldReceiverShape)
	if err := recv.ValidateChoice("table", nil); err == nil {
		t.Error("a receiver of table shape accepted")
	}
}

// writeTankTable (a test helper) writes rows as a calibration table that ParseTankTable
// reads back to the same values: a header, then level in m and volume in m³
// with every digit kept.
func writeTankTable(w io.Writer, rows []TablePoint) error {
	cw := csv.NewWriter(w)
	if err := cw.Write([]string{"level (m)", "volume (m³)"}); err != nil {
		return err
	}
	for _, r := range rows {
		if err := cw.Write([]string{strconv.FormatFloat(r.Level, 'g', -1, 64), strconv.FormatFloat(r.Volume, 'g', -1, 64)}); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
