package report

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// Factors are printed as applied, never rounded to fewer digits: +5 % per 1 % of
// upslope at 0.3 % is x1.015 (AMC2 CAT.POL.A.305); 70 % of the LDA is x1/0.7
// (CAT.POL.A.330(a)); SSL 7c's x1.33 (from memory); a slope from threshold elevations
// (0.3727 %) keeps its six decimals.
func TestMultiplier(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		want string
	}{
		{1 + 0.05*0.3, "x1.015"},
		{1.33, "x1.33"},
		{1.0, "x1"},
		{1 / 0.7, "x1.428571 (1/0.7)"},
		{1 + 0.05*0.3727, "x1.018635"},
		{1.15 * 1.3, "x1.495"},
	} {
		assert.Equal(t, tc.want, multiplier(tc.v), "%v", tc.v)
	}
	assert.Equal(t, "0.3", slopeText(-0.3))
	assert.Equal(t, "0.25", slopeText(0.25))
}
