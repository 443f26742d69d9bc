package present

import "drawdown/model"

// ForJob words plan p of job j (its checklist built for p, see
// model.Job.RebuildChecklist) for the screen and the record: the Sheet of
// Build with the hazards the checklist is built for, and, first among the
// warnings, a priming method that does not suit the job, with why
// (model.MethodSuits).
func ForJob(j model.Job, p model.Plan, sys model.System) Sheet {
	ctx := j.Checklist.Context
	s := Build(p, sys, ctx.Hazards)
	if !s.Valid || ctx.Method == "" {
		return s
	}
	if ok, why := model.MethodSuits(ctx.Method, ctx); !ok {
		w := Warning{Line: Line{Code: "method_unsuited", Status: Warn,
			Short: ctx.Method.Label() + " does not suit this job: choose another",
			Long:  "the priming method chosen (" + ctx.Method.Label() + ") does not suit this job: " + why + "; choose another in the Hose pane"}}
		s.Warnings = append([]Warning{w}, s.Warnings...)
	}
	return s
}
