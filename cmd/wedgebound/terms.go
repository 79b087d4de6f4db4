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

// decodeRelaxation reads a JSON array of terms strictly.
func decodeRelaxation[T interval.Real[T]](like T, data []byte) (regions.Relaxation[T], error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var specs []termSpec
	if err := dec.Decode(&specs); err != nil {
		return regions.Relaxation[T]{}, fmt.Errorf("malformed terms: %v", err)
	}
	if len(specs) == 0 {
		return regions.Relaxation[T]{}, errors.New("no terms given")
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
