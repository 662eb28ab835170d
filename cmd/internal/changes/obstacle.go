package changes

import (
	"fmt"
	"math"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// obstacleText is an obstacle as a pilot reads it in a diff: "powerline 35 ft, 400 m
// past the end" (height in feet, the trade's unit; distances in metres as the other
// fields of a diff).
func obstacleText(o perf.Obstacle) string {
	s := fmt.Sprintf("%s %.0f ft, %.0f m past the end", o.Note, math.Ceil(units.Feet(o.HeightM)-1e-9), math.Floor(o.PastEndM+1e-9))
	switch {
	case o.LateralM < 0:
		s += fmt.Sprintf(", %.0f m left", -o.LateralM)
	case o.LateralM > 0:
		s += fmt.Sprintf(", %.0f m right", o.LateralM)
	}
	return s
}

// obstacleFields lists the obstacles added, removed or changed between two versions
// of a runway end (issue 12): an obstacle whose note appears once in each version is
// the same obstacle, changed when its figures differ; any other is removed or added.
func obstacleFields(old, new perf.RunwayEnd, add func(field, o, n string)) {
	count := func(os []perf.Obstacle) map[string]int {
		m := map[string]int{}
		for _, o := range os {
			m[o.Note]++
		}
		return m
	}
	oc, nc := count(old.Obstacles), count(new.Obstacles)
	matched := map[string]bool{}
	for _, o := range old.Obstacles {
		if oc[o.Note] != 1 || nc[o.Note] != 1 {
			continue
		}
		for _, n := range new.Obstacles {
			if n.Note == o.Note {
				add("obstacle "+o.Note, obstacleText(o), obstacleText(n))
				matched[o.Note] = true
			}
		}
	}
	oldText, newText := map[string]int{}, map[string]int{}
	for _, o := range old.Obstacles {
		if !matched[o.Note] {
			oldText[obstacleText(o)]++
		}
	}
	for _, n := range new.Obstacles {
		if !matched[n.Note] {
			newText[obstacleText(n)]++
		}
	}
	for _, o := range old.Obstacles {
		if t := obstacleText(o); !matched[o.Note] && oldText[t] > newText[t] {
			add("obstacle", t, "removed")
			oldText[t]--
		}
	}
	for _, n := range new.Obstacles {
		if t := obstacleText(n); !matched[n.Note] && newText[t] > oldText[t] {
			add("obstacle", "none", t)
			newText[t]--
		}
	}
}
