package feasibility

import "fmt"

// CavitationPressure is the ambient pressure a model needs for cavitation
// similarity (spec §3.6): the margin above vapour pressure scales as the
// pressure scale k_p, so p_m = p_v,m + (p_p − p_v,p)/k_p. Pressures in Pa;
// kPressure is the pressure scale factor of the solution (kL in a Froude
// model of the same liquid). An error says when the prototype is already
// below its vapour pressure (the cavitation number is negative).
func CavitationPressure(prototypeAmbient, prototypeVapour, modelVapour, kPressure float64) (float64, error) {
	if !(kPressure > 0) {
		return 0, fmt.Errorf("cavitation: pressure scale %g must be positive", kPressure)
	}
	margin := prototypeAmbient - prototypeVapour
	if margin < 0 {
		return 0, fmt.Errorf("cavitation: prototype ambient pressure %g Pa is below its vapour pressure %g Pa", prototypeAmbient, prototypeVapour)
	}
	return modelVapour + margin/kPressure, nil
}

// CavitationNumber is σ = (p − p_v)/(½ρV²).
func CavitationNumber(ambient, vapour, density, velocity float64) float64 {
	return (ambient - vapour) / (0.5 * density * velocity * velocity)
}
