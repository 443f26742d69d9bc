package main

import (
	"fmt"
	"io"
	"strings"

	"drawdown/model"
	"drawdown/presets"
)

// flagDef is one flag of a command. Each command keeps a table of them (the
// calc table is calcFlagDefs); a command that takes the calc flags and some
// of its own appends its own to a copy of that table and parses the lot with
// parseFlags.
type flagDef struct {
	name string // without the leading dashes
	// arg names the value in the help ("X", "ID", "FILE"); empty
	// for a switch, which takes no value.
	arg  string
	help string
	// repeat lets the flag be given more than once (its values are kept in
	// order); any other flag given twice is an error naming it.
	repeat bool
	// field is the job field the flag sets, if any.
	field model.FieldID
	// complete lists the values shell completion offers (the catalogue IDs
	// a user would otherwise look up); nil for none.
	complete func(cat *presets.Catalogue) []completion
	// path is "file" or "dir" when the value is a path the shell completes.
	path string
}

// completion is one value offered by shell completion, with a short
// description (fish and zsh show it; bash does not).
type completion struct{ value, note string }

// parsedFlags is what parseFlags read: every value by flag name, in the
// order given, and the arguments that are not flags.
type parsedFlags struct {
	values     map[string][]string
	positional []string
	help       bool
}

// has reports whether the flag was given.
func (p *parsedFlags) has(name string) bool { return len(p.values[name]) > 0 }

// get returns the flag's value ("" when not given; the last for a repeated
// flag, which callers read with all).
func (p *parsedFlags) get(name string) string {
	v := p.values[name]
	if len(v) == 0 {
		return ""
	}
	return v[len(v)-1]
}

// all returns every value of a repeatable flag, in order.
func (p *parsedFlags) all(name string) []string { return p.values[name] }

// usageError is a bad flag or value: one line, exit status 2.
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, a ...any) error { return &usageError{fmt.Sprintf(format, a...)} }

func lookupFlag(defs []flagDef, name string) (flagDef, bool) {
	for _, d := range defs {
		if d.name == name {
			return d, true
		}
	}
	return flagDef{}, false
}

// parseFlags reads the flags of command cmd from args: --name value,
// --name=value (one dash works too), switches without a value, -h and
// --help (which stop the reading: the caller prints its help), and "--",
// after which every argument is positional. maxPositional bounds the
// arguments that are not flags. Errors name the flag: an unknown flag, a
// flag given twice (unless repeatable), a switch given a value, a missing
// value.
func parseFlags(cmd string, args []string, defs []flagDef, maxPositional int) (*parsedFlags, error) {
	p := &parsedFlags{values: map[string][]string{}}
	for i := 0; i < len(args); i++ {
		a := args[i]
		if a == "--" {
			p.positional = append(p.positional, args[i+1:]...)
			break
		}
		if !strings.HasPrefix(a, "-") || a == "-" {
			p.positional = append(p.positional, a)
			continue
		}
		name, value, hasValue := strings.Cut(strings.TrimLeft(a, "-"), "=")
		if name == "h" || name == "help" {
			p.help = true
			return p, nil
		}
		d, ok := lookupFlag(defs, name)
		if !ok {
			return nil, usagef("unknown flag --%s; see drawdown %s --help", name, cmd)
		}
		if p.has(name) && !d.repeat {
			return nil, usagef("--%s given twice; give it once", name)
		}
		switch {
		case d.arg == "" && hasValue:
			return nil, usagef("--%s takes no value", name)
		case d.arg == "":
			value = "yes"
		case !hasValue && i+1 >= len(args):
			return nil, usagef("--%s needs a value: %s", name, strings.TrimSpace(strings.SplitN(d.help, " [", 2)[0]))
		case !hasValue:
			i++
			value = args[i]
		}
		p.values[name] = append(p.values[name], value)
	}
	if len(p.positional) > maxPositional {
		extra := p.positional[maxPositional]
		if maxPositional == 0 {
			return nil, usagef("unexpected argument %q; flags start with --", extra)
		}
		return nil, usagef("unexpected argument %q after %q", extra, strings.Join(p.positional[:maxPositional], " "))
	}
	return p, nil
}

// writeFlagHelp prints a flag table, one flag a line, in table order.
func writeFlagHelp(w io.Writer, defs []flagDef) {
	for _, d := range defs {
		head := "--" + d.name
		if d.arg != "" {
			head += " " + d.arg
		}
		if len(head) > 22 {
			fmt.Fprintf(w, "  %s\n  %-22s %s\n", head, "", d.help)
			continue
		}
		fmt.Fprintf(w, "  %-22s %s\n", head, d.help)
	}
}
