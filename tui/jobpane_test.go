package tui

import (
	"strings"
	"testing"

	"drawdown/model"
)

// jobRowTo moves the Job pane's selection to the row labelled label.
func jobRowTo(t *testing.T, m *Model, label string) *Model {
	t.Helper()
	if m.focus != PaneJob {
		m = press(t, m, "0")
	}
	p := m.jobp
	for range 2 * len(p.rows) {
		if p.rows[p.cur].label == label {
			return m
		}
		m = press(t, m, "down")
	}
	for range 2 * len(p.rows) {
		if p.rows[p.cur].label == label {
			return m
		}
		m = press(t, m, "up")
	}
	t.Fatalf("no row %q in the Job pane", label)
	return m
}

// typeRow opens the selected row's input, clears it and types text.
func typeRow(t *testing.T, m *Model, text string) *Model {
	t.Helper()
	m = press(t, m, "enter", "ctrl+u")
	m = typeText(t, m, text)
	return press(t, m, "enter")
}

// hasStep reports whether the checklist holds a step whose ID ends in id.
func hasStep(c model.Checklist, id string) bool {
	for _, s := range c.Steps {
		if strings.HasSuffix(s.ID, id) {
			return true
		}
	}
	return false
}

// A technician sets up their own job from the Job pane: every change goes
// through the model's setter, is logged once, and the checklist follows the
// site facts both ways (issue 12: facts on the screen, nothing sticky).
func TestJobPaneSetsUpAJob(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = jobRowTo(t, m, "Job name")
	m = typeRow(t, m, "Sump P3 pump-out")
	m = jobRowTo(t, m, "Site")
	m = typeRow(t, m, "Kestrel Lane pumping station (invented)")
	if m.job.Name != "Sump P3 pump-out" || m.job.Site != "Kestrel Lane pumping station (invented)" {
		t.Fatalf("name %q, site %q", m.job.Name, m.job.Site)
	}
	if !strings.Contains(frame(m), "Kestrel Lane") {
		t.Error("the header does not show the site")
	}

	m = jobRowTo(t, m, "Add a crew member")
	m = typeRow(t, m, "R. Diaz, attendant")
	if n := len(m.job.Crew); n != 3 || m.job.Crew[2] != (model.CrewMember{Name: "R. Diaz", Role: "attendant"}) {
		t.Fatalf("crew %+v", m.job.Crew)
	}
	m = jobRowTo(t, m, "Crew 2")
	m = press(t, m, "d")
	if len(m.job.Crew) != 2 || m.job.Crew[1].Name != "R. Diaz" {
		t.Fatalf("crew after removing the second: %+v", m.job.Crew)
	}

	// Confined space on, then off: the permit and attendant steps come
	// and go with it.
	m = jobRowTo(t, m, model.FlagConfined.Label())
	m = press(t, m, "enter")
	if !m.job.Facts.ConfinedSpace || !hasStep(m.job.Checklist, "cs.permit") || !hasStep(m.job.Checklist, "cs.attendant") {
		t.Fatalf("confined: fact %v, checklist lacks permit/attendant steps", m.job.Facts.ConfinedSpace)
	}
	m = press(t, m, "space")
	if m.job.Facts.ConfinedSpace || hasStep(m.job.Checklist, "cs.attendant") {
		t.Fatal("confined off: the attendant step stayed")
	}

	// Browsing the discharge choices logs nothing; taking one logs once.
	logs := len(m.job.Log)
	m = jobRowTo(t, m, "Where the liquid goes")
	m = press(t, m, "enter", "right", "right", "left")
	if len(m.job.Log) != logs {
		t.Fatalf("browsing logged %d lines", len(m.job.Log)-logs)
	}
	m = press(t, m, "enter")
	if len(m.job.Log) != logs+1 || m.job.Facts.Discharge == model.DischargeStorm {
		t.Fatalf("discharge %q, %d new log lines", m.job.Facts.Discharge, len(m.job.Log)-logs)
	}

	// A bad air temperature is refused with the range in the job's units;
	// the input stays open and the old value stays.
	m = jobRowTo(t, m, "Air temperature")
	m = typeRow(t, m, "-80 C")
	if !m.jobp.Typing() || !strings.Contains(m.jobp.errText, "−60") && !strings.Contains(m.jobp.errText, "-60") || m.job.Facts.AirTemp != "" {
		t.Fatalf("bad air temperature: typing %v, error %q, stored %q", m.jobp.Typing(), m.jobp.errText, m.job.Facts.AirTemp)
	}
	m = press(t, m, "esc")

	// A sheen takes the do-not-release branch.
	m = jobRowTo(t, m, "Sheen, odour or colour seen")
	m = typeRow(t, m, "rainbow sheen by the drain valve")
	if !m.job.Facts.SheenSeen || !m.job.Checklist.Context.Held() {
		t.Fatal("sheen recorded but the release is not held")
	}

	// Closing asks for a yes.
	m = jobRowTo(t, m, "Job state")
	m = typeRow(t, m, "no")
	if m.job.State() == model.JobClosed {
		t.Fatal("closed without a yes")
	}
	m = press(t, m, "ctrl+u")
	m = typeText(t, m, "yes")
	m = press(t, m, "enter")
	if m.job.State() != model.JobClosed {
		t.Fatalf("state %v after yes", m.job.State())
	}
	checkScreen(t, m)
}

// The release record shows where the sheen rule applies (rain water in an
// oil bund) and records who opened and resealed the valve.
func TestJobPaneRelease(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = jobRowTo(t, m, "Drain valve ID")
	m = typeRow(t, m, "DV-2")
	m = jobRowTo(t, m, "Valve opened by")
	m = typeRow(t, m, "A. Marsh")
	m = jobRowTo(t, m, "Valve resealed by")
	m = typeRow(t, m, "A. Marsh, S-10442")
	m = jobRowTo(t, m, "Add a photo")
	m = typeRow(t, m, "IMG_0412, water surface before release")
	r := m.job.Release
	if r.ValveID != "DV-2" || r.OpenedBy != "A. Marsh" || r.OpenedAt.IsZero() || r.NewSeal != "S-10442" || len(r.Photos) != 1 {
		t.Fatalf("release %+v", r)
	}
	// A job with no oil risk shows no release rows.
	j := model.DemoJob()
	j.Facts.MayCarryOil = false
	j.Checklist.Context.OilCheck = false
	for _, row := range jobRows(j, nil) {
		if row.label == "Drain valve ID" {
			t.Fatal("release rows on a job without the sheen rule")
		}
	}
}

// A new job starts blank (nothing of the demo in it) or from a template;
// a copy keeps the site and set-up but no marks or readings (issue 12).
func TestJobListNewAndCopy(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = press(t, m, "o", "n")
	// the help line says what Enter does at each step (it picks the
	// template, it does not take the next one; then it creates the job)
	if h := lastLine(frame(m)); !strings.Contains(h, "enter start from this") || strings.Contains(h, "enter next") {
		t.Errorf("help while choosing a template: %q", h)
	}
	m = press(t, m, "enter")
	if h := lastLine(frame(m)); !strings.Contains(h, "enter create it") {
		t.Errorf("help while naming the job: %q", h)
	}
	m = typeText(t, m, "Vault V7 dewatering")
	m = press(t, m, "enter")
	j := m.job
	if j.Name != "Vault V7 dewatering" || j.Site != "" || len(j.Crew) != 0 || j.Notes != "" || j.Supervisor != "" ||
		j.Facts.MayCarryOil || j.Template != "" {
		t.Fatalf("blank job carries text: %+v", j)
	}
	if strings.Contains(frame(m), "Harrowfen") || strings.Contains(frame(m), "Bund B2") {
		t.Fatalf("the demo shows in a blank job:\n%s", frame(m))
	}
	// its empty measurements read as needed, not as wrong
	if f := frame(m); !strings.Contains(f, "Hose inside diameter            ✗ needed") || strings.Contains(f, "✗ invalid") {
		t.Errorf("blank job's empty fields:\n%s", f)
	}
	// the Result names the field with its pane, and its accepted range
	if f := frame(m); !strings.Contains(f, "Fix Hose › Hose inside") || !strings.Contains(f, "600 mm") {
		t.Errorf("blank job's Result:\n%s", f)
	}
	// From the sump-pit template: confined, to the sewer, no names.
	m = press(t, m, "esc", "o", "n", "right", "right", "enter")
	m = typeText(t, m, "Pump house P2")
	m = press(t, m, "enter")
	if m.job.Template != model.TemplateSumpPit || !m.job.Facts.ConfinedSpace || m.job.Site != "" {
		t.Fatalf("sump-pit job: template %q, confined %v, site %q", m.job.Template, m.job.Facts.ConfinedSpace, m.job.Site)
	}
	// A blank name is refused in words, the input stays open.
	m = press(t, m, "o", "c", "ctrl+u", "enter")
	if m.jobs.err == nil || m.jobs.mode != listCopyName {
		t.Fatalf("blank copy name: err %v, mode %v", m.jobs.err, m.jobs.mode)
	}
	m = typeText(t, m, "Pump house P2, day 2")
	m = press(t, m, "enter")
	if m.job.Name != "Pump house P2, day 2" || !m.job.Facts.ConfinedSpace || m.jobs.open {
		t.Fatalf("copy: %q, confined %v, list open %v", m.job.Name, m.job.Facts.ConfinedSpace, m.jobs.open)
	}
	checkScreen(t, m)
}

// A priming method that does not suit the liquid is marked in the picker
// and named in the Result, never silently listed (issue 12 item 4).
func TestUnsuitedMethodShown(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m.job.Inputs[model.FieldLiquid] = "gasoline"
	m.job.Inputs[model.FieldPriming] = string(model.PrimeVacuum)
	m.recompute()
	m = press(t, m, "1")
	got := frame(m)
	if !strings.Contains(got, "suit this job") {
		t.Errorf("Result does not name the unsuited method:\n%s", got)
	}
	m = selectField(t, m, model.FieldPriming)
	if got := frame(m); !strings.Contains(got, "Unsuited here") {
		t.Errorf("the picker's help does not say why:\n%s", got)
	}
}

// Stepping the liquid picker through every liquid and back on the screen
// leaves the checklist as a fresh job with that liquid gets: no hazard
// sticks (issue 12 §3, the screen's path).
func TestScreenLiquidWalk(t *testing.T) {
	m := newTestModel(t, 80, 24)
	m = selectField(t, m, model.FieldLiquid)
	n := len(m.cat.Liquids())
	ids := func(c model.Checklist) string {
		var out []string
		for _, s := range c.Steps {
			out = append(out, s.ID)
		}
		return strings.Join(out, " ")
	}
	for i := range 2 * n {
		dir := "right"
		if i >= n {
			dir = "left"
		}
		m = press(t, m, dir)
		fresh := m.job.Clone()
		fresh.Checklist = model.Checklist{}
		fresh.RebuildChecklist(model.Compute(fresh, m.cat))
		if got, want := ids(m.job.Checklist), ids(fresh.Checklist); got != want {
			t.Fatalf("step %d (%s): the screen's checklist differs from a fresh build:\n got %s\nwant %s",
				i, m.job.Inputs[model.FieldLiquid], got, want)
		}
	}
}

// lastLine is a frame's last line: the help line.
func lastLine(f string) string {
	f = strings.TrimRight(f, "\n")
	return f[strings.LastIndex(f, "\n")+1:]
}
