package serve

import (
	"errors"
	"maps"
	"sync"
	"sync/atomic"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
	"drawdown/presets"
	"drawdown/tui"
)

// A Hub holds one job for every screen on it. Its owner goroutine (run) is
// the only one that changes the job: it takes the screens' edits in the
// order they come, applies them (model.Edit.Apply), journals the job
// through its model.Session (one record a batch, written before anyone is
// told), checkpoints it now and then, and publishes the result (latest)
// and pokes every other screen. A screen takes the latest job on its own
// goroutine (client.Latest), with its own edits still on their way
// applied again on top.
type Hub struct {
	path string
	sess *model.Session
	logf func(format string, args ...any)

	ops    chan hubOp
	ckDone chan ckResult
	quit   chan struct{}
	ended  chan struct{}
	once   sync.Once

	latest atomic.Pointer[shared]
	// failed is why the job is no longer saved (its lock was taken over,
	// the disk is full); every screen's next change says so.
	failed atomic.Pointer[error]

	mu      sync.Mutex // guards clients and nextID
	clients []*client
	nextID  int

	// The owner's own (run's goroutine only).
	job      model.Job
	acks     map[int]uint64
	ckBusy   bool
	ckAgain  bool
	dirty    bool // changed since the last checkpoint
	closeErr error
}

// shared is the job as the owner last published it, and the number of
// each screen's edits it holds.
type shared struct {
	job  model.Job
	acks map[int]uint64
}

type hubOp struct {
	c    *client
	seq  uint64
	edit *model.Edit
}

type ckResult struct {
	seq uint64
	res model.CheckpointResult
	err error
}

// checkpointEvery is how often a changed job is written whole (the journal
// holds every edit meanwhile).
const checkpointEvery = 5 * time.Second

// OpenHub opens the job file at path for the crew: it takes the job's lock
// for the server at addr (a *model.LockedError when a screen or another
// server holds it) and starts the owner. The job's plan and checklist are
// brought up to date once here, as a screen does when it opens a job, so
// that no screen's first frame has anything to add.
func OpenHub(path, addr string, cat *presets.Catalogue, logf func(string, ...any)) (*Hub, model.OpenReport, error) {
	s, j, rep, err := model.OpenSession(path, model.SessionOptions{Owner: model.LockOwner{Server: addr}})
	if err != nil {
		return nil, rep, err
	}
	if j.Inputs == nil {
		j.Inputs = map[model.FieldID]string{}
	}
	if j.LastGood == nil {
		j.CommitAll(cat)
	}
	j.RebuildChecklist(model.Compute(j, cat))
	j.Draft = model.Draft{} // a draft is a screen's own
	if _, err := s.Record(&j); err != nil {
		s.Abandon()
		return nil, rep, err
	}
	h := &Hub{
		path: path, sess: s, logf: logf, job: j, acks: map[int]uint64{},
		ops: make(chan hubOp, 1024), ckDone: make(chan ckResult, 1),
		quit: make(chan struct{}), ended: make(chan struct{}),
	}
	h.latest.Store(&shared{job: j.Clone(), acks: map[int]uint64{}})
	go h.run()
	return h, rep, nil
}

// Path is the job file the hub holds.
func (h *Hub) Path() string { return h.sess.Path() }

// Job is the shared job as it stands (a copy).
func (h *Hub) Job() model.Job { return h.latest.Load().job.Clone() }

// Close stops the owner once the edits sent so far are applied, writes the
// job whole and gives the lock up (within 2 s; past that the journal holds
// everything and the next open finishes).
func (h *Hub) Close() error {
	h.once.Do(func() { close(h.quit) })
	<-h.ended
	return h.closeErr
}

func (h *Hub) run() {
	defer close(h.ended)
	tick := time.NewTicker(checkpointEvery)
	defer tick.Stop()
	for {
		select {
		case o := <-h.ops:
			h.apply(o)
		case r := <-h.ckDone:
			h.checkpointed(r)
		case <-tick.C:
			if h.dirty {
				h.checkpoint()
			}
		case <-h.quit:
			h.drain()
			if h.ckBusy {
				h.checkpointed(<-h.ckDone)
			}
			h.closeErr = h.sess.Close(h.job, 2*time.Second)
			if errors.Is(h.closeErr, model.ErrSavedInJournal) {
				h.logf("the job was saved in its journal only (the whole file is written at the next open): %s", h.path)
			}
			return
		}
	}
}

// drain applies the edits already sent.
func (h *Hub) drain() {
	for {
		select {
		case o := <-h.ops:
			h.apply(o)
		default:
			return
		}
	}
}

// apply applies o and every edit queued behind it, journals the job once,
// and publishes it.
func (h *Hub) apply(first hubOp) {
	from := map[*client]bool{}
	batch := []hubOp{first}
more:
	for len(batch) < 256 {
		select {
		case o := <-h.ops:
			batch = append(batch, o)
		default:
			break more
		}
	}
	for _, o := range batch {
		from[o.c] = true
		if err := o.edit.Apply(&h.job); err != nil {
			h.logf("an edit from %s was left out: %v", o.c.name, err)
		}
		h.acks[o.c.id] = o.seq
	}
	c, err := h.sess.Record(&h.job)
	if err != nil {
		h.logf("the job could not be journalled: %v", err)
		h.failed.Store(&err)
	} else {
		h.failed.Store(nil)
	}
	if c.Recorded {
		h.dirty = true
	}
	if c.Checkpoint {
		h.checkpoint()
	}
	h.latest.Store(&shared{job: h.job.Clone(), acks: maps.Clone(h.acks)})
	only := (*client)(nil)
	if len(from) == 1 {
		for c := range from {
			only = c
		}
	}
	h.poke(only)
}

// checkpoint writes the job whole in the background, one at a time.
func (h *Hub) checkpoint() {
	if h.ckBusy {
		h.ckAgain = true
		return
	}
	h.ckBusy, h.dirty = true, false
	j, seq := h.job.Clone(), h.sess.Seq()
	go func() {
		res, err := h.sess.Checkpoint(j, seq)
		h.ckDone <- ckResult{seq: seq, res: res, err: err}
	}()
}

func (h *Hub) checkpointed(r ckResult) {
	h.ckBusy = false
	switch {
	case r.err != nil:
		h.logf("the job file could not be written whole (the journal holds every edit): %v", r.err)
		h.dirty = true
	default:
		if err := h.sess.Compact(r.seq); err != nil {
			h.logf("the journal could not be compacted: %v", err)
		}
		if r.res.Forked != "" {
			h.logf("the job file %s was changed by another program; the crew's version is saved as %s", r.res.Forked, h.sess.Path())
		}
	}
	if h.ckAgain {
		h.ckAgain = false
		h.checkpoint()
	}
}

// poke tells every screen but skip that the job or the crew changed.
func (h *Hub) poke(skip *client) {
	h.mu.Lock()
	defer h.mu.Unlock()
	for _, c := range h.clients {
		if c != skip {
			c.wake()
		}
	}
}

// join adds a screen for m.
func (h *Hub) join(m Member) *client {
	j := h.latest.Load().job.Clone()
	h.mu.Lock()
	h.nextID++
	c := &client{hub: h, id: h.nextID, name: m.Name, readOnly: m.ReadOnly, tracker: model.NewTracker(&j),
		poke: make(chan struct{}, 1), stop: make(chan struct{})}
	c.peer = tui.Peer{Name: m.Name, ReadOnly: m.ReadOnly}
	h.clients = append(h.clients, c)
	h.mu.Unlock()
	h.poke(c)
	return c
}

// leave takes a screen off the hub. Its edits already sent are applied;
// nothing it had not sent was on anyone's screen.
func (h *Hub) leave(c *client) {
	h.mu.Lock()
	for i, o := range h.clients {
		if o == c {
			h.clients = append(h.clients[:i], h.clients[i+1:]...)
			break
		}
	}
	h.mu.Unlock()
	close(c.stop)
	h.poke(nil)
}

// crew lists the screens on the hub but c, in the order they joined.
func (h *Hub) crew(c *client) []tui.Peer {
	h.mu.Lock()
	defer h.mu.Unlock()
	var out []tui.Peer
	for _, o := range h.clients {
		if o != c {
			o.mu.Lock()
			out = append(out, o.peer)
			o.mu.Unlock()
		}
	}
	return out
}

// client is one screen on the hub: the tui.Sharer of its program.
type client struct {
	hub      *Hub
	id       int
	name     string
	readOnly bool

	mu      sync.Mutex // guards everything below
	tracker *model.Tracker
	seq     uint64 // edits sent
	pending []hubOp
	peer    tui.Peer

	prog *tea.Program
	poke chan struct{}
	stop chan struct{}
}

var _ tui.Sharer = (*client)(nil)

// Name is the crew member's name.
func (c *client) Name() string { return c.name }

// ReadOnly reports whether the key may only look.
func (c *client) ReadOnly() bool { return c.readOnly }

// Crew is who else is on the job.
func (c *client) Crew() []tui.Peer { return c.hub.crew(c) }

// Submit sends what the screen changed to the owner (tui.Sharer).
func (c *client) Submit(j *model.Job) error {
	c.mu.Lock()
	p := tui.Peer{Name: c.name, ReadOnly: c.readOnly, Pane: j.Resume.Pane}
	if j.Draft.Kind == model.DraftField {
		p.Typing = j.Draft.Field
	}
	moved := p != c.peer
	c.peer = p
	by := c.name
	if c.readOnly {
		by = ""
	}
	e, err := c.tracker.Diff(j, by)
	var send *hubOp
	switch {
	case err != nil:
	case e != nil && c.readOnly:
		err = tui.ErrReadOnly
	case e != nil:
		c.seq++
		o := hubOp{c: c, seq: c.seq, edit: e}
		c.pending = append(c.pending, o)
		send = &o
	}
	c.mu.Unlock()
	if f := c.hub.failed.Load(); f != nil && err == nil {
		err = *f
	}
	if send != nil {
		select {
		case c.hub.ops <- *send:
		case <-c.hub.ended:
			err = errors.New("the crew server stopped; this change was not kept")
		}
	} else if moved {
		c.hub.poke(c)
	}
	return err
}

// Latest is the shared job with this screen's edits still on their way
// applied (tui.Sharer); it is what the screen's next edit is taken against.
func (c *client) Latest() model.Job {
	sh := c.hub.latest.Load()
	c.mu.Lock()
	defer c.mu.Unlock()
	ack := sh.acks[c.id]
	k := 0
	for k < len(c.pending) && c.pending[k].seq <= ack {
		k++
	}
	c.pending = c.pending[k:]
	j := sh.job.Clone()
	for _, o := range c.pending {
		_ = o.edit.Apply(&j) // as the owner will; one that does not fit is left out there too
	}
	c.tracker.Reset(&j)
	return j
}

func (c *client) wake() {
	select {
	case c.poke <- struct{}{}:
	default:
	}
}

// deliver passes the pokes to the program until the screen leaves.
func (c *client) deliver() {
	for {
		select {
		case <-c.stop:
			return
		case <-c.poke:
			c.prog.Send(tui.JobChangedMsg{})
		}
	}
}
