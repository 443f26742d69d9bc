package model

import (
	"encoding/json"
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"
	"time"

	"drawdown/presets"
)

// Sources named below are those field-practice.md §3 names for each rule:
//   - OSHA 29 CFR 1910.146 (permit-required confined spaces), atmospheric
//     testing order O₂ → flammable → toxic (Virginia Tech EHS and MSU ORCBS
//     atmospheric-testing guidance, as paraphrased in field-practice §3.1);
//   - NFPA 77 (static electricity) and OSHA 29 CFR 1910.106(e)(6)(ii)
//     (bonding when dispensing flammable liquids), field-practice §3.3;
//   - EPA 40 CFR 112.8(c)(3) (SPCC diked-area drainage: inspect, supervise,
//     reseal, record) and 40 CFR 110 (sheen rule), field-practice §3.8;
//   - CDC, Handling Human Waste or Sewage (PPE, hygiene), field-practice §3.4;
//   - poison-centre warnings against mouth siphoning, field-practice §3.2.
//
// The checklists are built the way the screen and the command line build
// them: a job, model.Compute with the built-in catalogue, ContextFor.

var testCat = presets.Builtin()

// siteJob is a job with a 25 mm × 8 m hose over a 0.5 m lift and a 1.5 m
// drop (invented), the liquid, temperature and method given, and the crew's
// site facts.
func siteJob(liquid, temp string, m PrimingMethod, f SiteFacts) Job {
	j := NewJob("test", SI, t0)
	j.Inputs = map[FieldID]string{FieldHoseID: "25 mm", FieldHoseLength: "8 m", FieldLift: "0.5 m", FieldDrop: "1.5 m",
		FieldLiquid: liquid, FieldTemp: temp, FieldPriming: string(m), FieldPumpStroke: "0.2 L"}
	j.Facts = f
	return j
}

// ctxOf derives the context of j as main does.
func ctxOf(j Job) ChecklistContext { return ContextFor(j, Compute(j, testCat)) }

// built is j's checklist after a compute, as main builds it.
func built(j Job) Checklist {
	j.RebuildChecklist(Compute(j, testCat))
	return j.Checklist
}

func stepIDs(c Checklist) map[string]bool {
	m := map[string]bool{}
	for _, s := range c.Steps {
		m[s.ID] = true
	}
	return m
}

// Atmospheric testing order: oxygen, then flammable, then toxic (OSHA
// 29 CFR 1910.146 practice as summarised in field-practice §3.1), all before
// any set-up or priming step, and tested from outside the space.
func TestChecklistAtmosphericTestingOrder(t *testing.T) {
	for _, entry := range []bool{false, true} {
		c := built(siteJob("water", "15 C", PrimeHandPump, SiteFacts{ConfinedSpace: true, Entry: entry, Discharge: DischargeSewer}))
		o2, fl, tx := c.Index("hazard.cs.oxygen"), c.Index("hazard.cs.flammable-gas"), c.Index("hazard.cs.toxic")
		if o2 < 0 || fl < 0 || tx < 0 {
			t.Fatalf("missing atmospheric test steps: %d %d %d", o2, fl, tx)
		}
		if !(c.Index("hazard.cs.permit") < o2 && o2 < fl && fl < tx) {
			t.Errorf("order permit<O2<flammable<toxic violated: %d %d %d %d", c.Index("hazard.cs.permit"), o2, fl, tx)
		}
		for _, i := range []int{o2, fl, tx} {
			if !strings.Contains(c.Steps[i].Text, "outside") {
				t.Errorf("step %s does not say to test from outside", c.Steps[i].ID)
			}
		}
		if !strings.Contains(c.Steps[o2].Caution, "19.5 %") || !strings.Contains(c.Steps[o2].Caution, "23.5 %") {
			t.Errorf("oxygen limits 19.5 %%/23.5 %% (29 CFR 1910.146(b) hazardous atmosphere) missing: %q", c.Steps[o2].Caution)
		}
		if !strings.Contains(c.Steps[fl].Caution, "10 %") {
			t.Errorf("10 %% LFL limit (29 CFR 1910.146(b)) missing: %q", c.Steps[fl].Caution)
		}
		if !strings.Contains(c.Steps[tx].Text, "H₂S") || !strings.Contains(c.Steps[tx].Text, "CO") {
			t.Errorf("toxic test does not name H₂S and CO (field-practice §5.1 readings O₂, LEL, H₂S, CO): %q", c.Steps[tx].Text)
		}
		if c.Index("setup.route") < tx {
			t.Error("set-up comes before the atmospheric tests")
		}
	}
}

// Structure: sections in working order, unique IDs, every step pending with
// a title and a rule family (or "common practice"), and no step ID in any
// text a person reads.
func TestChecklistStructure(t *testing.T) {
	order := map[Section]int{}
	for i, s := range Sections() {
		order[s] = i
	}
	for _, m := range append(PrimingMethods(), "") {
		for _, liquid := range []string{"water", "gasoline", "wastewater"} {
			f := SiteFacts{ConfinedSpace: true, OpenWater: true, Discharge: DischargeContainer, Overnight: true}
			c := built(siteJob(liquid, "15 C", m, f))
			seen := map[string]bool{}
			last := -1
			hasSection := map[Section]bool{}
			for _, s := range c.Steps {
				if seen[s.ID] {
					t.Errorf("%s, method %q: duplicate step ID %s", liquid, m, s.ID)
				}
				seen[s.ID] = true
				if order[s.Section] < last {
					t.Errorf("%s, method %q: step %s out of section order", liquid, m, s.ID)
				}
				last = order[s.Section]
				hasSection[s.Section] = true
				if s.State != StatePending || s.Rule == "" || s.Text == "" || s.Title == "" {
					t.Errorf("%s, method %q: step %+v incomplete", liquid, m, s)
				}
			}
			for _, s := range c.Steps {
				for id := range seen {
					if strings.Contains(s.Text+s.Caution+s.Title, id) {
						t.Errorf("step %s shows the internal ID %s", s.ID, id)
					}
				}
			}
			for _, sec := range Sections() {
				if !hasSection[sec] {
					t.Errorf("%s, method %q: section %s empty", liquid, m, sec)
				}
			}
		}
	}
}

// Stop method follows the hose: rigid lines with valves close the valve
// slowly (water hammer); portable hoses lift the intake (field-practice §2.9).
func TestChecklistStopByMethod(t *testing.T) {
	for _, tc := range []struct {
		m    PrimingMethod
		want string
	}{
		{PrimeCrestPort, "close the outlet valve slowly"},
		{PrimeVacuum, "close the outlet valve slowly"},
		{PrimeShakeValve, "lift the intake"},
		{PrimeHandPump, "lift the intake"},
	} {
		c := built(siteJob("water", "15 C", tc.m, SiteFacts{}))
		s := c.Steps[c.Index("stop.break")]
		if !strings.Contains(s.Text, tc.want) {
			t.Errorf("%s: stop step %q lacks %q (field-practice §2.9)", tc.m, s.Text, tc.want)
		}
	}
}

func TestChecklistMark(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.FixedZone("CEST", 2*3600))
	c := built(siteJob("water", "15 C", PrimeHandPump, SiteFacts{Discharge: DischargeContainer}))
	first, ok := c.Current()
	if !ok || first.ID != "hazard.liquid" {
		t.Fatalf("Current = %v %v", first.ID, ok)
	}
	if err := c.Mark("hazard.liquid", StateDone, "", "SDS on file", at); err != nil {
		t.Fatal(err)
	}
	if err := c.Mark("hazard.electrical", StateSkipped, "  ", "", at); !errors.Is(err, ErrReasonRequired) {
		t.Errorf("skip without reason: err = %v, want ErrReasonRequired", err)
	} else if err.Error() != "Live equipment isolated: a reason is needed to skip it" {
		t.Errorf("message %q", err)
	}
	if c.Steps[c.Index("hazard.electrical")].State != StatePending {
		t.Error("failed Mark changed the step")
	}
	if err := c.Mark("hazard.electrical", StateNotApplicable, "no power on site", "", time.Time{}); !errors.Is(err, ErrNoTime) {
		t.Errorf("mark without a time: %v", err)
	}
	if err := c.Mark("no.such", StateDone, "", "", at); !errors.Is(err, ErrUnknownStep) || strings.Contains(err.Error(), "no.such") {
		t.Errorf("unknown step: err = %v (must not echo an ID)", err)
	}
	if err := c.Mark("hazard.electrical", "finished", "", "", at); !errors.Is(err, ErrBadState) {
		t.Errorf("unknown state: %v", err)
	}
	if err := c.Mark("hazard.electrical", StateSkipped, "no power on site", "", at); err != nil {
		t.Fatal(err)
	}
	// The discharge step is required: not applicable needs a reason, and
	// the refusal names the step by its title (issue 12 §5).
	err := c.Mark("hazard.discharge", StateNotApplicable, "", "", at)
	var me *MarkError
	if !errors.As(err, &me) || !errors.Is(err, ErrReasonRequired) ||
		err.Error() != "Receiving vessel and destination: a reason is needed to mark it not applicable: a rule asks for this step" {
		t.Errorf("n/a without reason on a required step: %v", err)
	}
	if err := c.Mark("hazard.discharge", StateNotApplicable, "water stays in the tank: job cancelled", "", at); err != nil {
		t.Errorf("n/a with reason: %v", err)
	}
	// A plain practice step may be marked not applicable without one.
	if err := c.Mark("run.levels", StateNotApplicable, "", "", at); err != nil {
		t.Errorf("n/a on a practice step: %v", err)
	}
	p := c.Progress()
	if p.Done != 1 || p.Skipped != 1 || p.NotApplicable != 2 || p.Pending != p.Total-4 || p.Marked() != 4 {
		t.Errorf("Progress = %+v", p)
	}
	// Undo keeps the note, clears time and reason.
	if err := c.Mark("hazard.liquid", StatePending, "", "", at); err != nil {
		t.Fatal(err)
	}
	s := c.Steps[0]
	if s.State != StatePending || !s.At.IsZero() || s.Note != "SDS on file" {
		t.Errorf("undo: %+v", s)
	}
	for _, s := range c.Steps {
		_ = c.Mark(s.ID, StateDone, "", "ok", at)
	}
	if _, ok := c.Current(); ok || c.CurrentIndex() != -1 {
		t.Error("Current with all steps done")
	}
}

// Steps that ask for a recorded fact (permit number, gas reading, sheen
// check, authorisation) are done only with a note: the record must hold the
// fact (OSHA 29 CFR 1910.146(f): test results with times and initials on the
// permit; 40 CFR 112.8(c)(3): records of each drainage event).
func TestChecklistNoteRequired(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.UTC)
	c := built(siteJob("bund-water", "10 C", PrimeHandPump, SiteFacts{ConfinedSpace: true, Discharge: DischargeStorm}))
	for _, id := range []string{"hazard.cs.permit", "hazard.cs.oxygen", "hazard.cs.flammable-gas", "hazard.cs.toxic", "hazard.discharge", "setup.inspect-before", "closeout.inspect"} {
		i := c.Index(id)
		if i < 0 || !c.Steps[i].NoteRequired || !c.Steps[i].Required {
			t.Errorf("%s: NoteRequired and Required not set", id)
			continue
		}
		if err := c.Mark(id, StateDone, "", " ", at); !errors.Is(err, ErrNoteRequired) {
			t.Errorf("%s done without a note: err = %v", id, err)
		}
		if err := c.Mark(id, StateSkipped, "meter in for calibration", "", at); err != nil {
			t.Errorf("%s skip with reason: %v", id, err)
		}
		if err := c.Mark(id, StateDone, "", "O2 20.9 %, 09:30, AM", at); err != nil {
			t.Errorf("%s with a note: %v", id, err)
		}
	}
	if c.Steps[c.Index("setup.route")].NoteRequired {
		t.Error("plain step needs a note")
	}
}

// The checklist serialises with the job and comes back equal, times with
// their zone offset intact, hazards as catalogue codes.
func TestChecklistJSONRoundTrip(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.FixedZone("", -5*3600))
	c := built(siteJob("gasoline", "15 C", PrimeShakeValve, SiteFacts{ConfinedSpace: true, Discharge: DischargeTanker, AirTemp: "-3 C"}))
	_ = c.Mark("hazard.liquid", StateDone, "", "amber, petrol smell", at)
	_ = c.Mark("hazard.electrical", StateSkipped, "utility confirmed no supply in vault", "", at)
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"hazards":["flammable","volatile","toxic","environmental"]`) || !strings.Contains(string(b), `"class":"IB"`) {
		t.Errorf("hazards not written as codes: %s", b[:300])
	}
	var back Checklist
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(c.Context, back.Context) || len(back.Steps) != len(c.Steps) {
		t.Fatalf("round trip changed the checklist:\n%+v\n%+v", c.Context, back.Context)
	}
	for i := range c.Steps {
		a, z := c.Steps[i], back.Steps[i]
		if !a.At.Equal(z.At) {
			t.Errorf("step %d time %v != %v", i, a.At, z.At)
		}
		a.At, z.At = time.Time{}, time.Time{}
		if !reflect.DeepEqual(a, z) {
			t.Errorf("step %d: %+v != %+v", i, a, z)
		}
	}
	if strings.Contains(string(b), `"at":"0001-01-01`) {
		t.Error("zero times serialised; want omitted")
	}
}

// Changing the liquid keeps the marks of steps that survive, parks marks of
// steps that no longer apply, and restores them when they apply again.
func TestChecklistRebuildKeepsState(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.UTC)
	j := siteJob("gasoline", "15 C", PrimeHandPump, SiteFacts{Discharge: DischargeContainer})
	j.RebuildChecklist(Compute(j, testCat))
	for _, m := range []struct{ id, reason, note string }{{"hazard.liquid", "", "checked"}, {"setup.bonding", "", "clamp on drum rim"}, {"setup.route", "short straight run", ""}} {
		state := StateDone
		if m.reason != "" {
			state = StateSkipped
		}
		if err := j.Mark(m.id, state, m.reason, m.note, at); err != nil {
			t.Fatal(err)
		}
	}
	_ = j.Set(FieldLiquid, "water")
	j.RebuildChecklist(Compute(j, testCat))
	w := j.Checklist
	if w.Index("setup.bonding") >= 0 {
		t.Error("bonding step kept for water")
	}
	if s := w.Steps[w.Index("hazard.liquid")]; s.State != StateDone || s.Note != "checked" || !s.At.Equal(at) || !strings.Contains(s.Text, "Fresh water") {
		t.Errorf("surviving step lost state or kept old text: %+v", s)
	}
	if s := w.Steps[w.Index("setup.route")]; s.State != StateSkipped || s.Reason != "short straight run" {
		t.Errorf("skipped step lost reason: %+v", s)
	}
	if len(w.Dropped) != 1 || w.Dropped[0].ID != "setup.bonding" {
		t.Fatalf("Dropped = %+v", w.Dropped)
	}
	_ = j.Set(FieldLiquid, "gasoline")
	j.RebuildChecklist(Compute(j, testCat))
	back := j.Checklist
	if s := back.Steps[back.Index("setup.bonding")]; s.State != StateDone || s.Note != "clamp on drum rim" {
		t.Errorf("bonding mark not restored: %+v", s)
	}
	if len(back.Dropped) != 0 {
		t.Errorf("Dropped after restore = %+v", back.Dropped)
	}
	_ = j.Set(FieldPriming, string(PrimeShakeValve))
	j.RebuildChecklist(Compute(j, testCat))
	m := j.Checklist
	if m.Index("prime.pump.stroke") >= 0 || m.Index("prime.shake.stroke") < 0 {
		t.Error("prime steps did not follow the method")
	}
	if m.Steps[m.Index("setup.bonding")].State != StateDone {
		t.Error("bonding mark lost on method change")
	}
}

func TestParsePrimingMethod(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want PrimingMethod
		ok   bool
	}{
		{"submerge-and-cap", PrimeSubmerge, true},
		{"submerge", PrimeSubmerge, true},
		{"fill-from-supply", PrimeSupplyFill, true},
		{" Hand-Pump ", PrimeHandPump, true},
		{"vacuum at the crest", PrimeVacuum, true},
		{"", "", true},
		{"mouth", "", false},
		{"suck it", "", false},
		{"magic", "", false},
	} {
		got, err := ParsePrimingMethod(tc.in)
		if got != tc.want || (err == nil) != tc.ok {
			t.Errorf("ParsePrimingMethod(%q) = %q, %v", tc.in, got, err)
		}
		if strings.Contains(tc.in, "mouth") && err != nil && !strings.Contains(err.Error(), "never") {
			t.Errorf("mouth refusal does not say never: %v", err)
		}
	}
}

func BenchmarkBuildChecklist(b *testing.B) {
	ctx := ctxOf(siteJob("gasoline", "15 C", PrimeHandPump, SiteFacts{ConfinedSpace: true, Discharge: DischargeContainer}))
	b.ReportAllocs()
	var sink Checklist
	for b.Loop() {
		sink = BuildChecklist(ctx)
	}
	_ = sink
}

func FuzzParsePrimingMethod(f *testing.F) {
	for _, s := range []string{"", "hand-pump", "Submerge and cap", "mouth", "suck", "vacuum at the crest", "\x00", "  VACUUM "} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParsePrimingMethod(s)
		if err != nil {
			if m != "" {
				t.Errorf("%q: method %q with error", s, m)
			}
			return
		}
		if m == "" {
			if strings.TrimSpace(s) != "" {
				t.Errorf("%q: empty method without error", s)
			}
			return
		}
		valid := false
		for _, v := range PrimingMethods() {
			valid = valid || v == m
		}
		if !valid {
			t.Errorf("%q gave unknown method %q", s, m)
		}
		if strings.Contains(strings.ToLower(s), "mouth") {
			t.Errorf("%q accepted", s)
		}
		if back, err := ParsePrimingMethod(string(m)); err != nil || back != m {
			t.Errorf("round trip %q: %q %v", m, back, err)
		}
	})
}

// ExampleBuildChecklist counts the steps per section for a gasoline
// transfer into a can with a squeeze bulb.
func ExampleBuildChecklist() {
	j := NewJob("can transfer", SI, time.Date(2026, 3, 14, 9, 0, 0, 0, time.UTC))
	_ = j.Set(FieldLiquid, "gasoline")
	_ = j.Set(FieldPriming, "hand-pump")
	_ = j.SetDischarge(DischargeContainer, j.Created)
	c := BuildChecklist(ContextFor(j, Compute(j, presets.Builtin())))
	for _, sec := range Sections() {
		n := 0
		for _, s := range c.Steps {
			if s.Section == sec {
				n++
			}
		}
		fmt.Printf("%s: %d\n", sec.Title(), n)
	}
	s, _ := c.Current()
	fmt.Println("first:", s.Title)
	// Output:
	// Hazard check: 4
	// Set-up: 10
	// Prime: 6
	// Run and watch: 7
	// Stop and drain the hose: 5
	// Close out: 4
	// first: Identify the liquid
}

// BenchmarkRebuildChecklist is the per-compute cost the screen pays after
// each keystroke: ContextFor and Rebuild on the demo job (its plan
// computed once outside the loop).
func BenchmarkRebuildChecklist(b *testing.B) {
	j := DemoJob()
	p := Compute(j, testCat)
	b.ReportAllocs()
	for b.Loop() {
		j.RebuildChecklist(p)
	}
}
