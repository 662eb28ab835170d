package main

import (
	"fmt"

	kspec "kneeprint/cmd/internal/spec"
	"kneeprint/cmd/internal/units"
)

// defaultObstacleMargin is the --obstacle-margin default: 50 ft, common practice
// (perf.DefaultObstacleMarginM).
const defaultObstacleMargin = "50ft"

// obstacleMarginFlag reads --obstacle-margin: a length, within the range a card
// template accepts (10 to 500 ft).
func obstacleMarginFlag(s string) (float64, error) {
	v, err := quantity("obstacle-margin", s, units.Length)
	if err != nil {
		return 0, err
	}
	if v < kspec.MinObstacleMarginM-1e-9 || v > kspec.MaxObstacleMarginM+1e-9 {
		return 0, fmt.Errorf("--obstacle-margin: %s outside %.0f to %.0f ft", s, units.Feet(kspec.MinObstacleMarginM), units.Feet(kspec.MaxObstacleMarginM))
	}
	return v, nil
}
