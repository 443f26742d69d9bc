package serve

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"os"
	"strings"
	"unicode"

	gossh "golang.org/x/crypto/ssh"
)

// The allowed-keys file is in OpenSSH authorized_keys format, one crew
// member a line:
//
//	ssh-ed25519 AAAAC3Nza… Ana Lopes
//	read-only ssh-ed25519 AAAAC3Nza… Inspector Kowalski
//
// The comment after the key is the crew member's name, shown to the rest
// of the crew and written beside each mark, reading and log entry they
// make; a line without one is left out (a key is a person). The option
// read-only before the key lets that person look at the job but not
// change it. Other options are ignored. Blank lines and lines starting
// with # are comments. The file is read again at every login, so removing
// a leaver's line locks them out at once.

// MaxKeysFile bounds the allowed-keys file, bytes.
const MaxKeysFile = 1 << 20

// MaxName bounds a crew member's name, bytes.
const MaxName = 64

// ReadOnlyOption is the authorized_keys option that marks a read-only key.
const ReadOnlyOption = "read-only"

// Member is one allowed key.
type Member struct {
	Name        string
	Key         gossh.PublicKey
	Fingerprint string // SHA256:… as ssh-keygen -l shows it
	ReadOnly    bool
}

// ReadKeys reads the allowed-keys file. Lines that do not read, or carry
// no name, are left out and reported in skipped (by line number, never
// with the key).
func ReadKeys(path string) (members []Member, skipped []string, err error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, nil, err
	}
	if !fi.Mode().IsRegular() {
		return nil, nil, fmt.Errorf("%s is not a regular file", path)
	}
	if fi.Size() > MaxKeysFile {
		return nil, nil, fmt.Errorf("%s is over %d bytes", path, MaxKeysFile)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, nil, err
	}
	sc := bufio.NewScanner(bytes.NewReader(b))
	sc.Buffer(make([]byte, 64<<10), MaxKeysFile)
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		m, why := parseKeyLine(line)
		if why != "" {
			skipped = append(skipped, fmt.Sprintf("line %d: %s", n, why))
			continue
		}
		members = append(members, m)
	}
	if err := sc.Err(); err != nil {
		return nil, nil, err
	}
	return members, skipped, nil
}

func parseKeyLine(line string) (Member, string) {
	key, comment, options, _, err := gossh.ParseAuthorizedKey([]byte(line))
	if err != nil {
		return Member{}, "not a public key line"
	}
	name := strings.TrimSpace(comment)
	switch {
	case name == "":
		return Member{}, "no name after the key (the comment names the crew member)"
	case len(name) > MaxName:
		return Member{}, fmt.Sprintf("the name is over %d bytes", MaxName)
	case strings.IndexFunc(name, func(r rune) bool { return unicode.IsControl(r) || r == unicode.ReplacementChar }) >= 0:
		return Member{}, "the name holds control characters"
	}
	m := Member{Name: name, Key: key, Fingerprint: gossh.FingerprintSHA256(key)}
	for _, o := range options {
		if strings.EqualFold(strings.TrimSpace(o), ReadOnlyOption) {
			m.ReadOnly = true
		}
	}
	return m, ""
}

// errNoKey: the key is not in the allowed-keys file.
var errNoKey = errors.New("key not allowed")

// lookup finds key in the allowed-keys file.
func lookup(path string, key gossh.PublicKey) (Member, error) {
	members, _, err := ReadKeys(path)
	if err != nil {
		return Member{}, err
	}
	want := key.Marshal()
	for _, m := range members {
		if bytes.Equal(m.Key.Marshal(), want) {
			return m, nil
		}
	}
	return Member{}, errNoKey
}
