// Package calc is the siphon and drain physics of drawdown: pure functions over
// SI units with no I/O and no user interface.
//
// It owns liquid water properties (IAPWS-IF97, IAPWS 2008 viscosity), the
// barometric pressure of the U.S. Standard Atmosphere 1976, the Darcy friction
// factor (Colebrook–White, Hagen–Poiseuille, a documented transition), the
// steady siphon solver with its crest, air and intake checks, tank geometry and
// the quasi-steady drain plan.
//
// calc imports only the standard library. It must not import model, presets or
// tui. Every exported entry point validates its input and returns an error (a
// *RangeError naming the quantity and the accepted range) instead of NaN, Inf or
// a panic. Panics are reserved for programmer errors and start with "calc: ".
package calc
