//go:build unix

package model

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"os/user"
	"strconv"
	"syscall"
)

// fileOwner is the owner a saved file must keep.
type fileOwner struct {
	set      bool // a file exists and is not this process's user's
	uid, gid int
}

// ownerOf is the owner of the file at path that a save must keep; an error
// when it belongs to another user and this process (not root) cannot give
// a new file that owner.
func ownerOf(path string) (fileOwner, error) {
	fi, err := os.Stat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return fileOwner{}, nil
	}
	if err != nil {
		return fileOwner{}, nil // the write reports what is wrong
	}
	st, ok := fi.Sys().(*syscall.Stat_t)
	if !ok {
		return fileOwner{}, nil
	}
	uid, gid, me := int(st.Uid), int(st.Gid), os.Geteuid()
	if uid == me {
		return fileOwner{}, nil
	}
	if me != 0 {
		return fileOwner{}, fmt.Errorf("belongs to the user %s and would become yours if saved; not saved "+
			"(save it as its owner, or save a copy under another name)", userName(uid))
	}
	return fileOwner{set: true, uid: uid, gid: gid}, nil
}

// give makes f owned by the owner (root only; a no-op when there is none).
func (o fileOwner) give(f *os.File) error {
	if !o.set {
		return nil
	}
	if err := f.Chown(o.uid, o.gid); err != nil {
		return fmt.Errorf("cannot keep the file's owner, the user %s (%v); not saved", userName(o.uid), err)
	}
	return nil
}

func userName(uid int) string {
	if u, err := user.LookupId(strconv.Itoa(uid)); err == nil {
		return u.Username + " (uid " + strconv.Itoa(uid) + ")"
	}
	return "with uid " + strconv.Itoa(uid)
}
