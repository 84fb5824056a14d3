package materials

import (
	"fmt"
	"math"
)

// Gases as ideal gases with Sutherland's law for viscosity:
//
//	ρ = p/(R T),  μ = β T^{3/2}/(T + S),  a = √(γ R T).
//
// Viscosity and sound speed do not depend on pressure in this model; the
// valid ranges keep the compressibility factor and Sutherland's law within
// a few per cent (typical handbook limits, from memory).

// molarGasConstant is the molar gas constant, exact in the SI since 2019.
const molarGasConstant = 8.314462618 // J/(mol·K)

type gas struct {
	r, gamma   float64 // specific gas constant J/(kg·K), ratio of specific heats
	beta, s    float64 // Sutherland: kg/(m·s·K^½), K
	tMin, tMax float64 // K
	pMin, pMax float64 // Pa
	srcRho     string
	srcMu      string
	srcSound   string
	srcRange   string
}

// sutherlandBeta converts a reference viscosity mu0 at t0 to β.
func sutherlandBeta(mu0, t0, s float64) float64 { return mu0 * (t0 + s) / math.Pow(t0, 1.5) }

func (g gas) viscosity(T float64) float64 { return g.beta * math.Pow(T, 1.5) / (T + g.s) }

func (g gas) entry() Entry {
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: 293.15, Min: g.tMin, Max: g.tMax, Source: g.srcRange},
			{Condition: Pressure, Default: 101325, Min: g.pMin, Max: g.pMax, Tunable: true, Source: g.srcRange},
		},
		model: func(c Conditions) []Property {
			T, p := c.Temperature, c.Pressure
			return []Property{
				{Quantity: "density", Value: p / (g.r * T), Source: g.srcRho},
				{Quantity: "viscosity", Value: g.viscosity(T), Source: g.srcMu},
				{Quantity: "sound_speed", Value: math.Sqrt(g.gamma * g.r * T), Source: g.srcSound},
			}
		},
	}
}

// airGas is air by ISO 2533:1975 (Standard Atmosphere): R = 287.05287
// J/(kg·K), γ = 1.4, β = 1.458e-6 kg/(m·s·K^½), S = 110.4 K.
func airGas() gas {
	return gas{
		r: 287.05287, gamma: 1.4, beta: 1.458e-6, s: 110.4,
		tMin: 253.15, tMax: 393.15, pMin: 1e3, pMax: 2e6,
		srcRho:   "ideal gas ρ = p/(R T), R = 287.05287 J/(kg·K) (ISO 2533)",
		srcMu:    "Sutherland's law, β = 1.458e-6 kg/(m·s·K^½), S = 110.4 K (ISO 2533)",
		srcSound: "a = √(γ R T), γ = 1.4 (ISO 2533)",
		srcRange: "ideal gas and Sutherland's law within a few per cent over −20 to 120 °C and up to 2 MPa (from memory)",
	}
}

func gasSources(name string, molar float64, gamma float64, mu0, t0, s float64) (string, string, string) {
	return fmt.Sprintf("ideal gas ρ = p/(R T), R = R_m/M with M = %s g/mol (standard atomic weights, from memory)", num(molar*1e3)),
		fmt.Sprintf("Sutherland's law, μ = %s Pa·s at %s K, S = %s K (typical handbook constants for %s, from memory)", num(mu0), num(t0), num(s), name),
		fmt.Sprintf("a = √(γ R T), γ = %s (typical handbook value, from memory)", num(gamma))
}

func simpleGas(name string, molar, gamma, mu0, t0, s, tMin, tMax, pMax float64, rangeSrc string) gas {
	rho, mu, snd := gasSources(name, molar, gamma, mu0, t0, s)
	return gas{
		r: molarGasConstant / molar, gamma: gamma, beta: sutherlandBeta(mu0, t0, s), s: s,
		tMin: tMin, tMax: tMax, pMin: 1e3, pMax: pMax,
		srcRho: rho, srcMu: mu, srcSound: snd, srcRange: rangeSrc,
	}
}

const gasRange = "ideal gas and Sutherland's law within a few per cent over −20 to 120 °C and up to 2 MPa (from memory)"

func nitrogenGas() gas {
	return simpleGas("nitrogen", 28.0134e-3, 1.4, 1.663e-5, 273, 107, 253.15, 393.15, 2e6, gasRange)
}

func heliumGas() gas {
	return simpleGas("helium", 4.002602e-3, 5.0/3, 1.87e-5, 273, 79.4, 253.15, 393.15, 2e6, gasRange)
}

func carbonDioxideGas() gas {
	return simpleGas("carbon dioxide", 44.0095e-3, 1.29, 1.370e-5, 273, 222, 253.15, 353.15, 2e5,
		"carbon dioxide departs from an ideal gas early, and its γ varies: kept to −20 to 80 °C and 0.2 MPa (from memory)")
}
