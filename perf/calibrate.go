package perf

import (
	"errors"
	"fmt"
	"math"
)

// Physical bounds of the two fitted propeller figures. A fit that ends on one of
// them is refused: the rest of the description (power, diameter, drag, speeds) does
// not describe the manual's distances, and a parameter pinned at a bound would carry
// that error into every card.
//
//   - Static thrust fraction, the static thrust over the momentum-theory ideal
//     T_ideal = (2 rho A P^2)^(1/3): at most 1. The actuator-disc (Rankine-Froude)
//     momentum theory is the ideal no propeller beats; the fraction is the figure of
//     merit to the power 2/3 and the figure of merit cannot exceed 1 (Gudmundsson,
//     General Aviation Aircraft Design, ch. 14, momentum theory; McCormick,
//     Aerodynamics, Aeronautics and Flight Mechanics, ch. 6; from memory of the
//     sections). At least 0.35: a figure of merit near 0.2, a propeller stalled far
//     beyond any fixed-pitch cruise propeller (from memory).
//   - Propeller efficiency at lift-off and in the climb-out, eta = T V / P: at most
//     0.85, the peak of good light-aircraft propellers at their design speed, which
//     they do not reach at 50 to 70 kt (Gudmundsson ch. 14, Raymer ch. 13; from
//     memory); at least 0.35 (from memory: half of a typical climb efficiency).
const (
	MinStaticThrustFrac = 0.35
	MaxStaticThrustFrac = 1.0
	MinPropEfficiency   = 0.35
	MaxPropEfficiency   = 0.85
)

// CalibrationTolerancePct is the largest residual a calibration accepts on any
// figure: 5 %. Manual figures are printed to 5 or 10 m (1 to 2 % of a light
// aircraft's distances) and the physics leaves out details a test pilot's figures
// contain; a larger misfit means the description or a typed figure is wrong (common
// practice for fitting a performance model to flight-test data). Note it is far
// inside the 25-40 % optimism an uncalibrated model showed.
const CalibrationTolerancePct = 5.0

// MaxCalibrationPoints bounds the points a fit takes (a flight-manual table has
// under 200 cells): each point costs one takeoff integration per step of the fit.
const MaxCalibrationPoints = 400

// boundMargin is how close, as a fraction of the range, a fitted value may come to a
// bound before the fit counts as having hit it.
const boundMargin = 0.01

// ErrNotCalibrated marks a physics profile that cards and check refuse: it has no
// calibration point at MTOW on a paved, dry runway.
var ErrNotCalibrated = errors.New("the physics model is not calibrated to the flight manual")

// CalibrationPoint is one set of figures from the flight manual (or a measured
// takeoff) with its conditions. Slope is taken as level.
type CalibrationPoint struct {
	Conditions  Conditions // the wind, when given, is used as written: no factoring
	GroundRollM float64    // 0 when the point gives none
	To50ftM     float64    // 0 when the point gives none
	FromTable   bool       // a cell of the profile's own table
}

// PointFit is how the fitted model meets one point.
type PointFit struct {
	GroundRollM, To50ftM     float64 // the fitted model's figures (0 when it gives none)
	GroundRollPct, To50ftPct float64 // residual, (model - manual) / manual x 100; 0 for a figure not given
	Err                      string  // why the model gave no figure, if it did not
}

// Calibration is the fit of a physics description to its calibration points.
type Calibration struct {
	Points []CalibrationPoint
	// Where the fit started (the profile's values or the defaults) and where it ended.
	StartStatic, StartEta float64
	Static, Eta           float64
	Fits                  []PointFit `json:"-"`
	LargestPct            float64    `json:"-"` // largest |residual| over every figure
	BoundHit              bool       `json:"-"`
	Evaluations           int        `json:"-"` // model evaluations of the whole fit
	// Floor multiplies the fitted model's distances so that it is never shorter than
	// the manual at these points (floorFactor; PhysicsModel.Takeoff).
	Floor float64
}

// ModelLine is how a card names the model: "physics, calibrated to 4 manual points
// (largest residual 1.2 %)".
func (c *Calibration) ModelLine() string {
	if c == nil {
		return "physics, not calibrated"
	}
	noun := "points"
	if len(c.Points) == 1 {
		noun = "point"
	}
	return fmt.Sprintf("physics, calibrated to %d manual %s (largest residual %.1f %%%s)", len(c.Points), noun, c.LargestPct, floorText(c.Floor))
}

// Figures is how many distances the fit was held against.
func (c *Calibration) Figures() int {
	n := 0
	for _, p := range c.Points {
		if p.GroundRollM > 0 {
			n++
		}
		if p.To50ftM > 0 {
			n++
		}
	}
	return n
}

// FitProblem is one reason a fit is refused. Point is the index of the point (-1
// for the fit as a whole); Figure is "ground_roll", "to_50ft" or "".
type FitProblem struct {
	Point  int
	Figure string
	Msg    string
}

// FitError is a refused fit: every problem found.
type FitError struct{ Problems []FitProblem }

func (e *FitError) Error() string {
	s := "calibration refused"
	for i, p := range e.Problems {
		if i == 0 {
			s += ": "
		} else {
			s += "; "
		}
		if p.Point >= 0 {
			s += fmt.Sprintf("point %d %s: ", p.Point, p.Figure)
		}
		s += p.Msg
	}
	return s
}

// usable says why cards may not use the calibration c for an aircraft of maximum
// takeoff mass mtow, or nil.
func (c *Calibration) usable(mtowKg float64) error {
	if c == nil || len(c.Points) == 0 {
		return fmt.Errorf("%w: it has no calibration point", ErrNotCalibrated)
	}
	if c.BoundHit || c.LargestPct > CalibrationTolerancePct {
		return fmt.Errorf("%w: the fit was refused", ErrNotCalibrated)
	}
	for _, p := range c.Points {
		if IsAnchor(p, mtowKg) {
			return nil
		}
	}
	return fmt.Errorf("%w: no calibration point is at MTOW on a paved, dry runway", ErrNotCalibrated)
}

// IsAnchor reports whether p can anchor a calibration: the manual's basic figure, at
// MTOW (within 1 %) on a paved, dry runway. Without one the fit would reach MTOW,
// the weight every card shows first, only by extrapolation.
func IsAnchor(p CalibrationPoint, mtowKg float64) bool {
	c := p.Conditions
	return c.Surface == Paved && c.Condition == Dry && math.Abs(c.MassKg-mtowKg) <= 0.01*mtowKg
}

// logistic maps an unbounded u onto (lo, hi); logit is its inverse.
func logistic(u, lo, hi float64) float64 { return lo + (hi-lo)/(1+math.Exp(-u)) }

func logit(p, lo, hi float64) float64 {
	f := (p - lo) / (hi - lo)
	f = math.Min(math.Max(f, 0.02), 0.98) // a start on a bound would never leave it
	return math.Log(f / (1 - f))
}

// Calibrate fits the static thrust fraction and the propeller efficiency of model m
// to points: it minimises the sum of squared relative residuals
//
//	sum over figures of ((model - manual) / manual)^2
//
// with gonum's Nelder-Mead simplex (fitBounded, shared with the landing fit; derivative free: the model is an integration),
// started from m's values, run twice (the second run restarts from the first's
// result with a fresh simplex, the usual guard against a simplex collapsing early).
// The parameters are kept inside their physical bounds (MinStaticThrustFrac...
// MaxPropEfficiency) by a logistic change of variable. The same points give the same
// fit, bit for bit: the method and its settings are deterministic, with no time limit.
//
// Only these two figures are fitted. With the profile's speeds and drag polar, they
// are what the physics leaves uncertain: the static fraction sets the early ground
// run, eta the late run and the whole air segment, whose energy method has no other
// unknown than the excess thrust eta P / V - D.
//
// The fitted model is then floored at the manual's own figures (Floor, floorFactor):
// never shorter than the manual at any of its points.
//
// The returned Calibration is never nil when points are given; the error is a
// *FitError when a residual exceeds CalibrationTolerancePct or a parameter ends on a
// bound (the Calibration then shows the refused fit).
func Calibrate(m PhysicsModel, points []CalibrationPoint) (*Calibration, error) {
	if len(points) == 0 {
		return nil, fmt.Errorf("%w: it has no calibration point", ErrNotCalibrated)
	}
	if len(points) > MaxCalibrationPoints {
		return nil, fmt.Errorf("%d calibration points, at most %d", len(points), MaxCalibrationPoints)
	}
	m.Envelope = nil
	m.P.Calibration = nil // the fit is of the bare model: no floor factors
	cal := &Calibration{Points: append([]CalibrationPoint(nil), points...), StartStatic: m.P.StaticThrustFac, StartEta: m.P.PropEfficiency}
	params := []fitParam{
		{"static thrust fraction", m.P.StaticThrustFac, MinStaticThrustFrac, MaxStaticThrustFrac},
		{"propeller efficiency", m.P.PropEfficiency, MinPropEfficiency, MaxPropEfficiency},
	}
	set := func(v []float64) { m.P.StaticThrustFac, m.P.PropEfficiency = v[0], v[1] }
	cost := func() float64 {
		cal.Evaluations++
		sum := 0.0
		for _, p := range points {
			r, err := m.Takeoff(p.Conditions)
			sum = addSquares(sum, [2]float64{r.GroundRollM, r.To50ftM}, [2]float64{p.GroundRollM, p.To50ftM}, err)
		}
		return sum
	}
	vals, err := fitBounded(params, set, cost)
	if err != nil {
		return cal, err
	}
	cal.Static, cal.Eta = vals[0], vals[1]

	var fe FitError
	cal.Fits, cal.LargestPct, fe.Problems = residuals(len(points),
		func(i int) ([2]float64, error) {
			r, err := m.Takeoff(points[i].Conditions)
			return [2]float64{r.GroundRollM, r.To50ftM}, err
		},
		func(i int) [2]float64 { return [2]float64{points[i].GroundRollM, points[i].To50ftM} },
		[2]string{"ground_roll", "to_50ft"})
	cal.Floor = floorFactor(cal.Fits, func(i int) [2]float64 { return [2]float64{points[i].GroundRollM, points[i].To50ftM} })
	var bp []FitProblem
	cal.BoundHit, bp = boundProblems(params, vals, "the description (power, propeller diameter, drag, speeds) does not match the manual's figures")
	fe.Problems = append(fe.Problems, bp...)
	if len(fe.Problems) > 0 {
		return cal, &fe
	}
	return cal, nil
}
