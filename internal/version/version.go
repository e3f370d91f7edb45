// Package version holds the version of sheaf that every output names.
package version

// Version is sheaf's release version. Rendered packages and JSON carry it
// so that a checker knows which tool built them.
const Version = "0.1.0"
