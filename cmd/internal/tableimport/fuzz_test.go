package tableimport

import (
	"testing"

	"kneeprint/cmd/internal/spec"
)

// fuzzProfile is a profile the fuzzed sections are pasted into: the largest MTOW
// the loader accepts, and a small takeoff table (test figures, no aircraft's) so that
// a landing or a climb section has a profile around it.
const fuzzProfile = `kind: aircraft
name: Fuzz
type: none
mtow: 5670 kg
limits: {demonstrated_crosswind: 15 kt}
takeoff_flap: "0"
`

const fuzzTakeoff = `table:
  wind_factoring_included: false
  distance_unit: m
  pressure_altitudes: [0 ft, 1000 ft]
  temperatures: [0 C, 10 C]
  weights:
    - weight: 5670 kg
      ground_roll: [[500, 510], [520, 530]]
      to_50ft: [[900, 910], [920, 930]]
`

// FuzzImport: any bytes, read as each kind of table, are refused with an error or
// imported; an imported section with its questions answered loads in a profile as it
// stands (the output is always what the loader accepts).
// Seeds: testdata/fuzz/FuzzImport.
func FuzzImport(f *testing.F) {
	f.Fuzz(func(t *testing.T, data []byte) {
		for _, k := range Kinds {
			res, err := Import(k, "fuzz.csv", data)
			if err != nil {
				if _, ok := err.(spec.ErrorList); !ok {
					t.Fatalf("%s: error of type %T: %v", k, err, err)
				}
				continue
			}
			if len(res.Unanswered) > 0 {
				continue
			}
			profile := fuzzProfile + string(res.YAML)
			if k != Takeoff {
				profile += fuzzTakeoff
			}
			if _, err := spec.Parse("fuzz.yaml", []byte(profile)); err != nil {
				t.Fatalf("imported %s does not load: %v\n%s", k, err, res.YAML)
			}
		}
	})
}
