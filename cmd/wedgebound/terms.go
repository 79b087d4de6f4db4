package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"

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

// decodeRelaxation reads a JSON array of terms strictly.
func decodeRelaxation[T interval.Real[T]](like T, data []byte) (regions.Relaxation[T], error) {
	specs, err := decodeTermSpecs(data)
	if err != nil {
		return regions.Relaxation[T]{}, err
	}
	var rel regions.Relaxation[T]
	for i, s := range specs {
		t, err := regions.NewTerm(like, s.Kind, s.Params)
		if err != nil {
			return rel, fmt.Errorf("term %d: %v", i, err)
		}
		if _, err := regions.ParseRat(s.Weight); err != nil {
			return rel, fmt.Errorf("term %d weight: %v", i, err)
		}
		wv, err := like.Decimal(s.Weight)
		if err != nil {
			return rel, fmt.Errorf("term %d weight: %v", i, err)
		}
		rel.Terms = append(rel.Terms, t)
		rel.Weights = append(rel.Weights, wv)
	}
	return rel, nil
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
