package report

import (
	"math"
	"strconv"
	"strings"
)

// multiplier prints a factor exactly as it is applied, as a card prints it (×1.33,
// +1.5 % for 1.015): up to six decimals without trailing zeros ("x1.015", "x1.33",
// "x1"), never rounded to fewer digits than the factor has; a factor that is the
// reciprocal of a short decimal is named as such too ("x1.428571 (1/0.7)", the 70 %
// of the LDA of CAT.POL.A.330(a)).
func multiplier(v float64) string {
	s := "x" + trimmed(v, 6)
	if inv := 1 / v; !hasDecimals(v, 6) && inv > 0 && inv < 1 && hasDecimals(inv, 3) {
		s += " (1/" + trimmed(inv, 3) + ")"
	}
	return s
}

// hasDecimals reports whether v is written exactly with at most n decimals (within
// the float's own noise: 1 + 0.05 x 0.3 is 1.015).
func hasDecimals(v float64, n int) bool {
	p := math.Pow(10, float64(n))
	return math.Abs(v*p-math.Round(v*p)) < 1e-6
}

// trimmed prints v rounded to n decimals, without trailing zeros.
func trimmed(v float64, n int) string {
	s := strconv.FormatFloat(v, 'f', n, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}

// slopeText prints a slope in percent as the factor uses it: up to two decimals, no
// trailing zeros ("0.3", "0.25").
func slopeText(pct float64) string { return trimmed(math.Abs(pct), 2) }
