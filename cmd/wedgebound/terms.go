package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"

	"wedgebound/certify/spectrum"
	"wedgebound/interval"
	"wedgebound/regions"
)

// termSpec is one relaxation term as written in terms files and certificates.
type termSpec struct {
	Kind   string            `json:"kind"`
	Params map[string]string `json:"params"`
	Weight string            `json:"weight"`
}

// decodeTermSpecs reads a JSON array of terms strictly (not yet checked
// against the families).
func decodeTermSpecs(data []byte) ([]termSpec, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var specs []termSpec
	if err := dec.Decode(&specs); err != nil {
		return nil, fmt.Errorf("malformed terms: %v", err)
	}
	if len(specs) == 0 {
		return nil, errors.New("no terms given")
	}
	return specs, nil
}

// decodeRelaxation reads a JSON array of terms strictly and builds the
// relaxation with spectrum.BuildRelaxation; it also returns the exact
// specs, from which the Newton route rebuilds it at higher precision.
func decodeRelaxation[T interval.Real[T]](like T, data []byte) (regions.Relaxation[T], []spectrum.TermSpec, error) {
	raw, err := decodeTermSpecs(data)
	if err != nil {
		return regions.Relaxation[T]{}, nil, err
	}
	specs := make([]spectrum.TermSpec, len(raw))
	for i, s := range raw {
		specs[i] = spectrum.TermSpec{Kind: s.Kind, Params: s.Params, Weight: s.Weight}
	}
	rel, err := spectrum.BuildRelaxation(like, specs)
	return rel, specs, err
}

// termSpecsJSON turns --term flags KIND,NAME=VALUE,...,weight=W into the
// JSON term list read by decodeRelaxation; every flag needs its weight.
func termSpecsJSON(flags []string) ([]byte, error) {
	specs, err := certifyTermFlags(flags)
	if err != nil {
		return nil, err
	}
	for i, spec := range specs {
		if spec.Weight == "" {
			return nil, fmt.Errorf("--term %q: no weight=W", flags[i])
		}
	}
	return json.Marshal(specs)
}
