package record

import "drawdown/model"

// release writes the record of a containment release (rain water let out of
// an oil tank's bund through its normally sealed drain valve; 40 CFR
// 112.8(c)(3)): the valve and its seals, who opened and resealed it and
// when, the responsible supervisor, weather and rain, how the volume was
// estimated, photos and samples. What was not recorded is said so.
func (rw *recWriter) release(j model.Job) {
	r := j.Release
	rw.line("## Containment release")
	rw.line("")
	rw.line("| Item | Entry |")
	rw.line("| --- | --- |")
	notRecorded := func(s string) string {
		if s == "" {
			return "not recorded"
		}
		return s
	}
	rw.row(model.ReleaseValve.Label(), notRecorded(r.ValveID))
	rw.row(model.ReleaseSeal.Label(), notRecorded(r.SealNumber))
	rw.row("Valve opened by", notRecorded(whoWhen(r.OpenedBy, rw.tmOr(r.OpenedAt, ""))))
	rw.row("Valve resealed by", notRecorded(whoWhen(r.ResealedBy, rw.tmOr(r.ResealedAt, ""))))
	rw.row("New seal number", notRecorded(r.NewSeal))
	rw.row("Responsible supervisor", notRecorded(j.Supervisor))
	rw.row(model.ReleaseWeather.Label(), notRecorded(r.Weather))
	rw.row(model.ReleaseRain.Label(), notRecorded(r.Rain))
	rw.row(model.ReleaseVolumeBasis.Label(), notRecorded(r.VolumeBasis))
	rw.line("")
	if len(r.Photos) > 0 {
		rw.line("| Photo | What it shows | Time |")
		rw.line("| --- | --- | --- |")
		for _, ph := range r.Photos {
			rw.row(ph.Ref, orDash(ph.What), rw.tmOr(ph.At, "—"))
		}
		rw.line("")
	} else {
		rw.line("No photos recorded.")
		rw.line("")
	}
	if len(r.Samples) > 0 {
		rw.line("| Sample | Result | Time |")
		rw.line("| --- | --- | --- |")
		for _, s := range r.Samples {
			rw.row(s.What, orDash(s.Result), rw.tmOr(s.At, "—"))
		}
		rw.line("")
	} else {
		rw.line("No samples recorded (take them where the permit asks).")
		rw.line("")
	}
}

// whoWhen is "name, time" ("" when no one is recorded; the name alone
// without a time).
func whoWhen(by, at string) string {
	switch {
	case by == "":
		return ""
	case at == "":
		return by
	}
	return by + ", " + at
}
