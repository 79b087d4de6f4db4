package regions

import (
	"testing"

	"wedgebound/interval"
)

// expJetRefs: D, D', D” and Re, Im of B, B', B” of the unit-weight term
// e^{-150 xp} at four s, from mpmath 1.3.0 at 50 digits by a different
// route: the Lerch transcendent, I = Phi(q, 1, a), I' = -i Phi(q, 2, a),
// I” = -2 Phi(q, 3, a) (the r-integral of I expanded in the geometric
// series of 1/(1 - q r)), and B^(n) = conj(I^(n))/(pi (k + 2i)); seen
// here, not a published source. The first s is the critical point of the
// inf-spec edge of testdata/terms/exp150.json; the others exercise the
// turned rays (s <= -1, s >= 1) and the real one.
var expJetRefs = [][10]string{
	{"-0.259179428399470498257", "0.00490304702668832459986183587725783498840216", "0.0104805850013226304018196116093635910139421", "-0.00414070233337932169565807075676921477001893", "0.00959432259332403091415437229609058338764727", "-0.00553419358453665699407195754067054228199902", "0.0061735446588427097046653484389814620423701", "0.00555647969277639403366349039596529301714858", "-0.004396888805803902079406769582838966422042", "0.0243816255792780339644247037404775772417375"},
	{"-1.5", "0.00011506144119024363521711214966828371745417", "0.00036448596444840589846244595376332569678152", "0.00115423416649453398980362797025054763814312", "0.00534501483937516035607726752380262926544858", "-0.00640419201156958004683676615081024370505022", "0.00161943881632568574397764759215346981570082", "-0.000167521350839196802013284341907226761515516", "0.0011305594794791651174661381744541458255604", "0.0000160177174089751158532039507425138743446317"},
	{"2.5", "0.00000553236004219435506221218578464929356841478", "-0.0000172328955674904374486946948646255526646748", "0.0000536791722302571163412014610196213033433743", "0.00499745926243850869972539788906270689447236", "-0.00000000107383994682813416915684899650751968520782", "-0.000728385973250463269760557216760476816608084", "0.00000000671850032420409872109555408874072975313719", "0.000335975040162390872252160964574691030721296", "-0.0000000420344203800012210557745408264287964563857"},
	{"0.75", "0.00127767168813761622968649740906536345794266", "-0.00390838034380253439654017215508501367029028", "0.0115105937383188436991550649990181605600067", "0.00746842526540183336364645097845852416126401", "-0.0000605490049380694107572561361104084888818963", "-0.00315960109701391818315090401082372069803871", "0.000375438892972742322026214156059561297979486", "0.00511008210130206991697504622502505250260627", "-0.00230684574174403257526455008250853093233996"},
}

// checkExpJet builds the jet of e^{-150 xp} at the precision of like on a
// window around each reference s and checks that every entry encloses the
// reference (padded by slack, the rounding of the 42-digit references) and
// is narrower than maxW.
func checkExpJet[T interval.Real[T]](t *testing.T, like T, refs [][10]string, slack, maxW float64) {
	t.Helper()
	term, err := NewTerm(like, "exp", map[string]string{"k": "150"})
	if err != nil {
		t.Fatal(err)
	}
	pad := like.Float(slack)
	for _, ref := range refs {
		s, _ := like.Decimal(ref[0])
		sf := s.Lo()
		j, err := term.(Jetter[T]).JetOn(sf-1.0/32, sf+1.0/32, 2)
		if err != nil {
			t.Fatalf("s = %s: %v", ref[0], err)
		}
		m := j.Jet(s, 2)
		got := []T{m[0].D, m[1].D, m[2].D, m[0].B.Re, m[0].B.Im, m[1].B.Re, m[1].B.Im, m[2].B.Re, m[2].B.Im}
		names := []string{"D", "D'", "D''", "Re B", "Im B", "Re B'", "Im B'", "Re B''", "Im B''"}
		for i, g := range got {
			want, _ := like.Decimal(ref[i+1])
			if !g.Pad(pad).Contains(want) {
				t.Errorf("s = %s, %d bits: %s = %v does not enclose %s", ref[0], like.Prec(), names[i], g, ref[i+1])
			}
			if w := 2 * g.Rad(); !(w <= maxW) {
				t.Errorf("s = %s, %d bits: %s = %v is %.2g wide", ref[0], like.Prec(), names[i], g, w)
			}
		}
	}
}

func TestExpJetFloat(t *testing.T) {
	checkExpJet(t, interval.F{}, expJetRefs, 1e-30, 1e-13)
}

// At 140 bits the enclosures hold the 42-digit references to about 40
// digits (two windows: the real ray and a turned one).
func TestExpJetBig(t *testing.T) {
	checkExpJet(t, interval.NewB(0, 140), [][10]string{expJetRefs[0], expJetRefs[2]}, 1e-44, 1e-38)
}

// A window the turned ray cannot serve (s from -0.6 to 1.4 has its middle
// at 0.4, so the real ray is used, and that works) and a bad window.
func TestExpJetWindows(t *testing.T) {
	term, _ := NewTerm(interval.F{}, "exp", map[string]string{"k": "150"})
	if _, err := term.(Jetter[interval.F]).JetOn(-0.6, 1.4, 1); err != nil {
		t.Errorf("window [-0.6, 1.4]: %v", err)
	}
	if _, err := term.(Jetter[interval.F]).JetOn(1, 0, 1); err == nil {
		t.Error("the empty window [1, 0] was accepted")
	}
}
