package recheck

import (
	"encoding/json"
	"errors"
	"fmt"
	"sort"
	"sync"
	"time"

	"wedgebound/certificates"
)

// ErrUnsupported is wrapped by Verify's error for a certificate kind this
// version cannot check (no package registered for it).
var ErrUnsupported = errors.New("not supported by this version of the verifier")

// Options tunes the verification; the zero value is sensible. A kind uses
// the options that apply to it and ignores the others.
type Options struct {
	// Workers is the number of goroutines (0: GOMAXPROCS). The result does
	// not depend on it.
	Workers int
	// MaxDepth bounds the bisection of one recorded cell when the first
	// enclosure is too wide to decide the claim (0: 10, that is up to 1024
	// pieces per cell).
	MaxDepth int
	// NoTailExtension forbids covering more of s beyond a recorded tail
	// start when the verifier's tail lemma is too weak there.
	NoTailExtension bool
	// NoHighPrecision forbids the retry at high precision of pieces that
	// float64 intervals cannot decide.
	NoHighPrecision bool
}

// Bracket is a closed interval [Lower, Upper] the verifier reports, as
// decimals rounded outward ("-inf" or "inf" for an unbounded end).
type Bracket struct {
	Lower string `json:"lower"`
	Upper string `json:"upper"`
}

// Failure is one claim that does not hold.
type Failure struct {
	// Where names the part of the certificate concerned, as a path into the
	// kind's section ("cover[3]", "tail_below", "advantage.lower", ...).
	Where string `json:"where"`
	// Lo and Hi give the range of the kind's variable concerned (empty
	// when not applicable).
	Lo string `json:"s_lo,omitempty"`
	Hi string `json:"s_hi,omitempty"`
	// Message explains what was found.
	Message string `json:"message"`
	// By is how far the failing quantity is on the wrong side, rounded
	// outward (empty when not a number).
	By string `json:"by,omitempty"`
	// Refuted is true when the verifier exhibits a point where the claim is
	// false, rather than merely failing to prove it.
	Refuted bool `json:"refuted"`
	// Bound is true when the failure concerns the claimed bound itself,
	// false for other recorded numbers and for the structure.
	Bound bool `json:"bound"`
}

// Result is the outcome of verifying one certificate. The fields are the
// same for every kind; what is particular to a kind is in Detail.
type Result struct {
	// Kind is the certificate kind that was checked.
	Kind string `json:"kind"`
	// Pass is true when every claim was proved again.
	Pass bool `json:"pass"`
	// Problem describes the problem in one line.
	Problem string `json:"problem"`
	// Bound is the claimed bound (for a bracket, the proved end a reader
	// cares about most).
	Bound string `json:"bound"`
	// Statement is the claim in words.
	Statement string `json:"statement"`
	// Recomputed is what the verifier's own numbers prove, in words or as
	// a number rounded outward; empty when a check failed early.
	Recomputed string   `json:"recomputed,omitempty"`
	Notes      []string `json:"notes,omitempty"`
	// Failures lists every claim found not to hold, in the order the kind
	// defines (structure first).
	Failures []Failure     `json:"failures,omitempty"`
	Elapsed  time.Duration `json:"elapsed_ns"`
	// Detail is the kind's own record of what it checked (a pointer to a
	// struct of the kind's package, e.g. *relaxation.Detail).
	Detail any `json:"detail,omitempty"`
}

// Checker verifies certificates of one kind. Check recomputes everything
// the claim of c rests on and reports every failed claim in the result; it
// returns an error only when c cannot be checked at all (a missing
// section). Kind, Pass and Elapsed are filled in by Verify.
type Checker interface {
	Check(c *certificates.Certificate, opt Options) (*Result, error)
}

// DetailDecoder is implemented by a Checker whose Result.Detail should be
// decoded back into its own type when a Result is read from JSON.
type DetailDecoder interface {
	// NewDetail returns a pointer to a zero detail value.
	NewDetail() any
}

// CheckerFunc adapts a function to the Checker interface.
type CheckerFunc func(c *certificates.Certificate, opt Options) (*Result, error)

// Check calls f.
func (f CheckerFunc) Check(c *certificates.Certificate, opt Options) (*Result, error) {
	return f(c, opt)
}

var (
	regMu    sync.RWMutex
	registry = map[string]Checker{}
)

// Register makes a checker available for a certificate kind. A kind
// package calls it from its init function; registering a kind twice
// panics.
func Register(kind string, c Checker) {
	regMu.Lock()
	defer regMu.Unlock()
	if _, dup := registry[kind]; dup {
		panic("recheck: kind " + kind + " registered twice")
	}
	registry[kind] = c
}

// Kinds lists the registered kinds in increasing order.
func Kinds() []string {
	regMu.RLock()
	defer regMu.RUnlock()
	ks := make([]string, 0, len(registry))
	for k := range registry {
		ks = append(ks, k)
	}
	sort.Strings(ks)
	return ks
}

func lookup(kind string) Checker {
	regMu.RLock()
	defer regMu.RUnlock()
	return registry[kind]
}

// Verify dispatches c to the checker registered for its kind. It returns
// an error (wrapping ErrUnsupported) only for a kind no package registered,
// or the checker's error; every failed claim is reported in the result.
// Verify does not look at the recorded hash: CheckHash does.
func Verify(c *certificates.Certificate, opt Options) (*Result, error) {
	start := time.Now()
	ch := lookup(c.Kind)
	if ch == nil {
		return nil, fmt.Errorf("certificate kind %q is %w (it checks %s)", c.Kind, ErrUnsupported, quoted(Kinds()))
	}
	// The schema's strict reading, in case c did not come from Decode: the
	// checkers then find every number present and read.
	if err := certificates.CheckStrict(c); err != nil {
		res := &Result{Kind: c.Kind, Failures: []Failure{{Where: "structure", Message: err.Error()}}, Elapsed: time.Since(start)}
		if nd, ok := ch.(interface{ NewDetail() any }); ok {
			res.Detail = nd.NewDetail()
		}
		return res, nil
	}
	res, err := ch.Check(c, opt)
	if err != nil {
		return nil, err
	}
	res.Kind = c.Kind
	res.Pass = len(res.Failures) == 0
	res.Elapsed = time.Since(start)
	return res, nil
}

func quoted(ks []string) string {
	switch len(ks) {
	case 0:
		return "no kind"
	case 1:
		return fmt.Sprintf("%q", ks[0])
	}
	s := ""
	for i, k := range ks {
		switch {
		case i == len(ks)-1:
			s += " and "
		case i > 0:
			s += ", "
		}
		s += fmt.Sprintf("%q", k)
	}
	return s
}

// StaleHashError reports a certificate whose content does not hash to the
// recorded value.
type StaleHashError struct {
	// Recorded is the sha256 field of the file (empty: never sealed);
	// Content is the hash of its content.
	Recorded, Content string
}

// Error says which hash was recorded and which one the content has.
func (e *StaleHashError) Error() string {
	if e.Recorded == "" {
		return fmt.Sprintf("stale hash: the certificate records no sha256 (it was never sealed; its content hashes to %s), so none of its claims is checked", e.Content)
	}
	return fmt.Sprintf("stale hash: the recorded sha256 %s does not match the content, which hashes to %s; the file was changed after it was sealed, so none of its claims is checked", e.Recorded, e.Content)
}

// Unwrap returns certificates.ErrStaleHash.
func (e *StaleHashError) Unwrap() error { return certificates.ErrStaleHash }

// CheckHash recomputes the canonical hash of c and returns a
// *StaleHashError when it differs from the recorded one, or the error of
// the hashing itself.
func CheckHash(c *certificates.Certificate) error {
	h, err := certificates.Hash(c)
	if err != nil {
		return err
	}
	if h != c.SHA256 {
		return &StaleHashError{Recorded: c.SHA256, Content: h}
	}
	return nil
}

// UnmarshalJSON reads a Result; Detail is decoded into the registered
// kind's own type when its checker is a DetailDecoder, otherwise left as
// generic JSON values.
func (r *Result) UnmarshalJSON(b []byte) error {
	type plain Result
	var aux struct {
		plain
		Detail json.RawMessage `json:"detail,omitempty"`
	}
	if err := json.Unmarshal(b, &aux); err != nil {
		return err
	}
	*r = Result(aux.plain)
	r.Detail = nil
	if len(aux.Detail) == 0 || string(aux.Detail) == "null" {
		return nil
	}
	if dd, ok := lookup(r.Kind).(DetailDecoder); ok {
		d := dd.NewDetail()
		if err := json.Unmarshal(aux.Detail, d); err != nil {
			return err
		}
		r.Detail = d
		return nil
	}
	var d any
	if err := json.Unmarshal(aux.Detail, &d); err != nil {
		return err
	}
	r.Detail = d
	return nil
}
