//go:build !unix

package files

import "os"

// openNonBlocking checks that path is a regular file before opening it: the systems
// built here (not Unix) have no named pipes a plain open would block on in the file
// system's name space.
func openNonBlocking(path string) (*os.File, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if !st.Mode().IsRegular() {
		return nil, &NotRegularError{Path: path, Mode: st.Mode()}
	}
	return os.Open(path)
}
