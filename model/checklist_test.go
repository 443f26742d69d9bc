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

var (
	hzGasoline = Hazards{Flammable: true, FlammableClass: "IB", Environmental: true}
	hzSewage   = Hazards{Biohazard: true, Environmental: true}
	hzPlain    = Hazards{}
	// hzDikeWater is rain water inside an oil tank's secondary containment.
	hzDikeWater = Hazards{Environmental: true}
)

func stepIDs(c Checklist) map[string]bool {
	m := map[string]bool{}
	for _, s := range c.Steps {
		m[s.ID] = true
	}
	return m
}

func TestChecklistIncludesRuleSteps(t *testing.T) {
	cases := []struct {
		name    string
		ctx     ChecklistContext
		want    []string // step IDs that must be present
		absent  []string // step IDs that must be absent
		source  string
		wantRef string // rule family that must be named on a step
	}{
		{
			name:    "flammable liquid: bonding, grounding, ignition sources, approved containers",
			ctx:     ChecklistContext{Liquid: "gasoline", Hazards: hzGasoline, Method: PrimeHandPump, Discharge: DischargeContainer},
			want:    []string{"setup.bonding", "setup.ignition", "setup.containers", "prime.no-pressure", "stop.unbond", "closeout.store"},
			source:  "NFPA 77; OSHA 29 CFR 1910.106(e)(6)(ii) (field-practice §3.3)",
			wantRef: "NFPA 77",
		},
		{
			name:    "combustible liquid: bonding and ignition steps too",
			ctx:     ChecklistContext{Liquid: "diesel", Hazards: Hazards{Combustible: true, FlammableClass: "II"}, Method: PrimeShakeValve, Discharge: DischargeContainer},
			want:    []string{"setup.bonding", "setup.ignition", "hazard.fuel"},
			source:  "NFPA 30 class II; combustible within ~9 °C of flash point treated as flammable (field-practice §3.3)",
			wantRef: "NFPA 30",
		},
		{
			name:    "environmental discharge: inspection before release, sheen watch, inspection and record after, reseal",
			ctx:     ChecklistContext{Liquid: "containment rain water", Hazards: hzDikeWater, Method: PrimeSubmerge, Discharge: DischargeStorm},
			want:    []string{"setup.inspect-before", "run.sheen", "closeout.inspect", "closeout.reseal"},
			source:  "EPA 40 CFR 112.8(c)(3); 40 CFR 110 (field-practice §3.8)",
			wantRef: "40 CFR 112.8(c)(3)",
		},
		{
			name:    "biohazard: PPE, dedicated hose, decontamination",
			ctx:     ChecklistContext{Liquid: "sewage", Hazards: hzSewage, Method: PrimePumpStart, Discharge: DischargeSewer},
			want:    []string{"hazard.ppe.sewage", "setup.hose.dedicated", "closeout.decon"},
			source:  "CDC, Handling Human Waste or Sewage (field-practice §3.4)",
			wantRef: "CDC",
		},
		{
			name:    "confined space: permit, three tests, attendant, rescue, monitoring, permit close",
			ctx:     ChecklistContext{Liquid: "water", Method: PrimeVacuum, ConfinedSpace: true, Discharge: DischargeSewer},
			want:    []string{"hazard.cs.permit", "hazard.cs.oxygen", "hazard.cs.flammable-gas", "hazard.cs.toxic", "hazard.cs.attendant", "hazard.cs.rescue", "run.atmosphere", "closeout.permit"},
			source:  "OSHA 29 CFR 1910.146 (field-practice §3.1)",
			wantRef: "1910.146",
		},
		{
			name:   "hzPlain water, submerge and cap: no fuel, hzSewage, sheen or confined-space steps",
			ctx:    ChecklistContext{Liquid: "water", Hazards: hzPlain, Method: PrimeSubmerge, Discharge: DischargeSameSite},
			want:   []string{"prime.no-mouth", "prime.submerge.fill", "prime.submerge.open", "setup.outlet", "setup.outlet-protection"},
			absent: []string{"setup.bonding", "setup.ignition", "setup.containers", "prime.no-pressure", "stop.unbond", "hazard.fuel", "hazard.ppe.sewage", "closeout.decon", "setup.inspect-before", "closeout.inspect", "hazard.cs.permit", "hazard.edge", "setup.containment"},
			source: "field-practice §2.1 (method) and §3 (steps that do not apply are left out)",
		},
		{
			name:   "open pond edge: fall and drowning step",
			ctx:    ChecklistContext{Liquid: "water", Method: PrimeCrestPort, OpenEdge: true, Discharge: DischargeStorm},
			want:   []string{"hazard.edge", "prime.crest.fit", "prime.crest.fill"},
			source: "MSHA water-hazard alert; common practice (field-practice §3.6)",
		},
		{
			name:   "clean-supply fill: backflow caution",
			ctx:    ChecklistContext{Liquid: "water", Method: PrimeSupplyFill, Discharge: DischargeSewer},
			want:   []string{"prime.supply.fill"},
			source: "local cross-connection control programs, e.g. City of Bremerton (field-practice §3.9)",
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := BuildChecklist(tc.ctx)
			ids := stepIDs(c)
			for _, id := range tc.want {
				if !ids[id] {
					t.Errorf("missing step %s (source: %s)", id, tc.source)
				}
			}
			for _, id := range tc.absent {
				if ids[id] {
					t.Errorf("step %s present but does not apply (source: %s)", id, tc.source)
				}
			}
			if tc.wantRef != "" {
				found := false
				for _, s := range c.Steps {
					if strings.Contains(s.Rule, tc.wantRef) {
						found = true
					}
				}
				if !found {
					t.Errorf("no step names rule %q (source: %s)", tc.wantRef, tc.source)
				}
			}
		})
	}
}

// No step, for any liquid and any method, instructs priming by mouth; the
// only step that mentions the mouth is the standing prohibition. Source:
// poison-centre warnings (field-practice §3.2); common practice.
func TestChecklistNeverInstructsMouthPriming(t *testing.T) {
	hazardSets := []Hazards{hzPlain, hzGasoline, hzSewage, hzDikeWater, {Combustible: true}, {Hot: true, FreezingRisk: true}}
	methods := append(PrimingMethods(), "")
	for _, h := range hazardSets {
		for _, m := range methods {
			for _, cs := range []bool{false, true} {
				ctx := ChecklistContext{Hazards: h, Method: m, ConfinedSpace: cs, OpenEdge: cs, Discharge: DischargeContainer, Strokes: 12}
				c := BuildChecklist(ctx)
				sawBan := false
				for _, s := range c.Steps {
					text := strings.ToLower(s.Text)
					if strings.Contains(text, "mouth") || strings.Contains(text, "suck") || strings.Contains(text, "by lung") {
						if s.ID != "prime.no-mouth" || !strings.Contains(text, "never") {
							t.Errorf("%+v: step %s mentions mouth/suction: %q", ctx, s.ID, s.Text)
						}
						sawBan = true
					}
					if strings.Contains(text, "by mouth") && !strings.Contains(text, "never start") {
						t.Errorf("%+v: step %s: %q", ctx, s.ID, s.Text)
					}
				}
				if !sawBan {
					t.Errorf("%+v: the standing 'never by mouth' step is missing", ctx)
				}
			}
		}
	}
}

// Atmospheric testing order: oxygen, then flammable, then toxic (OSHA
// 29 CFR 1910.146 practice as summarised in field-practice §3.1), all before
// any set-up or priming step, and tested from outside the space.
func TestChecklistAtmosphericTestingOrder(t *testing.T) {
	c := BuildChecklist(ChecklistContext{Method: PrimeHandPump, ConfinedSpace: true, Discharge: DischargeContainer})
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
	if c.Index("setup.route") < tx {
		t.Error("set-up comes before the atmospheric tests")
	}
}

// Structure: sections in working order, unique IDs, every step pending, and
// every step has a rule family (or "common practice").
func TestChecklistStructure(t *testing.T) {
	order := map[Section]int{}
	for i, s := range Sections() {
		order[s] = i
	}
	for _, m := range append(PrimingMethods(), "") {
		c := BuildChecklist(ChecklistContext{Hazards: hzGasoline, Method: m, ConfinedSpace: true, OpenEdge: true, Receiver: true, Discharge: DischargeStorm})
		seen := map[string]bool{}
		last := -1
		hasSection := map[Section]bool{}
		for _, s := range c.Steps {
			if seen[s.ID] {
				t.Errorf("method %q: duplicate step ID %s", m, s.ID)
			}
			seen[s.ID] = true
			if order[s.Section] < last {
				t.Errorf("method %q: step %s out of section order", m, s.ID)
			}
			last = order[s.Section]
			hasSection[s.Section] = true
			if s.State != StatePending || s.Rule == "" || s.Text == "" {
				t.Errorf("method %q: step %+v incomplete", m, s)
			}
		}
		for _, sec := range Sections() {
			if !hasSection[sec] {
				t.Errorf("method %q: section %s empty", m, sec)
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
		{PrimeSubmerge, "lift the intake"},
		{PrimeHandPump, "lift the intake"},
	} {
		c := BuildChecklist(ChecklistContext{Method: tc.m})
		s := c.Steps[c.Index("stop.break")]
		if !strings.Contains(s.Text, tc.want) {
			t.Errorf("%s: stop step %q lacks %q (field-practice §2.9)", tc.m, s.Text, tc.want)
		}
	}
}

func TestChecklistMark(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.FixedZone("CEST", 2*3600))
	c := BuildChecklist(ChecklistContext{Hazards: hzGasoline, Method: PrimeHandPump, Discharge: DischargeContainer})
	first, ok := c.Current()
	if !ok || first.ID != "hazard.liquid" {
		t.Fatalf("Current = %v %v", first.ID, ok)
	}
	if err := c.Mark("hazard.liquid", StateDone, "", "SDS on file", at); err != nil {
		t.Fatal(err)
	}
	if err := c.Mark("hazard.electrical", StateSkipped, "  ", "", at); !errors.Is(err, ErrReasonRequired) {
		t.Errorf("skip without reason: err = %v, want ErrReasonRequired", err)
	}
	if c.Steps[c.Index("hazard.electrical")].State != StatePending {
		t.Error("failed Mark changed the step")
	}
	if err := c.Mark("hazard.electrical", StateNotApplicable, "", "", time.Time{}); err == nil {
		t.Error("mark without a time accepted")
	}
	if err := c.Mark("no.such", StateDone, "", "", at); !errors.Is(err, ErrUnknownStep) {
		t.Errorf("unknown step: err = %v", err)
	}
	if err := c.Mark("hazard.electrical", "finished", "", "", at); err == nil {
		t.Error("unknown state accepted")
	}
	if err := c.Mark("hazard.electrical", StateSkipped, "no power on site", "", at); err != nil {
		t.Fatal(err)
	}
	if err := c.Mark("hazard.fuel", StateNotApplicable, "", "", at.Add(time.Minute)); err != nil {
		t.Fatal(err)
	}
	cur, _ := c.Current()
	if cur.ID != "hazard.discharge" {
		t.Errorf("Current after three marks = %s", cur.ID)
	}
	p := c.Progress()
	if p.Done != 1 || p.Skipped != 1 || p.NotApplicable != 1 || p.Pending != p.Total-3 || p.Marked() != 3 {
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
	// All marked → no current step.
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
	c := BuildChecklist(ChecklistContext{Hazards: hzDikeWater, Method: PrimeHandPump, ConfinedSpace: true, Discharge: DischargeStorm})
	for _, id := range []string{"hazard.cs.permit", "hazard.cs.oxygen", "hazard.cs.flammable-gas", "hazard.cs.toxic", "hazard.discharge", "setup.inspect-before", "closeout.inspect"} {
		i := c.Index(id)
		if i < 0 || !c.Steps[i].NoteRequired {
			t.Errorf("%s: NoteRequired not set", id)
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
// their zone offset intact.
func TestChecklistJSONRoundTrip(t *testing.T) {
	at := time.Date(2026, 5, 14, 9, 30, 0, 0, time.FixedZone("", -5*3600))
	c := BuildChecklist(ChecklistContext{Liquid: "sewage", Hazards: hzSewage, Method: PrimeSubmerge, ConfinedSpace: true, Discharge: DischargeSewer})
	_ = c.Mark("hazard.liquid", StateDone, "", "grey, septic odour", at)
	_ = c.Mark("hazard.electrical", StateSkipped, "utility confirmed no supply in vault", "", at)
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	var back Checklist
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(c.Context, back.Context) || len(back.Steps) != len(c.Steps) {
		t.Fatalf("round trip changed the checklist")
	}
	for i := range c.Steps {
		a, z := c.Steps[i], back.Steps[i]
		if a.ID != z.ID || a.State != z.State || !a.At.Equal(z.At) || a.Reason != z.Reason || a.Note != z.Note || a.Text != z.Text {
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
	ctx := ChecklistContext{Liquid: "gasoline", Hazards: hzGasoline, Method: PrimeHandPump, Discharge: DischargeContainer}
	c := BuildChecklist(ctx)
	_ = c.Mark("hazard.liquid", StateDone, "", "checked", at)
	_ = c.Mark("setup.bonding", StateDone, "", "clamp on drum rim", at)
	_ = c.Mark("setup.route", StateSkipped, "short straight run", "", at)

	water := ctx
	water.Liquid, water.Hazards = "water", hzPlain
	w := c.Rebuild(water)
	if w.Index("setup.bonding") >= 0 {
		t.Error("bonding step kept for water")
	}
	if s := w.Steps[w.Index("hazard.liquid")]; s.State != StateDone || s.Note != "checked" || !s.At.Equal(at) || !strings.Contains(s.Text, "water") {
		t.Errorf("surviving step lost state or kept old text: %+v", s)
	}
	if s := w.Steps[w.Index("setup.route")]; s.State != StateSkipped || s.Reason != "short straight run" {
		t.Errorf("skipped step lost reason: %+v", s)
	}
	if len(w.Dropped) != 1 || w.Dropped[0].ID != "setup.bonding" {
		t.Fatalf("Dropped = %+v", w.Dropped)
	}
	back := w.Rebuild(ctx)
	if s := back.Steps[back.Index("setup.bonding")]; s.State != StateDone || s.Note != "clamp on drum rim" {
		t.Errorf("bonding mark not restored: %+v", s)
	}
	if len(back.Dropped) != 0 {
		t.Errorf("Dropped after restore = %+v", back.Dropped)
	}
	// Method change: prime steps change, hazard marks stay.
	m := back.Rebuild(ChecklistContext{Liquid: "gasoline", Hazards: hzGasoline, Method: PrimeShakeValve, Discharge: DischargeContainer})
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

func TestHazardsFromTags(t *testing.T) {
	got := HazardsFromTags([]string{"flammable", "nfpa:ib", "environmental", "freezing-risk", "future-tag"})
	want := Hazards{Flammable: true, FlammableClass: "IB", Environmental: true, FreezingRisk: true}
	if got != want {
		t.Errorf("HazardsFromTags = %+v, want %+v", got, want)
	}
	// Gasoline: NFPA 30 class IB (field-practice §3.3).
	p := HazardsFromPresets(presets.Of(presets.Flammable, presets.Volatile, presets.Toxic, presets.Environmental), presets.ClassIB)
	wantP := Hazards{Flammable: true, FlammableClass: "IB", Volatile: true, Toxic: true, Environmental: true}
	if p != wantP {
		t.Errorf("HazardsFromPresets = %+v, want %+v", p, wantP)
	}
	if c := BuildChecklist(ChecklistContext{Hazards: p}); c.Index("hazard.toxic") < 0 || c.Index("setup.bonding") < 0 {
		t.Error("toxic or bonding step missing for hzGasoline from presets")
	}
}

// Methods the catalogue rules out for a hazard get a step saying so (presets
// catalogue priming entries, not_for; common practice).
func TestChecklistMethodUnsuited(t *testing.T) {
	for _, tc := range []struct {
		m    PrimingMethod
		h    Hazards
		want bool
	}{
		{PrimeSubmerge, hzGasoline, true},
		{PrimeSupplyFill, Hazards{Combustible: true}, true},
		{PrimeSubmerge, hzPlain, false},
		{PrimeHandPump, hzGasoline, false},
	} {
		c := BuildChecklist(ChecklistContext{Method: tc.m, Hazards: tc.h})
		if got := c.Index("prime.method-unsuited") >= 0; got != tc.want {
			t.Errorf("%s with %+v: unsuited step %v, want %v", tc.m, tc.h, got, tc.want)
		}
	}
}

func TestChecklistHandPumpStrokes(t *testing.T) {
	c := BuildChecklist(ChecklistContext{Method: PrimeHandPump, Strokes: 14})
	if s := c.Steps[c.Index("prime.pump.stroke")]; !strings.Contains(s.Text, "about 14 strokes") {
		t.Errorf("stroke count not quoted: %q", s.Text)
	}
}

func BenchmarkBuildChecklist(b *testing.B) {
	ctx := ChecklistContext{Hazards: hzGasoline, Method: PrimeHandPump, ConfinedSpace: true, Discharge: DischargeContainer}
	b.ReportAllocs()
	var sink Checklist
	for b.Loop() {
		sink = BuildChecklist(ctx)
	}
	_ = sink
}

// ContextFor takes the liquid's hazards from the catalogue and keeps the
// crew's site facts and extra hazards across a change of liquid. Gasoline is
// NFPA 30 class IB (field-practice §3.3); water has no flammability class.
func TestContextFor(t *testing.T) {
	cat := presets.Builtin()
	j := DemoJob()
	j.Checklist.Context.ExtraHazards = Hazards{Environmental: true}
	j.Checklist.Context.ConfinedSpace = true
	ctx := ContextFor(j, Compute(j, cat))
	if !ctx.Hazards.Environmental || ctx.Hazards.Flammable || !ctx.ConfinedSpace || ctx.Method != PrimeHandPump || ctx.Strokes <= 0 {
		t.Errorf("water in a bund: %+v", ctx)
	}
	_ = j.Set(FieldLiquid, "gasoline")
	_ = j.Set(FieldTemp, "15 C")
	p := Compute(j, cat)
	if !p.Liquid.Valid() {
		t.Skipf("gasoline not in the catalogue: %v", p.Err)
	}
	g := ContextFor(j, p)
	if !g.Hazards.Flammable || g.Hazards.FlammableClass != "IB" || !g.Hazards.Environmental || !g.ConfinedSpace {
		t.Errorf("gasoline: %+v", g.Hazards)
	}
	c := j.Checklist.Rebuild(g)
	if c.Index("setup.bonding") < 0 || c.Index("hazard.cs.oxygen") < 0 {
		t.Error("rebuilt checklist lacks bonding or atmospheric testing")
	}
	_ = j.Set(FieldLiquid, "water")
	if w := ContextFor(j, Compute(j, cat)); w.Hazards.Flammable || w.Hazards.FlammableClass != "" || !w.Hazards.Environmental {
		t.Errorf("back to water: %+v", w.Hazards)
	}
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
		// round trip: the ID parses to itself
		if back, err := ParsePrimingMethod(string(m)); err != nil || back != m {
			t.Errorf("round trip %q: %q %v", m, back, err)
		}
	})
}

// ExampleBuildChecklist counts the steps per section for a gasoline
// transfer into a can with a squeeze bulb.
func ExampleBuildChecklist() {
	c := BuildChecklist(ChecklistContext{
		Liquid:    "gasoline",
		Hazards:   Hazards{Flammable: true, FlammableClass: "IB", Volatile: true, Toxic: true},
		Method:    PrimeHandPump,
		Discharge: DischargeContainer,
	})
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
	fmt.Println("first:", s.ID)
	// Output:
	// Hazard check: 5
	// Set-up: 8
	// Prime: 6
	// Run and watch: 6
	// Stop and drain the hose: 5
	// Close out: 4
	// first: hazard.liquid
}

// A recorded sheen holds the release: no priming, running or release steps,
// only recording, notification and collection (40 CFR 110 sheen rule and
// 40 CFR 112.8(c)(3), field-practice §3.8: "any sheen … do not release;
// collect it for proper disposal"). A transfer into a container is not a
// release and keeps its steps.
func TestChecklistSheenHoldsRelease(t *testing.T) {
	at := time.Date(2026, 3, 14, 7, 50, 0, 0, time.UTC)
	ctx := ChecklistContext{Liquid: "bund water", Hazards: hzDikeWater, Method: PrimeHandPump, Discharge: DischargeStorm}
	c := BuildChecklist(ctx)
	if err := c.Mark("setup.inspect-before", StateDone, "", "rainbow sheen near the sump, 07:48, AM", at); err != nil {
		t.Fatal(err)
	}
	held := c.WithSheen(true)
	if !held.Context.Held() {
		t.Fatal("not held")
	}
	for _, s := range held.Steps {
		if s.Section == SectionRun || (s.Section == SectionPrime && s.ID != "hold.no-release") || strings.HasPrefix(s.ID, "prime.") {
			t.Errorf("release step %s kept while held", s.ID)
		}
	}
	for _, id := range []string{"hold.no-release", "hold.record", "hold.notify", "hold.collect", "closeout.reseal", "setup.inspect-before"} {
		if held.Index(id) < 0 {
			t.Errorf("held checklist lacks %s", id)
		}
	}
	if s := held.Steps[held.Index("setup.inspect-before")]; s.State != StateDone || !strings.Contains(s.Note, "sheen") {
		t.Errorf("inspection mark lost: %+v", s)
	}
	ctx.Discharge = DischargeContainer
	ctx.SheenSeen = true
	if k := BuildChecklist(ctx); k.Context.Held() || k.Index("prime.pump.stroke") < 0 {
		t.Error("transfer to a container held")
	}
	if back := held.WithSheen(false); back.Index("prime.pump.stroke") < 0 || back.Index("hold.no-release") >= 0 {
		t.Error("clearing the sheen flag did not restore the release steps")
	}
}
