// Package serve is the crew server: `drawdown serve` puts one job on an SSH
// server (Charm's wish, over golang.org/x/crypto/ssh) so that a crew can
// work on it at once from any stock SSH client, a phone's included, with
// nothing installed.
//
// Who may connect is the allowed-keys file (keys.go, OpenSSH
// authorized_keys lines whose comment names the crew member; a line that
// starts with the option read-only may look but not change). The host key
// is made once, in the data folder (hostkey.go). Only public-key logins,
// only sessions: no password, no keyboard-interactive, no shell, no port,
// agent or X11 forwarding, no subsystem; idle and maximum session times; a
// cap on connections at once and on new connections a second from one
// address (server.go).
//
// `ssh -t HOST -p PORT` opens the screen (package tui) on the shared job;
// `ssh HOST -p PORT calc …` runs one of the command line's safe commands
// (the caller's Run decides which); anything else gets one line saying how
// to connect.
//
// The job is held once, by its hub (hub.go): one owner goroutine applies
// every screen's edits in the order they come, journals them through the
// job's model.Session (the server holds the job's lock) and tells every
// other screen, which takes the shared job and keeps its own pane, cursor
// and draft.
package serve
