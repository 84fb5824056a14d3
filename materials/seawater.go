package materials

import "math"

// Seawater at atmospheric pressure by Sharqawy, Lienhard & Zubair (2010),
// "Thermophysical properties of seawater: a review of existing correlations
// and data", Desalination and Water Treatment 16:354–380. Temperatures t in
// °C (ITS-90), salinity S in kg/kg (reference-composition salinity).

// seawaterDensity is eq. (8), ±0.1 %, valid 0–180 °C and 0–0.16 kg/kg.
func seawaterDensity(t, S float64) float64 {
	rhoW := 9.999e2 + 2.034e-2*t - 6.162e-3*t*t + 2.261e-5*t*t*t - 4.657e-8*t*t*t*t
	return rhoW + S*(8.020e2-2.001*t+1.677e-2*t*t-3.060e-5*t*t*t-1.613e-5*S*t*t)
}

// seawaterViscosity is eqs. (22)–(23), ±1.5 %, valid 0–180 °C and
// 0–0.15 kg/kg (Pa·s).
func seawaterViscosity(t, S float64) float64 {
	muW := 4.2844e-5 + 1/(0.157*(t+64.993)*(t+64.993)-91.296)
	A := 1.541 + 1.998e-2*t - 9.52e-5*t*t
	B := 7.974 - 7.561e-2*t + 4.724e-4*t*t
	return muW * (1 + A*S + B*S*S)
}

// seawaterSurfaceTension is eq. (28) on the IAPWS pure-water value, valid
// 0–40 °C and 0–40 g/kg (N/m); the salinity enters in g/kg.
func seawaterSurfaceTension(t, S float64) float64 {
	sgkg := S * 1e3
	return waterSurfaceTension(t+273.15) * (1 + (2.2637334337e-4*t+9.4579521377e-3)*math.Log(1+3.3104954843e-2*sgkg))
}

const (
	srcSharqawyRho = "Sharqawy, Lienhard & Zubair 2010, Desalination and Water Treatment 16:354, eq. 8 (±0.1 %)"
	srcSharqawyMu  = "Sharqawy, Lienhard & Zubair 2010, Desalination and Water Treatment 16:354, eqs. 22–23 (±1.5 %)"
	srcSharqawySig = "Sharqawy, Lienhard & Zubair 2010, Desalination and Water Treatment 16:354, eq. 28 on IAPWS R1-76(2014)"
)

func seawaterEntry() Entry {
	const rangeSrc = "Sharqawy et al. 2010 eq. 28 (surface tension) holds 0–40 °C and 0–40 g/kg; eqs. 8 and 22 hold wider"
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: 293.15, Min: 273.15, Max: 313.15, Tunable: true, Source: rangeSrc},
			{Condition: Salinity, Default: 0.035, Min: 0, Max: 0.040, Source: rangeSrc},
		},
		model: func(c Conditions) []Property {
			t, S := c.Temperature-273.15, c.Salinity
			return []Property{
				{Quantity: "density", Value: seawaterDensity(t, S), Source: srcSharqawyRho},
				{Quantity: "viscosity", Value: seawaterViscosity(t, S), Source: srcSharqawyMu},
				{Quantity: "surface_tension", Value: seawaterSurfaceTension(t, S), Source: srcSharqawySig},
				{Quantity: "sound_speed", Value: seawaterSoundSpeed(t, S, 0), Source: srcMackenzieC},
				{Quantity: "vapour_pressure", Value: seawaterVapourPressure(t, S), Source: srcSharqawyPv},
			}
		},
	}
}
