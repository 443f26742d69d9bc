// Package calc is the siphon and drain physics of drawdown: pure functions over
// SI units with no I/O and no user interface.
//
// It owns liquid water properties (IAPWS-IF97, IAPWS 2008 viscosity), the
// barometric pressure of the U.S. Standard Atmosphere 1976, the Darcy friction
// factor (Colebrook–White, Hagen–Poiseuille, a documented transition), the
// steady siphon solver (Solve) with its crest limits and choked running
// (crest.go), intake kinds and their air-starts and prime-lost levels
// (intake.go), the air-clearing check, hose collapse (collapse.go) and the
// fixes a verdict names, tank geometry and the quasi-steady drain plan
// (PlanDrain: drain.go, drainrun.go, events.go, flowtable.go, pathmap.go,
// quadrature.go, rootfind.go).
//
// calc imports only the standard library. It must not import model, presets or
// tui. Every exported entry point validates its input and returns an error (a
// *RangeError naming the quantity and the accepted range) instead of NaN, Inf or
// a panic. Panics are reserved for programmer errors and start with "calc: ".
package calc
