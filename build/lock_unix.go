//go:build unix

package build

import (
	"errors"
	"os"

	"golang.org/x/sys/unix"
)

// errBusy says that another build holds an output folder's lock.
var errBusy = errors.New("locked by another build")

// lock takes the exclusive lock on the file at path, creating it, and
// returns its release. The system drops the lock when the process ends,
// however it ends, so a killed build never leaves a folder locked.
func lock(path string) (func(), error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o644)
	if err != nil {
		return nil, err
	}
	if err := unix.Flock(int(f.Fd()), unix.LOCK_EX|unix.LOCK_NB); err != nil {
		_ = f.Close()
		if errors.Is(err, unix.EWOULDBLOCK) {
			return nil, errBusy
		}
		return nil, err
	}
	return func() { _ = f.Close() }, nil
}
