package batch

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"kneeprint/cmd/internal/files"
	"kneeprint/cmd/internal/inputs"
	"kneeprint/cmd/internal/spec"
)

// CheckPlan checks what a plan read from planPath names: every aircraft, airfield and
// template file exists, is a regular file of the kind its list needs and reads
// without error, and the output, where it exists, is a folder. Each problem is
// reported at the plan's line naming the file.
func CheckPlan(plan *spec.Plan, planPath string) spec.ErrorList {
	planDir := filepath.Dir(planPath)
	var errs spec.ErrorList
	for _, ref := range plan.Refs {
		fail := func(format string, args ...any) {
			errs = append(errs, &spec.FieldError{File: planPath, Line: ref.Line, Column: ref.Column, Field: ref.Field(), Msg: fmt.Sprintf(format, args...)})
		}
		var want spec.Kind
		src := inputs.In(planDir, ref.Value)
		switch ref.List {
		case "output":
			if st, err := os.Stat(src); err == nil && !st.IsDir() {
				fail("%s is a file, not a folder: the cards are written into a folder", src)
			}
			continue
		case "aircraft":
			want = spec.KindAircraft
		case "airfields":
			want = spec.KindAirfield
		case "templates":
			src = templateSource(planDir, ref.Value)
			if _, err := inputs.Template(src); err != nil {
				fail("%s", problem(src, err))
			}
			continue
		}
		s, err := inputs.Resolve(src)
		if err != nil {
			fail("%v", err)
			continue
		}
		doc, err := s.Load()
		switch {
		case err != nil && (doc == nil || doc.Kind == ""):
			fail("%s", problem(src, err))
		case doc.Kind != want:
			fail("%s is %s file, %s file is needed here", src, article(doc.Kind), article(want))
		case err != nil:
			fail("%s", problem(src, err))
		}
	}
	return errs
}

// problem says in one line why a file a plan names cannot be used.
func problem(src string, err error) string {
	var nr *files.NotRegularError
	var list spec.ErrorList
	switch {
	case isNotExist(err):
		return fmt.Sprintf("%s: no such file", src)
	case errors.As(err, &nr):
		return nr.Error()
	case errors.As(err, &list):
		more := ""
		if len(list) > 1 {
			more = fmt.Sprintf(" (and %d more: run 'kneeprint validate %s')", len(list)-1, src)
		}
		return fmt.Sprintf("%s has errors: %s%s", src, list[0].Error(), more)
	}
	return fmt.Sprintf("%s: %v", src, err)
}

func article(k spec.Kind) string {
	if k == spec.KindAircraft || k == spec.KindAirfield {
		return "an " + string(k)
	}
	return "a " + string(k)
}
