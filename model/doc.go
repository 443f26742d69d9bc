// Package model is the technician's job in drawdown: the inputs exactly as
// typed, the unit system, the checklist state, field readings and the log,
// and their persistence in a versioned file of our own.
//
// It owns the unit-suffix parser and formatter (units.go), the table of input
// fields with their accepted ranges (fields.go), the Job and its JSON file
// (job.go, store.go), the checklist, the readings and the job record.
//
// model imports calc and presets and the standard library. It must not import
// tui or anything that draws a screen; the command line (package main) sits
// on top of it. Persistence works on io.Reader and io.Writer; the file helpers
// in store.go write atomically and never overwrite a file they cannot read.
package model
