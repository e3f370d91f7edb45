//go:build !linux

package build

import "errors"

// errNoExchange says that the system cannot exchange two folders in one step.
var errNoExchange = errors.New("no atomic exchange")

// exchange is not available here: swap falls back to two renames.
func exchange(a, b string) error { return errNoExchange }
