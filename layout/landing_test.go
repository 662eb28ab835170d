package layout

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// Issue 11 item 3: on 2-up sheets printed double-sided and turned over on the short
// edge, a point on the left half of the front is behind the right half of the back
// (common practice of duplex printing: the sheet turns like a book page). So every
// card's back (its landing side, the page after its front) must sit in the other
// half of the sheet's back page, and nothing else may.
func TestImposeDuplexBacksBehindFronts(t *testing.T) {
	for pairs := 1; pairs <= 5; pairs++ {
		n := 2 * pairs
		sheets := Impose(n, true)
		assert.Len(t, sheets, 2*((pairs+1)/2), "%d cards: a front and a back page per sheet", pairs)
		seen := map[int]bool{}
		for s := 0; s < len(sheets); s += 2 {
			front, back := sheets[s], sheets[s+1]
			for half := 0; half < 2; half++ {
				f := front[half]
				if f < 0 {
					assert.Equal(t, -1, back[1-half], "no card in front, none behind")
					continue
				}
				assert.Equal(t, 0, f%2, "a front page is a card's first page")
				assert.Equal(t, f+1, back[1-half], "card %d: its back is behind it, in the other half", f/2)
				seen[f], seen[f+1] = true, true
			}
		}
		assert.Len(t, seen, n, "every page placed once")
	}
	assert.Equal(t, [][2]int{{0, 2}, {3, 1}, {4, -1}, {-1, 5}}, Impose(6, true))
	// Single-sided cards go two by two, as before.
	assert.Equal(t, [][2]int{{0, 1}, {2, -1}}, Impose(3, false))
}
