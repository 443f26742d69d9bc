package model

import (
	"bufio"
	"io"
	"strconv"
	"strings"
)

// TableError is a problem in a tank calibration table, with its 1-based line
// and column (1 = level, 2 = volume), in the manner of csv.ParseError.
type TableError struct {
	Line, Column int
	Err          error
}

func (e *TableError) Error() string {
	s := "tank table line " + strconv.Itoa(e.Line)
	switch e.Column {
	case 1:
		s += ", level"
	case 2:
		s += ", volume"
	}
	return s + ": " + e.Err.Error()
}

// Unwrap returns the cause.
func (e *TableError) Unwrap() error { return e.Err }

// maxTableRows bounds a calibration table (a tank chart rarely has more
// than a few hundred rows).
const maxTableRows = 10000

// ParseTankTable reads a tank calibration table: one row per line, the
// level and the volume held up to it, separated by a comma, semicolon or
// tab. Each cell is read by Parse, so units may be written (`1.2 m`,
// `850 L`, `3 ft`, `224 gal`); bare numbers are in the system's default
// units (m and L, or ft and gal). A first line that is not numeric is a
// header and is skipped; blank lines and lines starting with # are
// ignored. Monotonicity is checked by calc.NewTable, which names the row.
func ParseTankTable(r io.Reader, sys System) ([]TablePoint, error) {
	sc := bufio.NewScanner(io.LimitReader(r, 1<<20))
	var out []TablePoint
	line := 0
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		cells := strings.FieldsFunc(text, func(r rune) bool { return r == ',' || r == ';' || r == '\t' })
		if len(cells) != 2 {
			if len(out) == 0 && line == 1 {
				continue // header
			}
			return nil, &TableError{Line: line, Err: errTableCells}
		}
		lv, err := Parse(DimLength, cells[0], sys)
		if err != nil {
			if len(out) == 0 && line == 1 {
				continue // header such as "level,volume"
			}
			return nil, &TableError{Line: line, Column: 1, Err: err}
		}
		vo, err := Parse(DimVolume, cells[1], sys)
		if err != nil {
			return nil, &TableError{Line: line, Column: 2, Err: err}
		}
		if len(out) >= maxTableRows {
			return nil, &TableError{Line: line, Err: errTableLong}
		}
		out = append(out, TablePoint{Level: lv, Volume: vo})
	}
	if err := sc.Err(); err != nil {
		return nil, &TableError{Line: line + 1, Err: err}
	}
	if len(out) < 2 {
		return nil, &TableError{Line: line, Err: errTableShort}
	}
	return out, nil
}

type tableErr string

func (e tableErr) Error() string { return string(e) }

const (
	errTableCells tableErr = "expected two cells, level and volume"
	errTableLong  tableErr = "more than 10000 rows"
	errTableShort tableErr = "a tank table needs at least two rows"
)
