package spec

import (
	"fmt"
	"time"

	"gopkg.in/yaml.v3"
)

// KindPlan is a season plan file.
const KindPlan Kind = "plan"

// Plan is a season batch: every aircraft at every airfield with every template.
// Paths are as written in the file (relative to the plan's folder, or demo:NAME).
type Plan struct {
	Name       string
	Aircraft   []string
	Airfields  []string
	Templates  []string // preset names or card-template files; default a5
	Unit       string   // "" keeps each template's unit
	Policy     string   // "" keeps each template's policy
	Date       time.Time
	ValidUntil time.Time // zero: date + the template's valid_days
	Output     string
	Sheet      string // "" for one card per page

	// Refs are the files and the folder the plan names, with where it names them, so
	// that a check of the files can point at the plan's line.
	Refs []PlanRef
}

// PlanRef is one file (or the output folder) a plan names, and where.
type PlanRef struct {
	List         string // "aircraft", "airfields", "templates" or "output"
	Index        int    // position in the list
	Value        string // as written
	Line, Column int
}

// Field names the reference as messages do: aircraft[1], output.
func (r PlanRef) Field() string {
	if r.List == "output" {
		return r.List
	}
	return fmt.Sprintf("%s[%d]", r.List, r.Index)
}

// Plan size limits: far above a club's fleet and fields, far below a runaway file.
const (
	maxPlanAircraft  = 200
	maxPlanAirfields = 500
	maxPlanTemplates = 6
)

func (d *decoder) plan(m *mapping) *Plan {
	p := &Plan{}
	p.Name = m.str("name", true)
	p.Aircraft = d.strList(m, "aircraft", maxPlanAircraft, &p.Refs)
	p.Airfields = d.strList(m, "airfields", maxPlanAirfields, &p.Refs)
	if m.has("templates") {
		p.Templates = d.strList(m, "templates", maxPlanTemplates, &p.Refs)
	} else {
		m.get("templates", false)
		p.Templates = []string{"a5"}
		d.notef("templates not given: the a5 preset")
	}
	p.Unit = m.oneOf("unit", false, "m", "ft")
	p.Policy = m.oneOf("policy", false, "uk-advisory", "eu-class-b")
	p.Date = d.date(m, "date", true)
	p.ValidUntil = d.date(m, "valid_until", false)
	if !p.ValidUntil.IsZero() && !p.Date.IsZero() && !p.ValidUntil.After(p.Date) {
		d.errorf(m.vals["valid_until"], "valid_until", "must be after the date")
	}
	p.Output = m.str("output", true)
	if v := m.vals["output"]; v != nil && p.Output != "" {
		p.Refs = append(p.Refs, PlanRef{List: "output", Value: p.Output, Line: v.Line, Column: v.Column})
	}
	p.Sheet = m.oneOf("sheet", false, "a4", "letter")
	m.finish()
	return p
}

func (d *decoder) strList(m *mapping, key string, max int, refs *[]PlanRef) []string {
	items := m.list(key, true)
	if len(items) > max {
		d.errorf(m.vals[key], key, "%d entries, at most %d accepted", len(items), max)
		return nil
	}
	var out []string
	seen := map[string]int{}
	for i, it := range items {
		field := fmt.Sprintf("%s[%d]", key, i)
		if it.Kind != yaml.ScalarNode || it.Value == "" {
			d.errorf(it, field, "expected a file name (or demo:NAME), found %s", describe(it))
			continue
		}
		if j, dup := seen[it.Value]; dup {
			d.errorf(it, field, "%q is listed twice (first as %s[%d])", it.Value, key, j)
			continue
		}
		seen[it.Value] = i
		out = append(out, it.Value)
		*refs = append(*refs, PlanRef{List: key, Index: i, Value: it.Value, Line: it.Line, Column: it.Column})
	}
	return out
}

func (d *decoder) date(m *mapping, key string, required bool) time.Time {
	v := m.get(key, required)
	if v == nil {
		return time.Time{}
	}
	t, err := time.Parse("2006-01-02", v.Value)
	if err != nil || v.Kind != yaml.ScalarNode {
		d.errorf(v, m.field(key), "%q: write the date as YYYY-MM-DD", v.Value)
		return time.Time{}
	}
	return t
}
