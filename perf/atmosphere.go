package perf

import (
	"fmt"
	"math"
)

// ISA constants, ICAO Doc 7488/3 (Manual of the ICAO Standard Atmosphere), Table A;
// the same values define ISO 2533:1975 and the US Standard Atmosphere 1976 below
// 11 km geopotential altitude.
const (
	ISASeaLevelTempK      = 288.15    // T0
	ISASeaLevelPressurePa = 101325.0  // p0
	ISASeaLevelDensity    = 1.225     // rho0, kg/m3
	ISALapseRateKPerM     = 0.0065    // L, troposphere
	StandardGravity       = 9.80665   // g0, m/s2
	GasConstantAir        = 287.05287 // R, J/(kg K) (ICAO Doc 7488; 287.053 rounded)
	ratioOfSpecificHeats  = 1.4       // gamma for air
	TropopauseM           = 11000.0   // top of the layer these formulas hold in
	isaLowestM            = -5000.0   // ICAO Doc 7488 tabulates from -5 km
)

// isaExponent is n = g0 / (R L) = 5.25588 (ICAO Doc 7488).
const isaExponent = StandardGravity / (GasConstantAir * ISALapseRateKPerM)

// Atmosphere is the state of the air at one point.
type Atmosphere struct {
	TempK          float64
	PressurePa     float64
	DensityKgM3    float64
	SpeedOfSoundMS float64
}

// ISA returns the International Standard Atmosphere at geopotential altitude hM:
//
//	T = T0 - L h
//	p = p0 (T/T0)^n,  n = g0/(R L)
//	rho = p / (R T)
//	a = sqrt(gamma R T)
//
// Source: ICAO Doc 7488/3, eqs. for the troposphere; ISO 2533. Valid from -5000 m to
// the tropopause at 11 000 m; outside that an error is returned, never a number.
func ISA(hM float64) (Atmosphere, error) {
	if !(hM >= isaLowestM && hM <= TropopauseM) {
		return Atmosphere{}, fmt.Errorf("%w: altitude %.0f m is outside the ISA troposphere (%.0f to %.0f m)", ErrNoData, hM, isaLowestM, TropopauseM)
	}
	t := ISASeaLevelTempK - ISALapseRateKPerM*hM
	p := ISASeaLevelPressurePa * math.Pow(t/ISASeaLevelTempK, isaExponent)
	return Atmosphere{
		TempK:          t,
		PressurePa:     p,
		DensityKgM3:    p / (GasConstantAir * t),
		SpeedOfSoundMS: math.Sqrt(ratioOfSpecificHeats * GasConstantAir * t),
	}, nil
}

// ISATempK is the ISA temperature at pressure altitude paM (T0 - L h), used for
// "ISA deviation".
func ISATempK(paM float64) float64 { return ISASeaLevelTempK - ISALapseRateKPerM*paM }

// PressureAtAltitudePa is the ISA pressure at pressure altitude paM, p0 (1 - L h/T0)^n.
func PressureAtAltitudePa(paM float64) float64 {
	return ISASeaLevelPressurePa * math.Pow(1-ISALapseRateKPerM*paM/ISASeaLevelTempK, isaExponent)
}

// PressureAltitudeM is the altitude in the ISA at which the pressure is pPa:
//
//	Hp = (T0/L) [1 - (p/p0)^(1/n)]
//
// Source: ICAO Doc 7488 (inverse of the troposphere pressure law). Meaningful for
// pressures of the troposphere (above about 227 hPa).
func PressureAltitudeM(pPa float64) float64 {
	return ISASeaLevelTempK / ISALapseRateKPerM * (1 - math.Pow(pPa/ISASeaLevelPressurePa, 1/isaExponent))
}

// StationPressurePa is the pressure at elevation elevM when the QNH is qnhPa. QNH is
// defined by reducing the station pressure to mean sea level through the ISA
// (ICAO Doc 8896, Manual of Aeronautical Meteorological Practice), so
//
//	p = QNH (1 - L h / T0)^n
func StationPressurePa(qnhPa, elevM float64) float64 {
	return qnhPa * math.Pow(1-ISALapseRateKPerM*elevM/ISASeaLevelTempK, isaExponent)
}

// PressureAltitudeFromQNH is the pressure altitude of a place at elevation elevM when
// the QNH is qnhPa: PressureAltitudeM(StationPressurePa(qnh, elev)).
func PressureAltitudeFromQNH(qnhPa, elevM float64) float64 {
	return PressureAltitudeM(StationPressurePa(qnhPa, elevM))
}

// DensityKgM3 is the air density at pressure altitude paM and outside air
// temperature oatK: rho = p(Hp) / (R T), the ideal gas law with the ISA pressure.
func DensityKgM3(paM, oatK float64) float64 {
	return PressureAtAltitudePa(paM) / (GasConstantAir * oatK)
}

// DensityAltitudeM is the altitude in the ISA whose density equals the density at
// pressure altitude paM and temperature oatK:
//
//	sigma = rho / rho0
//	DA = (T0/L) [1 - sigma^(1/(n-1))]
//
// Exact within the ISA troposphere; not the 120 ft per degree rule of thumb.
func DensityAltitudeM(paM, oatK float64) float64 {
	sigma := DensityKgM3(paM, oatK) / isaDensity0()
	return ISASeaLevelTempK / ISALapseRateKPerM * (1 - math.Pow(sigma, 1/(isaExponent-1)))
}

// isaDensity0 is rho0 computed from p0/(R T0) = 1.2250 kg/m3, so that the ISA
// itself has density altitude exactly equal to pressure altitude.
func isaDensity0() float64 { return ISASeaLevelPressurePa / (GasConstantAir * ISASeaLevelTempK) }

// TakeoffElevationM is the elevation a takeoff from runway end e of airfield f takes
// its pressure altitude at: the highest of the aerodrome elevation and the threshold
// elevations of e's runway (both ends). The aerodrome elevation is by definition the
// highest point of the landing area (ICAO Annex 14, definitions), but a file can give a
// threshold above it; the higher figure gives the higher pressure altitude, which is
// the conservative one.
func TakeoffElevationM(f Airfield, e RunwayEnd) float64 {
	h := math.Max(f.ElevationM, e.ElevationM)
	for _, r := range f.Runways {
		mine := false
		for _, x := range r.Ends {
			mine = mine || x.Designator == e.Designator
		}
		if !mine {
			continue
		}
		for _, x := range r.Ends {
			h = math.Max(h, x.ElevationM)
		}
	}
	return h
}
