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

// WriteCSV writes the job's level readings, flow tests and the planned
// curve as CSV, SI units named in the headers:
//
//	kind,time,elapsed_s,level_m,planned_level_m,flow_m3_s,note
//
// kind is "reading", "flow_test" or "plan". time is RFC 3339 in r.Now's
// zone, empty for plan points when neither a start time nor a reading
// fixes the clock. elapsed_s counts, for every row, from one time base:
// the drain's start (model.DrainStart: the start time, else the "flow
// started" step, else the first reading), given by the first row after
// the header, of kind "time_base": its time, elapsed 0, and a note naming
// which it is. level_m is the observed level
// (readings and flow tests); planned_level_m the plan's level at that time
// (empty when the plan cannot be placed on the clock); flow_m3_s a flow
// test's flow.
func WriteCSV(w io.Writer, r Input) error {
	loc := r.Now.Location()
	if loc == nil {
		loc = time.UTC
	}
	cw := csv.NewWriter(w)
	num := func(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
	rs := sortedReadings(r.Job.Readings)
	start := flowStart(r.Job)
	base := model.DrainStart(&r.Job)
	var plan model.DrainCurve
	if r.Plan.Drain != nil {
		plan = model.PlanCurve(*r.Plan.Drain)
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
	baseText, what := "", "not known: no start time and no reading; plan rows count from the plan's start"
	switch {
	case !start.IsZero():
		what = "the drain's start"
	case !base.IsZero():
		what = "the first reading (the start time was not recorded)"
	}
	if !base.IsZero() {
		baseText = base.In(loc).Format(time.RFC3339)
	}
	_ = cw.Write([]string{"kind", "time", "elapsed_s", "level_m", "planned_level_m", "flow_m3_s", "note"})
	el0 := ""
	if !base.IsZero() {
		el0 = "0"
	}
	_ = cw.Write([]string{"time_base", baseText, el0, "", "", "", "elapsed_s counts from " + what})
	elapsed := func(t time.Time) string {
		if base.IsZero() {
			return ""
		}
		return num(round3(t.Sub(base).Seconds()))
	}
	for _, rd := range rs {
		planned := ""
		if lv, ok := model.PlannedAt(plan, start, rs[0], rd.At); ok {
			planned = num(round6(lv))
		}
		_ = cw.Write([]string{"reading", rd.At.In(loc).Format(time.RFC3339), elapsed(rd.At),
			num(round6(rd.Level)), planned, "", present.CSVCell(rd.Note)})
	}
	for _, ft := range r.Job.FlowTests {
		lv, planned := "", ""
		if ft.Level > 0 {
			lv = num(round6(ft.Level))
		}
		if len(rs) > 0 {
			if pl, ok := model.PlannedAt(plan, start, rs[0], ft.At); ok {
				planned = num(round6(pl))
			}
		} else if !start.IsZero() && len(plan.Times) > 0 {
			planned = num(round6(plan.LevelAt(ft.At.Sub(start).Seconds())))
		}
		_ = cw.Write([]string{"flow_test", ft.At.In(loc).Format(time.RFC3339), elapsed(ft.At), lv, planned,
			strconv.FormatFloat(ft.Flow(), 'g', 6, 64), present.CSVCell(ft.Note)})
	}
	for i := range plan.Times {
		ts, el := "", num(round3(plan.Times[i]))
		if !planZero.IsZero() {
			at := planZero.Add(model.DurationOf(plan.Times[i]))
			ts = at.In(loc).Format(time.RFC3339)
			el = elapsed(at)
			if base.IsZero() {
				el = num(round3(plan.Times[i]))
			}
		}
		_ = cw.Write([]string{"plan", ts, el, "", num(round6(plan.Levels[i])), "", ""})
	}
	cw.Flush()
	return cw.Error()
}

func round3(v float64) float64 { return math.Round(v*1e3) / 1e3 }
func round6(v float64) float64 { return math.Round(v*1e6) / 1e6 }
