// Package present words and formats what a plan means, once, for every
// reader: the screen (package tui), the command line's text output and the
// job record (package record). A Sheet is built from a model.Plan after each
// recompute; readers lay it out and never decide or word anything themselves.
//
// It owns:
//
//   - the verdict as a word, a status and a reason, and what to change;
//   - the one crest status every view shows (Result, side view, record);
//   - stop reasons, short (a screen line) and long (a sentence);
//   - warnings, short and long, in the technician's unit system;
//   - hazard words and the cautions that go with a plan, and the standing
//     cautions every reader repeats (never by mouth, the tool does not
//     authorise, local codes govern);
//   - figures with their units and precision (through model.Format), ranges,
//     durations and the one minus sign.
//
// Drawn views that need numbers to lay out (the side view, the curve) read
// the typed quantities of the model.Plan itself; their words and statuses
// come from here.
//
// present imports model, calc and presets and the standard library. It must
// not import tui or the command line.
package present
