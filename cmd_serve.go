package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"

	"drawdown/model"
	"drawdown/serve"
)

var serveFlagDefs = []flagDef{
	{name: "listen", arg: "ADDR", help: "host:port to listen on [" + serve.DefaultListen + ", this machine only]; e.g. 0.0.0.0:2222 for the site network"},
	{name: "keys", arg: "FILE", path: "file", help: "the allowed-keys file (OpenSSH authorized_keys lines, the comment naming the crew member) [" + keysPathWords + "]"},
	{name: "job", arg: "FILE", path: "file", help: "the job file the crew works on [the last job, or the demo job in a new file]"},
}

const keysPathWords = "$XDG_CONFIG_HOME/drawdown/crew_keys"

const serveHelp = `usage: drawdown serve [--listen ADDR] [--keys FILE] [--job FILE]
Puts one job on an SSH server for a crew: every stock SSH client (a laptop's, a phone's)
reaches it with nothing installed, and everyone on it sees everyone's changes at once.

  ssh -t HOST -p 2222            the planning screen on the crew's job
  ssh -p 2222 HOST calc --help   a command without the screen (calc, presets, checklist,
                                 version, help)

flags:
%s
Who may log in is the allowed-keys file: one line per person, the public key and, after
it, the person's name (shown to the crew and written beside each mark, reading and log
entry they make):

  ssh-ed25519 AAAAC3Nza... Ana Lopes
  read-only ssh-ed25519 AAAAC3Nza... Inspector Kowalski

A line that starts with read-only may look at the job but not change it. The file is read
at every login: delete a line and that key is out. Public keys only; no password, no
shell, no forwarding. The host key is made once, in the data folder
($DRAWDOWN_HOME/ssh_host_ed25519_key), and each login is logged on standard error.

The server gives access to this job's data only, not to the machine; keep it on the site
network. drawdown plans and records; it does not authorise a discharge or an entry.
`

// defaultKeysPath is the allowed-keys file in the user's configuration
// folder, beside the preset file.
func defaultKeysPath() string {
	dir, err := os.UserConfigDir()
	if err != nil || dir == "" {
		return ""
	}
	return filepath.Join(dir, "drawdown", "crew_keys")
}

func runServe(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("serve", args, serveFlagDefs, 0)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown serve: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		var b strings.Builder
		writeFlagHelp(&b, serveFlagDefs)
		fmt.Fprintf(stdout, serveHelp, b.String())
		return ExitOK
	}
	keys := pf.get("keys")
	if keys == "" {
		keys = defaultKeysPath()
	}
	if _, err := os.Stat(keys); err != nil {
		fmt.Fprintf(stderr, "drawdown serve: no allowed-keys file at %s (%v); put one line per crew member there, "+
			"e.g. the contents of their ~/.ssh/id_ed25519.pub followed by their name, or give --keys FILE\n", keys, plainErr(err))
		return ExitUsage
	}
	home, err := model.Home()
	if err != nil {
		fmt.Fprintln(stderr, "drawdown serve: no data folder:", err)
		return ExitError
	}
	job, err := serveJob(pf.get("job"))
	if err != nil {
		fmt.Fprintln(stderr, "drawdown serve:", err)
		return ExitError
	}
	srv, err := serve.Start(serve.Config{
		Listen: pf.get("listen"), Keys: keys, HostKey: filepath.Join(home, serve.HostKeyName), Job: job,
		Cat: loadCatalogue(stderr), Run: runRemote, Log: stderr,
	})
	if err != nil {
		var locked *model.LockedError
		if errors.As(err, &locked) {
			fmt.Fprintln(stderr, "drawdown serve: the job is open elsewhere; close it there first:", err)
			return ExitError
		}
		fmt.Fprintln(stderr, "drawdown serve:", err)
		return ExitError
	}
	fmt.Fprintf(stderr, "drawdown serve: listening on %s; connect with ssh -t HOST -p %s; ctrl+c stops\n", srv.Addr(), portOf(srv.Addr().String()))
	sigs := make(chan os.Signal, 2)
	signal.Notify(sigs, syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP)
	defer signal.Stop(sigs)
	s := <-sigs
	fmt.Fprintf(stderr, "drawdown serve: %s: stopping; the job is written whole\n", signalName(s))
	if err := srv.Close(); err != nil && !errors.Is(err, model.ErrSavedInJournal) {
		fmt.Fprintln(stderr, "drawdown serve: the job was NOT written whole at exit:", err)
		return ExitError
	}
	return ExitOK
}

func portOf(addr string) string {
	if i := strings.LastIndexByte(addr, ':'); i >= 0 {
		return addr[i+1:]
	}
	return addr
}

func plainErr(err error) string {
	if errors.Is(err, os.ErrNotExist) {
		return "not found"
	}
	return err.Error()
}

// serveJob is the job the server holds: the one named, else the last job,
// else the demo job saved in a new file.
func serveJob(named string) (string, error) {
	if named != "" {
		return named, nil
	}
	if last, err := model.LastJobPath(); err == nil && last != "" {
		if _, err := os.Stat(last); err == nil {
			return last, nil
		}
	}
	dir, err := model.JobsDir()
	if err != nil {
		return "", err
	}
	demo := model.DemoJob()
	path := model.NewJobPath(dir, demo.Name)
	if err := model.SaveAtomic(path, demo); err != nil {
		return "", err
	}
	return path, model.SetLastJob(path)
}

// remoteCommands are the commands a crew member may run over ssh: they
// compute and print, and write nothing.
var remoteCommands = map[string]bool{"calc": true, "presets": true, "checklist": true, "version": true, "--version": true,
	"help": true, "-h": true, "--help": true}

// runRemote runs a command a crew member sent (`ssh HOST calc …`): only
// the commands that print, and none of their flags that name a file on
// the server; anything else is refused in one line.
func runRemote(args []string, stdout, stderr io.Writer) int {
	stderr = cleanWriter{stderr}
	if !remoteCommands[args[0]] {
		fmt.Fprintf(stderr, "drawdown: %q is not run over ssh; the commands are calc, presets, checklist, version and help (the screen: ssh -t)\n", args[0])
		return ExitUsage
	}
	for _, a := range args[1:] {
		if !strings.HasPrefix(a, "-") {
			continue
		}
		name, _, _ := strings.Cut(strings.TrimLeft(a, "-"), "=")
		if d, ok := lookupFlag(commandFlags(args[0]), name); ok && d.path != "" {
			fmt.Fprintf(stderr, "drawdown: --%s names a file on the server, which is not read over ssh\n", name)
			return ExitUsage
		}
	}
	return run(args, stdout, stderr)
}
