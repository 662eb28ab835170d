package main

// Exit codes, in one place.
const (
	exitOK      = 0 // done (check and grid: computed, whatever the verdict)
	exitFailure = 1 // bad input data, a failed card, or a change found by diff
	exitUsage   = 2 // the command line itself is wrong
)

// dataError marks an error about the user's files (exit 1), as opposed to a usage
// error (exit 2).
type dataError struct{ err error }

func (e dataError) Error() string { return e.err.Error() }
func (e dataError) Unwrap() error { return e.err }
