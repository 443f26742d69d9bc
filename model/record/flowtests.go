package record

import (
	"slices"

	"drawdown/model"
	"drawdown/model/present"
)

// flowTests lists the job's bucket-and-stopwatch flow tests, oldest first,
// with the flow each gives (the fit in the readings section uses them).
func (rw *recWriter) flowTests(j model.Job) {
	if len(j.FlowTests) == 0 {
		return
	}
	ts := append([]model.FlowTest(nil), j.FlowTests...)
	slices.SortStableFunc(ts, func(a, b model.FlowTest) int { return a.At.Compare(b.At) })
	rw.line("## Flow tests")
	rw.line("")
	rw.line("A container of known volume timed as it fills at the outlet (common practice: one that takes at least a few seconds to fill, several repeats).")
	rw.line("")
	rw.line("| Time | Caught | In | Flow | Level | By | Note |")
	rw.line("| --- | --- | --- | --- | --- | --- | --- |")
	fig := present.Figures{Sys: rw.sys}
	for _, t := range ts {
		lv := "from the readings"
		if t.Level > 0 {
			lv = present.LevelTo(t.Level, 0.001, rw.sys)
		}
		rw.row(rw.clock(t.At), fig.Of(model.DimVolume, t.Volume), present.Duration(t.Seconds),
			fig.Of(model.DimFlow, t.Flow()), lv, t.By, t.Note)
	}
	rw.line("")
}
