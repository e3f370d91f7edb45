//go:build !unix

package build

import (
	"errors"
	"io/fs"
	"os"
)

// errBusy says that another build holds an output folder's lock.
var errBusy = errors.New("locked by another build")

// lock creates the lock file at path, which must not exist, and returns
// its release, which removes it. Where sheaf has no system lock, a killed
// build leaves the file behind, and it must be removed by hand.
func lock(path string) (func(), error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o644)
	if errors.Is(err, fs.ErrExist) {
		return nil, errBusy
	}
	if err != nil {
		return nil, err
	}
	_ = f.Close()
	return func() { _ = os.Remove(path) }, nil
}
