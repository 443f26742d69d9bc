package model

import (
	"errors"
	"fmt"
	"strings"
	"time"
)

// Site facts are what the crew says about the place: whether the source is a
// confined space and whether anyone enters it, whether there is an open edge
// or deep water, where the liquid goes, whether the water may carry oil, the
// air temperature and whether the siphon may stand overnight, and whether a
// sheen, odour or colour was seen. The tool does not judge them: it records
// the crew's answers and builds the checklist from them (see ContextFor).

// Discharge is where the liquid goes.
type Discharge string

// Discharge kinds. The empty Discharge means the crew has not said.
const (
	// DischargeStorm: a storm drain, a ditch or the ground.
	DischargeStorm Discharge = "storm"
	// DischargeSewer: the sanitary sewer.
	DischargeSewer Discharge = "sewer"
	// DischargeContainer: a receiving vessel or container (drums, a tote, a
	// tank); the job is a transfer.
	DischargeContainer Discharge = "container"
	// DischargeTanker: a tanker or vacuum truck; the job is a transfer.
	DischargeTanker Discharge = "tanker"
)

// Discharges lists the discharge kinds in picker order.
func Discharges() []Discharge {
	return []Discharge{DischargeStorm, DischargeSewer, DischargeContainer, DischargeTanker}
}

// Label is the description shown for the discharge kind.
func (d Discharge) Label() string {
	switch d {
	case DischargeStorm:
		return "storm drain or ground"
	case DischargeSewer:
		return "sanitary sewer"
	case DischargeContainer:
		return "receiving vessel or container"
	case DischargeTanker:
		return "tanker or vacuum truck"
	}
	return "not yet stated"
}

// Transfer reports whether the liquid stays in a vessel (container or
// tanker) rather than being released.
func (d Discharge) Transfer() bool { return d == DischargeContainer || d == DischargeTanker }

// ErrUnknownDischarge is wrapped by ParseDischarge's error.
var ErrUnknownDischarge = errors.New("unknown discharge")

// ParseDischarge accepts a discharge ID ("storm", "sewer", "container",
// "tanker") or its label, ignoring case and surrounding space. Empty text
// gives "" (not stated) and no error.
func ParseDischarge(text string) (Discharge, error) {
	t := strings.ToLower(strings.TrimSpace(text))
	if t == "" {
		return "", nil
	}
	for _, d := range Discharges() {
		if t == string(d) || t == d.Label() {
			return d, nil
		}
	}
	return "", fmt.Errorf("where the liquid goes: %q is not one of storm, sewer, container, tanker: %w", text, ErrUnknownDischarge)
}

// SiteFacts are the crew's answers about the site, kept in the job file.
type SiteFacts struct {
	// ConfinedSpace: the source is in a space the site program classes as
	// a (permit-required) confined space. Choosing a catalogue tank that
	// carries the flag sets it (Job.ApplyTankPreset); the crew may clear it.
	ConfinedSpace bool `json:"confined_space,omitempty"`
	// Entry: someone will enter the confined space (any part of the body
	// through the plane of the opening). False means all work is done
	// from outside.
	Entry bool `json:"entry,omitempty"`
	// OpenWater: an open edge, pond, lagoon or deep water with a fall or
	// drowning hazard.
	OpenWater bool `json:"open_water,omitempty"`
	// Discharge is where the liquid goes ("" until the crew says).
	Discharge Discharge `json:"discharge,omitempty"`
	// MayCarryOil: the water may carry oil (rain in an oil containment
	// bund, an elevator pit, a vault near fuel): it is inspected for a
	// sheen before and during any release.
	MayCarryOil bool `json:"may_carry_oil,omitempty"`
	// AirTemp is the air temperature as typed, in the job's unit system
	// ("" when not given).
	AirTemp string `json:"air_temp,omitempty"`
	// Overnight: the siphon may stand overnight.
	Overnight bool `json:"overnight,omitempty"`
	// SheenSeen: the crew recorded a sheen, odour of product or colour in
	// the liquid. Unless the liquid goes into a vessel, the checklist then
	// holds the release (see ChecklistContext.HoldReason).
	SheenSeen bool      `json:"sheen_seen,omitempty"`
	SheenNote string    `json:"sheen_note,omitempty"` // what was seen, where
	SheenAt   time.Time `json:"sheen_at,omitzero"`
}

// Flag names a yes/no site fact.
type Flag string

// The yes/no site facts.
const (
	FlagConfined    Flag = "confined"
	FlagEntry       Flag = "entry"
	FlagOpenWater   Flag = "open-water"
	FlagMayCarryOil Flag = "may-carry-oil"
	FlagOvernight   Flag = "overnight"
)

// Flags lists the yes/no site facts in the order a form shows them.
func Flags() []Flag {
	return []Flag{FlagConfined, FlagEntry, FlagOpenWater, FlagMayCarryOil, FlagOvernight}
}

// Label is the question the flag answers, as a form shows it.
func (f Flag) Label() string {
	switch f {
	case FlagConfined:
		return "Confined space"
	case FlagEntry:
		return "Someone enters the space"
	case FlagOpenWater:
		return "Open edge or deep water"
	case FlagMayCarryOil:
		return "Water may carry oil"
	case FlagOvernight:
		return "Siphon may stand overnight"
	}
	return string(f)
}

func (s *SiteFacts) flag(f Flag) *bool {
	switch f {
	case FlagConfined:
		return &s.ConfinedSpace
	case FlagEntry:
		return &s.Entry
	case FlagOpenWater:
		return &s.OpenWater
	case FlagMayCarryOil:
		return &s.MayCarryOil
	case FlagOvernight:
		return &s.Overnight
	}
	return nil
}

// Flag returns the crew's answer for f (false for an unknown flag).
func (s SiteFacts) Flag(f Flag) bool {
	if p := s.flag(f); p != nil {
		return *p
	}
	return false
}

// Air temperature range accepted by SetAirTemp, in °C: colder or hotter air
// is outside any siphon job the tool is for (our choice).
const (
	airTempMinC = -60.0
	airTempMaxC = 60.0
)

// airTemp returns the air temperature in kelvin and true, or false when none
// is given or it does not read.
func (s SiteFacts) airTemp(sys System) (float64, bool) {
	if strings.TrimSpace(s.AirTemp) == "" {
		return 0, false
	}
	v, err := Parse(DimTemperature, s.AirTemp, sys)
	if err != nil || v < airTempMinC+273.15 || v > airTempMaxC+273.15 {
		return 0, false
	}
	return v, true
}

// SetFlag records the crew's answer for a yes/no site fact and, when it
// changes, logs it ("Confined space: yes") at time at. Call it when the
// crew commits the answer, not while a picker is browsed.
func (j *Job) SetFlag(f Flag, on bool, at time.Time) error {
	p := j.Facts.flag(f)
	if p == nil {
		return fmt.Errorf("site fact %q is not one the tool knows", string(f))
	}
	if *p == on {
		return nil
	}
	*p = on
	j.AddLog(at, f.Label()+": "+yesNoWord(on))
	return nil
}

// SetDischarge records where the liquid goes and logs the change.
func (j *Job) SetDischarge(d Discharge, at time.Time) error {
	if d != "" && !d.Transfer() && d != DischargeStorm && d != DischargeSewer {
		return fmt.Errorf("where the liquid goes: %q is not one of storm, sewer, container, tanker", string(d))
	}
	if j.Facts.Discharge == d {
		return nil
	}
	j.Facts.Discharge = d
	j.AddLog(at, "Liquid goes to: "+d.Label())
	return nil
}

// SetAirTemp records the air temperature as typed (in the job's units when
// bare, e.g. "-4", "-4 C", "25F"); blank text clears it. Text that does not
// read or lies outside -60 to 60 °C is refused with one line naming the
// field and the range in the job's units, and the old value is kept.
func (j *Job) SetAirTemp(text string, at time.Time) error {
	text = strings.TrimSpace(text)
	if text != "" {
		v, err := Parse(DimTemperature, text, j.Units)
		lo, hi := quote(DimTemperature, airTempMinC+273.15, j.Units), quote(DimTemperature, airTempMaxC+273.15, j.Units)
		if err != nil {
			return &InputError{Field: "Air temperature", Detail: fmt.Sprintf("cannot read %q; accepted %s to %s", text, lo, hi)}
		}
		if v < airTempMinC+273.15 || v > airTempMaxC+273.15 {
			return &InputError{Field: "Air temperature", Detail: fmt.Sprintf("%s is out of range; accepted %s to %s", quote(DimTemperature, v, j.Units), lo, hi)}
		}
	}
	if j.Facts.AirTemp == text {
		return nil
	}
	j.Facts.AirTemp = text
	if text == "" {
		j.AddLog(at, "Air temperature: cleared")
	} else {
		j.AddLog(at, "Air temperature: "+text)
	}
	return nil
}

// RecordSheen records that a sheen, odour of product or colour was seen,
// with what and where in plain words (required), at time at. The checklist
// then takes the do-not-release branch (see ChecklistContext.HoldReason).
func (j *Job) RecordSheen(what string, at time.Time) error {
	what, err := cleanLine("What was seen", what, maxLine)
	if err != nil {
		return err
	}
	if what == "" {
		return &InputError{Field: "What was seen", Detail: "say what was seen and where (a sheen, an odour of product, a colour)"}
	}
	if at.IsZero() {
		return &InputError{Field: "What was seen", Detail: "a time is needed to record it"}
	}
	j.Facts.SheenSeen, j.Facts.SheenNote, j.Facts.SheenAt = true, what, at
	j.AddLog(at, "Sheen, odour or colour seen: "+what)
	return nil
}

// ClearSheen withdraws a sheen record (entered in error, or the liquid has
// gone for disposal and the job changed), with the reason, which is logged.
// The earlier record stays in the log.
func (j *Job) ClearSheen(reason string, at time.Time) error {
	reason, err := cleanLine("Reason", reason, maxLine)
	if err != nil {
		return err
	}
	if reason == "" {
		return &InputError{Field: "Reason", Detail: "say why the sheen record is withdrawn"}
	}
	if !j.Facts.SheenSeen {
		return nil
	}
	j.Facts.SheenSeen, j.Facts.SheenNote, j.Facts.SheenAt = false, "", time.Time{}
	j.AddLog(at, "Sheen record withdrawn: "+reason)
	return nil
}

func yesNoWord(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}
