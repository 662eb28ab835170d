package units

import (
	"fmt"
	"strconv"
	"strings"
)

// WindReport is a wind as a tower or a report gives it.
type WindReport struct {
	FromDeg  float64
	SpeedMS  float64
	GustMS   float64 // 0 when none
	Variable bool    // VRB: direction variable
}

// ParseWind reads a wind written the way a tower or a routine report gives it:
// direction in degrees / speed in knots, with an optional gust: "240/15",
// "240/15G25", "VRB/05", "calm" (or "0/0"). Direction 1 to 360 (000 only when calm),
// speeds 0 to 99 kt.
func ParseWind(s string) (WindReport, error) {
	s = strings.TrimSpace(s)
	if strings.EqualFold(s, "calm") {
		return WindReport{}, nil
	}
	dir, spd, ok := strings.Cut(s, "/")
	if !ok {
		return WindReport{}, fmt.Errorf("wind %q: write direction/speed in knots, e.g. 240/15, 240/15G25, VRB/05 or calm", s)
	}
	var w WindReport
	gust := ""
	if i := strings.IndexAny(spd, "Gg"); i >= 0 {
		spd, gust = spd[:i], spd[i+1:]
	}
	speed, err := knots(spd, "speed")
	if err != nil {
		return w, fmt.Errorf("wind %q: %w", s, err)
	}
	w.SpeedMS = speed
	if gust != "" {
		g, err := knots(gust, "gust")
		if err != nil {
			return w, fmt.Errorf("wind %q: %w", s, err)
		}
		if g < speed {
			return w, fmt.Errorf("wind %q: the gust is below the steady speed", s)
		}
		w.GustMS = g
	}
	if strings.EqualFold(dir, "VRB") {
		w.Variable = true
		return w, nil
	}
	d, err := strconv.Atoi(dir)
	if err != nil || len(dir) > 3 {
		return w, fmt.Errorf("wind %q: direction %q is not whole degrees (1 to 360, or VRB)", s, dir)
	}
	if d == 0 && speed == 0 {
		return WindReport{}, nil
	}
	if d < 1 || d > 360 {
		return w, fmt.Errorf("wind %q: direction %d outside 1 to 360 degrees", s, d)
	}
	w.FromDeg = float64(d)
	return w, nil
}

func knots(s, what string) (float64, error) {
	s = strings.TrimSuffix(strings.TrimSuffix(s, "KT"), "kt")
	n, err := strconv.Atoi(s)
	if err != nil || len(s) > 3 || n < 0 || n > 99 {
		return 0, fmt.Errorf("%s %q is not whole knots from 0 to 99", what, s)
	}
	return float64(n) * MetresPerSecPerKnot, nil
}
