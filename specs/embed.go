// Package specs holds the example spec files of quadwright's scenarios,
// embedded so that `quadwright demo` can run them from any folder.
package specs

import "embed"

// Files are the spec files (*.toml) and the data they name (*.txt).
//
//go:embed *.toml *.txt
var Files embed.FS
