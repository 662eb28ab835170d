// Command kneeprint precomputes takeoff-distance grids for light piston aircraft and
// lays them out as printable kneeboard cards.
//
// Not a substitute for the approved flight manual; the pilot in command decides;
// local rules and licensed practice prevail.
package main

import (
	"os"
	"time"
)

func main() {
	os.Exit(run(os.Args[1:], env{stdout: os.Stdout, stderr: os.Stderr, now: time.Now}))
}
