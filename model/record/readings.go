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
		rw.row(rw.clock(r.At), present.ReadingLevel(r, rw.sys), planned, diff, byText(r.Note, r.By))
	}
	rw.line("")
	switch {
	case fitErr != nil:
		rw.line("Comparison with the plan: " + mdText(fitErr.Error()) + ".")
	case fit != nil:
		rw.fitLines(fit)
	}
	rw.line("")
}

// fitLines is the fit's summary (present.FitSummary) with its figures.
func (rw *recWriter) fitLines(fit *model.Fit) {
	what := strconv.Itoa(fit.N) + " readings"
	if fit.NTests > 0 {
		what += " and " + strconv.Itoa(fit.NTests) + " flow tests"
	}
	rw.line("Comparison with the plan (fitted to " + what + "):")
	rw.line("")
	for _, l := range present.FitSummary(fit, nil, present.FitWords{Sys: rw.sys, Clock: rw.tm, Long: true}) {
		rw.line("- " + mdText(l.Text) + ".")
	}
	if fit.N >= 2 {
		rw.line("- Effective extra loss coefficient ΔK: " + strconv.FormatFloat(fit.ExtraK, 'f', 2, 64) +
			"; level residual " + rw.level(fit.RMS) + " RMS (plan as typed: " + rw.level(fit.PlanRMS) + ").")
	}
	if fit.SlowingJudged && !fit.Slowing {
		rw.line(fmt.Sprintf("- Recent readings: not slowing faster than planned (recent rate %.0f %% of the earlier, relative to the plan's own slowdown).", 100*fit.RateRatio))
	}
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
		rw.row(rw.clock(e.At), byText(e.Text, e.By))
	}
	rw.line("")
}

// byText is an entry's text with who made it, when a crew member did
// ("Strainer cleared (by Ana)"); the text alone on a lone screen.
func byText(text, by string) string {
	switch {
	case by == "":
		return text
	case text == "":
		return "by " + by
	}
	return text + " (by " + by + ")"
}
