package report

import (
	"encoding/json"
	"io"
)

// WriteJSON writes v as indented JSON, the form every --json output takes.
func WriteJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}
