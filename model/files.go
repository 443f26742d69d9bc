package model

// WriteFileAtomic writes b to path the way jobs are saved: a temporary file
// in the same folder, fsync, rename, mode 0600. The job record and its CSV
// use it so that a dropped session never leaves half a record.
func WriteFileAtomic(path string, b []byte) error { return writeFileAtomic(path, b) }
