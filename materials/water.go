package materials

import "math"

// Fresh water at atmospheric pressure, as functions of temperature.

// waterDensity is the density of air-free SMOW at 101325 Pa (kg/m³) at
// Celsius temperature t, by the CIPM formula of Tanaka, Girard, Davis,
// Peuto & Bignell (2001), Metrologia 38:301–309, valid 0–40 °C.
func waterDensity(t float64) float64 {
	const (
		a1 = -3.983035  // °C
		a2 = 301.797    // °C
		a3 = 522528.9   // °C²
		a4 = 69.34881   // °C
		a5 = 999.974950 // kg/m³
	)
	return a5 * (1 - (t+a1)*(t+a1)*(t+a2)/(a3*(t+a4)))
}

// Reference constants of IAPWS R12-08 and R1-76(2014).
const (
	waterTc   = 647.096 // K, critical temperature
	waterRhoc = 322.0   // kg/m³, reference density of R12-08
)

// waterViscosity is the dynamic viscosity (Pa·s) of water at temperature T
// (K) and density rho (kg/m³) by IAPWS R12-08 in its form for industrial
// use: μ = μ0(T̄)·μ1(T̄, ρ̄) with the critical enhancement μ2 = 1, which
// R12-08 allows outside a small region around the critical point.
func waterViscosity(T, rho float64) float64 {
	// Coefficients of IAPWS R12-08 (2008), Release on the IAPWS
	// Formulation 2008 for the Viscosity of Ordinary Water Substance,
	// Tables 1 and 2; viscH1[i][j] multiplies (1/T̄ − 1)^i (ρ̄ − 1)^j.
	viscH0 := [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}
	viscH1 := [6][7]float64{
		{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
		{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
		{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
		{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
		{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
		{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
	}
	tb, db := T/waterTc, rho/waterRhoc
	var s0 float64
	for i, h := range viscH0 {
		s0 += h / math.Pow(tb, float64(i))
	}
	mu0 := 100 * math.Sqrt(tb) / s0
	var s1 float64
	x, y := 1/tb-1, db-1
	for i := range viscH1 {
		var inner float64
		for j := range viscH1[i] {
			inner += viscH1[i][j] * math.Pow(y, float64(j))
		}
		s1 += math.Pow(x, float64(i)) * inner
	}
	mu1 := math.Exp(db * s1)
	return mu0 * mu1 * 1e-6 // μ* = 1 µPa·s
}

// waterSurfaceTension is the surface tension (N/m) of water against its
// vapour at temperature T (K) by IAPWS R1-76(2014):
// σ = 235.8 mN/m · τ^1.256 · (1 − 0.625 τ), τ = 1 − T/Tc; valid from the
// triple point to the critical point.
func waterSurfaceTension(T float64) float64 {
	tau := 1 - T/waterTc
	return 235.8e-3 * math.Pow(tau, 1.256) * (1 - 0.625*tau)
}

// waterSoundSpeed is the speed of sound (m/s) in pure water at
// atmospheric pressure at Celsius temperature t, by the fifth-order
// polynomial of Marczak (1997), J. Acoust. Soc. Am. 102:2776–2779,
// valid 0–95 °C.
func waterSoundSpeed(t float64) float64 {
	k := [6]float64{1.402385e3, 5.038813, -5.799136e-2, 3.287156e-4, -1.398845e-6, 2.787860e-9}
	c := 0.0
	for i := len(k) - 1; i >= 0; i-- {
		c = c*t + k[i]
	}
	return c
}

const (
	srcTanaka   = "Tanaka et al. 2001, Metrologia 38:301 (CIPM formula, air-free SMOW at 101325 Pa)"
	srcIAPWSVis = "IAPWS R12-08 (2008), industrial form μ0·μ1 with μ2 = 1, at the Tanaka density"
	srcIAPWSSig = "IAPWS R1-76(2014): 235.8 mN/m · τ^1.256 · (1 − 0.625 τ), τ = 1 − T/647.096 K"
	srcMarczak  = "Marczak 1997, J. Acoust. Soc. Am. 102:2776 (polynomial, 0–95 °C)"
)

func waterEntry() Entry {
	return Entry{
		Ranges: []ConditionRange{{
			Condition: Temperature, Default: 293.15, Min: 273.15, Max: 313.15, Tunable: true,
			Source: "the Tanaka et al. 2001 density formula holds 0–40 °C",
		}},
		model: func(c Conditions) []Property {
			t := c.Temperature - 273.15
			rho := waterDensity(t)
			return []Property{
				{Quantity: "density", Value: rho, Source: srcTanaka},
				{Quantity: "viscosity", Value: waterViscosity(c.Temperature, rho), Source: srcIAPWSVis},
				{Quantity: "surface_tension", Value: waterSurfaceTension(c.Temperature), Source: srcIAPWSSig},
				{Quantity: "sound_speed", Value: waterSoundSpeed(t), Source: srcMarczak},
				{Quantity: "vapour_pressure", Value: waterVapourPressure(c.Temperature), Source: srcIF97Sat},
			}
		},
	}
}
