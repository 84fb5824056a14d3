package materials

import "math"

// Water–glycerol mixtures by Cheng (2008), "Formula for the viscosity of a
// glycerol-water mixture", Ind. Eng. Chem. Res. 47:3285–3288, valid 0–100 °C
// and mass fractions 0–1. Temperatures t in °C, mass fraction cm of glycerol.

// glycerolViscosity is Cheng's μ = μw^α μg^(1−α) (Pa·s), with
// α = 1 − Cm + a b Cm(1 − Cm)/(a Cm + b(1 − Cm)), a = 0.705 − 0.0017 t,
// b = (4.9 + 0.036 t) a^2.5, μw = 1.790 exp((−1230 − t) t/(36100 + 360 t))
// mPa·s and μg = 12100 exp((−1233 + t) t/(9900 + 70 t)) mPa·s.
func glycerolViscosity(t, cm float64) float64 {
	muW := 1.790 * math.Exp((-1230-t)*t/(36100+360*t))
	muG := 12100 * math.Exp((-1233+t)*t/(9900+70*t))
	a := 0.705 - 0.0017*t
	b := (4.9 + 0.036*t) * math.Pow(a, 2.5)
	alpha := 1 - cm
	if d := a*cm + b*(1-cm); d != 0 {
		alpha += a * b * cm * (1 - cm) / d
	}
	return math.Exp(alpha*math.Log(muW)+(1-alpha)*math.Log(muG)) * 1e-3
}

// glycerolDensity is the mixture density (kg/m³) from the pure-component
// densities Cheng (2008) used, ρg = 1277 − 0.654 t and
// ρw = 1000 (1 − |(t − 4)/622|^1.7), mixed by volume (ideal mixing:
// 1/ρ = Cm/ρg + (1 − Cm)/ρw). The volume contraction on mixing, which
// Cheng's formula leaves out, makes real mixtures up to about 1 % denser
// near Cm = 0.5 (Volk & Kähler 2018, Exp. Fluids 59:75).
func glycerolDensity(t, cm float64) float64 {
	rhoG := 1277 - 0.654*t
	rhoW := 1000 * (1 - math.Pow(math.Abs((t-4)/622), 1.7))
	return 1 / (cm/rhoG + (1-cm)/rhoW)
}

const (
	srcChengMu  = "Cheng 2008, Ind. Eng. Chem. Res. 47:3285 (μ = μw^α μg^(1−α), 0–100 °C)"
	srcChengRho = "pure-component densities of Cheng 2008 mixed by volume; about 1 % low near w = 0.5 (no volume contraction)"
)

func glycerolEntry() Entry {
	const rangeSrc = "Cheng 2008 holds 0–100 °C and mass fractions 0–1"
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: 293.15, Min: 273.15, Max: 373.15, Source: rangeSrc},
			{Condition: MassFraction, Default: 0.5, Min: 0, Max: 1, Tunable: true, Source: rangeSrc},
		},
		model: func(c Conditions) []Property {
			t, cm := c.Temperature-273.15, c.MassFraction
			return []Property{
				{Quantity: "density", Value: glycerolDensity(t, cm), Source: srcChengRho},
				{Quantity: "viscosity", Value: glycerolViscosity(t, cm), Source: srcChengMu},
			}
		},
	}
}
