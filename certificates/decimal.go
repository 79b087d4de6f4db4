package certificates

import (
	"bytes"
	"encoding"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/big"
	"reflect"
	"strconv"
	"strings"
)

// The exact numbers of a certificate. Each is read once, at the JSON
// boundary, by the grammar of its type, and keeps both its value (an exact
// rational) and the text it was read from, so that a certificate re-encodes
// to the very bytes it was read from and its hash is over what the file
// says. The grammars (see the package doc) are:
//
//	plain      -?[0-9]+(\.[0-9]+)?                    Decimal
//	scientific plain, or plain followed by e[+-][0-9]+  SciDecimal
//	           with the exponent in [-1000, 1000]
//	fraction   plain, or plain/plain (nonzero)        Fraction
//	alpha      fraction, optionally after "2*pi*";    AlphaValue
//	           positive
//
// No sign "+", no base prefix, no NaN or infinity, no spaces, at most
// maxNumberLen characters.

// maxNumberLen bounds the length of one number's text.
const maxNumberLen = 20000

// maxExponent bounds the decimal exponent of a scientific number.
const maxExponent = 1000

// number is the text shared by the exact number types; the zero value is
// unset. Only this package makes numbers, and only from text its readers
// accepted or its printers wrote, so the text always reads; == compares
// texts (as the certificate's bytes do), Cmp compares values.
type number struct {
	text string
}

// ratOf reads a text of one of the grammars (plain, scientific, p/q of
// plain decimals) into a new rational.
func ratOf(s string) (*big.Rat, bool) {
	if p, q, ok := strings.Cut(s, "/"); ok {
		a, ok1 := new(big.Rat).SetString(p)
		b, ok2 := new(big.Rat).SetString(q)
		if !ok1 || !ok2 || b.Sign() == 0 {
			return nil, false
		}
		return a.Quo(a, b), true
	}
	return new(big.Rat).SetString(s)
}

// Rat returns the value as a new rational, or nil when the number is unset.
func (n number) Rat() *big.Rat {
	if n.text == "" {
		return nil
	}
	r, ok := ratOf(n.text)
	if !ok {
		// Unreachable: every text was accepted by a reader of this package.
		panic(fmt.Sprintf("certificates: number %.40q does not read", n.text))
	}
	return r
}

// String returns the text of the number ("" when unset).
func (n number) String() string { return n.text }

// IsSet reports whether the number holds a value.
func (n number) IsSet() bool { return n.text != "" }

// Sign returns -1, 0 or +1 by the sign of the value (0 when unset).
func (n number) Sign() int {
	if n.text == "" {
		return 0
	}
	return n.Rat().Sign()
}

// Cmp compares the value with r (an unset number compares as 0).
func (n number) Cmp(r *big.Rat) int {
	if n.text == "" {
		return new(big.Rat).Cmp(r)
	}
	return n.Rat().Cmp(r)
}

// MarshalText writes the text the number was read or made from.
func (n number) MarshalText() ([]byte, error) { return []byte(n.text), nil }

// Decimal is an exact number in the plain decimal grammar
// -?[0-9]+(\.[0-9]+)?: no exponent, no fraction.
type Decimal struct{ number }

// SciDecimal is an exact number in the scientific grammar: a plain decimal,
// optionally followed by e, a sign and the decimal exponent (at most 1000 in
// absolute value), as in 5e-01. It is used where the schema writes floats
// exactly (witness coefficients, matched cell ends).
type SciDecimal struct{ number }

// Fraction is an exact rational written as a plain decimal or as p/q with p
// and q plain decimals and q nonzero.
type Fraction struct{ number }

// UnmarshalText reads a Decimal strictly.
func (d *Decimal) UnmarshalText(b []byte) error {
	v, err := ParseDecimal(string(b))
	if err != nil {
		return err
	}
	*d = v
	return nil
}

// UnmarshalText reads a SciDecimal strictly.
func (d *SciDecimal) UnmarshalText(b []byte) error {
	v, err := ParseSci(string(b))
	if err != nil {
		return err
	}
	*d = v
	return nil
}

// UnmarshalText reads a Fraction strictly.
func (f *Fraction) UnmarshalText(b []byte) error {
	v, err := ParseFraction(string(b))
	if err != nil {
		return err
	}
	*f = v
	return nil
}

// NumberError is the error of the number readers: the text and what is
// wrong with it.
type NumberError struct {
	Text string
	Msg  string
}

func (e *NumberError) Error() string { return e.Msg }

func numErr(s, format string, args ...any) error {
	return &NumberError{Text: s, Msg: fmt.Sprintf(format, args...)}
}

// badText explains why s is not a number of the plain (or, with sci, the
// scientific) grammar.
func badText(s string, sci bool) error {
	if s == "" {
		return numErr(s, "missing number")
	}
	l := strings.ToLower(s)
	if strings.Contains(l, "nan") || strings.Contains(l, "inf") {
		return numErr(s, "%.40q is not a finite decimal number", s)
	}
	if sci {
		return numErr(s, "%.40q is not a decimal number (digits, an optional point with digits, an optional exponent e-12)", s)
	}
	return numErr(s, "%.40q is not a plain decimal number (digits with an optional point and digits, no exponent)", s)
}

// scanPlain returns the length of the longest prefix of s in the plain
// grammar, or 0 if there is none.
func scanPlain(s string) int {
	i := 0
	if i < len(s) && s[i] == '-' {
		i++
	}
	d := digits(s[i:])
	if d == 0 {
		return 0
	}
	i += d
	if i < len(s) && s[i] == '.' {
		f := digits(s[i+1:])
		if f == 0 {
			return 0
		}
		i += 1 + f
	}
	return i
}

func digits(s string) int {
	i := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
	}
	return i
}

// ParseDecimal reads s in the plain grammar.
func ParseDecimal(s string) (Decimal, error) {
	if len(s) > maxNumberLen {
		return Decimal{}, numErr(s, "%.40q... is longer than %d characters", s, maxNumberLen)
	}
	if n := scanPlain(s); n == 0 || n != len(s) {
		return Decimal{}, badText(s, false)
	}
	if _, ok := ratOf(s); !ok {
		return Decimal{}, badText(s, false)
	}
	return Decimal{number{s}}, nil
}

// ParseSci reads s in the scientific grammar.
func ParseSci(s string) (SciDecimal, error) {
	if len(s) > maxNumberLen {
		return SciDecimal{}, numErr(s, "%.40q... is longer than %d characters", s, maxNumberLen)
	}
	n := scanPlain(s)
	if n == 0 {
		return SciDecimal{}, badText(s, true)
	}
	if n < len(s) {
		e := s[n:]
		if len(e) < 3 || e[0] != 'e' || (e[1] != '+' && e[1] != '-') || digits(e[2:]) != len(e)-2 {
			return SciDecimal{}, badText(s, true)
		}
		x, err := strconv.Atoi(e[2:])
		if err != nil || x > maxExponent {
			return SciDecimal{}, numErr(s, "%.40q has an exponent out of range (at most %d in absolute value)", s, maxExponent)
		}
	}
	if _, ok := ratOf(s); !ok {
		return SciDecimal{}, badText(s, true)
	}
	return SciDecimal{number{s}}, nil
}

// ParseFraction reads s as a plain decimal or p/q.
func ParseFraction(s string) (Fraction, error) {
	p, q, ok := strings.Cut(s, "/")
	if !ok {
		d, err := ParseDecimal(s)
		return Fraction(d), err
	}
	if _, err := ParseDecimal(p); err != nil {
		return Fraction{}, fracErr(s, err)
	}
	b, err := ParseDecimal(q)
	if err != nil {
		return Fraction{}, fracErr(s, err)
	}
	if b.Sign() == 0 {
		return Fraction{}, numErr(s, "division by zero in %.40q", s)
	}
	return Fraction{number{s}}, nil
}

func fracErr(s string, err error) error {
	return numErr(s, "%.40q is not a decimal or fraction p/q of plain decimals: %v", s, err)
}

// StripTwoPiPrefix marks an alpha value that is 2 pi times a rational.
const StripTwoPiPrefix = "2*pi*"

// AlphaValue is an exact positive alpha: a Fraction r, or "2*pi*" followed
// by one (alpha = 2 pi r; the form physical units give).
type AlphaValue struct {
	text string
}

// ParseAlpha reads an alpha value.
func ParseAlpha(s string) (AlphaValue, error) {
	t := strings.TrimPrefix(s, StripTwoPiPrefix)
	f, err := ParseFraction(t)
	if err != nil {
		return AlphaValue{}, err
	}
	if f.Sign() <= 0 {
		return AlphaValue{}, numErr(s, "%.40q is not positive", s)
	}
	return AlphaValue{s}, nil
}

// AlphaOf writes the alpha value r (twoPi false) or 2 pi r (twoPi true);
// r must be positive.
func AlphaOf(r *big.Rat, twoPi bool) (AlphaValue, error) {
	if r == nil || r.Sign() <= 0 {
		return AlphaValue{}, errors.New("alpha must be positive")
	}
	t := FractionOf(r).text
	if twoPi {
		t = StripTwoPiPrefix + t
	}
	return AlphaValue{t}, nil
}

// Factor returns r as a new rational, where alpha = r or alpha = 2 pi r
// (nil when unset).
func (a AlphaValue) Factor() *big.Rat {
	t := strings.TrimPrefix(a.text, StripTwoPiPrefix)
	return number{t}.Rat()
}

// TwoPi reports whether alpha = 2 pi Factor().
func (a AlphaValue) TwoPi() bool { return strings.HasPrefix(a.text, StripTwoPiPrefix) }

// IsSet reports whether the value is set.
func (a AlphaValue) IsSet() bool { return a.text != "" }

// String returns the text of the value.
func (a AlphaValue) String() string { return a.text }

// MarshalText writes the text of the value.
func (a AlphaValue) MarshalText() ([]byte, error) { return []byte(a.text), nil }

// UnmarshalText reads an alpha value strictly.
func (a *AlphaValue) UnmarshalText(b []byte) error {
	v, err := ParseAlpha(string(b))
	if err != nil {
		return err
	}
	*a = v
	return nil
}

// decimalPlaces returns the number of decimal places of r when r is a
// terminating decimal (its denominator is 2^i 5^j), and ok false otherwise.
func decimalPlaces(r *big.Rat) (places int, ok bool) {
	d := new(big.Int).Set(r.Denom())
	twos := int(d.TrailingZeroBits())
	d.Rsh(d, uint(twos))
	fives := 0
	five := big.NewInt(5)
	q, m := new(big.Int), new(big.Int)
	for d.Cmp(big.NewInt(1)) != 0 {
		q.QuoRem(d, five, m)
		if m.Sign() != 0 {
			return 0, false
		}
		d.Set(q)
		fives++
	}
	return max(twos, fives), true
}

// DecimalText writes r exactly in the plain grammar with as few places as
// it needs ("0.5", "-3", "0.000125"); ok is false when r does not
// terminate in base 10 (then the text is "").
func DecimalText(r *big.Rat) (text string, ok bool) {
	places, ok := decimalPlaces(r)
	if !ok {
		return "", false
	}
	return r.FloatString(places), true
}

// DecimalOf returns r as a Decimal written by DecimalText; r must terminate
// in base 10.
func DecimalOf(r *big.Rat) (Decimal, error) {
	t, ok := DecimalText(r)
	if !ok {
		return Decimal{}, fmt.Errorf("%s is not a terminating decimal", r.RatString())
	}
	return Decimal{number{t}}, nil
}

// FloatDecimal returns the float64 x exactly as a Decimal (every finite
// float64 is a terminating decimal); x must be finite.
func FloatDecimal(x float64) (Decimal, error) {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return Decimal{}, fmt.Errorf("%v is not a finite number", x)
	}
	return DecimalOf(new(big.Rat).SetFloat64(x))
}

// FractionText writes r as DecimalText does when r terminates in base 10,
// else as p/q in lowest terms.
func FractionText(r *big.Rat) string {
	if t, ok := DecimalText(r); ok {
		return t
	}
	return r.String()
}

// FractionOf returns r as a Fraction written by FractionText.
func FractionOf(r *big.Rat) Fraction {
	return Fraction{number{FractionText(r)}}
}

// SciStyle chooses how SciFloat writes exponent zero.
type SciStyle int

const (
	// SciAlways writes every nonzero value with an exponent (5e+00).
	SciAlways SciStyle = iota
	// SciPlainUnits omits the exponent e+00 (values in [1, 10) in
	// absolute value are written as plain decimals).
	SciPlainUnits
)

// SciFloat writes the finite float64 x exactly in the scientific grammar:
// 0 as "0", otherwise the shortest mantissa d.ddd (exact, a float64 has at
// most 767 significant digits) and the exponent as e-01, e+12.
func SciFloat(x float64, style SciStyle) (SciDecimal, error) {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return SciDecimal{}, fmt.Errorf("%v is not a finite number", x)
	}
	if x == 0 {
		return SciDecimal{number{"0"}}, nil
	}
	s := new(big.Float).SetFloat64(x).Text('e', 800)
	i := strings.IndexByte(s, 'e')
	mant, exp := s[:i], s[i:]
	mant = strings.TrimSuffix(strings.TrimRight(mant, "0"), ".")
	if exp == "e+00" && style == SciPlainUnits {
		exp = ""
	}
	return SciDecimal{number{mant + exp}}, nil
}

// fields collects named numbers whose presence validate checks.
type fields []struct {
	name string
	n    interface{ IsSet() bool }
}

func (fs *fields) add(name string, n interface{ IsSet() bool }) {
	*fs = append(*fs, struct {
		name string
		n    interface{ IsSet() bool }
	}{name, n})
}

// check reports the first unset number by name ("claim.bound: missing
// number") and empties the list.
func (fs *fields) check() error {
	defer func() { *fs = (*fs)[:0] }()
	for _, f := range *fs {
		if !f.n.IsSet() {
			return fmt.Errorf("%s: missing number", f.name)
		}
	}
	return nil
}

// numberPath returns the JSON path ("relaxation.cover[3].lo") of the first
// number in the certificate b that its field's grammar rejects, or "" when
// there is none. Decode uses it to name the field in its error: the JSON
// reader reports a number's error without saying where it is.
func numberPath(b []byte) string {
	dec := json.NewDecoder(bytes.NewReader(b))
	path, err := findBadNumber(dec, reflect.TypeFor[Certificate](), "")
	if err != nil {
		return "" // a JSON syntax error: the decoder's own message says where
	}
	return path
}

var textUnmarshaler = reflect.TypeFor[encoding.TextUnmarshaler]()

// findBadNumber reads one JSON value from dec, which is to be decoded into
// type t (nil: not a schema field, only skipped), and returns the path of
// the first text value that t's UnmarshalText rejects. A JSON syntax error
// ends the search (its error is returned, with no path).
func findBadNumber(dec *json.Decoder, t reflect.Type, path string) (string, error) {
	tok, err := dec.Token()
	if err != nil {
		return "", err
	}
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if s, ok := tok.(string); ok && t != nil && reflect.PointerTo(t).Implements(textUnmarshaler) {
		if err := reflect.New(t).Interface().(encoding.TextUnmarshaler).UnmarshalText([]byte(s)); err != nil {
			return path, nil
		}
		return "", nil
	}
	d, ok := tok.(json.Delim)
	if !ok {
		return "", nil
	}
	join := func(key string) string {
		if path == "" {
			return key
		}
		return path + "." + key
	}
	for i := 0; dec.More(); i++ {
		var sub reflect.Type
		var subPath string
		if d == '{' {
			kt, err := dec.Token()
			if err != nil {
				return "", err
			}
			key, ok := kt.(string)
			if !ok {
				return "", fmt.Errorf("object key %v is not a string", kt)
			}
			subPath = join(key)
			switch {
			case t == nil:
			case t.Kind() == reflect.Struct:
				sub = jsonField(t, key)
			case t.Kind() == reflect.Map:
				sub = t.Elem()
			}
		} else {
			subPath = fmt.Sprintf("%s[%d]", path, i)
			if t != nil && (t.Kind() == reflect.Slice || t.Kind() == reflect.Array) {
				sub = t.Elem()
			}
		}
		p, err := findBadNumber(dec, sub, subPath)
		if p != "" || err != nil {
			return p, err
		}
	}
	_, err = dec.Token() // the closing delimiter
	return "", err
}

// jsonField returns the type of the field of struct t that the JSON key
// names, or nil.
func jsonField(t reflect.Type, key string) reflect.Type {
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if name == key {
			return f.Type
		}
	}
	return nil
}

// MustDecimal returns the Decimal of a literal such as "0.5" and panics if
// it does not read; it is meant for constants in code and tests, never for
// input.
func MustDecimal(s string) Decimal {
	d, err := ParseDecimal(s)
	if err != nil {
		panic("certificates.MustDecimal: " + err.Error())
	}
	return d
}

// MustSci is MustDecimal for the scientific grammar.
func MustSci(s string) SciDecimal {
	d, err := ParseSci(s)
	if err != nil {
		panic("certificates.MustSci: " + err.Error())
	}
	return d
}

// MustFraction is MustDecimal for fractions.
func MustFraction(s string) Fraction {
	f, err := ParseFraction(s)
	if err != nil {
		panic("certificates.MustFraction: " + err.Error())
	}
	return f
}

// MustAlpha is MustDecimal for alpha values.
func MustAlpha(s string) AlphaValue {
	a, err := ParseAlpha(s)
	if err != nil {
		panic("certificates.MustAlpha: " + err.Error())
	}
	return a
}

// Parser reads numbers for a certificate being built and keeps the first
// error, so that a certifier reads all its printed numbers and checks
// once: p.Decimal(s) ... if err := p.Err(); err != nil { ... }.
type Parser struct{ err error }

func (p *Parser) keep(what, s string, err error) {
	if err != nil && p.err == nil {
		p.err = fmt.Errorf("%s %.40q: %v", what, s, err)
	}
}

// Decimal reads s in the plain grammar.
func (p *Parser) Decimal(s string) Decimal {
	d, err := ParseDecimal(s)
	p.keep("decimal", s, err)
	return d
}

// Decimals reads each of ss in the plain grammar.
func (p *Parser) Decimals(ss []string) []Decimal {
	out := make([]Decimal, len(ss))
	for i, s := range ss {
		out[i] = p.Decimal(s)
	}
	return out
}

// Params reads each value of a parameter map in the plain grammar.
func (p *Parser) Params(m map[string]string) map[string]Decimal {
	out := make(map[string]Decimal, len(m))
	for k, v := range m {
		out[k] = p.Decimal(v)
	}
	return out
}

// Sci reads s in the scientific grammar.
func (p *Parser) Sci(s string) SciDecimal {
	d, err := ParseSci(s)
	p.keep("decimal", s, err)
	return d
}

// Fraction reads s as a decimal or p/q.
func (p *Parser) Fraction(s string) Fraction {
	f, err := ParseFraction(s)
	p.keep("fraction", s, err)
	return f
}

// Alpha reads an alpha value.
func (p *Parser) Alpha(s string) AlphaValue {
	a, err := ParseAlpha(s)
	p.keep("alpha", s, err)
	return a
}

// Note records err (when it is the first error); nil is ignored.
func (p *Parser) Note(err error) {
	if err != nil && p.err == nil {
		p.err = err
	}
}

// Err returns the first error met, or nil.
func (p *Parser) Err() error { return p.err }

// ShortDecimal writes the finite float64 x as the shortest plain decimal
// that reads back as x (strconv's 'f' format with precision -1): the
// recorded number is that decimal, not x's exact binary value. Certifiers
// use it for parameters they choose (the verifier checks whatever decimal
// is recorded).
func ShortDecimal(x float64) (Decimal, error) {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return Decimal{}, fmt.Errorf("%v is not a finite number", x)
	}
	return ParseDecimal(strconv.FormatFloat(x, 'f', -1, 64))
}

// MustThreshold is MustDecimal for a normal form's threshold (a Fraction
// or NoThreshold).
func MustThreshold(s string) ThresholdValue {
	var t ThresholdValue
	if err := t.UnmarshalText([]byte(s)); err != nil {
		panic("certificates.MustThreshold: " + err.Error())
	}
	return t
}
