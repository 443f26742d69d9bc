package record

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"drawdown/calc"
	"drawdown/model"
	"drawdown/model/present"
)

func (rw *recWriter) readings(j model.Job, p model.Plan, start time.Time, fit *model.Fit, fitErr error) {
	rw.line("## Level readings against the plan")
	rw.line("")
	if len(j.Readings) == 0 {
		rw.line("No level readings were entered.")
		rw.line("")
		return
	}
	rs := sortedReadings(j.Readings)
	var plan model.DrainCurve
	if p.Drain != nil {
		plan = model.PlanCurve(*p.Drain)
	}
	if start.IsZero() && len(plan.Times) > 0 {
		rw.line("Flow start time not recorded: the plan is aligned on the first reading's level.")
		rw.line("")
	}
	rw.line("| Time | Level | Planned | Observed − planned | Note |")
	rw.line("| --- | --- | --- | --- | --- |")
	for _, r := range rs {
		planned, diff := "—", "—"
		if lv, ok := model.PlannedAt(plan, start, rs[0], r.At); ok {
			planned = rw.level(lv)
			diff = signed(rw.level(r.Level - lv))
		}
		rw.row(rw.clock(r.At), rw.level(r.Level), planned, diff, r.Note)
	}
	rw.line("")
	switch {
	case fitErr != nil:
		rw.line("Comparison with the plan: " + mdText(fitErr.Error()) + ".")
	case fit != nil:
		rw.line("Comparison with the plan (fitted to " + strconv.Itoa(fit.N) + " readings):")
		rw.line("")
		rw.line("- " + mdText(fit.Message) + ".")
		rw.line("- Effective extra loss coefficient ΔK: " + strconv.FormatFloat(fit.ExtraK, 'f', 2, 64) +
			"; level residual " + rw.level(fit.RMS) + " RMS (plan as typed: " + rw.level(fit.PlanRMS) + ").")
		if fit.Stopped {
			rw.line("- The readings show the drain at its stop: " + rw.level(fit.StopLevel) +
				" (" + present.StopLong(calc.StopReason(fit.Stop)) + "), reached about " + rw.tm(fit.Finish) + ".")
		} else {
			rw.line("- Re-predicted from the last reading: stop at " + rw.level(fit.StopLevel) +
				" (" + present.StopLong(calc.StopReason(fit.Stop)) + ") about " + rw.tm(fit.Finish) + ".")
		}
		if fit.SlowingJudged {
			state := "not slowing faster than planned"
			if fit.Slowing {
				state = "SLOWING faster than planned: check for air at the crest or a clogging intake"
			}
			rw.line(fmt.Sprintf("- Recent readings: %s (recent fall %.0f %% of what the earlier readings predict).", state, 100*fit.RecentRatio))
		}
	}
	rw.line("")
}

func sortedReadings(in []model.Reading) []model.Reading {
	rs := append([]model.Reading(nil), in...)
	for i := 1; i < len(rs); i++ { // insertion sort: few readings, stable
		for k := i; k > 0 && rs[k].At.Before(rs[k-1].At); k-- {
			rs[k], rs[k-1] = rs[k-1], rs[k]
		}
	}
	return rs
}

func signed(s string) string {
	if strings.HasPrefix(s, "-") || s == "—" {
		return s
	}
	if strings.Trim(strings.Fields(s)[0], "0.") == "" {
		return s
	}
	return "+" + s
}

func (rw *recWriter) volume(j model.Job, p model.Plan) {
	rw.line("## Volume discharged")
	rw.line("")
	planned := ""
	if p.Drain != nil {
		planned = " The plan moves " + rw.f(model.DimVolume, float64(p.Drain.Volume)) + " to its stop."
	}
	if p.Tank == nil {
		rw.line("Not estimated: the tank is not described." + planned)
		rw.line("")
		return
	}
	if len(j.Readings) == 0 {
		rw.line("Not estimated: no level readings." + planned)
		rw.line("")
		return
	}
	rs := sortedReadings(j.Readings)
	start := float64(p.Siphon.Geometry.Surface)
	end := rs[len(rs)-1].Level
	v := float64(p.Tank.Volume(calc.Length(start)) - p.Tank.Volume(calc.Length(end)))
	if !(v > 0) {
		v = 0
	}
	rw.line("Estimated " + rw.f(model.DimVolume, v) + ": from the starting level " + rw.level(start) +
		" to the last reading " + rw.level(end) + " (" + rw.clock(rs[len(rs)-1].At) + "), over the tank shape as described." + planned)
	rw.line("")
}

func (rw *recWriter) log(j model.Job) {
	if len(j.Log) == 0 {
		return
	}
	rw.line("## Log")
	rw.line("")
	rw.line("| Time | Entry |")
	rw.line("| --- | --- |")
	for _, e := range j.Log {
		rw.row(rw.clock(e.At), e.Text)
	}
	rw.line("")
}
