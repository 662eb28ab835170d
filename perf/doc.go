// Package perf computes takeoff performance for light piston aircraft: the ISA
// atmosphere, wind components and their factoring, two takeoff models (a flight-manual
// table and a physics integration), the published safety policies, and the grid of
// cells a kneeboard card prints.
//
// perf is pure: plain Go values in SI units in, numbers out. It reads no files, prints
// nothing and knows nothing of YAML or PDF. Every formula names its published source
// in its doc comment.
//
// Caution: results are planning figures. They are not a substitute for the approved
// flight manual; the pilot in command decides; local rules and licensed practice
// prevail.
package perf
