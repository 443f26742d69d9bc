// Package testkit is the test helpers every package of drawdown shares: one
// tolerance rule (Within, and Close that reports a failing case with its
// source) and one golden-file helper (Golden) with one -update flag.
//
// testkit imports only the standard library, so that calc's own tests may
// use it. Production code never imports it: it registers the -update flag
// on the command line of whatever binary links it.
package testkit
