package materials

import "math"

// Brine: a solution of sodium chloride in water, at atmospheric pressure,
// by the models of Laliberté and Cooper (2004), "Model for calculating the
// density of aqueous electrolyte solutions", J. Chem. Eng. Data 49:1141,
// and Laliberté (2007), "Model for calculating the viscosity of aqueous
// solutions", J. Chem. Eng. Data 52:321, with the NaCl parameters as
// updated in Laliberté (2009), J. Chem. Eng. Data 54:1725. Temperatures t
// in °C, w the NaCl mass fraction (kg of salt per kg of solution), carried
// in the Salinity condition.

// brineWaterDensity is the pure-water density the density model is built
// on (kg/m³), Kell's (1975) formula as used by Laliberté & Cooper (2004).
func brineWaterDensity(t float64) float64 {
	num := ((((-2.8054253e-10*t+1.0556302e-7)*t-4.6170461e-5)*t-0.0079870401)*t+16.945176)*t + 999.83952
	return num / (1 + 0.01687985*t)
}

// brineDensity is 1/ρ = ww/ρw + w·v_app with the apparent specific volume
// of NaCl v_app = (w + c2 + c3 t)/((c0 w + c1) exp(1e-6 (t + c4)²)) m³/kg.
func brineDensity(t, w float64) float64 {
	const c0, c1, c2, c3, c4 = -0.00324112223655149, 0.0636354335906616, 1.01371399467365, 0.0145951015210159, 3317.34854426537
	vApp := (w + c2 + c3*t) / ((c0*w + c1) * math.Exp(1e-6*(t+c4)*(t+c4)))
	return 1 / ((1-w)/brineWaterDensity(t) + w*vApp)
}

// brineWaterViscosity is the pure-water viscosity of Laliberté (2007)
// (Pa·s): μw = (t + 246)/((0.05594 t + 5.2842) t + 137.37) mPa·s.
func brineWaterViscosity(t float64) float64 {
	return (t + 246) / ((0.05594*t+5.2842)*t + 137.37) * 1e-3
}

// brineViscosity is Laliberté's mixing rule ln μ = ww ln μw + w ln μs with
// the solute viscosity μs = exp((v1 w^v2 + v3)/(v4 t + 1))/(v5 w^v6 + 1)
// mPa·s (Pa·s).
func brineViscosity(t, w float64) float64 {
	const v1, v2, v3, v4, v5, v6 = 16.221788633396, 1.32293086770011, 1.48485985010431, 0.00746912559657377, 30.7802007540575, 2.05826852322558
	muW := brineWaterViscosity(t) * 1e3
	if w == 0 {
		return muW * 1e-3
	}
	muS := math.Exp((v1*math.Pow(w, v2)+v3)/(v4*t+1)) / (v5*math.Pow(w, v6) + 1)
	return math.Exp((1-w)*math.Log(muW)+w*math.Log(muS)) * 1e-3
}

const (
	srcLaliberteRho = "Laliberté & Cooper 2004, J. Chem. Eng. Data 49:1141 (NaCl parameters of Laliberté 2009)"
	srcLaliberteMu  = "Laliberté 2007, J. Chem. Eng. Data 52:321 (NaCl parameters of Laliberté 2009)"
	brineRange      = "NaCl up to 260 g/kg (near saturation, 264 g/kg at 20 °C) and 0–100 °C, within the data Laliberté fitted (from memory)"
)

func brineEntry() Entry {
	return mixtureEntry(liquidMixture{
		comp:    ConditionRange{Condition: Salinity, Default: 0.035, Min: 0, Max: 0.26},
		rangeOf: brineRange,
		density: brineDensity, viscosity: brineViscosity,
		srcRho: srcLaliberteRho, srcMu: srcLaliberteMu,
	})
}
