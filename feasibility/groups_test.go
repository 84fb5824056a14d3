package feasibility

import (
	"reflect"
	"testing"

	"gonum.org/v1/gonum/unit"
)

// Dimensions of the variables used below, over M, L, T, Θ.
var (
	piForce     = Dim(1, 1, -2, 0)
	piDensity   = Dim(1, -3, 0, 0)
	piVelocity  = Dim(0, 1, -1, 0)
	piLength    = Dim(0, 1, 0, 0)
	piViscosity = Dim(1, -1, -1, 0)
	piKinematic = Dim(0, 2, -1, 0)
	piPressure  = Dim(1, -1, -2, 0)
	piAccel     = Dim(0, 1, -2, 0)
	piFrequency = Dim(0, 0, -1, 0)
	piTime      = Dim(0, 0, 1, 0)
	piMass      = Dim(1, 0, 0, 0)
	piFlow      = Dim(0, 3, -1, 0)
	piPower     = Dim(1, 2, -3, 0)
	piTorque    = Dim(1, 2, -2, 0)
	piHead      = Dim(0, 2, -2, 0)
	piTension   = Dim(1, 0, -2, 0)
	piHeatCoef  = Dim(1, 0, -3, -1)
	piConduct   = Dim(1, 1, -3, -1)
	piSpecHeat  = Dim(0, 2, -2, -1)
	piNone      = Dim(0, 0, 0, 0)
)

// gonumUnit builds a variable's dimension as a gonum unit.
func gonumUnit(t *testing.T, d Dimension) *unit.Unit {
	t.Helper()
	keys := [numBase]unit.Dimension{unit.MassDim, unit.LengthDim, unit.TimeDim, unit.TemperatureDim}
	dims := unit.Dimensions{}
	for i, e := range d {
		if !e.IsInt() {
			t.Fatalf("gonum units need integer dimensions, got %s", d)
		}
		if e.Num() != 0 {
			dims[keys[i]] = int(e.Num())
		}
	}
	return unit.New(1, dims)
}

// gonumProduct raises each variable to its exponent of the group, all
// exponents first multiplied by the LCM of their denominators so that they
// are integers, and multiplies the powers with gonum's own algebra. The
// result is the group raised to that LCM, as a gonum unit.
func gonumProduct(t *testing.T, vars []Variable, g PiGroup) *unit.Unit {
	t.Helper()
	dimOf := map[string]Dimension{}
	for _, v := range vars {
		dimOf[v.Name] = v.Dim
	}
	lcm := int64(1)
	for _, e := range g.Exponents {
		lcm = lcm / gcd(lcm, e.Exp.Den()) * e.Exp.Den()
	}
	prod := unit.New(1, unit.Dimensions{})
	for _, e := range g.Exponents {
		d, ok := dimOf[e.Name]
		if !ok {
			t.Fatalf("group %s names unknown variable %s", g, e.Name)
		}
		n := e.Exp.Mul(Int(lcm))
		if !n.IsInt() {
			t.Fatalf("exponent %s times %d is not an integer", e.Exp, lcm)
		}
		u := gonumUnit(t, d)
		for k := int64(0); k < abs64(n.Num()); k++ {
			if n.Num() > 0 {
				prod.Mul(u)
			} else {
				prod.Div(u)
			}
		}
	}
	return prod
}

// checkDimensionless verifies a group with our dimension algebra and,
// independently, with gonum.org/v1/gonum/unit.
func checkDimensionless(t *testing.T, vars []Variable, g PiGroup) {
	t.Helper()
	if !g.Dim.IsDimensionless() {
		t.Errorf("group %s: Dim = %s, want dimensionless", g, g.Dim)
	}
	own := Dim(0, 0, 0, 0)
	dimOf := map[string]Dimension{}
	for _, v := range vars {
		dimOf[v.Name] = v.Dim
	}
	for _, e := range g.Exponents {
		if e.Exp.IsZero() {
			t.Errorf("group %s lists a zero exponent for %s", g, e.Name)
		}
		own = own.Mul(dimOf[e.Name].Pow(e.Exp))
	}
	if !own.IsDimensionless() {
		t.Errorf("group %s has dimension %s by our algebra", g, own)
	}
	p := gonumProduct(t, vars, g)
	if !unit.DimensionsMatch(p, unit.Dimless(0)) || len(p.Dimensions()) != 0 {
		t.Errorf("group %s: gonum finds dimensions %v", g, p.Dimensions())
	}
}

// The gonum check must be able to fail: F/(ρV²D) is a length.
func TestPiGroupGonumCheckDetectsDimension(t *testing.T) {
	vars := []Variable{{"F", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}}
	g := PiGroup{Exponents: []VarExp{{"F", Int(1)}, {"rho", Int(-1)}, {"V", Int(-2)}, {"D", Int(-1)}}}
	p := gonumProduct(t, vars, g)
	if unit.DimensionsMatch(p, unit.Dimless(0)) {
		t.Fatalf("gonum reports F/(rho V^2 D) dimensionless")
	}
	if want := (unit.Dimensions{unit.LengthDim: 1}); !reflect.DeepEqual(p.Dimensions(), want) {
		t.Fatalf("gonum dimensions %v, want %v", p.Dimensions(), want)
	}
	// Fractional exponents are raised to the LCM of their denominators.
	w := []Variable{{"c", piVelocity}, {"g", piAccel}, {"lambda", piLength}}
	h := PiGroup{Exponents: []VarExp{{"c", Int(1)}, {"g", R(-1, 2)}, {"lambda", R(-1, 2)}}}
	if q := gonumProduct(t, w, h); !unit.DimensionsMatch(q, unit.Dimless(0)) {
		t.Fatalf("c g^-1/2 lambda^-1/2 squared: gonum finds %v", q.Dimensions())
	}
}

type wantGroup struct {
	str, name string
}

type piCase struct {
	name      string
	source    string
	vars      []Variable
	repeat    []string
	rank      int
	dims      []string
	repeating []string
	groups    []wantGroup
}

func runPiCases(t *testing.T, cases []piCase) {
	t.Helper()
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res, err := PiGroups(c.vars, c.repeat)
			if err != nil {
				t.Fatalf("%s (%s): %v", c.name, c.source, err)
			}
			if res.Rank != c.rank {
				t.Errorf("rank %d, want %d", res.Rank, c.rank)
			}
			if len(res.Groups) != len(c.vars)-c.rank {
				t.Errorf("%d groups, want n - rank = %d", len(res.Groups), len(c.vars)-c.rank)
			}
			if !reflect.DeepEqual(res.Dimensions, c.dims) {
				t.Errorf("dimensions %q, want %q", res.Dimensions, c.dims)
			}
			if !reflect.DeepEqual(res.Repeating, c.repeating) {
				t.Errorf("repeating %q, want %q", res.Repeating, c.repeating)
			}
			var got []wantGroup
			for _, g := range res.Groups {
				got = append(got, wantGroup{g.String(), g.Name})
				checkDimensionless(t, c.vars, g)
			}
			if !reflect.DeepEqual(got, c.groups) {
				t.Errorf("groups\n got %q\nwant %q", got, c.groups)
			}
		})
	}
}

// Textbook analyses with the repeating variables chosen automatically.
func TestPiGroupsTextbook(t *testing.T) {
	runPiCases(t, []piCase{
		{
			name:   "drag on a sphere",
			source: "Fox & McDonald, Introduction to Fluid Mechanics, ch. 7, drag on a smooth sphere; textbook example, from memory",
			vars: []Variable{
				{"F", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}, {"mu", piViscosity},
			},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"rho", "V", "D"},
			groups: []wantGroup{
				{"F · rho^-1 · V^-2 · D^-2", "force coefficient"},
				{"rho^-1 · V^-1 · D^-1 · mu", "inverse Reynolds number"},
			},
		},
		{
			name:   "pressure drop in a pipe",
			source: "White, Fluid Mechanics, ch. 5, pipe pressure drop with roughness; Fox & McDonald ch. 7; textbook example, from memory",
			vars: []Variable{
				{"dp", piPressure}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength},
				{"mu", piViscosity}, {"L", piLength}, {"eps", piLength},
			},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"rho", "V", "D"},
			groups: []wantGroup{
				{"dp · rho^-1 · V^-2", "Euler number"},
				{"rho^-1 · V^-1 · D^-1 · mu", "inverse Reynolds number"},
				{"D^-1 · L", "length ratio"},
				{"D^-1 · eps", "relative roughness"},
			},
		},
		{
			name:   "pump similarity",
			source: "Munson et al., Fundamentals of Fluid Mechanics, turbomachine similarity laws; textbook example, from memory",
			vars: []Variable{
				{"gH", piHead}, {"Q", piFlow}, {"N", piFrequency}, {"D", piLength},
				{"rho", piDensity}, {"mu", piViscosity}, {"P", piPower},
			},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"N", "D", "rho"},
			groups: []wantGroup{
				{"gH · N^-2 · D^-2", "head coefficient"},
				{"Q · N^-1 · D^-3", "flow coefficient"},
				{"N^-1 · D^-2 · rho^-1 · mu", "inverse Reynolds number"},
				{"N^-3 · D^-5 · rho^-1 · P", "power number"},
			},
		},
		{
			name:   "deep-water wave speed",
			source: "White, Fluid Mechanics, dimensional analysis of deep-water wave celerity c = f(g, λ); textbook example, from memory",
			vars:   []Variable{{"c", piVelocity}, {"g", piAccel}, {"lambda", piLength}},
			rank:   2, dims: []string{"L", "T"}, repeating: []string{"g", "lambda"},
			groups: []wantGroup{
				{"c · g^-1/2 · lambda^-1/2", "Froude number"},
			},
		},
		{
			name:   "vortex-shedding frequency",
			source: "Munson et al., Fundamentals of Fluid Mechanics, vortex shedding behind a cylinder (Strouhal vs Reynolds); textbook example, from memory",
			vars: []Variable{
				{"f", piFrequency}, {"V", piVelocity}, {"D", piLength}, {"rho", piDensity}, {"mu", piViscosity},
			},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"V", "D", "rho"},
			groups: []wantGroup{
				{"f · V^-1 · D", "Strouhal number"},
				{"V^-1 · D^-1 · rho^-1 · mu", "inverse Reynolds number"},
			},
		},
		{
			name:   "flow over a weir",
			source: "Munson et al., Fundamentals of Fluid Mechanics, rectangular weir Q = f(g, H, b); textbook example, from memory",
			vars:   []Variable{{"Q", piFlow}, {"g", piAccel}, {"H", piLength}, {"b", piLength}},
			rank:   2, dims: []string{"L", "T"}, repeating: []string{"g", "H"},
			groups: []wantGroup{
				{"Q · g^-1/2 · H^-5/2", "discharge coefficient"},
				{"H^-1 · b", "length ratio"},
			},
		},
		{
			name:   "ship resistance",
			source: "Froude's method of ship model testing, R = f(V, L, ρ, μ, g) (e.g. White, Fluid Mechanics, ch. 5); textbook example, from memory",
			vars: []Variable{
				{"R", piForce}, {"V", piVelocity}, {"L", piLength}, {"rho", piDensity}, {"mu", piViscosity}, {"g", piAccel},
			},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"V", "L", "rho"},
			groups: []wantGroup{
				{"R · V^-2 · L^-2 · rho^-1", "resistance coefficient"},
				{"V^-1 · L^-1 · rho^-1 · mu", "inverse Reynolds number"},
				{"V^-2 · L · g", "Froude number^-2"},
			},
		},
		{
			name:   "forced convection in a pipe",
			source: "Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, dimensional analysis of convection (Nu, Re, Pr); textbook example, from memory",
			vars: []Variable{
				{"h", piHeatCoef}, {"D", piLength}, {"V", piVelocity}, {"rho", piDensity},
				{"mu", piViscosity}, {"k", piConduct}, {"cp", piSpecHeat},
			},
			rank: 4, dims: []string{"M", "L", "T", "Θ"}, repeating: []string{"D", "V", "rho", "k"},
			groups: []wantGroup{
				{"h · D · k^-1", "Nusselt number"},
				{"D^-1 · V^-1 · rho^-1 · mu", "inverse Reynolds number"},
				{"D · V · rho · k^-1 · cp", "Péclet number"},
			},
		},
		{
			name:   "pendulum with the mass listed first",
			source: "simple pendulum, period T = f(m, L, g) (Rayleigh's method; any fluid-mechanics text); textbook example, from memory",
			// m comes first, so it is taken as the dependent variable, but it
			// is the only one with M: the rule repeats it because it must.
			vars: []Variable{{"m", piMass}, {"L", piLength}, {"g", piAccel}, {"T", piTime}},
			rank: 3, dims: []string{"M", "L", "T"}, repeating: []string{"m", "L", "g"},
			groups: []wantGroup{
				{"L^-1/2 · g^1/2 · T", ""},
			},
		},
	})
}

// Analyses with the user's choice of repeating variables.
func TestPiGroupsUserRepeating(t *testing.T) {
	runPiCases(t, []piCase{
		{
			name:   "sphere, viscosity repeating",
			source: "Stokes drag form F/(μVD); Fox & McDonald ch. 7, textbook example, from memory",
			vars: []Variable{
				{"F", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}, {"mu", piViscosity},
			},
			repeat: []string{"mu", "V", "D"},
			rank:   3, dims: []string{"M", "L", "T"}, repeating: []string{"V", "D", "mu"},
			groups: []wantGroup{
				{"F · V^-1 · D^-1 · mu^-1", ""},
				{"rho · V · D · mu^-1", "Reynolds number"},
			},
		},
		{
			name:   "pipe, textbook choice in another order",
			source: "White, Fluid Mechanics, ch. 5, pipe pressure drop; textbook example, from memory",
			vars: []Variable{
				{"dp", piPressure}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength},
				{"mu", piViscosity}, {"L", piLength}, {"eps", piLength},
			},
			repeat: []string{" D", "rho", "V "},
			rank:   3, dims: []string{"M", "L", "T"}, repeating: []string{"rho", "V", "D"},
			groups: []wantGroup{
				{"dp · rho^-1 · V^-2", "Euler number"},
				{"rho^-1 · V^-1 · D^-1 · mu", "inverse Reynolds number"},
				{"D^-1 · L", "length ratio"},
				{"D^-1 · eps", "relative roughness"},
			},
		},
		{
			name:   "wave speed, celerity repeating",
			source: "deep-water wave celerity; textbook example, from memory",
			vars:   []Variable{{"c", piVelocity}, {"g", piAccel}, {"lambda", piLength}},
			repeat: []string{"c", "lambda"},
			rank:   2, dims: []string{"L", "T"}, repeating: []string{"c", "lambda"},
			groups: []wantGroup{
				{"c^-2 · g · lambda", "Froude number^-2"},
			},
		},
		{
			name:   "weir, crest width repeating",
			source: "Munson et al., rectangular weir; textbook example, from memory",
			vars:   []Variable{{"Q", piFlow}, {"g", piAccel}, {"H", piLength}, {"b", piLength}},
			repeat: []string{"g", "b"},
			rank:   2, dims: []string{"L", "T"}, repeating: []string{"g", "b"},
			groups: []wantGroup{
				{"Q · g^-1/2 · b^-5/2", "discharge coefficient"},
				{"H · b^-1", "length ratio"},
			},
		},
		{
			name:   "every variable dimensionless",
			source: "rank 0: each variable is its own group (Buckingham's theorem)",
			vars:   []Variable{{"eps", piNone}, {"poisson", Dimension{}}},
			rank:   0, dims: nil, repeating: nil,
			groups: []wantGroup{{"eps", ""}, {"poisson", ""}},
		},
		{
			name:   "no group left",
			source: "n = rank: nothing dimensionless can be formed",
			vars:   []Variable{{"F", piForce}, {"V", piVelocity}, {"D", piLength}},
			rank:   3, dims: []string{"M", "L", "T"}, repeating: []string{"F", "V", "D"},
			groups: nil,
		},
	})
}

// Recognition of classic groups, up to inversion and powers, with name hints.
func TestPiGroupNames(t *testing.T) {
	cases := []struct {
		vars   []Variable
		repeat []string
		str    string // the first group
		name   string
	}{
		{[]Variable{{"sigma", piTension}, {"rho", piDensity}, {"V", piVelocity}, {"L", piLength}}, nil,
			"sigma · rho^-1 · V^-2 · L^-1", "inverse Weber number"},
		{[]Variable{{"p", piPressure}, {"rho", piDensity}, {"V", piVelocity}}, nil,
			"p · rho^-1 · V^-2", "Euler number"},
		{[]Variable{{"pressure_rise", piPressure}, {"rho", piDensity}, {"V", piVelocity}}, nil,
			"pressure_rise · rho^-1 · V^-2", "Euler number"},
		{[]Variable{{"E", piPressure}, {"rho", piDensity}, {"V", piVelocity}}, nil,
			"E · rho^-1 · V^-2", "inverse Cauchy number"},
		{[]Variable{{"rho", piDensity}, {"V", piVelocity}, {"modulus", piPressure}}, []string{"V", "modulus"},
			"rho · V^2 · modulus^-1", "Cauchy number"},
		{[]Variable{{"s", piPressure}, {"rho", piDensity}, {"V", piVelocity}}, nil,
			"s · rho^-1 · V^-2", "Euler number or inverse Cauchy number"},
		{[]Variable{{"p_v", piPressure}, {"rho", piDensity}, {"V", piVelocity}}, nil,
			"p_v · rho^-1 · V^-2", "cavitation number"},
		{[]Variable{{"V", piVelocity}, {"c", piVelocity}}, nil,
			"V · c^-1", "Mach number"},
		{[]Variable{{"sound_speed", piVelocity}, {"U", piVelocity}}, nil,
			"sound_speed · U^-1", "inverse Mach number"},
		{[]Variable{{"V", piVelocity}, {"U", piVelocity}}, nil,
			"V · U^-1", "velocity ratio"},
		{[]Variable{{"D", piLength}, {"eps", piLength}}, []string{"eps"},
			"D · eps^-1", "inverse relative roughness"},
		{[]Variable{{"V", piVelocity}, {"n", piFrequency}, {"D", piLength}}, nil,
			"V · n^-1 · D^-1", "advance ratio"},
		{[]Variable{{"omega", piFrequency}, {"V", piVelocity}, {"D", piLength}}, nil,
			"omega · V^-1 · D", "Strouhal number"},
		{[]Variable{{"rate", piFrequency}, {"V", piVelocity}, {"D", piLength}}, nil,
			"rate · V^-1 · D", "Strouhal number or inverse advance ratio"},
		{[]Variable{{"Tp", piTime}, {"V", piVelocity}, {"D", piLength}}, nil,
			"Tp · V · D^-1", "Keulegan–Carpenter number"},
		{[]Variable{{"t", piTime}, {"V", piVelocity}, {"D", piLength}}, nil,
			"t · V · D^-1", "inverse Strouhal number"},
		{[]Variable{{"N", piFrequency}, {"D", piLength}, {"g", piAccel}}, nil,
			"N · D^1/2 · g^-1/2", "rotational Froude number^1/2"},
		{[]Variable{{"mu", piViscosity}, {"V", piVelocity}, {"sigma", piTension}}, nil,
			"mu · V · sigma^-1", "capillary number"},
		{[]Variable{{"sigma", piTension}, {"rho", piDensity}, {"g", piAccel}, {"L", piLength}}, nil,
			"sigma · rho^-1 · g^-1 · L^-2", "inverse Bond number"},
		{[]Variable{{"mu", piViscosity}, {"rho", piDensity}, {"sigma", piTension}, {"L", piLength}}, []string{"rho", "sigma", "L"},
			"mu · rho^-1/2 · sigma^-1/2 · L^-1/2", "Ohnesorge number"},
		{[]Variable{{"g", piAccel}, {"L", piLength}, {"nu", piKinematic}}, nil,
			"g · L^3 · nu^-2", "Galileo number"},
		{[]Variable{{"nu", piKinematic}, {"V", piVelocity}, {"L", piLength}}, nil,
			"nu · V^-1 · L^-1", "inverse Reynolds number"},
		{[]Variable{{"alpha", piKinematic}, {"V", piVelocity}, {"L", piLength}}, nil,
			"alpha · V^-1 · L^-1", "inverse Péclet number"},
		{[]Variable{{"Q", piFlow}, {"D", piLength}, {"nu", piKinematic}}, nil,
			"Q · D^-1 · nu^-1", "Reynolds number"},
		{[]Variable{{"cp", piSpecHeat}, {"mu", piViscosity}, {"k", piConduct}}, nil,
			"cp · mu · k^-1", "Prandtl number"},
		{[]Variable{{"Fd", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}}, nil,
			"Fd · rho^-1 · V^-2 · D^-2", "drag coefficient"},
		{[]Variable{{"lift", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"c", piLength}}, nil,
			"lift · rho^-1 · V^-2 · c^-2", "lift coefficient"},
		{[]Variable{{"T", piForce}, {"rho", piDensity}, {"n", piFrequency}, {"D", piLength}}, nil,
			"T · rho^-1 · n^-2 · D^-4", "thrust coefficient"},
		{[]Variable{{"torque", piTorque}, {"rho", piDensity}, {"n", piFrequency}, {"D", piLength}}, nil,
			"torque · rho^-1 · n^-2 · D^-5", "torque coefficient"},
		{[]Variable{{"P", piPower}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}}, nil,
			"P · rho^-1 · V^-3 · D^-2", "power coefficient"},
		{[]Variable{{"dp", piPressure}, {"rho", piDensity}, {"N", piFrequency}, {"D", piLength}}, nil,
			"dp · rho^-1 · N^-2 · D^-2", "head coefficient"},
		{[]Variable{{"V", piVelocity}, {"rho", piDensity}, {"K", piPressure}}, []string{"rho", "K"},
			"V · rho^1/2 · K^-1/2", "Cauchy number^1/2"},
		{[]Variable{{"Q", piFlow}, {"g", piAccel}, {"H", piLength}}, nil,
			"Q · g^-1/2 · H^-5/2", "discharge coefficient"},
		{[]Variable{{"F", piForce}, {"mu", piViscosity}, {"V", piVelocity}, {"D", piLength}}, nil,
			"F · mu^-1 · V^-1 · D^-1", ""},
		{[]Variable{{"poisson", piNone}, {"L", piLength}}, nil,
			"poisson", ""},
	}
	for _, c := range cases {
		res, err := PiGroups(c.vars, c.repeat)
		if err != nil {
			t.Errorf("%v: %v", c.vars, err)
			continue
		}
		if len(res.Groups) == 0 {
			t.Errorf("%v: no groups", c.vars)
			continue
		}
		g := res.Groups[0]
		checkDimensionless(t, c.vars, g)
		if g.String() != c.str || g.Name != c.name {
			t.Errorf("first group %q named %q, want %q named %q", g.String(), g.Name, c.str, c.name)
		}
	}
}

func TestPiGroupString(t *testing.T) {
	cases := []struct {
		g    PiGroup
		want string
	}{
		{PiGroup{}, "1"},
		{PiGroup{Exponents: []VarExp{{"eps", Int(1)}}}, "eps"},
		{PiGroup{Exponents: []VarExp{{"F", Int(1)}, {"rho", Int(-1)}, {"V", Int(-2)}, {"D", Int(-2)}}}, "F · rho^-1 · V^-2 · D^-2"},
		{PiGroup{Exponents: []VarExp{{"Q", Int(1)}, {"g", R(-1, 2)}, {"H", R(-3, 2)}, {"b", Int(-1)}}}, "Q · g^-1/2 · H^-3/2 · b^-1"},
	}
	for _, c := range cases {
		if got := c.g.String(); got != c.want {
			t.Errorf("String() = %q, want %q", got, c.want)
		}
	}
}

func TestPiGroupsErrors(t *testing.T) {
	sphere := []Variable{
		{"F", piForce}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength}, {"mu", piViscosity},
	}
	pipe := []Variable{
		{"dp", piPressure}, {"rho", piDensity}, {"V", piVelocity}, {"D", piLength},
		{"mu", piViscosity}, {"L", piLength}, {"eps", piLength},
	}
	cases := []struct {
		name   string
		vars   []Variable
		repeat []string
		want   string
	}{
		{"no variables", nil, nil,
			"no variables: a pi analysis needs at least one variable with its unit"},
		{"no name", []Variable{{"F", piForce}, {" ", piLength}}, nil,
			"variable 2 has no name"},
		{"duplicate name", []Variable{{"F", piForce}, {"V", piVelocity}, {"F", piForce}}, nil,
			`variable "F" is listed twice (as variables 1 and 3)`},
		{"unknown repeating", sphere, []string{"rh", "V", "D"},
			`repeating variable "rh" is not one of the variables (did you mean rho?)`},
		{"unknown repeating, no close name", sphere, []string{"xyzzy", "V", "D"},
			`repeating variable "xyzzy" is not one of the variables (known: F, rho, V, D, mu)`},
		{"empty repeating name", sphere, []string{"rho", " ", "V"},
			"a repeating variable has an empty name"},
		{"repeating listed twice", sphere, []string{"rho", "rho", "V"},
			"repeating variable rho is listed twice"},
		{"too few repeating", sphere, []string{"rho", "V"},
			"3 repeating variables are needed: the matrix has rank 3 (2 given: rho and V)"},
		{"too many repeating", sphere, []string{"rho", "V", "D", "mu"},
			"3 repeating variables are needed: the matrix has rank 3 (4 given: rho, V, D and mu)"},
		{"rank 1", []Variable{{"L", piLength}, {"D", piLength}}, []string{"L", "D"},
			"1 repeating variable is needed: the matrix has rank 1 (2 given: L and D)"},
		{"rank 0 with repeating", []Variable{{"eps", piNone}, {"poisson", piNone}}, []string{"eps"},
			"no repeating variables are needed: every variable is dimensionless (eps given)"},
		{"dimensionless repeating", append(append([]Variable{}, sphere...), Variable{"Re0", piNone}), []string{"rho", "V", "Re0"},
			"Re0 is dimensionless and cannot be a repeating variable"},
		{"repeating set without M", pipe, []string{"D", "V", "L"},
			"none of the repeating variables D, V and L involves M, but dp (M L^-1 T^-2) does: its group could not be made dimensionless"},
		{"repeating set without T", pipe, []string{"rho", "D", "L"},
			"none of the repeating variables rho, D and L involves T, but dp (M L^-1 T^-2) does: its group could not be made dimensionless"},
		{"two lengths repeating", pipe, []string{"mu", "D", "L"},
			"D and L have dependent dimensions: L and L (L has the dimension of D)"},
		{"three dependent", append(append([]Variable{}, sphere...), Variable{"nu", piKinematic}), []string{"rho", "mu", "nu"},
			"rho, mu and nu have dependent dimensions: M L^-3, M L^-1 T^-1 and L^2 T^-1 (nu has the dimension of rho^-1 · mu)"},
	}
	for _, c := range cases {
		_, err := PiGroups(c.vars, c.repeat)
		if err == nil {
			t.Errorf("%s: no error, want %q", c.name, c.want)
			continue
		}
		if err.Error() != c.want {
			t.Errorf("%s:\n got %q\nwant %q", c.name, err.Error(), c.want)
		}
	}
}

// The automatic choice must not depend on anything but the input: the same
// analysis twice gives the same result.
func TestPiGroupsDeterministic(t *testing.T) {
	vars := []Variable{
		{"gH", piHead}, {"Q", piFlow}, {"N", piFrequency}, {"D", piLength},
		{"rho", piDensity}, {"mu", piViscosity}, {"P", piPower},
	}
	a, err := PiGroups(vars, nil)
	if err != nil {
		t.Fatal(err)
	}
	for range 20 {
		b, err := PiGroups(vars, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(a, b) {
			t.Fatalf("results differ:\n%v\n%v", a, b)
		}
	}
}
