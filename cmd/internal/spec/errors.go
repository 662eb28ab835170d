// Package spec reads kneeprint's files (aircraft profiles, airfields) strictly, with
// units, into perf's SI types. Every problem is reported with file, line, column and
// field, and all of a file's problems are reported together.
package spec

import (
	"fmt"
	"strings"
)

// FieldError is one problem in one file, at one place.
type FieldError struct {
	File   string
	Line   int // 1-based; 0 when the problem concerns the whole file
	Column int
	Field  string // dotted path, e.g. runways[0].ends[1].tora
	Msg    string
}

func (e *FieldError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d:%d", e.Line, e.Column)
	}
	if e.Field != "" {
		b.WriteString(": ")
		b.WriteString(e.Field)
	}
	b.WriteString(": ")
	b.WriteString(e.Msg)
	return b.String()
}

// ErrorList is every problem found in a file, in file order.
type ErrorList []*FieldError

func (l ErrorList) Error() string {
	parts := make([]string, len(l))
	for i, e := range l {
		parts[i] = e.Error()
	}
	return strings.Join(parts, "\n")
}

// Err returns nil for an empty list and the list otherwise.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}
