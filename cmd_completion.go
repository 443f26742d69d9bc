package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"

	"drawdown/model"
	"drawdown/presets"
)

// Shell completion. `drawdown completion bash|zsh|fish` prints a short
// script; the script asks the binary itself for the candidates each time,
// through the hidden command `drawdown __complete WORD... PARTIAL` (the
// words typed after "drawdown", then the word being completed). So the
// catalogue IDs offered (liquids, hose sizes, materials, fittings, tanks,
// priming methods, tank shapes) are those of the catalogue at completion
// time, the user's presets file included, and jobs are those in the jobs
// folder at that moment.
//
// __complete prints one candidate a line, "value<TAB>note" (bash shows the
// value only); a last line ":file" or ":dir" asks the shell to complete a
// path as well.

// completionShells are the shells `drawdown completion` writes a script for.
var completionShells = []completion{
	{"bash", "source <(drawdown completion bash), or save it in bash-completion's completions folder"},
	{"zsh", "source <(drawdown completion zsh) after compinit"},
	{"fish", "drawdown completion fish | source, or save it as ~/.config/fish/completions/drawdown.fish"},
}

const completionHelp = `usage: drawdown completion bash|zsh|fish
Prints a shell completion script for drawdown: commands, flags, and the catalogue IDs
(liquids, hose sizes, materials, fittings, tanks, priming methods, tank shapes) and job
names, read from the catalogue and the jobs folder each time you press Tab.

  bash   source <(drawdown completion bash)
         or save it as ~/.local/share/bash-completion/completions/drawdown
  zsh    source <(drawdown completion zsh)          (in ~/.zshrc, after compinit)
  fish   drawdown completion fish | source
         or save it as ~/.config/fish/completions/drawdown.fish
`

func runCompletion(args []string, stdout, stderr io.Writer) int {
	pf, err := parseFlags("completion", args, nil, 1)
	if err != nil {
		fmt.Fprintln(stderr, "drawdown completion: "+err.Error())
		return ExitUsage
	}
	if pf.help {
		fmt.Fprint(stdout, completionHelp)
		return ExitOK
	}
	if len(pf.positional) == 0 {
		fmt.Fprintln(stderr, "drawdown completion: which shell? accepted bash, zsh, fish")
		return ExitUsage
	}
	switch pf.positional[0] {
	case "bash":
		fmt.Fprint(stdout, bashCompletion)
	case "zsh":
		fmt.Fprint(stdout, zshCompletion)
	case "fish":
		fmt.Fprint(stdout, fishCompletion)
	default:
		fmt.Fprintf(stderr, "drawdown completion: %q is not a shell drawdown completes for; accepted bash, zsh, fish\n", pf.positional[0])
		return ExitUsage
	}
	return ExitOK
}

// runComplete is the hidden `drawdown __complete`. It never fails: a
// completion that cannot be worked out offers nothing.
func runComplete(args []string, stdout, _ io.Writer) int {
	cands, path := completeWords(args, func() *presets.Catalogue { return loadCatalogue(nil) })
	for _, c := range cands {
		if c.note != "" {
			fmt.Fprintf(stdout, "%s\t%s\n", c.value, oneLine(c.note))
		} else {
			fmt.Fprintln(stdout, c.value)
		}
	}
	if path != "" {
		fmt.Fprintln(stdout, ":"+path)
	}
	return ExitOK
}

// commandLine matches a command's line in the top-level usage text, which
// is the one list of commands.
var commandLine = regexp.MustCompile(`(?m)^  drawdown ([a-z][a-z0-9-]*)[^\n]*?  +(\S[^\n]*)$`)

// commands lists the commands named in the top-level usage, with their
// one-line summaries.
func commands() []completion {
	var out []completion
	for _, m := range commandLine.FindAllStringSubmatch(usage, -1) {
		if slices.ContainsFunc(out, func(c completion) bool { return c.value == m[1] }) {
			continue
		}
		out = append(out, completion{m[1], m[2]})
	}
	return out
}

// commandFlags returns a command's flag table: the table itself for the
// commands that keep one here, else the flags its --help lists.
func commandFlags(cmd string) []flagDef {
	switch cmd {
	case "calc":
		return calcFlagDefs
	case "report":
		return reportFlagDefs
	}
	var help, discard bytes.Buffer
	if run([]string{cmd, "--help"}, &help, &discard) != ExitOK {
		return nil
	}
	var defs []flagDef
	for _, m := range helpFlagLine.FindAllStringSubmatch(help.String(), -1) {
		defs = append(defs, flagDef{name: m[1], arg: strings.TrimSpace(m[2]), repeat: true})
	}
	return defs
}

var helpFlagLine = regexp.MustCompile(`(?m)^  --([a-z][a-z0-9-]*)( [A-Z|a-z]+)?`)

// completeWords offers the candidates for the last of words (the word being
// completed, possibly empty), given the words before it. bash splits
// "--flag=value" at the "=", so a lone "=" after a flag is taken as joining
// the two.
func completeWords(words []string, cat func() *presets.Catalogue) ([]completion, string) {
	if len(words) == 0 {
		words = []string{""}
	}
	cur, prev := words[len(words)-1], words[:len(words)-1]
	if len(prev) == 0 {
		if strings.HasPrefix(cur, "-") {
			return filter([]completion{{"--help", "how to use drawdown"}, {"--version", "the version and revision"}}, cur), ""
		}
		return filter(commands(), cur), ""
	}
	cmd := prev[0]
	switch cmd {
	case "help":
		return filter(commands(), cur), ""
	case "completion":
		return filter(completionShells, cur), ""
	}
	defs := commandFlags(cmd)
	last := prev[len(prev)-1]
	if last == "=" && len(prev) >= 3 {
		last = prev[len(prev)-2]
	} else if strings.HasPrefix(cur, "-") {
		if name, partial, ok := strings.Cut(strings.TrimLeft(cur, "-"), "="); ok {
			return completeValue(defs, name, partial, cur[:len(cur)-len(partial)], cat)
		}
		return completeFlagNames(defs, prev[1:], cur), ""
	}
	if d, ok := lookupFlag(defs, strings.TrimLeft(last, "-")); ok && strings.HasPrefix(last, "-") && !strings.Contains(last, "=") && d.arg != "" {
		return completeValue(defs, d.name, cur, "", cat)
	}
	if cmd == "report" {
		return filter(jobNames(), cur), "file"
	}
	return nil, ""
}

// completeFlagNames offers the command's flags not yet given (a repeatable
// flag stays on offer).
func completeFlagNames(defs []flagDef, given []string, cur string) []completion {
	out := []completion{{"--help", "this command's help"}}
	for _, d := range defs {
		used := slices.ContainsFunc(given, func(g string) bool {
			name, _, _ := strings.Cut(strings.TrimLeft(g, "-"), "=")
			return strings.HasPrefix(g, "-") && name == d.name
		})
		if used && !d.repeat {
			continue
		}
		out = append(out, completion{"--" + d.name, d.help})
	}
	return filter(out, cur)
}

// completeValue offers the values of flag name that start with partial,
// each with prefix put back (the "--flag=" a shell did not split off). A
// comma-separated list (the fittings) is completed after its last comma.
func completeValue(defs []flagDef, name, partial, prefix string, cat func() *presets.Catalogue) ([]completion, string) {
	d, ok := lookupFlag(defs, name)
	if !ok {
		return nil, ""
	}
	if d.path != "" {
		return nil, d.path
	}
	if d.complete == nil {
		return nil, ""
	}
	if spec, ok := model.FieldByID(d.field); ok && spec.Multi {
		if i := strings.LastIndex(partial, ","); i >= 0 {
			prefix, partial = prefix+partial[:i+1], partial[i+1:]
		}
	}
	out := filter(d.complete(cat()), partial)
	for i := range out {
		out[i].value = prefix + out[i].value
	}
	return out, ""
}

// filter keeps the candidates that start with prefix (any case).
func filter(cs []completion, prefix string) []completion {
	var out []completion
	for _, c := range cs {
		if strings.HasPrefix(strings.ToLower(c.value), strings.ToLower(prefix)) {
			out = append(out, c)
		}
	}
	return out
}

// jobNames lists the job files in the jobs folder, by the name `drawdown
// report` accepts.
func jobNames() []completion {
	dir, err := model.JobsDir()
	if err != nil {
		return nil
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*.json"))
	var out []completion
	for _, f := range files {
		if fi, err := os.Stat(f); err == nil && fi.Mode().IsRegular() {
			out = append(out, completion{strings.TrimSuffix(filepath.Base(f), ".json"), "job in " + dir})
		}
	}
	return out
}

// The value lists of the calc flags.

func completeField(id model.FieldID) func(*presets.Catalogue) []completion {
	return func(cat *presets.Catalogue) []completion {
		spec, ok := model.FieldByID(id)
		if !ok || !spec.IsPicker() {
			return nil
		}
		var out []completion
		for _, c := range spec.Choices(cat) {
			out = append(out, completion{c.ID, c.Label})
		}
		return out
	}
}

func completeUnits(*presets.Catalogue) []completion {
	return []completion{{"si", "metres, litres, °C, kPa"}, {"us", "feet, US gallons, °F, psi"}}
}

func completeHoses(cat *presets.Catalogue) []completion {
	var out []completion
	for _, h := range cat.Hoses() {
		out = append(out, completion{h.ID, h.Name})
	}
	return out
}

func completeTankPresets(cat *presets.Catalogue) []completion {
	var out []completion
	for _, t := range cat.Tanks() {
		out = append(out, completion{t.ID, t.Name})
	}
	return out
}

func completeShapes(*presets.Catalogue) []completion {
	var out []completion
	for _, s := range presets.TankShapes() {
		out = append(out, completion{s, strings.ReplaceAll(s, "-", " ")})
	}
	return out
}

func completeTankShapes(cat *presets.Catalogue) []completion {
	return append(completeShapes(cat), completion{"table", "calibration table (with --tank-table FILE)"})
}
