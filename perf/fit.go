package perf

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/optimize"
)

// fitParam is one figure a calibration fits, with the physical bounds it is kept in.
type fitParam struct {
	name   string
	start  float64
	lo, hi float64
}

// fitBounded is the calibration machinery the takeoff (Calibrate) and the landing
// (CalibrateLanding) fits share. It minimises cost, a sum of squared relative
// residuals, over the figures params, with gonum's Nelder-Mead simplex (derivative
// free: the models are integrations), started from each figure's start value, run
// twice (the second run restarts from the first's result with a fresh simplex, the
// usual guard against a simplex collapsing early). Each figure is kept inside its
// physical bounds by a logistic change of variable. The same inputs give the same
// fit, bit for bit: the method and its settings are deterministic, with no time
// limit. set is called with the figures before every evaluation of cost and once
// more with the result.
func fitBounded(params []fitParam, set func(vals []float64), cost func() float64) ([]float64, error) {
	vals := make([]float64, len(params))
	apply := func(x []float64) {
		for i, p := range params {
			vals[i] = logistic(x[i], p.lo, p.hi)
		}
		set(vals)
	}
	x := make([]float64, len(params))
	for i, p := range params {
		x[i] = logit(p.start, p.lo, p.hi)
	}
	f := func(x []float64) float64 {
		apply(x)
		return cost()
	}
	for run := 0; run < 2; run++ {
		res, err := optimize.Minimize(optimize.Problem{Func: f}, x, &optimize.Settings{
			Converger:       &optimize.FunctionConverge{Absolute: 1e-14, Relative: 1e-12, Iterations: 40},
			FuncEvaluations: 1500,
		}, &optimize.NelderMead{SimplexSize: 0.5})
		if err != nil && res == nil {
			return nil, fmt.Errorf("calibration: %w", err)
		}
		x = append(x[:0], res.X...)
	}
	apply(x)
	return append([]float64(nil), vals...), nil
}

// addSquares adds to sum the squared relative residuals of a model's two figures
// against the manual's (a figure the manual does not give, 0, adds nothing); a point
// where the model gives no figure counts as a residual of 100 % on each figure the
// manual gives.
func addSquares(sum float64, model, manual [2]float64, modelErr error) float64 {
	for k := 0; k < 2; k++ {
		if manual[k] <= 0 {
			continue
		}
		if modelErr != nil {
			sum++
			continue
		}
		d := model[k]/manual[k] - 1
		sum += d * d
	}
	return sum
}

// residuals holds a fitted model against every point: eval gives the model's two
// figures at point i, manual the manual's (0 where it gives none), names the two
// figures' field names ("ground_roll", "to_50ft"). A residual beyond
// CalibrationTolerancePct, or a point with no figure, is a FitProblem.
func residuals(n int, eval func(i int) ([2]float64, error), manual func(i int) [2]float64, names [2]string) (fits []PointFit, largest float64, problems []FitProblem) {
	for i := 0; i < n; i++ {
		var pf PointFit
		got, err := eval(i)
		if err != nil {
			pf.Err = err.Error()
			problems = append(problems, FitProblem{Point: i, Msg: "the fitted model gives no figure here: " + err.Error()})
			largest = math.Max(largest, 100)
			fits = append(fits, pf)
			continue
		}
		pf.GroundRollM, pf.To50ftM = got[0], got[1]
		want := manual(i)
		var pct [2]float64
		for k := 0; k < 2; k++ {
			if want[k] <= 0 {
				continue
			}
			pct[k] = (got[k]/want[k] - 1) * 100
			largest = math.Max(largest, math.Abs(pct[k]))
			if math.Abs(pct[k]) > CalibrationTolerancePct {
				problems = append(problems, FitProblem{Point: i, Figure: names[k],
					Msg: fmt.Sprintf("the best fit gives %.0f m, %+.1f %% off the manual's %.0f m (at most %.0f %% accepted)", got[k], pct[k], want[k], CalibrationTolerancePct)})
			}
		}
		pf.GroundRollPct, pf.To50ftPct = pct[0], pct[1]
		fits = append(fits, pf)
	}
	return fits, largest, problems
}

// boundProblems reports every fitted figure that ended within boundMargin of one of
// its bounds: the rest of the description does not describe the manual's figures,
// and a figure pinned at a bound would carry that error into every card.
func boundProblems(params []fitParam, vals []float64, what string) (hit bool, problems []FitProblem) {
	for i, p := range params {
		v := vals[i]
		if v-p.lo < boundMargin*(p.hi-p.lo) || p.hi-v < boundMargin*(p.hi-p.lo) {
			hit = true
			problems = append(problems, FitProblem{Point: -1,
				Msg: fmt.Sprintf("the fit pushed the %s to %.3f, on its physical bound (%.2f to %.2f): %s", p.name, v, p.lo, p.hi, what)})
		}
	}
	return hit, problems
}

// exactFit is how far above 1 a ratio manual / model may be and still be taken as an
// exact fit: the fit's own numerical noise, far below a printed metre.
const exactFit = 1e-6

// floorFactor is the floor factor of a calibration (Calibration.Floor,
// LandingCalibration.Floor), which makes the calibrated model never shorter than the
// manual at its own points: the fitted model's distances (ground roll, and total: to
// 50 ft for a takeoff, from 50 ft for a landing) are multiplied by it. It is the
// largest ratio manual / fitted model over every figure of every point, rounded up to
// a thousandth (so the factor printed is the factor applied), and never below 1: one
// factor for both figures, the larger of the two a factor per figure kind would give,
// so that a figure and its ground roll keep their proportion. A fit within
// CalibrationTolerancePct keeps it under 1/0.95 = 1.053. Zero (an old calibration)
// changes nothing.
//
// The fit balances its residuals about zero (least squares), so without it some
// manual figures would be printed shorter than the manual prints them: conservative
// wins, and the manual's own figure is the floor where it gives one (kneeprint's own
// rule, as FloorRule is for the policies' factors).
//
// fits are the fitted figures, manual gives point i's two figures (0 where the manual
// gives none). A point the fit gives no figure for is refused elsewhere (residuals)
// and counts for nothing here.
func floorFactor(fits []PointFit, manual func(i int) [2]float64) float64 {
	f := 1.0
	for i, pf := range fits {
		if pf.Err != "" {
			continue
		}
		got, want := [2]float64{pf.GroundRollM, pf.To50ftM}, manual(i)
		for k := 0; k < 2; k++ {
			if !(want[k] > 0 && got[k] > 0) {
				continue
			}
			if r := want[k] / got[k]; r > 1+exactFit {
				f = math.Max(f, math.Ceil(r*1000-1e-9)/1000)
			}
		}
	}
	return f
}

// applyFloor multiplies a model's ground roll and total distance by the floor factor
// f (nothing for f <= 1).
func applyFloor(f, gr, total float64) (float64, float64) {
	if !(f > 1) {
		return gr, total
	}
	return gr * f, total * f
}

// floorText is what a model line adds for floor factor f: ", floor ×1.007", or
// nothing when f changes nothing.
func floorText(f float64) string {
	if !(f > 1) {
		return ""
	}
	return ", floor ×" + trim3(f)
}

// trim3 prints x with at most three decimals and no trailing zeros.
func trim3(x float64) string {
	s := strconv.FormatFloat(x, 'f', 3, 64)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	return s
}
