//go:build !unix

package presets

// openNonBlock: opening does not block on this platform's files.
const openNonBlock = 0
