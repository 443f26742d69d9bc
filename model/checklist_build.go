package model

import "drawdown/presets"

// Rule families named beside each step (as field-practice §3 and its sources
// name them; the review of every step against them is
// testdata/checklists/REVIEW.md at the top of the repository).
const (
	ruleConfined    = "OSHA 29 CFR 1910.146; 29 CFR 1926 Subpart AA"
	ruleEntryPlane  = "OSHA 29 CFR 1910.146 (interpretation of 18 Oct 1995: breaking the plane is entry)"
	ruleAtmosphere  = "OSHA 29 CFR 1910.146 (atmospheric testing order)"
	ruleIsolation   = "OSHA 29 CFR 1910.146(d)(3); 29 CFR 1910.147 (lockout/tagout)"
	ruleVentilation = "OSHA 29 CFR 1910.146(c)(5) (continuous forced-air ventilation)"
	ruleRetrieval   = "OSHA 29 CFR 1910.146(k)(3) (retrieval systems)"
	ruleRescue      = "OSHA 29 CFR 1910.146(k); NIOSH Alert 86-110"
	ruleExhaust     = "NIOSH Alert 86-110; common practice"
	ruleFlammable   = "NFPA 30; OSHA 29 CFR 1910.106"
	ruleBonding     = "NFPA 77; OSHA 29 CFR 1910.106(e)(6)(ii)"
	ruleStatic      = "NFPA 77 (static electricity)"
	ruleContainers  = "NFPA 77; NIOSH 98-111"
	ruleSewage      = "CDC guidance for workers handling human waste or sewage"
	ruleVaccination = "wastewater employers' practice (AIHA Synergist); CDC guidance"
	ruleH2S         = "NIOSH FACE reports (hydrogen sulfide in sewers and vaults)"
	ruleSPCC        = "EPA 40 CFR 112.8(c)(3)"
	ruleSheen       = "EPA 40 CFR 110 (sheen rule); 40 CFR 112.8(c)(3)"
	ruleElectrical  = "electrical safety guidance for flooded spaces"
	ruleWater       = "MSHA water-hazard guidance; common practice"
	ruleBackflow    = "local cross-connection control program"
	ruleStormwater  = "MS4 / NPDES permits; construction stormwater permit"
	ruleSewer       = "local sewer-use ordinance"
	ruleMouth       = "poison-centre warnings; common practice"
	rulePractice    = "common practice"
)

// deferLocal closes the cautions that defer to the site's rules.
const deferLocal = presets.DeferLocal

// BuildChecklist generates the steps for ctx, all pending, in section order.
// It is pure: no clock, no I/O. Steps that do not apply to the liquid, the
// method or the site are left out. With no method chosen the prime section
// holds the standing caution and a step asking for a method; with a method
// that does not suit the job (MethodSuits), a step saying why instead of
// its procedure. When the release is held (ChecklistContext.HoldReason) the
// prime, run and stop sections give way to the do-not-release branch.
//
// Most callers want Job.RebuildChecklist, which derives the context
// (ContextFor) and keeps the recorded marks (Checklist.Rebuild).
func BuildChecklist(ctx ChecklistContext) Checklist {
	b := &builder{}
	b.hazardSection(ctx)
	b.setupSection(ctx)
	if ctx.Held() {
		b.heldSteps(ctx)
		return Checklist{Context: ctx, Steps: b.steps}
	}
	b.primeSection(ctx)
	b.runSection(ctx)
	b.stopSection(ctx)
	b.closeOutSection(ctx)
	return Checklist{Context: ctx, Steps: b.steps}
}

// builder collects the steps of one build.
type builder struct{ steps []Step }

// add appends a pending step. A step whose rule is a regulation or published
// guidance (anything but plain common practice) is Required: marking it not
// applicable needs a reason.
func (b *builder) add(sec Section, id, title, text, caution, rule string) {
	b.steps = append(b.steps, Step{ID: id, Section: sec, Title: title, Text: text, Caution: caution, Rule: rule,
		Required: rule != rulePractice, State: StatePending})
}

// needNote marks the last added step as needing a note to be done; such a
// step is also Required.
func (b *builder) needNote() {
	s := &b.steps[len(b.steps)-1]
	s.NoteRequired, s.Required = true, true
}

// must marks the last added step Required although its rule is common
// practice.
func (b *builder) must() { b.steps[len(b.steps)-1].Required = true }
