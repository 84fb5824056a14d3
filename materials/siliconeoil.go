package materials

import (
	"fmt"
	"math"
)

// Silicone oils (polydimethylsiloxane fluids) are sold by their nominal
// kinematic viscosity at 25 °C. Over temperature their viscosity follows
// the Andrade form ν(T) = ν25 exp(B (1/T − 1/298.15 K)), with B set by the
// grade's viscosity–temperature coefficient VTC = 1 − ν(98.9 °C)/ν(37.8 °C)
// that manufacturers' data sheets give; the density follows the volume
// expansion coefficient α: ρ(T) = ρ25/(1 + α (T − 298.15 K)). The surface
// tension is held at its 25 °C value (it falls by roughly 0.06 mN/m per K,
// not modelled). The VTC, α, ρ25 and σ25 below are typical manufacturer
// data-sheet values for PDMS fluids, from memory.

type siliconeGrade struct {
	name           string
	nu25           float64 // m²/s, the grade
	rho25, sigma25 float64 // kg/m³, N/m
	vtc, alpha     float64 // 1, 1/K
	tMin, tMax     float64 // K
	srcRange       string
}

func siliconeGrades() []siliconeGrade {
	const wide = "Andrade form through the data-sheet points at 37.8 and 98.9 °C; kept to 0–100 °C (from memory)"
	return []siliconeGrade{
		{"silicone_oil_1cst", 1e-6, 818, 17.4e-3, 0.37, 1.34e-3, 273.15, 313.15,
			"the 1 cSt grade is volatile (flash point near 40 °C): kept to 0–40 °C (from memory)"},
		{"silicone_oil_5cst", 5e-6, 913, 19.7e-3, 0.55, 1.05e-3, 273.15, 373.15, wide},
		{"silicone_oil_10cst", 10e-6, 935, 20.1e-3, 0.56, 1.08e-3, 273.15, 373.15, wide},
		{"silicone_oil_50cst", 50e-6, 960, 20.8e-3, 0.59, 1.04e-3, 273.15, 373.15, wide},
		{"silicone_oil_100cst", 100e-6, 965, 20.9e-3, 0.60, 9.6e-4, 273.15, 373.15, wide},
		{"silicone_oil_1000cst", 1000e-6, 970, 21.2e-3, 0.61, 9.6e-4, 273.15, 373.15, wide},
	}
}

// Reference temperatures of the viscosity–temperature coefficient (100 °F
// and 210 °F) and of the grade.
const (
	vtcLow, vtcHigh = 310.928, 372.039 // K: 100 °F and 210 °F
	gradeT          = 298.15           // K
)

// andradeB is the B of ν ∝ exp(B/T) that gives ν(vtcHigh)/ν(vtcLow) = 1 − VTC.
func andradeB(vtc float64) float64 { return math.Log(1-vtc) / (1/vtcHigh - 1/vtcLow) }

func (g siliconeGrade) kinematicViscosity(T float64) float64 {
	return g.nu25 * math.Exp(andradeB(g.vtc)*(1/T-1/gradeT))
}

func (g siliconeGrade) density(T float64) float64 { return g.rho25 / (1 + g.alpha*(T-gradeT)) }

func (g siliconeGrade) entry() Entry {
	srcNu := fmt.Sprintf("nominal grade at 25 °C; over temperature the Andrade form with VTC = %s (typical data-sheet value for PDMS fluids, from memory)", num(g.vtc))
	srcRho := fmt.Sprintf("%s kg/m³ at 25 °C, expansion %s /K (typical data-sheet values for PDMS fluids, from memory)", num(g.rho25), num(g.alpha))
	srcSig := "at 25 °C, held over temperature (typical data-sheet value for PDMS fluids, from memory)"
	return Entry{
		Ranges: []ConditionRange{
			{Condition: Temperature, Default: gradeT, Min: g.tMin, Max: g.tMax, Tunable: true, Source: g.srcRange},
		},
		model: func(c Conditions) []Property {
			T := c.Temperature
			return []Property{
				{Quantity: "density", Value: g.density(T), Source: srcRho},
				{Quantity: "kinematic_viscosity", Value: g.kinematicViscosity(T), Source: srcNu},
				{Quantity: "surface_tension", Value: g.sigma25, Source: srcSig},
			}
		},
	}
}
