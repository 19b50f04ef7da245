package seep

import (
	"errors"
	"fmt"
	"math"

	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Defaults of Options and of the scene's problem settings.
const (
	// DefaultUnitWeight is the unit weight of water in kN/m^3 used when the
	// scene gives none (geom.Read fills in the same value).
	DefaultUnitWeight = 9.81
	// DefaultCriticalGradient is the critical gradient used when the scene
	// gives none: about 1 for sands, i_c = (Gs - 1)/(1 + e) (common
	// practice).
	DefaultCriticalGradient = 1.0
	// DefaultPipingSafety is the least factor of safety against piping,
	// i_c / i_exit, below which Analyse warns: 3 to 4 are the usual minimums
	// against the exit gradient in sands (common practice, from memory);
	// the default takes the upper end.
	DefaultPipingSafety = 4.0
	// DefaultHeaveSafety is the least factor of safety of Terzaghi's heave
	// check below which Analyse warns: 1.5 to 2 are usual (common
	// practice, from memory); the default takes the lower end.
	DefaultHeaveSafety = 1.5
	// DefaultExitFraction: where the exit gradient is infinite in theory,
	// it is averaged over this fraction of the seepage path of the
	// structure at the singular point (its length of contact with the
	// soil), or of the exit face when no structure is there.
	DefaultExitFraction = 0.1
)

// Options tunes Analyse. The zero value gives the documented defaults.
type Options struct {
	// ExitLength is the length of exit face, in metres, over which a
	// singular exit gradient (infinite in theory, at the toe of a floor
	// without a cutoff) is averaged. 0: DefaultExitFraction of the seepage
	// path of the structure at the singular point.
	ExitLength float64
	// PipingSafety is the least acceptable factor of safety against
	// piping, i_c / i_exit (1); 0: DefaultPipingSafety.
	PipingSafety float64
	// HeaveSafety is the least acceptable factor of safety of Terzaghi's
	// heave check (1); 0: DefaultHeaveSafety.
	HeaveSafety float64
	// Soil names the soil of Lane's check, one of LaneRatios' names ("fine
	// sand"); "" checks against none and lists the soils for which the
	// weighted creep ratio would be safe.
	Soil string
}

// Report gathers the seepage results of one solved scene, in SI units.
type Report struct {
	// Solution is the solution analysed.
	Solution *bem.Solution
	// UnitWeight is the unit weight of water used, kN/m^3, and
	// CriticalGradient the critical gradient i_c (1).
	UnitWeight, CriticalGradient float64

	// Discharge is the total seepage through the soil per metre width, in
	// m^2/s: the inflow summed over the boundary panels where water
	// enters. Outflow is the same sum where water leaves (m^2/s); the
	// formulation holds every region's net inflow to zero, so the two agree
	// to rounding, and Imbalance, (Discharge - Outflow) / Discharge, checks
	// the bookkeeping (NaN without flow).
	Discharge, Outflow, Imbalance float64
	// Boundaries is the inflow of every body and edge (sol.Owners()):
	// m^2/s entering the soil, negative where water leaves.
	Boundaries []bem.OwnerResult

	// Head is the total head h = u on every panel (m), PorePressure the
	// pore pressure p = gw (h - y) at its midpoint (kPa) and
	// NormalGradient the hydraulic gradient across the boundary,
	// F / (n.K.n) with F the inflow density (1; positive where water
	// enters the domain, into the Left region on an interface). All are
	// indexed like the mesh's panels.
	Head, PorePressure, NormalGradient []float64

	// Structures lists every body in contact with the soil.
	Structures []Structure
	// Exits lists every fixed-head boundary through which water leaves the
	// soil, in the order of the layout's owners.
	Exits []Exit
	// ExitGradient is the governing exit: the largest exit gradient of
	// Exits; nil when no water leaves through a fixed head.
	ExitGradient *Exit
	// PipingSafety is CriticalGradient / ExitGradient.Value; NaN without
	// an exit.
	PipingSafety float64
	// Heave is Terzaghi's check of the soil prism beside every structure
	// that reaches below an exit face at its edge.
	Heave []Heave
	// Creeps is Lane's weighted creep check along the contact of every
	// structure (bodies that touch one another) that touches fixed heads
	// that differ, in the order of the layout's owners; Creep is the one
	// with the smallest ratio, nil when there is none.
	Creeps []Creep
	Creep  *Creep
	// Warnings, one sentence each, name the boundary and place it in the
	// scene's unit.
	Warnings []string
}

// ErrNotSeepage is returned by Analyse for a scene whose physics is not
// seepage.
var ErrNotSeepage = errors.New("seep: the scene's physics is not seepage; set problem.physics to \"seepage\"")

// Analyse computes the seepage results of sol, the solution of the scene
// sc with its own boundary conditions: discharge, heads and pore pressures
// on every panel, the uplift on every structure, the exit gradient of
// every exit face with the piping safety, Terzaghi's heave check and
// Lane's creep ratio. sys, the system sol was solved from, is not needed
// by these results and may be nil. Its warnings name the boundary and place
// it in the scene's unit.
func Analyse(sc *geom.Scene, sys *bem.System, sol *bem.Solution, o Options) (*Report, error) {
	if sc == nil || sol == nil || sol.Mesh == nil || sol.Mesh.Layout == nil {
		panic("seep: Analyse needs the scene and a solution with its mesh and layout")
	}
	if sc.Problem.Physics != geom.Seepage {
		return nil, ErrNotSeepage
	}
	if err := o.check(); err != nil {
		return nil, err
	}
	a := newAnalysis(sc, sol, o)
	rep := &Report{
		Solution:         sol,
		UnitWeight:       a.gw,
		CriticalGradient: a.ic,
		Boundaries:       sol.Owners(),
		PipingSafety:     math.NaN(),
	}
	a.panels(rep)
	a.discharge(rep)
	rep.Structures = a.structures()
	rep.Exits = a.exits()
	for i := range rep.Exits {
		if e := &rep.Exits[i]; rep.ExitGradient == nil || e.Value > rep.ExitGradient.Value {
			rep.ExitGradient = e
		}
	}
	if g := rep.ExitGradient; g != nil && g.Value > 0 {
		rep.PipingSafety = a.ic / g.Value
	}
	rep.Heave = a.heave(rep.Exits)
	rep.Creeps = a.creep()
	for i := range rep.Creeps {
		if c := &rep.Creeps[i]; rep.Creep == nil || c.Ratio < rep.Creep.Ratio {
			rep.Creep = c
		}
	}
	a.warn(rep)
	return rep, nil
}

// check validates the options.
func (o Options) check() error {
	for _, f := range []struct {
		name string
		v    float64
	}{{"exit length", o.ExitLength}, {"piping safety", o.PipingSafety}, {"heave safety", o.HeaveSafety}} {
		if !(f.v >= 0) || math.IsInf(f.v, 1) {
			return fmt.Errorf("seep: %s %g must be a positive finite number (0 for the default)", f.name, f.v)
		}
	}
	if o.Soil != "" {
		if _, ok := laneRatio(o.Soil); !ok {
			return fmt.Errorf("seep: soil %q is not in Lane's table; use one of %s", o.Soil, laneNames())
		}
	}
	return nil
}

// analysis holds what the parts of Analyse share.
type analysis struct {
	sc  *geom.Scene
	sol *bem.Solution
	m   *mesh.Mesh
	lay *geom.Layout
	o   Options
	gw  float64 // kN/m^3
	ic  float64
	// starts and ends list the boundary (non-interface) panels by their
	// start and end points; joints the interface panels by either end.
	starts, ends, joints map[r2.Vec][]int
	// noise is the inflow density (m/s) below which a value is rounding.
	noise float64
}

func newAnalysis(sc *geom.Scene, sol *bem.Solution, o Options) *analysis {
	a := &analysis{sc: sc, sol: sol, m: sol.Mesh, lay: sol.Mesh.Layout, o: o,
		gw: sc.Problem.UnitWeightWater, ic: sc.Problem.CriticalGradient}
	if !(a.gw > 0) {
		a.gw = DefaultUnitWeight
	}
	if !(a.ic > 0) {
		a.ic = DefaultCriticalGradient
	}
	if a.o.PipingSafety == 0 {
		a.o.PipingSafety = DefaultPipingSafety
	}
	if a.o.HeaveSafety == 0 {
		a.o.HeaveSafety = DefaultHeaveSafety
	}
	a.starts = map[r2.Vec][]int{}
	a.ends = map[r2.Vec][]int{}
	a.joints = map[r2.Vec][]int{}
	for j, p := range a.m.Panels {
		if p.Interface() {
			a.joints[p.A] = append(a.joints[p.A], j)
			a.joints[p.B] = append(a.joints[p.B], j)
			continue
		}
		a.starts[p.A] = append(a.starts[p.A], j)
		a.ends[p.B] = append(a.ends[p.B], j)
	}
	a.noise = a.fluxNoise()
	return a
}

// nKn returns n.K.n of panel j's Left region: the conductivity across the
// panel, which turns an inflow density into a hydraulic gradient.
func (a *analysis) nKn(j int) float64 {
	p := a.m.Panels[j]
	k := a.lay.Regions[p.Left].Material
	n := p.Normal()
	return n.X*n.X*k.Kx + n.Y*n.Y*k.Ky
}

// panels fills the per-panel heads, pore pressures and normal gradients.
func (a *analysis) panels(rep *Report) {
	n := len(a.m.Panels)
	rep.Head = make([]float64, n)
	rep.PorePressure = make([]float64, n)
	rep.NormalGradient = make([]float64, n)
	for j, p := range a.m.Panels {
		h := a.sol.U[j]
		rep.Head[j] = h
		rep.PorePressure[j] = a.gw * (h - p.Mid().Y)
		rep.NormalGradient[j] = a.sol.F[j] / a.nKn(j)
	}
}

// discharge sums the inflow where water enters and where it leaves.
func (a *analysis) discharge(rep *Report) {
	for j, p := range a.m.Panels {
		if p.Interface() {
			continue
		}
		q := a.sol.F[j] * p.Length()
		if q > 0 {
			rep.Discharge += q
		} else {
			rep.Outflow -= q
		}
	}
	rep.Imbalance = math.NaN()
	if rep.Discharge > 0 {
		rep.Imbalance = (rep.Discharge - rep.Outflow) / rep.Discharge
	}
}

// boundaryLength returns the length of the boundary panels (m).
func (a *analysis) boundaryLength() float64 {
	l := 0.0
	for _, p := range a.m.Panels {
		if !p.Interface() {
			l += p.Length()
		}
	}
	return l
}

// unit returns the scene's coordinate unit and metres per unit.
func (a *analysis) unit() (string, float64) {
	p := a.sc.Problem
	if p.Unit == "" || !(p.Scale > 0) {
		return "m", 1
	}
	return p.Unit, p.Scale
}

// where writes a point in the scene's unit.
func (a *analysis) where(p r2.Vec) string {
	unit, scale := a.unit()
	return fmt.Sprintf("(%.4g, %.4g) %s", p.X/scale, p.Y/scale, unit)
}

// length writes a length in the scene's unit.
func (a *analysis) length(l float64) string {
	unit, scale := a.unit()
	return fmt.Sprintf("%.3g %s", l/scale, unit)
}

// warn adds the report's warnings.
func (a *analysis) warn(rep *Report) {
	if math.Abs(rep.Imbalance) > 1e-3 {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf(
			"the water entering the soil (%.4g m^2/s) and leaving it (%.4g m^2/s) differ by %.2g %%: the solution does not balance; check the scene's flux conditions",
			rep.Discharge, rep.Outflow, 100*math.Abs(rep.Imbalance)))
	}
	if total := a.boundaryLength(); rep.Discharge <= a.noise*total && rep.Outflow <= a.noise*total {
		rep.Warnings = append(rep.Warnings, "no water flows: the scene needs fixed heads that differ (an upstream and a downstream bed)")
	}
	for i := range rep.Exits {
		e := &rep.Exits[i]
		if e.Singular {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf(
				"the exit gradient on %q is infinite in theory at %s (it grows like r^%.2f): %.3g is its mean over the first %s of the exit face; a cutoff or a filter there removes the singularity",
				e.Boundary, a.where(e.At), e.Exponent, e.Value, a.length(e.AveragedOver)))
		}
	}
	if g := rep.ExitGradient; g != nil && rep.PipingSafety < a.o.PipingSafety {
		rep.Warnings = append(rep.Warnings, fmt.Sprintf(
			"the factor of safety against piping is %.3g on %q at %s (critical gradient %.3g over exit gradient %.3g), below %.3g (3 to 4 are usual minimums in sands)",
			rep.PipingSafety, g.Boundary, a.where(g.At), a.ic, g.Value, a.o.PipingSafety))
	}
	for _, h := range rep.Heave {
		if h.Safety < a.o.HeaveSafety {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf(
				"Terzaghi's heave check beside %q gives a factor of safety of %.3g (prism %s deep at %s, mean excess head %.3g m at its base), below %.3g",
				h.Structure, h.Safety, a.length(h.Depth), a.where(h.Corner), h.ExcessHead, a.o.HeaveSafety))
		}
	}
	for _, c := range rep.Creeps {
		if c.Required > 0 && c.Ratio < c.Required {
			rep.Warnings = append(rep.Warnings, fmt.Sprintf(
				"Lane's weighted creep ratio along %q is %.3g, below %.3g, the safe ratio for %s",
				c.Structures, c.Ratio, c.Required, a.o.Soil))
		}
	}
}
