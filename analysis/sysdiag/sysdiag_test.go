package sysdiag

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// The fixture testdata/fixtures/sysdiag_reference.json is written by
// testdata/scripts/sysdiag_reference.py: statsmodels 0.13.5
// (VARResults.test_normality, VECMResults.test_normality,
// acorr_breusch_godfrey, het_arch), scipy 1.10.1 (stats.skewtest) and
// numpy 1.24.2 code written from the published formulas (see the script).
// Each system carries its residuals and regressors, so the comparison is of
// the tests alone. Tolerance: 1e-6 relative.
type refSerial struct {
	H      int
	LMStat float64 `json:"lm"`
	LMP    float64 `json:"lm_p"`
	LMDF   int     `json:"lm_df"`
	F      float64
	FDF1   int     `json:"f_df1"`
	FDF2   float64 `json:"f_df2"`
	FP     float64 `json:"f_p"`
}

type refSystem struct {
	Name string
	U, X [][]float64
	JB   struct {
		Skew, Kurt, Joint float64
		SkewP             float64 `json:"skew_p"`
		KurtP             float64 `json:"kurt_p"`
		JointP            float64 `json:"joint_p"`
		DF                int
		JointStatsmodels  float64 `json:"joint_statsmodels"`
	}
	Serial []refSerial
	ARCH   []struct {
		Q, DF   int
		Stat, P float64
	}
	DH struct {
		Z1, Z2  []float64
		Stat, P float64
		DF      int
	}
	Case string
}

type refFixture struct {
	Library, Version string
	Systems, VECM    []refSystem
	Single           []struct {
		U, X   [][]float64
		Serial []struct {
			H                    int
			LM, LMP, F, FP, FDF2 float64
		}
		ARCH []struct {
			Q       int
			Stat, P float64
		}
	}
}

func loadFixture(t *testing.T) *refFixture {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/sysdiag_reference.json")
	if err != nil {
		t.Fatal(err)
	}
	var fx refFixture
	if err := json.Unmarshal(b, &fx); err != nil {
		t.Fatal(err)
	}
	if fx.Library != "statsmodels" || len(fx.Systems) != 2 || len(fx.VECM) != 2 || len(fx.Single) != 1 {
		t.Fatalf("unexpected fixture: %s %s, %d systems, %d VECMs", fx.Library, fx.Version, len(fx.Systems), len(fx.VECM))
	}
	return &fx
}

// The single-equation keys differ in case only; decode them by hand.
func (s *refFixture) UnmarshalJSON(b []byte) error {
	type plain refFixture
	if err := json.Unmarshal(b, (*plain)(s)); err != nil {
		return err
	}
	var raw struct {
		Single []struct {
			Serial []map[string]float64
		}
	}
	if err := json.Unmarshal(b, &raw); err != nil {
		return err
	}
	for i, sg := range raw.Single {
		for j, r := range sg.Serial {
			e := &s.Single[i].Serial[j]
			e.LM, e.LMP, e.F, e.FP, e.FDF2 = r["lm"], r["lm_p"], r["f"], r["f_p"], r["f_df2"]
		}
	}
	return nil
}

func dense(t *testing.T, rows [][]float64) *mat.Dense {
	t.Helper()
	if rows == nil {
		return nil
	}
	m := mat.NewDense(len(rows), len(rows[0]), nil)
	for i, r := range rows {
		m.SetRow(i, r)
	}
	return m
}

func near(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Max(math.Abs(want), 1e-300) || got == want
}

func TestAgainstReference(t *testing.T) {
	fx := loadFixture(t)
	n := 0
	check := func(sys, what string, got, want float64) {
		t.Helper()
		n++
		if !near(got, want, 1e-6) {
			t.Errorf("%s: %s = %.12g, reference %.12g", sys, what, got, want)
		}
	}
	for _, s := range append(append([]refSystem{}, fx.Systems...), fx.VECM...) {
		u, x := dense(t, s.U), dense(t, s.X)
		jb, err := JarqueBera(u)
		if err != nil {
			t.Fatal(err)
		}
		check(s.Name, "JB joint vs statsmodels test_normality", jb.Joint.Stat, s.JB.JointStatsmodels)
		check(s.Name, "JB skewness", jb.Skew.Stat, s.JB.Skew)
		check(s.Name, "JB kurtosis", jb.Kurt.Stat, s.JB.Kurt)
		check(s.Name, "JB skewness p", jb.Skew.P, s.JB.SkewP)
		check(s.Name, "JB kurtosis p", jb.Kurt.P, s.JB.KurtP)
		check(s.Name, "JB joint p", jb.Joint.P, s.JB.JointP)
		if jb.Skew.DF != s.JB.DF || jb.Joint.DF != 2*s.JB.DF {
			t.Errorf("%s: JB df %d, %d", s.Name, jb.Skew.DF, jb.Joint.DF)
		}
		for _, r := range s.Serial {
			got, err := SerialLM(u, x, r.H)
			if err != nil {
				t.Fatal(err)
			}
			check(s.Name, "LM "+strconv.Itoa(r.H), got.LM.Stat, r.LMStat)
			check(s.Name, "LM p "+strconv.Itoa(r.H), got.LM.P, r.LMP)
			check(s.Name, "ES F "+strconv.Itoa(r.H), got.F.Stat, r.F)
			check(s.Name, "ES F df2 "+strconv.Itoa(r.H), got.F.DF2, r.FDF2)
			check(s.Name, "ES F p "+strconv.Itoa(r.H), got.F.P, r.FP)
			if got.LM.DF != r.LMDF || got.F.DF != r.FDF1 {
				t.Errorf("%s: LM df %d, F df %d; reference %d, %d", s.Name, got.LM.DF, got.F.DF, r.LMDF, r.FDF1)
			}
		}
		for _, r := range s.ARCH {
			got, err := ARCH(u, r.Q)
			if err != nil {
				t.Fatal(err)
			}
			check(s.Name, "ARCH "+strconv.Itoa(r.Q), got.Stat, r.Stat)
			check(s.Name, "ARCH p "+strconv.Itoa(r.Q), got.P, r.P)
			if got.DF != r.DF {
				t.Errorf("%s: ARCH(%d) df %d, reference %d", s.Name, r.Q, got.DF, r.DF)
			}
		}
		dh, err := DoornikHansen(u)
		if err != nil {
			t.Fatal(err)
		}
		check(s.Name, "DH", dh.Test.Stat, s.DH.Stat)
		check(s.Name, "DH p", dh.Test.P, s.DH.P)
		for j := range s.DH.Z1 {
			check(s.Name, "DH z1 (scipy skewtest)", dh.Z1[j], s.DH.Z1[j])
			check(s.Name, "DH z2", dh.Z2[j], s.DH.Z2[j])
		}
	}
	// K = 1: the system formulas are statsmodels' single-equation
	// Breusch–Godfrey (LM and F) and Engle's ARCH-LM.
	sg := fx.Single[0]
	u, x := dense(t, sg.U), dense(t, sg.X)
	for _, r := range sg.Serial {
		got, err := SerialLM(u, x, r.H)
		if err != nil {
			t.Fatal(err)
		}
		check("K=1", "acorr_breusch_godfrey lm", got.LM.Stat, r.LM)
		check("K=1", "acorr_breusch_godfrey lm p", got.LM.P, r.LMP)
		check("K=1", "acorr_breusch_godfrey fval", got.F.Stat, r.F)
		check("K=1", "acorr_breusch_godfrey f p", got.F.P, r.FP)
		check("K=1", "F df2 = T − n − h", got.F.DF2, r.FDF2)
	}
	for _, r := range sg.ARCH {
		got, err := ARCH(u, r.Q)
		if err != nil {
			t.Fatal(err)
		}
		check("K=1", "het_arch lm", got.Stat, r.Stat)
		check("K=1", "het_arch p", got.P, r.P)
	}
	// Per system: 6 JB values, 5 per LM order, 2 per ARCH order, 2 DH
	// values and 2 per equation; then 5 per order and 2 per ARCH order
	// for K = 1.
	if want := (6 + 4*5 + 2*2 + 2 + 3*2) + (6 + 4*5 + 2*2 + 2 + 4*2) + 2*(6+4*5+1*2+2+4*2) + 4*5 + 4*2; n != want {
		t.Errorf("checked %d values", n)
	}
}

// TestVECMRegressors: the regressors built from galley's own VECM of the
// Danish data are those statsmodels' VECM implies (β'y_{t−1} with the
// restricted constant in case rc, the constant in case c, Δy_{t−1}); both
// normalise β on LRM, so the columns agree one for one.
func TestVECMRegressors(t *testing.T) {
	fx := loadFixture(t)
	y := readDenmark(t)
	for _, s := range fx.VECM {
		c := map[string]johansen.Case{"constant": johansen.C, "restricted constant": johansen.RC}[s.Case]
		r, err := johansen.Test(y, c, 1)
		if err != nil {
			t.Fatal(err)
		}
		m, err := r.Estimate(1, []int{0})
		if err != nil {
			t.Fatal(err)
		}
		x, err := VECMRegressors(y, c, m, johansen.Extra{})
		if err != nil {
			t.Fatal(err)
		}
		want := dense(t, s.X)
		rows, cols := want.Dims()
		if gr, gc := x.Dims(); gr != rows || gc != cols {
			t.Fatalf("%s: %d×%d regressors, reference %d×%d", s.Case, gr, gc, rows, cols)
		}
		for i := 0; i < rows; i++ {
			for j := 0; j < cols; j++ {
				if !near(x.At(i, j), want.At(i, j), 1e-6) && math.Abs(x.At(i, j)-want.At(i, j)) > 1e-9 {
					t.Fatalf("%s: regressor [%d,%d] = %.10g, reference %.10g", s.Case, i, j, x.At(i, j), want.At(i, j))
				}
			}
		}
		// galley's residuals are statsmodels' and orthogonal to the regressors.
		u := dense(t, s.U)
		for i := 0; i < rows; i++ {
			for j := 0; j < 4; j++ {
				if math.Abs(m.Resid.At(i, j)-u.At(i, j)) > 1e-8 {
					t.Fatalf("%s: residual [%d,%d] = %.10g, statsmodels %.10g", s.Case, i, j, m.Resid.At(i, j), u.At(i, j))
				}
			}
		}
	}
}

func readDenmark(t *testing.T) *mat.Dense {
	t.Helper()
	f, err := os.Open("../../testdata/data/denmark.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// date, LRM, LRY, LPY, IBO, IDE → LRM, LRY, IBO, IDE
	y := mat.NewDense(len(recs)-1, 4, nil)
	for i, r := range recs[1:] {
		for j, c := range []int{1, 2, 4, 5} {
			v, err := strconv.ParseFloat(r[c], 64)
			if err != nil {
				t.Fatal(err)
			}
			y.Set(i, j, v)
		}
	}
	return y
}

func TestBadInput(t *testing.T) {
	u := mat.NewDense(20, 2, nil)
	for i := 0; i < 20; i++ {
		u.Set(i, 0, math.Sin(float64(i)))
		u.Set(i, 1, math.Cos(1.7*float64(i)))
	}
	if _, err := SerialLM(u, nil, 0); err == nil {
		t.Error("order 0 accepted")
	}
	if _, err := SerialLM(u, nil, 9); !errors.Is(err, ErrTooFewObs) {
		t.Errorf("order 9 on 20 observations: %v", err)
	}
	if _, err := SerialLM(u, mat.NewDense(19, 1, nil), 1); err == nil {
		t.Error("mismatched rows accepted")
	}
	if _, err := ARCH(u, 0); err == nil {
		t.Error("ARCH order 0 accepted")
	}
	if _, err := ARCH(u, 5); !errors.Is(err, ErrTooFewObs) {
		t.Errorf("ARCH(5) on 20 observations of 2 series: %v", err)
	}
	if _, err := DoornikHansen(mat.NewDense(5, 2, []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 1})); !errors.Is(err, ErrTooFewObs) {
		t.Errorf("DH on 5 observations: %v", err)
	}
	// Two identical equations: singular covariances, an error each.
	same := mat.NewDense(20, 2, nil)
	for i := 0; i < 20; i++ {
		same.Set(i, 0, u.At(i, 0))
		same.Set(i, 1, u.At(i, 0))
	}
	if _, err := JarqueBera(same); err == nil {
		t.Error("JB: singular covariance accepted")
	}
	if _, err := DoornikHansen(same); err == nil {
		t.Error("DH: singular correlation accepted")
	}
	if _, err := SerialLM(same, nil, 1); err == nil {
		t.Error("LM: singular covariance accepted")
	}
	bad := mat.DenseCopyOf(u)
	bad.Set(3, 1, math.NaN())
	for name, f := range map[string]func() error{
		"LM":   func() error { _, err := SerialLM(bad, nil, 1); return err },
		"JB":   func() error { _, err := JarqueBera(bad); return err },
		"DH":   func() error { _, err := DoornikHansen(bad); return err },
		"ARCH": func() error { _, err := ARCH(bad, 1); return err },
	} {
		if err := f(); err == nil {
			t.Errorf("%s: NaN residual accepted", name)
		}
	}
	if _, err := JarqueBera(nil); err == nil {
		t.Error("nil residuals accepted")
	}
	if _, err := VECMRegressors(nil, johansen.C, nil, johansen.Extra{}); err == nil {
		t.Error("nil VECM accepted")
	}
}
