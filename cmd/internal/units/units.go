// Package units parses the quantities a pilot writes in kneeprint files and on the
// command line ("2690 ft", "1100 kg", "29.62inHg") into SI values, and formats SI
// values back for printing. Conversion happens here, at the edges, and nowhere else.
//
// Exact definitions used (each is a defined constant, not a measurement):
//
//	1 ft   = 0.3048 m                 international yard and pound agreement, 1959
//	1 lb   = 0.45359237 kg            international yard and pound agreement, 1959
//	1 kt   = 1852/3600 m/s            ICAO Annex 5 (1 NM = 1852 m)
//	1 mph  = 1609.344/3600 m/s        international yard and pound agreement, 1959
//	1 inHg = 3386.389 Pa              conventional inch of mercury (NIST SP 811, B.8)
//	1 hp   = 550 ft lbf/s = 745.69987158227022 W  (mechanical horsepower, NIST SP 811)
//	degC   = K - 273.15; degF = degC x 9/5 + 32   (ISO 80000-5)
package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Dimension is the physical kind of a quantity.
type Dimension int

// The dimensions kneeprint files use.
const (
	Length Dimension = iota
	Mass
	Temperature
	Pressure
	Speed
	Slope
	Angle
	Area
	Power
	Duration
	Percent
)

// Exact conversion factors to SI. Sources in the package comment.
const (
	MetresPerFoot       = 0.3048
	KilogramsPerPound   = 0.45359237
	MetresPerSecPerKnot = 1852.0 / 3600.0
	MetresPerSecPerMph  = 1609.344 / 3600.0
	MetresPerSecPerKmh  = 1000.0 / 3600.0
	PascalsPerInHg      = 3386.389
	PascalsPerHPa       = 100.0
	WattsPerHorsepower  = 745.69987158227022
	KelvinAtZeroCelsius = 273.15
	SquareMetresPerFt2  = MetresPerFoot * MetresPerFoot
)

type unitDef struct {
	name string
	// toSI converts a value in this unit to SI (K for temperature, % for slope,
	// degrees for angles: those two stay in their usual units by design).
	toSI func(float64) float64
}

func scale(f float64) func(float64) float64 { return func(v float64) float64 { return v * f } }

// units lists accepted spellings per dimension; the first spelling is the one
// shown in error messages.
var table = map[Dimension][]struct {
	spellings []string
	def       unitDef
}{
	Length: {
		{[]string{"m"}, unitDef{"m", scale(1)}},
		{[]string{"ft"}, unitDef{"ft", scale(MetresPerFoot)}},
	},
	Mass: {
		{[]string{"kg"}, unitDef{"kg", scale(1)}},
		{[]string{"lb", "lbs"}, unitDef{"lb", scale(KilogramsPerPound)}},
	},
	Temperature: {
		{[]string{"C", "°C", "degC"}, unitDef{"C", func(v float64) float64 { return v + KelvinAtZeroCelsius }}},
		{[]string{"F", "°F", "degF"}, unitDef{"F", func(v float64) float64 { return (v-32)*5/9 + KelvinAtZeroCelsius }}},
	},
	Pressure: {
		{[]string{"hPa", "mb", "mbar"}, unitDef{"hPa", scale(PascalsPerHPa)}},
		{[]string{"inHg"}, unitDef{"inHg", scale(PascalsPerInHg)}},
	},
	Speed: {
		{[]string{"kt", "kts", "kn"}, unitDef{"kt", scale(MetresPerSecPerKnot)}},
		{[]string{"km/h", "kmh"}, unitDef{"km/h", scale(MetresPerSecPerKmh)}},
		{[]string{"mph"}, unitDef{"mph", scale(MetresPerSecPerMph)}},
		{[]string{"m/s"}, unitDef{"m/s", scale(1)}},
	},
	Slope: {
		{[]string{"%"}, unitDef{"%", scale(1)}},
	},
	Angle: {
		{[]string{"deg", "°"}, unitDef{"deg", scale(1)}},
	},
	Area: {
		{[]string{"m2", "m²"}, unitDef{"m2", scale(1)}},
		{[]string{"ft2", "ft²"}, unitDef{"ft2", scale(SquareMetresPerFt2)}},
	},
	Power: {
		{[]string{"kW"}, unitDef{"kW", scale(1000)}},
		{[]string{"hp"}, unitDef{"hp", scale(WattsPerHorsepower)}},
	},
	Duration: {
		{[]string{"s"}, unitDef{"s", scale(1)}},
	},
	Percent: {
		{[]string{"%"}, unitDef{"%", scale(1)}},
	},
}

var dimNames = map[Dimension]string{
	Length: "length", Mass: "mass", Temperature: "temperature", Pressure: "pressure",
	Speed: "speed", Slope: "slope", Angle: "angle", Area: "area", Power: "power",
	Duration: "duration", Percent: "percentage",
}

// String names the dimension in lower case.
func (d Dimension) String() string { return dimNames[d] }

// Accepted lists the unit spellings shown to a user for a dimension.
func Accepted(d Dimension) []string {
	var out []string
	for _, u := range table[d] {
		out = append(out, u.def.name)
	}
	return out
}

// Parse reads "<number> <unit>" (the space is optional) for dimension d and returns
// the value in SI (kelvin for temperature; percent for slope and degrees for angles
// are kept as such). A bare number, an unknown unit, NaN or an infinity is an error
// that lists the units accepted.
func Parse(s string, d Dimension) (float64, error) {
	v, _, err := ParseUnit(s, d)
	return v, err
}

// ParseUnit is Parse that also returns the canonical name of the unit written.
func ParseUnit(s string, d Dimension) (float64, string, error) {
	s = strings.TrimSpace(s)
	accepted := strings.Join(Accepted(d), ", ")
	if s == "" {
		return 0, "", fmt.Errorf("empty %s: write a number and one of %s", d, accepted)
	}
	i := numberPrefix(s)
	if i == 0 {
		return 0, "", fmt.Errorf("%q is not a %s: write a number and one of %s", s, d, accepted)
	}
	num, rest := s[:i], strings.TrimSpace(s[i:])
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, "", fmt.Errorf("%q is not a finite number", num)
	}
	if rest == "" {
		return 0, "", fmt.Errorf("%q has no unit: write it with one of %s", s, accepted)
	}
	for _, u := range table[d] {
		for _, sp := range u.spellings {
			if rest == sp {
				si := u.def.toSI(v)
				if math.IsInf(si, 0) || math.IsNaN(si) {
					return 0, "", fmt.Errorf("%q is out of range", s)
				}
				return si, u.def.name, nil
			}
		}
	}
	return 0, "", fmt.Errorf("%q: unknown %s unit %q, accepted: %s", s, d, rest, accepted)
}

// numberPrefix returns the length of the leading decimal number in s (sign, digits,
// one point, an optional exponent). Words such as NaN or Inf are not numbers here.
func numberPrefix(s string) int {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && (s[i] >= '0' && s[i] <= '9') {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && (s[i] >= '0' && s[i] <= '9') {
			i++
			digits++
		}
	}
	if digits == 0 {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return i
}

// Conversions from SI for printing.

// Feet converts metres to feet.
func Feet(m float64) float64 { return m / MetresPerFoot }

// Pounds converts kilograms to pounds.
func Pounds(kg float64) float64 { return kg / KilogramsPerPound }

// Knots converts metres per second to knots.
func Knots(ms float64) float64 { return ms / MetresPerSecPerKnot }

// Celsius converts kelvin to degrees Celsius.
func Celsius(k float64) float64 { return k - KelvinAtZeroCelsius }

// HPa converts pascals to hectopascals.
func HPa(pa float64) float64 { return pa / PascalsPerHPa }

// InHg converts pascals to inches of mercury.
func InHg(pa float64) float64 { return pa / PascalsPerInHg }

// Spellings lists every spelling of a unit that Parse accepts for d (Accepted lists
// only the canonical ones), for the files' JSON Schema.
func Spellings(d Dimension) []string {
	var out []string
	for _, u := range table[d] {
		out = append(out, u.spellings...)
	}
	return out
}

// FromSI converts SI value x of dimension d to the unit named unit (a canonical name,
// as ParseUnit returns it). Every unit's conversion to SI is linear or affine
// (temperature), so the inverse is (x - toSI(0)) / (toSI(1) - toSI(0)). The bool is
// false for a unit d does not have.
func FromSI(x float64, d Dimension, unit string) (float64, bool) {
	for _, u := range table[d] {
		if u.def.name == unit {
			zero := u.def.toSI(0)
			return (x - zero) / (u.def.toSI(1) - zero), true
		}
	}
	return 0, false
}

// siName is the unit SI values of d are printed in when no other is known.
func siName(d Dimension) string { return table[d][0].def.name }

// decimals is how many decimals a value of magnitude |v| is printed with in a
// message: whole units from 100 up, one decimal from 10, two from 1, three below.
// Enough to tell values a user could mean apart, never the 14 digits of a raw
// conversion.
func decimals(v float64) int {
	switch a := math.Abs(v); {
	case a >= 100:
		return 0
	case a >= 10:
		return 1
	case a >= 1:
		return 2
	}
	return 3
}

// unitDecimals are units read to finer steps than their magnitude suggests: an
// altimeter setting in inches of mercury is read to the hundredth (29.92).
var unitDecimals = map[string]int{"inHg": 2}

// decimalsIn is decimals(v), at least what unit is read to.
func decimalsIn(v float64, unit string) int {
	if d := unitDecimals[unit]; d > decimals(v) {
		return d
	}
	return decimals(v)
}

// trimmed prints v with dec decimals and no trailing zeros.
func trimmed(v float64, dec int) string {
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s
}

// roundTo rounds v to dec decimals in the direction dir (-1 down, +1 up, 0 nearest).
// A value within a billionth of a step of a rounded one is taken as that value, so a
// bound that is exact in the unit (10 ft stored as 3.048 m) prints as written.
func roundTo(v float64, dec, dir int) float64 {
	p := math.Pow(10, float64(dec))
	x := v * p
	if r := math.Round(x); math.Abs(x-r) < 1e-9*math.Max(1, math.Abs(x)) {
		return r / p
	}
	switch dir {
	case -1:
		return math.Floor(x) / p
	case 1:
		return math.Ceil(x) / p
	}
	return math.Round(x) / p
}

// Format prints SI value x of dimension d in unit (its canonical name; the SI unit
// when empty or unknown), rounded to a sensible number of decimals: "610 m",
// "2001 ft", "3.28 ft".
func Format(x float64, d Dimension, unit string) string {
	v, ok := FromSI(x, d, unit)
	if !ok {
		unit = siName(d)
		v, _ = FromSI(x, d, unit)
	}
	dec := decimalsIn(v, unit)
	return trimmed(roundTo(v, dec, 0), dec) + " " + unit
}

// FormatRange prints the SI range lo to hi of dimension d in unit (the SI unit when
// empty or unknown), each bound rounded inwards (the lower up, the upper down) to a
// sensible number of decimals, so that every value the message shows as accepted is
// accepted: "10 to 500 ft", "3.29 to 19685 ft".
func FormatRange(lo, hi float64, d Dimension, unit string) string {
	a, ok := FromSI(lo, d, unit)
	if !ok {
		unit = siName(d)
		a, _ = FromSI(lo, d, unit)
	}
	b, _ := FromSI(hi, d, unit)
	return boundIn(a, 1, unit) + " to " + boundIn(b, -1, unit) + " " + unit
}

// FormatNumberRange prints the plain-number range lo to hi with each bound as it is
// when it has at most three decimals, else rounded inwards to a sensible number of
// decimals: "1 to 19685", "0.01 to 0.15", "-10.16 to 25.4".
func FormatNumberRange(lo, hi float64) string {
	return boundIn(lo, 1, "") + " to " + boundIn(hi, -1, "")
}

// boundIn prints a range bound v in unit, as it is when it has at most three
// decimals, else rounded in the direction dir (+1 up, -1 down) to decimalsIn(v, unit).
func boundIn(v float64, dir int, unit string) string {
	if exact := roundTo(v, 3, 0); math.Abs(exact-v) < 1e-9*math.Max(1, math.Abs(v)) {
		return trimmed(exact, 3)
	}
	d := decimalsIn(v, unit)
	return trimmed(roundTo(v, d, dir), d)
}

// UnitOf is the canonical name of the unit text s is written in for dimension d, or
// the SI unit's name when s does not parse.
func UnitOf(s string, d Dimension) string {
	if _, u, err := ParseUnit(s, d); err == nil {
		return u
	}
	return siName(d)
}
