// Package pdf prints a built package to PDF with a locally installed
// Chromium, driven through the DevTools protocol (chromedp). It starts the
// browser headless with a fresh profile and without any network service of
// its own, opens each page from disk, and prints it as the page's print
// stylesheet lays it out.
package pdf

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"

	"github.com/chromedp/chromedp"
)

// ErrNoChromium says that no Chromium was found.
var ErrNoChromium = errors.New("no Chromium found: install Debian's package chromium (apt-get install chromium), " +
	"or set SHEAF_CHROMIUM to the path of a Chromium or Chrome browser")

// candidates are the names a Chromium goes by on the PATH.
var candidates = []string{"chromium", "chromium-browser", "google-chrome-stable", "google-chrome"}

// FindChromium returns the path of the browser to print with: SHEAF_CHROMIUM
// when it is set, else the first Chromium on the PATH.
func FindChromium() (string, error) {
	if p := os.Getenv("SHEAF_CHROMIUM"); p != "" {
		if _, err := os.Stat(p); err != nil {
			return "", fmt.Errorf("SHEAF_CHROMIUM is %s, which cannot be used: %v", p, err)
		}
		return p, nil
	}
	for _, name := range candidates {
		if p, err := exec.LookPath(name); err == nil {
			return p, nil
		}
	}
	return "", ErrNoChromium
}

// Browser is a headless Chromium that sheaf started, with a profile of its
// own that Close removes.
type Browser struct {
	ctx     context.Context
	cancel  func()
	profile string
}

// Start starts a headless Chromium. The flags keep it from reaching for the
// network on its own (updates, sync, field trials), which a closed network
// refuses and a build has no use for. A Chromium that exits before it is
// ready (seen now and then on a loaded machine) is started once more, with
// a fresh profile.
func Start(parent context.Context) (*Browser, error) {
	exe, err := FindChromium()
	if err != nil {
		return nil, err
	}
	for attempt := 1; ; attempt++ {
		b, err := start(parent, exe)
		if err == nil || attempt == 2 || parent.Err() != nil {
			return b, err
		}
	}
}

// start starts Chromium once.
func start(parent context.Context, exe string) (*Browser, error) {
	profile, err := os.MkdirTemp("", "sheaf-chromium-")
	if err != nil {
		return nil, err
	}
	actx, acancel := chromedp.NewExecAllocator(parent,
		chromedp.ExecPath(exe),
		chromedp.Headless, chromedp.NoSandbox, chromedp.DisableGPU, chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-extensions", true),
		chromedp.UserDataDir(profile),
	)
	ctx, cancel := chromedp.NewContext(actx)
	// Start the browser now, so that a browser that cannot start says so here.
	if err := chromedp.Do(ctx); err != nil {
		cancel()
		acancel()
		os.RemoveAll(profile)
		return nil, fmt.Errorf("starting %s: %w", exe, err)
	}
	return &Browser{ctx: ctx, cancel: func() { cancel(); acancel() }, profile: profile}, nil
}

// Tab opens a new tab of the browser; cancel closes it.
func (b *Browser) Tab() (context.Context, context.CancelFunc) {
	return chromedp.NewContext(b.ctx)
}

// Close stops the browser and removes its profile.
func (b *Browser) Close() {
	b.cancel()
	os.RemoveAll(b.profile)
}
