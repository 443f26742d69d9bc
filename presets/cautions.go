package presets

// The standing cautions: the sentences every reader repeats (the screen, the
// command line, the checklist and the record). They live here, at the floor
// of the house that the checklist content and the presentation layer both
// build on, so that each is written once. NeverByMouth is in hose.go beside
// the priming methods it governs.
const (
	// DeferLocal closes a checklist caution or a hazard line: the tool
	// plans; the site's rules decide.
	DeferLocal = "Local codes, permits and the site's written program govern."

	// DeferLocalShort is DeferLocal where a screen line has no room.
	DeferLocalShort = "Local codes and permits govern."

	// PlanNotPermit closes the command line's text output and the screen's
	// help: what the tool is and is not.
	PlanNotPermit = "drawdown plans and records; it does not authorise a discharge or an entry. " +
		"Local codes, permits and licensed practice govern."

	// RecordDisclaimer closes every job record.
	RecordDisclaimer = "This record plans and records the job. It does not authorise a discharge " +
		"and does not declare any space, liquid or discharge safe; local codes, permits, the site's " +
		"written program and licensed practice govern."

	// NotAuthorised is the close-out reminder that recording a release is
	// not permission for it.
	NotAuthorised = "This record does not authorise a discharge."

	// FlammableLocalCode is added to the cautions of a flammable liquid
	// whose catalogue note does not already say it.
	FlammableLocalCode = "Whether a hose siphon may be used for this liquid at a workplace is a question " +
		"for local fire code and the employer (OSHA 29 CFR 1910.106, NFPA 30, NFPA 77)."
)
