package serve

import (
	"crypto/ed25519"
	"crypto/rand"
	"encoding/pem"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"

	gossh "golang.org/x/crypto/ssh"
)

// HostKeyName is the server's host key file in the data folder.
const HostKeyName = "ssh_host_ed25519_key"

// HostKey returns the server's host key at path, making it the first time
// (Ed25519, OpenSSH private key format, mode 0600). A key file that others
// can read is refused, as OpenSSH refuses one.
func HostKey(path string) (gossh.Signer, error) {
	b, err := os.ReadFile(path)
	if errors.Is(err, fs.ErrNotExist) {
		return makeHostKey(path)
	}
	if err != nil {
		return nil, err
	}
	fi, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if fi.Mode().Perm()&0o077 != 0 {
		return nil, fmt.Errorf("the host key %s can be read by others (mode %04o); chmod 600 it", path, fi.Mode().Perm())
	}
	s, err := gossh.ParsePrivateKey(b)
	if err != nil {
		return nil, fmt.Errorf("the host key %s does not read: %w", path, err)
	}
	return s, nil
}

func makeHostKey(path string) (gossh.Signer, error) {
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		return nil, err
	}
	blk, err := gossh.MarshalPrivateKey(priv, "drawdown crew server")
	if err != nil {
		return nil, err
	}
	if err := os.MkdirAll(filepath.Dir(path), 0o700); err != nil {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o600)
	if err != nil {
		return nil, err
	}
	if _, err := f.Write(pem.EncodeToMemory(blk)); err != nil {
		f.Close()
		os.Remove(path)
		return nil, err
	}
	if err := f.Sync(); err != nil {
		f.Close()
		return nil, err
	}
	if err := f.Close(); err != nil {
		return nil, err
	}
	return gossh.NewSignerFromKey(priv)
}
