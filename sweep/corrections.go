package sweep

import "math"

// ITTC1957 returns the ITTC-1957 model–ship correlation line's friction
// coefficient at Reynolds number re.
func ITTC1957(re float64) float64 {
	d := math.Log10(re) - 2
	return 0.075 / (d * d)
}

// friction computes the ITTC-1957 correction at ln kL.
func (x *combo) friction(ln float64) *Friction {
	p := x.plan
	L, V := p.Settings.ReferenceLength, p.Settings.ReferenceSpeed
	nuP, ok := p.Proto["kinematic_viscosity"]
	if L == "" || V == "" || !ok {
		return nil
	}
	fl, err1 := x.form(L)
	fv, err2 := x.form(V)
	fn, err3 := x.form("kinematic_viscosity")
	if err1 != nil || err2 != nil || err3 != nil {
		return nil
	}
	f := &Friction{
		ReModel: fl.at(ln) * fv.at(ln) / fn.at(ln),
		ReProto: p.Items[L].Value * p.Items[V].Value / nuP,
	}
	f.CFModel, f.CFProto = ITTC1957(f.ReModel), ITTC1957(f.ReProto)
	f.Delta = f.CFModel - f.CFProto
	return f
}
