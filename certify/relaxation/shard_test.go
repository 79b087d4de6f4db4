package relaxation

import (
	"bytes"
	"strings"
	"testing"

	"wedgebound/certificates"
	"wedgebound/certificates/recheck"
	_ "wedgebound/certificates/recheck/relaxation" // registers the kind
	"wedgebound/regions"
)

// TestShardsMergeToWholeRun certifies a one-profile relaxation of the
// backflow preset whole (with 1 and with 2 workers) and as 3 shards, merges
// the shards and checks that the merged certificate has the same cover and
// claim, passes the independent verifier, and that bad merges are refused.
// (Consistency checks of the tool against itself; the bound's external
// checks are in certify_test.go.)
func TestShardsMergeToWholeRun(t *testing.T) {
	base := Config{Problem: regions.Presets["backflow"], Terms: expSpecs([]string{"150"}, nil), Margin: 2e-4}
	run := func(workers, shard, shards int) *certificates.Certificate {
		cfg := base
		cfg.Workers, cfg.Shard, cfg.Shards = workers, shard, shards
		out, err := Run(cfg)
		if err != nil {
			t.Fatalf("run (workers %d, shard %d/%d): %v", workers, shard, shards, err)
		}
		if err := certificates.Seal(out.Certificate); err != nil {
			t.Fatal(err)
		}
		return out.Certificate
	}
	whole1 := run(1, 0, 0)
	whole2 := run(2, 0, 0)
	b1, _ := certificates.Encode(whole1)
	b2, _ := certificates.Encode(whole2)
	if !bytes.Equal(b1, b2) {
		t.Fatal("certificates for 1 and 2 workers differ")
	}
	var parts []*certificates.Certificate
	for i := range 3 {
		parts = append(parts, run(2, i, 3))
	}
	merged, err := certificates.Merge(parts)
	if err != nil {
		t.Fatal(err)
	}
	w, m := whole1.Relaxation, merged.Relaxation
	if len(w.Cover) != len(m.Cover) {
		t.Fatalf("merged cover has %d cells, whole run %d", len(m.Cover), len(w.Cover))
	}
	for i := range w.Cover {
		if w.Cover[i] != m.Cover[i] {
			t.Fatalf("cell %d differs: %+v vs %+v", i, m.Cover[i], w.Cover[i])
		}
	}
	if w.Claim != m.Claim {
		t.Fatalf("merged claim %+v, whole run %+v", m.Claim, w.Claim)
	}
	if err := certificates.Seal(merged); err != nil {
		t.Fatal(err)
	}
	res, err := recheck.Verify(merged, recheck.Options{})
	if err != nil || !res.Pass {
		t.Fatalf("the verifier rejects the merged certificate: %v %+v", err, res)
	}
	// A shard on its own is refused by the verifier.
	if res, err := recheck.Verify(parts[1], recheck.Options{}); err == nil && res.Pass {
		t.Fatal("the verifier accepts a partial certificate")
	}

	clone := func(c *certificates.Certificate) *certificates.Certificate {
		b, _ := certificates.Encode(c)
		d, err := certificates.Decode(b)
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	bad := func(name, want string, mutate func([]*certificates.Certificate) []*certificates.Certificate) {
		ps := []*certificates.Certificate{clone(parts[0]), clone(parts[1]), clone(parts[2])}
		ps = mutate(ps)
		_, err := certificates.Merge(ps)
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%s: merge error %v, want one containing %q", name, err, want)
		}
	}
	bad("gap", "gap", func(ps []*certificates.Certificate) []*certificates.Certificate {
		ps[1].Relaxation.Cover = ps[1].Relaxation.Cover[1:]
		return ps
	})
	bad("overlap", "overlap", func(ps []*certificates.Certificate) []*certificates.Certificate {
		r := ps[1].Relaxation
		prev := ps[0].Relaxation.Cover[len(ps[0].Relaxation.Cover)-1]
		r.Cover = append([]certificates.Cell{prev}, r.Cover...)
		return ps
	})
	bad("different regions", "different terms", func(ps []*certificates.Certificate) []*certificates.Certificate {
		ps[2].Relaxation.Terms[0].Weight = certificates.MustDecimal("8.5")
		return ps
	})
	// A part of another run: its weights, and therefore its range, differ.
	// The message names the terms (issue 17: it named the range and a
	// "shard 0" that does not exist).
	bad("other run", "different terms", func(ps []*certificates.Certificate) []*certificates.Certificate {
		ps[1].Relaxation.Terms[0].Weight = certificates.MustDecimal("8.5")
		ps[1].Relaxation.Shard.Lo = certificates.MustDecimal("-50")
		return ps
	})
	for _, ps := range [][]*certificates.Certificate{{clone(parts[0]), clone(parts[1])}, {parts[0], parts[1], parts[1]}} {
		if _, err := certificates.Merge(ps); err == nil || strings.Contains(err.Error(), "shard 0") {
			t.Errorf("merge error %v: want an error that numbers shards from 1", err)
		}
	}
	bad("missing shard", "shard 3/3 is missing", func(ps []*certificates.Certificate) []*certificates.Certificate {
		return ps[:2]
	})
	bad("shard twice", "are both shard 2/3", func(ps []*certificates.Certificate) []*certificates.Certificate {
		return []*certificates.Certificate{ps[0], ps[1], ps[1]}
	})
}
