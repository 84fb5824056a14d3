package feasibility

import (
	"strings"
	"unicode"
)

// Recognition of classic groups.
//
// A group is reduced to its signature: the exponents summed per variable
// dimension (so D and L, both lengths, add up). It is a classic group raised
// to the power k when its signature is k times the classic pattern. Where
// patterns coincide, hints on the names of the variables of one dimension
// decide: a pressure named p, dp, Δp or …pressure… gives Euler, one named E,
// K or …modulus… gives Cauchy, p_v or …vapour… the cavitation number; a
// frequency named f, omega or …freq… gives Strouhal, one named n, N or rpm
// the advance ratio; a force named D, Fd or …drag… the drag coefficient
// (likewise lift, resistance R, thrust T); a speed named c, a or …sound…
// makes a velocity ratio the Mach number; a length named eps, ε, ks or
// …rough… makes a length ratio the relative roughness. A hint prefers a
// group among those the dimensions allow; with no hint, every general
// candidate is named ("Euler number or inverse Cauchy number") and the
// specialised ones (cavitation, drag, Keulegan–Carpenter, Péclet by α, …)
// are left out.

type sigTerm struct {
	dim Dimension
	exp Rat
}

type nameHints struct {
	words    []string // whole names or name tokens, compared in lower case
	contains []string // substrings of the lower-case name
}

type classicGroup struct {
	name  string
	terms []sigTerm
	// hintDim and hint, when hint is set: the group is preferred when a
	// variable of dimension hintDim has a matching name.
	hintDim Dimension
	hint    *nameHints
	// hintOnly: a specialised name, given only when the hint matches.
	hintOnly bool
	// notHint: the group is not this one when a variable of dimension
	// hintDim has a name that fits notHint (g·L³/α² with a thermal
	// diffusivity α is no Galileo number).
	notHint *nameHints
}

func piTerm(d Dimension, num, den int64) sigTerm { return sigTerm{d, R(num, den)} }

var (
	pressureHints   = &nameHints{words: []string{"p", "dp", "δp", "deltap", "pd", "ps", "p0", "pinf"}, contains: []string{"pressure"}}
	cavitationHints = &nameHints{words: []string{"pv", "pvap", "p_v"}, contains: []string{"vapour", "vapor", "cavitation"}}
	modulusHints    = &nameHints{words: []string{"e", "k", "g", "ev", "kv", "ym"}, contains: []string{"modulus", "young", "elastic", "bulk"}}
	soundHints      = &nameHints{words: []string{"c", "a", "c0", "a0", "cs"}, contains: []string{"sound"}}
	frequencyHints  = &nameHints{words: []string{"f", "fs", "fn", "f0", "ω", "w"}, contains: []string{"freq", "omega", "shedding"}}
	rotationHints   = &nameHints{words: []string{"n", "rpm", "rps", "rot", "revs"}, contains: []string{"rotation", "shaft", "revolution"}}
	periodHints     = &nameHints{words: []string{"tp", "tz", "tw", "tm"}, contains: []string{"period"}}
	dragHints       = &nameHints{words: []string{"d", "fd", "cd"}, contains: []string{"drag"}}
	liftHints       = &nameHints{words: []string{"l", "fl"}, contains: []string{"lift"}}
	resistanceHints = &nameHints{words: []string{"r", "rt", "rf"}, contains: []string{"resistance"}}
	thrustHints     = &nameHints{words: []string{"t", "th"}, contains: []string{"thrust"}}
	diffusionHints  = &nameHints{words: []string{"α", "κ", "alpha", "kappa"}, contains: []string{"diffusiv"}}
	roughnessHints  = &nameHints{words: []string{"ε", "eps", "epsilon", "e", "ks"}, contains: []string{"rough"}}
	// Wave height H (upper case; h is a water depth), wavelength λ and a
	// beach or structure slope tan α.
	heightHints     = &nameHints{words: []string{"hs", "hm0", "hrms", "hmax", "hw", "hwave", "hi"}, contains: []string{"height"}}
	wavelengthHints = &nameHints{words: []string{"λ", "lambda", "lw", "l0", "lo", "wl"}, contains: []string{"wavelength", "wave_length"}}
	slopeHints      = &nameHints{words: []string{"tana", "tanα", "tan_alpha", "tanalpha", "m", "s", "slope"}, contains: []string{"slope", "tan"}}
)

// isWaveHeight reports whether a length variable is a wave height: the
// name H (upper case) or one that fits heightHints.
func isWaveHeight(name string) bool {
	return name == "H" || strings.HasPrefix(name, "H_") || matchHints(name, heightHints)
}

var classicGroups = []classicGroup{
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Péclet number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdKinematic, -1, 1)}, hintDim: pdKinematic, hint: diffusionHints, hintOnly: true},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFrequency, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdFrequency, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFlow, 1, 1), piTerm(pdLength, -1, 1), piTerm(pdViscosity, -1, 1)}},
	{name: "Reynolds number", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdLength, -1, 1), piTerm(pdKinematic, -1, 1)}},
	{name: "Froude number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdAccel, -1, 2), piTerm(pdLength, -1, 2)}},
	{name: "rotational Froude number", terms: []sigTerm{piTerm(pdFrequency, 2, 1), piTerm(pdLength, 1, 1), piTerm(pdAccel, -1, 1)}},
	{name: "Weber number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 2, 1), piTerm(pdLength, 1, 1), piTerm(pdTension, -1, 1)}},
	{name: "Weber number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdFrequency, 2, 1), piTerm(pdLength, 3, 1), piTerm(pdTension, -1, 1)}},
	{name: "Euler number", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1)}, hintDim: pdPressure, hint: pressureHints},
	{name: "cavitation number", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1)}, hintDim: pdPressure, hint: cavitationHints, hintOnly: true},
	{name: "Cauchy number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdVelocity, 2, 1), piTerm(pdPressure, -1, 1)}, hintDim: pdPressure, hint: modulusHints},
	{name: "Strouhal number", terms: []sigTerm{piTerm(pdFrequency, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdVelocity, -1, 1)}, hintDim: pdFrequency, hint: frequencyHints},
	{name: "advance ratio", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdFrequency, -1, 1), piTerm(pdLength, -1, 1)}, hintDim: pdFrequency, hint: rotationHints},
	{name: "Strouhal number", terms: []sigTerm{piTerm(pdLength, 1, 1), piTerm(pdVelocity, -1, 1), piTerm(pdTime, -1, 1)}},
	{name: "Keulegan–Carpenter number", terms: []sigTerm{piTerm(pdVelocity, 1, 1), piTerm(pdTime, 1, 1), piTerm(pdLength, -1, 1)}, hintDim: pdTime, hint: periodHints, hintOnly: true},
	{name: "force coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "drag coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: dragHints, hintOnly: true},
	{name: "lift coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: liftHints, hintOnly: true},
	{name: "resistance coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: resistanceHints, hintOnly: true},
	{name: "thrust coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -2, 1), piTerm(pdLength, -2, 1)}, hintDim: pdForce, hint: thrustHints, hintOnly: true},
	{name: "thrust coefficient", terms: []sigTerm{piTerm(pdForce, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -4, 1)}},
	{name: "torque coefficient", terms: []sigTerm{piTerm(pdTorque, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -5, 1)}},
	{name: "power number", terms: []sigTerm{piTerm(pdPower, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -3, 1), piTerm(pdLength, -5, 1)}},
	{name: "power coefficient", terms: []sigTerm{piTerm(pdPower, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdVelocity, -3, 1), piTerm(pdLength, -2, 1)}},
	{name: "flow coefficient", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdFrequency, -1, 1), piTerm(pdLength, -3, 1)}},
	{name: "head coefficient", terms: []sigTerm{piTerm(pdHead, 1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "head coefficient", terms: []sigTerm{piTerm(pdPressure, 1, 1), piTerm(pdDensity, -1, 1), piTerm(pdFrequency, -2, 1), piTerm(pdLength, -2, 1)}},
	{name: "discharge coefficient", terms: []sigTerm{piTerm(pdFlow, 1, 1), piTerm(pdAccel, -1, 2), piTerm(pdLength, -5, 2)}},
	{name: "capillary number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdTension, -1, 1)}},
	{name: "Bond number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdAccel, 1, 1), piTerm(pdLength, 2, 1), piTerm(pdTension, -1, 1)}},
	{name: "Ohnesorge number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdDensity, -1, 2), piTerm(pdTension, -1, 2), piTerm(pdLength, -1, 2)}},
	{name: "Galileo number", terms: []sigTerm{piTerm(pdAccel, 1, 1), piTerm(pdLength, 3, 1), piTerm(pdKinematic, -2, 1)}, hintDim: pdKinematic, notHint: diffusionHints},
	{name: "Galileo number", terms: []sigTerm{piTerm(pdAccel, 1, 1), piTerm(pdLength, 3, 1), piTerm(pdDensity, 2, 1), piTerm(pdViscosity, -2, 1)}},
	{name: "Prandtl number", terms: []sigTerm{piTerm(pdViscosity, 1, 1), piTerm(pdSpecHeat, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Nusselt number", terms: []sigTerm{piTerm(pdHeatCoef, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Péclet number", terms: []sigTerm{piTerm(pdDensity, 1, 1), piTerm(pdSpecHeat, 1, 1), piTerm(pdVelocity, 1, 1), piTerm(pdLength, 1, 1), piTerm(pdConduct, -1, 1)}},
	{name: "Fourier number", terms: []sigTerm{piTerm(pdKinematic, 1, 1), piTerm(pdTime, 1, 1), piTerm(pdLength, -2, 1)}, hintDim: pdKinematic, hint: diffusionHints, hintOnly: true},
}

// ratioNouns names a ratio of two variables of the same dimension.
var ratioNouns = map[Dimension]string{
	pdLength:      "length",
	pdArea:        "area",
	pdVolume:      "volume",
	pdVelocity:    "velocity",
	pdDensity:     "density",
	pdFrequency:   "frequency",
	pdTime:        "time",
	pdMass:        "mass",
	pdViscosity:   "viscosity",
	pdKinematic:   "kinematic viscosity",
	pdAccel:       "acceleration",
	pdTension:     "surface tension",
	pdPressure:    "pressure",
	pdForce:       "force",
	pdPower:       "power",
	pdTorque:      "energy",
	pdFlow:        "flow rate",
	pdTemperature: "temperature",
}

// matchHints reports whether a variable name fits the nameHints: the whole name,
// or one of its tokens (split at anything not a letter or digit), equals a
// word, or the name contains one of the longer stems.
func matchHints(name string, h *nameHints) bool {
	lower := strings.ToLower(name)
	tokens := strings.FieldsFunc(lower, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) })
	compact := strings.Join(tokens, "")
	for _, w := range h.words {
		if lower == w || compact == w {
			return true
		}
		for _, tok := range tokens {
			if tok == w {
				return true
			}
		}
	}
	for _, s := range h.contains {
		if strings.Contains(lower, s) {
			return true
		}
	}
	return false
}

// powName names a classic group raised to the power k.
func powName(name string, k Rat) string {
	switch {
	case k.Cmp(Int(1)) == 0:
		return name
	case k.Cmp(Int(-1)) == 0:
		return "inverse " + name
	default:
		return name + "^" + k.String()
	}
}

func recogniseGroup(g PiGroup, index map[string]int, dims []Dimension) string {
	if len(g.Exponents) < 2 {
		return ""
	}
	dimOf := func(e VarExp) Dimension { return dims[index[e.Name]] }
	if n := waveGroupName(g, dimOf); n != "" {
		return n
	}
	if n, ok := convectionName(g, dimOf); ok {
		return n
	}
	sig := groupSignature(g, dimOf)
	if len(sig) == 0 {
		return ratioName(g, dimOf)
	}
	return preferredNames(classicMatches(g, sig, dimOf))
}

// groupSignature is a group's exponents summed per dimension, zero sums
// dropped.
func groupSignature(g PiGroup, dimOf func(VarExp) Dimension) []sigTerm {
	var sig []sigTerm
	for _, e := range g.Exponents {
		d := dimOf(e)
		found := false
		for k := range sig {
			if sig[k].dim == d {
				sig[k].exp = sig[k].exp.Add(e.Exp)
				found = true
			}
		}
		if !found {
			sig = append(sig, sigTerm{d, e.Exp})
		}
	}
	nonzero := sig[:0]
	for _, s := range sig {
		if !s.exp.IsZero() {
			nonzero = append(nonzero, s)
		}
	}
	return nonzero
}

// classicMatch is a classic group whose signature a group has, to the
// power k; hinted when one of the group's variables carries its hint.
type classicMatch struct {
	c      classicGroup
	k      Rat
	hinted bool
}

// classicMatches lists the classic groups with signature sig, leaving out
// those a variable's name excludes.
func classicMatches(g PiGroup, sig []sigTerm, dimOf func(VarExp) Dimension) []classicMatch {
	var matches []classicMatch
	for _, c := range classicGroups {
		k, ok := proportional(sig, c.terms)
		if !ok {
			continue
		}
		if hintedBy(g, dimOf, c.hintDim, c.notHint) {
			continue
		}
		matches = append(matches, classicMatch{c, k, hintedBy(g, dimOf, c.hintDim, c.hint)})
	}
	return matches
}

// hintedBy says whether a variable of g of dimension dim has a name that
// fits h (false for nil h).
func hintedBy(g PiGroup, dimOf func(VarExp) Dimension, dim Dimension, h *nameHints) bool {
	if h == nil {
		return false
	}
	for _, e := range g.Exponents {
		if dimOf(e) == dim && matchHints(e.Name, h) {
			return true
		}
	}
	return false
}

// preferredNames joins the names of the matches kept: a hinted specialised
// name beats a hinted general one, which beats the unhinted general names;
// specialised names need their hint.
func preferredNames(matches []classicMatch) string {
	keep := func(m classicMatch) bool { return !m.c.hintOnly }
	anyHinted, anySpecial := false, false
	for _, m := range matches {
		if m.hinted {
			anyHinted = true
			if m.c.hintOnly {
				anySpecial = true
			}
		}
	}
	switch {
	case anySpecial:
		keep = func(m classicMatch) bool { return m.hinted && m.c.hintOnly }
	case anyHinted:
		keep = func(m classicMatch) bool { return m.hinted }
	}
	var out []string
	for _, m := range matches {
		if !keep(m) {
			continue
		}
		n := powName(m.c.name, m.k)
		dup := false
		for _, o := range out {
			if o == n {
				dup = true
			}
		}
		if !dup {
			out = append(out, n)
		}
	}
	return strings.Join(out, " or ")
}

// proportional returns k with sig = k·pattern, term by term.
func proportional(sig, pattern []sigTerm) (Rat, bool) {
	if len(sig) != len(pattern) {
		return Rat{}, false
	}
	var k Rat
	for i, p := range pattern {
		var s *sigTerm
		for j := range sig {
			if sig[j].dim == p.dim {
				s = &sig[j]
			}
		}
		if s == nil {
			return Rat{}, false
		}
		r := s.exp.Div(p.exp)
		if i == 0 {
			k = r
		} else if r.Cmp(k) != 0 {
			return Rat{}, false
		}
	}
	return k, true
}

// ratioName names a group whose variables all share one dimension: a ratio
// of two like variables.
func ratioName(g PiGroup, dimOf func(VarExp) Dimension) string {
	d := dimOf(g.Exponents[0])
	for _, e := range g.Exponents[1:] {
		if dimOf(e) != d {
			return ""
		}
	}
	// hinted returns the exponent of the one variable whose name fits h.
	hinted := func(h *nameHints) (Rat, bool) {
		var exp Rat
		n := 0
		for _, e := range g.Exponents {
			if matchHints(e.Name, h) {
				exp, n = e.Exp, n+1
			}
		}
		return exp, n == 1
	}
	switch d {
	case pdVelocity:
		// Mach number V/c: the power is minus the exponent of the speed of sound.
		if e, ok := hinted(soundHints); ok {
			return powName("Mach number", e.Neg())
		}
	case pdKinematic:
		// Prandtl number ν/α: the power is minus the exponent of the
		// thermal diffusivity.
		if e, ok := hinted(diffusionHints); ok {
			return powName("Prandtl number", e.Neg())
		}
	case pdLength:
		// Relative roughness ε/D: the power is the exponent of the roughness.
		if e, ok := hinted(roughnessHints); ok {
			return powName("relative roughness", e)
		}
	}
	if noun, ok := ratioNouns[d]; ok {
		return noun + " ratio"
	}
	return ""
}

// waveGroupName names the groups of coastal models that the dimensions
// alone cannot tell from a length ratio, by the names of their variables
// (Hughes 1993, Physical Models and Laboratory Techniques in Coastal
// Engineering, ch. 2; from memory):
//
//	wave steepness      H/λ, or H/(g·T²) (deep water, λ0 = gT²/2π)
//	Iribarren number    tan α/√(H/λ), or tan α·T·√(g/H)
//
// each up to a power. It returns "" when the group is neither.
func waveGroupName(g PiGroup, dimOf func(VarExp) Dimension) string {
	var slope, height, wavelength, accel, period Rat
	var nSlope, nHeight, nWave, nAccel, nPeriod int
	for _, e := range g.Exponents {
		d := dimOf(e)
		switch {
		case d == pdNone && matchHints(e.Name, slopeHints):
			slope, nSlope = e.Exp, nSlope+1
		case d == pdLength && isWaveHeight(e.Name):
			height, nHeight = e.Exp, nHeight+1
		case d == pdLength && matchHints(e.Name, wavelengthHints):
			wavelength, nWave = e.Exp, nWave+1
		case d == pdAccel:
			accel, nAccel = e.Exp, nAccel+1
		case d == pdTime:
			period, nPeriod = e.Exp, nPeriod+1
		default:
			return ""
		}
	}
	if nHeight != 1 || nSlope > 1 || nWave > 1 || nAccel > 1 || nPeriod > 1 {
		return ""
	}
	// steepness^k: H^k·λ^-k, or H^k·g^-k·T^-2k.
	k := height
	if nSlope == 1 {
		// Iribarren^j = tanα^j · steepness^(-j/2): k = −j/2.
		k = slope.Mul(R(-1, 2))
		if height.Cmp(k) != 0 {
			return ""
		}
	}
	switch {
	case nWave == 1 && nAccel == 0 && nPeriod == 0:
		if wavelength.Cmp(k.Neg()) != 0 {
			return ""
		}
	case nWave == 0 && nAccel == 1 && nPeriod == 1:
		if accel.Cmp(k.Neg()) != 0 || period.Cmp(k.Mul(Int(-2))) != 0 {
			return ""
		}
	default:
		return ""
	}
	if nSlope == 1 {
		return powName("Iribarren number", slope)
	}
	return powName("wave steepness", k)
}
