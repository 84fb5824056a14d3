package sweep

import (
	"math"
	"testing"

	"scaleplan/sweep/study"
)

// The depressurised-tank case of spec §3.6 through a study: a propeller in
// a cavitation tunnel, Froude and cavitation numbers kept (ITTC
// Recommended Procedures for cavitation tests, from memory). The tunnel
// pressure the model needs, p_m = p_v,m + (p_p − p_v,p)/k_p with
// k_p = k_ρ·kL, is read the other way as the requirement on the tunnel's
// lowest pressure and bounds the window where it reaches 5 kPa.
func TestStudyCavitationTunnelPressure(t *testing.T) {
	s, err := study.Load("testdata/propeller")
	if err != nil {
		t.Fatal(err)
	}
	res := runStudy(t, s)
	sr := strategy(t, res, "cavitation")
	b := comboIn(t, sr, "Test tunnel")
	if b.Window.Empty() {
		t.Fatal("no window in the tunnel")
	}
	pvm := res.Plan.Media[0].Props["vapour_pressure"].Value
	// IAPWS saturation pressure of water at 20 °C: 2.339 kPa.
	if math.Abs(pvm-2339) > 1 {
		t.Fatalf("tunnel water vapour pressure %v Pa, want 2339", pvm)
	}
	kRho := res.Plan.Proto["density"] / res.Plan.Media[0].Props["density"].Value
	const margin = 139875.0 // p_p − p_v,p, Pa (Prototype sheet)
	need := func(kL float64) float64 { return pvm + margin/(kRho*kL) }
	var req *Requirement
	for i := range b.Requirements {
		if b.Requirements[i].Capability == "ambient_pressure_min" {
			req = &b.Requirements[i]
		}
	}
	if req == nil {
		t.Fatalf("no requirement on ambient_pressure_min: %+v", b.Requirements)
	}
	if req.AtLeast {
		t.Error("the tunnel's lowest pressure must be at most the required one")
	}
	for i, kL := range res.Plan.Grid {
		// Found by bisection to 0.1 %.
		if got, w := req.At(i), need(kL); math.Abs(got-w) > 2e-3*w {
			t.Errorf("kL %.4g: required tunnel pressure %v Pa, want %v", kL, got, w)
		}
	}
	// Small-model edge: p_m falls to the tunnel's 5 kPa.
	edge := margin / (kRho * (5000 - pvm))
	if w := b.Window[0]; w.HiLimit != "tunnel pressure min" || math.Abs(w.Hi-edge) > 1e-3*edge {
		t.Errorf("window %v ends at %q, want 1:%.4g at the tunnel pressure min", w, w.HiLimit, edge)
	}
	if got := b.Factors["pressure"]; !relClose(got, kRho*b.Recommended, 1e-9) {
		t.Errorf("k_pressure %v, want k_ρ·kL = %v", got, kRho*b.Recommended)
	}
	// The depressurised towing tank: the same requirement, bounded by its
	// lowest air pressure, 4 kPa.
	tank := comboIn(t, sr, "Vacuum tank")
	edge = margin / (kRho * (4000 - pvm))
	if w := tank.Window[0]; w.HiLimit != "tank pressure min" || math.Abs(w.Hi-edge) > 1e-3*edge {
		t.Errorf("tank window %v ends at %q, want 1:%.4g at the tank pressure min", w, w.HiLimit, edge)
	}
}
