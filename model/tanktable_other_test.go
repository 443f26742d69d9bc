//go:build !unix

package model

import "testing"

func makeFIFO(*testing.T, string) (string, bool) { return "", false }
