package serve

import (
	"strings"
	"testing"
	"unicode"
)

// FuzzKeyLine: any line of an allowed-keys file is a member or a reason,
// never a panic; a member's name is short and has no control character
// (it is shown to the crew and written in the record).
//
// ci-fuzz-execs: 20000
func FuzzKeyLine(f *testing.F) {
	f.Add("ssh-ed25519 AAAAC3NzaC1lZDI1NTE5AAAAILHde3hkQFfFA4bOdaUo1vHWMkl1AiiOzvkC+5Aamx4C Ana Lopes")
	f.Add("read-only ssh-ed25519 AAAAC3NzaC1lZDI1NTE5AAAAILHde3hkQFfFA4bOdaUo1vHWMkl1AiiOzvkC+5Aamx4C Insp\x1b[31m")
	f.Add(`command="x",read-only ssh-ed25519 AAAA`)
	f.Fuzz(func(t *testing.T, line string) {
		m, why := parseKeyLine(line)
		if why != "" {
			return
		}
		if m.Name == "" || len(m.Name) > MaxName || strings.IndexFunc(m.Name, unicode.IsControl) >= 0 {
			t.Errorf("name %q let through", m.Name)
		}
		if m.Key == nil || !strings.HasPrefix(m.Fingerprint, "SHA256:") {
			t.Errorf("member without a key: %+v", m)
		}
	})
}
