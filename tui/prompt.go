package tui

import (
	"errors"

	"charm.land/bubbles/v2/key"
	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/model/present"
)

// The first-screen prompts: the job is held by another process (open it
// read-only, take it over, pick another, quit), or the last job cannot be
// read (open the demo, pick another, keep the damaged file aside and open
// the demo). The sentences sit beside the choices they offer (the
// presentation layer may take them over).

// PromptKind is which question a StartPrompt asks.
type PromptKind int

const (
	// PromptLocked: another process holds the job.
	PromptLocked PromptKind = iota
	// PromptDamaged: the last job cannot be read.
	PromptDamaged
)

// StartPrompt is a choice to make before a job can be saved.
type StartPrompt struct {
	Kind   PromptKind
	Path   string
	Holder model.LockInfo // PromptLocked
	Err    error
	// FromList: asked on opening a job from the list (Esc goes back),
	// not at the start.
	FromList bool
}

// promptLines are the prompt's words and its keys.
func (m *Model) promptLines(p *StartPrompt) (title string, body, keys []string) {
	name := fileBase(p.Path)
	switch p.Kind {
	case PromptLocked:
		who := "another drawdown"
		if p.Holder.Token != "" {
			who = p.Holder.Who(m.loc())
		}
		title = "This job is open in another drawdown"
		body = []string{name + " is held by " + who + ".",
			"Two screens saving one job would overwrite each other, so only one saves it."}
		keys = []string{"r  open it read-only (see it, change nothing)",
			"t  take it over: the other screen stops saving and says so",
			"o  open another job"}
	case PromptDamaged:
		title = "The last job cannot be read"
		detail := p.Err.Error()
		var fe *model.JobFileError
		if errors.As(p.Err, &fe) {
			detail = fe.Detail
		}
		body = []string{name + ": " + detail}
		keys = []string{"d  open the demo job (in a new file)",
			"o  open another job",
			"k  keep the file aside as " + name + ".damaged, every byte, and open the demo job"}
	}
	if p.FromList {
		keys = append(keys, "esc  back to the job list")
	} else {
		keys = append(keys, "q  quit")
	}
	return title, body, keys
}

// promptHelp is the help line under the prompt: its keys only, as
// promptKey takes them (no pane's keys work while it is up).
func promptHelp(p *StartPrompt) []key.Binding {
	k := func(keys, help string) key.Binding {
		return key.NewBinding(key.WithKeys(keys), key.WithHelp(keys, help))
	}
	var b []key.Binding
	switch p.Kind {
	case PromptLocked:
		b = []key.Binding{k("r", "read-only"), k("t", "take it over"), k("o", "another job")}
	case PromptDamaged:
		b = []key.Binding{k("d", "open the demo"), k("k", "keep it aside"), k("o", "another job")}
	}
	if p.FromList {
		return append(b, k("esc", "back to the list"))
	}
	return append(b, k("q", "quit"))
}

// promptView draws the prompt in the main block.
func (m *Model) promptView() string {
	st, p := m.styles, m.ps.prompt
	title, body, keys := m.promptLines(p)
	w := max(m.lay.Main.W-2, 10)
	out := []string{st.fast.PaneTitle.Render(title), ""}
	for _, b := range body {
		// host, user and path names come from a lock file and the disk:
		// data, never control sequences
		for _, s := range wrapText(present.Clean(b), w, 6) {
			out = append(out, st.fast.Value.Render(s))
		}
	}
	out = append(out, "")
	for _, k := range keys {
		for i, s := range wrapText(k, w-3, 3) {
			if i > 0 {
				s = "   " + s
			}
			out = append(out, st.fast.LabelFocused.Render(s))
		}
	}
	return fitBlock(out, m.lay.Main.W, m.lay.Main.H)
}

// promptKey takes a key while the prompt is up.
func (m *Model) promptKey(msg tea.KeyPressMsg) tea.Cmd {
	p := m.ps.prompt
	k := msg.String()
	if k == "ctrl+c" || (k == "q" && !p.FromList) {
		return m.quit()
	}
	switch p.Kind {
	case PromptLocked:
		switch k {
		case "r":
			m.ps.prompt = nil
			if m.ps.readOnly && m.path == p.Path {
				m.job.AddLog(m.now(), "opened read-only: the job is held by "+p.Holder.Who(m.loc()))
				m.touch()
				return nil
			}
			return readOnlyCmd(p.Path, p.Holder)
		case "t":
			m.ps.prompt = nil
			return openJobCmd(p.Path, true)
		}
	case PromptDamaged:
		switch k {
		case "d":
			m.ps.prompt = nil
			return m.openDemo("")
		case "k":
			m.ps.prompt = nil
			keep, err := model.SetAsideDamaged(p.Path)
			if err != nil {
				m.flash = "✗ " + err.Error()
				return m.openDemo("")
			}
			return m.openDemo("the job that could not be read is kept as " + fileBase(keep) + " (every byte as it was)")
		}
	}
	switch {
	case k == "o":
		m.ps.prompt = nil
		m.jobs.open, m.jobs.loading = true, true
		return listJobsCmd(m.dir)
	case k == "esc" && p.FromList:
		m.ps.prompt = nil
	}
	return nil
}

// openDemo shows the demo job in a new file (saved from the next Update).
func (m *Model) openDemo(note string) tea.Cmd {
	demo := model.DemoJob()
	demo.Created, demo.Updated = m.now(), m.now()
	if note != "" {
		demo.AddLog(m.now(), note)
	}
	path := ""
	if m.dir != "" {
		path = model.NewJobPath(m.dir, demo.Name)
	}
	return m.loaded(jobLoadedMsg{path: path, job: demo})
}
