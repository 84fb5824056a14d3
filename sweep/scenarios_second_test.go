package sweep

import (
	"math"
	"strings"
	"testing"
)

func measureAt(t *testing.T, c *ComboResult, name string) float64 {
	t.Helper()
	for _, m := range c.Measures {
		if m.Name == name {
			return m.AtRecommended
		}
	}
	t.Fatalf("no measure %q", name)
	return 0
}

func requiredAt(t *testing.T, c *ComboResult, q string) float64 {
	t.Helper()
	for _, pv := range c.Required {
		if pv.Quantity == q {
			return pv.AtRecommended
		}
	}
	t.Fatalf("%s not required (required: %+v)", q, c.Required)
	return 0
}

// The estuary scenario: a reach 12 km long in a hall 80 m long with a
// 5 cm minimum depth. Undistorted, the floor wants kL ≥ 150 and the depth
// (6 m) kL ≤ 120: no window. Distorted with the vertical scale kz as the
// second axis, velocity, discharge, time and roughness follow the
// distorted Froude laws (Hughes 1993 ch. 2; Chanson 2004 ch. 14; from
// memory) at the recommended point, and the floor length sets kL = 150.
func TestScenarioEstuary(t *testing.T) {
	res := runStudy(t, scenario(t, "estuary"))
	if b := strategy(t, res, "undistorted").Best; b != nil {
		t.Errorf("undistorted model feasible at 1:%v; the floor (kL ≥ 150) and the depth (kL ≤ 120) exclude it", b.Recommended)
	}
	sr := strategy(t, res, "distorted")
	if f := sr.Cases[0].Solution.Free; len(f) != 1 || f[0] != "thickness" {
		t.Fatalf("free choices %v, want thickness (the second axis)", f)
	}
	b := sr.Best
	if b == nil {
		t.Fatal("distorted: no window")
	}
	kL, kz := b.Recommended, b.Axis
	if !relClose(kL, 12000.0/80, 1e-9) || b.Window[0].LoLimit != "reach fits the floor" {
		t.Errorf("recommended 1:%v limited by %q, want 1:150 by the floor length", kL, b.Window[0].LoLimit)
	}
	// The axis value keeps every limit: depth 6 m/kz ≥ 5 cm, distortion
	// kL/kz ≤ 10, model n = 0.025/k_n ≥ 0.012.
	if 6/kz < 0.05*(1-1e-9) || kL/kz > 10*(1+1e-9) {
		t.Errorf("kz = %v: depth %v m, distortion %v", kz, 6/kz, kL/kz)
	}
	kg := 1.0 // same gravity
	want := map[string]float64{
		"velocity":  math.Sqrt(kg * kz),
		"discharge": kL * math.Pow(kz, 1.5),
		"time":      kL / math.Sqrt(kz),
		"roughness": math.Pow(kz, 2.0/3) / math.Sqrt(kL),
	}
	for q, w := range want {
		if got := b.Factors[q]; !relClose(got, w, 1e-9) {
			t.Errorf("k_%s = %v at kL %v, kz %v; want %v", q, got, kL, kz, w)
		}
	}
	if got, w := requiredAt(t, b, "roughness"), 0.025/want["roughness"]; !relClose(got, w, 1e-9) {
		t.Errorf("model Manning n %v, want %v", got, w)
	}
	if got := measureAt(t, b, "distortion ratio"); !relClose(got, kL/kz, 1e-9) {
		t.Errorf("distortion ratio %v, want kL/kz = %v", got, kL/kz)
	}
	if len(b.AxisWindows) != len(res.Plan.AxisValues) {
		t.Errorf("%d axis windows, want one per vertical scale (%d)", len(b.AxisWindows), len(res.Plan.AxisValues))
	}
}

// The caisson scenario: a centrifuge with the g-level tied to the scale
// (N = kL). Garnier et al. 2007 (IJPMG 7(3), from memory): dynamic time
// scales as N and consolidation time as N², so the same clay and water
// cannot keep both; a pore fluid N times more viscous can (c_v,m =
// c_v,p/N); with water the time factor is off by N.
func TestScenarioCaisson(t *testing.T) {
	res := runStudy(t, scenario(t, "caisson"))
	same := strategy(t, res, "same soil")
	if same.Best != nil {
		t.Errorf("same soil feasible at 1:%v; the time factor holds only at kL = 1", same.Best.Recommended)
	}
	if c := same.Combos[0]; len(c.Conditions) != 1 || !strings.HasPrefix(c.Conditions[0], "time factor") {
		t.Errorf("same soil conditions %v, want the time factor", c.Conditions)
	}
	visc := strategy(t, res, "viscous pore fluid").Best
	if visc == nil {
		t.Fatal("viscous pore fluid: no window")
	}
	w := visc.Window[0]
	// Largest model: soil height 18 m/kL ≤ 0.1 × 5 m → kL ≥ 36; smallest:
	// c_v,m = 2e-7/kL ≥ 2e-9, the low end of the tunable range of the
	// pore-fluid kaolin (Custom sheet) → kL ≤ 100 (both products of
	// powers: exact).
	if !relClose(w.Lo, 36, 1e-9) || !relClose(w.Hi, 100, 1e-9) || w.HiLimit != "tuned consolidation_coefficient min" {
		t.Errorf("viscous window %v (%s, %s), want 1:36–1:100 ending at the tunable range of c_v", w, w.LoLimit, w.HiLimit)
	}
	kL := visc.Recommended
	if got := requiredAt(t, visc, "consolidation_coefficient"); !relClose(got, 2e-7/kL, 1e-9) {
		t.Errorf("required c_v %v, want 2e-7/kL = %v", got, 2e-7/kL)
	}
	if got := measureAt(t, visc, "pore fluid viscosity"); !relClose(got, kL, 1e-9) {
		t.Errorf("pore fluid viscosity %v × water, want N = kL = %v", got, kL)
	}
	if got := measureAt(t, visc, "g-level"); !relClose(got, kL, 1e-9) {
		t.Errorf("g-level %v, want N = kL = %v", got, kL)
	}
	// The g-level min limit names g_level, which follows the tie:
	// margin = log10(kL/10) exactly.
	for _, l := range visc.Limits {
		if l.Name == "g-level min" && (!l.Linear || !relClose(l.B, 1, 1e-12) || math.Abs(l.A+1) > 1e-12) {
			t.Errorf("g-level min: linear %v, margin %v + %v·log10 kL, want log10(kL/10)", l.Linear, l.A, l.B)
		}
	}
	if got := visc.Factors["time"]; !relClose(got, kL, 1e-9) {
		t.Errorf("k_time %v, want kL (dynamic and consolidation time alike)", got)
	}
	dyn := strategy(t, res, "dynamic loading only").Best
	if dyn == nil {
		t.Fatal("dynamic loading only: no window")
	}
	// Small-model edge: g-level N = kL ≤ 200.
	if d := dyn.Window[0]; !relClose(d.Hi, 200, 1e-9) || d.HiLimit != "g-level" {
		t.Errorf("dynamic window %v ends at %q, want 1:200 at the g-level", d, d.HiLimit)
	}
	found := false
	for _, m := range dyn.Mismatches {
		if m.Law == "consolidation" {
			found = true
			if !relClose(m.Ratio, 1/dyn.Recommended, 1e-9) {
				t.Errorf("time-factor mismatch %v, want 1/kL = %v", m.Ratio, 1/dyn.Recommended)
			}
		}
	}
	if !found {
		t.Errorf("no consolidation mismatch in %+v", dyn.Mismatches)
	}
}
