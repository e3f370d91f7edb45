package project

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"sort"
	"strconv"
	"strings"
	"time"

	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/sheets"
)

// SourceFile is one file a package was built from.
type SourceFile struct {
	Path   string `json:"path"`   // inside the package, with forward slashes
	SHA256 string `json:"sha256"` // hex
	Bytes  int    `json:"bytes"`
}

// sourceFiles lists the files with their hashes, sorted by path.
func sourceFiles(files map[string][]byte) []SourceFile {
	out := make([]SourceFile, 0, len(files))
	for p, data := range files {
		sum := sha256.Sum256(data)
		out = append(out, SourceFile{Path: p, SHA256: hex.EncodeToString(sum[:]), Bytes: len(data)})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Path < out[j].Path })
	return out
}

// StampOf is the package stamp: the SHA-256 over the tool version and, for
// every source file in path order, its path and its own SHA-256. Any change
// to any source, a renamed or added file, or another version of sheaf
// gives another stamp.
func StampOf(files []SourceFile, toolVersion string) string {
	h := sha256.New()
	fmt.Fprintf(h, "sheaf %s\n", toolVersion)
	for _, f := range files {
		fmt.Fprintf(h, "%s\x00%s\n", f.Path, f.SHA256)
	}
	return "sha256:" + hex.EncodeToString(h.Sum(nil))
}

// Stamp is the package's stamp with this version of sheaf.
func (p *Package) Stamp() string { return StampOf(p.Files, version.Version) }

// BuildDate is the date a build states, taken from the sources and never
// from the clock, so that builds stay byte-identical: SOURCE_DATE_EPOCH
// (seconds since 1970, the reproducible-builds convention) when set,
// otherwise the latest date in the sheets' front matter, otherwise "".
func (p *Package) BuildDate(sourceDateEpoch string) string {
	if sourceDateEpoch != "" {
		if secs, err := strconv.ParseInt(strings.TrimSpace(sourceDateEpoch), 10, 64); err == nil {
			// An epoch past year 9999 (or before year 0) would format as
			// no YYYY-MM-DD date; it is ignored like a malformed one.
			if d := time.Unix(secs, 0).UTC().Format("2006-01-02"); isISODate(d) {
				return d
			}
		}
	}
	return p.latestDate
}

// latestDate is the latest date in the front matter of the pages.
func latestDate(pages []*sheets.Document) string {
	latest := ""
	for _, d := range pages {
		if date := d.Meta.Date; isISODate(date) && date > latest {
			latest = date
		}
	}
	return latest
}

// isISODate reports whether s is a calendar date written YYYY-MM-DD.
func isISODate(s string) bool {
	_, err := time.Parse("2006-01-02", s)
	return err == nil
}
