package tui

import (
	"strconv"
	"strings"
	"time"

	"drawdown/model"
)

// jobRows lays the job out as the Job pane's rows: the job, the crew, the
// site facts, a sheen seen, a containment release (where the sheen rule
// applies, or where a release was recorded), and the job's state. Each
// editable row carries the model setter that makes its change.
func jobRows(j model.Job, loc *time.Location) []jobRow {
	var rows []jobRow
	add := func(r ...jobRow) { rows = append(rows, r...) }
	add(jobRow{kind: rowHeading, label: "Who, where and when"})
	add(jobRow{kind: rowText, label: "Job name", value: j.Name, initial: j.Name, prompt: "what the crew calls this job",
		set: func(t string) JobEditMsg {
			return JobEditMsg{What: "job name", Do: func(j *model.Job, at time.Time) error { return j.Rename(t, at) }}
		}})
	for _, f := range model.InfoFields() {
		add(infoRow(j, f))
	}
	add(crewRows(j)...)
	add(factRows(j)...)
	if j.Checklist.Context.OilCheck || j.Release.Recorded() {
		add(releaseRows(j, loc)...)
	}
	add(stateRows(j)...)
	return rows
}

func infoRow(j model.Job, f model.InfoField) jobRow {
	text := j.Info(f)
	shown := text
	initial := text
	prompt := ""
	switch f {
	case model.InfoDate:
		prompt = "YYYY-MM-DD"
	case model.InfoNotes:
		// The notes may hold line breaks; the one-line input shows them
		// as " / " and an edit saves what is typed.
		shown = strings.ReplaceAll(text, "\n", " / ")
		initial = shown
	case model.InfoSite, model.InfoLocation, model.InfoSupervisor, model.InfoSource, model.InfoReceiver:
	}
	return jobRow{kind: rowText, label: f.Label(), value: shown, initial: initial, prompt: prompt,
		set: func(t string) JobEditMsg {
			return JobEditMsg{What: strings.ToLower(f.Label()), Do: func(j *model.Job, at time.Time) error { return j.SetInfo(f, t, at) }}
		}}
}

func crewRows(j model.Job) []jobRow {
	rows := []jobRow{{kind: rowHeading, label: "Crew"}}
	for i, c := range j.Crew {
		text := c.Name
		if c.Role != "" {
			text += " (" + c.Role + ")"
		}
		rows = append(rows, jobRow{kind: rowItem, label: "Crew " + strconv.Itoa(i+1), value: text,
			remove: func() JobEditMsg {
				return JobEditMsg{What: "crew list", Do: func(j *model.Job, at time.Time) error { return j.RemoveCrew(i, at) }}
			}})
	}
	return append(rows, jobRow{kind: rowAction, label: "Add a crew member", prompt: "name, role (e.g. T. Okoro, attendant)",
		set: func(t string) JobEditMsg {
			name, role := splitPair(t)
			return JobEditMsg{What: "crew list", Do: func(j *model.Job, at time.Time) error { return j.AddCrew(name, role, at) }}
		}})
}

// factRows are the site facts the checklist is built from, as the crew
// answers them (the tool does not judge them).
func factRows(j model.Job) []jobRow {
	rows := []jobRow{{kind: rowHeading, label: "Site facts (the crew's answers)"}}
	for _, f := range model.Flags() {
		on := j.Facts.Flag(f)
		rows = append(rows, jobRow{kind: rowFlag, label: f.Label(), value: yesNo(on),
			flip: func() JobEditMsg {
				return JobEditMsg{What: strings.ToLower(f.Label()), Do: func(j *model.Job, at time.Time) error { return j.SetFlag(f, !on, at) }}
			}})
	}
	ds := append([]model.Discharge{""}, model.Discharges()...)
	names := make([]string, len(ds))
	chosen := 0
	for i, d := range ds {
		names[i] = d.Label()
		if d == j.Facts.Discharge {
			chosen = i
		}
	}
	rows = append(rows,
		jobRow{kind: rowChoice, label: "Where the liquid goes", value: j.Facts.Discharge.Label(), choices: names, chosen: chosen,
			pick: func(i int) JobEditMsg {
				d := ds[i]
				return JobEditMsg{What: "where the liquid goes", Do: func(j *model.Job, at time.Time) error { return j.SetDischarge(d, at) }}
			}},
		jobRow{kind: rowText, label: "Air temperature", value: j.Facts.AirTemp, initial: j.Facts.AirTemp,
			prompt: "e.g. −4 °C or 25 F; blank clears",
			set: func(t string) JobEditMsg {
				return JobEditMsg{What: "air temperature", Do: func(j *model.Job, at time.Time) error { return j.SetAirTemp(t, at) }}
			}})
	if j.Facts.SheenSeen {
		return append(rows, jobRow{kind: rowAction, label: "Sheen, odour or colour seen", value: "yes: " + j.Facts.SheenNote + " — release held",
			prompt: "why withdraw it (e.g. entered in error)",
			set: func(t string) JobEditMsg {
				return JobEditMsg{What: "sheen record", Do: func(j *model.Job, at time.Time) error { return j.ClearSheen(t, at) }}
			}})
	}
	return append(rows, jobRow{kind: rowAction, label: "Sheen, odour or colour seen", value: "none recorded",
		prompt: "what was seen, and where (holds the release)",
		set: func(t string) JobEditMsg {
			return JobEditMsg{What: "sheen record", Do: func(j *model.Job, at time.Time) error { return j.RecordSheen(t, at) }}
		}})
}

// releaseRows are the record of a containment release (40 CFR 112.8(c)(3)):
// the valve, its seals, who opened and resealed it, weather and rain, how
// the volume was estimated, photos and samples.
func releaseRows(j model.Job, loc *time.Location) []jobRow {
	r := j.Release
	rows := []jobRow{{kind: rowHeading, label: "Containment release record"}}
	for _, f := range model.ReleaseFields() {
		text := r.Text(f)
		rows = append(rows, jobRow{kind: rowText, label: f.Label(), value: text, initial: text,
			set: func(t string) JobEditMsg {
				return JobEditMsg{What: strings.ToLower(f.Label()), Do: func(j *model.Job, at time.Time) error { return j.SetRelease(f, t, at) }}
			}})
	}
	rows = append(rows,
		jobRow{kind: rowAction, label: "Valve opened by", value: whoAt(r.OpenedBy, r.OpenedAt, loc), prompt: "name of the person opening it (now)",
			set: func(t string) JobEditMsg {
				return JobEditMsg{What: "valve opened", Do: func(j *model.Job, at time.Time) error { return j.OpenValve(t, at) }}
			}},
		jobRow{kind: rowAction, label: "Valve resealed by", value: resealText(r, loc), prompt: "name, new seal number (now)",
			set: func(t string) JobEditMsg {
				by, seal := splitPair(t)
				return JobEditMsg{What: "valve resealed", Do: func(j *model.Job, at time.Time) error { return j.ResealValve(by, seal, at) }}
			}})
	for i, ph := range r.Photos {
		rows = append(rows, jobRow{kind: rowItem, label: "Photo " + strconv.Itoa(i+1), value: ph.Ref + dashed(ph.What)})
	}
	rows = append(rows, jobRow{kind: rowAction, label: "Add a photo", prompt: "file or photo number, what it shows",
		set: func(t string) JobEditMsg {
			ref, what := splitPair(t)
			return JobEditMsg{What: "photo", Do: func(j *model.Job, at time.Time) error { return j.AddPhoto(ref, what, at) }}
		}})
	for i, s := range r.Samples {
		rows = append(rows, jobRow{kind: rowItem, label: "Sample " + strconv.Itoa(i+1), value: s.What + dashed(s.Result)})
	}
	return append(rows, jobRow{kind: rowAction, label: "Add a sample", prompt: "what was sampled and for what, result",
		set: func(t string) JobEditMsg {
			what, result := splitPair(t)
			return JobEditMsg{What: "sample", Do: func(j *model.Job, at time.Time) error { return j.AddSample(what, result, at) }}
		}})
}

func stateRows(j model.Job) []jobRow {
	rows := []jobRow{{kind: rowHeading, label: "State"}}
	st := j.State()
	if st == model.JobClosed {
		return append(rows, jobRow{kind: rowAction, label: "Job state", value: string(st) + " — enter reopens it",
			prompt: "type yes to reopen the job",
			set: func(t string) JobEditMsg {
				return JobEditMsg{What: "job reopened", Do: confirmed(t, "Reopen the job", func(j *model.Job, at time.Time) error { return j.Reopen(at) })}
			}})
	}
	return append(rows, jobRow{kind: rowAction, label: "Job state", value: string(st) + " — enter closes it",
		prompt: "type yes to close the job out",
		set: func(t string) JobEditMsg {
			return JobEditMsg{What: "job closed", Do: confirmed(t, "Close the job", func(j *model.Job, at time.Time) error { return j.Close(at) })}
		}})
}

// confirmed runs do only when the typed text is "yes".
func confirmed(text, what string, do func(*model.Job, time.Time) error) func(*model.Job, time.Time) error {
	return func(j *model.Job, at time.Time) error {
		if !strings.EqualFold(strings.TrimSpace(text), "yes") {
			return &model.InputError{Field: what, Detail: "type yes to confirm, or esc to leave it"}
		}
		return do(j, at)
	}
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func dashed(s string) string {
	if s == "" {
		return ""
	}
	return " — " + s
}

func whoAt(by string, at time.Time, loc *time.Location) string {
	if by == "" {
		return ""
	}
	return by + " at " + at.In(loc).Format("15:04")
}

func resealText(r model.Release, loc *time.Location) string {
	if r.ResealedBy == "" {
		return ""
	}
	return whoAt(r.ResealedBy, r.ResealedAt, loc) + ", seal " + r.NewSeal
}
