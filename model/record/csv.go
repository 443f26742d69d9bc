package record

import (
	"encoding/csv"
	"io"
	"math"
	"strconv"
	"time"

	"drawdown/model"
	"drawdown/model/present"
)

// WriteCSV writes the job's level readings and the planned curve as
// CSV, SI units named in the headers:
//
//	kind,time,elapsed_s,level_m,planned_level_m,note
//
// kind is "reading" or "plan". time is RFC 3339 in r.Now's zone, empty for
// plan points when neither a start time nor a reading fixes the clock.
// elapsed_s counts from the flow start (or, without one, from the first
// reading for readings and from the plan's start for plan points). level_m is
// the observed level (reading rows only); planned_level_m is the plan's level
// at that time (empty when the plan cannot be placed on the clock).
func WriteCSV(w io.Writer, r Input) error {
	loc := r.Now.Location()
	if loc == nil {
		loc = time.UTC
	}
	cw := csv.NewWriter(w)
	num := func(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
	_ = cw.Write([]string{"kind", "time", "elapsed_s", "level_m", "planned_level_m", "note"})
	rs := sortedReadings(r.Job.Readings)
	start := flowStart(r.Job)
	var plan model.DrainCurve
	if r.Plan.Drain != nil {
		plan = model.PlanCurve(*r.Plan.Drain)
	}
	origin := start
	if origin.IsZero() && len(rs) > 0 {
		origin = rs[0].At
	}
	for _, rd := range rs {
		planned := ""
		if len(rs) > 0 {
			if lv, ok := model.PlannedAt(plan, start, rs[0], rd.At); ok {
				planned = num(round6(lv))
			}
		}
		_ = cw.Write([]string{"reading", rd.At.In(loc).Format(time.RFC3339), num(round3(rd.At.Sub(origin).Seconds())),
			num(round6(rd.Level)), planned, present.CSVCell(rd.Note)})
	}
	// Plan points on the clock: from the start time, or placed so that the
	// plan passes the first reading's level at its time.
	var planZero time.Time
	switch {
	case !start.IsZero():
		planZero = start
	case len(rs) > 0:
		if t0, ok := plan.TimeAt(rs[0].Level); ok {
			planZero = rs[0].At.Add(-model.DurationOf(t0))
		}
	}
	for i := range plan.Times {
		ts := ""
		if !planZero.IsZero() {
			ts = planZero.Add(model.DurationOf(plan.Times[i])).In(loc).Format(time.RFC3339)
		}
		_ = cw.Write([]string{"plan", ts, num(round3(plan.Times[i])), "", num(round6(plan.Levels[i])), ""})
	}
	cw.Flush()
	return cw.Error()
}

func round3(v float64) float64 { return math.Round(v*1e3) / 1e3 }
func round6(v float64) float64 { return math.Round(v*1e6) / 1e6 }
