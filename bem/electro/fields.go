package electro

import (
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Fields holds the electric field at the midpoint of every panel of a
// solution, on the side of the panel's Left region.
type Fields struct {
	Sol *bem.Solution
	// Charge is the free surface charge density in C/m^2: the inflow
	// density on every boundary panel (on a conductor, its surface charge),
	// 0 on interfaces between dielectrics.
	Charge []float64
	// Normal is the normal component of E in V/m, along -Normal() (out of
	// the boundary into the Left region): on a conductor, positive where the
	// field points away from it.
	Normal []float64
	// Tangent is the component of E along the panel's tangent (A to B),
	// V/m; 0 on conductors, which are equipotentials.
	Tangent []float64
	// next and prev are the neighbouring panels along the boundary or
	// interface (the panel whose A is this one's B, and the reverse), or -1.
	next, prev []int
	// corners caches Corners once found.
	corners []Corner
	found   bool
}

// conductor reports whether the panel lies on a conductor: a boundary panel
// of a body or edge at a fixed or floating potential.
func conductor(p mesh.Panel) bool {
	if p.Interface() || p.Owner < 0 {
		return false
	}
	return p.Cond.Kind == geom.Potential || p.Cond.Kind == geom.Floating
}

// material returns the permittivity tensor of region i.
func material(sol *bem.Solution, i int) geom.Material {
	return sol.Mesh.Layout.Regions[i].Material
}

// knn returns n.K.n and n.K.t for the diagonal tensor K.
func knn(k geom.Material, n, t r2.Vec) (nn, nt float64) {
	return k.Kx*n.X*n.X + k.Ky*n.Y*n.Y, k.Kx*n.X*t.X + k.Ky*n.Y*t.Y
}

// PanelFields works out the field on every panel of sol. The normal
// component comes from the inflow density, E_n = (F + n.K.t E_t) / n.K.n
// (F = D.(-n), the displacement entering the region through the panel;
// for isotropic material E_n = F / eps). The
// tangential component is the difference of the midpoint potentials of
// the neighbouring panels along the boundary over their distance along it,
// -du/ds (first order in the panel size on graded meshes); it is 0 on
// conductors.
func PanelFields(sol *bem.Solution) *Fields {
	m := sol.Mesh
	n := len(m.Panels)
	f := &Fields{
		Sol:     sol,
		Charge:  make([]float64, n),
		Normal:  make([]float64, n),
		Tangent: make([]float64, n),
	}
	f.next, f.prev = neighbours(m)
	for j, p := range m.Panels {
		if !p.Interface() {
			f.Charge[j] = sol.F[j]
		}
		if !conductor(p) {
			f.Tangent[j] = f.tangential(j)
		}
		nrm, tan := p.Normal(), p.Tangent()
		kn, kt := knn(material(sol, p.Left), nrm, tan)
		// D = K E; F = -n.D with n the outward normal = (-n).K E.
		// With E = En (-n) + Et t: F = En n.K.n - Et n.K.t.
		f.Normal[j] = (sol.F[j] + kt*f.Tangent[j]) / kn
	}
	return f
}

// tangential returns -du/ds at panel j from its neighbours.
func (f *Fields) tangential(j int) float64 {
	ps := f.Sol.Mesh.Panels
	u := f.Sol.U
	lj := ps[j].Length()
	p, q := f.prev[j], f.next[j]
	switch {
	case p >= 0 && q >= 0:
		return -(u[q] - u[p]) / (0.5*ps[p].Length() + lj + 0.5*ps[q].Length())
	case q >= 0:
		return -(u[q] - u[j]) / (0.5*lj + 0.5*ps[q].Length())
	case p >= 0:
		return -(u[j] - u[p]) / (0.5*lj + 0.5*ps[p].Length())
	}
	return 0
}

// neighbours finds, for every panel, the panel that continues it at B and
// the one that leads into it at A with the same regions on each side; -1
// where there is none or more than one (a junction).
func neighbours(m *mesh.Mesh) (next, prev []int) {
	type key struct {
		v           r2.Vec
		left, right int
	}
	starts := map[key]int{}
	ends := map[key]int{}
	const many = -2
	add := func(mp map[key]int, k key, j int) {
		if _, dup := mp[k]; dup {
			mp[k] = many
		} else {
			mp[k] = j
		}
	}
	for j, p := range m.Panels {
		add(starts, key{p.A, p.Left, p.Right}, j)
		add(ends, key{p.B, p.Left, p.Right}, j)
	}
	next = make([]int, len(m.Panels))
	prev = make([]int, len(m.Panels))
	look := func(mp map[key]int, k key) int {
		if j, ok := mp[k]; ok && j >= 0 {
			return j
		}
		return -1
	}
	for j, p := range m.Panels {
		next[j] = look(starts, key{p.B, p.Left, p.Right})
		prev[j] = look(ends, key{p.A, p.Left, p.Right})
	}
	return next, prev
}

// Magnitude returns |E| at panel j on the side of region reg, which must be
// the panel's Left or Right region. On the Right side of an interface the
// normal component is F / n.K.n of the Right region (D.n is continuous
// across a charge-free interface), the tangential one the same.
func (f *Fields) Magnitude(j, reg int) float64 {
	p := f.Sol.Mesh.Panels[j]
	et := f.Tangent[j]
	if reg == p.Left {
		return math.Hypot(f.Normal[j], et)
	}
	if reg != p.Right || reg < 0 {
		panic("electro: Magnitude: region not beside the panel")
	}
	// Seen from the Right region the outward normal is -n.
	nrm, tan := p.Normal(), p.Tangent()
	kn, kt := knn(material(f.Sol, reg), nrm, tan)
	// Flux into Right is -F: -F = En' n.K.n + Et n.K.t with En' along +n.
	en := (-f.Sol.F[j] - kt*et) / kn
	return math.Hypot(en, et)
}

// Peak is the largest field strength found on conductor surfaces.
type Peak struct {
	Value    float64 // V/m
	At       r2.Vec  // panel midpoint, metres
	Panel    int     // index into Mesh.Panels
	Owner    int     // index into Layout.Owners
	Boundary string  // the owner's name
	// Corner is the singular corner the peak sits at, nil when it lies on
	// a smooth stretch. There the true field is infinite and the value is
	// the mesh's.
	Corner *Corner
}

// Peak returns the largest |E| over the panels of conductors (bodies and
// edges at a fixed or floating potential), and false when there is none.
// A peak within one nominal panel size of a singular corner of a
// conductor carries that corner.
func (f *Fields) Peak() (Peak, bool) {
	m := f.Sol.Mesh
	best := -1
	for j, p := range m.Panels {
		if conductor(p) && (best < 0 || math.Abs(f.Normal[j]) > math.Abs(f.Normal[best])) {
			best = j
		}
	}
	if best < 0 {
		return Peak{}, false
	}
	p := m.Panels[best]
	pk := Peak{
		Value:    math.Abs(f.Normal[best]),
		At:       p.Mid(),
		Panel:    best,
		Owner:    p.Owner,
		Boundary: m.Layout.Owners[p.Owner].Name,
	}
	reach := reachOf(m)
	for _, c := range f.Corners() {
		if d := r2.Norm(r2.Sub(c.At, pk.At)); d <= reach && (pk.Corner == nil || d < r2.Norm(r2.Sub(pk.Corner.At, pk.At))) {
			pk.Corner = &c
		}
	}
	return pk, true
}
