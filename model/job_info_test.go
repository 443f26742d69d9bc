package model

import (
	"encoding/json"
	"errors"
	"reflect"
	"strings"
	"testing"
	"time"

	"drawdown/calc/testkit"
)

// demoWords are the demo scenario's names: none may appear in a job that
// did not start from the demo (issue 12 §1).
var demoWords = []string{"Harrowfen", "Marsh", "Okoro", "Pell", "Bund B2", "east ditch", "T4"}

func jobText(t *testing.T, j Job) string {
	t.Helper()
	b, err := json.Marshal(j)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

func TestNewJobsCarryNothingOfTheDemo(t *testing.T) {
	blank := NewJob("Pit 4", SI, t0)
	if len(blank.Inputs) != 0 || blank.Site != "" || blank.Crew != nil || blank.Notes != "" || blank.Template != "" || blank.Facts != (SiteFacts{}) {
		t.Errorf("blank job is not blank: %+v", blank)
	}
	for _, tp := range Templates() {
		j, err := FromTemplate(tp.ID, "My job", t0)
		if err != nil {
			t.Fatalf("%s: %v", tp.ID, err)
		}
		if j.Name != "My job" || j.Template != tp.ID || len(j.Checklist.Steps) == 0 {
			t.Errorf("%s: %+v", tp.ID, j)
		}
		if tp.ID == TemplateDemo {
			continue
		}
		text := jobText(t, j)
		for _, w := range demoWords {
			if strings.Contains(text, w) {
				t.Errorf("template %s carries the demo's %q", tp.ID, w)
			}
		}
	}
	sump, _ := FromTemplate(TemplateSumpPit, "Sump", t0)
	if !sump.Facts.ConfinedSpace || sump.Checklist.Index("hazard.cs.outside") < 0 || sump.Checklist.Index("hazard.cs.permit") < 0 {
		t.Error("sump-pit template: not a confined space worked from outside")
	}
	pond, _ := FromTemplate(TemplatePond, "Pond", t0)
	if pond.Checklist.Index("hazard.water.flotation") < 0 || pond.Checklist.Index("run.overnight") < 0 {
		t.Error("pond template lacks the open-water or overnight steps")
	}
	if _, err := FromTemplate("lagoon", "x", t0); err == nil || !strings.Contains(err.Error(), "demo, sump-pit, pond") {
		t.Errorf("unknown template: %v", err)
	}
	if _, err := FromTemplate(TemplatePond, " ", t0); err == nil {
		t.Error("template job without a name")
	}
}

func TestJobInfoAndCrew(t *testing.T) {
	j := NewJob("Vault 7", SI, t0)
	for f, v := range map[InfoField]string{InfoSite: "Elmstead works (invented)", InfoLocation: "vault 7, east road",
		InfoDate: "2026-05-01", InfoSupervisor: "D. Quill", InfoNotes: "line one\r\nline two"} {
		if err := j.SetInfo(f, "  "+v+" ", t0); err != nil {
			t.Errorf("%s: %v", f.Label(), err)
		}
	}
	if j.Notes != "line one\nline two" || j.Date != "2026-05-01" || j.Site != "Elmstead works (invented)" {
		t.Errorf("entries: %+v", j)
	}
	for _, tc := range []struct {
		f    InfoField
		text string
		says string
	}{
		{InfoDate, "1 May", `Date: "1 May" is not a date; accepted YYYY-MM-DD`},
		{InfoSite, "yard\x1b[31m", "Site: control characters"},
		{InfoLocation, "a\nb", "Location: control characters"},
		{InfoSite, strings.Repeat("x", 201), "Site: too long (201 characters; at most 200)"},
	} {
		err := j.SetInfo(tc.f, tc.text, t0)
		var ie *InputError
		if !errors.As(err, &ie) || !strings.HasPrefix(err.Error(), tc.says) {
			t.Errorf("SetInfo(%s, %q) = %v, want %q", tc.f, tc.text, err, tc.says)
		}
	}
	if j.Date != "2026-05-01" {
		t.Error("a refused entry changed the job")
	}
	_ = j.AddCrew("P. Lund", "lead", t0)
	_ = j.AddCrew("R. Oyelaran", "attendant", t0)
	_ = j.AddCrew("S. Ferreira", "", t0)
	if j.CrewText() != "P. Lund (lead), R. Oyelaran (attendant), S. Ferreira" {
		t.Errorf("CrewText = %q", j.CrewText())
	}
	if err := j.AddCrew(" ", "x", t0); err == nil {
		t.Error("crew without a name")
	}
	if err := j.RemoveCrew(1, t0); err != nil || len(j.Crew) != 2 || j.Crew[1].Name != "S. Ferreira" {
		t.Errorf("RemoveCrew: %v %+v", err, j.Crew)
	}
	if err := j.RemoveCrew(5, t0); err == nil || !strings.Contains(err.Error(), "no person 6") {
		t.Errorf("RemoveCrew(5): %v", err)
	}
	last := j.Log[len(j.Log)-1].Text
	if last != "Crew: R. Oyelaran removed (attendant)" {
		t.Errorf("log %q", last)
	}
}

func TestJobLifecycle(t *testing.T) {
	j := DemoJob()
	if j.State() != JobPlanned {
		t.Errorf("demo state %s", j.State())
	}
	at := t0.Add(time.Hour)
	if err := j.Rename("", at); err == nil {
		t.Error("blank name accepted")
	}
	if err := j.Rename("Bund B2, second release", at); err != nil || j.Name != "Bund B2, second release" {
		t.Errorf("Rename: %v", err)
	}
	if got := j.Log[len(j.Log)-1].Text; got != "Job renamed from “Bund B2 rainwater release” to “Bund B2, second release”" {
		t.Errorf("log %q", got)
	}
	if err := j.Mark("run.start", StateDone, "", "", at); err != nil {
		t.Fatal(err)
	}
	if j.State() != JobDraining {
		t.Errorf("after the start: %s", j.State())
	}
	if got := j.Log[len(j.Log)-1].Text; got != "Checklist: Record the start: done" {
		t.Errorf("mark logged as %q (no IDs in the log, issue 12 §6)", got)
	}
	_ = j.RecordSheen("faint film at the sump", at)
	d, err := j.Duplicate("Bund B3", at)
	if err != nil {
		t.Fatal(err)
	}
	if d.Name != "Bund B3" || d.Site != j.Site || !reflect.DeepEqual(d.Inputs, j.Inputs) || d.Facts.SheenSeen ||
		len(d.Checklist.Steps) != 0 || len(d.Readings) != 0 || !d.Started.IsZero() || d.State() != JobPlanned || len(d.Log) != 1 {
		t.Errorf("Duplicate: %+v", d)
	}
	d.Inputs[FieldLift] = "9 m"
	if j.Inputs[FieldLift] == "9 m" {
		t.Error("the copy shares its inputs with the original")
	}
	if err := j.Reopen(at); err == nil {
		t.Error("reopened an open job")
	}
	if err := j.Close(at); err != nil || j.State() != JobClosed {
		t.Errorf("Close: %v %s", err, j.State())
	}
	if !strings.Contains(j.Log[len(j.Log)-1].Text, "steps still to do") {
		t.Errorf("close log %q", j.Log[len(j.Log)-1].Text)
	}
	if err := j.Close(at); err == nil {
		t.Error("closed twice")
	}
	if err := j.Reopen(at); err != nil || j.State() != JobDraining {
		t.Errorf("Reopen: %v %s", err, j.State())
	}
	// Marking every step closes the job; putting one back reopens it.
	k := DemoJob()
	for _, s := range k.Checklist.Steps {
		if err := k.Mark(s.ID, StateDone, "", "ok", at); err != nil {
			t.Fatal(err)
		}
	}
	if k.State() != JobClosed {
		t.Error("all marked: not closed")
	}
	if err := k.Mark("run.levels", StatePending, "", "", at); err != nil || k.State() == JobClosed {
		t.Errorf("a step back to do: %v %s", err, k.State())
	}
}

func TestSiteFactSetters(t *testing.T) {
	j := NewJob("x", US, t0)
	if err := j.SetFlag(FlagConfined, true, t0); err != nil || !j.Facts.ConfinedSpace {
		t.Fatal(err)
	}
	if err := j.SetFlag("lagoon", true, t0); err == nil {
		t.Error("unknown flag accepted")
	}
	if err := j.SetDischarge("river", t0); err == nil {
		t.Error("unknown discharge accepted")
	}
	if err := j.SetDischarge(DischargeTanker, t0); err != nil || j.Facts.Discharge != DischargeTanker {
		t.Error(err)
	}
	// The air temperature reads in the job's units; the range is said in
	// them (-60 to 60 °C is -76 to 140 °F, exact).
	if err := j.SetAirTemp("28", t0); err != nil {
		t.Fatal(err)
	}
	if v, ok := j.Facts.airTemp(j.Units); !ok || !testkit.Within(v, 270.927778, 1e-6) {
		t.Errorf("28 °F = %g K", v)
	}
	if err := j.SetAirTemp("200", t0); err == nil || err.Error() != "Air temperature: 200 °F is out of range; accepted -76 °F to 140 °F" {
		t.Errorf("200 °F: %v", err)
	}
	if err := j.SetAirTemp("warm", t0); err == nil || !strings.HasPrefix(err.Error(), "Air temperature: cannot read") {
		t.Errorf("warm: %v", err)
	}
	if j.Facts.AirTemp != "28" {
		t.Error("a refused air temperature replaced the old one")
	}
	if err := j.RecordSheen("", t0); err == nil {
		t.Error("sheen without what was seen")
	}
	want := []string{"Confined space: yes", "Liquid goes to: tanker or vacuum truck", "Air temperature: 28"}
	for i, w := range want {
		if j.Log[i].Text != w {
			t.Errorf("log %d = %q, want %q", i, j.Log[i].Text, w)
		}
	}
	if d, err := ParseDischarge(" Sanitary Sewer "); err != nil || d != DischargeSewer {
		t.Errorf("ParseDischarge: %v %v", d, err)
	}
	if _, err := ParseDischarge("river"); !errors.Is(err, ErrUnknownDischarge) {
		t.Errorf("ParseDischarge(river): %v", err)
	}
}

// The containment-release record holds what an inspector asks for (40 CFR
// 112.8(c)(3): opened and resealed under responsible supervision, records
// of each event; field-practice §5.1: weather, photos, samples, how the
// volume was estimated).
func TestReleaseRecord(t *testing.T) {
	j := DemoJob()
	at := t0
	steps := []error{
		j.SetRelease(ReleaseValve, "B2-V1", at),
		j.SetRelease(ReleaseSeal, "S-20417", at),
		j.SetRelease(ReleaseWeather, "overcast, 8 °C, light wind", at),
		j.SetRelease(ReleaseRain, "22 mm since the last inspection", at),
		j.SetRelease(ReleaseVolumeBasis, "level fall × bund floor area, checked against the plan", at),
		j.OpenValve("A. Marsh", at),
		j.AddPhoto("IMG_0412", "water surface at the sump, no sheen", at),
		j.AddSample("oil and grease, as the permit asks", "below 5 mg/L (field kit)", at),
		j.ResealValve("A. Marsh", "S-20431", at.Add(time.Hour)),
	}
	for i, err := range steps {
		if err != nil {
			t.Errorf("step %d: %v", i, err)
		}
	}
	r := j.Release
	if r.ValveID != "B2-V1" || r.OpenedBy != "A. Marsh" || !r.OpenedAt.Equal(at) || r.NewSeal != "S-20431" || len(r.Photos) != 1 || len(r.Samples) != 1 {
		t.Errorf("release %+v", r)
	}
	if err := j.ResealValve("A. Marsh", "", at); err == nil {
		t.Error("reseal without a seal number")
	}
	if err := j.OpenValve("", at); err == nil {
		t.Error("valve opened by nobody")
	}
	for _, e := range j.Log {
		if strings.Contains(e.Text, "release.") || strings.Contains(e.Text, "volume-basis") {
			t.Errorf("log shows an internal ID: %q", e.Text)
		}
	}
	if got := j.Log[len(j.Log)-1].Text; got != "Drain valve B2-V1 resealed by A. Marsh, seal S-20431" {
		t.Errorf("log %q", got)
	}
	c := j.Clone()
	c.Release.Photos[0].Ref = "changed"
	if j.Release.Photos[0].Ref != "IMG_0412" {
		t.Error("Clone shares the photo list")
	}
}
