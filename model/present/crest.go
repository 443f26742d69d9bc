package present

import (
	"drawdown/calc"
	"drawdown/model"
)

// Crest is the crest against its limits, with the one crest status every
// view shows. Heights are above the source surface (the datum of the lift
// the technician measures).
type Crest struct {
	// Status: OK within the working limit; Warn above it but below the
	// limit at this flow (gas gathers); Bad above the limit at this flow or
	// at zero flow (the liquid boils at the crest: it will not run).
	Status Status
	// Says words the status, longest first, for views of different widths.
	Says []string

	Lift, NoFlow, ThisFlow, Working string
	// ShowThisFlow is false when the limit at this flow is not a figure
	// (no flow: the siphon will not run for another reason).
	ShowThisFlow bool
	// Margin is the working limit less the lift, signed.
	Margin string
}

// CrestOf words the crest of a steady result whose lift is lift.
func CrestOf(r calc.Result, lift calc.Length, f Figures) Crest {
	L := func(v calc.Length) string { return f.Of(model.DimLength, float64(v)) }
	c := Crest{
		Lift: L(lift), NoFlow: L(r.MaxCrestHeight), ThisFlow: L(r.FlowingCrestLimit), Working: L(r.WorkingCrestHeight),
		ShowThisFlow: r.Verdict != calc.WillNotRun || r.FlowingCrestLimit > 0,
		Margin:       f.Signed(model.DimLength, float64(r.CrestMargin)),
	}
	over := func(limit calc.Length) string { return L(lift - limit) }
	switch {
	case (r.Verdict == calc.WillNotRun && r.Why == calc.WarnCannotRun) || lift > r.FlowingCrestLimit:
		c.Status = Bad
		c.Says = []string{
			"crest " + over(r.FlowingCrestLimit) + " above the limit at this flow: will not run",
			"crest " + over(r.FlowingCrestLimit) + " above the limit",
			"crest above the limit",
		}
	case r.Verdict == calc.RunsChoked:
		c.Status = Warn
		c.Says = []string{
			"crest held at its running limit: the up-leg limits the flow",
			"crest at its running limit: choked",
			"choked at the crest",
		}
	case r.CrestMargin < 0:
		c.Status = Warn
		c.Says = []string{
			"crest " + over(r.WorkingCrestHeight) + " over the working limit: gas will gather, may break",
			"crest " + over(r.WorkingCrestHeight) + " over the working limit",
			"over the working limit",
		}
	default:
		c.Status = OK
		c.Says = []string{
			"lift " + c.Lift + " within the working limit " + c.Working,
			"lift " + c.Lift + " of " + c.Working + " working limit",
			"lift " + c.Lift + " of " + c.Working,
			"within the working limit",
		}
	}
	return c
}
