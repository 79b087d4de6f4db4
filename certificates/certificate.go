// Package certificates defines the JSON proof certificates written by the
// certifier and read by the verifier: a versioned schema, strict reading
// (unknown or missing fields, NaN, inconsistent entries are errors),
// canonical hashing and atomic writing.
//
// # Numbers
//
// Every number in a certificate is a JSON string, so nothing is lost to
// binary floating point. It is read once, when the certificate is decoded,
// into a typed exact value whose UnmarshalText enforces the grammar of its
// field; an error names the field ("relaxation.cover[3].lo: ..."). The
// grammars:
//
//	Decimal     plain: -?[0-9]+(\.[0-9]+)?
//	SciDecimal  plain, or plain followed by e[+-][0-9]+ (exponent in
//	            [-1000, 1000]), as in 5e-01 or 1e+00
//	Fraction    plain, or p/q with p and q plain and q != 0
//	AlphaValue  a positive Fraction, optionally after "2*pi*"
//	ThresholdValue  a Fraction, or "none"
//
// No sign "+", no base prefix (0x, 0b, 0o), no NaN or infinity, no spaces,
// at most 20000 characters. Exponents appear only where floats are written
// exactly (the SciDecimal fields: strip and matched witness coefficients,
// matched threshold and cell ends, width targets, the matched estimate);
// fractions only in the relaxation's problem and normal form and in the
// flight reduction. Each value keeps the text it was read from (== on two
// values compares their texts), so a certificate re-encodes to the bytes
// it was read from and its hash is over what the file says; Rat, Cmp and
// Sign give the exact value. Certifiers write numbers with the printers of
// this package (DecimalOf, FractionOf, FloatDecimal, SciFloat,
// ShortDecimal, AlphaOf, NewThreshold) or read their own printed text
// through a Parser.
//
// Physical input ("87 u", "0.2 ms", "1e-28 kg*m/s"), recorded as the user
// wrote it, is read by ParseQuantity with the exact SI factors.
package certificates

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"
)

// Schema is the version tag every certificate carries.
const Schema = "wedgebound/certificate/v1"

// Kinds of certificate.
const (
	// KindRelaxation proves a spectral bound for a wedge in a half-plane via a
	// squeeze-invariant relaxation and a cover of the Mellin variable s.
	KindRelaxation = "halfplane-relaxation"
	// KindStrip brackets the spectral edges of the finite-strip operator.
	KindStrip = "strip-bracket"
)

// Certificate is the top-level document. Exactly one of Relaxation and Strip
// is set, matching Kind.
type Certificate struct {
	Schema     string      `json:"schema"`
	Kind       string      `json:"kind"`
	Tool       Tool        `json:"tool"`
	Relaxation *Relaxation `json:"relaxation,omitempty"`
	Strip      *Strip      `json:"strip,omitempty"`
	Flight     *Flight     `json:"flight,omitempty"`
	Precession *Precession `json:"precession,omitempty"`
	Matched    *Matched    `json:"matched,omitempty"`
	Witness    *Witness    `json:"witness,omitempty"`
	// SHA256 is the hex SHA-256 of the canonical encoding of the certificate
	// with this field empty.
	SHA256 string `json:"sha256"`
}

// Tool names the program and version that produced the certificate.
type Tool struct {
	Name    string `json:"name"`
	Version string `json:"version"`
}

// Version is this program's version string.
const Version = "0.1.0"

// ErrStaleHash reports a certificate whose content no longer matches its hash.
var ErrStaleHash = errors.New("certificate hash is stale: the content was changed after it was written")

// Canonical returns the canonical encoding (compact JSON, fields in schema
// order, the hash field empty) that the hash is computed from.
func Canonical(c *Certificate) ([]byte, error) {
	cc := *c
	cc.SHA256 = ""
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(&cc); err != nil {
		return nil, err
	}
	return bytes.TrimRight(buf.Bytes(), "\n"), nil
}

// Hash returns the hex SHA-256 of the canonical encoding.
func Hash(c *Certificate) (string, error) {
	b, err := Canonical(c)
	if err != nil {
		return "", err
	}
	sum := sha256.Sum256(b)
	return hex.EncodeToString(sum[:]), nil
}

// Seal fills in the schema tag, tool and hash.
func Seal(c *Certificate) error {
	c.Schema = Schema
	c.Tool = Tool{Name: "wedgebound", Version: Version}
	h, err := Hash(c)
	if err != nil {
		return err
	}
	c.SHA256 = h
	return nil
}

// Encode returns the indented JSON of a sealed certificate.
func Encode(c *Certificate) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", " ")
	if err := enc.Encode(c); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// WriteFile seals c and writes it atomically: to a temporary file in the
// same directory, synced, then renamed over path.
func WriteFile(path string, c *Certificate) error {
	if err := Seal(c); err != nil {
		return err
	}
	b, err := Encode(c)
	if err != nil {
		return err
	}
	return WriteAtomic(path, b)
}

// WriteAtomic writes data to path via a temporary file and rename, so a
// reader sees either the old file or the complete new one. Its errors name
// path (never the temporary file).
func WriteAtomic(path string, data []byte) error {
	if err := CheckWritable(path); err != nil {
		return err
	}
	dir := filepath.Dir(path)
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, unwrapPath(err))
	}
	tmp := f.Name()
	err = f.Chmod(0o644)
	if err == nil {
		_, err = f.Write(data)
	}
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
		return fmt.Errorf("cannot write %s: %v", path, unwrapPath(err))
	}
	return nil
}

// CheckWritable reports, before any work is done, why path cannot receive
// an output file: it is a directory, its directory does not exist or is not
// a directory. It does not create anything.
func CheckWritable(path string) error {
	if path == "" {
		return errors.New("empty output path")
	}
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return fmt.Errorf("cannot write %s: it is a directory", path)
	}
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	if err != nil {
		return fmt.Errorf("cannot write %s: directory %s: %v", path, dir, unwrapPath(err))
	}
	if !st.IsDir() {
		return fmt.Errorf("cannot write %s: %s is not a directory", path, dir)
	}
	return nil
}

// unwrapPath drops the operation and file name of an *os.PathError or
// *os.LinkError, which name the temporary file.
func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}

// ReadFile reads and strictly decodes a certificate. It checks the schema
// tag, the structure, every decimal field and the hash; a stale hash is
// reported as an error wrapping ErrStaleHash.
func ReadFile(path string) (*Certificate, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Decode(b)
}

// Decode strictly decodes and validates a certificate (see ReadFile).
func Decode(b []byte) (*Certificate, error) {
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	var c Certificate
	if err := dec.Decode(&c); err != nil {
		var ne *NumberError
		if errors.As(err, &ne) {
			if path := numberPath(b); path != "" {
				return nil, fmt.Errorf("malformed certificate: %s: %v", path, err)
			}
		}
		return nil, fmt.Errorf("malformed certificate: %v", err)
	}
	if dec.More() {
		return nil, errors.New("malformed certificate: trailing data after the JSON object")
	}
	if c.Schema != Schema {
		return nil, fmt.Errorf("unknown schema %q (this program reads %q)", c.Schema, Schema)
	}
	if err := c.validate(); err != nil {
		return nil, fmt.Errorf("inconsistent certificate: %v", err)
	}
	h, err := Hash(&c)
	if err != nil {
		return nil, err
	}
	if h != c.SHA256 {
		return &c, fmt.Errorf("%w (recorded %.12s..., content hashes to %.12s...)", ErrStaleHash, c.SHA256, h)
	}
	return &c, nil
}

// CheckStrict reports why c, once sealed and encoded, would not pass the
// strict reader (Decode), or nil; c itself is not changed. Certifiers call
// it as the final check of what they are about to write.
func CheckStrict(c *Certificate) error {
	probe := *c
	if err := Seal(&probe); err != nil {
		return err
	}
	b, err := Encode(&probe)
	if err != nil {
		return err
	}
	_, err = Decode(b)
	return err
}

func (c *Certificate) validate() error {
	if c.Tool.Name == "" || c.Tool.Version == "" {
		return errors.New("missing tool name or version")
	}
	sections := 0
	for _, set := range []bool{c.Relaxation != nil, c.Strip != nil, c.Flight != nil, c.Precession != nil, c.Matched != nil, c.Witness != nil} {
		if set {
			sections++
		}
	}
	switch c.Kind {
	case KindRelaxation:
		if c.Relaxation == nil || sections != 1 {
			return errors.New("a relaxation certificate must hold exactly the relaxation section")
		}
		return c.Relaxation.validate()
	case KindStrip:
		if c.Strip == nil || sections != 1 {
			return errors.New("a strip certificate must hold exactly the strip section")
		}
		return c.Strip.validate()
	case KindFlight:
		if c.Flight == nil || sections != 1 {
			return errors.New("a flight certificate must hold exactly the flight section")
		}
		return c.Flight.validate()
	case KindPrecession:
		if c.Precession == nil || sections != 1 {
			return errors.New("a precession certificate must hold exactly the precession section")
		}
		return c.Precession.validate()
	case KindMatched:
		if c.Matched == nil || sections != 1 {
			return errors.New("a matched certificate must hold exactly the matched section")
		}
		return c.Matched.validate()
	case KindWitness:
		if c.Witness == nil || sections != 1 {
			return errors.New("a witness certificate must hold exactly the witness section")
		}
		return c.Witness.validate()
	}
	return fmt.Errorf("unknown certificate kind %q", c.Kind)
}
