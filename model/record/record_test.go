package record

import (
	"bytes"
	"encoding/csv"
	"errors"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"drawdown/calc/testkit"
	"drawdown/model"
	"drawdown/presets"
)

// Golden files: go test ./model/ -run Report -update rewrites
// testdata/report/*.md and *.csv. Review the diff before committing: the
// figures come from calc and presets, so a change there shows here.

// reportZone is a fixed zone so the goldens do not depend on the machine's
// time-zone database.
var reportZone = time.FixedZone("GMT", 0)

// demoRecordJob is the built-in demo job (an invented scenario) worked
// through: checklist marked, the siphon started, level readings taken off
// the plan with an extra loss of ΔK = 4 (a partly blinded strainer), and a
// stop.
func demoRecordJob(t *testing.T) (model.Job, model.Plan) {
	t.Helper()
	j := model.DemoJob()
	cat := presets.Builtin()
	p := model.Compute(j, cat)
	if p.Err != nil || p.Drain == nil {
		t.Fatalf("demo plan: %v", p.Err)
	}
	start := time.Date(2026, time.March, 14, 8, 10, 0, 0, time.UTC)
	at := start.Add(-40 * time.Minute)
	for i, s := range j.Checklist.Steps {
		if s.Section == model.SectionRun {
			break
		}
		var err error
		switch s.ID {
		case "hazard.electrical":
			err = j.Checklist.Mark(s.ID, model.StateNotApplicable, "no electrical equipment in or near the bund", "", at)
		case "setup.outlet-protection":
			err = j.Checklist.Mark(s.ID, model.StateSkipped, "ditch bank already lined with riprap", "photo 14", at)
		case "setup.inspect-before":
			err = j.Checklist.Mark(s.ID, model.StateDone, "", "no sheen, no odour, clear; 07:58 AM", at)
		case "hazard.discharge":
			err = j.Checklist.Mark(s.ID, model.StateDone, "", "site stormwater plan §4.2 (invented)", at)
		default:
			err = j.Checklist.Mark(s.ID, model.StateDone, "", "", at)
		}
		if err != nil {
			t.Fatal(err)
		}
		at = at.Add(time.Duration(i%3+1) * time.Minute)
	}
	if err := j.Checklist.Mark("run.start", model.StateDone, "", "steady stream at the ditch", start); err != nil {
		t.Fatal(err)
	}
	j.Started = start

	sim := model.DrainSimulator(p.DrainIn)
	truth, err := sim(model.FitParams{ExtraK: 4}, float64(p.Siphon.Geometry.Surface))
	if err != nil {
		t.Fatal(err)
	}
	for k := 1; k <= 8; k++ {
		s := float64(k) * 8 * 60
		if s > truth.End() {
			break
		}
		lv := truth.LevelAt(s)
		// readings to the millimetre, as read off a rod
		lv = float64(int(lv*1000+0.5)) / 1000
		note := ""
		if k == 3 {
			note = "water still clear"
		}
		j.Readings = append(j.Readings, model.Reading{At: start.Add(time.Duration(s) * time.Second), Level: lv, Note: note})
	}
	stop := start.Add(62 * time.Minute)
	if err := j.Checklist.Mark("stop.record", model.StateDone, "", "level 0.240 m", stop); err != nil {
		t.Fatal(err)
	}
	if err := j.Checklist.Mark("closeout.signoff", model.StateDone, "", "A. Marsh; T. Okoro", stop.Add(20*time.Minute)); err != nil {
		t.Fatal(err)
	}
	j.AddLog(start.Add(-5*time.Minute), "Sheen check before release: none seen (A. Marsh)")
	j.AddLog(start.Add(65*time.Minute), "Strainer cleared of leaves | flow picked up")
	return j, p
}

func TestReportGolden(t *testing.T) {
	now := time.Date(2026, time.March, 14, 11, 0, 0, 0, reportZone)
	cases := []struct {
		name string
		in   func(t *testing.T) Input
	}{
		{"demo-si", func(t *testing.T) Input {
			j, p := demoRecordJob(t)
			return Input{Job: j, Plan: p, Now: now, Cautions: []string{"Demo job: invented names and figures."}}
		}},
		{"demo-us-no-readings", func(t *testing.T) Input {
			j := model.DemoJob()
			j.SetUnits(model.US)
			p := model.Compute(j, presets.Builtin())
			j.RebuildChecklist(p)
			return Input{Job: j, Plan: p, Now: time.Date(2026, time.March, 14, 6, 0, 0, 0, time.FixedZone("EST", -5*3600))}
		}},
		{"bad-inputs", func(t *testing.T) Input {
			j := model.NewJob("Vault 7 | meter pit", model.SI, time.Date(2026, time.March, 2, 9, 0, 0, 0, time.UTC))
			_ = j.Set(model.FieldHoseID, "0x10")
			_ = j.Set(model.FieldHoseLength, "8 m")
			_ = j.Set(model.FieldLiquid, "water")
			j.Notes = "# not a heading\nsecond line"
			j.Facts = model.SiteFacts{ConfinedSpace: true, Discharge: model.DischargeSewer}
			_ = j.Set(model.FieldPriming, string(model.PrimeVacuum))
			j.Readings = []model.Reading{{At: time.Date(2026, time.March, 2, 9, 30, 0, 0, time.UTC), Level: 0.8}}
			p := model.Compute(j, presets.Builtin())
			j.RebuildChecklist(p)
			return Input{Job: j, Plan: p, Now: time.Date(2026, time.March, 2, 10, 0, 0, 0, time.UTC)}
		}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			in := tc.in(t)
			var md, cv bytes.Buffer
			if err := Write(&md, in); err != nil {
				t.Fatal(err)
			}
			if err := WriteCSV(&cv, in); err != nil {
				t.Fatal(err)
			}
			checkGolden(t, filepath.Join("testdata", "report", tc.name+".md"), md.Bytes())
			checkGolden(t, filepath.Join("testdata", "report", tc.name+".csv"), cv.Bytes())
			checkRecord(t, in, md.String())
		})
	}
}

// checkRecord checks what every record must hold whatever the figures
// (field-practice §5.1–§5.2: entries stand alone with units, local time and
// zone; the record does not authorise).
func checkRecord(t *testing.T, in Input, md string) {
	t.Helper()
	for _, bad := range []string{"NaN", "+Inf", "-Inf"} {
		if strings.Contains(md, bad) {
			t.Errorf("record contains %q", bad)
		}
	}
	if !strings.Contains(md, presets.RecordDisclaimer) {
		t.Error("closing line missing")
	}
	if !strings.HasSuffix(strings.TrimSpace(md), presets.RecordDisclaimer) {
		t.Error("the disclaimer is not the last line")
	}
	for _, s := range in.Job.Checklist.Steps {
		if !strings.Contains(md, cell(s.Text)) {
			t.Errorf("step %s missing from the record", s.ID)
		}
		if s.Reason != "" && !strings.Contains(md, "reason: "+s.Reason) {
			t.Errorf("skip reason of %s missing", s.ID)
		}
	}
	_, off := in.Now.Zone()
	zone := "UTC+00:00"
	if off < 0 {
		zone = "UTC-05:00"
	}
	if !strings.Contains(md, zone) {
		t.Errorf("zone offset %s not shown", zone)
	}
	if strings.Contains(strings.ToLower(md), "is safe") {
		t.Error("record declares something safe")
	}
	if !strings.Contains(md, "Never start a siphon by mouth") {
		t.Error("mouth caution missing")
	}
}

func checkGolden(t *testing.T, path string, got []byte) {
	t.Helper()
	testkit.Golden(t, path, got)
}

// The readings CSV parses back, has the documented header, its reading
// rows carry the planned level at their time, and every row's elapsed_s
// counts from the one time base its time_base row gives: with a start time
// (the demo record) and without one (the first reading is the base, and the
// plan rows, placed on the clock through the first reading, count from it
// too; issue 13 found them counted from the plan's own start).
func TestReadingsCSV(t *testing.T) {
	withStart, _ := demoRecordJob(t)
	noStart, p := demoRecordJob(t)
	noStart.Started = time.Time{}
	noStart.Checklist.Steps[noStart.Checklist.Index("run.start")].State = model.StatePending
	noStart.FlowTests = []model.FlowTest{{At: noStart.Readings[2].At, Volume: 0.01, Seconds: 12, Note: "bucket"}}
	for _, j := range []model.Job{withStart, noStart} {
		var b bytes.Buffer
		if err := WriteCSV(&b, Input{Job: j, Plan: p, Now: time.Date(2026, 3, 14, 12, 0, 0, 0, reportZone)}); err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(&b).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		if strings.Join(rows[0], ",") != "kind,time,elapsed_s,level_m,planned_level_m,flow_m3_s,note" {
			t.Errorf("header %v", rows[0])
		}
		if rows[1][0] != "time_base" || rows[1][2] != "0" {
			t.Fatalf("second row %v, want the time base", rows[1])
		}
		base, err := time.Parse(time.RFC3339, rows[1][1])
		if err != nil {
			t.Fatal(err)
		}
		if want := model.DrainStart(&j); !base.Equal(want) {
			t.Errorf("time base %v, want %v", base, want)
		}
		var nr, np, nf int
		for _, r := range rows[2:] {
			switch r[0] {
			case "reading":
				nr++
				if r[3] == "" || r[4] == "" || r[1] == "" {
					t.Errorf("reading row incomplete: %v", r)
				}
			case "plan":
				np++
				if r[3] != "" || r[4] == "" || r[1] == "" {
					t.Errorf("plan row: %v", r)
				}
			case "flow_test":
				nf++
				if r[5] == "" || r[6] != "bucket" {
					t.Errorf("flow test row: %v", r)
				}
			default:
				t.Errorf("kind %q", r[0])
			}
			at, err1 := time.Parse(time.RFC3339, r[1])
			el, err2 := strconv.ParseFloat(r[2], 64)
			if err1 != nil || err2 != nil || math.Abs(at.Sub(base).Seconds()-el) > 1 {
				t.Errorf("%s row at %s has elapsed_s %s; want %.0f from the time base", r[0], r[1], r[2], at.Sub(base).Seconds())
			}
		}
		if nr != len(j.Readings) || np != len(p.Drain.Curve) || nf != len(j.FlowTests) {
			t.Errorf("%d reading rows, %d plan rows, %d flow tests; want %d, %d, %d", nr, np, nf, len(j.Readings), len(p.Drain.Curve), len(j.FlowTests))
		}
	}
}

// The fit in the record recovers the ΔK the demo readings were made with
// (readings rounded to the millimetre). Source: the planner as oracle, as in
// TestFitOnPlannedDrain.
func TestReportFitOnDemo(t *testing.T) {
	j, p := demoRecordJob(t)
	f, err := Input{Job: j, Plan: p}.fit()
	if err != nil || f == nil {
		t.Fatalf("fit: %v", err)
	}
	if f.ExtraK < 3 || f.ExtraK > 5 {
		t.Errorf("ΔK = %.2f, want 4 ± 1 (readings rounded to 1 mm)", f.ExtraK)
	}
	t.Logf("demo: fitted ΔK %.3f from %d readings rounded to 1 mm (true 4)", f.ExtraK, f.N)
}

type failWriter struct{ n int }

func (w *failWriter) Write(p []byte) (int, error) {
	if w.n <= 0 {
		return 0, errors.New("disk full")
	}
	w.n--
	return len(p), nil
}

func TestReportWriteError(t *testing.T) {
	j, p := demoRecordJob(t)
	if err := Write(&failWriter{}, Input{Job: j, Plan: p, Now: time.Unix(0, 0)}); err == nil {
		t.Error("write error not reported")
	}
	if err := WriteCSV(&failWriter{}, Input{Job: j, Plan: p, Now: time.Unix(0, 0)}); err == nil {
		t.Error("CSV write error not reported")
	}
}

// A zero input writes a record that says what is missing, without a verdict.
func TestReportZeroInput(t *testing.T) {
	var b bytes.Buffer
	in := Input{Job: model.Job{Readings: []model.Reading{{At: time.Unix(1e9, 0), Level: 1}, {At: time.Unix(1e9+600, 0), Level: 0.9}}}}
	if err := Write(&b, in); err != nil {
		t.Fatal(err)
	}
	md := b.String()
	if strings.Contains(md, "| Verdict |") || !strings.Contains(md, "No plan was given") || !strings.Contains(md, "no plan to compare with") {
		t.Errorf("zero plan record:\n%s", md)
	}
	checkRecord(t, in, md)
	if err := WriteCSV(&b, in); err != nil {
		t.Fatal(err)
	}
}

// TestRecordBy: on the crew server each mark, reading and log entry names
// who made it, and the record says so beside it.
func TestRecordBy(t *testing.T) {
	j, p := demoRecordJob(t)
	j.Checklist.Steps[0].State, j.Checklist.Steps[0].By = model.StateDone, "Ana Lopes"
	j.Readings[0].By = "Ben Okafor"
	j.Log = append(j.Log, model.LogEntry{At: j.Readings[0].At, Text: "Strainer cleared", By: "Ben Okafor"})
	var b bytes.Buffer
	if err := Write(&b, Input{Job: j, Plan: p, Now: j.Readings[0].At}); err != nil {
		t.Fatal(err)
	}
	md := b.String()
	for _, want := range []string{"by: Ana Lopes", "(by Ben Okafor)", "Strainer cleared (by Ben Okafor)"} {
		if !strings.Contains(md, want) {
			t.Errorf("the record does not say %q", want)
		}
	}
}
