// Package version holds galley's version, recorded in every output and
// in the result cache key.
package version

// Version is the release of galley.
const Version = "0.1.0"
