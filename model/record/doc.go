// Package record writes the job record: a Markdown document a supervisor or
// a compliance officer can read on its own, long after the job
// (field-practice §5: identity, times with their zone, what went where,
// condition checks, quantities, safety steps, exceptions, sign-off), and a
// CSV of the level readings against the plan.
//
// It lays out what package present words: the verdict, stop reasons,
// warnings, figures and cautions read the same as on the screen and the
// command line. Both documents are written from an Input to an io.Writer;
// nothing here reads a clock or a file (the caller writes atomically).
//
// record imports model, present, calc and presets. The screen and the
// command line import it; it must import neither.
package record
