package materials

import "math"

// Vapour pressure and sound speed of water and seawater (library, second
// edition).

// waterVapourPressure is the saturation pressure (Pa) of water at
// temperature T (K) by the saturation-pressure equation of IAPWS-IF97
// (Revised Release on the IAPWS Industrial Formulation 1997, 2007, §8.1,
// eq. 30 with the coefficients of Table 34), valid 273.15–647.096 K.
func waterVapourPressure(T float64) float64 {
	n := [10]float64{
		0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
		0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
		-0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
		0.65017534844798e3,
	}
	th := T + n[8]/(T-n[9])
	A := th*th + n[0]*th + n[1]
	B := n[2]*th*th + n[3]*th + n[4]
	C := n[5]*th*th + n[6]*th + n[7]
	x := 2 * C / (-B + math.Sqrt(B*B-4*A*C))
	return x * x * x * x * 1e6 // p* = 1 MPa
}

// seawaterVapourPressure is the vapour pressure (Pa) of seawater at
// Celsius temperature t and salinity S (kg/kg) by the Raoult-law
// correlation Sharqawy et al. (2010) recommend:
// p_v,sw = p_v,w / (1 + 0.57357·S/(1000 − S)), S in g/kg, on the
// IAPWS-IF97 pure-water value.
func seawaterVapourPressure(t, S float64) float64 {
	sg := S * 1e3
	return waterVapourPressure(t+273.15) / (1 + 0.57357*sg/(1000-sg))
}

// seawaterSoundSpeed is the speed of sound (m/s) in seawater at Celsius
// temperature t, salinity S (kg/kg) and depth D (m) by the nine-term
// equation of Mackenzie (1981), J. Acoust. Soc. Am. 70(3):807–812; valid
// 2–30 °C, 25–40 g/kg, 0–8000 m. Salinity enters in parts per thousand.
func seawaterSoundSpeed(t, S, D float64) float64 {
	s := S*1e3 - 35
	return 1448.96 + 4.591*t - 5.304e-2*t*t + 2.374e-4*t*t*t + 1.340*s +
		1.630e-2*D + 1.675e-7*D*D - 1.025e-2*t*s - 7.139e-13*t*D*D*D
}

const (
	srcIF97Sat    = "IAPWS-IF97 (2007 revision) saturation-pressure equation, eq. 30, Table 34"
	srcSharqawyPv = "Sharqawy, Lienhard & Zubair 2010, Desalination and Water Treatment 16:354 (Raoult-law vapour-pressure correlation; its coefficient 0.57357 from memory, not checked against the paper) on IAPWS-IF97"
	srcMackenzieC = "Mackenzie 1981, J. Acoust. Soc. Am. 70:807 (nine-term equation), at the surface (depth 0)"
)
