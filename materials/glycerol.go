package materials

import "math"

// Water–glycerol mixtures and pure glycerol. Viscosity by Cheng (2008),
// "Formula for the viscosity of a glycerol-water mixture", Ind. Eng. Chem.
// Res. 47:3285–3288, valid 0–100 °C and mass fractions 0–1; density by
// Volk & Kähler (2018), "Density model for aqueous glycerol solutions",
// Exp. Fluids 59:75, which adds the volume contraction on mixing to the
// ideal (volume-additive) mixture. Temperatures t in °C, mass fraction cm
// of glycerol.

// glycerolViscosity is Cheng's μ = μw^α μg^(1−α) (Pa·s), with
// α = 1 − Cm + a b Cm(1 − Cm)/(a Cm + b(1 − Cm)), a = 0.705 − 0.0017 t,
// b = (4.9 + 0.036 t) a^2.5, μw = 1.790 exp((−1230 − t) t/(36100 + 360 t))
// mPa·s and μg = 12100 exp((−1233 + t) t/(9900 + 70 t)) mPa·s.
func glycerolViscosity(t, cm float64) float64 {
	muW := 1.790 * math.Exp((-1230-t)*t/(36100+360*t))
	muG := pureGlycerolViscosity(t) * 1e3
	a := 0.705 - 0.0017*t
	b := (4.9 + 0.036*t) * math.Pow(a, 2.5)
	alpha := 1 - cm
	if d := a*cm + b*(1-cm); d != 0 {
		alpha += a * b * cm * (1 - cm) / d
	}
	return math.Exp(alpha*math.Log(muW)+(1-alpha)*math.Log(muG)) * 1e-3
}

// pureGlycerolViscosity is Cheng's fit to pure glycerol (Pa·s):
// μg = 12100 exp((−1233 + t) t/(9900 + 70 t)) mPa·s.
func pureGlycerolViscosity(t float64) float64 {
	return 12100 * math.Exp((-1233+t)*t/(9900+70*t)) * 1e-3
}

// pureGlycerolDensity is Volk & Kähler's fit for glycerol (kg/m³):
// ρg = 1273.3 − 0.6121 t.
func pureGlycerolDensity(t float64) float64 { return 1273.3 - 0.6121*t }

// glycerolDensity is the mixture density (kg/m³) by Volk & Kähler (2018):
// the ideal mixture 1/ρ = Cm/ρg + (1 − Cm)/ρw, with
// ρw = 1000 (1 − |(t − 3.98)/615|^1.71), times the contraction factor
// κ = 1 + A sin(Cm^1.31 π)^0.81, A = 1.78e-6 t² − 1.82e-4 t + 1.41e-2.
// κ is 1 for pure water and pure glycerol and about 1.011 near Cm = 0.5
// at 20 °C: the ideal mixture alone is about 1 % low there.
func glycerolDensity(t, cm float64) float64 {
	rhoG := pureGlycerolDensity(t)
	rhoW := 1000 * (1 - math.Pow(math.Abs((t-3.98)/615), 1.71))
	ideal := 1 / (cm/rhoG + (1-cm)/rhoW)
	A := 1.78e-6*t*t - 1.82e-4*t + 1.41e-2
	kappa := 1 + A*math.Pow(math.Sin(math.Pow(cm, 1.31)*math.Pi), 0.81)
	return kappa * ideal
}

const (
	srcChengMu     = "Cheng 2008, Ind. Eng. Chem. Res. 47:3285 (μ = μw^α μg^(1−α), 0–100 °C)"
	srcChengMuPure = "Cheng 2008, Ind. Eng. Chem. Res. 47:3285, its fit for glycerol μg = 12100 exp((t − 1233) t/(9900 + 70 t)) mPa·s"
	srcVolkRho     = "Volk & Kähler 2018, Exp. Fluids 59:75 (ideal mixture × volume-contraction factor κ)"
	srcVolkRhoPure = "Volk & Kähler 2018, Exp. Fluids 59:75: ρg = 1273.3 − 0.6121 t kg/m³"
	glycerolRange  = "Cheng 2008 holds 0–100 °C and mass fractions 0–1 (Volk & Kähler 2018 applied over the same range)"
)

func glycerolEntry() Entry {
	return mixtureEntry(liquidMixture{
		comp:    ConditionRange{Condition: MassFraction, Default: 0.5, Min: 0, Max: 1},
		rangeOf: glycerolRange,
		density: glycerolDensity, viscosity: glycerolViscosity,
		srcRho: srcVolkRho, srcMu: srcChengMu,
	})
}

// liquidMixture is a liquid at atmospheric pressure whose density and
// viscosity are functions of its temperature t (°C, 0–100) and of one
// composition x (its mass fraction), the tunable knob.
type liquidMixture struct {
	comp               ConditionRange // the composition: condition, default and range
	rangeOf            string         // the source of the valid ranges
	density, viscosity func(t, x float64) float64
	srcRho, srcMu      string
}

func mixtureEntry(m liquidMixture) Entry {
	comp := m.comp
	comp.Tunable, comp.Composition, comp.Source = true, true, m.rangeOf
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: 293.15, Min: 273.15, Max: 373.15, Source: m.rangeOf},
			comp,
		},
		model: func(c Conditions) []Property {
			t, _ := c.Get(Temperature)
			x, _ := c.Get(comp.Condition)
			return []Property{
				{Quantity: "density", Value: m.density(t-273.15, x), Source: m.srcRho},
				{Quantity: "viscosity", Value: m.viscosity(t-273.15, x), Source: m.srcMu},
			}
		},
	}
}

// pureGlycerolEntry is glycerol itself (what "glycerol" and "glycerine"
// name), tunable by its temperature. No published surface-tension
// correlation over temperature was checked, so it gives none.
func pureGlycerolEntry() Entry {
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: 293.15, Min: 273.15, Max: 373.15, Tunable: true, Source: glycerolRange},
		},
		model: func(c Conditions) []Property {
			t := c.Temperature - 273.15
			return []Property{
				{Quantity: "density", Value: pureGlycerolDensity(t), Source: srcVolkRhoPure},
				{Quantity: "viscosity", Value: pureGlycerolViscosity(t), Source: srcChengMuPure},
			}
		},
	}
}
