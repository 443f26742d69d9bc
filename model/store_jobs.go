package model

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"time"
	"unicode"
)

// The data folder, the job folder, job file names, the last job and the
// job list.

// Home returns drawdown's data folder: $DRAWDOWN_HOME when set (tests and
// portable installs), else $XDG_DATA_HOME/drawdown, else the platform's
// usual place (~/.local/share/drawdown on Linux and the BSDs, the user
// configuration folder elsewhere).
func Home() (string, error) {
	if h := os.Getenv("DRAWDOWN_HOME"); h != "" {
		return h, nil
	}
	if x := os.Getenv("XDG_DATA_HOME"); x != "" && filepath.IsAbs(x) {
		return filepath.Join(x, "drawdown"), nil
	}
	switch runtime.GOOS {
	case "darwin", "windows", "ios", "plan9":
		d, err := os.UserConfigDir()
		if err != nil {
			return "", err
		}
		return filepath.Join(d, "drawdown"), nil
	}
	h, err := os.UserHomeDir()
	if err != nil {
		return "", err
	}
	return filepath.Join(h, ".local", "share", "drawdown"), nil
}

// JobsDir returns the folder of job files, <Home>/jobs. It does not create
// it; SaveAtomic does on first save.
func JobsDir() (string, error) {
	h, err := Home()
	if err != nil {
		return "", err
	}
	return filepath.Join(h, "jobs"), nil
}

// JobFileName turns a job name into a file name: lower case, letters and
// digits kept, other runs of characters made a single "-", ".json" added.
func JobFileName(name string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(name) {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(r)
		} else {
			dash = true
		}
		if b.Len() >= 60 {
			break
		}
	}
	if b.Len() == 0 {
		return "job.json"
	}
	return b.String() + ".json"
}

// NewJobPath returns a path in dir for a new job named name that does not
// name an existing file (adding -2, -3, … as needed).
func NewJobPath(dir, name string) string {
	base := strings.TrimSuffix(JobFileName(name), ".json")
	for i := 1; ; i++ {
		p := filepath.Join(dir, base+".json")
		if i > 1 {
			p = filepath.Join(dir, base+"-"+strconv.Itoa(i)+".json")
		}
		if _, err := os.Lstat(p); errors.Is(err, fs.ErrNotExist) {
			return p
		}
	}
}

// lastJobFile holds the path of the job open when drawdown last ran.
const lastJobFile = "last-job"

// LastJobPath returns the path of the job open when drawdown last ran, or ""
// (and no error) when there is none.
func LastJobPath() (string, error) {
	h, err := Home()
	if err != nil {
		return "", err
	}
	b, err := os.ReadFile(filepath.Join(h, lastJobFile))
	if errors.Is(err, fs.ErrNotExist) {
		return "", nil
	}
	if err != nil {
		return "", err
	}
	return strings.TrimSpace(string(b)), nil
}

// SetLastJob records path as the job to resume at the next start. The
// record is written atomically with mode 0600.
func SetLastJob(path string) error {
	h, err := Home()
	if err != nil {
		return err
	}
	if abs, err := filepath.Abs(path); err == nil {
		path = abs
	}
	return writeFileAtomic(filepath.Join(h, lastJobFile), []byte(path+"\n"))
}

// JobSummary is one entry of ListJobs.
type JobSummary struct {
	Path    string
	Name    string
	Site    string
	Date    string   // the day of the work, YYYY-MM-DD, or ""
	State   JobState // planned, draining or closed
	Updated time.Time
	Err     error // set when the file cannot be read; the entry is still listed
}

// ListJobs lists the job files (*.json) in dir, newest first. Unreadable
// files are listed with Err set, so the UI can say so instead of hiding them.
func ListJobs(dir string) ([]JobSummary, error) {
	entries, err := os.ReadDir(dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, err
	}
	var out []JobSummary
	for _, e := range entries {
		if e.IsDir() || !strings.HasSuffix(e.Name(), ".json") || strings.HasPrefix(e.Name(), ".") {
			continue
		}
		p := filepath.Join(dir, e.Name())
		s := JobSummary{Path: p}
		if j, err := Load(p); err != nil {
			s.Err = err
			if fi, err := e.Info(); err == nil {
				s.Updated = fi.ModTime()
			}
		} else {
			s.Name, s.Site, s.Date, s.State, s.Updated = j.Name, j.Site, j.Date, j.State(), j.Updated
		}
		out = append(out, s)
	}
	sort.SliceStable(out, func(a, b int) bool { return out[a].Updated.After(out[b].Updated) })
	return out, nil
}
