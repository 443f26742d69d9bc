//go:build unix

package presets

import "syscall"

// openNonBlock keeps open(2) from waiting for a writer should a named pipe
// be swapped in between Stat and Open.
const openNonBlock = syscall.O_NONBLOCK
