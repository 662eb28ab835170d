package tableimport

import (
	"testing"

	"kneeprint/cmd/internal/spec"
)

// FuzzImport: any bytes are refused with an error or imported; an imported table
// with its wind factoring answered loads in a profile as it stands (the output is
// always what the loader accepts).
// Seeds: testdata/fuzz/FuzzImport.
func FuzzImport(f *testing.F) {
	f.Fuzz(func(t *testing.T, data []byte) {
		res, err := Import("fuzz.csv", data)
		if err != nil {
			if _, ok := err.(spec.ErrorList); !ok {
				t.Fatalf("error of type %T: %v", err, err)
			}
			return
		}
		if !res.WindFactoringGiven {
			return
		}
		profile := "kind: aircraft\nname: Fuzz\ntype: none\nmtow: 5670 kg\nlimits: {demonstrated_crosswind: 15 kt}\ntakeoff_flap: \"0\"\n" + string(res.YAML)
		if _, err := spec.Parse("fuzz.yaml", []byte(profile)); err != nil {
			t.Fatalf("imported table does not load: %v\n%s", err, res.YAML)
		}
	})
}
