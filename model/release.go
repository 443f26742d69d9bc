package model

import (
	"time"
)

// Release is the record of a containment release: rain water let out of an
// oil tank's bund or dike through a normally sealed drain valve, which the
// EPA oil-spill rule allows only after inspection, under responsible
// supervision, with the valve resealed and each event recorded (40 CFR
// 112.8(c)(3); field-practice §3.8 and §5.1). The responsible supervisor is
// the job's (Job.Supervisor); the inspection before and after is on the
// checklist. The lead's record lays these out; the setters here keep them
// and log each one.
type Release struct {
	ValveID    string `json:"valve_id,omitempty"`
	SealNumber string `json:"seal_number,omitempty"` // the seal on the valve before it was opened
	OpenedBy   string `json:"opened_by,omitempty"`
	// OpenedAt is when the valve was opened; zero until then.
	OpenedAt    time.Time `json:"opened_at,omitzero"`
	ResealedBy  string    `json:"resealed_by,omitempty"`
	ResealedAt  time.Time `json:"resealed_at,omitzero"`
	NewSeal     string    `json:"new_seal,omitempty"` // the seal applied at the reseal
	Weather     string    `json:"weather,omitempty"`  // at the time of the release
	Rain        string    `json:"rain,omitempty"`     // rainfall since the last inspection, as stated
	VolumeBasis string    `json:"volume_basis,omitempty"`
	Photos      []Photo   `json:"photos,omitempty"`
	Samples     []Sample  `json:"samples,omitempty"`
}

// Photo is a reference to a photograph (a file name or a camera number),
// with what it shows and when it was taken.
type Photo struct {
	Ref  string    `json:"ref"`
	What string    `json:"what,omitempty"`
	At   time.Time `json:"at,omitzero"`
}

// Sample is a sample taken where a permit asks, with its result as the lab
// or the test kit reports it (text: units and method vary by permit).
type Sample struct {
	What   string    `json:"what"` // what was sampled and for what
	Result string    `json:"result,omitempty"`
	At     time.Time `json:"at,omitzero"`
}

// Recorded reports whether anything of a release is recorded.
func (r Release) Recorded() bool {
	return r.ValveID != "" || r.SealNumber != "" || r.OpenedBy != "" || r.ResealedBy != "" || r.NewSeal != "" ||
		r.Weather != "" || r.Rain != "" || r.VolumeBasis != "" || len(r.Photos) > 0 || len(r.Samples) > 0
}

// ReleaseField names one of the release record's text entries.
type ReleaseField string

// The release record's text entries, in form order.
const (
	ReleaseValve       ReleaseField = "valve"
	ReleaseSeal        ReleaseField = "seal"
	ReleaseWeather     ReleaseField = "weather"
	ReleaseRain        ReleaseField = "rain"
	ReleaseVolumeBasis ReleaseField = "volume-basis"
)

// ReleaseFields lists the release record's text entries in form order.
// Who opened and resealed the valve is recorded with OpenValve and
// ResealValve, photos with AddPhoto, samples with AddSample.
func ReleaseFields() []ReleaseField {
	return []ReleaseField{ReleaseValve, ReleaseSeal, ReleaseWeather, ReleaseRain, ReleaseVolumeBasis}
}

// Label is the entry's name on a form and in the log.
func (f ReleaseField) Label() string {
	switch f {
	case ReleaseValve:
		return "Drain valve ID"
	case ReleaseSeal:
		return "Seal number before opening"
	case ReleaseWeather:
		return "Weather"
	case ReleaseRain:
		return "Rain since the last inspection"
	case ReleaseVolumeBasis:
		return "How the volume released was estimated"
	}
	return string(f)
}

func (r *Release) field(f ReleaseField) *string {
	switch f {
	case ReleaseValve:
		return &r.ValveID
	case ReleaseSeal:
		return &r.SealNumber
	case ReleaseWeather:
		return &r.Weather
	case ReleaseRain:
		return &r.Rain
	case ReleaseVolumeBasis:
		return &r.VolumeBasis
	}
	return nil
}

// Text returns the entry's text ("" when empty or unknown).
func (r Release) Text(f ReleaseField) string {
	if p := r.field(f); p != nil {
		return *p
	}
	return ""
}

// SetRelease stores a release entry (one line, no control characters) and
// logs the change.
func (j *Job) SetRelease(f ReleaseField, text string, at time.Time) error {
	p := j.Release.field(f)
	if p == nil {
		return &InputError{Field: string(f), Detail: "not an entry of the release record"}
	}
	text, err := cleanLine(f.Label(), text, maxLine)
	if err != nil {
		return err
	}
	if *p == text {
		return nil
	}
	*p = text
	if text == "" {
		j.AddLog(at, f.Label()+": cleared")
	} else {
		j.AddLog(at, f.Label()+": "+text)
	}
	return nil
}

// OpenValve records who opened the drain valve, and when, and logs it.
func (j *Job) OpenValve(by string, at time.Time) error {
	by, err := who("Valve opened by", by, at)
	if err != nil {
		return err
	}
	j.Release.OpenedBy, j.Release.OpenedAt = by, at
	j.AddLog(at, "Drain valve"+valveName(j.Release.ValveID)+" opened by "+by)
	return nil
}

// ResealValve records who closed and resealed the drain valve, the new seal
// number, and when, and logs it.
func (j *Job) ResealValve(by, seal string, at time.Time) error {
	by, err := who("Valve resealed by", by, at)
	if err != nil {
		return err
	}
	if seal, err = cleanLine("New seal number", seal, maxLine); err != nil {
		return err
	}
	if seal == "" {
		return &InputError{Field: "New seal number", Detail: "give the number of the seal applied"}
	}
	j.Release.ResealedBy, j.Release.ResealedAt, j.Release.NewSeal = by, at, seal
	j.AddLog(at, "Drain valve"+valveName(j.Release.ValveID)+" resealed by "+by+", seal "+seal)
	return nil
}

func who(label, by string, at time.Time) (string, error) {
	by, err := cleanLine(label, by, maxLine)
	if err != nil {
		return "", err
	}
	if by == "" {
		return "", &InputError{Field: label, Detail: "give the person's name"}
	}
	if at.IsZero() {
		return "", &InputError{Field: label, Detail: "a time is needed"}
	}
	return by, nil
}

func valveName(id string) string {
	if id == "" {
		return ""
	}
	return " " + id
}

// AddPhoto records a photo reference with what it shows, and logs it.
func (j *Job) AddPhoto(ref, what string, at time.Time) error {
	ref, err := cleanLine("Photo reference", ref, maxLine)
	if err != nil {
		return err
	}
	if ref == "" {
		return &InputError{Field: "Photo reference", Detail: "give the file name or the camera's photo number"}
	}
	if what, err = cleanLine("What the photo shows", what, maxLine); err != nil {
		return err
	}
	j.Release.Photos = append(j.Release.Photos, Photo{Ref: ref, What: what, At: at})
	j.AddLog(at, "Photo "+ref+recorded(what))
	return nil
}

// AddSample records a sample and its result (the result may follow later
// with a second entry) and logs it.
func (j *Job) AddSample(what, result string, at time.Time) error {
	what, err := cleanLine("Sample", what, maxLine)
	if err != nil {
		return err
	}
	if what == "" {
		return &InputError{Field: "Sample", Detail: "say what was sampled and for what"}
	}
	if result, err = cleanLine("Sample result", result, maxLine); err != nil {
		return err
	}
	j.Release.Samples = append(j.Release.Samples, Sample{What: what, Result: result, At: at})
	j.AddLog(at, "Sample "+what+recorded(result))
	return nil
}

func recorded(s string) string {
	if s == "" {
		return ""
	}
	return ": " + s
}
