package perf

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const ft = 0.3048 // international foot, 1959 agreement

func TestISATable(t *testing.T) {
	cases := []struct {
		name            string
		hM              float64
		tempK, pPa, sig float64
		src             string
	}{
		// Geopotential altitudes; US Standard Atmosphere 1976, Table I (from memory).
		{"sea level", 0, 288.15, 101325, 1.0, "ICAO Doc 7488 / USSA 1976: sea-level values (defining)"},
		{"1000 m", 1000, 281.65, 89876, 1.1117 / 1.225, "US Standard Atmosphere 1976, Table I (from memory)"},
		{"2000 m", 2000, 275.15, 79501, 1.0066 / 1.225, "US Standard Atmosphere 1976, Table I (from memory)"},
		{"5000 m", 5000, 255.65, 54048, 0.73643 / 1.225, "US Standard Atmosphere 1976, Table I (from memory)"},
		{"11000 m", 11000, 216.65, 22632, 0.36392 / 1.225, "US Standard Atmosphere 1976, Table I (from memory)"},
		// Pressure altitudes in feet; domain notes' check values, which agree with
		// published ISA tables (ICAO Doc 7488 tabulated in feet).
		{"5000 ft", 5000 * ft, 5.09 + 273.15, 84307, 0.8617, "ICAO Doc 7488 ISA table in feet [calc, agrees with published]"},
		{"8000 ft", 8000 * ft, -0.85 + 273.15, 75262, 0.7860, "ICAO Doc 7488 ISA table in feet [calc, agrees with published]"},
		{"10000 ft", 10000 * ft, -4.81 + 273.15, 69682, 0.7385, "ICAO Doc 7488 ISA table in feet [calc, agrees with published]"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			a, err := ISA(tc.hM)
			require.NoError(t, err)
			assert.InEpsilon(t, tc.tempK, a.TempK, 1e-3, "T got %v want %v (%s)", a.TempK, tc.tempK, tc.src)
			assert.InEpsilon(t, tc.pPa, a.PressurePa, 1e-3, "p got %v want %v (%s)", a.PressurePa, tc.pPa, tc.src)
			assert.InEpsilon(t, tc.sig, a.DensityKgM3/ISASeaLevelDensity, 1e-3, "sigma got %v want %v (%s)", a.DensityKgM3/ISASeaLevelDensity, tc.sig, tc.src)
		})
	}
	// Speed of sound at sea level 340.294 m/s (USSA 1976, from memory).
	a, _ := ISA(0)
	assert.InDelta(t, 340.294, a.SpeedOfSoundMS, 0.01)
	// The exponent n = g0/(R L) = 5.25588 (ICAO Doc 7488).
	assert.InDelta(t, 5.25588, isaExponent, 1e-5)
}

func TestISAOutsideRange(t *testing.T) {
	_, err := ISA(12000)
	assert.ErrorIs(t, err, ErrNoData)
	_, err = ISA(math.NaN())
	assert.ErrorIs(t, err, ErrNoData)
}

func TestPressureAltitude(t *testing.T) {
	cases := []struct {
		name   string
		qnhPa  float64
		elevM  float64
		wantFt float64
		tolFt  float64
		src    string
	}{
		{"29.70 inHg at sea level", 29.70 * 3386.389, 0, 205, 2, "FAA Pilot's Handbook of Aeronautical Knowledge, pressure altitude table: 29.70 inHg -> 205 ft [sec]"},
		{"29.92 inHg at sea level", 29.92 * 3386.389, 0, 0, 5, "FAA PHAK: standard setting -> 0 ft"},
		{"QNH 1000 hPa at 5000 ft", 100000, 5000 * ft, 5351, 2, "domain notes [calc]"},
		{"QNH 1013.25 at 2000 ft", 101325, 2000 * ft, 2000, 0.01, "identity: standard QNH gives elevation"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got := PressureAltitudeFromQNH(tc.qnhPa, tc.elevM) / ft
			assert.InDelta(t, tc.wantFt, got, tc.tolFt, "got %.1f ft, want %.0f ft (%s)", got, tc.wantFt, tc.src)
		})
	}
	// Rule of thumb, looser: about 27-30 ft per hPa below 1013 near sea level
	// (common practice).
	perHPa := PressureAltitudeFromQNH(100325, 0) / ft / 10
	assert.InDelta(t, 27.3, perHPa, 1.0, "got %.1f ft/hPa", perHPa)
}

// densityAltitudeBisect finds, independently of DensityAltitudeM, the ISA altitude
// whose density equals rho, by bisection on ISA().
func densityAltitudeBisect(rho float64) float64 {
	lo, hi := -2000.0, 11000.0
	for i := 0; i < 100; i++ {
		mid := (lo + hi) / 2
		a, _ := ISA(mid)
		if a.DensityKgM3 > rho {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

func TestDensityAltitude(t *testing.T) {
	// PA 5000 ft, OAT 25 C -> DA 7262 ft (domain notes [calc]).
	got := DensityAltitudeM(5000*ft, 298.15) / ft
	assert.InDelta(t, 7262, got, 3, "got %.0f ft", got)
	for _, tc := range []struct{ paFt, oatC float64 }{{0, 15}, {0, 35}, {3000, 30}, {5000, -10}, {8000, 20}} {
		pa, oat := tc.paFt*ft, tc.oatC+273.15
		got := DensityAltitudeM(pa, oat)
		want := densityAltitudeBisect(DensityKgM3(pa, oat))
		assert.InDelta(t, want, got, 0.5, "PA %.0f ft OAT %.0f C: got %.1f m, bisection %.1f m", tc.paFt, tc.oatC, got, want)
		// Rule of thumb, looser: DA ~ PA + 120 ft per degree above ISA (common practice).
		dev := oat - ISATempK(pa)
		thumb := tc.paFt + 120*dev
		assert.InDelta(t, thumb, got/ft, 0.1*math.Abs(120*dev)+150, "rule of thumb: got %.0f ft, thumb %.0f ft", got/ft, thumb)
	}
	// At ISA temperature, DA = PA exactly (property).
	assert.InDelta(t, 4000*ft, DensityAltitudeM(4000*ft, ISATempK(4000*ft)), 1e-6)
}

// Issue 9.7: the pressure altitude of a takeoff uses the highest of the aerodrome
// elevation and the runway's threshold elevations (the aerodrome elevation is defined
// as the highest point of the landing area, ICAO Annex 14 definitions; a file can still
// say otherwise, and the higher figure is the conservative one).
func TestTakeoffElevation(t *testing.T) {
	f := Airfield{ElevationM: 4950 * ft, Runways: []Runway{
		{Ends: []RunwayEnd{{Designator: "04", ElevationM: 4935 * ft}, {Designator: "22", ElevationM: 4975 * ft}}},
		{Ends: []RunwayEnd{{Designator: "13", ElevationM: 4940 * ft}, {Designator: "31", ElevationM: 4945 * ft}}},
	}}
	assert.InDelta(t, 4975*ft, TakeoffElevationM(f, f.Runways[0].Ends[0]), 1e-9, "the far threshold of 04 is the highest")
	assert.InDelta(t, 4975*ft, TakeoffElevationM(f, f.Runways[0].Ends[1]), 1e-9)
	assert.InDelta(t, 4950*ft, TakeoffElevationM(f, f.Runways[1].Ends[0]), 1e-9, "the aerodrome elevation when above both thresholds")
	// Property: never below the aerodrome elevation nor the end's own threshold.
	for _, e := range f.Ends() {
		assert.GreaterOrEqual(t, TakeoffElevationM(f, e), f.ElevationM)
		assert.GreaterOrEqual(t, TakeoffElevationM(f, e), e.ElevationM)
	}
}
