package build

import (
	"errors"

	"golang.org/x/sys/unix"
)

// errNoExchange says that the system cannot exchange two folders in one step.
var errNoExchange = errors.New("no atomic exchange")

// exchange swaps the folders at a and b in one step (renameat2 with
// RENAME_EXCHANGE), so that no moment passes without a package at b.
func exchange(a, b string) error {
	err := unix.Renameat2(unix.AT_FDCWD, a, unix.AT_FDCWD, b, unix.RENAME_EXCHANGE)
	if errors.Is(err, unix.EINVAL) || errors.Is(err, unix.ENOSYS) || errors.Is(err, unix.EOPNOTSUPP) {
		return errNoExchange
	}
	return err
}
