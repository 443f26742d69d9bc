package model

import (
	"reflect"
	"strconv"
	"strings"
	"testing"
	"time"

	"drawdown/presets"
)

// Each case: a job as a crew would state it, the steps a rule asks for and
// the steps that must not appear, with the rule named.
func TestChecklistRuleSteps(t *testing.T) {
	cases := []struct {
		name           string
		liquid, temp   string
		method         PrimingMethod
		facts          SiteFacts
		want, absent   []string
		source         string
		wantRule       string // a rule family that must be named on a step
		wantText, step string // text that step must hold
	}{
		{name: "gasoline: bonding, static hose, slow fill, ignition, containers",
			liquid: "gasoline", temp: "15 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeContainer},
			want:   []string{"setup.bonding", "setup.hose-static", "run.slow-fill", "setup.ignition", "setup.containers", "setup.drain-cover", "prime.no-pressure", "stop.unbond", "closeout.store", "hazard.fuel"},
			absent: []string{"setup.outlet-protection", "setup.inspect-before", "run.sheen", "closeout.inspect", "hazard.ppe.sewage"},
			source: "NFPA 77; OSHA 29 CFR 1910.106(e)(6)(ii) (field-practice §3.3)", wantRule: "NFPA 77",
			step: "hazard.fuel", wantText: "class IB"},
		{name: "diesel: a static accumulator, bonded like gasoline",
			liquid: "diesel", temp: "15 C", method: PrimeShakeValve, facts: SiteFacts{Discharge: DischargeContainer},
			want:   []string{"setup.bonding", "setup.hose-static", "run.slow-fill", "setup.ignition", "hazard.fuel"},
			absent: []string{"setup.inspect-before", "run.sheen"},
			source: "NFPA 77 (static accumulators, from memory); NFPA 30 class II (field-practice §3.3)", wantRule: "NFPA 30",
			step: "setup.bonding", wantText: "static accumulator"},
		{name: "diesel at 48 °C: within 9 °C of its 52 °C flash point, treated as flammable",
			liquid: "diesel", temp: "48 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeContainer},
			want:   []string{"hazard.fuel", "setup.bonding"},
			source: "NFPA 30 advice via field-practice §3.3; ASTM D975 flash point 52 °C (presets)",
			step:   "hazard.fuel", wantText: "Diesel fuel at 48 °C is within 9 °C of its flash point (52 °C): treat it as flammable"},
		{name: "water at 70 °C: hot-liquid step",
			liquid: "water", temp: "70 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeSewer},
			want:   []string{"hazard.hot"},
			source: "common practice; presets.HotThreshold 50 °C", step: "hazard.hot", wantText: "Hot liquid (70 °C)"},
		{name: "rain in an oil bund: inspect before release, watch for a sheen, inspect after, reseal, release record",
			liquid: "water", temp: "8 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeStorm, MayCarryOil: true},
			want:   []string{"setup.inspect-before", "run.sheen", "closeout.inspect", "closeout.reseal", "closeout.release-record", "setup.outlet-protection"},
			absent: []string{"setup.bonding", "hazard.ppe.sewage"},
			source: "EPA 40 CFR 112.8(c)(3); 40 CFR 110 (field-practice §3.8)", wantRule: "40 CFR 112.8(c)(3)"},
		{name: "catalogue containment water: the sheen rule without the crew's flag",
			liquid: "bund-water", temp: "8 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeStorm},
			want:   []string{"setup.inspect-before", "run.sheen"},
			source: "40 CFR 112.8(c)(3) (field-practice §3.8)"},
		{name: "sewage: PPE, vaccinations, H2S, dedicated hose, decontamination, no sheen rule",
			liquid: "wastewater", temp: "12 C", method: PrimePumpStart, facts: SiteFacts{Discharge: DischargeSewer, MayCarryOil: true},
			want:   []string{"hazard.ppe.sewage", "hazard.sewage.vaccination", "hazard.sewage.h2s", "setup.hose.dedicated", "closeout.decon"},
			absent: []string{"setup.inspect-before", "run.sheen", "closeout.inspect"},
			source: "CDC, Handling Human Waste or Sewage; AIHA; NIOSH FACE H₂S reports (field-practice §3.1, §3.4)", wantRule: "CDC",
			step: "hazard.sewage.vaccination", wantText: "hepatitis A"},
		{name: "confined vault worked from outside: permit, outside path, isolation, exhaust, tests, second person, rescue call, monitoring",
			liquid: "water", temp: "10 C", method: PrimeHandPump, facts: SiteFacts{ConfinedSpace: true, Discharge: DischargeSewer},
			want:   []string{"hazard.cs.permit", "hazard.cs.outside", "hazard.cs.isolate", "hazard.cs.exhaust", "hazard.cs.oxygen", "hazard.cs.flammable-gas", "hazard.cs.toxic", "hazard.cs.attendant", "hazard.cs.rescue", "run.atmosphere", "closeout.permit"},
			absent: []string{"hazard.cs.ventilate", "hazard.cs.retrieval"},
			source: "OSHA 29 CFR 1910.146 and its 1995 breaking-the-plane interpretation (field-practice §3.1)", wantRule: "1910.146"},
		{name: "confined vault with entry: ventilation, retrieval, attendant, rescue service",
			liquid: "water", temp: "10 C", method: PrimeHandPump, facts: SiteFacts{ConfinedSpace: true, Entry: true, Discharge: DischargeSewer},
			want:   []string{"hazard.cs.permit", "hazard.cs.ventilate", "hazard.cs.retrieval", "hazard.cs.attendant", "hazard.cs.rescue", "run.atmosphere"},
			absent: []string{"hazard.cs.outside"},
			source: "OSHA 29 CFR 1910.146(c)(5), (k)(3) (from memory); NIOSH Alert 86-110", wantRule: "(k)(3)",
			step: "hazard.cs.retrieval", wantText: "vertical entry"},
		{name: "hands in the liquid inside a confined space is entry",
			liquid: "water", temp: "10 C", method: PrimeSubmerge, facts: SiteFacts{ConfinedSpace: true, Entry: true},
			want:   []string{"hazard.cs.retrieval", "prime.submerge.fill"},
			source: "OSHA interpretation of 18 Oct 1995: reaching in is entry (field-practice §3.1)"},
		{name: "pond: edge, flotation, ring buoy, never alone",
			liquid: "water", temp: "15 C", method: PrimeCrestPort, facts: SiteFacts{OpenWater: true, Discharge: DischargeStorm},
			want:   []string{"hazard.edge", "hazard.water.flotation", "hazard.water.buoy", "hazard.water.alone", "prime.crest.fill"},
			source: "MSHA water-hazard alert; common practice (field-practice §3.6)", wantRule: "MSHA",
			step: "setup.intake", wantText: "trap a person"},
		{name: "freezing night: frost from the air, overnight frost step, hose drained",
			liquid: "water", temp: "6 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeStorm, AirTemp: "-4 C", Overnight: true},
			want:   []string{"setup.freezing", "run.overnight", "run.overnight-frost"},
			source: "common practice; presets.FreezeMargin 5 K (our choice)",
			step:   "stop.drain-hose", wantText: "completely so it cannot freeze"},
		{name: "overnight, air temperature not given: check the forecast low",
			liquid: "water", temp: "15 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeStorm, Overnight: true},
			want: []string{"run.overnight", "run.overnight-frost"}, absent: []string{"setup.freezing"},
			source: "common practice", step: "run.overnight-frost", wantText: "forecast"},
		{name: "fuel overnight: never left unattended",
			liquid: "diesel", temp: "15 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeContainer, Overnight: true},
			source: "field-practice §2.9 (never walk away from a fuel transfer)", step: "run.overnight", wantText: "never left to run unattended"},
		{name: "clean-supply fill: backflow caution",
			liquid: "water", temp: "15 C", method: PrimeSupplyFill, facts: SiteFacts{Discharge: DischargeSewer},
			want:   []string{"prime.supply.fill"},
			source: "local cross-connection control programs, e.g. City of Bremerton (field-practice §3.9)", wantRule: "cross-connection"},
		{name: "plain water to a storm drain: nothing of fuel, sewage, sheen or confined space",
			liquid: "water", temp: "15 C", method: PrimeHandPump, facts: SiteFacts{Discharge: DischargeStorm},
			want:   []string{"prime.no-mouth", "setup.outlet-protection"},
			absent: []string{"setup.bonding", "setup.ignition", "setup.containers", "prime.no-pressure", "stop.unbond", "hazard.fuel", "hazard.ppe.sewage", "closeout.decon", "setup.inspect-before", "closeout.inspect", "hazard.cs.permit", "hazard.edge", "setup.containment", "run.overnight", "setup.freezing"},
			source: "field-practice §3 (steps that do not apply are left out)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := built(siteJob(tc.liquid, tc.temp, tc.method, tc.facts))
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
			if tc.wantRule != "" {
				found := false
				for _, s := range c.Steps {
					found = found || strings.Contains(s.Rule, tc.wantRule)
				}
				if !found {
					t.Errorf("no step names rule %q (source: %s)", tc.wantRule, tc.source)
				}
			}
			if tc.step != "" {
				i := c.Index(tc.step)
				if i < 0 {
					t.Fatalf("missing step %s (source: %s)", tc.step, tc.source)
				}
				if s := c.Steps[i]; !strings.Contains(s.Text+" "+s.Caution, tc.wantText) {
					t.Errorf("%s: %q / %q lacks %q (source: %s)", tc.step, s.Text, s.Caution, tc.wantText, tc.source)
				}
			}
		})
	}
}

// The property test of issue 12 §8, over every catalogue liquid × every
// method (and none) × every combination of the site facts:
//   - no flammable liquid gets a mouth-priming, supply-fill or open-flame
//     step (poison-centre warnings, field-practice §3.2; NFPA 30 and §3.3;
//     the only step naming the mouth is the standing prohibition, the only
//     one naming flames forbids them);
//   - every confined space gets permit, test (O₂, flammable, toxic) and
//     attendant steps (OSHA 29 CFR 1910.146; field-practice §3.1);
//   - no step directs a fuel or a transfer to a storm drain or the ground
//     (issue 12 contract);
//   - the sheen rule never applies to a fuel or to sewage (field-practice
//     §3.8: the rule is for water that may carry oil);
//   - no unsuited method's procedure is listed (MethodSuits).
func TestChecklistProperties(t *testing.T) {
	releaseSteps := []string{"setup.outlet-protection"}
	directing := []string{"discharge to the storm drain or ground is allowed", "Land the discharge", "vegetated ground"}
	sheenSteps := []string{"setup.inspect-before", "run.sheen", "closeout.inspect"}
	n := 0
	for _, liq := range testCat.Liquids() {
		base := siteJob(liq.ID, "15 C", "", SiteFacts{})
		p := Compute(base, testCat)
		if !p.Liquid.Valid() {
			t.Fatalf("%s: no plan at 15 °C: %v", liq.ID, p.Err)
		}
		for _, m := range append(PrimingMethods(), "") {
			j := base.Clone()
			j.Inputs[FieldPriming] = string(m)
			for bits := 0; bits < 1<<7; bits++ {
				for _, d := range append(Discharges(), "") {
					j.Facts = SiteFacts{ConfinedSpace: bits&1 != 0, Entry: bits&2 != 0, OpenWater: bits&4 != 0,
						MayCarryOil: bits&8 != 0, Overnight: bits&16 != 0, SheenSeen: bits&32 != 0, Discharge: d}
					if bits&64 != 0 {
						j.Facts.AirTemp = "-5 C"
					}
					ctx := ContextFor(j, p)
					c := BuildChecklist(ctx)
					n++
					checkProperties(t, liq.ID, m, ctx, c, releaseSteps, directing, sheenSteps)
				}
			}
		}
	}
	t.Logf("%d checklists checked", n)
}

func checkProperties(t *testing.T, liq string, m PrimingMethod, ctx ChecklistContext, c Checklist, releaseSteps, directing, sheenSteps []string) {
	t.Helper()
	where := func() string { return liq + "/" + string(m) + "/" + strconv.Quote(string(ctx.Discharge)) }
	flammable := ctx.has(presets.Flammable)
	mouthSeen := false
	for _, s := range c.Steps {
		text := strings.ToLower(s.Text)
		if strings.Contains(text, "mouth") || strings.Contains(text, "suck") {
			if s.ID != "prime.no-mouth" || !strings.Contains(text, "never") {
				t.Fatalf("%s: step %q mentions the mouth: %q", where(), s.Title, s.Text)
			}
			mouthSeen = true
		}
		if flammable && strings.Contains(text, "flame") && !strings.Contains(text, "no smoking, flames") {
			t.Fatalf("%s: step %q mentions flames: %q", where(), s.Title, s.Text)
		}
		if flammable && strings.HasPrefix(s.ID, "prime.supply.") {
			t.Fatalf("%s: supply-fill step for a flammable liquid", where())
		}
		if ctx.Fuel() || ctx.Transfer {
			for _, d := range directing {
				if strings.Contains(s.Text, d) {
					t.Fatalf("%s: step %q directs a fuel or transfer to a drain or the ground: %q", where(), s.Title, s.Text)
				}
			}
		}
	}
	if !ctx.Held() && !mouthSeen {
		t.Fatalf("%s: the standing never-by-mouth step is missing", where())
	}
	ids := stepIDs(c)
	if ctx.ConfinedSpace {
		for _, id := range []string{"hazard.cs.permit", "hazard.cs.oxygen", "hazard.cs.flammable-gas", "hazard.cs.toxic", "hazard.cs.attendant"} {
			if !ids[id] {
				t.Fatalf("%s: confined space without %s", where(), id)
			}
		}
	}
	if ctx.Fuel() || ctx.Transfer {
		for _, id := range releaseSteps {
			if ids[id] {
				t.Fatalf("%s: %s for a fuel or transfer", where(), id)
			}
		}
	}
	if ctx.Fuel() || ctx.has(presets.Biohazard) {
		for _, id := range sheenSteps {
			if ids[id] {
				t.Fatalf("%s: sheen step %s for a fuel or sewage", where(), id)
			}
		}
	}
	if ok, _ := MethodSuits(m, ctx); !ok {
		for id := range ids {
			if strings.HasPrefix(id, "prime.") && id != "prime.method-unsuited" && id != "prime.no-mouth" && id != "prime.no-pressure" {
				t.Fatalf("%s: unsuited method's step %s listed", where(), id)
			}
		}
	}
}

// MethodSuits: the cases issue 12 names (every method offered for gasoline;
// submerge-and-cap for a 12 m hose in the 8 × 5 m demo bund, 9.4 m across,
// and for the catalogue's 0.9 m sump pit), and the rules of the catalogue's
// priming entries (not_for; common practice).
func TestMethodSuits(t *testing.T) {
	gas := ctxOf(siteJob("gasoline", "15 C", "", SiteFacts{}))
	want := map[PrimingMethod]bool{PrimeSubmerge: false, PrimeSupplyFill: false, PrimeCrestPort: false, PrimeVacuum: false,
		PrimeHandPump: true, PrimeShakeValve: true, PrimePumpStart: true}
	for m, ok := range want {
		if got, why := MethodSuits(m, gas); got != ok || (!got && why == "") {
			t.Errorf("gasoline, %s: %v %q, want %v with a reason", m, got, why, ok)
		}
	}
	if got := SuitedMethods(gas); !reflect.DeepEqual(got, []PrimingMethod{PrimeHandPump, PrimeShakeValve, PrimePumpStart}) {
		t.Errorf("SuitedMethods(gasoline) = %v", got)
	}
	for _, m := range []PrimingMethod{PrimeSupplyFill, PrimeCrestPort} {
		if ok, _ := MethodSuits(m, ctxOf(siteJob("diesel", "15 C", "", SiteFacts{}))); ok {
			t.Errorf("diesel, %s suits", m)
		}
	}
	demo := DemoJob()
	_ = demo.Set(FieldPriming, string(PrimeSubmerge))
	if ok, why := MethodSuits(PrimeSubmerge, ctxOf(demo)); ok || why != "the 12 m hose is longer than the source is across (9.43 m), so it cannot lie under the surface" {
		t.Errorf("12 m hose in the demo bund: %v %q", ok, why)
	}
	sump := siteJob("water", "10 C", PrimeSubmerge, SiteFacts{})
	if tk, ok := testCat.Tank("sump-pit"); ok {
		sump.ApplyTankPreset(tk)
	} else {
		t.Fatal("catalogue has no sump-pit")
	}
	_ = sump.Set(FieldTankLevel, "0.8 m")
	sc := ctxOf(sump)
	if !sc.ConfinedSpace {
		t.Error("the catalogue sump pit did not pre-set the confined-space fact")
	}
	if ok, why := MethodSuits(PrimeSubmerge, sc); ok || !strings.Contains(why, "0.9") {
		t.Errorf("0.9 m sump: %v %q", ok, why)
	}
	pond := siteJob("water", "15 C", PrimeSubmerge, SiteFacts{})
	if tk, ok := testCat.Tank("farm-pond"); ok {
		pond.ApplyTankPreset(tk)
	}
	_ = pond.Set(FieldTankLevel, "1 m")
	if ok, why := MethodSuits(PrimeSubmerge, ctxOf(pond)); !ok {
		t.Errorf("8 m hose in a farm pond: %q", why)
	}
	outside := ctxOf(siteJob("water", "15 C", PrimeSubmerge, SiteFacts{ConfinedSpace: true}))
	if ok, why := MethodSuits(PrimeSubmerge, outside); ok || !strings.Contains(why, "which is entry") {
		t.Errorf("hands in a confined space worked from outside: %v %q", ok, why)
	}
	if !outside.Entering {
		t.Error("hands in the liquid inside a confined space does not count as entry")
	}
	c := BuildChecklist(outside)
	if c.Index("prime.method-unsuited") < 0 || c.Index("prime.submerge.fill") >= 0 {
		t.Error("an unsuited method's procedure is listed")
	}
	if ok, _ := MethodSuits(PrimeHandPump, outside); !ok {
		t.Error("hand pump unsuited from outside")
	}
}

// Step text quotes the live plan: after the hose changes, the hand-pump
// step quotes the new plan's stroke count (issue 12: "about 46 strokes"
// while the plan said 17).
func TestChecklistQuotesLivePlan(t *testing.T) {
	j := DemoJob()
	for _, hose := range []string{"38 mm", "25 mm", "50 mm"} {
		_ = j.Set(FieldHoseID, hose)
		p := Compute(j, testCat)
		j.RebuildChecklist(p)
		s := j.Checklist.Steps[j.Checklist.Index("prime.pump.stroke")]
		want := "about " + strconv.Itoa(p.PumpStrokes) + " strokes"
		if p.PumpStrokes <= 0 || !strings.Contains(s.Text, want) {
			t.Errorf("%s hose: plan %d strokes, step says %q", hose, p.PumpStrokes, s.Text)
		}
	}
}

// Hazards from one place (issue 12 §3): walk every catalogue liquid down
// the list, back up it, and down again, rebuilding after each change and
// marking steps on the way; at each stop the checklist equals a fresh build
// for that liquid (apart from marks): no sticky biohazard, no missing step.
func TestChecklistLiquidWalk(t *testing.T) {
	at := time.Date(2026, 3, 14, 8, 0, 0, 0, time.UTC)
	var ids []string
	for _, l := range testCat.Liquids() {
		ids = append(ids, l.ID)
	}
	var walk []string
	walk = append(walk, ids...)
	for i := len(ids) - 2; i >= 0; i-- {
		walk = append(walk, ids[i])
	}
	walk = append(walk, ids[1:]...)
	facts := SiteFacts{Discharge: DischargeContainer, MayCarryOil: true}
	j := siteJob("water", "15 C", PrimeHandPump, facts)
	j.RebuildChecklist(Compute(j, testCat))
	for k, id := range walk {
		_ = j.Set(FieldLiquid, id)
		j.RebuildChecklist(Compute(j, testCat))
		fresh := built(siteJob(id, "15 C", PrimeHandPump, facts))
		if got, want := unmarked(j.Checklist.Steps), unmarked(fresh.Steps); !reflect.DeepEqual(got, want) {
			t.Fatalf("stop %d (%s): walked checklist differs from a fresh build:\n got %v\nwant %v", k, id, titles(got), titles(want))
		}
		if !reflect.DeepEqual(j.Checklist.Context, fresh.Context) {
			t.Fatalf("stop %d (%s): context differs:\n%+v\n%+v", k, id, j.Checklist.Context, fresh.Context)
		}
		// Mark a step that depends on the liquid, so Dropped is exercised.
		if i := j.Checklist.CurrentIndex(); i >= 0 {
			s := j.Checklist.Steps[i]
			if err := j.Mark(s.ID, StateDone, "", "seen at stop "+strconv.Itoa(k), at); err != nil {
				t.Fatal(err)
			}
		}
	}
	// Temperature back and forth: water at 70 °C gets its hot step, and
	// loses it at 15 °C; diesel at 48 °C is treated as flammable.
	_ = j.Set(FieldLiquid, "water")
	for _, tc := range []struct {
		liquid, temp, step string
		want               bool
	}{{"water", "70 C", "hazard.hot", true}, {"water", "15 C", "hazard.hot", false}, {"water", "70 C", "hazard.hot", true}} {
		_ = j.Set(FieldLiquid, tc.liquid)
		_ = j.Set(FieldTemp, tc.temp)
		j.RebuildChecklist(Compute(j, testCat))
		if got := j.Checklist.Index(tc.step) >= 0; got != tc.want {
			t.Errorf("%s at %s: %s present %v", tc.liquid, tc.temp, tc.step, got)
		}
	}
	_ = j.Set(FieldLiquid, "diesel")
	_ = j.Set(FieldTemp, "48 C")
	j.RebuildChecklist(Compute(j, testCat))
	if !j.Checklist.Context.has(presets.Flammable) || !strings.Contains(j.Checklist.Steps[j.Checklist.Index("hazard.fuel")].Caution, "treat it as flammable") {
		t.Error("diesel at 48 °C not treated as flammable")
	}
}

// unmarked strips the marks from steps (state, time, reason, note).
func unmarked(steps []Step) []Step {
	out := make([]Step, len(steps))
	for i, s := range steps {
		s.State, s.At, s.Reason, s.Note = StatePending, time.Time{}, "", ""
		out[i] = s
	}
	return out
}

func titles(steps []Step) []string {
	var out []string
	for _, s := range steps {
		out = append(out, s.Title)
	}
	return out
}

// A recorded sheen holds the release: no priming, running or release steps,
// only recording, notification and collection (40 CFR 110 sheen rule and
// 40 CFR 112.8(c)(3), field-practice §3.8: "any sheen … do not release;
// collect it for proper disposal"). A transfer into a vessel is not a
// release and keeps its steps. A fuel meant for a storm drain is held too.
func TestChecklistHolds(t *testing.T) {
	at := time.Date(2026, 3, 14, 7, 50, 0, 0, time.UTC)
	j := DemoJob()
	if err := j.Mark("setup.inspect-before", StateDone, "", "rainbow sheen near the sump, 07:48, AM", at); err != nil {
		t.Fatal(err)
	}
	if err := j.RecordSheen("rainbow sheen near the sump", at); err != nil {
		t.Fatal(err)
	}
	j.RebuildChecklist(Compute(j, testCat))
	held := j.Checklist
	if !held.Context.Held() {
		t.Fatal("not held")
	}
	for _, s := range held.Steps {
		if s.Section == SectionRun || strings.HasPrefix(s.ID, "prime.") {
			t.Errorf("release step %q kept while held", s.Title)
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
	if err := j.ClearSheen("", at); err == nil {
		t.Error("sheen withdrawn without a reason")
	}
	if err := j.ClearSheen("it was a leaf film; checked again with the supervisor", at); err != nil {
		t.Fatal(err)
	}
	j.RebuildChecklist(Compute(j, testCat))
	if c := j.Checklist; c.Index("prime.pump.stroke") < 0 || c.Index("hold.no-release") >= 0 {
		t.Error("withdrawing the sheen did not restore the release steps")
	}
	k := siteJob("water", "10 C", PrimeHandPump, SiteFacts{Discharge: DischargeContainer, SheenSeen: true})
	if c := built(k); c.Context.Held() || c.Index("prime.pump.stroke") < 0 {
		t.Error("transfer to a container held")
	}
	for _, d := range []Discharge{DischargeStorm, DischargeSewer} {
		c := built(siteJob("gasoline", "15 C", PrimeHandPump, SiteFacts{Discharge: d}))
		if !c.Context.Held() || c.Index("hold.no-release") < 0 || c.Index("prime.pump.stroke") >= 0 {
			t.Errorf("gasoline to the %s not held", d.Label())
		}
	}
	if c := built(siteJob("wastewater", "15 C", PrimeHandPump, SiteFacts{Discharge: DischargeStorm})); !c.Context.Held() {
		t.Error("sewage to a storm drain not held")
	}
}

// ContextFor derives everything from the job as it is: a receiving vessel
// makes a transfer, a fuel with no discharge stated goes to a container, the
// air sets the freezing risk, and nothing carries over from the context the
// checklist was built from before.
func TestContextFor(t *testing.T) {
	j := siteJob("gasoline", "15 C", PrimeHandPump, SiteFacts{})
	g := ctxOf(j)
	if g.Discharge != DischargeContainer || !g.Transfer || g.Class != presets.ClassIB || !g.Fuel() {
		t.Errorf("gasoline with no discharge stated: %+v", g)
	}
	j.Checklist = BuildChecklist(ChecklistContext{Hazards: presets.Of(presets.Biohazard), SiteFacts: SiteFacts{ConfinedSpace: true}})
	_ = j.Set(FieldLiquid, "water")
	w := ctxOf(j)
	if w.Hazards != 0 || w.ConfinedSpace || w.Class != presets.NoFlashClass || w.Discharge != "" {
		t.Errorf("water after a stale context: %+v", w)
	}
	j.Facts.AirTemp = "30 F"
	if f := ctxOf(j); !f.has(presets.FreezingRisk) || !f.Figures.HasAirTemp {
		t.Errorf("air at 30 °F: %+v", f)
	}
	j.Facts.AirTemp = "12 C"
	if f := ctxOf(j); f.has(presets.FreezingRisk) {
		t.Errorf("air at 12 °C: %+v", f)
	}
	// A receiving vessel in the plan makes the job a transfer whatever
	// discharge was stated.
	tr := siteJob("water", "15 C", PrimeHandPump, SiteFacts{Discharge: DischargeStorm})
	for id, v := range map[FieldID]string{FieldTankShape: "vertical-cylinder", FieldTankDiameter: "0.6 m", FieldTankLevel: "0.8 m",
		FieldReceiverShape: "vertical-cylinder", ReceiverField("diameter"): "0.6 m", ReceiverField("height"): "0.9 m", FieldReceiverFloor: "-1.5 m"} {
		tr.Inputs[id] = v
	}
	rc := ctxOf(tr)
	if !rc.Transfer || rc.Discharge != DischargeContainer {
		t.Errorf("receiver in the plan: %+v (plan err %v)", rc, Compute(tr, testCat).Err)
	}
	if c := BuildChecklist(rc); c.Index("setup.outlet-protection") >= 0 || c.Index("setup.receiver") < 0 {
		t.Error("a transfer got the storm-drain outlet step or lacks the receiver step")
	}
}
