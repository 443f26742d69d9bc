package model

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"regexp"
	"strconv"
	"strings"

	"drawdown/calc"
)

// MaxTableBytes bounds a tank calibration file: 1 MiB holds calc.MaxTableRows
// rows of level and volume many times over. A larger file is refused, never
// cut.
const MaxTableBytes = 1 << 20

// TableError is a problem in a tank calibration table, with its 1-based line
// and field (1 = level, 2 = volume; 0 when the problem is the whole line or
// file), in the manner of csv.ParseError.
type TableError struct {
	Line, Column int
	Err          error
}

func (e *TableError) Error() string {
	s := "tank table"
	if e.Line > 0 {
		s += " line " + strconv.Itoa(e.Line)
	}
	switch e.Column {
	case 0:
	case 1:
		s += ", level"
	case 2:
		s += ", volume"
	default:
		s += ", field " + strconv.Itoa(e.Column)
	}
	return s + ": " + e.Err.Error()
}

// Unwrap returns the cause.
func (e *TableError) Unwrap() error { return e.Err }

// ParseTankTable reads a tank calibration table (CSV, through encoding/csv):
// one row per line, the level and the volume held up to it. The separator is
// a comma, a semicolon or a tab, whichever the first row uses; cells may be
// quoted; a UTF-8 byte-order mark and CRLF line ends are accepted; lines
// starting with # and blank lines are skipped. Each cell is read by Parse,
// so units may be written (`1.2 m`, `850 L`, `3 ft`, `224 gal`). A first row
// whose cells are not numbers is a header; a unit it names in brackets or
// after an underscore (`level (m)`, `volume [gal]`, `level_ft`) is the unit
// of the bare numbers in that column; otherwise bare numbers are in the
// system's default units (m and L, or ft and gal).
//
// Refused, with the line and field: an empty cell, a row that is not two
// cells, a decimal comma (a point is the decimal mark here), a cell Parse
// cannot read, more than calc.MaxTableRows rows, input over MaxTableBytes,
// fewer than two rows. Monotonicity is checked by calc.NewTable, which names
// the row.
func ParseTankTable(r io.Reader, sys System) ([]TablePoint, error) {
	data, err := io.ReadAll(io.LimitReader(r, MaxTableBytes+1))
	if err != nil {
		return nil, &TableError{Err: err}
	}
	if len(data) > MaxTableBytes {
		return nil, &TableError{Err: errTableBig}
	}
	data = bytes.TrimPrefix(data, []byte("\ufeff"))
	sep := tableSeparator(data)
	cr := csv.NewReader(bytes.NewReader(data))
	cr.Comma = sep
	cr.Comment = '#'
	cr.FieldsPerRecord = -1 // checked here, with a clearer message
	cr.TrimLeadingSpace = true
	cr.ReuseRecord = true

	t := tableReader{sys: sys, sep: sep, units: [2]string{DefaultUnit(DimLength, sys), DefaultUnit(DimVolume, sys)}}
	line := 0
	for first := true; ; first = false {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(err)
		}
		line, _ = cr.FieldPos(0)
		if err := t.row(rec, line, first); err != nil {
			return nil, err
		}
	}
	if len(t.out) < 2 {
		return nil, &TableError{Line: line, Err: errTableShort}
	}
	return t.out, nil
}

type tableReader struct {
	sys   System
	sep   rune
	units [2]string // of bare numbers: level, volume
	out   []TablePoint
}

var dims = [2]Dim{DimLength, DimVolume}

// row reads one record; the first may be a header.
func (t *tableReader) row(rec []string, line int, first bool) error {
	if first && t.header(rec) {
		return nil
	}
	for i, c := range rec {
		if strings.TrimSpace(c) == "" {
			return &TableError{Line: line, Column: i + 1, Err: errTableEmpty}
		}
		if t.sep != ',' && decimalComma.MatchString(c) {
			return &TableError{Line: line, Column: i + 1, Err: fmt.Errorf("%q has a decimal comma; write the decimal mark as a point (0.5, not 0,5)", c)}
		}
	}
	if len(rec) != 2 {
		if t.sep == ',' && len(rec) > 2 && allDigits(rec) {
			return &TableError{Line: line, Err: fmt.Errorf("%d cells, expected two (level, volume): a decimal comma? write 0.5, not 0,5", len(rec))}
		}
		if len(rec) == 1 {
			return &TableError{Line: line, Err: fmt.Errorf("one cell, expected two: level and volume, separated by %s", sepName(t.sep))}
		}
		return &TableError{Line: line, Err: fmt.Errorf("%d cells, expected two: level and volume", len(rec))}
	}
	var v [2]float64
	for i, c := range rec {
		c = strings.TrimSpace(c)
		if endsInDigit.MatchString(c) {
			c += " " + t.units[i] // a bare number: the column's unit
		}
		x, err := Parse(dims[i], c, t.sys)
		if err != nil {
			return &TableError{Line: line, Column: i + 1, Err: err}
		}
		v[i] = x
	}
	if len(t.out) >= calc.MaxTableRows {
		return &TableError{Line: line, Err: errTableLong}
	}
	t.out = append(t.out, TablePoint{Level: v[0], Volume: v[1]})
	return nil
}

// header reports whether rec is a header (no cell reads as a number), and
// takes the units it names for the bare numbers below it.
func (t *tableReader) header(rec []string) bool {
	for _, c := range rec {
		if numberStart.MatchString(strings.TrimSpace(c)) {
			return false
		}
	}
	for i := 0; i < len(rec) && i < 2; i++ {
		if u := headerUnit(rec[i]); u != "" {
			if _, err := Parse(dims[i], "1 "+u, t.sys); err == nil {
				t.units[i] = u
			}
		}
	}
	return true
}

// headerUnit finds a unit named in a header cell: in brackets, or after the
// last underscore.
func headerUnit(cell string) string {
	if m := bracketUnit.FindStringSubmatch(cell); m != nil {
		return strings.TrimSpace(m[1])
	}
	if i := strings.LastIndex(cell, "_"); i >= 0 {
		return strings.TrimSpace(cell[i+1:])
	}
	return ""
}

var (
	bracketUnit  = regexp.MustCompile(`[(\[]\s*([^()\[\]]+?)\s*[)\]]\s*$`)
	bareNumber   = regexp.MustCompile(`^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$`)
	endsInDigit  = regexp.MustCompile(`\d$`)
	numberStart  = regexp.MustCompile(`^[+\-−]?\.?\d`)
	decimalComma = regexp.MustCompile(`^\s*[+-]?\d+,\d`)
)

func sepName(r rune) string {
	switch r {
	case '\t':
		return "a tab (as on the first row)"
	case ';':
		return "a semicolon (as on the first row)"
	}
	return "a comma (as on the first row)"
}

func allDigits(rec []string) bool {
	for _, c := range rec {
		if !bareNumber.MatchString(strings.TrimSpace(c)) {
			return false
		}
	}
	return true
}

// tableSeparator is the separator of the first line that is not blank or a
// comment: a tab, else a semicolon, else a comma.
func tableSeparator(data []byte) rune {
	for _, line := range bytes.Split(data, []byte("\n")) {
		line = bytes.TrimSpace(line)
		if len(line) == 0 || line[0] == '#' {
			continue
		}
		switch {
		case bytes.IndexByte(line, '\t') >= 0:
			return '\t'
		case bytes.IndexByte(line, ';') >= 0:
			return ';'
		}
		return ','
	}
	return ','
}

// csvError turns an encoding/csv error into a TableError with its line and
// the position in the line.
func csvError(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &TableError{Line: pe.Line, Err: fmt.Errorf("%v (at character %d); quote a cell that holds a quote as \"\" inside quotes", pe.Err, pe.Column)}
	}
	return &TableError{Err: err}
}

// ReadTankTableFile reads a calibration table from a regular file. A folder,
// a named pipe, a device or a socket is refused with a line saying what it
// is (none is ever read, so a pipe cannot hang the reader), and so is a file
// over MaxTableBytes.
func ReadTankTableFile(path string, sys System) ([]TablePoint, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, fileError(err)
	}
	if err := regularTable(fi); err != nil {
		return nil, err
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fileError(err)
	}
	defer f.Close()
	// The path may have been swapped for something else since the Stat.
	if fi, err = f.Stat(); err != nil {
		return nil, fileError(err)
	}
	if err := regularTable(fi); err != nil {
		return nil, err
	}
	return ParseTankTable(f, sys)
}

func regularTable(fi fs.FileInfo) error {
	m := fi.Mode()
	var what string
	switch {
	case m.IsDir():
		what = "a folder"
	case m&fs.ModeNamedPipe != 0:
		what = "a named pipe"
	case m&fs.ModeSocket != 0:
		what = "a socket"
	case m&fs.ModeDevice != 0, m&fs.ModeCharDevice != 0:
		what = "a device"
	case !m.IsRegular():
		what = "not a regular file"
	}
	if what != "" {
		return fmt.Errorf("is %s, not a CSV file; save the table to a file and give its path", what)
	}
	if fi.Size() > MaxTableBytes {
		return fmt.Errorf("is %s bytes; a calibration table is at most 1 MiB (1,048,576 bytes, %s rows)", groupDigits(fi.Size()), groupDigits(calc.MaxTableRows))
	}
	return nil
}

func fileError(err error) error {
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return errors.New("no such file")
	case errors.Is(err, fs.ErrPermission):
		return errors.New("cannot be read (permission denied)")
	}
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

var errTableLong = fmt.Errorf("more than %d rows; a calibration table is at most %d rows", calc.MaxTableRows, calc.MaxTableRows)

type tableErr string

func (e tableErr) Error() string { return string(e) }

const (
	errTableEmpty tableErr = "empty cell; every row needs a level and a volume"
	errTableShort tableErr = "a tank table needs at least two rows"
	errTableBig   tableErr = "larger than 1 MiB; a calibration table is at most 1 MiB"
)

// groupDigits writes n with commas between groups of three digits
// (1,100,000), as the size of a file is read.
func groupDigits(n int64) string {
	s := strconv.FormatInt(n, 10)
	for i := len(s) - 3; i > 0 && s[i-1] != '-'; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
